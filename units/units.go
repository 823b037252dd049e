// Package units converts values written with units ("1 atm", "25 degC",
// "0.1 MPa", "45 kJ/mol") to the SI units used inside flame1d.
//
// The SI unit of each dimension: temperature K, pressure Pa, length m, time
// s, energy per mole J/mol, energy per mass J/kg, molar mass kg/mol, molar
// entropy J/(mol K). A bare number is taken to be in SI already.
package units

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
)

// Dimension is the physical kind of a quantity.
type Dimension int

const (
	Temperature   Dimension = iota // K
	Pressure                       // Pa
	Length                         // m
	Time                           // s
	EnergyPerMole                  // J/mol
	EnergyPerMass                  // J/kg
	MolarMass                      // kg/mol
	MolarEntropy                   // J/(mol K), also molar heat capacity
)

// String returns the dimension's name in words.
func (d Dimension) String() string {
	switch d {
	case Temperature:
		return "temperature"
	case Pressure:
		return "pressure"
	case Length:
		return "length"
	case Time:
		return "time"
	case EnergyPerMole:
		return "energy per mole"
	case EnergyPerMass:
		return "energy per mass"
	case MolarMass:
		return "molar mass"
	case MolarEntropy:
		return "molar entropy"
	}
	return fmt.Sprintf("Dimension(%d)", int(d))
}

// unit converts a value v in the unit to SI as v*scale + offset.
type unit struct {
	name          string
	scale, offset float64
}

// Exact conversion factors: 1 atm = 101325 Pa and 1 torr = 1/760 atm
// (ISO 80000-4); 1 psi = 0.45359237 kg * 9.80665 m/s^2 / (0.0254 m)^2
// (international pound, standard gravity, inch); 1 thermochemical calorie
// = 4.184 J; t/°C = T/K - 273.15; t/°F = 1.8 t/°C + 32 (ISO 80000-5).
var tables = map[Dimension][]unit{
	Temperature: {
		{"K", 1, 0},
		{"C", 1, 273.15}, {"degC", 1, 273.15}, {"°C", 1, 273.15},
		{"F", 5.0 / 9, 273.15 - 32*5.0/9}, {"degF", 5.0 / 9, 273.15 - 32*5.0/9}, {"°F", 5.0 / 9, 273.15 - 32*5.0/9},
	},
	Pressure: {
		{"Pa", 1, 0}, {"kPa", 1e3, 0}, {"MPa", 1e6, 0},
		{"bar", 1e5, 0}, {"mbar", 1e2, 0},
		{"atm", 101325, 0},
		{"psi", 0.45359237 * 9.80665 / (0.0254 * 0.0254), 0},
		{"torr", 101325.0 / 760, 0}, {"Torr", 101325.0 / 760, 0},
	},
	Length: {
		{"m", 1, 0}, {"cm", 1e-2, 0}, {"mm", 1e-3, 0}, {"um", 1e-6, 0}, {"µm", 1e-6, 0},
		{"nm", 1e-9, 0}, {"Å", 1e-10, 0}, {"angstrom", 1e-10, 0},
	},
	Time: {
		{"s", 1, 0}, {"ms", 1e-3, 0}, {"us", 1e-6, 0}, {"µs", 1e-6, 0}, {"μs", 1e-6, 0},
	},
	EnergyPerMole: {
		{"J/mol", 1, 0}, {"kJ/mol", 1e3, 0}, {"cal/mol", 4.184, 0}, {"kcal/mol", 4184, 0},
	},
	EnergyPerMass: {
		{"J/kg", 1, 0}, {"kJ/kg", 1e3, 0}, {"MJ/kg", 1e6, 0},
	},
	MolarMass: {
		{"kg/mol", 1, 0}, {"g/mol", 1e-3, 0}, {"kg/kmol", 1e-3, 0},
	},
	MolarEntropy: {
		{"J/mol/K", 1, 0}, {"J/(mol K)", 1, 0}, {"J/(mol*K)", 1, 0},
		{"cal/mol/K", 4.184, 0}, {"cal/(mol K)", 4.184, 0}, {"cal/(mol*K)", 4.184, 0},
	},
}

// Units returns the unit names Parse accepts for a dimension, SI first.
func Units(d Dimension) []string {
	var names []string
	for _, u := range tables[d] {
		names = append(names, u.name)
	}
	return names
}

// Parse converts a value written as "number [unit]" to SI units of
// dimension d. The unit may follow the number with or without a space
// ("300 K", "300K"); unit names are case-sensitive ("MPa", not "mpa"). A
// bare number is already SI. Temperatures below absolute zero are rejected.
func Parse(s string, d Dimension) (float64, error) {
	table, ok := tables[d]
	if !ok {
		return 0, fmt.Errorf("units: unknown dimension %v", d)
	}
	num, name := split(strings.TrimSpace(s))
	if num == "" {
		return 0, fmt.Errorf("%q is not a %v: expected a number, optionally followed by one of %s", s, d, strings.Join(Units(d), ", "))
	}
	v, err := strconv.ParseFloat(num, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a %v: %q is not a finite number (write e.g. \"1.5 %s\"; units: %s)",
			s, d, num, table[0].name, strings.Join(Units(d), ", "))
	}
	si := v
	if name != "" {
		found := false
		for _, u := range table {
			if u.name == name {
				si, found = v*u.scale+u.offset, true
				break
			}
		}
		if !found {
			return 0, fmt.Errorf("%q: unknown %v unit %q (expected one of %s)", s, d, name, strings.Join(Units(d), ", "))
		}
	}
	if d == Temperature && si < 0 {
		return 0, fmt.Errorf("%q is below absolute zero (%g K)", s, si)
	}
	return si, nil
}

// MustParse is Parse for constants in program text; it panics on error and
// must not be used on user input.
func MustParse(s string, d Dimension) float64 {
	v, err := Parse(s, d)
	if err != nil {
		panic(err)
	}
	return v
}

// split separates the leading number from the unit: at the first blank if
// there is one, otherwise after the longest prefix that parses as a number
// ("1e5Pa" -> "1e5", "Pa").
func split(s string) (num, unit string) {
	if i := strings.IndexFunc(s, unicode.IsSpace); i >= 0 {
		return s[:i], strings.TrimSpace(s[i:])
	}
	for j := len(s); j > 0; j-- {
		if _, err := strconv.ParseFloat(s[:j], 64); err == nil {
			return s[:j], s[j:]
		}
	}
	return s, ""
}
