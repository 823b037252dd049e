package newton

import (
	"math"
	"testing"
)

// bratu is the Bratu boundary-value problem u” + λ·e^u = 0, u(0) = u(1) = 0,
// discretised by the three-point formula on a (possibly non-uniform) grid
// x_0 = 0 < … < x_{N−1} = 1 with the boundary values as algebraic
// equations. The residual is written F = −(u” + λe^u) so that the
// pseudo-transient form du/dt = u” + λe^u is a stable diffusion problem.
type bratu struct {
	lambda float64
	x      []float64
}

func (p *bratu) Size() (int, int) { return len(p.x), 1 }

func (p *bratu) Residual(u, f []float64) error {
	n := len(p.x)
	f[0], f[n-1] = u[0], u[n-1]
	for j := 1; j < n-1; j++ {
		hm, hp := p.x[j]-p.x[j-1], p.x[j+1]-p.x[j]
		d2 := 2 / (hm + hp) * ((u[j+1]-u[j])/hp - (u[j]-u[j-1])/hm)
		f[j] = -(d2 + p.lambda*math.Exp(u[j]))
	}
	return nil
}

// TransientWeights marks the two boundary equations algebraic.
func (p *bratu) TransientWeights(u, w []float64) {
	for j := range w {
		w[j] = 1
	}
	w[0], w[len(w)-1] = 0, 0
}

// bratuAnalytic is bratu with its exact Jacobian.
type bratuAnalytic struct{ bratu }

func (p *bratuAnalytic) Jacobian(u, f0 []float64, J *BlockTridiagonal) error {
	J.Zero()
	n := len(p.x)
	J.DiagBlock(0)[0], J.DiagBlock(n - 1)[0] = 1, 1
	for j := 1; j < n-1; j++ {
		hm, hp := p.x[j]-p.x[j-1], p.x[j+1]-p.x[j]
		s := 2 / (hm + hp)
		J.LowerBlock(j)[0] = -s / hm
		J.UpperBlock(j)[0] = -s / hp
		J.DiagBlock(j)[0] = s/hm + s/hp - p.lambda*math.Exp(u[j])
	}
	return nil
}

// bratuTheta solves θ = √(2λ)·cosh(θ/4) for the lower-branch root by
// Newton's method from θ = 0.
func bratuTheta(lambda float64) float64 {
	theta := 0.0
	for range 50 {
		g := theta - math.Sqrt(2*lambda)*math.Cosh(theta/4)
		dg := 1 - math.Sqrt(2*lambda)*math.Sinh(theta/4)/4
		theta -= g / dg
	}
	return theta
}

// bratuExact is the closed-form solution
// u(x) = −2 ln[cosh((x − ½)θ/2) / cosh(θ/4)]; see Boyd, "An analytical and
// numerical study of the two-dimensional Bratu equation", J. Sci. Comput. 1
// (1986) 183–206, which quotes the one-dimensional solution.
func bratuExact(lambda, x float64) float64 {
	theta := bratuTheta(lambda)
	return -2 * math.Log(math.Cosh((x-0.5)*theta/2)/math.Cosh(theta/4))
}

func uniformGrid(n int) []float64 {
	x := make([]float64, n)
	for j := range x {
		x[j] = float64(j) / float64(n-1)
	}
	return x
}

// stretchedGrid maps a uniform ξ through x = ξ − a·sin(2πξ)/(2π), a smooth
// map with dx/dξ = 1 − a·cos(2πξ) ∈ [1−a, 1+a]: points cluster near the
// ends and spacing varies by a factor (1+a)/(1−a) = 3 for a = ½. On a
// smoothly mapped grid the three-point formula stays second order.
func stretchedGrid(n int) []float64 {
	x := uniformGrid(n)
	for j, xi := range x {
		x[j] = xi - 0.5*math.Sin(2*math.Pi*xi)/(2*math.Pi)
	}
	x[n-1] = 1
	return x
}

// bratuOptions asks for convergence far below the discretisation error and
// no time stepping, so any failure of Newton shows.
func bratuOptions() Options {
	opt := DefaultOptions(1)
	opt.AbsTol[0], opt.RelTol[0] = 1e-12, 1e-10
	opt.MaxTimeStepAttempts = 0
	return opt
}

func TestBratuTheta(t *testing.T) {
	// Lower-branch θ for λ = 1, 1.517164599 (from memory; the value
	// commonly tabulated with Boyd 1986), and the turning point λ_c ≈ 3.5138
	// where the branch folds (from memory, Boyd 1986).
	if got := bratuTheta(1); math.Abs(got-1.517164599) > 1e-8 {
		t.Errorf("θ(λ=1) = %.10f, want 1.517164599", got)
	}
	if got := bratuExact(1, 0.5); math.Abs(got-0.140539) > 1e-6 {
		// u(½) = 2 ln cosh(θ/4) = 0.140539 for λ = 1 (from memory).
		t.Errorf("u(½) = %.7f for λ = 1, want 0.140539", got)
	}
}

// TestBratuConvergence solves the discrete Bratu problem for λ = 1 on
// uniform and stretched grids of 21…321 points and checks that the error
// against the closed form falls as h² (observed order within 0.1 of 2 for
// successive halvings): a discretisation-convergence study, so the check
// is of the solver's answer, not of its own residual.
func TestBratuConvergence(t *testing.T) {
	const lambda = 1
	for _, g := range []struct {
		name string
		grid func(int) []float64
	}{{"uniform", uniformGrid}, {"stretched", stretchedGrid}} {
		prev := 0.0
		for _, n := range []int{21, 41, 81, 161, 321} {
			p := &bratu{lambda: lambda, x: g.grid(n)}
			u := make([]float64, n)
			res, err := Solve(p, u, bratuOptions())
			if err != nil {
				t.Fatalf("%s, N=%d: %v", g.name, n, err)
			}
			if res.TimeSteps != 0 {
				t.Errorf("%s, N=%d: %d time steps on a smooth problem, want 0", g.name, n, res.TimeSteps)
			}
			e := 0.0
			for j, x := range p.x {
				e = max(e, math.Abs(u[j]-bratuExact(lambda, x)))
			}
			t.Logf("%s, N=%d: max error %.3e", g.name, n, e)
			if prev > 0 {
				order := math.Log2(prev / e)
				if math.Abs(order-2) > 0.1 {
					t.Errorf("%s, N=%d: observed order %.3f (errors %.3g → %.3g), want 2 ± 0.1", g.name, n, order, prev, e)
				}
			}
			prev = e
		}
		if g.name != "uniform" {
			continue
		}
		// A priori bound on the uniform grid. The truncation error of the
		// three-point formula is τ = h²/12·u'''' with
		// u'''' = λe^u(λe^u − u'²), at most λ²e^{2u(½)} = 1.324 for λ = 1.
		// The discrete error solves (A − D)e = τ with A the discrete
		// −d²/dx² (‖A⁻¹‖∞ = 1/8, the maximum of x(1−x)/2) and
		// D = diag(λe^u) ≤ 1.151, so ‖e‖∞ ≤ ‖τ‖∞·(1/8)/(1 − 1.151/8)
		// = 0.0161·h² to leading order (the stability-plus-consistency
		// argument of Isaacson & Keller, "Analysis of Numerical Methods",
		// Wiley 1966, ch. 8); 5% is allowed for higher-order terms.
		h := 1.0 / 320
		if bound := 1.05 * 0.0161 * h * h; prev > bound {
			t.Errorf("uniform: max error %.3g on 321 points exceeds the a-priori bound %.3g", prev, bound)
		}
	}
}

// TestBratuQuadraticConvergence records the undamped Newton step norms with
// a fresh Jacobian every step and checks the order of convergence
// log(s_{k+1}/s_k) / log(s_k/s_{k−1}) ≈ 2 (Deuflhard 2004, Thm. 2.2:
// Newton's method converges quadratically near a regular solution).
func TestBratuQuadraticConvergence(t *testing.T) {
	for _, tc := range []struct {
		jac  string
		grid func(int) []float64
	}{{"finite-difference", uniformGrid}, {"finite-difference", stretchedGrid}, {"analytic", uniformGrid}, {"analytic", stretchedGrid}} {
		jac := tc.jac
		b := bratu{lambda: 3, x: tc.grid(101)}
		var p Problem = &b
		if jac == "analytic" {
			p = &bratuAnalytic{b}
		}
		opt := bratuOptions()
		opt.MaxJacobianAge = 1
		// Purely absolute scaling keeps the norm the same from step to
		// step, so ratios of scaled norms are ratios of step sizes.
		opt.RelTol[0], opt.AbsTol[0] = 0, 1e-12
		var steps []float64
		opt.Progress = func(e Event) {
			if e.Damping == 1 {
				steps = append(steps, e.StepNorm)
			}
		}
		u := make([]float64, 101)
		res, err := Solve(p, u, opt)
		if err != nil {
			t.Fatalf("%s: %v", jac, err)
		}
		var orders []float64
		for k := 1; k+1 < len(steps); k++ {
			// The order is asymptotic: start once steps are below 0.1
			// (a sixth of max u) and stop before they reach rounding level
			// of the residual (≈ 1e-12 here), at 1e-11.
			if steps[k-1] > 1e11 {
				continue
			}
			if steps[k+1] < 10 {
				break
			}
			p := math.Log(steps[k+1]/steps[k]) / math.Log(steps[k]/steps[k-1])
			if p < 1.9 || p > 2.1 {
				t.Errorf("%s: order estimate %.3f from steps %.3g, %.3g, %.3g; want ≈ 2", jac, p, steps[k-1], steps[k], steps[k+1])
			}
			orders = append(orders, p)
		}
		if len(orders) < 2 {
			t.Errorf("%s: only %d full Newton steps (%v), too few to estimate the order", jac, len(steps), steps)
		}
		if jac == "analytic" && res.ResidualEvaluations > 2*res.NewtonIterations+5 {
			t.Errorf("analytic Jacobian: %d residual evaluations for %d steps, finite differences seem to be used", res.ResidualEvaluations, res.NewtonIterations)
		}
		t.Logf("%s: steps %.3g, orders %.3f", jac, steps, orders)
	}
}
