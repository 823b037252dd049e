package study

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/fuel"
)

// ValidityFuels names the species whose chemistry the flame rests on, as
// checked against the mechanism's validity range: the components of a
// neat fuel or surrogate; the pool species of a cracked pool that carry at
// least minValidityCarbonShare of the fuel's carbon (hydrogen and carbon
// monoxide chemistry is the core of every hydrocarbon mechanism, and a
// trace species cannot move the flame).
func (s *Study) ValidityFuels() []string {
	var names []string
	if s.Fuel.Kind == fuel.Neat {
		for n := range s.Fuel.Composition {
			names = append(names, n)
		}
	} else {
		for _, e := range s.Fuel.Report.Pool {
			if e.CarbonShare >= minValidityCarbonShare {
				names = append(names, e.Species)
			}
		}
	}
	sort.Strings(names)
	return names
}

// minValidityCarbonShare is the share of the fuel's carbon below which a
// pool species is not checked against the validity range (common
// practice, no source: a species with 1% of the carbon shifts a flame
// speed by well under the scatter of the measurements).
const minValidityCarbonShare = 0.01

// ValidityWarnings says, one warning each, how flames of this study at the
// conditions lie outside the validity range its mechanism states (fuels,
// unburned temperature, pressure, equivalence ratio: chem.Validity.Outside
// at the extremes of each), naming the built-in mechanisms validated for
// its fuels. None when the mechanism states no range.
func (s *Study) ValidityWarnings(conds ...Condition) []string {
	return validityWarnings(s.MechanismName, s.Mechanism.Validity, s.ValidityFuels(), conds, builtin.Covering)
}

// validityWarnings words the findings for mechanism name and asks
// covering (only when there is a finding) for the built-ins validated for
// the fuel species.
func validityWarnings(name string, v *chem.Validity, species []string, conds []Condition, covering func([]string) ([]string, error)) []string {
	findings := v.Outside(chem.FlameConditions{Species: species})
	lo, hi := Condition{Phi: math.Inf(1), T: math.Inf(1), P: math.Inf(1)}, Condition{}
	for _, c := range conds {
		lo = Condition{Phi: math.Min(lo.Phi, c.Phi), T: math.Min(lo.T, c.T), P: math.Min(lo.P, c.P)}
		hi = Condition{Phi: math.Max(hi.Phi, c.Phi), T: math.Max(hi.T, c.T), P: math.Max(hi.P, c.P)}
	}
	if len(conds) > 0 {
		// Each extreme alone (a zero field is not checked), so that a range
		// of conditions gives at most two findings per quantity.
		for _, fc := range []chem.FlameConditions{{Temperature: lo.T}, {Temperature: hi.T}, {Pressure: lo.P}, {Pressure: hi.P},
			{EquivalenceRatio: lo.Phi}, {EquivalenceRatio: hi.Phi}} {
			for _, f := range v.Outside(fc) {
				if !contains(findings, f) {
					findings = append(findings, f)
				}
			}
		}
	}
	if len(findings) == 0 {
		return nil
	}
	var warns []string
	for _, f := range findings {
		warns = append(warns, fmt.Sprintf("mechanism %s: %s", name, f))
	}
	if v.Outside(chem.FlameConditions{Species: species}) == nil {
		return warns
	}
	better, err := covering(species)
	if err != nil {
		return append(warns, fmt.Sprintf("could not look for a better built-in mechanism: %v", err))
	}
	var others []string
	for _, b := range better {
		if b != name {
			others = append(others, b)
		}
	}
	if len(others) > 0 {
		warns = append(warns, fmt.Sprintf("built-in %s validated for %s: %s", plural(others, "mechanism"), strings.Join(species, ", "), strings.Join(others, ", ")))
	}
	return warns
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

func plural(list []string, word string) string {
	if len(list) == 1 {
		return word
	}
	return word + "s"
}

// ValidityWarnings of a comparison: each fuel's (Study.ValidityWarnings
// over the compared conditions), prefixed with the fuel's name.
func (c *Comparison) ValidityWarnings() []string {
	var out []string
	for _, name := range c.Fuels {
		st := c.Studies[name]
		conds := make([]Condition, len(c.Phis))
		for i, phi := range c.Phis {
			conds[i] = Condition{Phi: phi, T: st.Case.Temperature, P: st.Case.Pressure}
		}
		for _, w := range st.ValidityWarnings(conds...) {
			out = append(out, "fuel "+name+": "+w)
		}
	}
	return out
}
