package fuel

import (
	"fmt"

	"flame1d/chem"
	"flame1d/thermo"
)

// Representation says how one fuel is represented on a mechanism and what
// its premixed inlet is at given conditions. JSON names carry units.
type Representation struct {
	Fuel        string             `json:"fuel"`
	Mechanism   string             `json:"mechanism,omitempty"` // as the file or flag names it
	Kind        string             `json:"kind"`
	Composition map[string]float64 `json:"composition,omitempty"` // a neat fuel's mole fractions
	Report      *PoolReport        `json:"report,omitempty"`      // a cracked pool's
	Inlet       *InletSummary      `json:"inlet"`
}

// InletSummary is the premixed inlet of a fuel at the conditions asked for.
type InletSummary struct {
	EquivalenceRatio    float64            `json:"equivalence_ratio"`
	UnburnedTemperature float64            `json:"unburned_temperature_K"`
	InletTemperature    float64            `json:"inlet_temperature_K"`
	TemperatureShift    float64            `json:"temperature_shift_K"`
	MoleFractions       map[string]float64 `json:"mole_fractions,omitempty"`
	MassFractions       map[string]float64 `json:"mass_fractions,omitempty"`
	// Error says why no inlet exists at these conditions.
	Error string `json:"error,omitempty"`
}

// Represent resolves each fuel on mechanism m and forms its inlet with the
// oxidizer (mole fractions by species name) at equivalence ratio phi and
// unburned temperature Tu (K). A fuel that does not resolve is an error;
// an inlet that cannot be built (a pre-cracked pool too cold at this
// unburned temperature) is reported in its InletSummary.Error, since the
// representation itself is still worth seeing.
func Represent(m *chem.Mechanism, specs []Spec, oxidizer map[string]float64, phi, Tu float64) ([]Representation, error) {
	set, err := SpeciesSet(m)
	if err != nil {
		return nil, err
	}
	var out []Representation
	for _, s := range specs {
		r, err := s.Resolve(m, set)
		if err != nil {
			return nil, err
		}
		rep := Representation{Fuel: s.Name, Kind: r.Kind.String(), Composition: r.Composition, Report: r.Report,
			Inlet: &InletSummary{EquivalenceRatio: phi, UnburnedTemperature: Tu}}
		if in, err := r.Inlet(oxidizer, phi, Tu); err != nil {
			rep.Inlet.Error = err.Error()
		} else {
			rep.Inlet.InletTemperature, rep.Inlet.TemperatureShift = in.T, in.TemperatureShift
			rep.Inlet.MoleFractions, rep.Inlet.MassFractions = byName(r.Set, in.X), byName(r.Set, in.Y)
		}
		out = append(out, rep)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("no fuels to represent")
	}
	return out, nil
}

// byName maps the non-zero entries of v onto species names.
func byName(set *thermo.SpeciesSet, v []float64) map[string]float64 {
	out := map[string]float64{}
	for k, x := range v {
		if x != 0 {
			out[set.Species[k].Name] = x
		}
	}
	return out
}
