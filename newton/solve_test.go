package newton

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// arctanChain is F_j = (atan(u_j), atan(v_j − 1)) + κ·(2x_j − x_{j−1} − x_{j+1})
// for both components x ∈ {u, v}, with zero ghost values beyond the ends for
// u and one for v. F is the gradient of a strictly convex function, so its
// only root is u = 0, v = 1. For κ small the problem is nearly the scalar
// equation atan(x) = 0, on which undamped Newton diverges from |x_0| above
// about 1.39 (Kelley, "Solving Nonlinear Equations with Newton's Method",
// SIAM 2003, §1.7.1, from memory).
type arctanChain struct {
	n     int
	kappa float64
}

func (p *arctanChain) Size() (int, int) { return p.n, 2 }

func (p *arctanChain) Residual(x, f []float64) error {
	ghost := [2]float64{0, 1}
	at := func(j, c int) float64 {
		if j < 0 || j >= p.n {
			return ghost[c]
		}
		return x[j*2+c]
	}
	for j := range p.n {
		f[j*2] = math.Atan(at(j, 0)) + p.kappa*(2*at(j, 0)-at(j-1, 0)-at(j+1, 0))
		f[j*2+1] = math.Atan(at(j, 1)-1) + p.kappa*(2*at(j, 1)-at(j-1, 1)-at(j+1, 1))
	}
	return nil
}

// TestDampingRescuesDivergentNewton shows that the undamped Newton iteration
// on arctanChain from x_0 = 2 diverges, and that Solve's damped iteration
// reaches the root without falling back to time stepping.
func TestDampingRescuesDivergentNewton(t *testing.T) {
	p := &arctanChain{n: 12, kappa: 0.01}
	start := func() []float64 {
		x := make([]float64, 24)
		for j := range 12 {
			x[j*2], x[j*2+1] = 2, -1.5
		}
		return x
	}

	// Undamped Newton, built from the package's tested pieces.
	x := start()
	f := make([]float64, 24)
	J := NewBlockTridiagonal(12, 2)
	for range 4 {
		if err := p.Residual(x, f); err != nil {
			t.Fatal(err)
		}
		if err := FiniteDifferenceJacobian(p.Residual, x, f, J, fdPerturbation, fdPerturbation); err != nil {
			t.Fatal(err)
		}
		if err := J.Factor(); err != nil {
			t.Fatal(err)
		}
		for i := range f {
			f[i] = -f[i]
		}
		J.Solve(f)
		for i := range x {
			x[i] += f[i]
		}
	}
	if m := maxAbs(x); m < 100 {
		t.Fatalf("undamped Newton: max |x| = %.3g after 4 steps; expected divergence (> 100), so the test problem does not need damping", m)
	}

	x = start()
	opt := DefaultOptions(2)
	opt.MaxTimeStepAttempts = 0
	minDampingSeen := 1.0
	opt.Progress = func(e Event) { minDampingSeen = min(minDampingSeen, e.Damping) }
	res, err := Solve(p, x, opt)
	if err != nil {
		t.Fatalf("damped Newton: %v", err)
	}
	if minDampingSeen >= 1 {
		t.Error("damped Newton converged without damping; the test shows nothing")
	}
	for j := range 12 {
		// Converged to RelTol 1e-4·|x| + AbsTol 1e-9, then one more step.
		if math.Abs(x[j*2]) > 1e-8 || math.Abs(x[j*2+1]-1) > 1e-4 {
			t.Errorf("point %d: (%.3g, %.6f), want (0, 1)", j, x[j*2], x[j*2+1])
		}
	}
	if res.TimeSteps != 0 || !res.Converged {
		t.Errorf("TimeSteps = %d, Converged = %v; want 0 and true", res.TimeSteps, res.Converged)
	}
}

// cubicChain is F_j = (u_j³ − 3u_j + 3 + κ·(2u_j − u_{j−1} − u_{j+1}), v_j − u_j²)
// with reflecting ends (u_{−1} = u_0, u_N = u_{N−1}). Its root is uniform,
// u = r, v = r², r = −(∛((3+√5)/2) + ∛((3−√5)/2)) ≈ −2.1038 the real root
// of u³ − 3u + 3 by Cardano's formula. From u > 1, Newton is drawn to the
// local minimum of |F| at u = 1 where ∂F/∂u = 0 and stalls; the flow
// du/dt = −F crosses it since F > 0 for all u > r. Component v is
// algebraic (transient weight 0).
type cubicChain struct {
	n     int
	kappa float64
}

func (p *cubicChain) Size() (int, int) { return p.n, 2 }

func (p *cubicChain) Residual(x, f []float64) error {
	for j := range p.n {
		u := x[j*2]
		um, up := x[max(j-1, 0)*2], x[min(j+1, p.n-1)*2]
		f[j*2] = u*u*u - 3*u + 3 + p.kappa*(2*u-um-up)
		f[j*2+1] = x[j*2+1] - u*u
	}
	return nil
}

func (p *cubicChain) TransientWeights(x, w []float64) {
	for j := range p.n {
		w[j*2], w[j*2+1] = 1, 0
	}
}

func cubicRoot() float64 {
	s := math.Sqrt(5)
	return -(math.Cbrt((3+s)/2) + math.Cbrt((3-s)/2))
}

func TestPseudoTransientRescue(t *testing.T) {
	p := &cubicChain{n: 15, kappa: 0.05}
	start := func() []float64 {
		x := make([]float64, 30)
		for j := range 15 {
			x[j*2] = 1.5 + 0.1*math.Sin(float64(j))
			x[j*2+1] = x[j*2] * x[j*2]
		}
		return x
	}
	opt := DefaultOptions(2)
	opt.MaxTimeStepAttempts = 0
	x := start()
	res, err := Solve(p, x, opt)
	if err == nil || !errors.Is(err, ErrNotConverged) {
		t.Fatalf("steady Newton alone: error %v, want ErrNotConverged (the problem must need time stepping)", err)
	}
	// On failure u holds an accepted state, and ResidualNorm describes it.
	f := make([]float64, 30)
	if err := p.Residual(x, f); err != nil {
		t.Fatal(err)
	}
	if math.Abs(maxAbs(f)-res.ResidualNorm) > 1e-12*maxAbs(f) {
		t.Errorf("after failure: ResidualNorm %.6g, but max|F(u)| = %.6g", res.ResidualNorm, maxAbs(f))
	}

	opt = DefaultOptions(2)
	opt.TimeStep, opt.MaxTimeStep = 0.05, 1
	x = start()
	res, err = Solve(p, x, opt)
	if err != nil {
		t.Fatalf("with time stepping: %v", err)
	}
	if res.TimeSteps == 0 {
		t.Error("converged without time steps")
	}
	r := cubicRoot()
	if math.Abs(r-(-2.1038034027355365)) > 1e-12 {
		t.Errorf("Cardano root %.16f, want -2.1038034027355365 (from memory)", r)
	}
	for j := range 15 {
		// Tolerance: one step after a step of scaled norm < 1, i.e. well
		// inside RelTol 1e-4 relative.
		if math.Abs(x[j*2]-r) > 1e-4*math.Abs(r) || math.Abs(x[j*2+1]-r*r) > 1e-4*r*r {
			t.Errorf("point %d: (%.8f, %.8f), want (%.8f, %.8f)", j, x[j*2], x[j*2+1], r, r*r)
		}
	}
	t.Logf("time steps %d, Newton %d, Jacobians %d, factorisations %d", res.TimeSteps, res.NewtonIterations, res.JacobianEvaluations, res.Factorizations)
}

// TestTimeStepFloor checks that pseudo-time stepping gives up, wrapping
// ErrNotConverged, when the time step falls below its minimum: the
// residual fails for every state but the initial one.
func TestTimeStepFloor(t *testing.T) {
	p := &failingAway{cubicChain{n: 4, kappa: 0}, nil}
	x := []float64{1.5, 2.25, 1.5, 2.25, 1.5, 2.25, 1.5, 2.25}
	p.start = append([]float64(nil), x...)
	opt := DefaultOptions(2)
	opt.TimeStep, opt.MinTimeStep = 1e-3, 1e-6
	_, err := Solve(p, x, opt)
	if !errors.Is(err, ErrNotConverged) || !strings.Contains(err.Error(), "below the minimum") {
		t.Errorf("error %v, want ErrNotConverged about the minimum time step", err)
	}
	if maxAbsDiff(x, p.start) != 0 {
		t.Errorf("u = %v after failure, want the initial (only accepted) state %v", x, p.start)
	}
}

type failingAway struct {
	cubicChain
	start []float64
}

var errAway = errors.New("state leaves the admissible set")

func (p *failingAway) Residual(x, f []float64) error {
	if maxAbsDiff(x, p.start) > 1e-6 {
		return errAway
	}
	return p.cubicChain.Residual(x, f)
}

// logKinetics has a "mass fraction" y ≥ 0 per point with residual
// ln((y + ε)/(y* + ε)) plus diffusion, and a coupled unbounded second
// unknown z − y. The residual fails for y ≤ −ε. From y = 1 the full Newton
// step overshoots to y ≈ −3 (for ε = 0.01, y* = 0.1). Every state passed to
// the residual is recorded.
type logKinetics struct {
	n           int
	minY        float64
	target, eps float64
}

func (p *logKinetics) Size() (int, int) { return p.n, 2 }

func (p *logKinetics) Residual(x, f []float64) error {
	for j := range p.n {
		p.minY = min(p.minY, x[j*2])
	}
	for j := range p.n {
		y := x[j*2]
		if y+p.eps <= 0 {
			return errors.New("negative mass fraction")
		}
		ym, yp := x[max(j-1, 0)*2], x[min(j+1, p.n-1)*2]
		f[j*2] = math.Log((y+p.eps)/(p.target+p.eps)) + 0.01*(2*y-ym-yp)
		f[j*2+1] = x[j*2+1] - y
	}
	return nil
}

func TestBoundsRespected(t *testing.T) {
	for _, bounded := range []bool{false, true} {
		p := &logKinetics{n: 6, minY: math.Inf(1), target: 0.1, eps: 0.01}
		x := make([]float64, 12)
		for j := range 6 {
			x[j*2], x[j*2+1] = 1, 1
		}
		opt := DefaultOptions(2)
		if bounded {
			opt.Lower[0] = 0
		}
		if _, err := Solve(p, x, opt); err != nil {
			t.Fatalf("bounded=%v: %v", bounded, err)
		}
		for j := range 6 {
			if math.Abs(x[j*2]-p.target) > 1e-4*p.target || math.Abs(x[j*2+1]-p.target) > 1e-4*p.target {
				t.Errorf("bounded=%v: point %d = (%.6g, %.6g), want (%g, %g)", bounded, j, x[j*2], x[j*2+1], p.target, p.target)
			}
		}
		if bounded && p.minY < 0 {
			t.Errorf("with lower bound 0 the residual saw y = %.3g", p.minY)
		}
		if !bounded && p.minY >= 0 {
			t.Errorf("without bounds y never went negative (min %.3g): the test does not exercise the bound", p.minY)
		}
	}
}

func TestJacobianReuse(t *testing.T) {
	var results [2]Result
	var answers [2][]float64
	for k, age := range []int{1, 10} {
		p := &bratu{lambda: 3, x: stretchedGrid(101)}
		u := make([]float64, 101)
		opt := bratuOptions()
		opt.MaxJacobianAge = age
		res, err := Solve(p, u, opt)
		if err != nil {
			t.Fatalf("MaxJacobianAge %d: %v", age, err)
		}
		results[k], answers[k] = res, u
	}
	if results[1].JacobianEvaluations >= results[0].JacobianEvaluations {
		t.Errorf("Jacobian evaluations: %d with reuse, %d without; want fewer with reuse", results[1].JacobianEvaluations, results[0].JacobianEvaluations)
	}
	// Both met ‖Δu‖ < 1 in the scale 1e-10·|u| + 1e-12 and then applied the
	// step, so they agree to a few times that scale.
	if d := maxAbsDiff(answers[0], answers[1]); d > 1e-9 {
		t.Errorf("answers with and without Jacobian reuse differ by %.3g", d)
	}
	t.Logf("fresh: %+v", results[0])
	t.Logf("reuse: %+v", results[1])
}

// TestAnalyticJacobianUsed checks that a JacobianEvaluator replaces finite
// differences: with it, residual evaluations are only those of the Newton
// trial points.
func TestAnalyticJacobianUsed(t *testing.T) {
	fd := &bratu{lambda: 2, x: uniformGrid(51)}
	an := &bratuAnalytic{bratu{lambda: 2, x: uniformGrid(51)}}
	u1, u2 := make([]float64, 51), make([]float64, 51)
	r1, err1 := Solve(fd, u1, bratuOptions())
	r2, err2 := Solve(an, u2, bratuOptions())
	if err1 != nil || err2 != nil {
		t.Fatal(err1, err2)
	}
	if r2.ResidualEvaluations >= r1.ResidualEvaluations-3*r1.JacobianEvaluations+1 {
		t.Errorf("residual evaluations %d with analytic Jacobian vs %d with finite differences (%d Jacobians)", r2.ResidualEvaluations, r1.ResidualEvaluations, r1.JacobianEvaluations)
	}
	if d := maxAbsDiff(u1, u2); d > 1e-9 {
		t.Errorf("analytic and finite-difference Jacobians give answers %.3g apart", d)
	}
}

type nanProblem struct{ bratu }

// Residual returns NaN without an error once u(½) exceeds 0.1.
func (p *nanProblem) Residual(u, f []float64) error {
	err := p.bratu.Residual(u, f)
	if u[len(u)/2] > 0.1 {
		f[3] = math.NaN()
	}
	return err
}

func TestSolveErrors(t *testing.T) {
	good := func() Options { return bratuOptions() }
	p := &bratu{lambda: 1, x: uniformGrid(11)}
	tests := []struct {
		name string
		p    Problem
		u    []float64
		opt  func() Options
		want string
	}{
		{"length", p, make([]float64, 10), good, "len(u)"},
		{"tolerance count", p, make([]float64, 11), func() Options { o := good(); o.AbsTol = nil; return o }, "AbsTol"},
		{"zero abs tol", p, make([]float64, 11), func() Options { o := good(); o.AbsTol[0] = 0; return o }, "AbsTol[0]"},
		{"bounds order", p, make([]float64, 11), func() Options { o := good(); o.Lower[0], o.Upper[0] = 1, 0; return o }, "bounds"},
		{"outside bounds", p, make([]float64, 11), func() Options { o := good(); o.Lower[0] = 0.5; return o }, "outside its bounds"},
		{"time steps", p, make([]float64, 11), func() Options { o := good(); o.MaxTimeStepAttempts = 1; o.MinTimeStep = 1; return o }, "MinTimeStep"},
		{"NaN start", p, append(make([]float64, 10), math.NaN()), good, "initial state"},
		{"NaN residual", &nanProblem{bratu{lambda: 3, x: uniformGrid(11)}}, make([]float64, 11), good, "residual is NaN"},
	}
	failing := &failingAway{cubicChain{n: 2}, []float64{9, 9, 9, 9}}
	res, err := Solve(failing, []float64{1, 1, 1, 1}, DefaultOptions(2))
	if !errors.Is(err, errAway) || !errors.Is(err, ErrNotConverged) || !math.IsInf(res.ResidualNorm, 1) {
		t.Errorf("residual failing at the start: error %v, ResidualNorm %g; want ErrNotConverged wrapping %v and +Inf", err, res.ResidualNorm, errAway)
	}
	for _, tc := range tests {
		_, err := Solve(tc.p, tc.u, tc.opt())
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want one mentioning %q", tc.name, err, tc.want)
		}
	}
}

func BenchmarkSolveBratu(b *testing.B) {
	p := &bratu{lambda: 3, x: stretchedGrid(401)}
	u := make([]float64, 401)
	opt := bratuOptions()
	for b.Loop() {
		clear(u)
		if _, err := Solve(p, u, opt); err != nil {
			b.Fatal(err)
		}
	}
}

// shifted is F_{j,c} = u_{j,c} − target_{j,c}; with a Jacobian error set,
// its Jacobian evaluator always fails, and with badWeight its transient
// weights are negative.
type shifted struct {
	n, b      int
	target    []float64
	jacErr    error
	badWeight bool
}

func (p *shifted) Size() (int, int) { return p.n, p.b }

func (p *shifted) Residual(u, f []float64) error {
	for i := range u {
		f[i] = u[i] - p.target[i]
	}
	return nil
}

func (p *shifted) TransientWeights(u, w []float64) {
	for i := range w {
		w[i] = 1
	}
	if p.badWeight {
		w[len(w)-1] = -1
	}
}

type shiftedFailingJacobian struct{ shifted }

func (p *shiftedFailingJacobian) Jacobian(u, f0 []float64, J *BlockTridiagonal) error {
	return p.jacErr
}

func TestSolveFailureReasons(t *testing.T) {
	target := []float64{0.5, 0.5, 0.5, -1, 0.5, 0.5}
	start := func() []float64 { return []float64{0.2, 0.2, 0.2, 0, 0.2, 0.2} }
	jacErr := errors.New("chemistry table missing")

	// The unknown (point 1, component 1) sits on its lower bound 0 and the
	// step points below it: the projected step moves every other unknown to
	// its target, and then only the blocked one is left, which no damping
	// helps.
	opt := DefaultOptions(2)
	opt.Lower[1] = 0
	opt.MaxTimeStepAttempts = 0
	x := start()
	_, err := Solve(&shifted{n: 3, b: 2, target: target}, x, opt)
	if !errors.Is(err, ErrNotConverged) || !strings.Contains(err.Error(), "point 1, component 1 at its bound") {
		t.Errorf("blocked by bound: error %v, want ErrNotConverged naming point 1, component 1", err)
	}
	if want := []float64{0.5, 0.5, 0.5, 0, 0.5, 0.5}; maxAbsDiff(x, want) > 1e-12 {
		t.Errorf("blocked by bound: u = %v, want %v (all but the blocked unknown at their targets)", x, want)
	}

	opt = DefaultOptions(2)
	_, err = Solve(&shiftedFailingJacobian{shifted{n: 3, b: 2, target: target, jacErr: jacErr}}, start(), opt)
	if !errors.Is(err, ErrNotConverged) || !errors.Is(err, jacErr) {
		t.Errorf("failing Jacobian: error %v, want it to wrap ErrNotConverged and %v", err, jacErr)
	}

	opt = DefaultOptions(2)
	opt.Lower[1] = 0
	_, err = Solve(&shifted{n: 3, b: 2, target: target, badWeight: true}, start(), opt)
	if err == nil || !strings.Contains(err.Error(), "transient weight at point 2, component 1") {
		t.Errorf("negative transient weight: error %v, want one naming point 2, component 1", err)
	}

	// Without obstacles the linear problem takes one Newton step with one
	// Jacobian (3·B = 6 finite-difference residuals), plus the initial and
	// the trial residual.
	opt = DefaultOptions(2)
	x = start()
	res, err := Solve(&shifted{n: 3, b: 2, target: target}, x, opt)
	if err != nil {
		t.Fatal(err)
	}
	if maxAbsDiff(x, target) > 1e-12 || res.JacobianEvaluations != 1 || res.ResidualEvaluations != 8 || res.NewtonIterations != 1 {
		t.Errorf("linear problem: u = %v, %+v; want the target after 1 step, 1 Jacobian, 8 residuals", x, res)
	}
}

// Flush zeroes trial values below the floor: a linear problem whose
// solution has a component of 1e-200 converges to exactly 0 there, and the
// other component is unaffected.
func TestFlushZeroesTinyValues(t *testing.T) {
	p := &linearProblem{target: []float64{1e-200, 3}}
	opt := DefaultOptions(2)
	opt.Flush = []float64{1e-100, 0}
	u := []float64{1, 1}
	if _, err := Solve(p, u, opt); err != nil {
		t.Fatal(err)
	}
	if u[0] != 0 || math.Abs(u[1]-3) > 1e-12 {
		t.Errorf("u = %v, want [0 3]", u)
	}
	opt.Flush = []float64{1, 0}
	if _, err := Solve(p, []float64{1, 1}, opt); err == nil {
		t.Error("a flush floor above AbsTol was accepted")
	}
}

// linearProblem is F(u) = u - target on one point.
type linearProblem struct{ target []float64 }

func (p *linearProblem) Size() (int, int) { return 1, len(p.target) }
func (p *linearProblem) Residual(u, f []float64) error {
	for i := range u {
		f[i] = u[i] - p.target[i]
	}
	return nil
}

// A looser Newton test inside pseudo-time steps reaches the same root in
// fewer Newton iterations (the time steps are a path, not the answer), and
// Result.TimeStep hands on a step a later solve can start from.
func TestTimeStepTolerance(t *testing.T) {
	p := &cubicChain{n: 15, kappa: 0.05}
	start := func() []float64 {
		x := make([]float64, 30)
		for j := range 15 {
			x[j*2] = 1.5 + 0.1*math.Sin(float64(j))
			x[j*2+1] = x[j*2] * x[j*2]
		}
		return x
	}
	var iters [2]int
	r := cubicRoot()
	for i, tol := range []float64{0, 100} {
		opt := DefaultOptions(2)
		opt.TimeStep, opt.MaxTimeStep = 0.05, 1
		opt.TimeStepTolerance = tol
		x := start()
		res, err := Solve(p, x, opt)
		if err != nil {
			t.Fatalf("TimeStepTolerance %g: %v", tol, err)
		}
		iters[i] = res.NewtonIterations
		for j := range 15 {
			if math.Abs(x[j*2]-r) > 1e-4*math.Abs(r) {
				t.Errorf("TimeStepTolerance %g: point %d u = %.8f, want %.8f", tol, j, x[j*2], r)
			}
		}
		if res.TimeSteps == 0 || !(res.TimeStep > opt.TimeStep && res.TimeStep <= opt.MaxTimeStep) {
			t.Errorf("TimeStepTolerance %g: %d time steps, next step %g; want steps and a grown step in (%g, %g]",
				tol, res.TimeSteps, res.TimeStep, opt.TimeStep, opt.MaxTimeStep)
		}
	}
	if iters[1] >= iters[0] {
		t.Errorf("Newton iterations: %d with the loose time-step test, %d with the tight one; want fewer", iters[1], iters[0])
	}
	opt := DefaultOptions(2)
	opt.TimeStepTolerance = 0.5
	if _, err := Solve(p, start(), opt); err == nil || !strings.Contains(err.Error(), "TimeStepTolerance") {
		t.Errorf("TimeStepTolerance 0.5: error %v, want one naming the option", err)
	}
}

// With ProjectedConvergence a state whose only remaining correction pushes
// an unknown on its bound outward is accepted: the root of the problem
// restricted to the bounds. Without it the same state is a failure.
func TestProjectedConvergence(t *testing.T) {
	target := []float64{0.5, 0.5, 0.5, -1, 0.5, 0.5}
	for _, projected := range []bool{false, true} {
		opt := DefaultOptions(2)
		opt.Lower[1] = 0
		opt.MaxTimeStepAttempts = 0
		opt.ProjectedConvergence = projected
		x := []float64{0.2, 0.2, 0.2, 0, 0.2, 0.2}
		_, err := Solve(&shifted{n: 3, b: 2, target: target}, x, opt)
		if projected != (err == nil) {
			t.Errorf("ProjectedConvergence %v: error %v", projected, err)
		}
		if want := []float64{0.5, 0.5, 0.5, 0, 0.5, 0.5}; maxAbsDiff(x, want) > 1e-12 {
			t.Errorf("ProjectedConvergence %v: u = %v, want %v", projected, x, want)
		}
	}
}

// TimeStepsFirst takes pseudo-time steps before any steady Newton step:
// the first event reported is a time step, and the root is still found.
func TestTimeStepsFirst(t *testing.T) {
	p := &linearProblem{target: []float64{1, 2}}
	opt := DefaultOptions(2)
	opt.TimeStepsFirst = true
	var first string
	opt.Progress = func(e Event) {
		if first == "" {
			first = e.Stage
		}
	}
	u := []float64{0, 0}
	res, err := Solve(p, u, opt)
	if err != nil {
		t.Fatal(err)
	}
	if first != "timestep" || res.TimeSteps != opt.StepsPerAttempt {
		t.Errorf("first event %q, %d time steps; want a time step first and %d steps", first, res.TimeSteps, opt.StepsPerAttempt)
	}
	if maxAbsDiff(u, p.target) > 1e-9 {
		t.Errorf("u = %v, want %v", u, p.target)
	}
}

// firstTransient records the state at which the first pseudo-time step
// starts.
type firstTransient struct {
	cubicChain
	first []float64
}

func (p *firstTransient) TransientWeights(x, w []float64) {
	if p.first == nil {
		p.first = append([]float64(nil), x...)
	}
	p.cubicChain.TransientWeights(x, w)
}

// A failed steady attempt hands the pseudo-time steps the state it started
// from, not the one its damped steps reached: on the cubic chain steady
// Newton accepts steps towards the stationary point u = 1 before it
// fails, and time stepping must begin at the initial state nonetheless.
func TestTimeStepsStartWhereSteadyStarted(t *testing.T) {
	p := &firstTransient{cubicChain: cubicChain{n: 15, kappa: 0.05}}
	x := make([]float64, 30)
	for j := range 15 {
		x[j*2] = 1.5 + 0.1*math.Sin(float64(j))
		x[j*2+1] = x[j*2] * x[j*2]
	}
	start := append([]float64(nil), x...)
	var steadySteps int
	opt := DefaultOptions(2)
	opt.TimeStep, opt.MaxTimeStep = 0.05, 1
	opt.Progress = func(e Event) {
		if e.Stage == "newton" && p.first == nil {
			steadySteps++
		}
	}
	if _, err := Solve(p, x, opt); err != nil {
		t.Fatal(err)
	}
	if steadySteps == 0 {
		t.Fatal("no steady step accepted before the time steps; the test needs a steady attempt that moves the state")
	}
	if d := maxAbsDiff(p.first, start); d != 0 {
		t.Errorf("first pseudo-time step began %g away from the initial state after %d accepted steady steps; want at the initial state", d, steadySteps)
	}
}

// boundedAlgebraic has a differential unknown per point with root 0.5 and an
// algebraic one (transient weight 0) whose root -1 lies below its bound 0.
type boundedAlgebraic struct{ n int }

func (p *boundedAlgebraic) Size() (int, int) { return p.n, 2 }

func (p *boundedAlgebraic) Residual(u, f []float64) error {
	for j := range p.n {
		f[2*j] = u[2*j] - 0.5
		f[2*j+1] = u[2*j+1] + 1
	}
	return nil
}

func (p *boundedAlgebraic) TransientWeights(u, w []float64) {
	for j := range p.n {
		w[2*j], w[2*j+1] = 1, 0
	}
}

// An algebraic unknown held on its bound by an outward push must not stop
// pseudo-time stepping: the push does not shrink with the time step, so
// time steps that counted it would fail down to the minimum step. The
// steady problem has no root in the box, so Solve still fails, but after
// taking its time steps, with the differential unknowns at their roots.
func TestTimeStepsPastAlgebraicBound(t *testing.T) {
	p := &boundedAlgebraic{n: 3}
	u := []float64{2, 0, 2, 0, 2, 0}
	opt := DefaultOptions(2)
	opt.Lower[1] = 0
	opt.MaxTimeStepAttempts = 1
	opt.TimeStep, opt.MaxTimeStep = 10, 1e6
	res, err := Solve(p, u, opt)
	if err == nil || strings.Contains(err.Error(), "below the minimum") {
		t.Fatalf("error %v; want a failure of the steady attempt after the time steps, not of the time steps", err)
	}
	if res.TimeSteps != opt.StepsPerAttempt {
		t.Errorf("%d time steps taken, want %d", res.TimeSteps, opt.StepsPerAttempt)
	}
	for j := range 3 {
		if math.Abs(u[2*j]-0.5) > 1e-6 || u[2*j+1] != 0 {
			t.Errorf("point %d: (%g, %g), want (0.5, 0): the differential unknown at its root, the algebraic one on its bound", j, u[2*j], u[2*j+1])
		}
	}
}
