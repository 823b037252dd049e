// Package newton solves the nonlinear systems F(u) = 0 that arise from
// three-point discretisations of two-point boundary-value problems: N grid
// points with B unknowns each, the residual at point j depending only on
// points j−1, j and j+1.
//
// It knows nothing of the physics. A Problem supplies the residual and the
// block structure; optionally transient weights (Transient) and its own
// Jacobian (JacobianEvaluator). The package provides the block-tridiagonal
// linear algebra (BlockTridiagonal), a coloured finite-difference Jacobian
// (FiniteDifferenceJacobian) and a damped Newton solver with a
// pseudo-transient fallback (Solve).
package newton
