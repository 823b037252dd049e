package transport

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
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
// (u_i, f(u_i)) on Chebyshev-Lobatto nodes (which keep the error
// near-minimax at the interval ends), coefficients in rising powers. The
// least-squares problem is solved by QR factorisation of the Vandermonde
// matrix (gonum/mat), which on [-1, 1] with deg <= 8 is well conditioned.
func fitPolynomial(deg int, f func(u float64) float64) ([]float64, error) {
	n := deg + 1
	V := mat.NewDense(fitNodes, n, nil)
	y := mat.NewVecDense(fitNodes, nil)
	for i := 0; i < fitNodes; i++ {
		u := -math.Cos(math.Pi * float64(i) / float64(fitNodes-1))
		v := f(u)
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("non-finite value %g at fit node u=%.3f", v, u)
		}
		y.SetVec(i, v)
		p := 1.0
		for k := 0; k < n; k++ {
			V.Set(i, k, p)
			p *= u
		}
	}
	var c mat.VecDense
	if err := c.SolveVec(V, y); err != nil {
		return nil, fmt.Errorf("polynomial fit: %v", err)
	}
	return append([]float64(nil), c.RawVector().Data...), nil
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
