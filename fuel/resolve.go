package fuel

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"flame1d/chem"
	"flame1d/thermo"
)

// Kind says how a fuel is represented on the mechanism.
type Kind int

const (
	// Neat is a neat fuel or a surrogate: mole fractions of mechanism
	// species.
	Neat Kind = iota
	// CrackedPool is a real fuel represented by its cracked pool.
	CrackedPool
)

func (k Kind) String() string {
	if k == CrackedPool {
		return "cracked pool"
	}
	return "neat/surrogate"
}

// Pool is a cracked-pool fuel resolved on a mechanism: the fuel's mean
// formula and thermochemistry and the pool it cracks into.
type Pool struct {
	Fuel      string  // fuel name
	Formula   Formula // mean formula
	MolarMass float64 // kg/mol
	// Species and Moles give the pool: mechanism species names and moles
	// per mole of fuel. Their atoms equal the formula's to round-off.
	Species []string
	Moles   []float64
	// FormationEnthalpy is Δh_f°(298.15 K) of the fuel vapour, J/mol.
	FormationEnthalpy float64
	// Pseudo is the fuel as one species: the formula, NASA-7 thermo
	// reproducing FormationEnthalpy, transport parameters.
	Pseudo *chem.Species
}

// Resolved is a fuel definition resolved on a mechanism, ready to build a
// flame inlet.
type Resolved struct {
	Name string
	Kind Kind
	// Mode is ModeFiniteRate or ModePreCracked for a cracked pool; empty
	// for a neat fuel.
	Mode string
	// Composition holds the neat fuel's mole fractions by species name.
	Composition map[string]float64
	Pool        *Pool
	// Rate is the global cracking step (finite-rate mode).
	Rate   chem.Arrhenius
	Report *PoolReport // nil for a neat fuel
	// Mechanism and Set are what the flame burns: the mechanism with the
	// pseudo-species and its global step in finite-rate mode, the given one
	// otherwise.
	Mechanism *chem.Mechanism
	Set       *thermo.SpeciesSet
}

// PoolReport describes a cracked-pool fuel: what it is, what it cracks
// into, and every number derived on the way. JSON names carry units.
type PoolReport struct {
	Fuel        string `json:"fuel"`
	Description string `json:"description,omitempty"`
	Mode        string `json:"mode"`
	Method      string `json:"cracking_method"`
	Mechanism   string `json:"mechanism"`

	Formula   string  `json:"formula"`
	HToC      float64 `json:"h_to_c"`
	OToC      float64 `json:"o_to_c"`
	MolarMass float64 `json:"molar_mass_kg_mol"`
	// Heating values of the fuel vapour at 298.15 K.
	LHV float64 `json:"lower_heating_value_J_kg"`
	HHV float64 `json:"higher_heating_value_J_kg"`
	// Liquid-basis values, when a vaporization enthalpy was given.
	LiquidLHV            float64 `json:"liquid_lower_heating_value_J_kg,omitempty"`
	LiquidHHV            float64 `json:"liquid_higher_heating_value_J_kg,omitempty"`
	VaporizationEnthalpy float64 `json:"vaporization_enthalpy_J_kg,omitempty"`
	// Enthalpy of formation of the vapour at 298.15 K.
	FormationEnthalpyMole float64 `json:"formation_enthalpy_J_mol"`
	FormationEnthalpyMass float64 `json:"formation_enthalpy_J_kg"`

	Pool []PoolEntry `json:"pool"`
	// CrackingEnthalpy is h(pool) - h(fuel) at 298.15 K per kg of fuel;
	// positive means cracking is endothermic.
	CrackingEnthalpy float64          `json:"cracking_enthalpy_J_kg"`
	Residuals        ElementResiduals `json:"closure_residuals"`
	Adjustments      []Adjustment     `json:"adjustments"`

	Pseudo *PseudoReport `json:"pseudo_species"`
	Notes  []string      `json:"notes,omitempty"`
}

// PoolEntry is one pool species.
type PoolEntry struct {
	Species     string  `json:"species"`
	Moles       float64 `json:"mol_per_mol_fuel"`
	Mass        float64 `json:"kg_per_kg_fuel"`
	CarbonShare float64 `json:"carbon_share"`
}

// ElementResiduals are (pool atoms - fuel atoms) per mole of fuel,
// relative to the fuel's atoms of that element (to its total atoms for an
// element it lacks).
type ElementResiduals struct {
	C float64 `json:"C"`
	H float64 `json:"H"`
	O float64 `json:"O"`
}

// PseudoReport describes the fuel pseudo-species.
type PseudoReport struct {
	Name             string  `json:"name"`
	Cp298            float64 `json:"cp_298K_J_mol_K"`
	Cp1000           float64 `json:"cp_1000K_J_mol_K"`
	S298             float64 `json:"s_298K_J_mol_K"`
	EntropyEstimated bool    `json:"entropy_estimated"`
	CpFitDeviation   float64 `json:"cp_fit_max_relative_deviation"`
	TLow             float64 `json:"t_low_K"`
	THigh            float64 `json:"t_high_K"`
	WellDepth        float64 `json:"lj_well_depth_K"`
	Diameter         float64 `json:"lj_diameter_m"`
	TransportSource  string  `json:"transport_source"`
	// Global step (finite-rate mode).
	Equation            string  `json:"global_step,omitempty"`
	PreExponential      float64 `json:"pre_exponential_1_s,omitempty"`
	TemperatureExponent float64 `json:"temperature_exponent,omitempty"`
	ActivationEnergy    float64 `json:"activation_energy_J_mol,omitempty"`
	CrackingTime1300K   float64 `json:"cracking_time_1300K_s,omitempty"`
}

// DefaultPseudoName is the pseudo-species name when species_name is not
// given.
const DefaultPseudoName = "FUEL"

// maxPoolCarbon is the largest carbon number of the default equilibrium
// candidates (C0-C4).
const maxPoolCarbon = 4

// poolTraceShare is the share of the fuel's atoms below which an
// equilibrium pool species is dropped from the pool (it could not matter
// to a flame; dropping all of them changes the closure by less than
// 1e-12).
const poolTraceShare = 1e-14

// Resolve resolves the fuel on mechanism m, whose species set is set (as
// built by SpeciesSet(m), same species order).
func (s Spec) Resolve(m *chem.Mechanism, set *thermo.SpeciesSet) (*Resolved, error) {
	label := "fuel " + s.Name
	if s.Name == "" {
		label = "fuel"
	}
	if m == nil || set == nil || set.Len() != len(m.Species) {
		return nil, fmt.Errorf("%s: the species set does not belong to the mechanism", label)
	}
	r, err := s.resolve(m, set)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", label, err)
	}
	return r, nil
}

func (s Spec) resolve(m *chem.Mechanism, set *thermo.SpeciesSet) (*Resolved, error) {
	if len(s.Composition) > 0 {
		if s.IsPool() || s.Mode != "" || s.Cracking.Method != "" || len(s.Cracking.Yields) > 0 || s.Cracking.Temperature != 0 {
			return nil, fmt.Errorf("give either composition (neat fuel or surrogate) or a cracked-pool definition (formula, heating value, cracking), not both")
		}
		if _, err := Composition(m, "composition", s.Composition); err != nil {
			return nil, err
		}
		for n, x := range s.Composition {
			if !(x >= 0) || math.IsInf(x, 0) {
				return nil, fmt.Errorf("composition: %s = %g must be a non-negative mole fraction", n, x)
			}
		}
		return &Resolved{Name: s.Name, Kind: Neat, Composition: s.Composition, Mechanism: m, Set: set}, nil
	}
	if !s.IsPool() {
		return nil, fmt.Errorf("no definition: give composition = { SPECIES = mole fraction, ... } for a neat fuel, or formula, a heating value and [cracking] for a real fuel (docs/fuels.md)")
	}
	rep := &PoolReport{Fuel: s.Name, Description: s.Description, Mechanism: m.Name}
	f, err := s.MeanFormula()
	if err != nil {
		return nil, err
	}
	W := f.MolarMass()
	rep.Formula, rep.HToC, rep.OToC, rep.MolarMass = f.String(), f.HToC(), f.O/f.C, W

	mode := s.Mode
	if mode == "" {
		mode = ModeFiniteRate
	}
	if mode != ModeFiniteRate && mode != ModePreCracked {
		return nil, fmt.Errorf("mode %q: use %q (pseudo-species plus global cracking step) or %q (the inlet is the pool itself)", s.Mode, ModeFiniteRate, ModePreCracked)
	}
	rep.Mode = mode
	if mode == ModePreCracked && s.GlobalStep.Given() {
		return nil, fmt.Errorf("global_step applies only to mode = %q; remove it or change the mode", ModeFiniteRate)
	}

	pa, err := s.crack(set, f, rep)
	if err != nil {
		return nil, err
	}
	pool := &Pool{Fuel: s.Name, Formula: f, MolarMass: W}
	for i, k := range pa.index {
		pool.Species = append(pool.Species, set.Species[k].Name)
		pool.Moles = append(pool.Moles, pa.moles[i])
	}
	rep.Residuals = closureResiduals(set, f, pa)

	if err := s.thermochemistry(set, f, pa, pool, rep); err != nil {
		return nil, err
	}
	res := &Resolved{Name: s.Name, Kind: CrackedPool, Mode: mode, Pool: pool, Report: rep, Mechanism: m, Set: set}
	if mode == ModeFiniteRate {
		rate, err := s.GlobalStep.Rate()
		if err != nil {
			return nil, err
		}
		aug, err := AugmentMechanism(m, pool, rate)
		if err != nil {
			return nil, err
		}
		augSet, err := SpeciesSet(aug)
		if err != nil {
			return nil, err
		}
		res.Rate, res.Mechanism, res.Set = rate, aug, augSet
		pr := rep.Pseudo
		pr.Equation = aug.Reactions[len(aug.Reactions)-1].Equation
		pr.PreExponential, pr.TemperatureExponent, pr.ActivationEnergy = rate.A, rate.B, rate.E
		pr.CrackingTime1300K = CrackingTime(rate, 1300)
	}
	return res, nil
}

// MeanFormula returns the fuel's mean formula, from Formula or from HToC
// and OToC with MolarMass.
func (s Spec) MeanFormula() (Formula, error) {
	W := s.MolarMass
	if W != 0 && !(W > 0 && W < 10) {
		return Formula{}, fmt.Errorf("molar_mass must be positive (got %g kg/mol)", W)
	}
	if s.Formula != "" {
		if s.HToC != 0 || s.OToC != 0 {
			return Formula{}, fmt.Errorf("give formula or h_to_c (with o_to_c and molar_mass), not both")
		}
		f, err := ParseFormula(s.Formula)
		if err != nil {
			return Formula{}, err
		}
		if W > 0 && math.Abs(f.MolarMass()-W) > 5e-3*W {
			return Formula{}, fmt.Errorf("molar_mass %.5g g/mol disagrees with formula %s (%.5g g/mol) by more than 0.5%%; give one of them",
				W*1e3, f, f.MolarMass()*1e3)
		}
		return f, nil
	}
	if s.HToC == 0 {
		return Formula{}, fmt.Errorf("the mean formula is missing: give formula = \"C11.2H21.9\", or h_to_c with molar_mass")
	}
	if W == 0 {
		return Formula{}, fmt.Errorf("h_to_c needs molar_mass (e.g. molar_mass = \"158 g/mol\") to fix the formula")
	}
	f, err := FormulaFromRatios(s.HToC, s.OToC, W)
	if err != nil {
		return Formula{}, fmt.Errorf("h_to_c/o_to_c/molar_mass: %w", err)
	}
	return f, nil
}

// crack builds the pool over set by the spec's method.
func (s Spec) crack(set *thermo.SpeciesSet, f Formula, rep *PoolReport) (*poolAmounts, error) {
	c := s.Cracking
	method := c.Method
	if method == "" {
		method = MethodEquilibrium
		if len(c.Yields) > 0 {
			method = MethodYields
		}
	}
	switch method {
	case MethodYields:
		if c.Temperature != 0 || c.Pressure != 0 || len(c.Candidates) > 0 || len(c.Exclude) > 0 {
			return nil, fmt.Errorf("cracking: temperature, pressure, candidates and exclude belong to method = %q", MethodEquilibrium)
		}
		scale := true
		if c.ScaleToCarbon != nil {
			scale = *c.ScaleToCarbon
		}
		pa, adj, err := CloseYields(set, f, c.Yields, c.Balance, scale)
		if err != nil {
			return nil, err
		}
		rep.Method = "measured yields"
		rep.Adjustments = adj
		if len(adj) == 0 {
			rep.Notes = append(rep.Notes, "the measured yields close the element balances as given; no adjustment made")
		}
		return pa, nil
	case MethodEquilibrium:
		if len(c.Yields) > 0 || len(c.Balance) > 0 || c.ScaleToCarbon != nil {
			return nil, fmt.Errorf("cracking: yields, balance and scale_to_carbon belong to method = %q", MethodYields)
		}
		return s.equilibriumPool(set, f, rep)
	}
	return nil, fmt.Errorf("cracking.method %q: use %q (measured yields, closed on C/H/O) or %q (constrained equilibrium)", c.Method, MethodYields, MethodEquilibrium)
}

// DefaultCandidates returns the species of set that may form an
// equilibrium pool by default: gas species with only C, H (and O, when the
// fuel holds it) carrying carbon or hydrogen, at most four carbon atoms,
// closed-shell by ClosedShell.
func DefaultCandidates(set *thermo.SpeciesSet, f Formula) []int {
	var out []int
	for k := range set.Species {
		sp := &set.Species[k]
		c, h, o, other := speciesAtoms(sp.Composition)
		if sp.Condensed || other || (o > 0 && f.O == 0) || c+h == 0 || c > maxPoolCarbon {
			continue
		}
		if ClosedShell(sp.Composition) {
			out = append(out, k)
		}
	}
	return out
}

func (s Spec) equilibriumPool(set *thermo.SpeciesSet, f Formula, rep *PoolReport) (*poolAmounts, error) {
	c := s.Cracking
	if c.Temperature == 0 || c.Pressure == 0 {
		return nil, fmt.Errorf("cracking: method = %q needs temperature and pressure (the pool depends on both), e.g. temperature = \"1300 K\", pressure = \"10 bar\"", MethodEquilibrium)
	}
	T, P := c.Temperature, c.Pressure
	if !(T >= 500 && T <= 3000) {
		return nil, fmt.Errorf("cracking.temperature %g K is outside 500-3000 K", T)
	}
	if !(P >= 100 && P <= 1e8) {
		return nil, fmt.Errorf("cracking.pressure %g Pa is outside 100 Pa - 100 MPa", P)
	}
	var cand []int
	if len(c.Candidates) > 0 {
		for _, n := range c.Candidates {
			k := set.Index(strings.TrimSpace(n))
			if k < 0 {
				return nil, fmt.Errorf("cracking.candidates: species %q is not in the mechanism%s", n, setSuggestion(set, n))
			}
			if set.Species[k].Condensed {
				return nil, fmt.Errorf("cracking.candidates: %s is condensed; a flame pool is gas", set.Species[k].Name)
			}
			cand = append(cand, k)
		}
	} else {
		cand = DefaultCandidates(set, f)
	}
	walled := map[int]bool{}
	for _, n := range c.Exclude {
		k := set.Index(strings.TrimSpace(n))
		if k < 0 {
			return nil, fmt.Errorf("cracking.exclude: species %q is not in the mechanism%s", n, setSuggestion(set, n))
		}
		walled[k] = true
	}
	var keep []int
	var names []string
	for _, k := range cand {
		if !walled[k] {
			keep = append(keep, k)
			names = append(names, set.Species[k].Name)
		}
	}
	if len(keep) == 0 {
		return nil, fmt.Errorf("cracking: no candidate species left after the walls")
	}
	species := make([]thermo.Species, len(keep))
	for i, k := range keep {
		species[i] = set.Species[k]
		if th := &species[i].Thermo; !th.InRange(T) {
			rep.Notes = append(rep.Notes, fmt.Sprintf("%s: cracking temperature %g K is outside its thermo range %g-%g K (extrapolated)", species[i].Name, T, th.TLow, th.THigh))
		}
	}
	sub, err := thermo.NewSpeciesSet(species)
	if err != nil {
		return nil, err
	}
	cr, err := CrackingEquilibrium(sub, f, T, P, nil)
	if err != nil {
		return nil, err
	}
	rep.Method = fmt.Sprintf("constrained equilibrium at %g K, %.6g bar over %d candidates (%s)", T, P/1e5, len(keep), strings.Join(names, " "))
	if len(c.Exclude) > 0 {
		rep.Method += "; walled off: " + strings.Join(c.Exclude, " ")
	}
	if len(cr.Forced) > 0 {
		rep.Notes = append(rep.Notes, "held at zero (no combination of allowed species holding the fuel's atoms contains them): "+strings.Join(cr.Forced, " "))
	}
	total := f.C + f.H + f.O
	pa := &poolAmounts{}
	var dropped []string
	for i, k := range keep {
		n := cr.Equilibrium.Moles[i]
		if n <= 0 {
			continue
		}
		c, h, o, _ := speciesAtoms(set.Species[k].Composition)
		if n*(c+h+o) < poolTraceShare*total {
			dropped = append(dropped, set.Species[k].Name)
			continue
		}
		pa.index = append(pa.index, k)
		pa.moles = append(pa.moles, n)
	}
	if len(dropped) > 0 {
		rep.Notes = append(rep.Notes, fmt.Sprintf("trace species below %g of the fuel's atoms left out of the pool: %s", poolTraceShare, strings.Join(dropped, " ")))
	}
	return pa, nil
}

// closureResiduals compares the pool's atoms with the fuel's.
func closureResiduals(set *thermo.SpeciesSet, f Formula, pa *poolAmounts) ElementResiduals {
	var c, h, o float64
	for i, k := range pa.index {
		ck, hk, ok, _ := speciesAtoms(set.Species[k].Composition)
		c += ck * pa.moles[i]
		h += hk * pa.moles[i]
		o += ok * pa.moles[i]
	}
	rel := func(got, want float64) float64 {
		d := want
		if d == 0 {
			d = f.C + f.H + f.O
		}
		return (got - want) / d
	}
	return ElementResiduals{C: rel(c, f.C), H: rel(h, f.H), O: rel(o, f.O)}
}

// thermochemistry fixes the fuel's enthalpy of formation from its heating
// value, builds the pseudo-species and fills the report's numbers.
func (s Spec) thermochemistry(set *thermo.SpeciesSet, f Formula, pa *poolAmounts, pool *Pool, rep *PoolReport) error {
	W := f.MolarMass()
	if (s.LowerHeatingValue != 0) == (s.HigherHeatingValue != 0) {
		return fmt.Errorf("give exactly one of lower_heating_value and higher_heating_value (e.g. lower_heating_value = \"43.2 MJ/kg\")")
	}
	key, hv := "lower_heating_value", s.LowerHeatingValue
	if s.HigherHeatingValue != 0 {
		key, hv = "higher_heating_value", s.HigherHeatingValue
	}
	if !(hv > 1e6 && hv < 2e8) {
		return fmt.Errorf("%s %g J/kg is outside 1-200 MJ/kg; check the unit", key, hv)
	}
	lhv := hv
	if key == "higher_heating_value" {
		lhv = hv - HHVMinusLHV(f)
	}
	var hvap float64
	if s.VaporizationEnthalpy != 0 {
		if hvap = s.VaporizationEnthalpy; !(hvap >= 0 && hvap < 2e6) {
			return fmt.Errorf("vaporization_enthalpy %g J/kg is outside 0-2 MJ/kg", hvap)
		}
		rep.LiquidLHV, rep.LiquidHHV, rep.VaporizationEnthalpy = lhv, lhv+HHVMinusLHV(f), hvap
		rep.Notes = append(rep.Notes, "the heating value is that of the liquid; the vapour that enters the flame carries the vaporization enthalpy on top")
	}
	lhvVap := lhv + hvap
	hf, err := FormationEnthalpyFromLHV(set, f, lhvVap)
	if err != nil {
		return err
	}
	pool.FormationEnthalpy = hf
	rep.LHV, rep.HHV = lhvVap, lhvVap+HHVMinusLHV(f)
	rep.FormationEnthalpyMole, rep.FormationEnthalpyMass = hf, hf/W

	hPool, mass := 0.0, 0.0
	var cTot float64
	for i, k := range pa.index {
		hPool += pa.moles[i] * set.Species[k].FormationEnthalpy()
		mass += pa.moles[i] * set.MolarMass[k]
		cTot += pa.moles[i] * atomCount(set.Species[k].Composition, "C")
	}
	rep.CrackingEnthalpy = (hPool - hf) / W
	for i, k := range pa.index {
		rep.Pool = append(rep.Pool, PoolEntry{
			Species: set.Species[k].Name, Moles: pa.moles[i], Mass: pa.moles[i] * set.MolarMass[k] / W,
			CarbonShare: pa.moles[i] * atomCount(set.Species[k].Composition, "C") / cTot,
		})
	}
	sort.SliceStable(rep.Pool, func(a, b int) bool { return rep.Pool[a].Mass > rep.Pool[b].Mass })

	s298, estimated := EstimateStandardEntropy(f), true
	if s.StandardEntropy != 0 {
		if s298 = s.StandardEntropy; !(s298 > 0) || math.IsInf(s298, 0) {
			return fmt.Errorf("standard_entropy must be positive (got %g J/(mol K))", s298)
		}
		estimated = false
	}
	poly, dev, err := PseudoThermo(set, pa, hf, s298)
	if err != nil {
		return err
	}
	if dev > 0.01 {
		rep.Notes = append(rep.Notes, fmt.Sprintf("the pseudo-species cp polynomials deviate from the pool's cp by up to %.2g%%", 100*dev))
	}
	tp, src, err := s.transport(W)
	if err != nil {
		return err
	}
	name := s.SpeciesName
	if name == "" {
		name = DefaultPseudoName
	}
	if strings.ContainsAny(name, " \t+=<>") {
		return fmt.Errorf("species_name %q: a species name may not contain blanks or + = < >", name)
	}
	pseudo := &chem.Species{
		Species:   thermo.Species{Name: name, Composition: f.Composition(), Thermo: poly},
		Transport: &tp,
		Origin:    chem.Position{File: "fuel " + s.Name},
	}
	pool.Pseudo = pseudo
	rep.Pseudo = &PseudoReport{
		Name: name, Cp298: pseudo.CpMole(thermo.ReferenceTemperature), Cp1000: pseudo.CpMole(1000),
		S298: pseudo.EntropyMole(thermo.ReferenceTemperature), EntropyEstimated: estimated, CpFitDeviation: dev,
		TLow: poly.TLow, THigh: poly.THigh, WellDepth: tp.WellDepth, Diameter: tp.Diameter, TransportSource: src,
	}
	return nil
}

func (s Spec) transport(W float64) (chem.TransportParams, string, error) {
	if s.Transport == nil {
		tp, err := EstimateTransport(W)
		return tp, "estimated from molar mass (n-alkane critical constants, Tee, Gotoh & Stewart 1966)", err
	}
	t := s.Transport
	if !(t.WellDepth > 0) || t.Diameter == 0 {
		return chem.TransportParams{}, "", fmt.Errorf("kinetic_theory: give both lj_well_depth_K and lj_diameter (e.g. \"7.1 Å\")")
	}
	d := t.Diameter
	if !(d > 1e-10 && d < 3e-9) {
		return chem.TransportParams{}, "", fmt.Errorf("kinetic_theory.lj_diameter %g m is outside 1-30 Å", d)
	}
	return chem.TransportParams{Geometry: chem.Nonlinear, WellDepth: t.WellDepth, Diameter: d, RotRelaxation: 1}, "given in the fuel definition", nil
}
