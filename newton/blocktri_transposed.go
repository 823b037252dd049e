package newton

import (
	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
)

// SolveTransposed overwrites rhs (length N·B, point-major) with the solution
// λ of mᵀ·λ = rhs, using the factors from the last successful Factor. It is
// the adjoint solve of sensitivity analysis: one transposed solve gives the
// derivative of one output with respect to every parameter.
//
// With m = L̃·Ũ, L̃ block lower bidiagonal (diagonal D′_j, sub-diagonal L_j)
// and Ũ block upper bidiagonal (identity diagonal, super-diagonal G_j),
// mᵀ = Ũᵀ·L̃ᵀ and
//
//	forward:  z_j = rhs_j − G_{j−1}ᵀ · z_{j−1}
//	backward: λ_j = D′_j⁻ᵀ (z_j − L_{j+1}ᵀ · λ_{j+1})
//
// (Golub & Van Loan, "Matrix Computations", 4th ed. (2013), §4.5.1, applied
// to the transpose). D′_j⁻ᵀ uses the in-block factors P·D′ = L·U as
// D′ᵀ = Uᵀ·Lᵀ·P. It allocates nothing and panics, like Solve, without a
// successful Factor.
func (m *BlockTridiagonal) SolveTransposed(rhs []float64) {
	if !m.factored {
		panic("newton: BlockTridiagonal.SolveTransposed called without a successful Factor")
	}
	n, b := m.N, m.B
	bb := b * b
	rhs = rhs[:n*b]
	vec := func(j int) blas64.Vector { return blas64.Vector{N: b, Inc: 1, Data: rhs[j*b : (j+1)*b]} }
	for j := 1; j < n; j++ {
		blas64.Gemv(blas.Trans, -1, m.general(m.g, j-1), vec(j-1), 1, vec(j))
	}
	for j := n - 1; j >= 0; j-- {
		if j < n-1 {
			blas64.Gemv(blas.Trans, -1, m.general(m.Lower, j+1), vec(j+1), 1, vec(j))
		}
		luSolveVecTransposed(m.lu[j*bb:(j+1)*bb], m.piv[j*b:(j+1)*b], b, rhs[j*b:(j+1)*b])
	}
}

// luSolveVecTransposed overwrites x (length b) with A⁻ᵀ·x, A factored by
// luFactor as P·A = L·U: Aᵀ = Uᵀ·Lᵀ·P, so solve Uᵀ·w = x (forward), Lᵀ·s = w
// (backward, unit diagonal) and undo the interchanges in reverse order.
func luSolveVecTransposed(lu []float64, piv []int, b int, x []float64) {
	for r := 0; r < b; r++ {
		s := x[r]
		for k := 0; k < r; k++ {
			s -= lu[k*b+r] * x[k]
		}
		x[r] = s / lu[r*b+r]
	}
	for r := b - 2; r >= 0; r-- {
		s := x[r]
		for k := r + 1; k < b; k++ {
			s -= lu[k*b+r] * x[k]
		}
		x[r] = s
	}
	for k := b - 1; k >= 0; k-- {
		if p := piv[k]; p != k {
			x[k], x[p] = x[p], x[k]
		}
	}
}
