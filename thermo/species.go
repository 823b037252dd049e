package thermo

import "fmt"

// Species is one chemical species as thermodynamics sees it: its elemental
// make-up and its standard-state polynomials.
type Species struct {
	Name string
	// Composition maps element symbol (as written in the mechanism, upper
	// case, e.g. "C", "H", "AR") to atoms per molecule; non-integer counts
	// are allowed for lumped pseudo-species.
	Composition map[string]float64
	Thermo      NASA7
	// Condensed marks a pure condensed phase (e.g. graphite). In equilibrium
	// its activity is 1; it never appears in gas-phase mixtures.
	Condensed bool
}

// MolarMass returns the species' molar mass in kg/mol from its composition
// and the standard atomic weights.
func (s *Species) MolarMass() (float64, error) {
	if len(s.Composition) == 0 {
		return 0, fmt.Errorf("species %q: no elemental composition", s.Name)
	}
	// Summed in a fixed (sorted) element order: map order would change the
	// last bits from run to run, and with them every result downstream.
	w := 0.0
	for _, e := range sortedKeys(s.Composition) {
		n := s.Composition[e]
		aw, ok := AtomicWeight(e)
		if !ok {
			return 0, fmt.Errorf("species %q: element %q has no standard atomic weight", s.Name, e)
		}
		w += n * aw
	}
	return w, nil
}
