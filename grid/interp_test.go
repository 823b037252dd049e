package grid

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestInterpolateLinearExact: piecewise-linear interpolation reproduces a
// linear profile exactly inside the old grid and the end values outside
// (constant extrapolation), for sorted and unsorted positions, and returns
// the nodal values at the nodes.
func TestInterpolateLinearExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	const block = 3
	xOld := []float64{-1, -0.3, 0, 0.01, 0.5, 2}
	line := func(x float64, c int) float64 { return float64(c+1)*x - 0.25*float64(c) }
	uOld := make([]float64, len(xOld)*block)
	for j, x := range xOld {
		for c := 0; c < block; c++ {
			uOld[j*block+c] = line(x, c)
		}
	}
	xNew := append([]float64{}, xOld...)
	for i := 0; i < 200; i++ {
		xNew = append(xNew, -1.5+4*rng.Float64()) // unsorted, some outside
	}
	uNew := make([]float64, len(xNew)*block)
	Interpolate(xOld, uOld, block, xNew, uNew)
	for i, x := range xNew {
		xc := math.Min(math.Max(x, xOld[0]), xOld[len(xOld)-1])
		for c := 0; c < block; c++ {
			got, want := uNew[i*block+c], line(xc, c)
			if i < len(xOld) {
				want = uOld[i*block+c] // nodes: bit-exact
				if got != want {
					t.Errorf("node %d comp %d: %v, want %v", i, c, got, want)
				}
			} else if math.Abs(got-want) > 1e-14 {
				t.Errorf("x = %g comp %d: %v, want %v", x, c, got, want)
			}
		}
	}
}

// TestInterpolateErrorBound compares interpolation of sin on a fine sorted
// grid with the linear-interpolation bound h²max|u”|/8 = h²/8 (Burden and
// Faires, Numerical Analysis, interpolation error theorem).
func TestInterpolateErrorBound(t *testing.T) {
	xOld := Clustered(0, 3, 1, 0.5, 40)
	uOld := sample(math.Sin, xOld)
	hmax := 0.0
	for j := 1; j < len(xOld); j++ {
		hmax = math.Max(hmax, xOld[j]-xOld[j-1])
	}
	xNew := Uniform(0, 3, 1001)
	uNew := make([]float64, len(xNew))
	Interpolate(xOld, uOld, 1, xNew, uNew)
	worst := 0.0
	for i, x := range xNew {
		worst = math.Max(worst, math.Abs(uNew[i]-math.Sin(x)))
	}
	if bound := hmax * hmax / 8; worst > bound || worst < bound/100 {
		t.Errorf("max error %.3g, want at most h²/8 = %.3g (and not far below: the bound is attained at order h²)", worst, bound)
	}
}

func TestInterpolateSinglePointAndNaN(t *testing.T) {
	uNew := make([]float64, 6)
	Interpolate([]float64{0.3}, []float64{7, 8}, 2, []float64{-1, 0.3, math.NaN()}, uNew)
	want := []float64{7, 8, 7, 8}
	for i, w := range want {
		if uNew[i] != w {
			t.Errorf("uNew[%d] = %g, want %g", i, uNew[i], w)
		}
	}
	if !math.IsNaN(uNew[4]) || !math.IsNaN(uNew[5]) {
		t.Errorf("NaN position gave %v, want NaN values", uNew[4:])
	}
}

func BenchmarkInterpolate(b *testing.B) {
	const block = 50
	xOld := Clustered(0, 0.02, 0.006, 0.002, 300)
	uOld := make([]float64, len(xOld)*block)
	for i := range uOld {
		uOld[i] = float64(i % 17)
	}
	xNew := Clustered(0, 0.02, 0.006, 0.002, 450)
	uNew := make([]float64, len(xNew)*block)
	for b.Loop() {
		Interpolate(xOld, uOld, block, xNew, uNew)
	}
}
