package mechtoml

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"flame1d/thermo"
)

// avogadro is the Avogadro constant N_A in 1/mol (CODATA 2018, exact by the
// 2019 SI definition).
const avogadro = 6.02214076e23

// Unit sizes used at this edge. The thermochemical calorie is exactly
// 4.184 J (NIST SP 811, 2008, appendix B.8); 1 atm is exactly 101325 Pa and
// 1 Torr is 1/760 atm (same source); the debye is 1e-21/c C m with
// c = 299792458 m/s (the unit's definition, 10^-18 statC cm; 3.33564e-30 C m
// to six digits).
//
// Every conversion is a multiplication by these sizes, done the way the
// keyword-block importer (flame1d/chem/keyblock) does it, so that numbers
// imported from published files are written back exactly as published.
const (
	calorie  = 4.184 // J
	debye    = 1e-21 / 299792458.0
	oneAtmos = thermo.OneAtmosphere
	torr     = oneAtmos / 760
	angstrom = 1e-10 // m
	cm3      = 1e-6  // m^3
)

// energyUnits maps the accepted activation-energy units to their size in
// J/mol. "K" means E/R written as a temperature.
var energyUnits = map[string]float64{
	"J/mol":    1,
	"kJ/mol":   1000,
	"cal/mol":  calorie,
	"kcal/mol": 1000 * calorie,
	"K":        thermo.GasConstant,
}

// pressureUnits maps the accepted pressure units to their size in Pa.
var pressureUnits = map[string]float64{
	"Pa":   1,
	"kPa":  1e3,
	"MPa":  1e6,
	"bar":  1e5,
	"atm":  oneAtmos,
	"Torr": torr,
}

// unitNames returns the keys of a unit table, sorted.
func unitNames(m map[string]float64) []string {
	names := make([]string, 0, len(m))
	for k := range m {
		names = append(names, k)
	}
	sort.Strings(names)
	return names
}

// unitList returns the keys of a unit table, sorted, for error messages.
func unitList(m map[string]float64) string { return strings.Join(unitNames(m), ", ") }

// concentrationUnits are the values of [default_units] concentration: the
// concentration unit C in which a rate constant of overall order n is
// written as C^(1-n)/s.
var concentrationUnits = [...]string{"mol/cm^3", "mol/m^3", "molecule/cm^3", "molecule/m^3"}

// scaleBy converts q to SI by a unit of size f (SI units per unit). The SI
// unit itself (f == 1) converts exactly.
func scaleBy(q, f float64) float64 {
	if f == 1 {
		return q
	}
	return q * f
}

// rateUnit is the unit of a rate constant (or pre-exponential factor) of
// overall order n = k+1: (length^3/quantity)^k / s, with the length in cm
// or m and the quantity in mol or molecules.
type rateUnit struct {
	cm       bool    // length in centimetres (else metres)
	molecule bool    // quantity in molecules (else moles)
	k        float64 // overall order minus one
}

// tableRateUnit is the unit of a rate constant of overall order n under a
// units table.
func tableRateUnit(u units, n float64) rateUnit {
	return rateUnit{cm: u.lengthCM, molecule: u.molecule, k: n - 1}
}

// factor is the size of the unit in m, mol, s: (1e-6 [N_A])^k.
func (u rateUnit) factor() float64 {
	base := 1.0
	if u.cm {
		base = cm3
	}
	if u.molecule {
		base *= avogadro
	}
	if base == 1 {
		return 1
	}
	return math.Pow(base, u.k)
}

// toSI converts q in this unit to m, mol, s.
func (u rateUnit) toSI(q float64) float64 { return scaleBy(q, u.factor()) }

// log10Factor is log10 of the unit's size, the term a unit change adds to
// the first Chebyshev coefficient (which holds log10 k); 0 for SI.
func (u rateUnit) log10Factor() float64 { return math.Log10(u.factor()) }

// String writes the unit the way a chemist reads it, e.g. "cm^3/mol/s".
func (u rateUnit) String() string {
	length, quantity := "m", "mol"
	if u.cm {
		length = "cm"
	}
	if u.molecule {
		quantity = "molecule"
	}
	var num, den []string
	put := func(name string, e float64) {
		switch {
		case e == 1:
			num = append(num, name)
		case e > 0:
			num = append(num, name+"^"+formatFloat(e))
		case e == -1:
			den = append(den, name)
		case e < 0:
			den = append(den, name+"^"+formatFloat(-e))
		}
	}
	put(length, 3*u.k)
	put(quantity, -u.k)
	put("s", -1)
	s := strings.Join(num, "*")
	if s == "" {
		s = "1"
	}
	for _, d := range den {
		s += "/" + d
	}
	return s
}

// writtenRateUnit is a rate unit as written in a file: exponents of
// length, quantity and time.
type writtenRateUnit struct {
	L, Q, T      float64
	cm, molecule bool
}

// parseRateUnit reads a unit such as "cm^3/mol/s", "cm3/(mol s)",
// "m^6/mol^2/s", "cm^3/molecule/s" or "1/s". Lengths are cm or m,
// quantities mol or molecule(s), time s; one length and one quantity unit
// throughout.
func parseRateUnit(s string) (writtenRateUnit, error) {
	var u writtenRateUnit
	var seenLength, seenQuantity bool
	bad := func(format string, a ...any) (writtenRateUnit, error) {
		return writtenRateUnit{}, fmt.Errorf("rate unit %q: %s", s, fmt.Sprintf(format, a...))
	}
	sign := 1.0  // sign of the next factor's exponent
	group := 0.0 // sign inside an open parenthesis, 0 when none
	i := 0
	for i < len(s) {
		c := s[i]
		switch c {
		case ' ', '*', '.':
			i++
			continue
		case '/':
			if group != 0 {
				return bad("'/' inside parentheses")
			}
			sign = -1
			i++
			continue
		case '(':
			if group != 0 {
				return bad("nested parentheses")
			}
			group = sign
			i++
			continue
		case ')':
			if group == 0 {
				return bad("unmatched ')'")
			}
			group, sign = 0, 1
			i++
			continue
		}
		j := i + 1
		if c != '1' {
			for j = i; j < len(s) && (s[j] >= 'a' && s[j] <= 'z' || s[j] >= 'A' && s[j] <= 'Z'); j++ {
			}
		}
		name := s[i:j]
		if name == "" {
			return bad("unexpected %q", s[i:])
		}
		e := 1.0
		k := j
		if k < len(s) && s[k] == '^' {
			k++
		}
		m := k
		for m < len(s) && (s[m] >= '0' && s[m] <= '9' || s[m] == '.' || s[m] == '-' && m == k) {
			m++
		}
		if m > k {
			v, err := strconv.ParseFloat(s[k:m], 64)
			if err != nil {
				return bad("bad exponent %q", s[k:m])
			}
			e = v
		} else if k > j {
			return bad("'^' without an exponent")
		}
		i = m
		if group != 0 {
			e *= group
		} else {
			e *= sign
			sign = 1
		}
		switch name {
		case "1":
			if e != 1 && e != -1 {
				return bad("exponent on 1")
			}
		case "cm", "m":
			if seenLength && u.cm != (name == "cm") {
				return bad("mixes cm and m")
			}
			seenLength, u.cm = true, name == "cm"
			u.L += e
		case "mol", "molecule", "molecules":
			mc := name != "mol"
			if seenQuantity && u.molecule != mc {
				return bad("mixes mol and molecules")
			}
			seenQuantity, u.molecule = true, mc
			u.Q += e
		case "s":
			u.T += e
		default:
			return bad("unknown unit %q (use cm or m, mol or molecule, s)", name)
		}
	}
	if group != 0 {
		return bad("unclosed '('")
	}
	return u, nil
}

// forOrder returns the unit as that of a rate constant of overall order n,
// or false when its dimensions are not (length^3/quantity)^(n-1)/s.
func (w writtenRateUnit) forOrder(n float64) (rateUnit, bool) {
	k := n - 1
	u := rateUnit{cm: w.cm, molecule: w.molecule, k: k}
	return u, w.T == -1 && approxEqual(w.L, 3*k) && approxEqual(w.Q, -k)
}

func approxEqual(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(1, math.Abs(b)) }

// units are the units of a file's rate data, declared in its [default_units]
// table.
type units struct {
	energy   string  // key of energyUnits
	energyJ  float64 // J/mol per energy unit
	pressure string  // key of pressureUnits
	pressPa  float64 // Pa per pressure unit
	lengthCM bool
	molecule bool
}

// siUnits are the units of the SI fallback the writer uses.
var siUnits = units{energy: "J/mol", energyJ: 1, pressure: "Pa", pressPa: 1}

// writeUnits are the units the writer declares: those of most published
// mechanisms, so that the numbers read as in their sources.
var writeUnits = units{energy: "cal/mol", energyJ: calorie, pressure: "atm", pressPa: oneAtmos, lengthCM: true}

// diameterToSI, dipoleToSI and polarizabilityToSI convert the units of
// published transport tables (Å, debye, Å^3) to m, C m, m^3.
func diameterToSI(q float64) float64       { return q * angstrom }
func dipoleToSI(q float64) float64         { return q * debye }
func polarizabilityToSI(q float64) float64 { return q * angstrom * angstrom * angstrom }

// transportQuantity is a kinetic-theory parameter that a file gives under
// one of two keys: in the unit of published transport tables (tableKey)
// or in SI (siKey). The writer uses the table unit whenever that reads
// back exactly.
type transportQuantity struct {
	tableKey, siKey string
	toSI            func(float64) float64 // table unit -> SI
	required        bool
}

// transportQuantities are the Lennard-Jones diameter, the dipole moment
// and the polarizability volume, in the order of chem.TransportParams.
var transportQuantities = [...]transportQuantity{
	{"lj_diameter_angstrom", "lj_diameter_m", diameterToSI, true},
	{"dipole_moment_debye", "dipole_moment_C_m", dipoleToSI, false},
	{"polarizability_angstrom3", "polarizability_m3", polarizabilityToSI, false},
}

// invert finds the number q with the fewest significant digits such that
// toSI(q) == v exactly: first the roundings of guess (the inverse
// conversion) to 1..17 digits, then the floats a few ulps around guess
// (any solution lies within a few ulps of it). It reports false when there
// is none; the writer then writes v in SI units.
func invert(v, guess float64, toSI func(float64) float64) (float64, bool) {
	if math.IsInf(guess, 0) || math.IsNaN(guess) {
		return 0, false
	}
	for p := 1; p <= 17; p++ {
		q, err := strconv.ParseFloat(strconv.FormatFloat(guess, 'e', p-1, 64), 64)
		if err == nil && toSI(q) == v {
			return q, true
		}
	}
	best, found := 0.0, false
	bestDigits := 0
	up, down := guess, guess
	for step := 0; step <= 4; step++ {
		for _, q := range [2]float64{up, down} {
			if toSI(q) != v {
				continue
			}
			if n := significantDigits(q); !found || n < bestDigits {
				best, bestDigits, found = q, n, true
			}
		}
		up = math.Nextafter(up, math.Inf(1))
		down = math.Nextafter(down, math.Inf(-1))
	}
	return best, found
}

// significantDigits is the number of digits in the shortest decimal form of v.
func significantDigits(v float64) int {
	s := strconv.FormatFloat(v, 'e', -1, 64)
	n := 0
	for i := 0; i < len(s) && s[i] != 'e'; i++ {
		if s[i] >= '0' && s[i] <= '9' {
			n++
		}
	}
	return n
}

// parseValueWithUnit splits "1.5e13 cm^3/mol/s" into its number and unit.
func parseValueWithUnit(s string) (float64, string, error) {
	s = strings.TrimSpace(s)
	cut := strings.IndexAny(s, " \t")
	if cut < 0 {
		if _, err := strconv.ParseFloat(s, 64); err == nil {
			return 0, "", fmt.Errorf("%q is a number written as a string; write it without quotes or add a unit", s)
		}
		return 0, "", fmt.Errorf("%q is not a number followed by a unit", s)
	}
	num, unit := s[:cut], strings.TrimSpace(s[cut:])
	v, err := strconv.ParseFloat(num, 64)
	if err != nil {
		return 0, "", fmt.Errorf("%q: %q is not a number", s, num)
	}
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, "", fmt.Errorf("%q: the number must be finite", s)
	}
	return v, unit, nil
}
