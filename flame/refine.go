package flame

import (
	"fmt"
	"math"

	"flame1d/newton"
	"flame1d/thermo"
)

// stage is one flame solve in progress: its settings, the work done so far
// and the pseudo-time step the next Newton solve starts from (0: the
// default). Carrying the step over means a solve on a refined grid does not
// creep up again from the smallest step.
type stage struct {
	set      Settings
	stats    *Stats
	timeStep float64 // s
	// startUp marks the fixed-temperature stage: its answer only seeds the
	// full solve, so a state held on the mass-fraction bounds is accepted
	// (newton.Options.ProjectedConvergence). With a guessed temperature
	// profile and mass flux, the species equations may have their root at
	// slightly negative mass fractions, out of the solver's reach.
	startUp bool
	// timeStepsFirst: the next solve starts with pseudo-time steps
	// (newton.Options.TimeStepsFirst); cleared after it.
	timeStepsFirst bool
	// regrids is the number of whole-grid halvings a failed solve of the
	// refinement loop may still use (last-resort cold starts only).
	regrids int
}

// newtonSolve solves pr from u, to looseRelTol while loose (a grid still
// changing, a start-up stage) and to the settings' tolerance otherwise.
func (s *Solver) newtonSolve(st *stage, pr *problem, u []float64, loose bool) error {
	set := st.set
	if loose {
		set.RelTol = math.Max(set.RelTol, looseRelTol)
	}
	opt := s.newtonOptions(set, pr.b)
	opt.ProjectedConvergence = st.startUp
	if st.startUp {
		opt.MaxTimeStepAttempts = seedTimeStepAttempts
	}
	opt.TimeStepsFirst = st.timeStepsFirst
	st.timeStepsFirst = false
	if st.timeStep > 0 {
		opt.TimeStep = min(max(st.timeStep, opt.MinTimeStep), opt.MaxTimeStep)
	}
	res, err := newton.Solve(pr, u, opt)
	st.stats.add(res, pr.evaluations)
	st.timeStep = res.TimeStep
	return err
}

func (s *Solver) newtonOptions(set Settings, b int) newton.Options {
	o := newton.DefaultOptions(b)
	o.TimeStepTolerance = timeStepTolerance
	K := s.ph.nSpecies
	for c := 0; c < b; c++ {
		o.RelTol[c] = set.RelTol
		o.AbsTol[c] = set.AbsTolY
		o.Lower[c] = -1e-7
		o.Upper[c] = 1.0 + 1e-7
	}
	// Mass fractions decaying exponentially (a fuel consumed by a fast
	// step) would otherwise reach subnormal numbers; 1e-100 is 89 orders of
	// magnitude below the absolute tolerance.
	o.Flush = make([]float64, b)
	for k := 0; k < K; k++ {
		o.Flush[compY(k)] = flushY
	}
	o.AbsTol[compT] = set.AbsTolT
	o.Lower[compT], o.Upper[compT] = 200, 6000
	cm := compM(K)
	o.AbsTol[cm] = 1e-9
	o.Lower[cm], o.Upper[cm] = 1e-7, 1e4
	if set.Progress != nil {
		o.Progress = func(e newton.Event) {
			set.Progress(Progress{Stage: e.Stage, ResidualNorm: e.ResidualNorm})
		}
	}
	return o
}

// timeStepTolerance loosens the Newton test inside pseudo-time steps
// (newton.Options.TimeStepTolerance): a pseudo-time step is accepted once
// its Newton update is below 100 times the steady tolerance. The steps only
// carry the state towards the basin of the steady Newton iteration; on the
// CH4/air demo this cut the start-up from 121 to 109 Newton iterations
// with the same S_L to nine digits.
const timeStepTolerance = 100

// seedTimeStepAttempts bounds the pseudo-time attempts of the
// fixed-temperature start-up stage, whose answer only seeds the full solve
// (coldStart).
const seedTimeStepAttempts = 4

// looseRelTol is the relative Newton tolerance on grids that are still being
// refined.
const looseRelTol = 1e-3

// flushY is the magnitude below which mass fractions are set to zero.
const flushY = 1e-100

// refineLoop alternates full solves and grid refinement until the grid
// satisfies the criteria and both domain ends are flat.
func (s *Solver) refineLoop(sol *Solution, st *stage) (*Solution, error) {
	set, stats := st.set, st.stats
	K := s.ph.nSpecies
	b := blockSize(K)
	comps := make([]int, 0, K+1)
	for c := 0; c <= K; c++ {
		comps = append(comps, c)
	}
	// While the grid is still changing, solve to a loose tolerance: the
	// solution only has to be good enough to place the next points. On a
	// grid that passes the criteria, solve to the requested tolerance and
	// check the criteria once more.
	tight := false
	centralOn := false
	for iter := 0; ; iter++ {
		pr := s.problemFor(sol, set)
		// Central faces oscillate on grids too coarse for the front; they
		// are switched on once a upwind solution has passed the grid
		// criteria, and stay on while the grid is refined further.
		pr.central = set.CentralConvection && centralOn
		s.report(set, "solve", sol.Points(), "full equations")
		var before []float64
		if st.regrids > 0 {
			before = append(before, sol.U...)
		}
		if err := s.newtonSolve(st, pr, sol.U, !tight); err != nil {
			// On a last-resort start, a grid too coarse for the front is
			// the likely cause: halve every interval, go back to the state
			// before the attempt and try again.
			if st.regrids > 0 && 2*sol.Points() <= set.Grid.MaxPoints {
				st.regrids--
				sol.X, sol.U = bisectAll(sol.X, before, pr.b)
				s.report(set, "regrid", sol.Points(), "solve failed; every interval halved and retried")
				continue
			}
			return sol, fmt.Errorf("%w on %d points: %v", ErrNotConverged, sol.Points(), err)
		}
		if iter >= set.MaxRefinements {
			return sol, fmt.Errorf("%w: grid still changing after %d refinements", ErrNotConverged, iter)
		}
		if s.extendDomain(sol, set) {
			stats.DomainExtensions++
			continue
		}
		var refiner Refiner = set.Grid
		if set.Refiner != nil {
			refiner = set.Refiner
		}
		newX, newU, changed, err := refiner.Refine(sol.X, sol.U, b, comps, []float64{sol.AnchorX})
		if err != nil {
			return sol, fmt.Errorf("grid refinement: %w", err)
		}
		if !changed {
			if tight && (centralOn || !set.CentralConvection) {
				return sol, nil
			}
			if tight {
				split, err := s.pecletSplit(pr, sol.U)
				if err != nil {
					return sol, fmt.Errorf("cell Péclet numbers: %w", err)
				}
				if added := count(split); added > 0 && sol.Points()+added <= set.Grid.MaxPoints {
					sol.X, sol.U = bisect(sol.X, sol.U, pr.b, func(j int) bool { return split[j] })
					sol.AnchorX = sol.X[indexOf(sol.X, sol.AnchorX)]
					stats.Refinements++
					s.report(set, "refine", sol.Points(), "intervals with a cell Péclet number above 2 halved before central convection")
					tight = false
					continue
				}
				centralOn = true
			}
			tight = true
			continue
		}
		tight = false
		stats.Refinements++
		sol.X, sol.U = newX, newU
		sol.AnchorX = sol.X[indexOf(sol.X, sol.AnchorX)]
	}
}

// Flatness limits for the domain ends. At the inlet, the temperature
// gradient relative to the peak gradient: 1e-3 keeps the heat lost to the
// fixed inlet temperature negligible for S_L (common practice, no source).
// At the outlet, the post-flame recombination zone is long and slow; the
// temperature still to be gained there is about the outlet gradient times the
// initial domain length, which is held below outletRise so the burned temperature
// approaches equilibrium within a few kelvin.
const (
	endFlatness     = 1e-3
	outletRise      = 2.0 // K
	maxDomainGrowth = 8
)

// extendDomain lengthens the domain at an end that is not flat, copying the
// end state onto the new points. It reports whether it changed the grid.
func (s *Solver) extendDomain(sol *Solution, set Settings) bool {
	initialLength := sol.InitialLength
	n := sol.Points()
	maxG := 0.0
	for j := 0; j+1 < n; j++ {
		maxG = math.Max(maxG, math.Abs(sol.T(j+1)-sol.T(j))/(sol.X[j+1]-sol.X[j]))
	}
	if maxG == 0 {
		return false
	}
	gIn := math.Abs(sol.T(1)-sol.T(0)) / (sol.X[1] - sol.X[0])
	gOut := math.Abs(sol.T(n-2)-sol.T(n-3)) / (sol.X[n-2] - sol.X[n-3])
	L := sol.X[n-1] - sol.X[0]
	extended := false
	b := blockSize(sol.NumSpecies())
	if gIn > endFlatness*maxG {
		add := 0.25 * L
		pts := 4
		newX := make([]float64, 0, n+pts)
		newU := make([]float64, 0, (n+pts)*b)
		for i := 0; i < pts; i++ {
			newX = append(newX, sol.X[0]-add*float64(pts-i)/float64(pts))
			newU = append(newU, sol.U[:b]...)
		}
		sol.X = append(newX, sol.X...)
		sol.U = append(newU, sol.U...)
		extended = true
		s.report(set, "extend", len(sol.X), "inlet end not flat: domain extended upstream")
	}
	if (gOut > endFlatness*maxG || gOut*initialLength > outletRise) && L < maxDomainGrowth*initialLength {
		add := 0.5 * L
		pts := 4
		last := sol.X[len(sol.X)-1]
		end := append([]float64(nil), sol.U[len(sol.U)-b:]...)
		for i := 1; i <= pts; i++ {
			sol.X = append(sol.X, last+add*float64(i)/float64(pts))
			sol.U = append(sol.U, end...)
		}
		extended = true
		s.report(set, "extend", len(sol.X), "outlet end not flat: domain extended downstream")
	}
	return extended
}

// bisectAll inserts the midpoint of every interval, interpolating linearly.
func bisectAll(x, u []float64, b int) ([]float64, []float64) {
	return bisect(x, u, b, func(int) bool { return true })
}

// bisect inserts the midpoint of every interval j (between points j and
// j+1) for which split(j) holds, interpolating linearly.
func bisect(x, u []float64, b int, split func(j int) bool) ([]float64, []float64) {
	n := len(x)
	nx := make([]float64, 0, 2*n-1)
	nu := make([]float64, 0, (2*n-1)*b)
	for j := 0; j < n; j++ {
		if j > 0 && split(j-1) {
			nx = append(nx, 0.5*(x[j-1]+x[j]))
			for c := 0; c < b; c++ {
				nu = append(nu, 0.5*(u[(j-1)*b+c]+u[j*b+c]))
			}
		}
		nx = append(nx, x[j])
		nu = append(nu, u[j*b:(j+1)*b]...)
	}
	return nx, nu
}

// Central convective face values keep a convection-diffusion equation
// monotone only where the cell Péclet number m·Δx/Γ is at most 2 (Patankar,
// Numerical Heat Transfer and Fluid Flow, 1980, §5.2); beyond it the
// discrete solution can oscillate from point to point. Before central
// convection is switched on, intervals where it exceeds pecletLimit for the
// temperature (Γ = λ/c_p) or for a species (Γ = ρD_km) are halved, wherever
// that component changes by more than pecletChange of its range across the
// interval. On lean CH4/air (phi 0.8) the upwind grid had 23 such
// intervals, Péclet numbers up to 12, near the inlet and in the post-flame
// zone; the central solve on it did not converge in 2682 iterations.
const (
	pecletLimit  = 2
	pecletChange = 1e-3
)

// pecletSplit reports, per interval of the solution u on the grid of pr,
// whether it must be halved before central convection (see pecletLimit).
// It evaluates the residual at u to have the properties of u.
func (s *Solver) pecletSplit(pr *problem, u []float64) ([]bool, error) {
	f := make([]float64, len(u))
	if err := pr.Residual(u, f); err != nil {
		return nil, err
	}
	K, b, n := s.ph.nSpecies, pr.b, pr.n
	lo, hi := make([]float64, 1+K), make([]float64, 1+K)
	for c := 0; c <= K; c++ {
		lo[c], hi[c] = math.Inf(1), math.Inf(-1)
		for j := 0; j < n; j++ {
			lo[c], hi[c] = min(lo[c], u[j*b+c]), max(hi[c], u[j*b+c])
		}
	}
	m := u[compM(K)]
	split := make([]bool, n-1)
	gammas := make([]float64, K)
	for j := 0; j+1 < n; j++ {
		dx := pr.x[j+1] - pr.x[j]
		changes := func(c int) bool {
			r := hi[c] - lo[c]
			return r > 0 && math.Abs(u[(j+1)*b+c]-u[j*b+c]) > pecletChange*r
		}
		cpFace := 0.5 * (pr.cp[j] + pr.cp[j+1])
		if changes(compT) && m*dx*cpFace > pecletLimit*pr.lambda[j] {
			split[j] = true
			continue
		}
		gamma := s.faceDiffusivities(pr, u, j, gammas)
		for k := 0; k < K; k++ {
			if changes(compY(k)) && m*dx > pecletLimit*gamma[k] {
				split[j] = true
				break
			}
		}
	}
	return split, nil
}

// faceDiffusivities returns in gamma the species diffusivities ρD_km,
// kg/(m s), at face j (between points j and j+1) of u: the mixture-averaged
// coefficients of the last residual evaluation, or, with multicomponent
// diffusion (which has no per-species coefficient), the mixture-averaged
// ones computed at the face state, a proxy close enough for a Péclet
// number.
func (s *Solver) faceDiffusivities(pr *problem, u []float64, j int, gamma []float64) []float64 {
	K := s.ph.nSpecies
	if pr.multi == nil {
		wm := 0.5 * (pr.wMean[j] + pr.wMean[j+1])
		for k := range gamma {
			// rhoD holds rho D_km W_k/W, the coefficient of dX_k/dx.
			gamma[k] = pr.rhoD[j*K+k] * wm / s.ph.molarMass[k]
		}
		return gamma
	}
	w := pr.workers[0]
	Tm, wm := pr.midpointState(w, u, j)
	w.tr.Mixture(Tm, pr.pressure, w.xMid, w.yMid, &w.mix)
	rho := pr.pressure * wm / (thermo.GasConstant * Tm)
	for k := range gamma {
		gamma[k] = rho * w.mix.Diffusion[k]
	}
	return gamma
}

// count returns the number of true values in v.
func count(v []bool) int {
	n := 0
	for _, x := range v {
		if x {
			n++
		}
	}
	return n
}
