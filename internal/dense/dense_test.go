package dense

import (
	"errors"
	"math"
	"math/rand"
	"testing"
)

// A 3×3 system built from the exact solution x = (1, -2, 3), with rows
// of size 1, 1e-20 and 1e20 to exercise the equilibration; the solution
// is exact to round-off (the system is well conditioned once scaled).
func TestSolveExact(t *testing.T) {
	x := []float64{1, -2, 3}
	M := []float64{
		2, 1, 1,
		1e-20, 3e-20, 2e-20,
		4e20, -1e20, 1e20,
	}
	r := make([]float64, 3)
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			r[i] += M[i*3+j] * x[j]
		}
	}
	var s Solver
	for round := 0; round < 2; round++ { // the second call reuses the storage
		Mc, rc := append([]float64(nil), M...), append([]float64(nil), r...)
		if err := s.Solve(Mc, rc, 3, 1e12); err != nil {
			t.Fatal(err)
		}
		for i := range x {
			if math.Abs(rc[i]-x[i]) > 1e-14*math.Abs(x[i]) {
				t.Errorf("round %d: x[%d] = %.17g, want %g", round, i, rc[i], x[i])
			}
		}
	}
}

func TestSolveSingular(t *testing.T) {
	for name, M := range map[string][]float64{
		"dependent rows":  {1, 2, 2, 4},
		"zero row":        {1, 2, 0, 0},
		"NaN":             {1, math.NaN(), 0, 1},
		"ill-conditioned": {1, 1, 1, 1 + 1e-13},
	} {
		if err := Solve(M, []float64{1, 2}, 2, 1e12); !errors.Is(err, ErrSingular) {
			t.Errorf("%s: err = %v, want ErrSingular", name, err)
		}
	}
	if err := Solve([]float64{1}, []float64{1}, 2, 1e12); err == nil || errors.Is(err, ErrSingular) {
		t.Errorf("short matrix: err = %v, want a size error", err)
	}
}

func TestOrthonormalize(t *testing.T) {
	vs := [][]float64{
		{1, 1, 0, 0},
		{2, 2, 0, 0}, // multiple of the first
		{0, 0, 0, 0}, // zero
		{1, 0, 1, 0},
		{0, 1, -1, 0}, // first minus the fourth: dependent
		{1e-12, 0, 0, 1e-12},
	}
	basis, kept := Orthonormalize(vs, 1e-10)
	if want := []int{0, 3, 5}; len(kept) != len(want) || kept[0] != 0 || kept[1] != 3 || kept[2] != 5 {
		t.Fatalf("kept %v, want %v", kept, want)
	}
	for i := range basis {
		for j := range basis {
			want := 0.0
			if i == j {
				want = 1
			}
			if d := dot(basis[i], basis[j]); math.Abs(d-want) > 1e-15 {
				t.Errorf("basis %d·%d = %g, want %g", i, j, d, want)
			}
		}
	}
	if vs[1][0] != 2 {
		t.Error("input modified")
	}
}

func BenchmarkSolve8(b *testing.B) {
	const n = 8
	M0, r0 := make([]float64, n*n), make([]float64, n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			M0[i*n+j] = 1 / float64(i+j+1) // Hilbert-like, well inside the limit at n = 8 after scaling
		}
		M0[i*n+i] += 1
		r0[i] = 1
	}
	M, r := make([]float64, n*n), make([]float64, n)
	var s Solver
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		copy(M, M0)
		copy(r, r0)
		if err := s.Solve(M, r, n, 1e14); err != nil {
			b.Fatal(err)
		}
	}
}

// Both solvers on symmetric, indefinite matrices with rows and columns
// scaled over ten decades, as the Newton matrices of an equilibrium
// calculation are; the solution is known by construction.
func TestSolveScaledSymmetric(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	var s Solver
	for _, n := range []int{1, 3, 7, 10} {
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
		for _, solver := range []string{"LU", "truncated"} {
			M := append([]float64(nil), A...)
			r := append([]float64(nil), b...)
			var err error
			if solver == "LU" {
				err = s.Solve(M, r, n, 1e16)
			} else {
				err = s.SolveSymmetricTruncated(M, r, n, 1e-12)
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
	// Exactly singular: [[1,1],[1,1]] x = [2,2]. LU refuses it; the
	// truncated solve returns the minimum-norm solution (1, 1).
	M := []float64{1, 1, 1, 1}
	if err := Solve(append([]float64(nil), M...), []float64{2, 2}, 2, 1e16); !errors.Is(err, ErrSingular) {
		t.Errorf("LU of a singular matrix: err = %v, want ErrSingular", err)
	}
	r := []float64{2, 2}
	if err := s.SolveSymmetricTruncated(M, r, 2, 1e-12); err != nil {
		t.Fatal(err)
	}
	if math.Abs(r[0]-1) > 1e-14 || math.Abs(r[1]-1) > 1e-14 {
		t.Errorf("minimum-norm solution %v, want [1 1]", r)
	}
}
