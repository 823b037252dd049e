package thermo

import (
	"math"
	"math/rand"
	"testing"

	"flame1d/internal/dense"
)

func TestLinearSolvers(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	for _, n := range []int{1, 3, 7, 10} {
		// Symmetric, indefinite, rows and columns scaled over 10 decades, as the
		// equilibrium Newton matrices are.
		A := make([]float64, n*n)
		for i := 0; i < n; i++ {
			for j := 0; j <= i; j++ {
				v := rng.NormFloat64()
				A[i*n+j], A[j*n+i] = v, v
			}
			A[i*n+i] += 3 * float64(n) * math.Copysign(1, rng.NormFloat64())
		}
		d := make([]float64, n)
		for i := range d {
			d[i] = math.Pow(10, -5+10*rng.Float64())
		}
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				A[i*n+j] *= d[i] * d[j]
			}
		}
		x := make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64() / d[i]
		}
		b := make([]float64, n)
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				b[i] += A[i*n+j] * x[j]
			}
		}
		for _, solver := range []string{"dense", "truncated"} {
			M := append([]float64(nil), A...)
			r := append([]float64(nil), b...)
			var err error
			if solver == "dense" {
				err = dense.Solve(M, r, n, maxCondition)
			} else {
				err = solveSymmetricTruncated(M, r, n, newSymmetricWork(n), 1e-12)
			}
			if err != nil {
				t.Fatalf("%s n=%d: %v", solver, n, err)
			}
			for i := range x {
				if math.Abs(r[i]-x[i]) > 1e-9*math.Abs(x[i])+1e-12/d[i] {
					t.Errorf("%s n=%d: x[%d] = %g, want %g", solver, n, i, r[i], x[i])
				}
			}
		}
	}
	// Exactly singular: [[1,1],[1,1]] x = [2,2]. Dense fails; the truncated
	// solve returns the minimum-norm solution (1, 1).
	M := []float64{1, 1, 1, 1}
	if err := dense.Solve(append([]float64(nil), M...), []float64{2, 2}, 2, maxCondition); err == nil {
		t.Error("dense solve of a singular matrix: want error")
	}
	r := []float64{2, 2}
	if err := solveSymmetricTruncated(M, r, 2, newSymmetricWork(2), 1e-12); err != nil {
		t.Fatal(err)
	}
	if math.Abs(r[0]-1) > 1e-14 || math.Abs(r[1]-1) > 1e-14 {
		t.Errorf("minimum-norm solution %v, want [1 1]", r)
	}
}
