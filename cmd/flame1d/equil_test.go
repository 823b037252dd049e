package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"strings"
	"testing"

	"flame1d/builtin"
	"flame1d/fuel"
	"flame1d/output"
	"flame1d/thermo"
)

func runEquil(t *testing.T, args ...string) (string, error) {
	t.Helper()
	cmd := newEquilCmd()
	var out bytes.Buffer
	cmd.SetOut(&out)
	cmd.SetErr(&out)
	cmd.SetArgs(args)
	err := cmd.Execute()
	return out.String(), err
}

func TestEquilCommandMatchesLibrary(t *testing.T) {
	m, err := builtin.Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatal(err)
	}
	set, err := fuel.SpeciesSet(m)
	if err != nil {
		t.Fatal(err)
	}
	charge, err := fuel.Premixed(m, set, map[string]float64{"CH4": 0.9, "C2H6": 0.1}, map[string]float64{"O2": 0.21, "N2": 0.79}, 0.8)
	if err != nil {
		t.Fatal(err)
	}
	want, err := set.AdiabaticFlame(350, 5e5, charge.X, thermo.EquilibriumOptions{})
	if err != nil {
		t.Fatal(err)
	}

	out, err := runEquil(t, "--fuel", "CH4:0.9,C2H6:0.1", "--phi", "0.8", "--T", "350 K", "--P", "5 bar", "--json")
	if err != nil {
		t.Fatal(err)
	}
	var rep equilReport
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatalf("JSON output: %v\n%s", err, out)
	}
	if rep.Temperature != want.T || rep.InitialT != 350 || rep.Pressure != 5e5 || rep.Mode != "hp" {
		t.Errorf("report T %v (library %v), T0 %v, P %v, mode %s", rep.Temperature, want.T, rep.InitialT, rep.Pressure, rep.Mode)
	}
	sum := 0.0
	for _, x := range rep.MoleFractions {
		sum += x
	}
	if math.Abs(sum-1) > 1e-12 {
		t.Errorf("listed mole fractions sum to %v", sum)
	}
	if x := rep.MoleFractions["CO2"]; x != want.MoleFractions[m.SpeciesIndex("CO2")] {
		t.Errorf("X_CO2 %v, library %v", x, want.MoleFractions[m.SpeciesIndex("CO2")])
	}
	if rep.Note != output.SafetyNote || rep.FuelLHV == nil || rep.BurnedDensity >= rep.UnburnedDensity {
		t.Errorf("note %q, LHV %v, densities %v -> %v", rep.Note, rep.FuelLHV, rep.UnburnedDensity, rep.BurnedDensity)
	}

	text, err := runEquil(t, "--fuel", "CH4:0.9,C2H6:0.1", "--phi", "0.8", "--T", "350 K", "--P", "5 bar")
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []string{"adiabatic flame T", fmt.Sprintf("%.2f K", want.T), "model predictions", "N2 ", "CO2 "} {
		if !strings.Contains(text, s) {
			t.Errorf("text output lacks %q:\n%s", s, text)
		}
	}
}

func TestEquilCommandModesAndOptions(t *testing.T) {
	// Fixed T and P: the state is at exactly the given temperature.
	out, err := runEquil(t, "--fuel", "H2", "--oxidizer", "O2:1", "--mode", "tp", "--T", "3000 K", "--P", "1 atm", "--json")
	if err != nil {
		t.Fatal(err)
	}
	var rep equilReport
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatal(err)
	}
	if rep.Temperature != 3000 || rep.Mode != "tp" || rep.Pressure != thermo.OneAtmosphere {
		t.Errorf("tp: T %v mode %s P %v", rep.Temperature, rep.Mode, rep.Pressure)
	}
	// Held at zero: no NO in the products, and the flame is hotter without
	// the endothermic NO (Δh_f = +90 kJ/mol).
	with, err := runEquil(t, "--json")
	if err != nil {
		t.Fatal(err)
	}
	without, err := runEquil(t, "--exclude", "NO, NO2,N2O", "--json")
	if err != nil {
		t.Fatal(err)
	}
	var a, b equilReport
	if err := json.Unmarshal([]byte(with), &a); err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal([]byte(without), &b); err != nil {
		t.Fatal(err)
	}
	if _, ok := b.MoleFractions["NO"]; ok || a.MoleFractions["NO"] <= 0 {
		t.Errorf("NO: %v excluded, %v not", b.MoleFractions["NO"], a.MoleFractions["NO"])
	}
	if !(b.Temperature > a.Temperature) || len(b.Excluded) != 3 {
		t.Errorf("T without NOx %v, with %v; excluded %v", b.Temperature, a.Temperature, b.Excluded)
	}
}

func TestEquilCommandErrors(t *testing.T) {
	cases := []struct {
		args []string
		msg  string
	}{
		{[]string{"--mode", "uv"}, "--mode"},
		{[]string{"--T", "300 bar"}, "unknown temperature unit"},
		{[]string{"--P", "-1 atm"}, "pressure must be positive"},
		{[]string{"--fuel", "XYZ"}, "not in mechanism"},
		{[]string{"--fuel", "CH4:abc"}, "non-negative number"},
		{[]string{"--fuel", "CH4,C2H6:0.1"}, "give every species of a blend an amount"},
		{[]string{"--phi", "0"}, "equivalence ratio"},
		{[]string{"--oxidizer", "N2:1"}, "supplies no oxygen"},
		{[]string{"--exclude", "FOO"}, "no species \"FOO\""},
		{[]string{"--mechanism", "no-such-mechanism"}, "neither a built-in mechanism"},
		{[]string{"--min-x", "2"}, "--min-x"},
		{[]string{"extra"}, "unknown command"},
	}
	for _, c := range cases {
		_, err := runEquil(t, c.args...)
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%v: error %v, want one containing %q", c.args, err, c.msg)
		}
	}
}

func TestParseComposition(t *testing.T) {
	cases := []struct {
		in   string
		want map[string]float64
	}{
		{"CH4", map[string]float64{"CH4": 1}},
		{" CH4:0.9, C2H6:0.1 ", map[string]float64{"CH4": 0.9, "C2H6": 0.1}},
		{"O2:21,N2:79", map[string]float64{"O2": 21, "N2": 79}},
		{"H2:1,", map[string]float64{"H2": 1}},
	}
	for _, c := range cases {
		got, err := parseComposition(c.in)
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if len(got) != len(c.want) {
			t.Errorf("%q: %v, want %v", c.in, got, c.want)
		}
		for k, v := range c.want {
			if got[k] != v {
				t.Errorf("%q: %s = %v, want %v", c.in, k, got[k], v)
			}
		}
	}
	for _, bad := range []string{"", " , ", ":0.5", "CH4:-1", "CH4:1,CH4:2", "CH4:inf"} {
		if _, err := parseComposition(bad); err == nil {
			t.Errorf("%q: want error", bad)
		}
	}
}
