package main

import (
	"encoding/json"
	"strings"
	"testing"

	"flame1d/builtin"
	"flame1d/fuel"
	"flame1d/transport"
)

// The command prints transport.Model.Properties (tested against handbook
// values in package transport) for the composition its flags give.
func TestTransportCommand(t *testing.T) {
	m, err := builtin.Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatal(err)
	}
	set, err := fuel.SpeciesSet(m)
	if err != nil {
		t.Fatal(err)
	}
	tr, err := transport.New(m, transport.Options{})
	if err != nil {
		t.Fatal(err)
	}
	X, err := fuel.MoleFractions(m, "air", map[string]float64{"O2": 0.21, "N2": 0.79})
	if err != nil {
		t.Fatal(err)
	}
	want, err := tr.Properties(set, 400, 2e5, X)
	if err != nil {
		t.Fatal(err)
	}
	out, err := runCmd(t, "transport", "--mole-fractions", "O2=0.21,N2=0.79", "--temperature", "400 K", "--pressure", "2 bar", "--json")
	if err != nil {
		t.Fatal(err)
	}
	var rep transportReport
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	if rep.Prandtl != want.Prandtl || rep.Density != want.Density || len(rep.Species) != 2 {
		t.Errorf("Pr %v (library %v), rho %v (library %v), %d species rows", rep.Prandtl, want.Prandtl, rep.Density, want.Density, len(rep.Species))
	}
	for _, s := range rep.Species {
		if k := m.SpeciesIndex(s.Name); s.Lewis != want.Lewis[k] {
			t.Errorf("Le_%s %v, library %v", s.Name, s.Lewis, want.Lewis[k])
		}
	}
	text, err := runCmd(t, "transport", "--fuel", "CH4", "--phi", "1")
	if err != nil || !strings.Contains(text, "confirm them against local codes") || !strings.Contains(text, "CH4 ") {
		t.Errorf("premixed charge, text: %v\n%s", err, text)
	}
}

func TestTransportCommandErrors(t *testing.T) {
	for _, c := range []struct {
		args []string
		msg  string
	}{
		{nil, "give the composition"},
		{[]string{"--mole-fractions", "XX=1"}, `--mole-fractions: species "XX" is not in mechanism`},
		{[]string{"--mole-fractions", "N2=1", "--fuel", "CH4"}, "not both"},
		{[]string{"--mole-fractions", "N2=1", "--temperature", "9000 K"}, "outside the transport fit range"},
		{[]string{"--mole-fractions", "N2=1", "--pressure", "-1 atm"}, "--pressure: pressure must be positive"},
		{[]string{"--mole-fractions", "N2:1"}, "write each species as NAME=value"},
		{[]string{"--X", "N2=1"}, "unknown flag: --X"},
	} {
		_, err := runCmd(t, append([]string{"transport"}, c.args...)...)
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%v: error %v, want one containing %q", c.args, err, c.msg)
		}
	}
}
