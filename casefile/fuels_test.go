package casefile

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/fuel"
	"flame1d/thermo"
)

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

const fuelsSrc = `mechanism = "lu2009-heptane"
[fuels.kero]
formula = "C11.4H22.23"
lower_heating_value = "43.2 MJ/kg"
mode = "pre-cracked"
[fuels.kero.cracking]
yields = { c2h4 = 2.6, ch4 = 0.8 }
balance = ["h2", "c2h2"]
scale_to_carbon = false
[fuels.ng]
composition = { CH4 = 0.9, C2H6 = 0.1 }
[fuels.syn]
h_to_c = 2.05
molar_mass = "165 g/mol"
higher_heating_value = 4.65e7
standard_entropy = "140 cal/mol/K"
[fuels.syn.cracking]
temperature = 1300
pressure = "10 bar"
[fuels.syn.global_step]
activation_energy = "60 kcal/mol"
cracking_time = "50 us"
at_temperature = "1027 C"
[fuels.syn.kinetic_theory]
lj_well_depth_K = 560
lj_diameter = "7.1 Å"
`

func TestParseFuels(t *testing.T) {
	ff, err := ParseFuels([]byte(fuelsSrc), "test.toml")
	if err != nil {
		t.Fatal(err)
	}
	mech, specs := ff.Mechanism, ff.Fuels
	if mech != "lu2009-heptane" || len(specs) != 3 || specs[0].Name != "kero" || specs[1].Name != "ng" || specs[2].Name != "syn" {
		t.Fatalf("mechanism %q, specs %+v", mech, specs)
	}
	k := specs[0]
	if k.Mode != fuel.ModePreCracked || k.Cracking.ScaleToCarbon == nil || *k.Cracking.ScaleToCarbon || len(k.Cracking.Balance) != 2 ||
		k.LowerHeatingValue != 43.2e6 || k.GlobalStep.Given() || k.Transport != nil {
		t.Errorf("kero decoded as %+v", k)
	}
	// Every quantity in SI: bare numbers as they are, units converted
	// (thermochemical calorie 4.184 J; 1 Å = 1e-10 m; 1027 °C = 1300.15 K).
	s := specs[2]
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"higher_heating_value", s.HigherHeatingValue, 4.65e7},
		{"molar_mass", s.MolarMass, 0.165},
		{"standard_entropy", s.StandardEntropy, 140 * 4.184},
		{"cracking.temperature", s.Cracking.Temperature, 1300},
		{"cracking.pressure", s.Cracking.Pressure, 1e6},
		{"global_step.activation_energy", *s.GlobalStep.ActivationEnergy, 60 * 4184},
		{"global_step.cracking_time", s.GlobalStep.CrackingTime, 50e-6},
		{"global_step.at_temperature", s.GlobalStep.AtTemperature, 1300.15},
		{"kinetic_theory.lj_diameter", s.Transport.Diameter, 7.1e-10},
		{"kinetic_theory.lj_well_depth_K", s.Transport.WellDepth, 560},
	} {
		if relErr(c.got, c.want) > 1e-14 {
			t.Errorf("%s = %.17g, want %.17g", c.name, c.got, c.want)
		}
	}
	f, err := s.MeanFormula()
	if err != nil || relErr(f.HToC(), 2.05) > 1e-14 || relErr(f.MolarMass(), 0.165) > 1e-14 {
		t.Errorf("syn formula %v, %v", f, err)
	}
	if !specs[0].IsPool() || specs[1].IsPool() {
		t.Error("IsPool wrong")
	}
}

func TestParseFuelsErrors(t *testing.T) {
	for _, c := range []struct {
		name, from, to, want string
	}{
		{"misspelt key", "balance =", "balanse =", "test.toml:8: fuels.kero.cracking.balanse: unknown key"},
		{"unknown unit", `"165 g/mol"`, `"165 g"`, "test.toml:14: fuels.syn.molar_mass: \"165 g\": unknown molar mass unit"},
		{"energy per mass as per mole", `"60 kcal/mol"`, `"60 MJ/kg"`, "test.toml:21: fuels.syn.global_step.activation_energy"},
		{"bare diameter", `"7.1 Å"`, `7.1`, "test.toml:26: fuels.syn.kinetic_theory.lj_diameter: a bare number is metres"},
		{"bare diameter string", `"7.1 Å"`, `"7.1"`, "fuels.syn.kinetic_theory.lj_diameter: a bare number is metres"},
		{"syntax", `mode = "pre-cracked"`, `mode = "pre-cracked`, "test.toml:5: TOML syntax"},
	} {
		src := strings.Replace(fuelsSrc, c.from, c.to, 1)
		if src == fuelsSrc {
			t.Fatalf("%s: %q not in the sample", c.name, c.from)
		}
		if _, err := ParseFuels([]byte(src), "test.toml"); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want %q", c.name, err, c.want)
		}
	}
	if _, err := ParseFuels([]byte("title = 1\n"), "empty.toml"); err == nil || !strings.Contains(err.Error(), "no fuels") {
		t.Errorf("file without fuels: err = %v", err)
	}
}

// The case file reads the same [fuels] tables in SI.
func TestCaseFuelsInSI(t *testing.T) {
	src := "[mixture]\nfuel = \"syn\"\nequivalence_ratio = 1\n" + strings.SplitN(fuelsSrc, "\n", 2)[1]
	c, err := Parse([]byte(src), "c.toml")
	if err != nil {
		t.Fatal(err)
	}
	if c.Fuel.Name != "syn" || c.Fuel.MolarMass != 0.165 || len(c.Fuels) != 3 {
		t.Errorf("fuel %+v, %d fuels", c.Fuel, len(c.Fuels))
	}
	// A case file read as a fuel file carries its [mixture] conditions.
	ff, err := ParseFuels([]byte(strings.Replace(src, "[mixture]", "[mixture]\ntemperature = \"400 K\"\noxidizer = { O2 = 1, N2 = 3 }", 1)), "c.toml")
	if err != nil || ff.Temperature != 400 || ff.EquivalenceRatio != 1 || ff.Oxidizer["O2"] != 0.25 || len(ff.Fuels) != 3 {
		t.Errorf("case as fuel file: %+v, %v", ff, err)
	}
	if ff, err := ParseFuels([]byte(fuelsSrc), "f.toml"); err != nil || ff.Temperature != 0 || ff.Oxidizer != nil {
		t.Errorf("fuel file without [mixture]: %+v, %v", ff, err)
	}
	bad := strings.Replace(src, `"10 bar"`, `"10 barr"`, 1)
	if _, err := Parse([]byte(bad), "c.toml"); err == nil || !strings.Contains(err.Error(), "fuels.syn.cracking.pressure") {
		t.Errorf("bad unit in a case's fuel: err = %v", err)
	}
}

const studySrc = `[study]
title = "t"
mechanism = "lu2009-heptane"
fuel = "syn"
temperature = "1300 K"
pressure = "10 bar"
[[study.steps]]
label = "all"
[[study.steps]]
exclude = ["c2h2"]
max_carbon = 2
[fuels.syn]
h_to_c = 2.08
molar_mass = "158 g/mol"
lower_heating_value = "43.9 MJ/kg"
`

func TestParseStudy(t *testing.T) {
	st, err := ParseStudy([]byte(studySrc), "s.toml")
	if err != nil {
		t.Fatal(err)
	}
	if st.Temperature != 1300 || st.Pressure != 1e6 || len(st.Steps) != 2 || st.Steps[1].MaxCarbon != 2 ||
		relErr(st.Formula.HToC(), 2.08) > 1e-14 || relErr(st.Formula.MolarMass(), 0.158) > 1e-14 {
		t.Errorf("study %+v", st)
	}
	own := strings.Replace(studySrc, `fuel = "syn"`, `formula = "C11H22"`, 1)
	if st, err := ParseStudy([]byte(own), "s.toml"); err != nil || st.Formula.C != 11 || st.Formula.H != 22 {
		t.Errorf("own formula: %+v, %v", st, err)
	}
	for _, c := range []struct{ from, to, want string }{
		{`fuel = "syn"`, `fuel = "jet"`, "s.toml:4: study.fuel: no [fuels.jet] table"},
		{`fuel = "syn"`, `fuel = "syn"` + "\nformula = \"C11H22\"", "give fuel (a name in [fuels]) or formula, not both"},
		{`fuel = "syn"`, ``, "name the fuel"},
		{`temperature = "1300 K"`, `temperature = "5000 K"`, "s.toml:5: study.temperature: 5000 K is outside 300-4000 K"},
		{`pressure = "10 bar"`, ``, "give temperature and pressure"},
		{`mechanism = "lu2009-heptane"`, ``, "give mechanism or extra_species"},
		{`max_carbon = 2`, `max_carbons = 2`, "s.toml:11: study.steps.max_carbons: unknown key"},
		{`molar_mass = "158 g/mol"`, `molar_mass = "158 g"`, "fuels.syn.molar_mass"},
	} {
		src := strings.Replace(studySrc, c.from, c.to, 1)
		if _, err := ParseStudy([]byte(src), "s.toml"); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q -> %q: err = %v, want %q", c.from, c.to, err, c.want)
		}
	}
	if _, err := ParseStudy([]byte("[fuels.x]\nformula = \"CH4\"\n"), "s.toml"); err == nil || !strings.Contains(err.Error(), "no [study] table") {
		t.Errorf("no study table: err = %v", err)
	}
}

// Study.Species reads extra species files relative to the study file,
// keeps the first definition of a repeated name and marks condensed ones.
func TestStudySpecies(t *testing.T) {
	dir := t.TempDir()
	base := []thermo.Species{{Name: "H2", Composition: map[string]float64{"H": 2}}}
	extra := filepath.Join(dir, "extra.toml")
	if err := os.WriteFile(extra, []byte("not = [valid"), 0o644); err != nil {
		t.Fatal(err)
	}
	st := &Study{File: filepath.Join(dir, "s.toml"), ExtraSpecies: []string{"extra.toml"}}
	if _, _, err := st.Species(base); err == nil || !strings.Contains(err.Error(), "study.extra_species extra.toml") {
		t.Errorf("broken extra file: err = %v", err)
	}
	st.ExtraSpecies = []string{"missing.dat"}
	if _, _, err := st.Species(base); err == nil || !strings.Contains(err.Error(), "missing.dat") {
		t.Errorf("missing extra file: err = %v", err)
	}
	st.ExtraSpecies, st.Condensed = nil, []string{"h2"}
	sp, _, err := st.Species(base)
	if err != nil || len(sp) != 1 || !sp[0].Condensed || base[0].Condensed {
		t.Errorf("condensed: %+v, %v (base %+v)", sp, err, base)
	}
	st.Condensed = []string{"CSOLID"}
	if _, _, err := st.Species(base); err == nil || !strings.Contains(err.Error(), `no species "CSOLID"`) {
		t.Errorf("unknown condensed species: err = %v", err)
	}
}
