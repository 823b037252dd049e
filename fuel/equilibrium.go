package fuel

import (
	"fmt"
	"math"

	"flame1d/chem"
	"flame1d/thermo"
)

// Equilibrium constraints of EquilibriumRequest.Mode.
const (
	// Adiabatic holds pressure and enthalpy: the adiabatic flame
	// temperature and burned composition of the charge (the default).
	Adiabatic = "adiabatic"
	// Isothermal holds temperature and pressure.
	Isothermal = "isothermal"
)

// EquilibriumRequest is a premixed charge to bring to chemical equilibrium.
type EquilibriumRequest struct {
	// Fuel and Oxidizer are mole fractions (or amounts) by species name;
	// they are normalised.
	Fuel, Oxidizer   map[string]float64
	EquivalenceRatio float64 // O2-equivalent basis (thermo.SpeciesSet.PremixedMoleFractions)
	// Temperature, K, is the charge's for Adiabatic and the fixed one for
	// Isothermal.
	Temperature float64
	Pressure    float64 // Pa
	Mode        string  // Adiabatic (also when empty) or Isothermal
	// Exclude names species held at zero.
	Exclude []string
}

// EquilibriumReport is the equilibrium of a premixed charge. JSON names
// carry units.
type EquilibriumReport struct {
	Mechanism         string             `json:"mechanism"`
	Fuel              map[string]float64 `json:"fuel_mole_fractions"`
	Oxidizer          map[string]float64 `json:"oxidizer_mole_fractions"`
	EquivalenceRatio  float64            `json:"equivalence_ratio"`
	Mode              string             `json:"mode"`
	InitialT          float64            `json:"initial_temperature_K"`
	Pressure          float64            `json:"pressure_Pa"`
	Temperature       float64            `json:"equilibrium_temperature_K"`
	Excluded          []string           `json:"excluded_species,omitempty"`
	FuelLHV           *float64           `json:"fuel_lower_heating_value_J_kg,omitempty"`
	UnburnedDensity   float64            `json:"unburned_density_kg_m3"`
	BurnedDensity     float64            `json:"equilibrium_gas_density_kg_m3"`
	MeanMolarMass     float64            `json:"equilibrium_mean_molar_mass_kg_mol"`
	Reactants         map[string]float64 `json:"reactant_mole_fractions"`
	MoleFractions     map[string]float64 `json:"mole_fractions"`
	MassFractions     map[string]float64 `json:"mass_fractions"`
	Condensed         map[string]float64 `json:"condensed_mol_per_mol_reactants,omitempty"`
	ElementPotentials map[string]float64 `json:"element_potentials_over_RT"`
	Iterations        int                `json:"iterations"`
	ElementResidual   float64            `json:"element_balance_residual"`
}

// minListedFraction is the smallest gas mole fraction a report carries.
const minListedFraction = 1e-30

// PremixedEquilibrium brings the premixed charge req describes on
// mechanism m to chemical equilibrium by Gibbs energy minimisation over
// every species of the mechanism (thermo.SpeciesSet.AdiabaticFlame or
// EquilibrateTP), and reports the state, the species above 1e-30 and the
// element potentials.
func PremixedEquilibrium(m *chem.Mechanism, req EquilibriumRequest) (*EquilibriumReport, error) {
	T, P := req.Temperature, req.Pressure
	if !(T > 0) || math.IsInf(T, 0) {
		return nil, fmt.Errorf("temperature %g K must be above 0 K", T)
	}
	if !(P > 0) || math.IsInf(P, 0) {
		return nil, fmt.Errorf("pressure %g Pa must be positive", P)
	}
	mode := req.Mode
	if mode == "" {
		mode = Adiabatic
	}
	if mode != Adiabatic && mode != Isothermal {
		return nil, fmt.Errorf("equilibrium mode %q: use %q (constant pressure and enthalpy) or %q (fixed temperature and pressure)", req.Mode, Adiabatic, Isothermal)
	}
	set, err := SpeciesSet(m)
	if err != nil {
		return nil, err
	}
	charge, err := Premixed(m, set, req.Fuel, req.Oxidizer, req.EquivalenceRatio)
	if err != nil {
		return nil, err
	}
	var opt thermo.EquilibriumOptions
	if len(req.Exclude) > 0 {
		if opt.Exclude, err = set.ExcludeMask(req.Exclude); err != nil {
			return nil, err
		}
	}
	var res *thermo.EquilibriumResult
	if mode == Adiabatic {
		res, err = set.AdiabaticFlame(T, P, charge.X, opt)
	} else {
		res, err = set.EquilibrateTP(T, P, charge.X, opt)
	}
	if err != nil {
		return nil, err
	}
	rep := &EquilibriumReport{
		Mechanism: m.Name, Fuel: normalised(req.Fuel), Oxidizer: normalised(req.Oxidizer), EquivalenceRatio: req.EquivalenceRatio,
		Mode: mode, InitialT: T, Pressure: P, Temperature: res.T, Excluded: req.Exclude,
		UnburnedDensity: set.Density(P, T, charge.Y),
		Reactants:       map[string]float64{}, MoleFractions: map[string]float64{}, MassFractions: map[string]float64{},
		ElementPotentials: map[string]float64{},
		Iterations:        res.Iterations, ElementResidual: res.ElementResidual,
	}
	if fv, err := Composition(m, "fuel", req.Fuel); err == nil {
		if lhv, err := set.LowerHeatingValue(fv); err == nil {
			rep.FuelLHV = &lhv
		}
	}
	Y := make([]float64, set.Len())
	set.MoleToMass(res.MoleFractions, Y)
	rep.BurnedDensity = set.Density(P, res.T, Y)
	rep.MeanMolarMass = set.MeanMolarMassX(res.MoleFractions)
	total := 0.0
	for _, n := range charge.X {
		total += n
	}
	for k, sp := range set.Species {
		if charge.X[k] > 0 {
			rep.Reactants[sp.Name] = charge.X[k]
		}
		if sp.Condensed {
			if res.Moles[k] > 0 {
				if rep.Condensed == nil {
					rep.Condensed = map[string]float64{}
				}
				rep.Condensed[sp.Name] = res.Moles[k] / total
			}
			continue
		}
		if res.MoleFractions[k] >= minListedFraction {
			rep.MoleFractions[sp.Name] = res.MoleFractions[k]
			rep.MassFractions[sp.Name] = Y[k]
		}
	}
	for e, el := range set.Elements {
		if v := res.ElementPotentials[e]; !math.IsInf(v, 0) && !math.IsNaN(v) {
			rep.ElementPotentials[el] = v
		}
	}
	for _, v := range []float64{rep.Temperature, rep.UnburnedDensity, rep.BurnedDensity, rep.MeanMolarMass} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("equilibrium at %g K, %g Pa: the state is not finite", T, P)
		}
	}
	return rep, nil
}

// normalised scales amounts to sum to one (a copy; empty when they sum to
// zero).
func normalised(c map[string]float64) map[string]float64 {
	sum := 0.0
	for _, v := range c {
		sum += v
	}
	out := make(map[string]float64, len(c))
	for k, v := range c {
		if sum > 0 {
			out[k] = v / sum
		}
	}
	return out
}

// MoleFractions maps amounts by species name onto the mechanism's species
// order and normalises them to mole fractions; what names the source in
// errors.
func MoleFractions(m *chem.Mechanism, what string, amounts map[string]float64) ([]float64, error) {
	X, err := Composition(m, what, amounts)
	if err != nil {
		return nil, err
	}
	sum := 0.0
	for _, x := range X {
		if !(x >= 0) || math.IsInf(x, 0) {
			return nil, fmt.Errorf("%s: amounts must be non-negative and finite", what)
		}
		sum += x
	}
	if !(sum > 0) {
		return nil, fmt.Errorf("%s: amounts sum to zero", what)
	}
	for k := range X {
		X[k] /= sum
	}
	return X, nil
}
