package mechtoml

import (
	"errors"
	"math"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
)

// tinyHeader is a small hand-written mechanism head: units, elements and
// H2/O2/N2 species (polynomials from GRI-Mech 3.0, thermo30.dat, Smith et
// al. 1999, for H, H2, O, O2, OH, H2O, HO2, N2, AR).
const tinyHeader = `# A hand-written test mechanism.
format_version = 1
name = "tiny"
elements = ["O", "H", "N", "AR"]

[default_units]
activation_energy = "cal/mol"
concentration = "mol/cm^3"
pressure = "atm"

[[species]]
name = "H"
atoms = {H = 1}
[species.nasa7]
T_range_K = [200, 1000, 3500]
low_T_coefficients = [2.5, 7.05332819e-13, -1.99591964e-15, 2.30081632e-18, -9.27732332e-22, 25473.6599, -0.446682853]
high_T_coefficients = [2.50000001, -2.30842973e-11, 1.61561948e-14, -4.73515235e-18, 4.98197357e-22, 25473.6599, -0.446682914]

[[species]]
name = "H2"
atoms = {H = 2}
kinetic_theory = {structure = "linear", lj_well_depth_K = 38, lj_diameter_angstrom = 2.92, polarizability_angstrom3 = 0.79, rotational_collision_number_298K = 280}
[species.nasa7]
T_range_K = [200, 1000, 3500]
low_T_coefficients = [2.34433112, 0.00798052075, -1.9478151e-05, 2.01572094e-08, -7.37611761e-12, -917.935173, 0.683010238]
high_T_coefficients = [3.3372792, -4.94024731e-05, 4.99456778e-07, -1.79566394e-10, 2.00255376e-14, -950.158922, -3.20502331]

[[species]]
name = "O"
atoms = {O = 1}
[species.nasa7]
T_range_K = [200, 1000, 3500]
low_T_coefficients = [3.1682671, -0.00327931884, 6.64306396e-06, -6.12806624e-09, 2.11265971e-12, 29122.2592, 2.05193346]
high_T_coefficients = [2.56942078, -8.59741137e-05, 4.19484589e-08, -1.00177799e-11, 1.22833691e-15, 29217.5791, 4.78433864]

[[species]]
name = "O2"
atoms = {O = 2}
[species.nasa7]
T_range_K = [200, 1000, 3500]
low_T_coefficients = [3.78245636, -0.00299673416, 9.84730201e-06, -9.68129509e-09, 3.24372837e-12, -1063.94356, 3.65767573]
high_T_coefficients = [3.28253784, 0.00148308754, -7.57966669e-07, 2.09470555e-10, -2.16717794e-14, -1088.45772, 5.45323129]

[[species]]
name = "OH"
atoms = {O = 1, H = 1}
[species.nasa7]
T_range_K = [200, 1000, 3500]
low_T_coefficients = [3.99201543, -0.00240131752, 4.61793841e-06, -3.88113333e-09, 1.3641147e-12, 3615.08056, -0.103925458]
high_T_coefficients = [3.09288767, 0.000548429716, 1.26505228e-07, -8.79461556e-11, 1.17412376e-14, 3858.657, 4.4766961]

[[species]]
name = "H2O"
atoms = {H = 2, O = 1}
[species.nasa7]
T_range_K = [200, 1000, 3500]
low_T_coefficients = [4.19864056, -0.0020364341, 6.52040211e-06, -5.48797062e-09, 1.77197817e-12, -30293.7267, -0.849032208]
high_T_coefficients = [3.03399249, 0.00217691804, -1.64072518e-07, -9.7041987e-11, 1.68200992e-14, -30004.2971, 4.9667701]

[[species]]
name = "HO2"
atoms = {H = 1, O = 2}
[species.nasa7]
T_range_K = [200, 1000, 3500]
low_T_coefficients = [4.30179801, -0.00474912051, 2.11582891e-05, -2.42763894e-08, 9.29225124e-12, 294.80804, 3.71666245]
high_T_coefficients = [4.0172109, 0.00223982013, -6.3365815e-07, 1.1424637e-10, -1.07908535e-14, 111.856713, 3.78510215]

[[species]]
name = "N2"
atoms = {N = 2}
[species.nasa7]
T_range_K = [300, 1000, 5000]
low_T_coefficients = [3.298677, 0.0014082404, -3.963222e-06, 5.641515e-09, -2.444854e-12, -1020.8999, 3.950372]
high_T_coefficients = [2.92664, 0.0014879768, -5.68476e-07, 1.0097038e-10, -6.753351e-15, -922.7977, 5.980528]

[[species]]
name = "AR"
atoms = {AR = 1}
[species.nasa7]
T_range_K = [300, 1000, 5000]
low_T_coefficients = [2.5, 0, 0, 0, 0, -745.375, 4.366]
high_T_coefficients = [2.5, 0, 0, 0, 0, -745.375, 4.366]
`

// tinyReactions are three steps in the H2/O2 system, rates from GRI-Mech
// 3.0 (grimech30.dat, reactions 38, 33 and 1).
const tinyReactions = `
[[reaction]]
equation = "H + O2 <=> O + OH"
arrhenius = {pre_exponential = 2.65e16, temperature_exponent = -0.6707, activation_energy = 17041}

[[reaction]]
equation = "H + O2 (+M) <=> HO2 (+M)"
collision_efficiencies = {O2 = 0, H2O = 11, N2 = 0, AR = 0}
[reaction.falloff]
low_pressure_limit = {pre_exponential = 6.366e20, temperature_exponent = -1.72, activation_energy = 524.8}
high_pressure_limit = {pre_exponential = 4.65084e12, temperature_exponent = 0.44, activation_energy = 0}
troe_broadening = {alpha = 0.5, T_triple_star_K = 1e-30, T_single_star_K = 1e30}

[[reaction]]
equation = "2O+M<=>O2+M"
arrhenius = {pre_exponential = 1.2e17, temperature_exponent = -1, activation_energy = 0}
collision_efficiencies = {H2 = 2.4, H2O = 15.4, AR = 0.83}
`

func readString(t *testing.T, text string) (*chem.Mechanism, []chem.Problem, error) {
	t.Helper()
	return Read(strings.NewReader(text), "hand.toml")
}

// TestReadHandWritten reads a file as a chemist writes it and checks the SI
// values against the unit definitions: 1 cal = 4.184 J (NIST SP 811, 2008,
// B.8), 1 cm^3 = 1e-6 m^3, 1 Å = 1e-10 m.
func TestReadHandWritten(t *testing.T) {
	m, problems, err := readString(t, tinyHeader+tinyReactions)
	if err != nil {
		t.Fatalf("%v", err)
	}
	for _, p := range problems {
		t.Logf("%s", p)
	}
	if len(m.Species) != 9 || len(m.Reactions) != 3 {
		t.Fatalf("read %d species, %d reactions; want 9, 3", len(m.Species), len(m.Reactions))
	}
	r := m.Reactions[0]
	if r.Form != chem.Elementary || !close(r.Rate.A, 2.65e16*1e-6, 1e-15) || r.Rate.B != -0.6707 || !close(r.Rate.E, 17041*4.184, 1e-15) {
		t.Errorf("H + O2 <=> O + OH read as %+v", r.Rate)
	}
	f := m.Reactions[1]
	if f.Form != chem.Falloff || f.ThirdBody.Default != 1 || f.ThirdBody.Efficiencies[m.SpeciesIndex("H2O")] != 11 ||
		!close(f.FalloffRate.Low.A, 6.366e20*1e-12, 1e-15) || !close(f.FalloffRate.High.A, 4.65084e12*1e-6, 1e-15) ||
		f.FalloffRate.Troe == nil || f.FalloffRate.Troe.HasT2 || f.FalloffRate.Troe.T1 != 1e30 {
		t.Errorf("falloff step read as %s", describe(&f))
	}
	tb := m.Reactions[2]
	if tb.Form != chem.ThreeBody || len(tb.Reactants) != 1 || tb.Reactants[0].Coefficient != 2 ||
		!close(tb.Rate.A, 1.2e17*1e-12, 1e-15) || len(tb.ThirdBody.Efficiencies) != 3 {
		t.Errorf("2O+M<=>O2+M read as %s", describe(&tb))
	}
	h2 := m.Species[1]
	if h2.Transport == nil || h2.Transport.Geometry != chem.Linear || !close(h2.Transport.Diameter, 2.92e-10, 1e-15) ||
		!close(h2.Transport.Polarizability, 0.79e-30, 1e-15) || h2.Transport.RotRelaxation != 280 {
		t.Errorf("H2 transport read as %+v", h2.Transport)
	}
	// Origins point at the [[species]] / [[reaction]] headers.
	if o := m.Species[0].Origin; o.File != "hand.toml" || o.Line != textLine(tinyHeader, `name = "H"`)-1 {
		t.Errorf("H origin %+v", o)
	}
	if o := m.Reactions[1].Origin; o.Line != textLine(tinyHeader+tinyReactions, `equation = "H + O2 (+M)`)-1 {
		t.Errorf("reaction 2 origin %+v", o)
	}
}

func close(a, b, rel float64) bool { return math.Abs(a-b) <= rel*math.Abs(b) }

// textLine is the 1-based line of the first line containing s.
func textLine(text, s string) int {
	for i, l := range strings.Split(text, "\n") {
		if strings.Contains(l, s) {
			return i + 1
		}
	}
	return -1
}

// TestPerValueUnits: values may carry their own unit; each converts to SI
// by the unit's definition. Sources: NIST SP 811 (2008) appendix B.8 for
// cal, atm, Torr; SI Brochure, 9th ed. (2019), for N_A = 6.02214076e23/mol
// and R = 8.314462618 J/(mol K); debye = 1e-21/c C m by definition.
func TestPerValueUnits(t *testing.T) {
	const R = thermo.GasConstant
	cases := []struct {
		name  string
		value string // the rate line of reaction 1 (order 2, products order 2)
		pick  func(m *chem.Mechanism) float64
		want  float64
	}{
		{"kcal/mol", `arrhenius = {pre_exponential = 1, temperature_exponent = 0, activation_energy = "35 kcal/mol"}`, func(m *chem.Mechanism) float64 { return m.Reactions[0].Rate.E }, 35 * 4184},
		{"kJ/mol", `arrhenius = {pre_exponential = 1, temperature_exponent = 0, activation_energy = "146.44 kJ/mol"}`, func(m *chem.Mechanism) float64 { return m.Reactions[0].Rate.E }, 146440},
		{"J/mol", `arrhenius = {pre_exponential = 1, temperature_exponent = 0, activation_energy = "146440 J/mol"}`, func(m *chem.Mechanism) float64 { return m.Reactions[0].Rate.E }, 146440},
		{"K", `arrhenius = {pre_exponential = 1, temperature_exponent = 0, activation_energy = "10000 K"}`, func(m *chem.Mechanism) float64 { return m.Reactions[0].Rate.E }, 10000 * R},
		{"cm^3/mol/s", `arrhenius = {pre_exponential = "2.65e16 cm^3/mol/s", temperature_exponent = 0, activation_energy = 0}`, func(m *chem.Mechanism) float64 { return m.Reactions[0].Rate.A }, 2.65e10},
		{"m^3/mol/s", `arrhenius = {pre_exponential = "2.65e10 m^3/mol/s", temperature_exponent = 0, activation_energy = 0}`, func(m *chem.Mechanism) float64 { return m.Reactions[0].Rate.A }, 2.65e10},
		{"cm3/(mol s)", `arrhenius = {pre_exponential = "2.65e16 cm3/(mol s)", temperature_exponent = 0, activation_energy = 0}`, func(m *chem.Mechanism) float64 { return m.Reactions[0].Rate.A }, 2.65e10},
		// 1e-10 cm^3/molecule/s = 1e-16 m^3 * 6.02214076e23 /mol/s.
		{"cm^3/molecule/s", `arrhenius = {pre_exponential = "1e-10 cm^3/molecule/s", temperature_exponent = 0, activation_energy = 0}`, func(m *chem.Mechanism) float64 { return m.Reactions[0].Rate.A }, 6.02214076e7},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			text := tinyHeader + "\n[[reaction]]\nequation = \"H + O2 <=> O + OH\"\n" + c.value + "\n"
			m, _, err := readString(t, text)
			if err != nil {
				t.Fatal(err)
			}
			if got := c.pick(m); !close(got, c.want, 1e-14) {
				t.Errorf("got %.17g, want %.17g", got, c.want)
			}
		})
	}
	// Transport values under their SI keys, pressures with their own units.
	text := strings.Replace(tinyHeader, `kinetic_theory = {structure = "linear", lj_well_depth_K = 38, lj_diameter_angstrom = 2.92, polarizability_angstrom3 = 0.79, rotational_collision_number_298K = 280}`,
		`kinetic_theory = {structure = "linear", lj_well_depth_K = 38, lj_diameter_m = 2.92e-10, dipole_moment_C_m = 3.3356409519815204e-30, polarizability_m3 = 0.79e-30}`, 1) +
		"\n[[reaction]]\nequation = \"H + O2 <=> O + OH\"\npressure_table = [{pressure = \"1 bar\", pre_exponential = 2, temperature_exponent = 0, activation_energy = 0}, {pressure = \"760 Torr\", pre_exponential = 1, temperature_exponent = 0, activation_energy = 0}, {pressure = \"0.2 MPa\", pre_exponential = 3, temperature_exponent = 0, activation_energy = 0}]\n"
	m, _, err := readString(t, text)
	if err != nil {
		t.Fatal(err)
	}
	tp := m.Species[1].Transport
	if tp.Diameter != 2.92e-10 || tp.Dipole != 3.3356409519815204e-30 || tp.Polarizability != 0.79e-30 || tp.WellDepth != 38 {
		t.Errorf("transport with units read as %+v", tp)
	}
	pr := m.Reactions[0].PressureRates
	if pr[0].P != 1e5 || !close(pr[1].P, 101325, 1e-15) || pr[2].P != 2e5 {
		t.Errorf("pressures read as %v %v %v, want 1e5, 101325, 2e5 Pa", pr[0].P, pr[1].P, pr[2].P)
	}
}

// TestBrokenInput: every defect is a clear error naming the file and line.
func TestBrokenInput(t *testing.T) {
	good := tinyHeader + tinyReactions
	replace := func(old, new string) string {
		if !strings.Contains(good, old) {
			t.Fatalf("test setup: %q not in the good file", old)
		}
		return strings.Replace(good, old, new, 1)
	}
	cases := []struct {
		name   string
		text   string
		want   string // in the error message
		atLine string // the error is on the first line containing this, or, with a leading "^", on the line before it (a [[...]] header)
	}{
		{"unknown top-level key", replace(`name = "tiny"`, "name = \"tiny\"\nauthor = \"me\""), `unknown key "author"`, "author ="},
		{"unknown key in falloff", replace(`troe_broadening = {alpha`, `troe = {alpha`), `unknown key "troe" in reaction[2].falloff`, "troe = {alpha"},
		{"unknown key in inline table", replace("activation_energy = 0}\ncollision_efficiencies = {H2", "activation_energy = 0, Ea = 0}\ncollision_efficiencies = {H2"), `unknown key "Ea"`, "Ea = 0"},
		{"old key name", replace(`arrhenius = {pre_exponential = 1.2e17, temperature_exponent = -1, activation_energy = 0}`, `rate = {A = 1.2e17, b = -1, E = 0}`), `unknown key "rate"`, "rate = {A"},
		{"unknown species in equation", replace(`equation = "H + O2 <=> O + OH"`, `equation = "H + O3 <=> O + OH"`), `unknown species "O3"`, "O3"},
		{"unbalanced reaction", replace(`equation = "H + O2 <=> O + OH"`, `equation = "H + O2 <=> O + H2O"`), "not element-balanced", "^O + H2O"},
		{"missing thermo", replace("name = \"O\"\natoms = {O = 1}\n[species.nasa7]", "name = \"O\"\natoms = {O = 1}\n[species.stuff]"), "no thermo data", `^name = "O"`},
		{"bad number", replace(`temperature_exponent = -0.6707`, `temperature_exponent = "-0.67o7"`), `"-0.67o7" is not a number followed by a unit`, "0.67o7"},
		{"bad number with unit", replace(`activation_energy = 17041}`, `activation_energy = "17O41 cal/mol"}`), `"17O41" is not a number`, "17O41"},
		{"wrong type", replace("T_range_K = [200, 1000, 3500]\nlow_T_coefficients = [3.1682671", "T_range_K = \"200 1000 3500\"\nlow_T_coefficients = [3.1682671"), "T_range_K must be an array, not a string", `T_range_K = "200`},
		{"wrong type for name", replace(`name = "OH"`, `name = 7`), "name must be a string, not an integer", "name = 7"},
		{"TOML syntax", replace(`arrhenius = {pre_exponential = 2.65e16`, `arrhenius = {pre_exponential = 2.65e16,,`), "not valid TOML", "2.65e16,,"},
		{"not finite", replace(`pre_exponential = 2.65e16`, `pre_exponential = nan`), "must be finite", "pre_exponential = nan"},
		{"no concentration unit", replace(`concentration = "mol/cm^3"`, ``), "no concentration unit", `pre_exponential = 2.65e16`},
		{"bad concentration unit", replace(`concentration = "mol/cm^3"`, `concentration = "mol/cm3"`), `default_units.concentration = "mol/cm3" is not one of`, `concentration = "mol/cm3"`},
		{"unit of wrong order", replace(`pre_exponential = 1.2e17,`, `pre_exponential = "1.2e17 cm^3/mol/s",`), "does not fit a rate constant of overall order 3 (expected cm^6/mol^2/s)", "1.2e17 cm^3"},
		{"unknown energy unit", replace(`activation_energy = 17041}`, `activation_energy = "17041 kcal"}`), `unknown energy unit "kcal"`, "17041 kcal"},
		{"troe and sri", replace(`troe_broadening = {alpha = 0.5, T_triple_star_K = 1e-30, T_single_star_K = 1e30}`, "troe_broadening = {alpha = 0.5, T_triple_star_K = 1e-30, T_single_star_K = 1e30}\nsri_broadening = {a = 1, b_K = 2, c_K = 3}"), "troe_broadening or sri_broadening, not both", "[reaction.falloff]"},
		{"not marked duplicate", good + "\n[[reaction]]\nequation = \"O + OH <=> H + O2\"\narrhenius = {pre_exponential = 1, temperature_exponent = 0, activation_energy = 0}\n", "not marked duplicate", `^equation = "O + OH <=> H + O2"`},
		{"efficiencies without M", replace("arrhenius = {pre_exponential = 2.65e16, temperature_exponent = -0.6707, activation_energy = 17041}", "arrhenius = {pre_exponential = 2.65e16, temperature_exponent = -0.6707, activation_energy = 17041}\ncollision_efficiencies = {H2O = 2}"), "no third body M", "collision_efficiencies = {H2O = 2}"},
		{"collider on one side", replace(`"H + O2 (+M) <=> HO2 (+M)"`, `"H + O2 (+M) <=> HO2"`), "on both sides", `"H + O2 (+M) <=> HO2"`},
		{"no arrow", replace(`"H + O2 <=> O + OH"`, `"H + O2 -> O + OH"`), "no arrow", `-> O + OH`},
		{"reverse rate on irreversible", replace("equation = \"H + O2 <=> O + OH\"\narrhenius = {pre_exponential = 2.65e16, temperature_exponent = -0.6707, activation_energy = 17041}",
			"equation = \"H + O2 => O + OH\"\narrhenius = {pre_exponential = 2.65e16, temperature_exponent = -0.6707, activation_energy = 17041}\nreverse_arrhenius = {pre_exponential = 1, temperature_exponent = 0, activation_energy = 0}"), "irreversible", "reverse_arrhenius ="},
		{"pressure table unsorted", replace("arrhenius = {pre_exponential = 2.65e16, temperature_exponent = -0.6707, activation_energy = 17041}",
			"pressure_table = [\n  {pressure = 10, pre_exponential = 1, temperature_exponent = 0, activation_energy = 0},\n  {pressure = 1, pre_exponential = 1, temperature_exponent = 0, activation_energy = 0},\n]"), "rising pressure", "{pressure = 1, pre"},
		{"format version", replace("format_version = 1", "format_version = 2"), "format_version = 2 is not supported", "format_version = 2"},
		{"blank in species name", replace(`name = "HO2"`, `name = "HO 2"`), "without blanks", `name = "HO 2"`},
		{"efficiency of unknown species", replace(`H2 = 2.4, H2O = 15.4`, `H2 = 2.4, CO2 = 3.8`), `unknown species "CO2"`, "CO2 = 3.8"},
		{"two rates", replace("arrhenius = {pre_exponential = 1.2e17, temperature_exponent = -1, activation_energy = 0}", "arrhenius = {pre_exponential = 1.2e17, temperature_exponent = -1, activation_energy = 0}\nchebyshev = {}"), "more than one rate", `^equation = "2O+M`},
		{"no rate", replace("arrhenius = {pre_exponential = 1.2e17, temperature_exponent = -1, activation_energy = 0}\n", ""), "no rate", `^equation = "2O+M`},
		{"missing activation energy", replace("arrhenius = {pre_exponential = 1.2e17, temperature_exponent = -1, activation_energy = 0}", "arrhenius = {pre_exponential = 1.2e17, temperature_exponent = -1}"), "arrhenius has no activation_energy", "arrhenius = {pre_exponential = 1.2e17"},
		{"bad structure", replace(`structure = "linear"`, `structure = "bent"`), `structure = "bent"`, `structure = "bent"`},
		{"unit on a unit-in-key value", replace(`lj_diameter_angstrom = 2.92`, `lj_diameter_angstrom = "2.92 A"`), `lj_diameter_angstrom: write a plain number without a unit ("A")`, "lj_diameter_angstrom = \"2.92 A\""},
		{"diameter twice", replace(`lj_diameter_angstrom = 2.92`, `lj_diameter_angstrom = 2.92, lj_diameter_m = 2.92e-10`), "not both", "lj_diameter_m"},
		{"no diameter", replace(`lj_diameter_angstrom = 2.92, `, ``), "no lj_diameter_angstrom (or lj_diameter_m)", "structure = \"linear\""},
		{"uncertainty below 1", replace("activation_energy = 17041}", "activation_energy = 17041}\nrate_uncertainty_factor = 0.5"), "must be at least 1", "rate_uncertainty_factor = 0.5"},
		{"uncertainty not a number", replace("activation_energy = 17041}", "activation_energy = 17041}\nrate_uncertainty_factor = \"x2\""), "rate_uncertainty_factor", "rate_uncertainty_factor = \"x2\""},
		{"validity fuel unknown", replace("[[species]]\nname = \"H\"\n", "[validity]\nfuels = [\"H2\", \"CH4\"]\n\n[[species]]\nname = \"H\"\n"), `validity fuel "CH4" is not a species`, `fuels = ["H2", "CH4"]`},
		{"validity fuel twice", replace("[[species]]\nname = \"H\"\n", "[validity]\nfuels = [\"H2\", \"H2\"]\n\n[[species]]\nname = \"H\"\n"), `listed twice`, `fuels = ["H2", "H2"]`},
		{"validity range reversed", replace("[[species]]\nname = \"H\"\n", "[validity]\nunburned_temperature_range_K = [700, 300]\n\n[[species]]\nname = \"H\"\n"), "low first", "unburned_temperature_range_K = [700"},
		{"validity pressure negative", replace("[[species]]\nname = \"H\"\n", "[validity]\npressure_range = [-1, 10]\n\n[[species]]\nname = \"H\"\n"), "must not be negative", "pressure_range = [-1"},
		{"validity phi not two numbers", replace("[[species]]\nname = \"H\"\n", "[validity]\nequivalence_ratio_range = [0.5]\n\n[[species]]\nname = \"H\"\n"), "must hold 2 numbers", "equivalence_ratio_range = [0.5]"},
		{"validity unknown key", replace("[[species]]\nname = \"H\"\n", "[validity]\nfuel = [\"H2\"]\n\n[[species]]\nname = \"H\"\n"), `unknown key "fuel" in validity`, `fuel = ["H2"]`},
		{"nasa7 wrong length", replace("low_T_coefficients = [2.5, 7.05332819e-13, -1.99591964e-15, 2.30081632e-18, -9.27732332e-22, 25473.6599, -0.446682853]",
			"low_T_coefficients = [2.5, 7.05332819e-13, -1.99591964e-15, 2.30081632e-18, -9.27732332e-22, 25473.6599]"), "low_T_coefficients must hold 7 numbers, not 6", "low_T_coefficients = [2.5, 7.05332819e-13"},
		{"T_range not rising", replace("T_range_K = [200, 1000, 3500]\nlow_T_coefficients = [3.1682671", "T_range_K = [200, 3500, 1000]\nlow_T_coefficients = [3.1682671"), "T_range_K must rise", "T_range_K = [200, 3500, 1000]"},
		{"undeclared element", replace(`atoms = {AR = 1}`, `atoms = {AR = 1, XE = 0}`), `element "XE", which is not declared`, `^name = "AR"`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m, problems, err := readString(t, c.text)
			if err == nil || m != nil {
				t.Fatalf("read succeeded (m=%v, err=%v); want an error containing %q", m != nil, err, c.want)
			}
			wantLine := 0
			if at, before := strings.CutPrefix(c.atLine, "^"); before {
				wantLine = textLine(c.text, at) - 1
			} else {
				wantLine = textLine(c.text, at)
			}
			// The problem with the message, at the line if there is one
			// there (a repeated equation is reported at both steps).
			var found *chem.Problem
			for i := range problems {
				p := &problems[i]
				if !p.Warning && strings.Contains(p.Message, c.want) && (found == nil || p.Pos.Line == wantLine) {
					found = p
				}
			}
			if found == nil {
				t.Fatalf("no error containing %q; got:\n%v", c.want, err)
			}
			if !strings.Contains(err.Error(), c.want) {
				t.Errorf("returned error does not carry the problem: %v", err)
			}
			if found.Pos.File != "hand.toml" || found.Pos.Line != wantLine {
				t.Errorf("error at %s:%d, want hand.toml:%d (%q): %s", found.Pos.File, found.Pos.Line, wantLine, c.atLine, found.Message)
			}
		})
	}
}

// TestAllProblemsInOrder: one read reports every defect it finds, in file
// order, not just the first.
func TestAllProblemsInOrder(t *testing.T) {
	text := strings.Replace(tinyHeader+tinyReactions, `troe_broadening = {alpha`, `trow = {alpha`, 1)
	text = strings.Replace(text, `name = "tiny"`, "name = \"tiny\"\ncolour = \"blue\"", 1)
	text = strings.Replace(text, `equation = "2O+M<=>O2+M"`, `equation = "2O+M<=>O3+M"`, 1)
	_, problems, err := readString(t, text)
	if err == nil {
		t.Fatal("read succeeded")
	}
	want := []string{`unknown key "colour"`, `unknown key "trow"`, `unknown species "O3"`}
	if len(problems) != len(want) {
		t.Fatalf("%d problems, want %d: %v", len(problems), len(want), problems)
	}
	for i, w := range want {
		if !strings.Contains(problems[i].Message, w) {
			t.Errorf("problem %d = %s, want %q", i+1, problems[i], w)
		}
		if i > 0 && problems[i].Pos.Line <= problems[i-1].Pos.Line {
			t.Errorf("problems not in file order: %v", problems)
		}
	}
}

type failingReader struct{}

func (failingReader) Read([]byte) (int, error) { return 0, errors.New("disk on fire") }

// TestReadFailure: an I/O error is returned as such, wrapped with the file.
func TestReadFailure(t *testing.T) {
	m, problems, err := Read(failingReader{}, "x.toml")
	if m != nil || problems != nil || err == nil || !strings.Contains(err.Error(), "x.toml") || !strings.Contains(err.Error(), "disk on fire") {
		t.Errorf("Read = %v, %v, %v", m, problems, err)
	}
	if _, _, err := ReadFile("/nonexistent/mech.toml"); err == nil {
		t.Error("ReadFile of a missing file succeeded")
	}
}
