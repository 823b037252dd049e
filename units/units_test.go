package units

import (
	"math"
	"strings"
	"testing"
)

func TestParse(t *testing.T) {
	cases := []struct {
		in   string
		d    Dimension
		want float64
		src  string
	}{
		{"298.15", Temperature, 298.15, "bare number is SI"},
		{"300 K", Temperature, 300, ""},
		{"300K", Temperature, 300, "no blank"},
		{"25 C", Temperature, 298.15, "ISO 80000-5: t/°C = T/K - 273.15"},
		{"25 degC", Temperature, 298.15, ""},
		{"-40 °C", Temperature, 233.15, ""},
		{"-40 F", Temperature, 233.15, "-40 °F = -40 °C (ISO 80000-5 scale relation)"},
		{"212 degF", Temperature, 373.15, "water boiling point at 1 atm on both scales"},
		{"32F", Temperature, 273.15, ""},
		{"1 atm", Pressure, 101325, "ISO 80000-4, exact"},
		{"1e5Pa", Pressure, 1e5, ""},
		{"101.325 kPa", Pressure, 101325, ""},
		{"0.1 MPa", Pressure, 1e5, ""},
		{"2.5 bar", Pressure, 2.5e5, ""},
		{"14.6959487755 psi", Pressure, 101325, "1 atm = 14.6959487755 psi (NIST SP 811, App. B.8)"},
		{"760 torr", Pressure, 101325, "1 torr = 1/760 atm, exact"},
		{"1 Torr", Pressure, 101325.0 / 760, ""},
		{"2 cm", Length, 0.02, ""},
		{"15 mm", Length, 0.015, ""},
		{"1.5 m", Length, 1.5, ""},
		{"3 ms", Time, 3e-3, ""},
		{"20 us", Time, 2e-5, ""},
		{"1 kcal/mol", EnergyPerMole, 4184, "thermochemical calorie, 4.184 J exact"},
		{"1000 cal/mol", EnergyPerMole, 4184, ""},
		{"44.0 kJ/mol", EnergyPerMole, 44000, ""},
		{"50 MJ/kg", EnergyPerMass, 5e7, ""},
		{"  120 kJ/kg  ", EnergyPerMass, 1.2e5, "surrounding blanks"},
		{"0.72 nm", Length, 7.2e-10, ""},
		{"7.2 Å", Length, 7.2e-10, "1 Å = 1e-10 m, exact"},
		{"158 g/mol", MolarMass, 0.158, ""},
		{"0.158", MolarMass, 0.158, "bare number is SI"},
		{"44 kg/kmol", MolarMass, 0.044, ""},
		{"590 J/mol/K", MolarEntropy, 590, ""},
		{"590 J/(mol K)", MolarEntropy, 590, ""},
		{"100 cal/mol/K", MolarEntropy, 418.4, "thermochemical calorie, 4.184 J exact"},
	}
	for _, c := range cases {
		got, err := Parse(c.in, c.d)
		if err != nil {
			t.Errorf("Parse(%q, %v): %v", c.in, c.d, err)
			continue
		}
		if math.Abs(got-c.want) > 1e-9*math.Max(1, math.Abs(c.want)) {
			t.Errorf("Parse(%q, %v) = %.12g, want %.12g %s", c.in, c.d, got, c.want, c.src)
		}
	}
}

func TestParseErrors(t *testing.T) {
	cases := []struct {
		in   string
		d    Dimension
		msgs []string
	}{
		{"300 bar", Temperature, []string{"unknown temperature unit", "K, C, degC"}},
		{"1 mpa", Pressure, []string{"unknown pressure unit", "MPa"}},
		{"warm", Temperature, []string{"not a temperature", "K"}},
		{"", Pressure, []string{"not a pressure"}},
		{"NaN K", Temperature, []string{"finite"}},
		{"inf atm", Pressure, []string{"finite"}},
		{"-300 C", Temperature, []string{"below absolute zero"}},
		{"-1 K", Temperature, []string{"below absolute zero"}},
		{"3 kg", Length, []string{"unknown length unit"}},
		{"1 J/kg", EnergyPerMole, []string{"J/mol, kJ/mol"}},
	}
	for _, c := range cases {
		_, err := Parse(c.in, c.d)
		if err == nil {
			t.Errorf("Parse(%q, %v): want error", c.in, c.d)
			continue
		}
		for _, m := range c.msgs {
			if !strings.Contains(err.Error(), m) {
				t.Errorf("Parse(%q, %v): error %q lacks %q", c.in, c.d, err, m)
			}
		}
	}
}

func TestEveryUnitParses(t *testing.T) {
	for d := Temperature; d <= MolarEntropy; d++ {
		names := Units(d)
		if len(names) == 0 {
			t.Errorf("%v: no units", d)
		}
		for i, n := range names {
			v, err := Parse("1 "+n, d)
			if err != nil || !(v > 0) {
				t.Errorf("%v: Parse(1 %s) = %v, %v", d, n, v, err)
			}
			if i == 0 && v != 1 {
				t.Errorf("%v: first unit %s is not SI (1 %s = %v)", d, n, n, v)
			}
		}
	}
}
