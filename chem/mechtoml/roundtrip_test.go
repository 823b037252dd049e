package mechtoml

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/chem"
)

// TestHandBuiltValidates guards the test data itself: the mechanism used for
// round trips passes chem's validation (balanced, duplicates marked).
func TestHandBuiltValidates(t *testing.T) {
	if problems, err := handBuilt().Validate(); err != nil {
		t.Fatalf("hand-built mechanism invalid: %v %v", err, problems)
	}
}

// TestRoundTripExact: Write then Read gives back every field of a mechanism
// with every reaction form, bit for bit (a conservation law of the format:
// nothing is lost or rounded).
func TestRoundTripExact(t *testing.T) {
	want := handBuilt()
	got, text := roundTrip(t, handBuilt())
	// The one documented change: a reaction without equation text gets the
	// canonical equation.
	for i := range want.Reactions {
		if want.Reactions[i].Equation == "" {
			want.Reactions[i].Equation = "H2O2 + H <=> HO2 + H2"
		}
	}
	if d := Diff(want, got); d != "" {
		t.Fatalf("round trip changed the mechanism: %s\n%s", d, numbered(text))
	}
	// Writing what was read gives the same text (the writer is a function of
	// the model alone).
	var again bytes.Buffer
	if err := Write(&again, got); err != nil {
		t.Fatal(err)
	}
	if again.String() != text {
		t.Error("second write differs from the first")
	}
}

// TestWrittenUnits checks that the writer keeps the numbers of published
// sources (cal/mol, cm-mol-s, atm, Å, debye) where the conversion is
// exactly reversible, and falls back to SI with a unit where it is not.
func TestWrittenUnits(t *testing.T) {
	_, text := roundTrip(t, handBuilt())
	for _, want := range []string{
		`equation = "H+O2<=>O+OH"`, // author's text kept
		`arrhenius = {pre_exponential = 2.65e+16, temperature_exponent = -0.6707, activation_energy = 17041}`, // cm^3/mol/s and cal/mol as published
		`arrhenius = {pre_exponential = 1.2e+17, temperature_exponent = -1, activation_energy = 0}`,           // termolecular: cm^6/mol^2/s
		`{pressure = 0.01, pre_exponential = 4.936e+14, temperature_exponent = -0.669, activation_energy = -445.8}`,
		`pressure = "12345.678 Pa"`,                // no exact atm form
		`activation_energy = "12345.678901 J/mol"`, // no exact cal/mol form
		`equation = "CH3 + OH <=> CH2(S) + H2O"`,   // canonical, since the author's (+M) is not a third body here
		`written_as = "CH3+OH(+M)=CH2(S)+H2O(+M)"`, // author's text kept beside it
		`equation = "H2O2 + H <=> HO2 + H2"`,       // filled in
		`{structure = "linear", lj_well_depth_K = 38, lj_diameter_angstrom = 2.92, polarizability_angstrom3 = 0.79, rotational_collision_number_298K = 280}`,
		`dipole_moment_debye = 1.844`,
		`lj_diameter_m = 2.605e-10`, // 2.605 Å has no exact image of 2.605e-10 m under q*1e-10
		`"CH2(S)" = 2`,
		`(+AR)`,
		`unlisted_collision_efficiency = 0`,
		`sri_broadening = {a = 0.45, b_K = 797, c_K = 979}`,
		`sri_broadening = {a = 1.1, b_K = 1200, c_K = 101, d = 1.2, e = -0.3}`,
		`troe_broadening = {alpha = 0.5, T_triple_star_K = 1e-30, T_single_star_K = 1e+30}`,
		`phase = "condensed"`,
		`[reaction.chemically_activated]`,
		`[reaction.chebyshev]`,
		"[8.684, 0.8, -0.1]", // log10 k in cm^3/mol/s, as an importer converted it
		"rate_constant_unit = \"m^3/mol/s\"\ncoefficients = [\n  [2.684],", // SI-born log10 k, kept in SI
		`pressure_range = ["0.01 bar", "100 bar"]`,                         // no brief exact atm form
		"rate_uncertainty_factor = 1.5\narrhenius",
		"rate_uncertainty_factor = 3.16\n",
		"[validity]\nfuels = [\"CH4\", \"H2\"]\nunburned_temperature_range_K = [300, 700]\npressure_range = [0.1, \"12345.678 Pa\"]\nequivalence_ratio_range = [0.5, 0]\n",
		`concentration_exponents = {O2 = 0.8, H2O = 0.1, CH4 = 0.7}`,
		`reverse_concentration_exponents = {H2 = 0.25, H2O = 1}`,
	} {
		if !strings.Contains(text, want) {
			t.Errorf("written file lacks %s", want)
		}
	}
	if t.Failed() {
		t.Log(numbered(text))
	}
}

// TestWriteFileAtomic: WriteFile leaves the finished file and no temporary
// beside it; ReadFile reads it back with Origins pointing into it.
func TestWriteFileAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "mech.toml")
	if err := WriteFile(path, handBuilt()); err != nil {
		t.Fatal(err)
	}
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	if len(entries) != 1 || entries[0].Name() != "mech.toml" {
		t.Errorf("directory holds %v, want only mech.toml", entries)
	}
	m, _, err := ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	text, _ := os.ReadFile(path)
	lines := strings.Split(string(text), "\n")
	for _, o := range []chem.Position{m.Species[3].Origin, m.Reactions[5].Origin} {
		if o.File != path || o.Line < 1 || o.Line > len(lines) {
			t.Fatalf("origin %+v not in %s", o, path)
		}
	}
	if l := lines[m.Species[3].Origin.Line-1]; l != "[[species]]" || lines[m.Species[3].Origin.Line] != `name = "O2"` {
		t.Errorf("species 4 origin line %d is %q, want the [[species]] header of O2", m.Species[3].Origin.Line, l)
	}
	if l := lines[m.Reactions[5].Origin.Line-1]; l != "[[reaction]]" || !strings.Contains(lines[m.Reactions[5].Origin.Line], "HO2 (+M)") {
		t.Errorf("reaction 6 origin line %d is %q, want the [[reaction]] header of H + O2 (+M)", m.Reactions[5].Origin.Line, l)
	}
	// A write into a missing directory fails and leaves nothing.
	if err := WriteFile(filepath.Join(dir, "no", "such.toml"), handBuilt()); err == nil {
		t.Error("WriteFile into a missing directory succeeded")
	}
}

// TestWriteRefusesLoss: data the format cannot carry is an error, never
// silently dropped.
func TestWriteRefusesLoss(t *testing.T) {
	cases := []struct {
		name   string
		change func(m *chem.Mechanism)
		want   string
	}{
		{"rate on falloff", func(m *chem.Mechanism) { m.Reactions[5].Rate.A = 1 }, "do not belong"},
		{"efficiencies on elementary", func(m *chem.Mechanism) { m.Reactions[0].ThirdBody = &chem.ThirdBody{Default: 1} }, "without a third body"},
		{"three-body without efficiencies", func(m *chem.Mechanism) { m.Reactions[3].ThirdBody = nil }, "without collision efficiencies"},
		{"NaN rate", func(m *chem.Mechanism) { m.Reactions[0].Rate.B = nan() }, "non-finite"},
		{"Inf thermo", func(m *chem.Mechanism) { m.Species[0].Thermo.Low[2] = inf() }, "non-finite"},
		{"bad geometry", func(m *chem.Mechanism) { m.Species[0].Transport.Geometry = 7 }, "geometry"},
		{"troe and sri", func(m *chem.Mechanism) { m.Reactions[5].FalloffRate.SRI = &chem.SRI{D: 1} }, "both Troe and SRI"},
		{"T2 without HasT2", func(m *chem.Mechanism) { m.Reactions[5].FalloffRate.Troe.T2 = 5 }, "HasT2"},
		{"bad utf8 name", func(m *chem.Mechanism) { m.Name = "\xff" }, "UTF-8"},
		{"ragged chebyshev", func(m *chem.Mechanism) { m.Reactions[11].ChebyshevRate.Coeffs[1] = []float64{1} }, "unequal"},
		{"repeated participant", func(m *chem.Mechanism) {
			m.Reactions[12].Products = []chem.Participant{{Species: 4, Coefficient: 1}, {Species: 4, Coefficient: 1}}
		}, "appears twice"},
		{"index out of range", func(m *chem.Mechanism) { m.Reactions[0].Reactants[0].Species = 99 }, "out of range"},
		{"uncertainty below 1", func(m *chem.Mechanism) { m.Reactions[0].UncertaintyFactor = 0.9 }, "uncertainty factor"},
		{"uncertainty NaN", func(m *chem.Mechanism) { m.Reactions[0].UncertaintyFactor = nan() }, "uncertainty factor"},
		{"validity fuel unknown", func(m *chem.Mechanism) { m.Validity.Fuels = []string{"C8H18"} }, "not a species"},
		{"validity range reversed", func(m *chem.Mechanism) { m.Validity.Temperature = [2]float64{700, 300} }, "[low, high]"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := handBuilt()
			c.change(m)
			err := Write(&bytes.Buffer{}, m)
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Fatalf("Write error = %v, want one containing %q", err, c.want)
			}
		})
	}
}

// TestDiff: the round-trip equality ignores only Origins and nil-vs-empty,
// and sees a change of one ulp anywhere else.
func TestDiff(t *testing.T) {
	same := []func(m *chem.Mechanism){
		func(m *chem.Mechanism) { m.Species[2].Origin = chem.Position{File: "x", Line: 9} },
		func(m *chem.Mechanism) { m.Reactions[0].Orders = map[int]float64{} },
		func(m *chem.Mechanism) { m.Reactions[7].ThirdBody.Efficiencies = map[int]float64{} },
	}
	for i, change := range same {
		m := handBuilt()
		change(m)
		if d := Diff(handBuilt(), m); d != "" {
			t.Errorf("change %d should not count: %s", i, d)
		}
	}
	ulp := func(x float64) float64 { return math.Nextafter(x, math.Inf(1)) }
	differ := []func(m *chem.Mechanism){
		func(m *chem.Mechanism) { m.Species[2].Thermo.High[6] = ulp(m.Species[2].Thermo.High[6]) },
		func(m *chem.Mechanism) { m.Species[0].Transport.Diameter = ulp(m.Species[0].Transport.Diameter) },
		func(m *chem.Mechanism) { m.Reactions[5].FalloffRate.Troe.A = ulp(0.5) },
		func(m *chem.Mechanism) { m.Reactions[3].ThirdBody.Efficiencies[1] = ulp(2.4) },
		func(m *chem.Mechanism) { m.Reactions[11].ChebyshevRate.Coeffs[2][1] = ulp(0.02) },
		func(m *chem.Mechanism) { m.Reactions[1].Duplicate = false },
		func(m *chem.Mechanism) { m.Description += " " },
	}
	for i, change := range differ {
		m := handBuilt()
		change(m)
		if d := Diff(handBuilt(), m); d == "" {
			t.Errorf("change %d not seen", i)
		}
	}
}

// A chemically activated step in cm-mol-s: k0 is bimolecular
// (1 cm^3/(mol s) = 1e-6 m^3/(mol s)) and k_inf unimolecular (1/s, no
// conversion), since P_r = k0 [M]/k_inf is dimensionless. The writer must
// show the published cgs numbers and read them back to the same SI values.
func TestChemicallyActivatedUnitOrders(t *testing.T) {
	m := &chem.Mechanism{Name: "ca", Elements: []string{"H", "O"}, Species: []chem.Species{
		gas("H", map[string]float64{"H": 1}, 2.5, nil), gas("O2", map[string]float64{"O": 2}, 3.5, nil),
		gas("OH", map[string]float64{"O": 1, "H": 1}, 3.5, nil), gas("O", map[string]float64{"O": 1}, 2.5, nil),
	}}
	m.Reactions = []chem.Reaction{{
		Equation: "H + O2 (+M) => OH + O (+M)", Form: chem.ChemicallyActivated,
		Reactants:   []chem.Participant{{Species: 0, Coefficient: 1}, {Species: 1, Coefficient: 1}},
		Products:    []chem.Participant{{Species: 2, Coefficient: 1}, {Species: 3, Coefficient: 1}},
		ThirdBody:   &chem.ThirdBody{Default: 1},
		FalloffRate: &chem.FalloffRate{Low: chem.Arrhenius{A: 2e7}, High: chem.Arrhenius{A: 5e9}},
	}}
	back, text := roundTrip(t, m)
	if !strings.Contains(text, "low_pressure_limit = {pre_exponential = 2e+13") || !strings.Contains(text, "high_pressure_limit = {pre_exponential = 5e+09") {
		t.Errorf("written limits not in cgs of the right order:\n%s", text)
	}
	if d := Diff(m, back); d != "" {
		t.Error(d)
	}
}
