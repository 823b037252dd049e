package transport

import (
	"fmt"
	"math"
)

// lnTScale maps T to the fit variable u = (ln T - c)/h in [-1, 1] over
// [TMin, TMax]; polynomials in u are well conditioned where powers of ln T
// are not.
type lnTScale struct {
	tMin, tMax float64 // K
	c, h       float64
}

func newLnTScale(tMin, tMax float64) lnTScale {
	lo, hi := math.Log(tMin), math.Log(tMax)
	return lnTScale{tMin: tMin, tMax: tMax, c: (hi + lo) / 2, h: (hi - lo) / 2}
}

func (s lnTScale) u(T float64) float64 { return (math.Log(T) - s.c) / s.h }

// temperature returns the temperature at fit variable u.
func (s lnTScale) temperature(u float64) float64 { return math.Exp(s.c + s.h*u) }

// horner evaluates sum_i c[i] u^i.
func horner(c []float64, u float64) float64 {
	v := 0.0
	for i := len(c) - 1; i >= 0; i-- {
		v = v*u + c[i]
	}
	return v
}

// fitNodes is the number of least-squares nodes on [-1, 1]; errors are
// measured on a separate, finer grid (errorNodes).
const (
	fitNodes   = 41
	errorNodes = 301
)

// fitPolynomial returns the degree-deg least-squares polynomial in u through
// (u_i, y_i) on Chebyshev-Lobatto nodes (which keep the error near-minimax
// at the interval ends). The normal equations are solved by Gaussian
// elimination with partial pivoting; on [-1, 1] with deg <= 8 they are well
// conditioned.
func fitPolynomial(deg int, f func(u float64) float64) ([]float64, error) {
	n := deg + 1
	a := make([]float64, n*n)
	rhs := make([]float64, n)
	pw := make([]float64, 2*n)
	for i := 0; i < fitNodes; i++ {
		u := -math.Cos(math.Pi * float64(i) / float64(fitNodes-1))
		y := f(u)
		if math.IsNaN(y) || math.IsInf(y, 0) {
			return nil, fmt.Errorf("non-finite value %g at fit node u=%.3f", y, u)
		}
		pw[0] = 1
		for k := 1; k < 2*n; k++ {
			pw[k] = pw[k-1] * u
		}
		for r := 0; r < n; r++ {
			rhs[r] += pw[r] * y
			for c := 0; c < n; c++ {
				a[r*n+c] += pw[r+c]
			}
		}
	}
	for col := 0; col < n; col++ {
		piv := col
		for r := col + 1; r < n; r++ {
			if math.Abs(a[r*n+col]) > math.Abs(a[piv*n+col]) {
				piv = r
			}
		}
		if a[piv*n+col] == 0 {
			return nil, fmt.Errorf("singular normal equations in polynomial fit")
		}
		if piv != col {
			for c := 0; c < n; c++ {
				a[col*n+c], a[piv*n+c] = a[piv*n+c], a[col*n+c]
			}
			rhs[col], rhs[piv] = rhs[piv], rhs[col]
		}
		for r := col + 1; r < n; r++ {
			m := a[r*n+col] / a[col*n+col]
			for c := col; c < n; c++ {
				a[r*n+c] -= m * a[col*n+c]
			}
			rhs[r] -= m * rhs[col]
		}
	}
	coef := make([]float64, n)
	for r := n - 1; r >= 0; r-- {
		s := rhs[r]
		for c := r + 1; c < n; c++ {
			s -= a[r*n+c] * coef[c]
		}
		coef[r] = s / a[r*n+r]
	}
	return coef, nil
}

// fitError returns the largest err(fit(u), f(u)) over errorNodes evenly
// spaced points of [-1, 1].
func fitError(coef []float64, f func(u float64) float64, err func(fit, exact float64) float64) float64 {
	worst := 0.0
	for i := 0; i < errorNodes; i++ {
		u := -1 + 2*float64(i)/float64(errorNodes-1)
		worst = math.Max(worst, err(horner(coef, u), f(u)))
	}
	return worst
}
