package newton

import (
	"errors"
	"fmt"
	"math"
	"time"
)

// ErrNotConverged is wrapped by every error Solve returns when it stops
// without meeting the convergence test.
var ErrNotConverged = errors.New("newton: not converged")

// Problem is a system of nonlinear equations F(u) = 0 on a grid of points
// with a fixed number of unknowns per point. The residual at point j may
// depend only on the unknowns of points j−1, j and j+1.
type Problem interface {
	// Size returns the number of grid points and of unknowns per point.
	Size() (points, block int)
	// Residual writes F(u) into f. Both are point-major: component c of
	// point j is at index j·block + c. A non-nil error (for example a
	// non-physical state) marks u as unusable; the solver then damps its
	// step or shortens its time step instead of stopping.
	Residual(u, f []float64) error
}

// Transient is implemented by problems whose pseudo-transient form is
// w ⊙ du/dt = −F(u) with weights other than 1.
type Transient interface {
	// TransientWeights writes into w the coefficient w_i ≥ 0 of du_i/dt;
	// w_i = 0 marks an algebraic equation (for example a boundary
	// condition or a flux equation with no time derivative).
	TransientWeights(u, w []float64)
}

// JacobianEvaluator is implemented by problems that supply their own
// Jacobian of F. Otherwise Solve uses FiniteDifferenceJacobian on Residual.
type JacobianEvaluator interface {
	// Jacobian sets every entry of J's blocks to ∂F/∂u at u, where
	// f0 = F(u). J holds an earlier Jacobian on entry (zeroing it for
	// every evaluation cost 4% of a flame solve); an evaluator that fills
	// only the nonzero entries calls J.Zero first. f0 is scratch owned by
	// the solver: the evaluator may overwrite it.
	Jacobian(u, f0 []float64, J *BlockTridiagonal) error
}

// Event reports progress to Options.Progress.
type Event struct {
	// Stage is "newton" for a steady Newton step and "timestep" for an
	// accepted pseudo-time step.
	Stage string
	// Iteration counts steady Newton steps taken in this Solve (stage
	// "newton") or pseudo-time steps accepted (stage "timestep").
	Iteration int
	// ResidualNorm is max_i |F_i| at the new state, in the units of F.
	ResidualNorm float64
	// StepNorm is the scaled max norm (see Options) of the undamped Newton
	// step (stage "newton") or of u − u_old (stage "timestep").
	StepNorm float64
	// Damping is the factor λ ∈ (0, 1] applied to the Newton step; 1 for
	// stage "timestep".
	Damping float64
	// TimeStep is the pseudo-time step just taken; 0 for stage "newton".
	TimeStep float64
}

// Options controls Solve. Use DefaultOptions and modify it.
//
// Convergence: Solve stops when the undamped Newton step Δu satisfies
//
//	max_i |Δu_i| / (RelTol_c·|u_i| + AbsTol_c) < 1,
//
// c being the component of unknown i. The max norm (not RMS) is used so that
// a thin reaction zone cannot hide among many converged points and the test
// does not loosen as the grid is refined. The step is then applied.
type Options struct {
	// AbsTol and RelTol are the absolute (units of the unknown) and
	// relative tolerances per block component, length block. AbsTol > 0.
	AbsTol, RelTol []float64
	// Lower and Upper bound each block component (length block; nil means
	// unbounded). Newton steps are shortened so that u stays inside; an
	// unknown sitting exactly on its bound with a step pointing outward
	// blocks progress, so physical limits (for example a mass fraction of
	// 0) are best given a small margin.
	Lower, Upper []float64
	// MaxNewtonIterations limits each steady Newton attempt (≥ 1).
	MaxNewtonIterations int
	// MaxJacobianAge is the largest number of Newton steps taken with one
	// Jacobian (≥ 1; 1 means a fresh Jacobian for every step). A Jacobian
	// is also renewed as soon as the contraction ‖Δū_{k+1}‖/‖Δu_k‖ exceeds
	// 1/2, a step needed damping, or a trial point fails with it.
	MaxJacobianAge int
	// TimeStep is the first pseudo-time step; MinTimeStep and MaxTimeStep
	// bound it (units: time in the units implied by the transient weights,
	// seconds when w and F are physical rates). After an accepted step dt
	// is multiplied by TimeStepGrowth (≥ 1) up to MaxTimeStep; after a
	// failed one it is halved, and Solve fails once it drops below
	// MinTimeStep.
	TimeStep, MinTimeStep, MaxTimeStep, TimeStepGrowth float64
	// StepsPerAttempt pseudo-time steps are taken whenever steady Newton
	// fails, at most MaxTimeStepAttempts times (0 disables time stepping).
	StepsPerAttempt, MaxTimeStepAttempts int
	// TimeStepTolerance loosens the convergence test inside a pseudo-time
	// step: its Newton iteration stops once the scaled step norm is below
	// TimeStepTolerance instead of 1. A pseudo-time step only has to move
	// the state towards the steady solution; solving each one to the final
	// tolerance costs iterations that buy nothing. 0 means 1 (as tight as
	// the steady test); otherwise ≥ 1.
	TimeStepTolerance float64
	// ProjectedConvergence applies the convergence test to the step after
	// projection onto the bounds (see Solve): a state whose remaining
	// corrections only push unknowns on their bounds further outward counts
	// as solved. The answer is then a root of the problem restricted to the
	// bounds, not of F; meant for start-up stages whose result only seeds
	// a later solve.
	ProjectedConvergence bool
	// TimeStepsFirst takes one set of pseudo-time steps before the first
	// steady Newton attempt: for starts far from the solution, where a
	// steady attempt can wander into a state time stepping cannot leave.
	TimeStepsFirst bool
	// Flush, when non-nil (length block), sets to zero every trial value
	// whose magnitude is below Flush_c. Exponentially decaying profiles
	// otherwise reach subnormal numbers (below 2.2e-308), whose arithmetic is
	// two orders of magnitude slower and whose derivatives underflow; a
	// floor far below AbsTol changes no converged answer.
	Flush []float64
	// Progress, when non-nil, is called after every accepted step.
	Progress func(Event)
}

// DefaultOptions returns options for a problem with block unknowns per
// point. The tolerances and step controls are common practice, no source:
// relative 1e−4 and absolute 1e−9, unbounded unknowns, 30 Newton steps,
// Jacobian reused up to 10 steps, pseudo-time steps from 1e−6 between
// 1e−12 and 1e−2 growing by 2, 10 steps per attempt, 20 attempts.
func DefaultOptions(block int) Options {
	o := Options{
		AbsTol:              make([]float64, block),
		RelTol:              make([]float64, block),
		Lower:               make([]float64, block),
		Upper:               make([]float64, block),
		MaxNewtonIterations: 30,
		MaxJacobianAge:      10,
		TimeStep:            1e-6,
		MinTimeStep:         1e-12,
		MaxTimeStep:         1e-2,
		TimeStepGrowth:      2,
		StepsPerAttempt:     10,
		MaxTimeStepAttempts: 20,
	}
	for c := range block {
		o.AbsTol[c] = 1e-9
		o.RelTol[c] = 1e-4
		o.Lower[c] = math.Inf(-1)
		o.Upper[c] = math.Inf(1)
	}
	return o
}

func (o *Options) validate(b int) error {
	if len(o.AbsTol) != b || len(o.RelTol) != b {
		return fmt.Errorf("AbsTol and RelTol need one entry per block component (%d), have %d and %d", b, len(o.AbsTol), len(o.RelTol))
	}
	for c := range b {
		if !(o.AbsTol[c] > 0) || math.IsInf(o.AbsTol[c], 0) {
			return fmt.Errorf("AbsTol[%d] = %g, want finite and > 0", c, o.AbsTol[c])
		}
		if !(o.RelTol[c] >= 0) || math.IsInf(o.RelTol[c], 0) {
			return fmt.Errorf("RelTol[%d] = %g, want finite and ≥ 0", c, o.RelTol[c])
		}
	}
	if o.Flush != nil && len(o.Flush) != b {
		return fmt.Errorf("Flush needs one entry per block component (%d) or nil, has %d", b, len(o.Flush))
	}
	for c := range o.Flush {
		if !(o.Flush[c] >= 0) || o.Flush[c] >= o.AbsTol[c] {
			return fmt.Errorf("Flush[%d] = %g, want ≥ 0 and below AbsTol[%d] = %g", c, o.Flush[c], c, o.AbsTol[c])
		}
	}
	if (o.Lower != nil && len(o.Lower) != b) || (o.Upper != nil && len(o.Upper) != b) {
		return fmt.Errorf("Lower and Upper need one entry per block component (%d) or nil, have %d and %d", b, len(o.Lower), len(o.Upper))
	}
	for c := range b {
		lo, hi := o.bounds(c)
		if math.IsNaN(lo) || math.IsNaN(hi) || !(lo < hi) {
			return fmt.Errorf("bounds of component %d are [%g, %g], want lower < upper", c, lo, hi)
		}
	}
	if o.MaxNewtonIterations < 1 {
		return fmt.Errorf("MaxNewtonIterations = %d, want ≥ 1", o.MaxNewtonIterations)
	}
	if o.MaxJacobianAge < 1 {
		return fmt.Errorf("MaxJacobianAge = %d, want ≥ 1", o.MaxJacobianAge)
	}
	if !(o.TimeStepTolerance == 0 || o.TimeStepTolerance >= 1) || math.IsInf(o.TimeStepTolerance, 0) {
		return fmt.Errorf("TimeStepTolerance = %g, want 0 (meaning 1) or finite and ≥ 1", o.TimeStepTolerance)
	}
	if o.MaxTimeStepAttempts < 0 {
		return fmt.Errorf("MaxTimeStepAttempts = %d, want ≥ 0", o.MaxTimeStepAttempts)
	}
	if o.MaxTimeStepAttempts == 0 {
		return nil
	}
	if o.StepsPerAttempt < 1 {
		return fmt.Errorf("StepsPerAttempt = %d, want ≥ 1", o.StepsPerAttempt)
	}
	if !(o.MinTimeStep > 0 && o.MinTimeStep <= o.TimeStep && o.TimeStep <= o.MaxTimeStep) || math.IsInf(o.MaxTimeStep, 0) {
		return fmt.Errorf("time steps: want 0 < MinTimeStep ≤ TimeStep ≤ MaxTimeStep < ∞, have %g, %g, %g", o.MinTimeStep, o.TimeStep, o.MaxTimeStep)
	}
	if !(o.TimeStepGrowth >= 1) || math.IsInf(o.TimeStepGrowth, 0) {
		return fmt.Errorf("TimeStepGrowth = %g, want finite and ≥ 1", o.TimeStepGrowth)
	}
	return nil
}

func (o *Options) bounds(c int) (lo, hi float64) {
	lo, hi = math.Inf(-1), math.Inf(1)
	if o.Lower != nil {
		lo = o.Lower[c]
	}
	if o.Upper != nil {
		hi = o.Upper[c]
	}
	return lo, hi
}

// Result summarises a Solve.
type Result struct {
	Converged bool
	// NewtonIterations counts accepted Newton steps, steady and inside
	// pseudo-time steps; TimeSteps counts accepted pseudo-time steps.
	NewtonIterations, TimeSteps int
	// JacobianEvaluations, Factorizations and ResidualEvaluations count
	// calls; ResidualEvaluations includes those made by the
	// finite-difference Jacobian, but not those a JacobianEvaluator makes
	// on its own (the problem counts those).
	JacobianEvaluations, Factorizations, ResidualEvaluations int
	// ResidualTime is spent in Problem.Residual (all calls), JacobianTime
	// in building Jacobians (including the residual calls of finite
	// differences, so it overlaps ResidualTime), FactorTime in Factor and
	// SolveTime in the block-tridiagonal back-substitutions.
	ResidualTime, JacobianTime, FactorTime, SolveTime time.Duration
	// StepNorm is the scaled max norm of the last steady Newton step and
	// ResidualNorm is max_i |F_i| at the returned u (+Inf if the residual
	// could not be evaluated at the initial state).
	StepNorm, ResidualNorm float64
	// TimeStep is the pseudo-time step a later solve of a nearby problem
	// may start from: the step the solver would have taken next (grown after
	// the last accepted step), or Options.TimeStep if no step was taken.
	TimeStep float64
}

const (
	// minDamping is the smallest damping factor tried before a Newton
	// attempt is declared failed (ten halvings).
	minDamping = 1.0 / 1024
	// reuseContraction is the largest contraction ‖Δū_{k+1}‖/‖Δu_k‖ for
	// which the Jacobian is kept for the next step.
	reuseContraction = 0.5
	// transientNewtonIterations limits the Newton iteration of one
	// pseudo-time step; a step that needs more is better cut.
	transientNewtonIterations = 10
	// timeStepCut multiplies dt after a failed pseudo-time step.
	timeStepCut = 0.5
	// A steady Newton attempt is abandoned for pseudo-time steps after
	// maxStalls accepted steps in a row damped to stallDamping or less
	// whose contraction exceeds stallContraction: each costs a Jacobian and
	// moves the state by a few per mille of the Newton step. On the H2/air
	// cold start the first steady attempt took 17 such steps before it
	// failed.
	stallDamping     = 1.0 / 16
	stallContraction = 0.95
	maxStalls        = 4
)

// fdPerturbation is the relative and absolute finite-difference increment,
// √ε for double precision (Dennis & Schnabel 1996, §5.4).
var fdPerturbation = math.Sqrt(0x1p-52)

// Solve finds u with F(u) = 0 for the problem p, starting from u and
// overwriting it. The method is the damped Newton method of Deuflhard,
// "Newton Methods for Nonlinear Problems" (Springer 2004), §3.3: the step
// Δu_k = −J⁻¹F(u_k) is damped by the largest λ ∈ {1, ½, ¼, …} ≥ 1/1024
// (further limited to keep u within the bounds) that passes the restricted
// natural monotonicity test
//
//	‖Δū_{k+1}‖ ≤ (1 − λ/4)·‖Δu_k‖,   Δū_{k+1} = −J(u_k)⁻¹ F(u_k + λΔu_k),
//
// in the scaled max norm of Options; trial points where the residual fails
// are treated as failing the test. The Jacobian is reused over steps while
// the contraction stays below ½ (the next step is then the simplified
// correction Δū already computed) and renewed when it stalls.
//
// When a steady Newton attempt fails, Solve takes Options.StepsPerAttempt
// backward-Euler steps of the pseudo-transient problem w ⊙ du/dt = −F(u),
//
//	F(u) + w ⊙ (u − u_old)/dt = 0,
//
// each solved by a short damped Newton iteration with Jacobian J + diag(w/dt),
// and then tries steady Newton again: the alternation used for premixed
// flames by Smooke, Miller & Kee, Combust. Sci. Technol. 34 (1983) 79–90.
// The pseudo-time steps start from the state the failed steady attempt
// started from, not from where its damped steps ended. w comes from the
// Transient interface (1 for every unknown otherwise) evaluated at u_old. A steady attempt also counts as
// failed once maxStalls steps in a row were heavily damped and hardly
// contracted. While the iteration contracts well, the factors of
// J + diag(w/dt_old) are kept for the next pseudo-time step (dt only shifts
// the diagonal); they are brought up to date before a failed step is
// retried with a new Jacobian.
//
// On success u holds the solution. Otherwise u holds the last accepted state
// (of the last pseudo-time step when time steps were taken) and the error
// wraps ErrNotConverged and says why. Solve allocates its work arrays once
// per call.
func Solve(p Problem, u []float64, opt Options) (Result, error) {
	n, b := p.Size()
	if n < 1 || b < 1 {
		return Result{}, fmt.Errorf("newton: problem size %d points × %d components, want at least 1 × 1", n, b)
	}
	if len(u) != n*b {
		return Result{}, fmt.Errorf("newton: len(u) = %d, want %d points × %d components = %d", len(u), n, b, n*b)
	}
	if err := opt.validate(b); err != nil {
		return Result{}, fmt.Errorf("newton: options: %w", err)
	}
	for j := range n {
		for c := range b {
			v := u[j*b+c]
			lo, hi := opt.bounds(c)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return Result{}, fmt.Errorf("newton: initial state at point %d, component %d is %g", j, c, v)
			}
			if v < lo || v > hi {
				return Result{}, fmt.Errorf("newton: initial state at point %d, component %d is %g, outside its bounds [%g, %g]", j, c, v, lo, hi)
			}
		}
	}
	s := newSolver(p, n, b, opt)
	err := s.run(u)
	s.res.ResidualNorm = math.Inf(1)
	if s.haveResidual {
		s.res.ResidualNorm = maxAbs(s.f)
	}
	return s.res, err
}

// solver holds the state and work arrays of one Solve.
type solver struct {
	p    Problem
	jac  JacobianEvaluator // nil: finite differences
	tr   Transient         // nil: unit weights
	n, b int
	opt  Options
	res  Result

	lo, hi []float64 // bounds per component

	J        *BlockTridiagonal // filled by the Jacobian
	lin      linearSystem      // J, as factored and solved
	jacValid bool              // J holds ∂F/∂u at some earlier accepted state
	factored bool              // J's factors match its current values
	jacAge   int               // accepted steps since J was evaluated

	// shiftStale: the factors were made with the diagonal shift of an
	// earlier pseudo-time step (w/dt_old, not w/dt). The time step only
	// shifts the diagonal, so the old factors still give a convergent
	// simplified Newton iteration while its contraction stays good; a
	// failed step or a convergence decision on such factors brings the
	// shift up to date first (a factorisation, not a Jacobian).
	// shiftTransient: the factors are of a pseudo-time system; contracting:
	// the last accepted step was undamped with contraction ≤ reuseContraction.
	shiftStale, shiftTransient, contracting bool

	steadySteps  int  // accepted steady Newton steps, for Event.Iteration
	haveResidual bool // s.f holds F at the accepted state

	transient bool
	applied   []float64 // diagonal shift currently added to J.Diag
	shift     []float64 // scratch: change of the diagonal shift
	wdt       []float64 // w/dt of the current pseudo-time step

	f, ft, du, dubar, ut, wt, uOld, fOld, fSteady, w []float64
	uStart, fStart                                   []float64 // state and residual before a steady attempt
	// relaxAlgebraic: time steps no longer count outward pushes on
	// algebraic unknowns at their bounds (transientNorm).
	relaxAlgebraic bool

	fdResidual func(u, f []float64) error
}

func newSolver(p Problem, n, b int, opt Options) *solver {
	size := n * b
	s := &solver{p: p, n: n, b: b, opt: opt, J: NewBlockTridiagonal(n, b)}
	s.jac, _ = p.(JacobianEvaluator)
	s.tr, _ = p.(Transient)
	s.lo, s.hi = make([]float64, b), make([]float64, b)
	for c := range b {
		s.lo[c], s.hi[c] = opt.bounds(c)
	}
	s.lin = s.J
	work := make([]float64, 15*size)
	next := func() []float64 {
		v := work[:size:size]
		work = work[size:]
		return v
	}
	s.f, s.ft, s.du, s.dubar, s.ut, s.wt = next(), next(), next(), next(), next(), next()
	s.uOld, s.fOld, s.fSteady, s.w, s.applied, s.wdt = next(), next(), next(), next(), next(), next()
	s.shift = next()
	s.uStart, s.fStart = next(), next()
	s.fdResidual = s.residual
	return s
}

func (s *solver) run(u []float64) error {
	if err := s.residual(u, s.f); err != nil {
		return fmt.Errorf("%w: residual at the initial state: %w", ErrNotConverged, err)
	}
	s.haveResidual = true
	s.res.TimeStep = s.opt.TimeStep
	ok, why := false, error(nil)
	if !s.opt.TimeStepsFirst || s.opt.MaxTimeStepAttempts == 0 {
		if ok, why = s.steady(u); ok {
			s.res.Converged = true
			return nil
		}
	}
	dt := s.opt.TimeStep
	defer func() { s.res.TimeStep = dt }()
	for attempt := 1; attempt <= s.opt.MaxTimeStepAttempts; attempt++ {
		if err := s.timeSteps(u, &dt); err != nil {
			return fmt.Errorf("%w: pseudo-time stepping (attempt %d, %d steps taken): %w", ErrNotConverged, attempt, s.res.TimeSteps, err)
		}
		if ok, why = s.steady(u); ok {
			s.res.Converged = true
			return nil
		}
	}
	return fmt.Errorf("%w: steady Newton failed after %d pseudo-time attempts (%d steps): %w", ErrNotConverged, s.opt.MaxTimeStepAttempts, s.res.TimeSteps, why)
}

// steady runs a steady Newton attempt from u. When pseudo-time steps may
// follow, a failed attempt leaves u and s.f where they were before it:
// damped steps that did not converge can carry the state far from any
// solution (on n-heptane/air at 450 K the undamped step norm grew from 5e4
// to 1e10 over accepted, heavily damped steps, and no time step could be
// taken from there), so time stepping goes on from the last state known to
// be sound.
func (s *solver) steady(u []float64) (bool, error) {
	keep := s.opt.MaxTimeStepAttempts > 0
	if keep {
		copy(s.uStart, u)
		copy(s.fStart, s.f)
	}
	ok, err := s.newton(u, s.opt.MaxNewtonIterations)
	if !ok && keep {
		copy(u, s.uStart)
		copy(s.f, s.fStart)
		s.contracting = false
		if s.jacAge == 0 {
			s.jacAge = 1 // J was evaluated at a state just discarded
		}
	}
	return ok, err
}

// residual evaluates F(u) into f, counting and timing the call and
// rejecting non-finite values.
func (s *solver) residual(u, f []float64) error {
	t0 := time.Now()
	err := s.p.Residual(u, f)
	s.res.ResidualTime += time.Since(t0)
	s.res.ResidualEvaluations++
	if err != nil {
		return err
	}
	for i, v := range f {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("residual is %g at point %d, component %d", v, i/s.b, i%s.b)
		}
	}
	return nil
}

// system evaluates the residual of the current system: F(u) when steady,
// F(u) + w ⊙ (u − u_old)/dt during a pseudo-time step.
func (s *solver) system(u, f []float64) error {
	if err := s.residual(u, f); err != nil {
		return err
	}
	if s.transient {
		for i, c := range s.wdt {
			f[i] += c * (u[i] - s.uOld[i])
		}
	}
	return nil
}

// refreshJacobian evaluates ∂F/∂u at u, where s.f is the current system's
// residual at u.
func (s *solver) refreshJacobian(u []float64) error {
	// f0 is a copy, so an evaluator that writes into it (or fails half-way
	// through) cannot corrupt the residual of the accepted state.
	f0 := s.fSteady
	copy(f0, s.f)
	if s.transient {
		for i, c := range s.wdt {
			f0[i] -= c * (u[i] - s.uOld[i])
		}
	}
	t0 := time.Now()
	var err error
	if s.jac != nil {
		err = s.jac.Jacobian(u, f0, s.J)
	} else {
		err = FiniteDifferenceJacobian(s.fdResidual, u, f0, s.J, fdPerturbation, fdPerturbation)
	}
	s.res.JacobianTime += time.Since(t0)
	s.res.JacobianEvaluations++
	s.factored = false
	clear(s.applied)
	if err != nil {
		s.jacValid = false
		return fmt.Errorf("Jacobian: %w", err)
	}
	s.jacValid = true
	s.jacAge = 0
	return nil
}

// linearSystem is what Solve needs from the storage of its Jacobian: a
// shift of the diagonal (the w/dt of pseudo-time steps), a factorisation,
// and solves with the factors. BlockTridiagonal implements it.
type linearSystem interface {
	// AddDiagonal adds d_i to diagonal entry i (len(d) = N·B).
	AddDiagonal(d []float64)
	Factor() error
	Solve(rhs []float64)
}

// factor brings the diagonal shift of J to that of the current system
// (w/dt or none) and factors J if needed. Between pseudo-time steps, while
// the Newton iteration contracts well, the factors of the previous step's
// shift are kept (see shiftStale) unless exact is set.
func (s *solver) factor(exact bool) error {
	changed := false
	for i := range s.applied {
		want := 0.0
		if s.transient {
			want = s.wdt[i]
		}
		s.shift[i] = want - s.applied[i]
		if want != s.applied[i] {
			changed = true
		}
	}
	if changed && !exact && s.factored && s.transient && s.shiftTransient && s.contracting {
		s.shiftStale = true
		return nil
	}
	if changed {
		for i, d := range s.shift {
			s.applied[i] += d
		}
		s.lin.AddDiagonal(s.shift)
		s.factored = false
	}
	s.shiftStale = false
	if s.factored {
		return nil
	}
	s.shiftTransient = s.transient
	t0 := time.Now()
	err := s.lin.Factor()
	s.res.FactorTime += time.Since(t0)
	s.res.Factorizations++
	if err != nil {
		s.jacValid = false
		return err
	}
	s.factored = true
	return nil
}

// step sets dx = −J⁻¹ r and returns its scaled norm.
func (s *solver) step(r, dx []float64) float64 {
	t0 := time.Now()
	for i, v := range r {
		dx[i] = -v
	}
	s.lin.Solve(dx)
	s.res.SolveTime += time.Since(t0)
	return s.norm(dx)
}

// outward reports whether component i of the step dx pushes an unknown
// sitting on one of its bounds at u further outward.
func (s *solver) outward(u, dx []float64, i int) bool {
	c := i % s.b
	return (dx[i] < 0 && u[i] <= s.lo[c]) || (dx[i] > 0 && u[i] >= s.hi[c])
}

// project zeroes the components of the step dx that push an unknown sitting
// on one of its bounds further outward: the step is projected onto the
// directions the bounds allow (projected Newton; Kelley, "Iterative Methods
// for Optimization", SIAM 1999, §5.5). The other components keep their full
// length, so one unknown at its bound no longer shortens the whole step as a
// single damping factor set by the tightest bound did.
func (s *solver) project(u, dx []float64) {
	for i := range dx {
		if s.outward(u, dx, i) {
			dx[i] = 0
		}
	}
}

// largest returns the index of the largest scaled component of dx.
func (s *solver) largest(dx []float64) int {
	at, m := 0, -1.0
	for i, v := range dx {
		if a := math.Abs(v) * s.wt[i]; a > m {
			at, m = i, a
		}
	}
	return at
}

// projectedNorm is the scaled norm of dx projected at u, leaving dx as is.
func (s *solver) projectedNorm(u, dx []float64) float64 {
	m := 0.0
	for i, v := range dx {
		if s.outward(u, dx, i) {
			continue
		}
		a := math.Abs(v) * s.wt[i]
		if a > m || math.IsNaN(a) {
			m = a
		}
	}
	return m
}

// transientNorm is the scaled norm of dx at u inside a pseudo-time step
// once pseudo-time stepping has failed down to its minimum step
// (solver.relaxAlgebraic), leaving out components that push an algebraic
// unknown (transient weight 0: a boundary condition, a mass-flux row) on
// its bound outward. Such a
// push does not shrink with the time step, and a step that keeps the
// unknown on its bound is as good as the time step can do; a differential
// unknown pushed outward still counts, its push shrinking with dt.
func (s *solver) transientNorm(u, dx []float64) float64 {
	m := 0.0
	for i, v := range dx {
		if s.w[i] == 0 && s.outward(u, dx, i) {
			continue
		}
		a := math.Abs(v) * s.wt[i]
		if a > m || math.IsNaN(a) {
			m = a
		}
	}
	return m
}

// setWeights sets the scaling 1/(RelTol_c·|u_i| + AbsTol_c) at u.
func (s *solver) setWeights(u []float64) {
	b := s.b
	for j := range s.n {
		for c := range b {
			i := j*b + c
			s.wt[i] = 1 / (s.opt.RelTol[c]*math.Abs(u[i]) + s.opt.AbsTol[c])
		}
	}
}

// norm is the scaled max norm; NaN entries give NaN.
func (s *solver) norm(x []float64) float64 {
	m := 0.0
	for i, v := range x {
		a := math.Abs(v) * s.wt[i]
		if a > m || math.IsNaN(a) {
			m = a
		}
	}
	return m
}

// trial sets ut = u + λ·du projected onto the bounds (each unknown clipped
// to its interval) and flushed to zero below Options.Flush.
func (s *solver) trial(u, du []float64, lam float64) {
	b := s.b
	flush := s.opt.Flush
	for j := range s.n {
		for c := range b {
			i := j*b + c
			v := min(max(u[i]+lam*du[i], s.lo[c]), s.hi[c])
			if flush != nil && math.Abs(v) < flush[c] {
				v = 0
			}
			s.ut[i] = v
		}
	}
}

// accept makes the trial point the current state.
func (s *solver) accept(u []float64) {
	copy(u, s.ut)
	copy(s.f, s.ft)
	s.jacAge++
	s.res.NewtonIterations++
}

// recordSteady records an accepted steady Newton step (undamped norm s0,
// damping lam) and reports it; steps inside pseudo-time steps are not
// reported individually.
func (s *solver) recordSteady(s0, lam float64) {
	if s.transient {
		return
	}
	s.steadySteps++
	s.res.StepNorm = s0
	if s.opt.Progress != nil {
		s.opt.Progress(Event{Stage: "newton", Iteration: s.steadySteps, ResidualNorm: maxAbs(s.f), StepNorm: s0, Damping: lam})
	}
}

// newtonFailure records why a Newton attempt stopped; it is turned into an
// error only when the attempt ends, so the iteration itself formats nothing.
type newtonFailure struct {
	kind     int
	lam      float64 // damping of the last trial
	theta    float64 // contraction of the last trial
	s0       float64 // norm of the last undamped step
	trialErr error   // residual error at the last trial point
}

const (
	failNone = iota
	failTrial
	failMonotonicity
	failIterations
)

func (s *solver) failure(nf *newtonFailure, maxIter int) error {
	switch nf.kind {
	case failTrial:
		return fmt.Errorf("residual failed at every trial point down to damping %g: %w", nf.lam, nf.trialErr)
	case failMonotonicity:
		return fmt.Errorf("natural monotonicity test failed down to damping %g (contraction %.3g)", nf.lam, nf.theta)
	case failIterations:
		return fmt.Errorf("no convergence in %d Newton iterations (last step norm %.3g, contraction %.3g)", maxIter, nf.s0, nf.theta)
	case failNone:
	}
	return fmt.Errorf("no Newton step was attempted")
}

// newton runs at most maxIter damped Newton iterations on the current
// system (steady or one pseudo-time step) from u, where s.f holds the
// system residual at u. It reports whether the convergence test was met;
// otherwise the error says why not. u and s.f always hold the last
// accepted state.
func (s *solver) newton(u []float64, maxIter int) (bool, error) {
	needFresh := !s.jacValid || s.jacAge >= s.opt.MaxJacobianAge
	haveStep := false // s.dubar is the step at u with the current factors
	exact := false    // bring the factors' diagonal shift up to date
	// renew answers a failure with factors that are not exact at u: the
	// diagonal shift is brought up to date first, then J renewed.
	renew := func() {
		if s.shiftStale {
			exact = true
		} else {
			needFresh = true
		}
		haveStep = false
	}
	var nf newtonFailure
	stalls := 0 // consecutive steady steps that barely moved
	for it := 0; it < maxIter; it++ {
		if needFresh {
			if err := s.refreshJacobian(u); err != nil {
				return false, err
			}
			needFresh, haveStep = false, false
		}
		if err := s.factor(exact); err != nil {
			if s.jacAge == 0 {
				return false, err
			}
			needFresh = true
			continue
		}
		fresh := s.jacAge == 0 && !s.shiftStale // J + shift evaluated at u
		s.setWeights(u)
		var raw float64
		if haveStep {
			copy(s.du, s.dubar)
			raw = s.norm(s.du)
		} else {
			raw = s.step(s.f, s.du)
		}
		s0 := s.projectedNorm(u, s.du)
		if s.opt.ProjectedConvergence && !math.IsNaN(raw) {
			raw = s0
		} else if s.transient && s.relaxAlgebraic && !math.IsNaN(raw) {
			raw = s.transientNorm(u, s.du)
		}
		if s0 == 0 && raw > 0 && !math.IsNaN(raw) && !math.IsInf(raw, 0) {
			// Every component left is pushed outward at its bound: the
			// state is on the boundary of the box, not at a root.
			if fresh {
				i := s.largest(s.du)
				return false, fmt.Errorf("the Newton step only pushes unknowns outside their bounds (largest: point %d, component %d at its bound, scaled step %.3g)", i/s.b, i%s.b, raw)
			}
			renew()
			continue
		}
		s.project(u, s.du)
		if math.IsNaN(raw) || math.IsInf(raw, 0) {
			if fresh {
				return false, fmt.Errorf("Newton step is %g", raw)
			}
			renew()
			continue
		}
		if raw == 0 {
			if !s.transient {
				s.res.StepNorm = 0
			}
			return true, nil
		}
		lam := 1.0
		// The convergence test is on the step before projection: a state held
		// on a bound by the projection is not a root.
		if raw < s.tolerance() {
			s.trial(u, s.du, 1)
			err := s.system(s.ut, s.ft)
			if err == nil {
				s.accept(u)
				s.recordSteady(raw, 1)
				return true, nil
			}
			nf = newtonFailure{kind: failTrial, lam: 1, trialErr: err}
			lam /= 2 // the full step just failed
		}
		accepted := false
		for ; lam >= minDamping; lam /= 2 {
			s.trial(u, s.du, lam)
			if err := s.system(s.ut, s.ft); err != nil {
				nf = newtonFailure{kind: failTrial, lam: lam, trialErr: err}
			} else {
				s.step(s.ft, s.dubar)
				s1 := s.projectedNorm(s.ut, s.dubar)
				nf.theta = s1 / s0
				if nf.theta <= 1-lam/4 {
					accepted = true
					break
				}
				nf = newtonFailure{kind: failMonotonicity, lam: lam, theta: s1 / s0}
			}
			if !fresh {
				break
			}
		}
		if !accepted {
			if !fresh {
				// A Jacobian from an earlier state (or shift) may point the
				// wrong way; retry with a new one before damping further.
				renew()
				continue
			}
			return false, s.failure(&nf, maxIter)
		}
		s.accept(u)
		s.recordSteady(raw, lam)
		haveStep = true
		s.contracting = lam == 1 && nf.theta <= reuseContraction
		if !s.transient && lam <= stallDamping && nf.theta > stallContraction {
			stalls++
		} else {
			stalls = 0
		}
		if stalls >= maxStalls && s.opt.MaxTimeStepAttempts > 0 {
			// Heavily damped steps that hardly contract, each with a
			// fresh Jacobian: the state is outside the basin of steady
			// Newton, and pseudo-time steps are the cheaper way in.
			return false, fmt.Errorf("steady Newton stalled: %d steps in a row damped to %g or less with contraction above %g (last %.3g)", stalls, stallDamping, stallContraction, nf.theta)
		}
		needFresh = s.jacAge >= s.opt.MaxJacobianAge
		if !s.contracting {
			renew()
		}
		nf = newtonFailure{kind: failIterations, s0: raw, theta: nf.theta}
	}
	return false, s.failure(&nf, maxIter)
}

// tolerance is the scaled step norm below which the current system counts
// as solved.
func (s *solver) tolerance() float64 {
	if s.transient && s.opt.TimeStepTolerance > 1 {
		return s.opt.TimeStepTolerance
	}
	return 1
}

// timeSteps takes Options.StepsPerAttempt accepted backward-Euler steps of
// w ⊙ du/dt = −F(u) from u, adapting *dt. It fails when dt falls below
// Options.MinTimeStep or the transient weights are invalid.
func (s *solver) timeSteps(u []float64, dt *float64) error {
	defer func() { s.transient = false }()
	for taken := 0; taken < s.opt.StepsPerAttempt; {
		copy(s.uOld, u)
		copy(s.fOld, s.f)
		if err := s.transientWeights(u); err != nil {
			return err
		}
		for i, w := range s.w {
			s.wdt[i] = w / *dt
		}
		s.transient = true
		ok, err := s.newton(u, min(transientNewtonIterations, s.opt.MaxNewtonIterations))
		if ok {
			for i, c := range s.wdt {
				s.f[i] -= c * (u[i] - s.uOld[i])
			}
			taken++
			s.res.TimeSteps++
			if s.opt.Progress != nil {
				s.setWeights(s.uOld)
				for i := range s.du {
					s.du[i] = u[i] - s.uOld[i]
				}
				s.opt.Progress(Event{Stage: "timestep", Iteration: s.res.TimeSteps, ResidualNorm: maxAbs(s.f), StepNorm: s.norm(s.du), Damping: 1, TimeStep: *dt})
			}
			*dt = min(*dt*s.opt.TimeStepGrowth, s.opt.MaxTimeStep)
			continue
		}
		copy(u, s.uOld)
		copy(s.f, s.fOld)
		s.contracting = false
		if s.jacAge == 0 {
			s.jacAge = 1 // J was evaluated at a state just discarded
		}
		*dt *= timeStepCut
		if *dt < s.opt.MinTimeStep {
			if !s.relaxAlgebraic {
				// Perhaps an algebraic unknown held on its bound (see
				// transientNorm): go on without counting its push, from
				// the first time step again.
				s.relaxAlgebraic = true
				*dt = s.opt.TimeStep
				continue
			}
			return fmt.Errorf("time step fell below the minimum %g: %w", s.opt.MinTimeStep, err)
		}
	}
	return nil
}

func (s *solver) transientWeights(u []float64) error {
	if s.tr == nil {
		for i := range s.w {
			s.w[i] = 1
		}
		return nil
	}
	s.tr.TransientWeights(u, s.w)
	for i, w := range s.w {
		if !(w >= 0) || math.IsInf(w, 0) {
			return fmt.Errorf("transient weight at point %d, component %d is %g, want finite and ≥ 0", i/s.b, i%s.b, w)
		}
	}
	return nil
}

func maxAbs(x []float64) float64 {
	m := 0.0
	for _, v := range x {
		m = max(m, math.Abs(v))
	}
	return m
}
