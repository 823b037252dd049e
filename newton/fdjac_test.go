package newton

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// coupled3 is a smooth three-component test residual coupling each point to
// both neighbours, with fixed ghost values g beyond the ends:
//
//	F0 = a²b + sin c + (a⁻ − 2a + a⁺) + b⁺·a⁻
//	F1 = e^{0.3b} − a·c + ½·b⁺·c⁻
//	F2 = c³ + cos a⁺ + b⁻
//
// where (a, b, c) are the unknowns of point j and ⁻, ⁺ mark points j∓1.
type coupled3 struct {
	n     int
	calls int
	// wall, if set, makes the residual fail whenever component 1 of any
	// point exceeds it.
	wall float64
}

const coupled3Ghost = 0.3

func (p *coupled3) at(u []float64, j, c int) float64 {
	if j < 0 || j >= p.n {
		return coupled3Ghost
	}
	return u[j*3+c]
}

func (p *coupled3) residual(u, f []float64) error {
	p.calls++
	for j := range p.n {
		if p.wall != 0 && u[j*3+1] > p.wall {
			return fmt.Errorf("component 1 of point %d above %g", j, p.wall)
		}
	}
	for j := range p.n {
		a, b, c := p.at(u, j, 0), p.at(u, j, 1), p.at(u, j, 2)
		am, bm, cm := p.at(u, j-1, 0), p.at(u, j-1, 1), p.at(u, j-1, 2)
		ap, bp := p.at(u, j+1, 0), p.at(u, j+1, 1)
		f[j*3+0] = a*a*b + math.Sin(c) + (am - 2*a + ap) + bp*am
		f[j*3+1] = math.Exp(0.3*b) - a*c + 0.5*bp*cm
		f[j*3+2] = c*c*c + math.Cos(ap) + bm
	}
	return nil
}

// jacobian is the analytic Jacobian of residual.
func (p *coupled3) jacobian(u []float64) *BlockTridiagonal {
	J := NewBlockTridiagonal(p.n, 3)
	for j := range p.n {
		a, b, c := p.at(u, j, 0), p.at(u, j, 1), p.at(u, j, 2)
		am, cm := p.at(u, j-1, 0), p.at(u, j-1, 2)
		ap, bp := p.at(u, j+1, 0), p.at(u, j+1, 1)
		d := J.DiagBlock(j)
		d[0*3+0], d[0*3+1], d[0*3+2] = 2*a*b-2, a*a, math.Cos(c)
		d[1*3+0], d[1*3+1], d[1*3+2] = -c, 0.3*math.Exp(0.3*b), -a
		d[2*3+2] = 3 * c * c
		if j > 0 {
			l := J.LowerBlock(j)
			l[0*3+0] = 1 + bp
			l[1*3+2] = 0.5 * bp
			l[2*3+1] = 1
		}
		if j < p.n-1 {
			up := J.UpperBlock(j)
			up[0*3+0] = 1
			up[0*3+1] = am
			up[1*3+1] = 0.5 * cm
			up[2*3+0] = -math.Sin(ap)
		}
	}
	return J
}

func coupled3State(n int) []float64 {
	u := make([]float64, 3*n)
	for i := range u {
		u[i] = 0.8 * math.Sin(1.7*float64(i)+0.4)
	}
	return u
}

// TestFiniteDifferenceJacobian compares the coloured forward-difference
// Jacobian with the analytic one. With h = √ε·(1 + |u|) ≤ 3e-8 and
// |∂²F| ≤ 10, |F| ≤ 10 on the test states, truncation h·|F”|/2 and rounding
// ε·|F|/h are each below 2e-7 (Dennis & Schnabel 1996, §5.4); 1e-6 bounds
// their sum. It also checks the count of residual calls, min(N,3)·B.
func TestFiniteDifferenceJacobian(t *testing.T) {
	for _, tc := range []struct {
		n    int
		wall bool
	}{{1, false}, {2, false}, {3, false}, {4, false}, {7, false}, {10, false}, {7, true}} {
		p := &coupled3{n: tc.n}
		u := coupled3State(tc.n)
		if tc.wall {
			// Put point 2 exactly on the wall: its + perturbation fails and
			// the column group must be retried with −h.
			p.wall = u[2*3+1]
			for j := range tc.n {
				if j != 2 {
					u[j*3+1] = min(u[j*3+1], p.wall-0.1)
				}
			}
		}
		f0 := make([]float64, 3*tc.n)
		if err := p.residual(u, f0); err != nil {
			t.Fatal(err)
		}
		uSaved := append([]float64(nil), u...)
		p.calls = 0
		J := NewBlockTridiagonal(tc.n, 3)
		// Pre-fill with garbage: every entry must be overwritten.
		for i := range J.Diag {
			J.Lower[i], J.Diag[i], J.Upper[i] = 99, 99, 99
		}
		if err := FiniteDifferenceJacobian(p.residual, u, f0, J, fdPerturbation, fdPerturbation); err != nil {
			t.Fatalf("N=%d wall=%v: %v", tc.n, tc.wall, err)
		}
		want := p.jacobian(u)
		for name, pair := range map[string][2][]float64{"Lower": {J.Lower, want.Lower}, "Diag": {J.Diag, want.Diag}, "Upper": {J.Upper, want.Upper}} {
			if d := maxAbsDiff(pair[0], pair[1]); d > 1e-6 {
				t.Errorf("N=%d wall=%v: %s differs from the analytic Jacobian by %.3g > 1e-6", tc.n, tc.wall, name, d)
			}
		}
		wantCalls := min(tc.n, 3) * 3
		if tc.wall {
			wantCalls++ // one retried column group
		}
		if p.calls != wantCalls {
			t.Errorf("N=%d wall=%v: %d residual calls, want %d", tc.n, tc.wall, p.calls, wantCalls)
		}
		if maxAbsDiff(u, uSaved) != 0 {
			t.Errorf("N=%d: u changed by the finite-difference Jacobian", tc.n)
		}
	}
}

func TestFiniteDifferenceJacobianAllocations(t *testing.T) {
	p := &coupled3{n: 9}
	u := coupled3State(9)
	f0 := make([]float64, 27)
	J := NewBlockTridiagonal(9, 3)
	residual := p.residual
	if err := FiniteDifferenceJacobian(residual, u, f0, J, 1e-8, 1e-8); err != nil {
		t.Fatal(err)
	}
	allocs := testing.AllocsPerRun(10, func() {
		if err := FiniteDifferenceJacobian(residual, u, f0, J, 1e-8, 1e-8); err != nil {
			t.Fatal(err)
		}
	})
	if allocs != 0 {
		t.Errorf("FiniteDifferenceJacobian: %v allocations per call after the first, want 0", allocs)
	}
}

func TestFiniteDifferenceJacobianErrors(t *testing.T) {
	p := &coupled3{n: 4}
	u := coupled3State(4)
	f0 := make([]float64, 12)
	J := NewBlockTridiagonal(4, 3)
	if err := FiniteDifferenceJacobian(p.residual, u[:9], f0, J, 1e-8, 1e-8); err == nil {
		t.Error("wrong length accepted")
	}
	if err := FiniteDifferenceJacobian(p.residual, u, f0, J, 1e-8, 0); err == nil {
		t.Error("absPert = 0 accepted")
	}
	failing := errors.New("state not allowed")
	err := FiniteDifferenceJacobian(func(u, f []float64) error { return failing }, u, f0, J, 1e-8, 1e-8)
	if !errors.Is(err, failing) {
		t.Errorf("residual failing both ways: error %v, want it to wrap %v", err, failing)
	}
	if err := FiniteDifferenceJacobian(p.residual, []float64{1e30, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0}, f0, J, 0, 1e-8); err == nil {
		t.Error("perturbation lost in rounding (1e30 + 1e-8) accepted")
	}
}

// BenchmarkFiniteDifferenceJacobian measures the overhead of the coloured
// finite-difference Jacobian beyond the residual: the residual here only
// copies u, so the time is perturbation and difference bookkeeping plus
// 3·B trivially cheap calls.
func BenchmarkFiniteDifferenceJacobian(b *testing.B) {
	const n, nb = 200, 55
	u := make([]float64, n*nb)
	for i := range u {
		u[i] = float64(i%7) + 0.5
	}
	residual := func(u, f []float64) error {
		copy(f, u)
		return nil
	}
	f0 := make([]float64, n*nb)
	copy(f0, u)
	J := NewBlockTridiagonal(n, nb)
	b.ReportAllocs()
	for b.Loop() {
		if err := FiniteDifferenceJacobian(residual, u, f0, J, 1e-8, 1e-8); err != nil {
			b.Fatal(err)
		}
	}
}
