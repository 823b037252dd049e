package fuel

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"flame1d/chem"
	"flame1d/thermo"
)

// Defaults of the global cracking step FUEL -> pool, k = A exp(-E/(R T)),
// first order in the fuel. E = 250 kJ/mol and a cracking time 1/k of
// 0.1 ms at 1300 K (so A = 1e4/s exp(E/(R 1300 K)) ≈ 1.1e14 /s, a usual
// unimolecular pre-exponential factor) put the cracking of a kerosene-
// like fuel where the brief's physical picture has it: a few ms at
// 1100 K, 0.1 ms at 1300 K, 10 µs near 1500 K. Common practice, no
// source: replace them with fitted parameters where they exist.
const (
	DefaultActivationEnergy = 250e3  // J/mol
	DefaultCrackingTime     = 1e-4   // s, 1/k at DefaultCrackingTemperature
	DefaultCrackingTempK    = 1300.0 // K
)

// Rate returns the Arrhenius parameters of the global cracking step from
// the spec and the defaults above. Exactly one of pre_exponential and
// cracking_time may be given; neither means the default cracking time.
func (g GlobalStepSpec) Rate() (chem.Arrhenius, error) {
	r := chem.Arrhenius{B: g.TemperatureExponent, E: DefaultActivationEnergy}
	if math.IsNaN(r.B) || math.Abs(r.B) > 10 {
		return r, fmt.Errorf("global_step.temperature_exponent %g is not a sensible exponent (|b| <= 10)", r.B)
	}
	if g.ActivationEnergy != nil {
		e := *g.ActivationEnergy
		if !(e >= 0) || math.IsInf(e, 0) {
			return r, fmt.Errorf("global_step.activation_energy must be non-negative (got %g J/mol)", e)
		}
		r.E = e
	}
	if g.PreExponential != 0 {
		if g.CrackingTime != 0 || g.AtTemperature != 0 {
			return r, fmt.Errorf("global_step: give either pre_exponential or cracking_time (with at_temperature), not both")
		}
		if !(g.PreExponential > 0) || math.IsInf(g.PreExponential, 0) {
			return r, fmt.Errorf("global_step.pre_exponential must be positive and finite (got %g; unit 1/s)", g.PreExponential)
		}
		r.A = g.PreExponential
		return r, nil
	}
	tau, T := DefaultCrackingTime, DefaultCrackingTempK
	if g.CrackingTime != 0 {
		if tau = g.CrackingTime; !(tau > 0) || math.IsInf(tau, 0) {
			return r, fmt.Errorf("global_step.cracking_time must be positive (got %g s)", tau)
		}
	}
	if g.AtTemperature != 0 {
		if T = g.AtTemperature; !(T >= 300 && T <= 3000) {
			return r, fmt.Errorf("global_step.at_temperature %g K is outside 300-3000 K", T)
		}
	}
	// k(T) = 1/tau = A T^b exp(-E/(R T)).
	lnA := -math.Log(tau) - r.B*math.Log(T) + r.E/(thermo.GasConstant*T)
	if lnA > 700 {
		return r, fmt.Errorf("global_step: a cracking time of %g s at %g K with E = %g J/mol needs A = exp(%.0f), beyond floating point; lower the activation energy", tau, T, r.E, lnA)
	}
	r.A = math.Exp(lnA)
	return r, nil
}

// CrackingTime returns 1/k of the step at temperature T (K), s.
func CrackingTime(r chem.Arrhenius, T float64) float64 {
	return 1 / (r.A * math.Pow(T, r.B) * math.Exp(-r.E/(thermo.GasConstant*T)))
}

// AugmentMechanism returns a copy of m with the pool's pseudo-species
// appended and one irreversible global step
//
//	FUEL => sum_i ν_i P_i,   rate k [FUEL],  k = A T^b exp(-E/(R T)),
//
// appended to the reactions (first order in the fuel by its unit
// coefficient). The copy shares the rate data of m's own reactions; neither
// mechanism is modified afterwards. The result is checked with Validate:
// the step balances exactly by the pool's element closure.
func AugmentMechanism(m *chem.Mechanism, pool *Pool, rate chem.Arrhenius) (*chem.Mechanism, error) {
	if pool == nil || pool.Pseudo == nil {
		return nil, fmt.Errorf("augment mechanism: the pool has no pseudo-species")
	}
	if !(rate.A > 0) || math.IsInf(rate.A, 0) || math.IsNaN(rate.B) || !(rate.E >= 0) {
		return nil, fmt.Errorf("augment mechanism: rate A = %g, b = %g, E = %g J/mol is not a valid irreversible step", rate.A, rate.B, rate.E)
	}
	name := pool.Pseudo.Name
	if m.SpeciesIndexFold(name) >= 0 {
		return nil, fmt.Errorf("augment mechanism: the pseudo-species name %q is already a species of %s; choose another with species_name", name, m.Name)
	}
	out := *m
	out.Elements = append([]string(nil), m.Elements...)
	for _, e := range poolElements {
		if atomCount(pool.Pseudo.Composition, e) == 0 {
			continue
		}
		found := false
		for _, d := range out.Elements {
			found = found || strings.EqualFold(d, e)
		}
		if !found {
			return nil, fmt.Errorf("augment mechanism: %s does not declare element %s, which the fuel holds", m.Name, e)
		}
	}
	out.Species = append(append([]chem.Species(nil), m.Species...), *pool.Pseudo)
	fuelIdx := len(out.Species) - 1
	rxn := chem.Reaction{
		Reactants: []chem.Participant{{Species: fuelIdx, Coefficient: 1}},
		Form:      chem.Elementary,
		Rate:      rate,
		Origin:    chem.Position{File: "fuel " + pool.Fuel + " (global cracking step)"},
	}
	terms := make([]string, 0, len(pool.Species))
	for i, sp := range pool.Species {
		k := m.SpeciesIndex(sp)
		if k < 0 {
			return nil, fmt.Errorf("augment mechanism: pool species %q is not in %s", sp, m.Name)
		}
		if !(pool.Moles[i] > 0) {
			continue
		}
		rxn.Products = append(rxn.Products, chem.Participant{Species: k, Coefficient: pool.Moles[i]})
		terms = append(terms, strconv.FormatFloat(pool.Moles[i], 'g', 6, 64)+" "+sp)
	}
	rxn.Equation = name + " => " + strings.Join(terms, " + ")
	out.Reactions = append(append([]chem.Reaction(nil), m.Reactions...), rxn)
	if out.Description != "" {
		out.Description += "\n"
	}
	out.Description += fmt.Sprintf("Augmented by flame1d with the lumped fuel %s (%s) and its global cracking step.", name, pool.Formula)
	if _, err := out.Validate(); err != nil {
		return nil, fmt.Errorf("augment mechanism: %w", err)
	}
	return &out, nil
}
