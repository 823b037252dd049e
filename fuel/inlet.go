package fuel

import (
	"fmt"
	"math"

	"flame1d/chem"
	"flame1d/thermo"
)

// Inlet is the unburned premixed mixture that enters the flame, on the
// species of Resolved.Mechanism.
type Inlet struct {
	X []float64 // mole fractions
	Y []float64 // mass fractions
	// T is the inlet temperature, K: the unburned temperature, or in
	// pre-cracked mode the lower temperature at which the pool-oxidizer
	// mixture has the enthalpy of fuel + oxidizer at the unburned
	// temperature.
	T                   float64
	UnburnedTemperature float64 // K
	// TemperatureShift is T - UnburnedTemperature, K (negative: cracking
	// is endothermic).
	TemperatureShift float64
	// Enthalpy is the mixture's specific enthalpy, J/kg, and
	// EnthalpyResidual the relative mismatch of the inlet state against it.
	Enthalpy         float64
	EnthalpyResidual float64
}

// MinInletTemperature is the lowest inlet temperature a pre-cracked inlet
// may have, K: NASA-7 fits of mechanism sets start at 200-300 K.
const MinInletTemperature = 200.0

// Inlet returns the premixed inlet of the fuel with the oxidizer (mole
// fractions by species name) at equivalence ratio phi and unburned
// temperature Tu (K). The equivalence ratio is on the O2-equivalent basis
// of thermo.SpeciesSet.PremixedMoleFractions; for a cracked pool it is
// taken on the real fuel's formula, which the pool's atoms equal.
func (r *Resolved) Inlet(oxidizer map[string]float64, phi, Tu float64) (*Inlet, error) {
	if !(Tu > 0) || math.IsInf(Tu, 0) {
		return nil, fmt.Errorf("inlet: unburned temperature %g K must be positive", Tu)
	}
	switch {
	case r.Kind == Neat:
		return mixedInlet(r.Mechanism, r.Set, r.Composition, oxidizer, phi, Tu)
	case r.Mode == ModeFiniteRate:
		return mixedInlet(r.Mechanism, r.Set, map[string]float64{r.Pool.Pseudo.Name: 1}, oxidizer, phi, Tu)
	default:
		return PrecrackedInlet(r.Mechanism, r.Set, r.Pool, oxidizer, phi, Tu)
	}
}

func mixedInlet(m *chem.Mechanism, set *thermo.SpeciesSet, fuelX, oxidizer map[string]float64, phi, Tu float64) (*Inlet, error) {
	ch, err := Premixed(m, set, fuelX, oxidizer, phi)
	if err != nil {
		return nil, err
	}
	return &Inlet{X: ch.X, Y: ch.Y, T: Tu, UnburnedTemperature: Tu, Enthalpy: set.EnthalpyMass(Tu, ch.Y)}, nil
}

// PrecrackedInlet returns the inlet of a pre-cracked pool: the pool (per
// mole of fuel) mixed with the oxidizer at equivalence ratio phi, at the
// temperature T that gives the mixture the total enthalpy of the uncracked
// fuel vapour plus oxidizer at Tu:
//
//	sum_i ν_i h_i(T) + n_ox h_ox(T) = h_fuel(Tu) + n_ox h_ox(Tu),
//
// n_ox = (x + y/4 - z/2) / (phi ν_ox) moles of oxidizer per mole of fuel,
// ν_ox its O2 supply per mole. h_fuel is the pseudo-species' enthalpy, so
// the shift T - Tu is minus the cracking enthalpy over the mixture's mean
// cp. m and set are the mechanism the pool lives on. An inlet below
// MinInletTemperature is refused.
func PrecrackedInlet(m *chem.Mechanism, set *thermo.SpeciesSet, pool *Pool, oxidizer map[string]float64, phi, Tu float64) (*Inlet, error) {
	if pool == nil || pool.Pseudo == nil {
		return nil, fmt.Errorf("pre-cracked inlet: no pool")
	}
	if !(phi > 0) || math.IsInf(phi, 0) {
		return nil, fmt.Errorf("pre-cracked inlet: equivalence ratio must be positive and finite, got %g", phi)
	}
	ox, err := Composition(m, "oxidizer", oxidizer)
	if err != nil {
		return nil, err
	}
	sumOx := 0.0
	for _, v := range ox {
		sumOx += v
	}
	if !(sumOx > 0) {
		return nil, fmt.Errorf("pre-cracked inlet: the oxidizer is empty")
	}
	for k := range ox {
		ox[k] /= sumOx
	}
	demand, err := set.StoichiometricOxygen(ox)
	if err != nil {
		return nil, fmt.Errorf("pre-cracked inlet: oxidizer: %w", err)
	}
	if !(-demand > 0) {
		return nil, fmt.Errorf("pre-cracked inlet: the oxidizer supplies no oxygen (net O2 supply %g mol per mol)", -demand)
	}
	nOx := pool.Formula.OxygenDemand() / (phi * -demand)
	n := make([]float64, set.Len())
	for k, x := range ox {
		n[k] = nOx * x
	}
	for i, sp := range pool.Species {
		k := set.Index(sp)
		if k < 0 {
			return nil, fmt.Errorf("pre-cracked inlet: pool species %s is not in the mechanism", sp)
		}
		n[k] += pool.Moles[i]
	}
	total, mass := 0.0, 0.0
	for k, v := range n {
		total += v
		mass += v * set.MolarMass[k]
	}
	// Uncracked reference: fuel vapour + oxidizer at Tu, per mole of fuel.
	H := pool.Pseudo.EnthalpyMole(Tu)
	for k, x := range ox {
		if x != 0 {
			H += nOx * x * set.Species[k].EnthalpyMole(Tu)
		}
	}
	massRef := pool.MolarMass
	for k, x := range ox {
		massRef += nOx * x * set.MolarMass[k]
	}
	if math.Abs(massRef-mass) > 1e-9*mass {
		return nil, fmt.Errorf("pre-cracked inlet: the pool's mass %.9g kg per mol fuel differs from the fuel's %.9g: the pool is not closed on the fuel's atoms", mass, massRef)
	}
	h := H / mass
	X := make([]float64, len(n))
	for k, v := range n {
		X[k] = v / total
	}
	Y := make([]float64, len(n))
	set.MoleToMass(X, Y)
	if hMin := set.EnthalpyMass(MinInletTemperature, Y); h < hMin {
		crack := (set.EnthalpyMass(Tu, Y) - h) * mass / pool.MolarMass
		return nil, fmt.Errorf("pre-cracked inlet: cracking takes %.4g MJ per kg of fuel; to carry the enthalpy of fuel + oxidizer at %.1f K the pool mixture would have to enter below the %g K floor of the thermo fits. Raise the unburned temperature, burn a leaner mixture, or use mode = %q",
			crack/1e6, Tu, MinInletTemperature, ModeFiniteRate)
	}
	T, err := set.TemperatureFromEnthalpy(h, Y, Tu)
	if err != nil {
		return nil, fmt.Errorf("pre-cracked inlet: %w", err)
	}
	scale := math.Max(math.Abs(h), set.CpMass(Tu, Y)*Tu)
	return &Inlet{
		X: X, Y: Y, T: T, UnburnedTemperature: Tu, TemperatureShift: T - Tu,
		Enthalpy: h, EnthalpyResidual: math.Abs(set.EnthalpyMass(T, Y)-h) / scale,
	}, nil
}
