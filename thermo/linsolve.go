package thermo

import (
	"math"

	"flame1d/internal/dense"
)

var errSingular = dense.ErrSingular

// maxCondition is the estimated condition number (of the row-equilibrated
// matrix) at which an equilibrium Newton matrix counts as singular in
// floating point: about 1/ε of float64. Columns of the matrix differ by
// up to ten decades (element potentials against ln n and ln T), which the
// estimate includes; a smaller limit refuses regular systems.
const maxCondition = 1e16

// symmetricWork is scratch space for solveSymmetricTruncated.
type symmetricWork struct {
	scale, v, y []float64
}

func newSymmetricWork(n int) *symmetricWork {
	return &symmetricWork{scale: make([]float64, n), v: make([]float64, n*n), y: make([]float64, n)}
}

// solveSymmetricTruncated solves the symmetric n×n system M x = r in the
// least-squares sense, dropping directions whose eigenvalue is below
// rcond times the largest: x = S sum_{|μ_k| > rcond μ_max} v_k (v_k·S r)/μ_k
// for the symmetrically scaled matrix S M S = V diag(μ) V^T, S_ii = 1 /
// sqrt(max_j |M_ij|). The eigenpairs come from cyclic Jacobi rotations
// (Golub & Van Loan, Matrix Computations, 4th ed. 2013, sec. 8.5). M is
// destroyed and r receives x.
//
// It is the fallback for Newton matrices that are singular in floating
// point: when one species carries two elements in the very ratio of the
// mixture, the difference of their potentials is fixed only by trace
// species and is left unchanged rather than filled with round-off.
func solveSymmetricTruncated(M, r []float64, n int, w *symmetricWork, rcond float64) error {
	S, V, y := w.scale[:n], w.v[:n*n], w.y[:n]
	for i := 0; i < n; i++ {
		big := 0.0
		for j := 0; j < n; j++ {
			big = math.Max(big, math.Abs(M[i*n+j]))
		}
		if big == 0 || math.IsNaN(big) || math.IsInf(big, 0) {
			return errSingular
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
		return errSingular
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
