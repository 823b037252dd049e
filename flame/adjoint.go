package flame

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"time"

	"flame1d/chem"
	"flame1d/newton"
	"flame1d/thermo"
	"flame1d/transport"
)

// SensitivityRequest says which parameters besides the rate constants of
// every reaction (always included) get a flame-speed sensitivity.
type SensitivityRequest struct {
	// DiffusionSpecies are species indices whose mixture-averaged diffusion
	// coefficient is scaled (one multiplier per species, Settings.DiffusionScale).
	DiffusionSpecies []int
	// ActivationEnergies are reaction indices (Elementary or ThreeBody form)
	// whose activation energy E is a parameter.
	ActivationEnergies []int
	// Perturbations are parameters the residual is differentiated in by a
	// central difference of two perturbed problems (pool yields, whose
	// change moves the inlet composition, the cracking step and the
	// pseudo-fuel's thermo at once).
	Perturbations []Perturbation
}

// Perturbation is a parameter p given by the problems at ln p ± Step: the
// same species in the same order (a mechanism whose reactions or thermo
// differ, an inlet whose composition differs), the transport data
// unchanged.
type Perturbation struct {
	Name        string
	Step        float64 // change of ln p between the base and each side
	Plus, Minus PerturbedProblem
}

// PerturbedProblem is the mechanism and inlet at one side of a
// Perturbation.
type PerturbedProblem struct {
	Mechanism *chem.Mechanism
	Inlet     Inlet
}

// Sensitivity holds the normalised sensitivities d ln S_L / d ln p of the
// flame speed of a converged flame.
type Sensitivity struct {
	FlameSpeed float64 // m/s
	// RateConstants[i] is d ln S_L / d ln k_i for reaction i, its forward
	// and reverse rate constants scaled together (chem.Mechanism.WithRateMultipliers).
	RateConstants []float64
	// ActivationEnergies, Diffusion and Perturbations follow the order of
	// the request.
	ActivationEnergies []ParameterSensitivity
	Diffusion          []ParameterSensitivity
	Perturbations      []ParameterSensitivity
	// ResidualEvaluations counts the residual evaluations of the whole
	// computation (the Jacobian's included); Time is its wall time.
	ResidualEvaluations int
	Time                time.Duration
}

// ParameterSensitivity is one coefficient: Index is the reaction or species
// index (-1 for a Perturbation), Name the species name, the reaction
// equation or the perturbation's name.
type ParameterSensitivity struct {
	Index int
	Name  string
	Value float64
}

// Sensitivities returns the normalised sensitivities of the flame speed of
// the converged flame sol (solved by s with settings set) by one adjoint
// solve. With F(u, p) = 0 the discrete equations, J = dF/du at the solution
// and S_L = m/rho_u,
//
//	d ln S_L/d ln p = -(1/m) lambda^T dF/d ln p - d ln rho_u/d ln p,
//	J^T lambda = e_m,
//
// e_m the unit vector of the mass flux at the inlet point (m is the same at
// every point). J is the Jacobian of the full residual, transport
// properties not frozen (Newton's own Jacobian freezes them): finite
// differences of the residual with the production rates frozen, plus their
// analytic derivatives. The parameter derivatives are analytic where the
// residual is linear in the parameter:
//
//	rate constant k_i:   dF_Yk/d ln k_i = -W_k nu_ki q_i,  dF_T/d ln k_i = sum_k h_k nu_ki q_i
//	activation energy:   the same times -E_i/(R T) (forward rate only for a step with an explicit reverse rate)
//	diffusion scale s_k: F(2 s_k) - F(s_k) with the properties frozen (the fluxes are linear in s_k)
//
// at every interior point, q_i the net rate of progress. No flame is
// solved again for any parameter.
func (s *Solver) Sensitivities(sol *Solution, set Settings, req SensitivityRequest) (*Sensitivity, error) {
	start := time.Now()
	set = withDefaults(set)
	if err := s.compatible(sol); err != nil {
		return nil, err
	}
	if err := s.checkDiffusionScale(set); err != nil {
		return nil, err
	}
	ph := s.ph
	K := ph.nSpecies
	pr := s.problemFor(sol, set)
	pr.central = set.CentralConvection
	b := pr.b
	n := pr.n
	u := append([]float64(nil), sol.U...)
	f0 := make([]float64, len(u))
	evals := 0
	residualWith := func(e evaluation) func(u, f []float64) error {
		return func(u, f []float64) error {
			evals++
			return pr.evaluate(u, f, e)
		}
	}
	residual := residualWith(full)

	J := newton.NewBlockTridiagonal(n, b)
	pr.midpointTransport = newMidpointTransport(ph.transport, n-1, K, !set.NoThermalDiffusion)
	if err := residual(u, f0); err != nil {
		return nil, fmt.Errorf("sensitivities: residual at the solution: %w", err)
	}
	err := newton.FiniteDifferenceJacobian(residualWith(frozenChemistry), u, f0, J, 1e-7, 1e-12)
	if err != nil {
		return nil, fmt.Errorf("sensitivities: Jacobian: %w", err)
	}
	// The finite differences leave the per-point state of the last
	// perturbed column; restore the solution's before the analytic terms.
	if err := residual(u, f0); err != nil {
		return nil, fmt.Errorf("sensitivities: residual at the solution: %w", err)
	}
	pr.addChemistryJacobian(u, J)
	pr.midpointTransport = nil
	if err := J.Factor(); err != nil {
		return nil, fmt.Errorf("sensitivities: factoring the Jacobian of the solution: %w", err)
	}
	lambda := make([]float64, len(u))
	lambda[compM(K)] = 1
	J.SolveTransposed(lambda)

	m := sol.MassFlux()
	out := &Sensitivity{FlameSpeed: m / inletDensity(ph, sol.Inlet)}
	out.RateConstants, out.ActivationEnergies, err = s.kineticSensitivities(pr, u, lambda, m, req.ActivationEnergies)
	if err != nil {
		return nil, err
	}

	if out.Diffusion, err = s.diffusionSensitivities(pr, set, u, f0, lambda, m, req.DiffusionSpecies, residualWith(frozenProperties)); err != nil {
		return nil, err
	}

	for _, pt := range req.Perturbations {
		v, err := s.perturbationSensitivity(sol, set, u, lambda, m, pt, &evals)
		if err != nil {
			return nil, fmt.Errorf("sensitivities: %s: %w", pt.Name, err)
		}
		out.Perturbations = append(out.Perturbations, ParameterSensitivity{Index: -1, Name: pt.Name, Value: v})
	}
	for _, v := range out.RateConstants {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("sensitivities: a rate-constant sensitivity is not finite (singular Jacobian at the solution?)")
		}
	}
	out.ResidualEvaluations = evals
	out.Time = time.Since(start)
	return out, nil
}

// kineticSensitivities returns d ln S_L/d ln k_i for every reaction and
// d ln S_L/d ln E_i for the reactions listed in eIdx, from the adjoint
// lambda: d m/d p = -sum_j sum_k lambda_{j,k} dF_{j,k}/dp, the chemistry
// entering only the interior points' species and energy rows.
func (s *Solver) kineticSensitivities(pr *problem, u, lambda []float64, m float64, eIdx []int) ([]float64, []ParameterSensitivity, error) {
	ph := s.ph
	K := ph.nSpecies
	rx := ph.mech.Reactions
	R := len(rx)
	for _, i := range eIdx {
		if i < 0 || i >= R {
			return nil, nil, fmt.Errorf("sensitivities: reaction index %d outside 1-%d", i+1, R)
		}
		if f := rx[i].Form; f != chem.Elementary && f != chem.ThreeBody {
			return nil, nil, fmt.Errorf("sensitivities: activation energy of reaction %d (%s): only Elementary and ThreeBody steps have a single activation energy", i+1, rx[i].Equation)
		}
	}
	nu := make([][]chem.Participant, R)
	for i := range rx {
		nu[i] = rx[i].NetStoichiometry()
	}
	kin := ph.kinetics.Clone()
	conc := make([]float64, K)
	fwd, rev, net := make([]float64, R), make([]float64, R), make([]float64, R)
	g := make([]float64, K)
	dmdlnk := make([]float64, R)
	dmdlnE := make([]float64, len(eIdx))
	for j := 1; j < pr.n-1; j++ {
		base := j * pr.b
		T := u[base+compT]
		rho := pr.rho[j]
		for k := 0; k < K; k++ {
			conc[k] = rho * u[base+1+k] * ph.invW[k]
		}
		kin.RatesOfProgress(T, conc, fwd, rev, net)
		// g_k = dm-weight of a unit production of species k at point j:
		// -lambda . dF/d wdot_k.
		hk := pr.hk[j*K : (j+1)*K]
		lT := 0.0
		if pr.mode.energy {
			lT = lambda[base+compT]
		}
		for k := 0; k < K; k++ {
			g[k] = -(-ph.molarMass[k]*lambda[base+1+k] + hk[k]*lT)
		}
		for i := 0; i < R; i++ {
			if net[i] == 0 {
				continue
			}
			w := 0.0
			for _, p := range nu[i] {
				w += p.Coefficient * g[p.Species]
			}
			dmdlnk[i] += net[i] * w
		}
		for e, i := range eIdx {
			q := net[i]
			if rx[i].ReverseRate != nil {
				q = fwd[i]
			}
			w := 0.0
			for _, p := range nu[i] {
				w += p.Coefficient * g[p.Species]
			}
			dmdlnE[e] += -rx[i].Rate.E / (thermo.GasConstant * T) * q * w
		}
	}
	out := make([]float64, R)
	for i := range out {
		out[i] = dmdlnk[i] / m
	}
	var es []ParameterSensitivity
	for e, i := range eIdx {
		es = append(es, ParameterSensitivity{Index: i, Name: rx[i].Equation, Value: dmdlnE[e] / m})
	}
	return out, es, nil
}

// perturbationSensitivity differentiates the residual at u by a central
// difference of the two perturbed problems and adds the change of the
// unburned density.
func (s *Solver) perturbationSensitivity(sol *Solution, set Settings, u, lambda []float64, m float64, pt Perturbation, evals *int) (float64, error) {
	if !(pt.Step > 0) {
		return 0, fmt.Errorf("step %g must be positive", pt.Step)
	}
	side := func(pp PerturbedProblem) ([]float64, float64, error) {
		alt, err := s.WithReactions(pp.Mechanism)
		if err != nil {
			return nil, 0, err
		}
		if err := alt.checkInlet(pp.Inlet); err != nil {
			return nil, 0, err
		}
		shifted := *sol
		shifted.Inlet = pp.Inlet
		shifted.Mechanism = pp.Mechanism
		pr := alt.problemFor(&shifted, set)
		pr.central = set.CentralConvection
		f := make([]float64, len(u))
		*evals++
		if err := pr.Residual(u, f); err != nil {
			return nil, 0, err
		}
		return f, inletDensity(alt.ph, pp.Inlet), nil
	}
	fPlus, rhoPlus, err := side(pt.Plus)
	if err != nil {
		return 0, fmt.Errorf("perturbed up: %w", err)
	}
	fMinus, rhoMinus, err := side(pt.Minus)
	if err != nil {
		return 0, fmt.Errorf("perturbed down: %w", err)
	}
	dm := 0.0
	for i := range fPlus {
		dm -= lambda[i] * (fPlus[i] - fMinus[i]) / (2 * pt.Step)
	}
	return dm/m - math.Log(rhoPlus/rhoMinus)/(2*pt.Step), nil
}

// WithReactions returns a solver for a mechanism that has the species of
// s's mechanism, in the same order and with the same transport data, but
// other reactions or thermo (rate-constant perturbations, a perturbed
// cracked pool). The transport fits are shared, not refitted.
func (s *Solver) WithReactions(m *chem.Mechanism) (*Solver, error) {
	own := s.ph.mech
	if len(m.Species) != len(own.Species) {
		return nil, fmt.Errorf("mechanism %s has %d species, the solver's %s has %d", m.Name, len(m.Species), own.Name, len(own.Species))
	}
	for k := range m.Species {
		if m.Species[k].Name != own.Species[k].Name {
			return nil, fmt.Errorf("mechanism %s: species %d is %s, the solver's mechanism has %s", m.Name, k+1, m.Species[k].Name, own.Species[k].Name)
		}
	}
	ph, err := newPhysics(m, s.ph.transport)
	if err != nil {
		return nil, err
	}
	return &Solver{ph: ph}, nil
}

// checkDiffusionScale checks Settings.DiffusionScale against the mechanism.
func (s *Solver) checkDiffusionScale(set Settings) error {
	if set.DiffusionScale == nil {
		return nil
	}
	if set.Diffusion == Multicomponent {
		return errors.New("diffusion scales apply to mixture-averaged diffusion; solve with mixture-averaged diffusion")
	}
	if len(set.DiffusionScale) != s.ph.nSpecies {
		return fmt.Errorf("diffusion scale has %d entries, mechanism %s has %d species", len(set.DiffusionScale), s.ph.mech.Name, s.ph.nSpecies)
	}
	for k, v := range set.DiffusionScale {
		if !(v > 0) || math.IsInf(v, 0) {
			return fmt.Errorf("diffusion scale of %s is %g; it must be positive and finite", s.ph.mech.Species[k].Name, v)
		}
	}
	return nil
}

// inletDensity returns rho_u = P W/(R T) of the inlet, kg/m^3.
func inletDensity(ph *physics, in Inlet) float64 {
	return in.P * meanMolarMassY(ph, in.Y) / (thermo.GasConstant * in.T)
}

// SolveOnGrid solves the flame for the inlet on the grid of a converged
// neighbouring solution prev, starting from prev's state, without grid
// refinement or domain changes. The solution is the discrete one whose
// derivatives Sensitivities returns: finite-difference checks of the
// sensitivities and Monte-Carlo sampling of rate constants use it.
func (s *Solver) SolveOnGrid(prev *Solution, in Inlet, set Settings) (*Solution, error) {
	start := time.Now()
	set, err := s.prepare(in, set)
	if err != nil {
		return nil, err
	}
	if err := s.compatible(prev); err != nil {
		return nil, err
	}
	sol := *prev
	sol.Mechanism = s.ph.mech
	sol.Inlet = in
	sol.X = append([]float64(nil), prev.X...)
	sol.U = append([]float64(nil), prev.U...)
	sol.Stats = Stats{}
	pr := s.problemFor(&sol, set)
	pr.central = set.CentralConvection
	res, err := newton.Solve(pr, sol.U, s.newtonOptions(set, pr.b))
	sol.Stats.add(res, pr.evaluations)
	sol.Stats.WallTime = time.Since(start)
	if err != nil {
		return nil, fmt.Errorf("%w on the fixed grid of %d points: %v", ErrNotConverged, sol.Points(), err)
	}
	return &sol, nil
}

// midpointTransport evaluates the mixture properties of one midpoint and
// keeps the last state and result. A finite-difference Jacobian perturbs
// every third point at a time: a third of the midpoints see their last
// state again (the result is copied), and the columns of mass fractions
// leave the temperature unchanged (the evaluator's own temperature cache
// skips the temperature fits, four fifths of a GRI-Mech 3.0 evaluation).
type midpointTransport struct {
	tr   *transport.Model
	T    float64
	y    []float64
	mix  transport.MixtureProperties
	have bool
}

func newMidpointTransport(tr *transport.Model, n, K int, thermalDiffusion bool) []midpointTransport {
	out := make([]midpointTransport, n)
	for j := range out {
		m := &out[j]
		m.tr = tr.Clone()
		m.y = make([]float64, K)
		m.mix.Diffusion = make([]float64, K)
		if thermalDiffusion {
			m.mix.ThermalDiffusionRatios = make([]float64, K)
		}
	}
	return out
}

// mixture fills out as transport.Model.Mixture does.
func (m *midpointTransport) mixture(T, P float64, X, Y []float64, out *transport.MixtureProperties) {
	if !m.have || T != m.T || !slices.Equal(Y, m.y) {
		m.tr.Mixture(T, P, X, Y, &m.mix)
		m.T = T
		copy(m.y, Y)
		m.have = true
	}
	out.Viscosity, out.Conductivity = m.mix.Viscosity, m.mix.Conductivity
	copy(out.Diffusion, m.mix.Diffusion)
	if out.ThermalDiffusionRatios != nil {
		copy(out.ThermalDiffusionRatios, m.mix.ThermalDiffusionRatios)
	}
}

// diffusionSensitivities returns d ln S_L/d ln s_k for the species listed,
// s_k the multiplier of species k's diffusion coefficient. With the
// transport properties and production rates frozen the residual is linear
// in each s_k, so F(2 s_k) - F(s_k) is dF/d ln s_k exactly; f0 is F at the
// solution u.
func (s *Solver) diffusionSensitivities(pr *problem, set Settings, u, f0, lambda []float64, m float64, species []int,
	residual func(u, f []float64) error) ([]ParameterSensitivity, error) {
	if len(species) == 0 {
		return nil, nil
	}
	if pr.multi != nil {
		return nil, errors.New("sensitivities: diffusion sensitivities are defined for mixture-averaged diffusion; solve with mixture-averaged diffusion")
	}
	ph := s.ph
	K := ph.nSpecies
	scale := make([]float64, K)
	for k := range scale {
		scale[k] = 1
		if set.DiffusionScale != nil {
			scale[k] = set.DiffusionScale[k]
		}
	}
	pr.diffusionScale = scale
	defer func() { pr.diffusionScale = set.DiffusionScale }()
	fp := make([]float64, len(u))
	var out []ParameterSensitivity
	for _, k := range species {
		if k < 0 || k >= K {
			return nil, fmt.Errorf("sensitivities: diffusion species index %d outside 0-%d", k, K-1)
		}
		old := scale[k]
		scale[k] = 2 * old
		err := residual(u, fp)
		scale[k] = old
		if err != nil {
			return nil, fmt.Errorf("sensitivities: residual with the diffusion of %s scaled: %w", ph.mech.Species[k].Name, err)
		}
		dm := 0.0
		for i := range fp {
			dm -= lambda[i] * (fp[i] - f0[i])
		}
		out = append(out, ParameterSensitivity{Index: k, Name: ph.mech.Species[k].Name, Value: dm / m})
	}
	return out, nil
}
