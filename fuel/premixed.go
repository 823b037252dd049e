// Package fuel turns fuel definitions into what a flame burns on a
// mechanism: neat fuels and surrogates given as mole fractions of mechanism
// species, and real multicomponent fuels represented by the pool of light
// species they crack into (mean formula, heating value, measured yields or
// constrained equilibrium; a pseudo-species with a global cracking step, or
// the pool itself as a pre-cracked inlet); the premixed fuel/oxidizer
// charge at an equivalence ratio and its chemical equilibrium; and
// thermodynamic cracking studies over sequences of walled-off species. It
// takes SI values: package casefile reads fuel definitions and study files
// (documented key by key in docs/fuels.md) into Spec and StudyStep.
package fuel

import (
	"fmt"
	"sort"
	"strings"

	"flame1d/chem"
	"flame1d/thermo"
)

// SpeciesSet builds the thermodynamic species set of a mechanism.
func SpeciesSet(m *chem.Mechanism) (*thermo.SpeciesSet, error) {
	sp := make([]thermo.Species, len(m.Species))
	for i := range m.Species {
		sp[i] = m.Species[i].Species
	}
	return thermo.NewSpeciesSet(sp)
}

// Composition maps species names to amounts (mole fractions or moles) onto
// the mechanism's species order. Unknown names are errors that suggest the
// closest spelling in the mechanism.
func Composition(m *chem.Mechanism, what string, amounts map[string]float64) ([]float64, error) {
	v := make([]float64, len(m.Species))
	names := make([]string, 0, len(amounts))
	for n := range amounts {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		k := m.SpeciesIndexFold(n)
		if k < 0 {
			return nil, fmt.Errorf("%s: species %q is not in mechanism %s%s", what, n, m.Name, suggestion(m, n))
		}
		v[k] += amounts[n]
	}
	return v, nil
}

// suggestion names the mechanism species closest to name (edit distance).
func suggestion(m *chem.Mechanism, name string) string {
	return nearestName(name, len(m.Species), func(i int) string { return m.Species[i].Name })
}

// nearestName suggests the closest of n names (edit distance at most 2),
// or points to the species listing.
func nearestName(name string, n int, nameAt func(int) string) string {
	best, bestD := "", 1<<30
	for i := 0; i < n; i++ {
		d := editDistance(strings.ToUpper(name), strings.ToUpper(nameAt(i)))
		if d < bestD {
			best, bestD = nameAt(i), d
		}
	}
	if best != "" && bestD <= 2 {
		return fmt.Sprintf(" (did you mean %s?)", best)
	}
	return " (run `flame1d mech check` on the mechanism to list its species)"
}

func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			c := 1
			if a[i-1] == b[j-1] {
				c = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+c)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}

// Charge is an unburned premixed mixture on a mechanism's species.
type Charge struct {
	X []float64 // mole fractions
	Y []float64 // mass fractions
}

// Premixed mixes fuel and oxidizer (mole fractions by species name) at
// equivalence ratio phi (O2-equivalent basis, see
// thermo.SpeciesSet.PremixedMoleFractions).
func Premixed(m *chem.Mechanism, set *thermo.SpeciesSet, fuelX, oxidizerX map[string]float64, phi float64) (Charge, error) {
	f, err := Composition(m, "fuel", fuelX)
	if err != nil {
		return Charge{}, err
	}
	o, err := Composition(m, "oxidizer", oxidizerX)
	if err != nil {
		return Charge{}, err
	}
	X, err := set.PremixedMoleFractions(f, o, phi)
	if err != nil {
		return Charge{}, err
	}
	Y := make([]float64, len(X))
	set.MoleToMass(X, Y)
	return Charge{X: X, Y: Y}, nil
}
