package newton

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// randomBlockTridiagonal fills an n×n block matrix of b×b blocks. Diagonal
// blocks are P·(M + b·I) with M uniform in [−1, 1) and P a random row
// permutation when permute is set (so that the largest entry of a column is
// usually off the diagonal and elimination without pivoting would meet
// small or zero pivots); off-diagonal blocks are uniform in [−0.25, 0.25).
func randomBlockTridiagonal(rng *rand.Rand, n, b int, permute bool) *BlockTridiagonal {
	m := NewBlockTridiagonal(n, b)
	for j := range n {
		d := m.DiagBlock(j)
		perm := rng.Perm(b)
		for r := range b {
			big := r // column of the dominant entry of row r
			if permute {
				big = perm[r]
			}
			for c := range b {
				d[r*b+c] = 2*rng.Float64() - 1
			}
			d[r*b+big] += float64(b) + 1
			if big != r {
				d[r*b+r] = 0 // without row interchanges this pivot would be zero
			}
		}
		if j > 0 {
			for i, l := 0, m.LowerBlock(j); i < len(l); i++ {
				l[i] = 0.5*rng.Float64() - 0.25
			}
		}
		if j < n-1 {
			for i, u := 0, m.UpperBlock(j); i < len(u); i++ {
				u[i] = 0.5*rng.Float64() - 0.25
			}
		}
	}
	return m
}

// dense returns m as a gonum dense matrix.
func dense(m *BlockTridiagonal) *mat.Dense {
	n, b := m.N, m.B
	a := mat.NewDense(n*b, n*b, nil)
	for j := range n {
		for r := range b {
			for c := range b {
				a.Set(j*b+r, j*b+c, m.DiagBlock(j)[r*b+c])
				if j > 0 {
					a.Set(j*b+r, (j-1)*b+c, m.LowerBlock(j)[r*b+c])
				}
				if j < n-1 {
					a.Set(j*b+r, (j+1)*b+c, m.UpperBlock(j)[r*b+c])
				}
			}
		}
	}
	return a
}

func maxAbsDiff(x, y []float64) float64 {
	d := 0.0
	for i := range x {
		d = max(d, math.Abs(x[i]-y[i]))
	}
	return d
}

// TestFactorSolveAgainstDense compares the block Thomas solution with a
// dense LU solve with partial pivoting (gonum mat.LU, itself LAPACK dgetrf;
// Anderson et al., LAPACK Users' Guide, 3rd ed., SIAM 1999).
func TestFactorSolveAgainstDense(t *testing.T) {
	cases := []struct {
		n, b    int
		permute bool
	}{
		{1, 1, false}, {1, 5, false}, {1, 5, true}, {7, 1, false},
		{2, 3, false}, {3, 3, true}, {10, 4, false}, {10, 4, true},
		{25, 8, true}, {40, 13, false}, {6, 55, true},
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for _, tc := range cases {
		m := randomBlockTridiagonal(rng, tc.n, tc.b, tc.permute)
		a := dense(m)
		size := tc.n * tc.b
		rhs := make([]float64, size)
		for i := range rhs {
			rhs[i] = 2*rng.Float64() - 1
		}
		var lu mat.LU
		lu.Factorize(a)
		var want mat.VecDense
		if err := lu.SolveVecTo(&want, false, mat.NewVecDense(size, append([]float64(nil), rhs...))); err != nil {
			t.Fatalf("n=%d b=%d: dense solve: %v", tc.n, tc.b, err)
		}
		cond := lu.Cond()

		if err := m.Factor(); err != nil {
			t.Fatalf("n=%d b=%d permute=%v: Factor: %v", tc.n, tc.b, tc.permute, err)
		}
		x := append([]float64(nil), rhs...)
		m.Solve(x)
		// Backward-stable solvers agree to about cond·ε relative
		// (Golub & Van Loan 2013, §3.3); 100 allows for growth in n·b.
		tol := 100 * cond * 0x1p-52
		if d := maxAbsDiff(x, want.RawVector().Data) / mat.Norm(&want, math.Inf(1)); d > tol {
			t.Errorf("n=%d b=%d permute=%v: relative difference from dense solve %.3g > %.3g (cond %.3g)", tc.n, tc.b, tc.permute, d, tol, cond)
		}
		// MulVec after Factor still uses the original matrix.
		y := make([]float64, size)
		m.MulVec(x, y)
		if d := maxAbsDiff(y, rhs); d > 1e-12 {
			t.Errorf("n=%d b=%d: |A·x − rhs| = %.3g after Factor, want < 1e-12", tc.n, tc.b, d)
		}
	}
}

// TestMulVecAgainstDense checks MulVec against gonum's dense product,
// exact up to the order of summation.
func TestMulVecAgainstDense(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, nb := range [][2]int{{1, 1}, {1, 4}, {5, 1}, {9, 6}} {
		m := randomBlockTridiagonal(rng, nb[0], nb[1], true)
		// Entries outside the matrix must be ignored.
		for i := range m.LowerBlock(0) {
			m.LowerBlock(0)[i] = 1e300
			m.UpperBlock(m.N - 1)[i] = 1e300
		}
		size := nb[0] * nb[1]
		x := make([]float64, size)
		for i := range x {
			x[i] = 2*rng.Float64() - 1
		}
		var want mat.VecDense
		want.MulVec(dense(m), mat.NewVecDense(size, x))
		y := make([]float64, size)
		m.MulVec(x, y)
		if d := maxAbsDiff(y, want.RawVector().Data); d > 1e-13 {
			t.Errorf("n=%d b=%d: MulVec differs from dense product by %.3g", nb[0], nb[1], d)
		}
	}
}

func TestFactorSingular(t *testing.T) {
	tests := []struct {
		name      string
		point     int
		component int
		notFinite bool
		spoil     func(m *BlockTridiagonal)
	}{
		{"zero column", 2, 1, false, func(m *BlockTridiagonal) {
			// Column 1 of D_2 and L_2 zero: the Schur complement D′_2 has a
			// zero column, so elimination finds no pivot for component 1.
			for r := range m.B {
				m.DiagBlock(2)[r*m.B+1] = 0
			}
			clear(m.LowerBlock(2))
		}},
		{"equal rows", 0, 2, false, func(m *BlockTridiagonal) {
			d := m.DiagBlock(0)
			copy(d[2*m.B:3*m.B], d[0:m.B])
		}},
		{"NaN entry", 3, 0, true, func(m *BlockTridiagonal) {
			m.DiagBlock(3)[1*m.B+0] = math.NaN()
		}},
	}
	rng := rand.New(rand.NewPCG(5, 6))
	for _, tc := range tests {
		m := randomBlockTridiagonal(rng, 5, 3, false)
		tc.spoil(m)
		err := m.Factor()
		var se *SingularError
		if !errors.As(err, &se) {
			t.Fatalf("%s: Factor error %v, want *SingularError", tc.name, err)
		}
		if se.Point != tc.point || (!tc.notFinite && se.Component != tc.component) || se.NotFinite != tc.notFinite {
			t.Errorf("%s: got %+v, want point %d component %d notFinite %v", tc.name, *se, tc.point, tc.component, tc.notFinite)
		}
	}
}

// TestRefactorAfterShift checks that Factor leaves Diag intact so that a
// shifted matrix can be factored again (as the pseudo-time Jacobian
// J + diag(w/dt) is).
func TestRefactorAfterShift(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	m := randomBlockTridiagonal(rng, 8, 4, true)
	if err := m.Factor(); err != nil {
		t.Fatal(err)
	}
	for j := range m.N {
		for c := range m.B {
			m.DiagBlock(j)[c*m.B+c] += 3
		}
	}
	if err := m.Factor(); err != nil {
		t.Fatal(err)
	}
	x := make([]float64, m.N*m.B)
	for i := range x {
		x[i] = float64(i%5) - 2
	}
	y := make([]float64, len(x))
	m.MulVec(x, y)
	m.Solve(y)
	if d := maxAbsDiff(x, y); d > 1e-12 {
		t.Errorf("solve after shift and refactor: error %.3g, want < 1e-12", d)
	}
}

// TestFactorSolveAllocations checks that Factor and Solve allocate nothing
// once a matrix has been factored (conventions: no allocation in hot loops).
func TestFactorSolveAllocations(t *testing.T) {
	m := randomBlockTridiagonal(rand.New(rand.NewPCG(11, 12)), 20, 6, true)
	rhs := make([]float64, 120)
	if err := m.Factor(); err != nil {
		t.Fatal(err)
	}
	allocs := testing.AllocsPerRun(10, func() {
		if err := m.Factor(); err != nil {
			t.Fatal(err)
		}
		m.Solve(rhs)
	})
	if allocs != 0 {
		t.Errorf("Factor+Solve: %v allocations per run, want 0", allocs)
	}
}

func BenchmarkFactorSolve(b *testing.B) {
	for _, nb := range [][2]int{{200, 55}, {500, 12}} {
		rng := rand.New(rand.NewPCG(9, 10))
		m := randomBlockTridiagonal(rng, nb[0], nb[1], true)
		rhs := make([]float64, nb[0]*nb[1])
		b.Run(fmt.Sprintf("N=%d/B=%d", nb[0], nb[1]), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if err := m.Factor(); err != nil {
					b.Fatal(err)
				}
				m.Solve(rhs)
			}
		})
	}
}

// A block whose row holds entries 1e20 times its pivot is well-posed (an
// energy row with large chemical-source derivatives); the factorisation must
// accept it and solve exactly: [[1, 1e20], [0, 1]] x = [2e20, 1] has
// x = [1e20, 1].
func TestFactorAcceptsLargeOffDiagonalRows(t *testing.T) {
	m := NewBlockTridiagonal(1, 2)
	copy(m.DiagBlock(0), []float64{1, 1e20, 0, 1})
	if err := m.Factor(); err != nil {
		t.Fatalf("well-posed block refused: %v", err)
	}
	x := []float64{2e20, 1}
	m.Solve(x)
	if x[0] != 1e20 || x[1] != 1 {
		t.Errorf("x = %v, want [1e20 1]", x)
	}
}

// AddDiagonal shifts exactly the diagonal: (m + diag(d))·x = m·x + d⊙x.
func TestAddDiagonal(t *testing.T) {
	m := randomBlockTridiagonal(rand.New(rand.NewPCG(13, 14)), 6, 3, true)
	x, d := make([]float64, 18), make([]float64, 18)
	for i := range x {
		x[i], d[i] = float64(i%4)-1.5, float64(i)
	}
	want := make([]float64, 18)
	m.MulVec(x, want)
	for i := range want {
		want[i] += d[i] * x[i]
	}
	m.AddDiagonal(d)
	got := make([]float64, 18)
	m.MulVec(x, got)
	if e := maxAbsDiff(got, want); e > 1e-13 {
		t.Errorf("after AddDiagonal: m·x off by %.3g", e)
	}
}
