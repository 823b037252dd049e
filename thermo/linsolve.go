package thermo

import (
	"errors"
	"math"
)

var errSingular = errors.New("singular linear system")

// solveDense solves the n×n system M x = r in place by Gaussian elimination
// with row equilibration and partial pivoting; M is row-major and is
// destroyed, r receives x. Row equilibration (each row divided by its
// largest entry) keeps pivoting meaningful when rows differ by many orders
// of magnitude, as element-balance rows of trace elements do.
func solveDense(M, r []float64, n int) error {
	for i := 0; i < n; i++ {
		row := M[i*n : (i+1)*n]
		big := 0.0
		for _, v := range row {
			big = math.Max(big, math.Abs(v))
		}
		if big == 0 || math.IsNaN(big) || math.IsInf(big, 0) {
			return errSingular
		}
		inv := 1 / big
		for j := range row {
			row[j] *= inv
		}
		r[i] *= inv
	}
	for c := 0; c < n; c++ {
		p, best := c, math.Abs(M[c*n+c])
		for i := c + 1; i < n; i++ {
			if v := math.Abs(M[i*n+c]); v > best {
				p, best = i, v
			}
		}
		if best < 1e-14 {
			return errSingular
		}
		if p != c {
			for j := c; j < n; j++ {
				M[c*n+j], M[p*n+j] = M[p*n+j], M[c*n+j]
			}
			r[c], r[p] = r[p], r[c]
		}
		piv := 1 / M[c*n+c]
		for i := c + 1; i < n; i++ {
			f := M[i*n+c] * piv
			if f == 0 {
				continue
			}
			for j := c + 1; j < n; j++ {
				M[i*n+j] -= f * M[c*n+j]
			}
			r[i] -= f * r[c]
		}
	}
	for i := n - 1; i >= 0; i-- {
		v := r[i]
		for j := i + 1; j < n; j++ {
			v -= M[i*n+j] * r[j]
		}
		r[i] = v / M[i*n+i]
	}
	return nil
}

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
