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
