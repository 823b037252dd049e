package main

import (
	"encoding/json"
	"fmt"
	"strings"
	"testing"

	"flame1d/builtin"
	"flame1d/fuel"
	"flame1d/output"
)

// The command converts its flags and prints the library's result
// (fuel.PremixedEquilibrium, tested against published values there).
func TestEquilibriumCommandMatchesLibrary(t *testing.T) {
	m, err := builtin.Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatal(err)
	}
	want, err := fuel.PremixedEquilibrium(m, fuel.EquilibriumRequest{Fuel: map[string]float64{"CH4": 0.9, "C2H6": 0.1},
		Oxidizer: map[string]float64{"O2": 0.21, "N2": 0.79}, EquivalenceRatio: 0.8, Temperature: 350, Pressure: 5e5})
	if err != nil {
		t.Fatal(err)
	}
	args := []string{"equilibrium", "--fuel", "CH4=0.9,C2H6=0.1", "--phi", "0.8", "--temperature", "350 K", "--pressure", "5 bar"}
	out, err := runCmd(t, append(args, "--json")...)
	if err != nil {
		t.Fatal(err)
	}
	var rep equilibriumOutput
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatalf("JSON output: %v\n%s", err, out)
	}
	if rep.Temperature != want.Temperature || rep.InitialT != 350 || rep.Pressure != 5e5 || rep.Mode != "adiabatic" ||
		rep.MoleFractions["CO2"] != want.MoleFractions["CO2"] || rep.Note != output.SafetyNote || rep.MinFraction != 1e-4 {
		t.Errorf("report T %v (library %v), T0 %v, P %v, mode %s, X_CO2 %v (library %v), note %q, min %g",
			rep.Temperature, want.Temperature, rep.InitialT, rep.Pressure, rep.Mode, rep.MoleFractions["CO2"], want.MoleFractions["CO2"], rep.Note, rep.MinFraction)
	}
	text, err := runCmd(t, args...)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []string{"adiabatic flame T", fmt.Sprintf("%.2f K", want.Temperature), "model predictions", "N2 ", "CO2 "} {
		if !strings.Contains(text, s) {
			t.Errorf("text output lacks %q:\n%s", s, text)
		}
	}
	iso, err := runCmd(t, "equilibrium", "--fuel", "H2", "--oxidizer", "{ O2 = 1 }", "--mode", "isothermal", "--temperature", "3000 K", "--json")
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal([]byte(iso), &rep); err != nil || rep.Temperature != 3000 || rep.Mode != "isothermal" {
		t.Errorf("isothermal: %v, T %v, mode %s", err, rep.Temperature, rep.Mode)
	}
}

func TestEquilibriumCommandErrors(t *testing.T) {
	cases := []struct {
		args []string
		msg  string
	}{
		{[]string{"--mode", "hp"}, `--mode: "hp" is not adiabatic or isothermal`},
		{[]string{"--temperature", "300 bar"}, "--temperature: \"300 bar\": unknown temperature unit"},
		{[]string{"--pressure", "-1 atm"}, "--pressure: pressure must be positive"},
		{[]string{"--fuel", "XYZ"}, "not in mechanism"},
		{[]string{"--fuel", "CH4=abc"}, "--fuel \"CH4=abc\""},
		{[]string{"--fuel", "CH4:0.9,C2H6:0.1"}, "write each species as NAME=value, e.g. CH4=0.9"},
		{[]string{"--oxidizer", "N2=1"}, "supplies no oxygen"},
		{[]string{"--exclude", "FOO"}, "no species \"FOO\""},
		{[]string{"--mechanism", "no-such-mechanism"}, "--mechanism: "},
		{[]string{"--min-mole-fraction", "2"}, "--min-mole-fraction"},
		{[]string{"--T", "300"}, "unknown flag: --T"},
		{[]string{"extra"}, "unknown command"},
	}
	for _, c := range cases {
		_, err := runCmd(t, append([]string{"equilibrium"}, c.args...)...)
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%v: error %v, want one containing %q", c.args, err, c.msg)
		}
	}
}
