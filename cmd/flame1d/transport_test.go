package main

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"flame1d/builtin"
)

// Air at 300 K, 1 atm: Prandtl number 0.707 and density 1.177 kg/m^3
// (Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, Table A.4,
// from memory). The model's mu, lambda and cp are each within ~2%, so 4%.
func TestTransportAir(t *testing.T) {
	m, err := builtin.Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatal(err)
	}
	rep, err := computeTransport(m, transportRequest{X: "O2:0.21,N2:0.79", Temperature: "300 K", Pressure: "1 atm", MinFraction: 1e-6})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(rep.Prandtl/0.707-1) > 0.04 {
		t.Errorf("Pr(air, 300 K) = %.4f, want 0.707 within 4%%", rep.Prandtl)
	}
	if math.Abs(rep.Density/1.177-1) > 0.005 {
		t.Errorf("rho(air, 300 K) = %.4f kg/m^3, want 1.177", rep.Density)
	}
	if len(rep.Species) != 2 {
		t.Errorf("species table has %d rows, want O2 and N2 only", len(rep.Species))
	}
	var b bytes.Buffer
	if err := rep.writeText(&b); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), "confirm them against local codes") {
		t.Error("text output lacks the model-prediction notice")
	}
}

func TestTransportRequestErrors(t *testing.T) {
	m, err := builtin.Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatal(err)
	}
	for _, req := range []transportRequest{
		{Temperature: "300 K", Pressure: "1 atm"},                         // no composition
		{X: "XX:1", Temperature: "300 K", Pressure: "1 atm"},              // unknown species
		{X: "N2:1", Fuel: "CH4", Temperature: "300 K", Pressure: "1 atm"}, // both forms
		{X: "N2:1", Temperature: "9000 K", Pressure: "1 atm"},             // outside fit range
		{X: "N2:1", Temperature: "300 K", Pressure: "-1 atm"},             // bad pressure
	} {
		if _, err := computeTransport(m, req); err == nil {
			t.Errorf("%+v: no error", req)
		}
	}
}
