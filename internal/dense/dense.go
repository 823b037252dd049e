// Package dense holds the small dense linear algebra the physics packages
// share: the solution of a square system by LU factorisation (gonum's
// LAPACK) after row equilibration, its truncated least-squares fallback for
// symmetric systems singular in floating point, and Gram-Schmidt
// orthonormalisation that keeps the linearly independent vectors of a list. The block-tridiagonal
// factorisation of the flame Jacobian is package newton's own.
package dense

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// ErrSingular is returned for a system with a zero, non-finite or
// (relative to the condition limit) vanishing row or pivot.
var ErrSingular = errors.New("singular linear system")

// Solver solves square systems M x = r of up to a few dozen unknowns. It
// keeps its work storage between calls and allocates nothing once it has
// seen the largest size; a Solver is used by one goroutine at a time. The
// zero value is ready to use.
type Solver struct {
	ipiv, iwork []int
	work        []float64

	// SolveSymmetricTruncated
	scale, v, y []float64
}

// Solve solves the n×n system M x = r, M row-major, by LU factorisation
// with partial pivoting (LAPACK dgetrf/dgetrs as gonum's lapack64 has them)
// after dividing each row by its largest entry. The equilibration keeps
// pivoting meaningful when rows differ by many orders of magnitude, as the
// balance rows of trace elements do (Golub & Van Loan, Matrix
// Computations, 4th ed. 2013, sec. 3.5.2). M is overwritten with its
// factors and r receives x. The system is refused (an error wrapping
// ErrSingular) when a row is zero or not finite, a pivot vanishes, or the
// estimated 1-norm condition number of the equilibrated matrix (dgecon) is
// not below maxCond: the solution would not be determined by the data.
func (s *Solver) Solve(M, r []float64, n int, maxCond float64) error {
	if len(M) < n*n || len(r) < n {
		return fmt.Errorf("dense: %d×%d system with %d matrix entries and %d right-hand sides", n, n, len(M), len(r))
	}
	if n == 0 {
		return nil
	}
	for i := 0; i < n; i++ {
		row := M[i*n : (i+1)*n]
		big := 0.0
		for _, v := range row {
			big = math.Max(big, math.Abs(v))
		}
		if big == 0 || math.IsNaN(big) || math.IsInf(big, 0) {
			return fmt.Errorf("row %d is zero or not finite: %w", i, ErrSingular)
		}
		inv := 1 / big
		for j := range row {
			row[j] *= inv
		}
		r[i] *= inv
	}
	if len(s.ipiv) < n {
		s.ipiv, s.iwork, s.work = make([]int, n), make([]int, n), make([]float64, 4*n)
	}
	a := blas64.General{Rows: n, Cols: n, Stride: n, Data: M[:n*n]}
	anorm := lapack64.Lange(lapack.MaxColumnSum, a, s.work)
	if !lapack64.Getrf(a, s.ipiv[:n]) {
		return fmt.Errorf("zero pivot: %w", ErrSingular)
	}
	if rcond := lapack64.Gecon(lapack.MaxColumnSum, a, anorm, s.work[:4*n], s.iwork[:n]); !(rcond*maxCond > 1) {
		return fmt.Errorf("condition number %.3g: %w", 1/rcond, ErrSingular)
	}
	lapack64.Getrs(blas.NoTrans, a, blas64.General{Rows: n, Cols: 1, Stride: 1, Data: r[:n]}, s.ipiv[:n])
	for _, v := range r[:n] {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("solution not finite: %w", ErrSingular)
		}
	}
	return nil
}

// SolveSymmetricTruncated solves the symmetric n×n system M x = r in the
// least-squares sense, dropping directions whose eigenvalue is below rcond
// times the largest:
//
//	x = S sum_{|μ_k| > rcond μ_max} v_k (v_k·S r)/μ_k
//
// for the symmetrically scaled matrix S M S = V diag(μ) V^T, S_ii = 1 /
// sqrt(max_j |M_ij|). The eigenpairs come from cyclic Jacobi rotations
// (Golub & Van Loan, Matrix Computations, 4th ed. 2013, sec. 8.5), which
// keep the solution of the scaled test systems (dense_test.go) to 1e-9
// where gonum's EigenSym (LAPACK dsyev) loses a further digit. For a
// singular M it returns the minimum-norm solution of the scaled system; it
// is the fallback for systems singular in floating point. M is destroyed
// and r receives x.
func (s *Solver) SolveSymmetricTruncated(M, r []float64, n int, rcond float64) error {
	if len(M) < n*n || len(r) < n {
		return fmt.Errorf("dense: %d×%d system with %d matrix entries and %d right-hand sides", n, n, len(M), len(r))
	}
	if len(s.scale) < n || len(s.v) < n*n {
		s.scale, s.v, s.y = make([]float64, n), make([]float64, n*n), make([]float64, n)
	}
	S, V, y := s.scale[:n], s.v[:n*n], s.y[:n]
	for i := 0; i < n; i++ {
		big := 0.0
		for j := 0; j < n; j++ {
			big = math.Max(big, math.Abs(M[i*n+j]))
		}
		if big == 0 || math.IsNaN(big) || math.IsInf(big, 0) {
			return ErrSingular
		}
		S[i] = 1 / math.Sqrt(big)
	}
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			M[i*n+j] *= S[i] * S[j]
			V[i*n+j] = 0
		}
		V[i*n+i] = 1
	}
	for sweep := 0; sweep < 100; sweep++ {
		off, diag := 0.0, 0.0
		for i := 0; i < n; i++ {
			diag += M[i*n+i] * M[i*n+i]
			for j := i + 1; j < n; j++ {
				off += M[i*n+j] * M[i*n+j]
			}
		}
		if off <= 1e-32*diag {
			break
		}
		for p := 0; p < n; p++ {
			for q := p + 1; q < n; q++ {
				apq := M[p*n+q]
				if apq == 0 {
					continue
				}
				theta := (M[q*n+q] - M[p*n+p]) / (2 * apq)
				t := math.Copysign(1, theta) / (math.Abs(theta) + math.Sqrt(theta*theta+1))
				c := 1 / math.Sqrt(t*t+1)
				s := t * c
				for k := 0; k < n; k++ {
					mkp, mkq := M[k*n+p], M[k*n+q]
					M[k*n+p] = c*mkp - s*mkq
					M[k*n+q] = s*mkp + c*mkq
				}
				for k := 0; k < n; k++ {
					mpk, mqk := M[p*n+k], M[q*n+k]
					M[p*n+k] = c*mpk - s*mqk
					M[q*n+k] = s*mpk + c*mqk
				}
				for k := 0; k < n; k++ {
					vkp, vkq := V[k*n+p], V[k*n+q]
					V[k*n+p] = c*vkp - s*vkq
					V[k*n+q] = s*vkp + c*vkq
				}
			}
		}
	}
	top := 0.0
	for i := 0; i < n; i++ {
		top = math.Max(top, math.Abs(M[i*n+i]))
	}
	if top == 0 {
		return ErrSingular
	}
	for i := range y {
		y[i] = 0
	}
	for k := 0; k < n; k++ {
		mu := M[k*n+k]
		if math.Abs(mu) <= rcond*top {
			continue
		}
		d := 0.0
		for i := 0; i < n; i++ {
			d += V[i*n+k] * S[i] * r[i]
		}
		d /= mu
		for i := 0; i < n; i++ {
			y[i] += V[i*n+k] * d
		}
	}
	for i := 0; i < n; i++ {
		r[i] = S[i] * y[i]
	}
	return nil
}

// Solve solves the n×n system M x = r with a Solver of its own (see
// Solver.Solve); for one-off systems.
func Solve(M, r []float64, n int, maxCond float64) error {
	var s Solver
	return s.Solve(M, r, n, maxCond)
}

// Basis is an orthonormal basis built one vector at a time by modified
// Gram-Schmidt, each vector orthogonalised twice against the basis so far
// (Giraud, Langou & Rozložník, Comput. Math. Appl. 50 (2005) 1069: "twice
// is enough"). The zero value is an empty basis with tolerance 0.
type Basis struct {
	// Tol is the relative size of a vector's part orthogonal to the basis
	// at or below which the vector counts as dependent.
	Tol float64
	// Vectors are the orthonormal basis vectors.
	Vectors [][]float64
}

// Add adds the normalised part of v orthogonal to the basis when that part
// is larger than b.Tol times the norm of v, and reports whether it did. A
// zero or non-finite v is never added; v is not modified.
func (b *Basis) Add(v []float64) bool {
	w := append([]float64(nil), v...)
	n0 := norm(w)
	if n0 == 0 || math.IsNaN(n0) || math.IsInf(n0, 0) {
		return false
	}
	for pass := 0; pass < 2; pass++ {
		for _, u := range b.Vectors {
			d := dot(w, u)
			for j := range w {
				w[j] -= d * u[j]
			}
		}
	}
	nn := norm(w)
	if nn <= b.Tol*n0 {
		return false
	}
	for j := range w {
		w[j] /= nn
	}
	b.Vectors = append(b.Vectors, w)
	return true
}

// Orthonormalize adds the vectors of vs to an empty Basis with tolerance
// tol, in order, and returns the basis vectors and the indices into vs of
// the vectors kept.
func Orthonormalize(vs [][]float64, tol float64) (basis [][]float64, kept []int) {
	b := Basis{Tol: tol}
	for i, v := range vs {
		if b.Add(v) {
			kept = append(kept, i)
		}
	}
	return b.Vectors, kept
}

func dot(a, b []float64) float64 {
	s := 0.0
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}

func norm(a []float64) float64 { return math.Sqrt(dot(a, a)) }
