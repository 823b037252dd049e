package grid

import (
	"math"
	"testing"
)

// refineUntilFixed refines x for the exact profile f until Refine reports no
// change, re-evaluating f at every new point.
func refineUntilFixed(t *testing.T, f func(float64) float64, x []float64, c Criteria, maxIter int) []float64 {
	t.Helper()
	for it := 0; it < maxIter; it++ {
		u := sample(f, x)
		nx, _, changed, err := Refine(x, u, 1, nil, nil, c)
		if err != nil {
			t.Fatalf("refinement %d on %d points: %v", it, len(x), err)
		}
		if !changed {
			return x
		}
		x = nx
	}
	t.Fatalf("grid still changing after %d refinements (%d points)", maxIter, len(x))
	return nil
}

func sample(f func(float64) float64, x []float64) []float64 {
	u := make([]float64, len(x))
	for j, v := range x {
		u[j] = f(v)
	}
	return u
}

func TestRefineTanhReachesFixedPoint(t *testing.T) {
	f := func(v float64) float64 { return math.Tanh((v - 0.5) / 0.01) }
	x := refineUntilFixed(t, f, Uniform(0, 1, 11), DefaultCriteria(), 50)
	p, err := Analyse(x, sample(f, x), 1, nil, nil, DefaultCriteria())
	if err != nil || !p.Empty() {
		t.Fatalf("converged grid: plan %+v, err %v; want empty plan", p, err)
	}
}
