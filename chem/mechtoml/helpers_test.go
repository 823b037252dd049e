package mechtoml

import (
	"bytes"
	"fmt"
	"math"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
)

// roundTrip writes m, reads it back, and returns the result and the text.
func roundTrip(t testing.TB, m *chem.Mechanism) (*chem.Mechanism, string) {
	t.Helper()
	var buf bytes.Buffer
	if err := Write(&buf, m); err != nil {
		t.Fatalf("Write: %v", err)
	}
	got, problems, err := Read(bytes.NewReader(buf.Bytes()), "roundtrip.toml")
	if err != nil {
		t.Fatalf("Read of written file: %v\n%s", err, numbered(buf.String()))
	}
	for _, p := range problems {
		t.Logf("%s", p)
	}
	return got, buf.String()
}

func numbered(s string) string {
	var b strings.Builder
	for i, l := range strings.Split(s, "\n") {
		fmt.Fprintf(&b, "%4d | %s\n", i+1, l)
	}
	return b.String()
}

// gas returns a species with flat (cp = const) polynomials whose midpoint is
// continuous by construction.
func gas(name string, atoms map[string]float64, cpR float64, tp *chem.TransportParams) chem.Species {
	c := [7]float64{cpR, 0, 0, 0, 0, -1000 * cpR, 3.5}
	return chem.Species{
		Species: thermo.Species{
			Name: name, Composition: atoms,
			Thermo: thermo.NASA7{TLow: 300, TMid: 1000, THigh: 5000, Low: c, High: c},
		},
		Transport: tp,
	}
}

// ang and debyeSI are 1 Å and 1 debye in SI, as variables so that the
// products below are rounded at run time as an importer's are (constant
// expressions are exact in Go).
var ang, debyeSI = 1e-10, 1e-21 / 299792458.0

// calToJ and cgs convert the way published rate data are usually given
// (cal/mol; cm, mol, s for a step of overall order n) into SI.
func calToJ(e float64) float64     { return e * 4.184 }
func cgs(a float64, n int) float64 { return a * math.Pow(1e-6, float64(n-1)) }

// handBuilt is a mechanism with every reaction form and option the model
// has; the numbers are partly typical published values converted from
// cm-mol-s-cal (which the writer keeps in those units) and partly
// arbitrary SI values (which it must write in SI to stay exact).
func handBuilt() *chem.Mechanism {
	lj := func(g chem.Geometry, eps, sigma float64) *chem.TransportParams {
		return &chem.TransportParams{Geometry: g, WellDepth: eps, Diameter: sigma * ang, RotRelaxation: 1}
	}
	sp := []chem.Species{
		gas("H", map[string]float64{"H": 1}, 2.5, lj(chem.Atom, 145, 2.05)),
		gas("H2", map[string]float64{"H": 2}, 3.5, &chem.TransportParams{Geometry: chem.Linear, WellDepth: 38, Diameter: 2.92 * ang, Polarizability: 0.79 * ang * ang * ang, RotRelaxation: 280}),
		gas("O", map[string]float64{"O": 1}, 2.5, lj(chem.Atom, 80, 2.75)),
		gas("O2", map[string]float64{"O": 2}, 3.5, lj(chem.Linear, 107.4, 3.458)),
		gas("OH", map[string]float64{"O": 1, "H": 1}, 3.5, lj(chem.Linear, 80, 2.75)),
		gas("H2O", map[string]float64{"H": 2, "O": 1}, 4, &chem.TransportParams{Geometry: chem.Nonlinear, WellDepth: 572.4, Diameter: 2.605e-10, Dipole: 1.844 * debyeSI, RotRelaxation: 4}),
		gas("HO2", map[string]float64{"H": 1, "O": 2}, 4, lj(chem.Nonlinear, 107.4, 3.458)),
		gas("H2O2", map[string]float64{"H": 2, "O": 2}, 4, lj(chem.Nonlinear, 107.4, 3.458)),
		gas("CH4", map[string]float64{"C": 1, "H": 4}, 4, lj(chem.Nonlinear, 141.4, 3.746)),
		gas("CH3", map[string]float64{"C": 1, "H": 3}, 4, nil),
		gas("CH2(S)", map[string]float64{"C": 1, "H": 2}, 4, lj(chem.Linear, 144, 3.8)),
		gas("CO", map[string]float64{"C": 1, "O": 1}, 3.5, lj(chem.Linear, 98.1, 3.65)),
		gas("CO2", map[string]float64{"C": 1, "O": 2}, 4.5, lj(chem.Linear, 244, 3.763)),
		gas("N2", map[string]float64{"N": 2}, 3.5, lj(chem.Linear, 97.53, 3.621)),
		gas("AR", map[string]float64{"AR": 1}, 2.5, lj(chem.Atom, 136.5, 3.33)),
		gas("c4h8-1", map[string]float64{"C": 4, "H": 8}, 10, lj(chem.Nonlinear, 357, 5.176)),
		gas("C(gr)", map[string]float64{"C": 1}, 1, nil),
	}
	sp[len(sp)-1].Condensed = true
	// An SI transport value with no exact Å form: written in m.
	sp[9].Transport = &chem.TransportParams{Geometry: chem.Nonlinear, WellDepth: 144, Diameter: 3.8000000000000003e-10 + 1e-26, Polarizability: 1.23456789e-30}
	idx := func(name string) int {
		for i := range sp {
			if sp[i].Name == name {
				return i
			}
		}
		panic("no species " + name)
	}
	p := func(c float64, name string) chem.Participant {
		return chem.Participant{Species: idx(name), Coefficient: c}
	}
	one := func(names ...string) []chem.Participant {
		out := make([]chem.Participant, len(names))
		for i, n := range names {
			out[i] = p(1, n)
		}
		return out
	}
	arr := func(a float64, n int, b, ecal float64) chem.Arrhenius {
		return chem.Arrhenius{A: cgs(a, n), B: b, E: calToJ(ecal)}
	}
	eff := func(kv ...any) map[int]float64 {
		m := map[int]float64{}
		for i := 0; i < len(kv); i += 2 {
			m[idx(kv[i].(string))] = kv[i+1].(float64)
		}
		return m
	}
	atm := thermo.OneAtmosphere
	rs := []chem.Reaction{
		{Equation: "H+O2<=>O+OH", Reactants: one("H", "O2"), Products: one("O", "OH"), Reversible: true,
			Form: chem.Elementary, Rate: arr(2.65e16, 2, -0.6707, 17041)},
		{Equation: "O + H2 <=> H + OH", Reactants: one("O", "H2"), Products: one("H", "OH"), Reversible: true, Duplicate: true,
			Form: chem.Elementary, Rate: arr(3.818e12, 2, 0, 7948)},
		{Equation: "O + H2 <=> H + OH", Reactants: one("O", "H2"), Products: one("H", "OH"), Reversible: true, Duplicate: true,
			Form: chem.Elementary, Rate: arr(8.792e14, 2, 0, 19170)},
		{Equation: "2O+M<=>O2+M", Reactants: []chem.Participant{p(2, "O")}, Products: one("O2"), Reversible: true,
			Form: chem.ThreeBody, Rate: arr(1.2e17, 3, -1, 0),
			ThirdBody: &chem.ThirdBody{Default: 1, Efficiencies: eff("H2", 2.4, "H2O", 15.4, "AR", 0.83, "CH2(S)", 2.0)}},
		{Equation: "H + H + M <=> H2 + M", Reactants: []chem.Participant{p(2, "H")}, Products: one("H2"), Reversible: true,
			Form: chem.ThreeBody, Rate: arr(1e18, 3, -1, 0),
			ThirdBody: &chem.ThirdBody{Default: 0, Efficiencies: eff("AR", 1.0)}},
		{Equation: "H + O2 (+M) <=> HO2 (+M)", Reactants: one("H", "O2"), Products: one("HO2"), Reversible: true,
			Form: chem.Falloff, ThirdBody: &chem.ThirdBody{Default: 1, Efficiencies: eff("H2", 2.0, "H2O", 14.0, "AR", 0.67)},
			FalloffRate: &chem.FalloffRate{Low: arr(6.366e20, 3, -1.72, 524.8), High: arr(4.65084e12, 2, 0.44, 0),
				Troe: &chem.Troe{A: 0.5, T3: 1e-30, T1: 1e30}}},
		{Equation: "H2O2(+M)<=>2OH(+M)", Reactants: one("H2O2"), Products: []chem.Participant{p(2, "OH")}, Reversible: true,
			Form: chem.Falloff, ThirdBody: &chem.ThirdBody{Default: 1.5, Efficiencies: eff("H2O", 7.5)},
			FalloffRate: &chem.FalloffRate{Low: arr(2.49e24, 2, -2.3, 48749), High: arr(2e12, 1, 0.9, 48749),
				Troe: &chem.Troe{A: 0.42, T3: 1e-30, T1: 1e30, T2: 1e10, HasT2: true}}},
		{Equation: "CH3 + H (+M) <=> CH4 (+M)", Reactants: one("CH3", "H"), Products: one("CH4"), Reversible: true,
			Form: chem.Falloff, ThirdBody: &chem.ThirdBody{Default: 1},
			FalloffRate: &chem.FalloffRate{Low: arr(2.62e33, 3, -4.76, 2440), High: arr(1.27e16, 2, -0.63, 383)}},
		{Equation: "CH3 + H (+AR) <=> CH4 (+AR)", Reactants: one("CH3", "H"), Products: one("CH4"), Reversible: true,
			Form: chem.Falloff, ThirdBody: &chem.ThirdBody{Efficiencies: eff("AR", 1.0)},
			FalloffRate: &chem.FalloffRate{Low: arr(1.1e33, 3, -4.76, 2440), High: arr(1.27e16, 2, -0.63, 383),
				SRI: &chem.SRI{A: 0.45, B: 797, C: 979, D: 1, E: 0}}},
		{Equation: "CH3 + OH (+M) <=> CH2(S) + H2O (+M)", Reactants: one("CH3", "OH"), Products: one("CH2(S)", "H2O"), Reversible: true,
			Form: chem.ChemicallyActivated, ThirdBody: &chem.ThirdBody{Default: 1, Efficiencies: eff("N2", 0.0)},
			FalloffRate: &chem.FalloffRate{Low: arr(1.2e20, 3, -1.2, 2400), High: arr(4e13, 2, 0, 2500),
				SRI: &chem.SRI{A: 1.1, B: 1200, C: 101, D: 1.2, E: -0.3}}},
		{Equation: "CH3+OH(+M)=CH2(S)+H2O(+M)", Reactants: one("CH3", "OH"), Products: one("CH2(S)", "H2O"), Reversible: true,
			Form: chem.PressureTable, PressureRates: []chem.PressureRate{
				{P: 0.01 * atm, Rate: arr(4.936e14, 2, -0.669, -445.8)},
				{P: 12345.678, Rate: chem.Arrhenius{A: 1.234567e-3, B: 0.5, E: 12345.678901}},
				{P: 1 * atm, Rate: arr(4.952e17, 2, -1.56, 3003)},
				{P: 1 * atm, Rate: arr(-1.2e13, 2, 0.1, 2000)},
				{P: 100 * atm, Rate: arr(1.258e27, 2, -3.63, 13880)},
			}},
		{Equation: "OH + CO <=> H + CO2", Reactants: one("OH", "CO"), Products: one("H", "CO2"), Reversible: true,
			Form: chem.Chebyshev, ChebyshevRate: &chem.ChebyshevRate{TMin: 290, TMax: 3000, PMin: 0.001 * atm, PMax: 100 * atm,
				Coeffs: [][]float64{{8.684 + math.Log10(cgs(1, 2)), 0.8, -0.1}, {1.2, -0.3, 0.05}, {-0.1, 0.02, 0.0}}}},
		{Equation: "HO2 + CO => OH + CO2", Reactants: one("HO2", "CO"), Products: one("OH", "CO2"),
			Form: chem.Chebyshev, ChebyshevRate: &chem.ChebyshevRate{TMin: 300, TMax: 2500, PMin: 1000, PMax: 1e7,
				Coeffs: [][]float64{{2.684}, {1.2}}}},
		{Equation: "HO2 + H <=> OH + OH", Reactants: one("HO2", "H"), Products: []chem.Participant{p(2, "OH")}, Reversible: true,
			Form: chem.Elementary, Rate: arr(7.079e13, 2, 0, 295), ReverseRate: &chem.Arrhenius{A: 2.3e7, B: 0.2, E: 1.5e5}},
		{Equation: "CH4 + 1.5 O2 => CO + 2 H2O", Reactants: []chem.Participant{p(1, "CH4"), p(1.5, "O2")},
			Products: []chem.Participant{p(1, "CO"), p(2, "H2O")},
			Form:     chem.Elementary, Rate: chem.Arrhenius{A: 4.9e9 * 1.2345, B: 0, E: calToJ(40000)},
			Orders: eff("CH4", 0.7, "O2", 0.8, "H2O", 0.1)},
		{Equation: "H2 + 0.5O2 <=> H2O", Reactants: []chem.Participant{p(1, "H2"), p(0.5, "O2")}, Products: one("H2O"), Reversible: true,
			Form: chem.Elementary, Rate: arr(1.8e13, 2, 0, 35000), Orders: eff("O2", 1.0), ReverseOrders: eff("H2O", 1.0, "H2", 0.25)},
		{Equation: "", Reactants: one("H2O2", "H"), Products: one("HO2", "H2"), Reversible: true,
			Form: chem.Elementary, Rate: arr(6.05e6, 2, 2, 5200)},
		{Equation: "H + OH + M <=> H2O + M", Reactants: one("H", "OH"), Products: one("H2O"), Reversible: true,
			Form: chem.ThreeBody, Rate: arr(2.2e22, 3, -2, 0), ThirdBody: &chem.ThirdBody{Default: 1, Efficiencies: eff("H2O", 3.65, "AR", 0.38)},
			ReverseRate: &chem.Arrhenius{A: cgs(1.1e23, 2), B: -1.8, E: calToJ(118000)}},
		{Equation: "c4h8-1 + 2 O2 => 4 CO + 4 H2", Reactants: []chem.Participant{p(1, "c4h8-1"), p(2, "O2")},
			Products: []chem.Participant{p(4, "CO"), p(4, "H2")},
			Form:     chem.Elementary, Rate: arr(3.1e12, 2, 0, -1.5e3)},
	}
	// Uncertainty factors as review articles state them (values typical of
	// such reviews, not taken from one): exact numbers and a non-round one.
	rs[0].UncertaintyFactor = 1.5
	rs[5].UncertaintyFactor = 3.16
	rs[10].UncertaintyFactor = 1
	return &chem.Mechanism{
		Name: "hand-built test set",
		Validity: &chem.Validity{
			Fuels:            []string{"CH4", "H2"},
			Temperature:      [2]float64{300, 700},
			Pressure:         [2]float64{0.1 * atm, 12345.678}, // the second has no exact atm form
			EquivalenceRatio: [2]float64{0.5, 0},               // upper bound not stated
			Source:           "invented for this test; \"quotes\" kept",
		},
		Description: "Test mechanism for flame1d's TOML format.\n" +
			"Rates: typical published magnitudes, not a validated model.\n" +
			"Quotes ' \" and a backslash \\ and tabs\tkept.\n",
		Elements:  []string{"O", "H", "C", "N", "AR"},
		Species:   sp,
		Reactions: rs,
	}
}

func nan() float64 { return math.NaN() }
func inf() float64 { return math.Inf(1) }
