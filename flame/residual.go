package flame

import (
	"fmt"
	"math"
	"runtime"
	"sync"

	"flame1d/chem"
	"flame1d/newton"
	"flame1d/thermo"
	"flame1d/transport"
)

// physics is everything about the gas that the residual needs and that does
// not change during a solve: species data, kinetics and transport templates.
type physics struct {
	mech      *chem.Mechanism
	nSpecies  int
	molarMass []float64 // kg/mol
	invW      []float64 // 1/W_k
	kinetics  *chem.Kinetics
	transport *transport.Model
	thermo    []*thermo.NASA7
	set       *thermo.SpeciesSet
}

func newPhysics(m *chem.Mechanism, tr *transport.Model) (*physics, error) {
	kin, err := chem.NewKinetics(m)
	if err != nil {
		return nil, fmt.Errorf("kinetics: %w", err)
	}
	w, err := m.MolarMasses()
	if err != nil {
		return nil, err
	}
	ph := &physics{mech: m, nSpecies: len(m.Species), molarMass: w, kinetics: kin, transport: tr}
	ph.invW = make([]float64, len(w))
	for k := range w {
		ph.invW[k] = 1 / w[k]
	}
	sp := make([]thermo.Species, len(m.Species))
	for i := range m.Species {
		sp[i] = m.Species[i].Species
	}
	if ph.set, err = thermo.NewSpeciesSet(sp); err != nil {
		return nil, err
	}
	ph.thermo = make([]*thermo.NASA7, len(m.Species))
	for k := range m.Species {
		ph.thermo[k] = &m.Species[k].Thermo
	}
	return ph, nil
}

// equationMode says which equations are active in a solve stage.
type equationMode struct {
	energy bool // false: temperature held at fixedT profile
	// freeFlux: mass flux is the eigenvalue fixed by the anchor temperature;
	// false: held at the given value.
	freeFlux bool
}

// worker holds per-goroutine copies of the non-thread-safe evaluators and
// scratch arrays.
type worker struct {
	kin  *chem.Kinetics
	tr   *transport.Model
	conc []float64
	dWdC []float64 // K*K
	dWdT []float64
	dWdY []float64 // K*(K+1): d wdot_i/d(T, Y_k) at constant P
	xMid []float64
	yMid []float64
	mix  transport.MixtureProperties
	mc   *multicomponentScratch // set with multicomponent diffusion
}

// problem is the discretised free flame on a fixed grid; it implements
// newton.Problem, newton.Transient and newton.JacobianEvaluator.
type problem struct {
	ph   *physics
	x    []float64
	n    int // points
	b    int // block size
	mode equationMode

	pressure    float64
	inletT      float64
	inletY      []float64
	anchor      int     // index of the fixed-temperature point
	anchorT     float64 // K
	fixedFlux   float64 // kg/(m^2 s), used when !mode.freeFlux
	fixedT      []float64
	thermalDiff bool
	central     bool // central (instead of upwind) convective face values
	// multi, when non-nil, selects multicomponent diffusion
	// (diffusion_multicomponent.go).
	multi *multicomponentFaces
	// diffusionScale multiplies each species' diffusive flux before the
	// correction flux (Settings.DiffusionScale); nil means 1 for all.
	diffusionScale []float64
	// midpointTransport, when non-nil, evaluates the properties of each
	// midpoint with its own cache (the full-property Jacobian of the
	// sensitivities, flame/adjoint.go).
	midpointTransport []midpointTransport
	workers           []*worker
	haveTransport     bool
	// evaluations counts Residual calls, finite-difference ones included.
	evaluations int
	// Species thermodynamics cache: thermoCpk and thermoHk hold cp_k and
	// h_k of point j at temperature thermoT[j] (NaN: empty). They depend on
	// T alone, so a residual reuses them wherever T_j is unchanged; only
	// evaluations with live transport refill the cache, so the perturbed residuals of
	// a finite-difference Jacobian (one column in B perturbs T) recompute
	// the thermodynamics only where T was perturbed.
	thermoT, thermoCpk, thermoHk []float64

	// per-point state (n entries, or n*K)
	X     []float64 // mole fractions n*K
	wMean []float64
	rho   []float64
	cp    []float64 // mixture cp, J/(kg K)
	cpk   []float64 // species cp, J/(kg K), n*K
	hk    []float64 // species molar enthalpy, J/mol, n*K
	wdot  []float64 // n*K, mol/(m^3 s)

	// per-midpoint (n-1 entries, or (n-1)*K)
	rhoD   []float64 // rho D_km W_k / W_mean, kg/(m s), (n-1)*K
	rhoDT  []float64 // rho D_km W_k/W_mean theta_k / T, kg/(m s K), (n-1)*K
	lambda []float64 // W/(m K)
	flux   []float64 // j_k, kg/(m^2 s), (n-1)*K
}

func newProblem(ph *physics, x []float64, inletT, pressure float64, inletY []float64, thermalDiff bool, nWorkers int) *problem {
	n, K := len(x), ph.nSpecies
	if nWorkers <= 0 {
		nWorkers = runtime.GOMAXPROCS(0)
	}
	if nWorkers > n/4+1 {
		nWorkers = n/4 + 1
	}
	p := &problem{
		ph: ph, x: x, n: n, b: blockSize(K), pressure: pressure, inletT: inletT,
		inletY: inletY, thermalDiff: thermalDiff,
		X: make([]float64, n*K), wMean: make([]float64, n), rho: make([]float64, n),
		cp: make([]float64, n), cpk: make([]float64, n*K), hk: make([]float64, n*K),
		wdot: make([]float64, n*K), rhoD: make([]float64, (n-1)*K), rhoDT: make([]float64, (n-1)*K),
		lambda: make([]float64, n-1), flux: make([]float64, (n-1)*K), fixedT: make([]float64, n),
		thermoT: make([]float64, n), thermoCpk: make([]float64, n*K), thermoHk: make([]float64, n*K),
	}
	for j := range p.thermoT {
		p.thermoT[j] = math.NaN()
	}
	for i := 0; i < nWorkers; i++ {
		w := &worker{
			kin: ph.kinetics.Clone(), tr: ph.transport.Clone(),
			conc: make([]float64, K), xMid: make([]float64, K), yMid: make([]float64, K),
			dWdC: make([]float64, K*K), dWdT: make([]float64, K), dWdY: make([]float64, K*(K+1)),
		}
		w.mix.Diffusion = make([]float64, K)
		if thermalDiff {
			w.mix.ThermalDiffusionRatios = make([]float64, K)
		}
		p.workers = append(p.workers, w)
	}
	return p
}

func (p *problem) Size() (int, int) { return p.n, p.b }

// parallel runs fn over [0, count) split into one contiguous chunk per worker.
func (p *problem) parallel(count int, fn func(w *worker, lo, hi int)) {
	nw := len(p.workers)
	if nw == 1 || count < 8 {
		fn(p.workers[0], 0, count)
		return
	}
	var wg sync.WaitGroup
	chunk := (count + nw - 1) / nw
	for i := 0; i < nw; i++ {
		lo, hi := i*chunk, min((i+1)*chunk, count)
		if lo >= hi {
			break
		}
		wg.Add(1)
		go func(w *worker, lo, hi int) {
			defer wg.Done()
			fn(w, lo, hi)
		}(p.workers[i], lo, hi)
	}
	wg.Wait()
}

// errNonPhysical is returned for states the equations cannot be evaluated at.
type errNonPhysical struct{ msg string }

func (e errNonPhysical) Error() string { return e.msg }

// evaluation says what a residual evaluation takes from the last full
// evaluation instead of computing it at u. Fluxes, convection and
// thermodynamics are always computed at u.
type evaluation struct {
	transportFrozen bool // midpoint transport properties
	chemistryFrozen bool // production rates
}

var (
	// full: everything at u; the caches are refilled.
	full = evaluation{}
	// frozenChemistry: the full-property Jacobian of the sensitivities,
	// whose chemistry is added analytically.
	frozenChemistry = evaluation{chemistryFrozen: true}
	// frozenProperties: Newton's finite-difference Jacobian.
	frozenProperties = evaluation{transportFrozen: true, chemistryFrozen: true}
)

// residualWith returns the residual evaluated as e says.
func (p *problem) residualWith(e evaluation) func(u, f []float64) error {
	return func(u, f []float64) error { return p.evaluate(u, f, e) }
}

// pointProperties fills the per-point thermodynamic state and, in a full
// evaluation, the production rates.
func (p *problem) pointProperties(u []float64, e evaluation) error {
	K := p.ph.nSpecies
	var bad error
	var mu sync.Mutex
	p.parallel(p.n, func(w *worker, lo, hi int) {
		for j := lo; j < hi; j++ {
			base := j * p.b
			T := u[base+compT]
			if !(T > 100 && T < 10000) {
				mu.Lock()
				bad = errNonPhysical{fmt.Sprintf("temperature %g K at point %d", T, j)}
				mu.Unlock()
				continue
			}
			Y := u[base+1 : base+1+K]
			sumYW := 0.0
			for k := 0; k < K; k++ {
				sumYW += Y[k] * p.ph.invW[k]
			}
			if !(sumYW > 0) {
				mu.Lock()
				bad = errNonPhysical{fmt.Sprintf("mass fractions sum to a non-positive mean at point %d", j)}
				mu.Unlock()
				continue
			}
			wm := 1 / sumYW
			p.wMean[j] = wm
			rho := p.pressure * wm / (thermo.GasConstant * T)
			p.rho[j] = rho
			X := p.X[j*K : (j+1)*K]
			cpk := p.cpk[j*K : (j+1)*K]
			hk := p.hk[j*K : (j+1)*K]
			if T == p.thermoT[j] {
				copy(cpk, p.thermoCpk[j*K:(j+1)*K])
				copy(hk, p.thermoHk[j*K:(j+1)*K])
			} else {
				for k := 0; k < K; k++ {
					th := p.ph.thermo[k]
					cpk[k] = th.CpR(T) * thermo.GasConstant * p.ph.invW[k]
					hk[k] = th.HRT(T) * thermo.GasConstant * T
				}
				if !e.transportFrozen {
					copy(p.thermoCpk[j*K:(j+1)*K], cpk)
					copy(p.thermoHk[j*K:(j+1)*K], hk)
					p.thermoT[j] = T
				}
			}
			cpMix := 0.0
			for k := 0; k < K; k++ {
				X[k] = Y[k] * wm * p.ph.invW[k]
				cpMix += Y[k] * cpk[k]
				w.conc[k] = rho * Y[k] * p.ph.invW[k]
			}
			p.cp[j] = cpMix
			if !e.chemistryFrozen {
				w.kin.NetProductionRates(T, w.conc, p.wdot[j*K:(j+1)*K])
			}
		}
	})
	return bad
}

// midpointFluxes evaluates transport properties at cell midpoints (unless
// e freezes them) and the corrected diffusive mass fluxes j_k.
func (p *problem) midpointFluxes(u []float64, e evaluation) {
	K := p.ph.nSpecies
	p.parallel(p.n-1, func(w *worker, lo, hi int) {
		for j := lo; j < hi; j++ {
			if p.multi != nil {
				p.multicomponentFlux(w, u, j, e)
				continue
			}
			a, b := j*p.b, (j+1)*p.b
			Ta, Tb := u[a+compT], u[b+compT]
			dx := p.x[j+1] - p.x[j]
			rhoD := p.rhoD[j*K : (j+1)*K]
			rhoDT := p.rhoDT[j*K : (j+1)*K]
			if !e.transportFrozen {
				Tm, wm := p.midpointState(w, u, j)
				if p.midpointTransport != nil {
					p.midpointTransport[j].mixture(Tm, p.pressure, w.xMid, w.yMid, &w.mix)
				} else {
					w.tr.Mixture(Tm, p.pressure, w.xMid, w.yMid, &w.mix)
				}
				rho := p.pressure * wm / (thermo.GasConstant * Tm)
				p.lambda[j] = w.mix.Conductivity
				for k := 0; k < K; k++ {
					rhoD[k] = rho * w.mix.Diffusion[k] * p.ph.molarMass[k] / wm
					if p.thermalDiff {
						rhoDT[k] = rhoD[k] * w.mix.ThermalDiffusionRatios[k] / Tm
					} else {
						rhoDT[k] = 0
					}
				}
			}
			// j_k = -rho D_km (W_k/W) dX_k/dx - rho D_km (W_k/W) theta_k (1/T) dT/dx,
			// then the correction flux -Y_k sum_i j_i.
			fl := p.flux[j*K : (j+1)*K]
			Xa, Xb := p.X[j*K:(j+1)*K], p.X[(j+1)*K:(j+2)*K]
			dTdx := (Tb - Ta) / dx
			sum := 0.0
			for k := 0; k < K; k++ {
				fl[k] = -rhoD[k]*(Xb[k]-Xa[k])/dx - rhoDT[k]*dTdx
				if p.diffusionScale != nil {
					fl[k] *= p.diffusionScale[k]
				}
				sum += fl[k]
			}
			for k := 0; k < K; k++ {
				yk := 0.5 * (u[a+1+k] + u[b+1+k])
				fl[k] -= yk * sum
			}
		}
	})
}

// midpointState sets w.yMid and w.xMid to the mean state of face j
// (between points j and j+1) and returns its temperature, K, and mean molar
// mass, kg/mol.
func (p *problem) midpointState(w *worker, u []float64, j int) (T, wMean float64) {
	K := p.ph.nSpecies
	a, b := j*p.b, (j+1)*p.b
	sumYW := 0.0
	for k := 0; k < K; k++ {
		y := 0.5 * (u[a+1+k] + u[b+1+k])
		w.yMid[k] = y
		sumYW += y * p.ph.invW[k]
	}
	wMean = 1 / sumYW
	for k := 0; k < K; k++ {
		w.xMid[k] = w.yMid[k] * wMean * p.ph.invW[k]
	}
	return 0.5 * (u[a+compT] + u[b+compT]), wMean
}

// Residual evaluates the discretised equations (see package doc). Signs are
// such that the transient form is w du/dt = -F(u) with w >= 0.
func (p *problem) Residual(u, f []float64) error { return p.evaluate(u, f, full) }

// evaluate is Residual with the evaluation e.
func (p *problem) evaluate(u, f []float64, e evaluation) error {
	p.evaluations++
	if err := p.pointProperties(u, e); err != nil {
		return err
	}
	p.midpointFluxes(u, e)
	K := p.ph.nSpecies
	cm := compM(K)
	n := p.n
	p.parallel(n, func(_ *worker, lo, hi int) {
		for j := lo; j < hi; j++ {
			base := j * p.b
			fj := f[base : base+p.b]
			uj := u[base : base+p.b]
			m := uj[cm]
			switch {
			case j == 0:
				fj[compT] = uj[compT] - p.inletT
				fl := p.flux[0:K]
				next := u[base+p.b : base+2*p.b]
				for k := 0; k < K; k++ {
					fj[1+k] = m*p.face(uj[1+k], next[1+k]) + fl[k] - m*p.inletY[k]
				}
			case j == n-1:
				prev := u[base-p.b : base]
				fj[compT] = uj[compT] - prev[compT]
				for k := 0; k < K; k++ {
					fj[1+k] = uj[1+k] - prev[1+k]
				}
			default:
				prev := u[base-p.b : base]
				hC := 0.5 * (p.x[j+1] - p.x[j-1])
				flL := p.flux[(j-1)*K : j*K]
				flR := p.flux[j*K : (j+1)*K]
				wd := p.wdot[j*K : (j+1)*K]
				// Finite-volume form: (m Y_{j+1/2} + j_{j+1/2}) - (m Y_{j-1/2} +
				// j_{j-1/2}) = h_C w_j W, the face value Y_{j+1/2} upwind (Y_j)
				// or central ((Y_j + Y_{j+1})/2). Summed over species with
				// element weights the chemistry cancels, so element fluxes are
				// conserved exactly.
				next := u[base+p.b : base+2*p.b]
				for k := 0; k < K; k++ {
					conv := m * (p.face(uj[1+k], next[1+k]) - p.face(prev[1+k], uj[1+k]))
					fj[1+k] = (conv+flR[k]-flL[k])/hC - wd[k]*p.ph.molarMass[k]
				}
				if p.mode.energy {
					fj[compT] = p.energyResidual(u, j)
				} else {
					fj[compT] = uj[compT] - p.fixedT[j]
				}
			}
			// Mass-flux rows: dm/dx = 0 towards the anchor, where the
			// temperature is pinned instead (or m is held fixed).
			switch {
			case !p.mode.freeFlux:
				fj[cm] = m - p.fixedFlux
			case j < p.anchor:
				fj[cm] = m - u[base+p.b+cm]
			case j == p.anchor:
				fj[cm] = uj[compT] - p.anchorT
			default:
				fj[cm] = m - u[base-p.b+cm]
			}
		}
	})
	for _, v := range f {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return errNonPhysical{"residual is not finite"}
		}
	}
	return nil
}

// TransientWeights gives rho for species rows and rho cp for the energy row
// at interior points; boundary rows and mass-flux rows are algebraic.
func (p *problem) TransientWeights(u, w []float64) {
	K := p.ph.nSpecies
	for i := range w {
		w[i] = 0
	}
	if err := p.pointProperties(u, frozenChemistry); err != nil {
		// Fall back to unit weights at points that could not be evaluated;
		// the next residual call reports the problem.
		for j := 1; j < p.n-1; j++ {
			for c := 0; c <= K; c++ {
				w[j*p.b+c] = 1
			}
		}
		return
	}
	for j := 1; j < p.n-1; j++ {
		base := j * p.b
		for k := 0; k < K; k++ {
			w[base+1+k] = p.rho[j]
		}
		if p.mode.energy {
			w[base+compT] = p.rho[j] * p.cp[j]
		}
	}
}

// Jacobian assembles the Jacobian in two parts. Transport, convection and
// thermodynamic terms are differentiated by three-colour finite differences
// of the residual with the midpoint transport properties and the production
// rates frozen at u: the properties depend weakly on the state compared with
// the fluxes they multiply, so Newton's convergence is barely affected while
// a perturbed residual costs no kinetics and no transport evaluation. The
// chemical source terms are added analytically, from the exact derivatives of
// the production rates (chem.Kinetics.ProductionRateDerivatives) converted
// from (T, C) at constant C to (T, Y) at constant P:
//
//	dC_i/dY_k = rho/W_i delta_ik - C_i W/W_k,   dC_i/dT = -C_i/T.
func (p *problem) Jacobian(u, f0 []float64, J *newton.BlockTridiagonal) error {
	if err := p.Residual(u, f0); err != nil {
		return err
	}
	err := newton.FiniteDifferenceJacobian(p.residualWith(frozenProperties), u, f0, J, 1e-7, 1e-12)
	if err != nil {
		return err
	}
	p.addChemistryJacobian(u, J)
	return nil
}

// addChemistryJacobian adds d(-w_k W_k)/du to the species rows and
// d(sum_k h_k w_k)/du (h_k held, its T-dependence is in the finite
// differences) to the energy row of every interior point.
func (p *problem) addChemistryJacobian(u []float64, J *newton.BlockTridiagonal) {
	K := p.ph.nSpecies
	b := p.b
	p.parallel(p.n, func(w *worker, lo, hi int) {
		for j := max(lo, 1); j < min(hi, p.n-1); j++ {
			base := j * b
			T := u[base+compT]
			rho, wm := p.rho[j], p.wMean[j]
			Y := u[base+1 : base+1+K]
			for k := 0; k < K; k++ {
				w.conc[k] = rho * Y[k] * p.ph.invW[k]
			}
			wd := p.wdot[j*K : (j+1)*K]
			w.kin.ProductionRateDerivatives(T, w.conc, wd, w.dWdC, w.dWdT)
			// dWdY row i: [d/dT, d/dY_0 .. d/dY_K-1]
			for i := 0; i < K; i++ {
				row := w.dWdC[i*K : (i+1)*K]
				sc := 0.0
				for c := 0; c < K; c++ {
					sc += row[c] * w.conc[c]
				}
				out := w.dWdY[i*(K+1) : (i+1)*(K+1)]
				out[0] = w.dWdT[i] - sc/T
				for k := 0; k < K; k++ {
					out[1+k] = row[k]*rho*p.ph.invW[k] - sc*wm*p.ph.invW[k]
				}
			}
			D := J.DiagBlock(j)
			hk := p.hk[j*K : (j+1)*K]
			for i := 0; i < K; i++ {
				dw := w.dWdY[i*(K+1) : (i+1)*(K+1)]
				rowY := D[(1+i)*b : (1+i)*b+K+1]
				Wi := p.ph.molarMass[i]
				for c := 0; c <= K; c++ {
					rowY[c] -= Wi * dw[c]
				}
				if p.mode.energy {
					rowT := D[compT*b : compT*b+K+1]
					for c := 0; c <= K; c++ {
						rowT[c] += hk[i] * dw[c]
					}
				}
			}
		}
	})
}

// energyResidual is the temperature form of the energy equation at interior
// point j, discretised to match the finite-volume species equations
// (upwind faces shown; with central faces the convective sum is
// (1/2) sum_k [Y_k,j+1 (h_k,j+1 - h_k,j) + Y_k,j-1 (h_k,j - h_k,j-1)]):
//
//	F_T = [ m sum_k Y_k,j-1 (h_k,j - h_k,j-1)
//	      - (lambda_+ (T_j+1 - T_j)/h_R - lambda_- (T_j - T_j-1)/h_L)
//	      + sum_k ((h_k,j+1 - h_k,j) j_k,+ + (h_k,j - h_k,j-1) j_k,-)/2 ] / h_C
//	      + sum_k h_k,j w_k
//
// (h_k per unit mass here). It equals the conservative enthalpy form
// [(m h + q)_j - (m h + q)_j-1]/h_C, with q = -lambda dT/dx + sum_k h_k j_k
// and midpoint h_k the mean of its neighbours, minus sum_k h_k,j times the
// species residuals. So at a solution the discrete total enthalpy flux is
// conserved exactly and the burned gas reaches the inlet enthalpy on any
// grid, while the Jacobian keeps the well-conditioned m cp dT/dx coupling of
// the temperature form (upwind, like the species convection).
func (p *problem) energyResidual(u []float64, j int) float64 {
	K := p.ph.nSpecies
	b := p.b
	Tm, T, Tp := u[(j-1)*b+compT], u[j*b+compT], u[(j+1)*b+compT]
	m := u[j*b+compM(K)]
	hL := p.x[j] - p.x[j-1]
	hR := p.x[j+1] - p.x[j]
	hC := 0.5 * (hL + hR)
	yPrev := u[(j-1)*b+1 : (j-1)*b+1+K]
	yNext := u[(j+1)*b+1 : (j+1)*b+1+K]
	hPrev, h, hNext := p.hk[(j-1)*K:j*K], p.hk[j*K:(j+1)*K], p.hk[(j+1)*K:(j+2)*K]
	flL, flR := p.flux[(j-1)*K:j*K], p.flux[j*K:(j+1)*K]
	wd := p.wdot[j*K : (j+1)*K]
	conv, diff, heat := 0.0, 0.0, 0.0
	for k := 0; k < K; k++ {
		iw := p.ph.invW[k]
		if p.central {
			conv += 0.5 * (yNext[k]*(hNext[k]-h[k]) + yPrev[k]*(h[k]-hPrev[k])) * iw
		} else {
			conv += yPrev[k] * (h[k] - hPrev[k]) * iw
		}
		diff += ((hNext[k]-h[k])*flR[k] + (h[k]-hPrev[k])*flL[k]) * iw
		heat += h[k] * wd[k]
	}
	cond := p.lambda[j]*(Tp-T)/hR - p.lambda[j-1]*(T-Tm)/hL
	return (m*conv-cond+0.5*diff)/hC + heat
}

// face is the convective face value between a point and its downstream
// neighbour: the upwind (upstream) value, or their mean with central
// convection.
func (p *problem) face(up, down float64) float64 {
	if p.central {
		return 0.5 * (up + down)
	}
	return up
}
