package newton

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// BlockTridiagonal is a square matrix of N×N blocks, each B×B, with non-zero
// blocks only on the main diagonal and the two neighbouring block diagonals:
//
//	row j:  Lower_j · x_{j−1} + Diag_j · x_j + Upper_j · x_{j+1}
//
// It is the Jacobian of a residual F_j that depends only on the unknowns of
// points j−1, j and j+1 (three-point discretisations of two-point
// boundary-value problems). Lower block j holds ∂F_j/∂u_{j−1}, Diag block j
// ∂F_j/∂u_j and Upper block j ∂F_j/∂u_{j+1}. Lower block 0 and Upper block
// N−1 lie outside the matrix and are ignored.
//
// Each of Lower, Diag and Upper has N·B·B entries: block j occupies
// [j·B·B, (j+1)·B·B) in row-major order, entry (r, c) of block j at
// j·B·B + r·B + c.
//
// Factor keeps its factors in separate storage: Lower, Diag and Upper are
// left untouched, so MulVec still multiplies by the original matrix and the
// matrix may be modified (for example a diagonal shift) and factored again.
type BlockTridiagonal struct {
	N, B               int
	Lower, Diag, Upper []float64

	// Factor storage, allocated on the first call to Factor.
	lu       []float64 // LU factors of the Schur complements D′_j, unit lower part below the diagonal
	piv      []int     // row interchanges of each D′_j: row i was swapped with row piv[j·B+i]
	g        []float64 // G_j = D′_j⁻¹ · Upper_j
	orig     []float64 // scratch: the block being factored, before elimination (b×b)
	origRow  []int     // scratch: original row index of each row of the factors
	factored bool

	// Scratch for FiniteDifferenceJacobian, allocated on first use.
	fdU, fdF []float64
}

// NewBlockTridiagonal returns a zero n×n block-tridiagonal matrix of b×b
// blocks. It panics if n < 1 or b < 1, as make does for a negative length;
// callers validate sizes that come from user input before calling it.
func NewBlockTridiagonal(n, b int) *BlockTridiagonal {
	if n < 1 || b < 1 {
		panic(fmt.Sprintf("newton: NewBlockTridiagonal(%d, %d): sizes must be at least 1", n, b))
	}
	bb := b * b
	return &BlockTridiagonal{
		N:     n,
		B:     b,
		Lower: make([]float64, n*bb),
		Diag:  make([]float64, n*bb),
		Upper: make([]float64, n*bb),
	}
}

// LowerBlock returns a view of block j of Lower, ∂F_j/∂u_{j−1}, row-major.
func (m *BlockTridiagonal) LowerBlock(j int) []float64 { return m.block(m.Lower, j) }

// DiagBlock returns a view of block j of Diag, ∂F_j/∂u_j, row-major.
func (m *BlockTridiagonal) DiagBlock(j int) []float64 { return m.block(m.Diag, j) }

// UpperBlock returns a view of block j of Upper, ∂F_j/∂u_{j+1}, row-major.
func (m *BlockTridiagonal) UpperBlock(j int) []float64 { return m.block(m.Upper, j) }

func (m *BlockTridiagonal) block(a []float64, j int) []float64 {
	bb := m.B * m.B
	return a[j*bb : (j+1)*bb : (j+1)*bb]
}

// AddDiagonal adds d_i to the diagonal entry of unknown i (len(d) = N·B,
// point-major), for example the w/dt of a pseudo-time step. Existing
// factors no longer match the matrix.
func (m *BlockTridiagonal) AddDiagonal(d []float64) {
	b := m.B
	for j := range m.N {
		blk := m.DiagBlock(j)
		for c, v := range d[j*b : (j+1)*b] {
			blk[c*b+c] += v
		}
	}
	m.factored = false
}

// Zero sets every entry of Lower, Diag and Upper to zero and discards any
// factorisation.
func (m *BlockTridiagonal) Zero() {
	clear(m.Lower)
	clear(m.Diag)
	clear(m.Upper)
	m.factored = false
}

// SingularError reports a diagonal block whose Schur complement could not be
// factored: at grid point Point, elimination of unknown Component found no
// usable pivot, or an entry was not finite.
type SingularError struct {
	Point, Component int
	NotFinite        bool // an entry was NaN or ±Inf rather than a vanishing pivot
}

func (e *SingularError) Error() string {
	if e.NotFinite {
		return fmt.Sprintf("block-tridiagonal factorisation: non-finite entry at point %d, component %d", e.Point, e.Component)
	}
	return fmt.Sprintf("block-tridiagonal factorisation: singular at point %d, component %d (no non-zero pivot)", e.Point, e.Component)
}

// pivotTolerance is the relative size below which a pivot counts as zero:
// |pivot| ≤ pivotTolerance · (largest |entry| the pivot column had, before
// elimination, in the rows not yet used as pivots), i.e. the column has
// cancelled to round-off. Measuring against the column keeps the test
// independent of row scaling, which in discretised PDEs differs by many
// orders of magnitude between equations, and of rows that are large in other
// columns (a flame's energy row holds chemical-source derivatives up to 1e14
// times its temperature entry; a row-relative test calls that well-defined
// pivot zero).
const pivotTolerance = 1e-14

// Factor computes the block LU factorisation (block Thomas algorithm) of m:
//
//	D′_0 = D_0,  D′_j = D_j − L_j · G_{j−1},  G_j = D′_j⁻¹ · U_j,
//
// with each D′_j factored by Gaussian elimination with partial (row)
// pivoting inside the block; see Golub & Van Loan, "Matrix Computations",
// 4th ed. (2013), §4.5.1 (block tridiagonal systems) and §3.4 (partial
// pivoting). No pivoting happens across blocks, so the factorisation exists
// when every Schur complement D′_j is non-singular, which holds for block
// diagonally dominant matrices and in practice for the Jacobians of
// well-posed boundary-value problems. The block operations are gonum's
// dense kernels (Gemm, Getrf, Getrs) rather than row-by-row updates.
//
// Cost: about (14/3)·N·B³ floating-point operations. Factor allocates only
// on its first call for a given matrix. On failure it returns a
// *SingularError naming the point and component.
func (m *BlockTridiagonal) Factor() error {
	n, b := m.N, m.B
	bb := b * b
	if m.lu == nil {
		m.lu = make([]float64, n*bb)
		m.g = make([]float64, n*bb)
		m.piv = make([]int, n*b)
		m.orig = make([]float64, bb)
		m.origRow = make([]int, b)
	}
	m.factored = false
	copy(m.lu, m.Diag)
	for j := 0; j < n; j++ {
		if j > 0 {
			blas64.Gemm(blas.NoTrans, blas.NoTrans, -1, m.general(m.Lower, j), m.general(m.g, j-1), 1, m.general(m.lu, j))
		}
		piv := m.piv[j*b : (j+1)*b]
		if err := luFactor(m.lu[j*bb:(j+1)*bb], piv, b, m.orig, m.origRow); err != nil {
			err.Point = j
			return err
		}
		if j < n-1 {
			g := m.g[j*bb : (j+1)*bb]
			copy(g, m.Upper[j*bb:(j+1)*bb])
			lapack64.Getrs(blas.NoTrans, m.general(m.lu, j), m.general(m.g, j), piv)
			for i, v := range g {
				if math.IsInf(v, 0) || math.IsNaN(v) {
					return &SingularError{Point: j, Component: i % b, NotFinite: true}
				}
			}
		}
	}
	m.factored = true
	return nil
}

// general is block j of a (Lower, Diag, Upper or the factor storage) as a
// row-major dense matrix.
func (m *BlockTridiagonal) general(a []float64, j int) blas64.General {
	bb := m.B * m.B
	return blas64.General{Rows: m.B, Cols: m.B, Stride: m.B, Data: a[j*bb : (j+1)*bb : (j+1)*bb]}
}

// luFactor overwrites the b×b row-major matrix a with its LU factors
// (PA = LU, L unit lower triangular; lapack64.Getrf), recording the
// interchanges in piv: row k was swapped with row piv[k] at step k. A pivot
// counts as zero when it is at most pivotTolerance times the largest
// magnitude its column had, before elimination, in the rows not used as
// pivots before it. orig (b×b) and origRow (b) are scratch. The returned
// error has Point unset.
func luFactor(a []float64, piv []int, b int, orig []float64, origRow []int) *SingularError {
	for i, v := range a[:b*b] {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return &SingularError{Component: i % b, NotFinite: true}
		}
	}
	copy(orig, a[:b*b])
	lapack64.Getrf(blas64.General{Rows: b, Cols: b, Stride: b, Data: a[:b*b]}, piv[:b])
	// origRow[r]: the original row that ended at position r. Rows at
	// positions ≥ k are those not used as pivots before step k.
	for r := range origRow[:b] {
		origRow[r] = r
	}
	for k, p := range piv[:b] {
		origRow[k], origRow[p] = origRow[p], origRow[k]
	}
	for k := 0; k < b; k++ {
		scale := 0.0
		for r := k; r < b; r++ {
			scale = max(scale, math.Abs(orig[origRow[r]*b+k]))
		}
		if pv := math.Abs(a[k*b+k]); pv == 0 || pv <= pivotTolerance*scale {
			return &SingularError{Component: k}
		}
	}
	return nil
}

// luSolveVec overwrites the vector x (length b) with A⁻¹·x using the
// factors from luFactor.
func luSolveVec(lu []float64, piv []int, b int, x []float64) {
	lapack64.Getrs(blas.NoTrans, blas64.General{Rows: b, Cols: b, Stride: b, Data: lu[:b*b]},
		blas64.General{Rows: b, Cols: 1, Stride: 1, Data: x[:b]}, piv[:b])
}

// Solve overwrites rhs (length N·B, point-major) with the solution x of
// m·x = rhs, using the factors from the last successful Factor:
//
//	forward:  y_j = D′_j⁻¹ (rhs_j − L_j · y_{j−1})
//	backward: x_j = y_j − G_j · x_{j+1}
//
// It panics if m has not been factored since it was last zeroed or since a
// failed Factor, which is a programming error.
func (m *BlockTridiagonal) Solve(rhs []float64) {
	if !m.factored {
		panic("newton: BlockTridiagonal.Solve called without a successful Factor")
	}
	n, b := m.N, m.B
	bb := b * b
	rhs = rhs[:n*b]
	vec := func(j int) blas64.Vector { return blas64.Vector{N: b, Inc: 1, Data: rhs[j*b : (j+1)*b]} }
	for j := 0; j < n; j++ {
		if j > 0 {
			blas64.Gemv(blas.NoTrans, -1, m.general(m.Lower, j), vec(j-1), 1, vec(j))
		}
		luSolveVec(m.lu[j*bb:(j+1)*bb], m.piv[j*b:(j+1)*b], b, rhs[j*b:(j+1)*b])
	}
	for j := n - 2; j >= 0; j-- {
		blas64.Gemv(blas.NoTrans, -1, m.general(m.g, j), vec(j+1), 1, vec(j))
	}
}

// MulVec sets y = m·x (both length N·B, point-major) using Lower, Diag and
// Upper, which Factor leaves intact. x and y must not overlap.
func (m *BlockTridiagonal) MulVec(x, y []float64) {
	n, b := m.N, m.B
	bb := b * b
	x, y = x[:n*b], y[:n*b]
	for j := 0; j < n; j++ {
		yj := y[j*b : (j+1)*b]
		d := m.Diag[j*bb : (j+1)*bb]
		xj := x[j*b : (j+1)*b]
		for r := range yj {
			yj[r] = dot(d[r*b:(r+1)*b], xj)
		}
		if j > 0 {
			l := m.Lower[j*bb : (j+1)*bb]
			xp := x[(j-1)*b : j*b]
			for r := range yj {
				yj[r] += dot(l[r*b:(r+1)*b], xp)
			}
		}
		if j < n-1 {
			u := m.Upper[j*bb : (j+1)*bb]
			xn := x[(j+1)*b : (j+2)*b]
			for r := range yj {
				yj[r] += dot(u[r*b:(r+1)*b], xn)
			}
		}
	}
}

// dot returns Σ x_i·y_i; len(y) must be at least len(x).
func dot(x, y []float64) float64 {
	return floats.Dot(x, y[:len(x)])
}
