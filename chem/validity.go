package chem

import (
	"fmt"
	"strconv"
	"strings"

	"flame1d/thermo"
)

// FlameConditions are what a validity range is checked against: the fuel
// species of a flame (a neat fuel, a surrogate's components or a cracked
// pool) and its unburned state. A zero number is not checked.
type FlameConditions struct {
	Species          []string // mechanism species names
	Temperature      float64  // unburned temperature, K
	Pressure         float64  // Pa
	EquivalenceRatio float64
}

// Outside lists, one sentence each, how a flame lies outside the range the
// mechanism was built and validated for: every species not among the
// validated fuels, every condition outside a stated range. It is empty when
// the flame lies inside, and for a nil Validity (nothing stated, nothing to
// compare with). A Validity without fuels checks no species.
func (v *Validity) Outside(c FlameConditions) []string {
	if v == nil {
		return nil
	}
	var out []string
	if len(v.Fuels) > 0 {
		for _, s := range c.Species {
			if !v.hasFuel(s) {
				out = append(out, fmt.Sprintf("%s is not among the fuels it was validated for (%s)", s, strings.Join(v.Fuels, ", ")))
			}
		}
	}
	check := func(what string, x float64, r [2]float64, show func(float64) string) {
		if x == 0 {
			return
		}
		if r[0] > 0 && x < r[0] || r[1] > 0 && x > r[1] {
			out = append(out, fmt.Sprintf("%s %s is outside its validated range %s", what, show(x), showRange(r, show)))
		}
	}
	check("unburned temperature", c.Temperature, v.Temperature, kelvin)
	check("pressure", c.Pressure, v.Pressure, atmospheres)
	check("equivalence ratio", c.EquivalenceRatio, v.EquivalenceRatio, plain)
	return out
}

func (v *Validity) hasFuel(name string) bool {
	for _, f := range v.Fuels {
		if f == name {
			return true
		}
	}
	return false
}

// Summary says in one line what the mechanism was validated for:
// "fuels CH4, C2H6; pressure 0.0132-10 atm; equivalence ratio 0.1-5".
// Ranges not stated are left out; "not stated" when nothing is.
func (v *Validity) Summary() string {
	if v == nil {
		return "not stated"
	}
	var parts []string
	if len(v.Fuels) > 0 {
		parts = append(parts, "fuels "+strings.Join(v.Fuels, ", "))
	}
	for _, r := range []struct {
		what string
		r    [2]float64
		show func(float64) string
	}{
		{"unburned temperature", v.Temperature, kelvin},
		{"pressure", v.Pressure, atmospheres},
		{"equivalence ratio", v.EquivalenceRatio, plain},
	} {
		if r.r != [2]float64{} {
			parts = append(parts, r.what+" "+showRange(r.r, r.show))
		}
	}
	if len(parts) == 0 {
		return "not stated"
	}
	return strings.Join(parts, "; ")
}

// showRange writes [low, high] with a zero bound as open: "0.1-5",
// "from 300 K", "up to 10 atm".
func showRange(r [2]float64, show func(float64) string) string {
	switch {
	case r[0] > 0 && r[1] > 0:
		lo, hi := show(r[0]), show(r[1])
		// "300-700 K", the unit once.
		if i := strings.IndexByte(lo, ' '); i >= 0 && strings.HasSuffix(hi, lo[i:]) {
			lo = lo[:i]
		}
		return lo + "-" + hi
	case r[0] > 0:
		return "from " + show(r[0])
	case r[1] > 0:
		return "up to " + show(r[1])
	}
	return "not stated"
}

func plain(x float64) string       { return strconv.FormatFloat(x, 'g', 3, 64) }
func kelvin(x float64) string      { return plain(x) + " K" }
func atmospheres(p float64) string { return plain(p/thermo.OneAtmosphere) + " atm" }
