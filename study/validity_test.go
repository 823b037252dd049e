package study

import (
	"errors"
	"strings"
	"testing"

	"flame1d/casefile"
	"flame1d/chem"
)

// Validity ranges made by hand for the test, shaped like published
// statements (the built-ins carry their real ones).
var (
	natgas = &chem.Validity{Fuels: []string{"CH4", "C2H6", "H2", "CO"}, Pressure: [2]float64{1333, 1013250}, EquivalenceRatio: [2]float64{0.1, 5}, Source: "natgas notes"}
	c1c3   = &chem.Validity{Fuels: []string{"CH4", "C2H4", "C2H6", "C3H6", "C3H8", "H2"}, Temperature: [2]float64{298, 700}, Pressure: [2]float64{50e3, 5e6}, Source: "c1c3 paper"}
)

// covering stands for builtin.Covering over the two hand-made ranges.
func covering(species []string) ([]string, error) {
	var out []string
	for name, v := range map[string]*chem.Validity{"c1c3": c1c3, "natgas": natgas} {
		if v.Outside(chem.FlameConditions{Species: species}) == nil {
			out = append(out, name)
		}
	}
	return out, nil
}

func TestValidityWarnings(t *testing.T) {
	air := []Condition{{Phi: 0.8, T: 298, P: 101325}, {Phi: 1.2, T: 298, P: 101325}}
	// Methane at ambient conditions lies inside: no warning, and no better
	// mechanism is sought.
	noLook := func([]string) ([]string, error) { return nil, errors.New("must not be called") }
	if w := validityWarnings("natgas", natgas, []string{"CH4"}, air, noLook); len(w) != 0 {
		t.Errorf("methane on natgas: unexpected warnings %q", w)
	}
	// A mechanism that states nothing finds nothing.
	if w := validityWarnings("mine", nil, []string{"C2H4"}, air, noLook); len(w) != 0 {
		t.Errorf("no validity stated: unexpected warnings %q", w)
	}
	// Ethylene and propane on the natural-gas set: each named, with the
	// set validated for them.
	w := strings.Join(validityWarnings("natgas", natgas, []string{"C2H4", "C3H8"}, air, covering), "\n")
	for _, want := range []string{"mechanism natgas: C2H4 is not among the fuels it was validated for (CH4, C2H6, H2, CO)",
		"mechanism natgas: C3H8 is not among", "built-in mechanism validated for C2H4, C3H8: c1c3"} {
		if !strings.Contains(w, want) {
			t.Errorf("ethylene and propane on natgas: warnings lack %q:\n%s", want, w)
		}
	}
	// A range of conditions is checked at its extremes: one finding per
	// bound passed, none for values inside; conditions alone seek no
	// better mechanism.
	sweep := []Condition{{Phi: 1, T: 300, P: 20e3}, {Phi: 1, T: 500, P: 101325}, {Phi: 1, T: 800, P: 4e6}, {Phi: 1, T: 900, P: 101325}}
	ws := validityWarnings("c1c3", c1c3, []string{"C3H8"}, sweep, noLook)
	w = strings.Join(ws, "\n")
	if len(ws) != 2 || !strings.Contains(w, "unburned temperature 900 K is outside") || !strings.Contains(w, "pressure 0.197 atm is outside") {
		t.Errorf("propane sweep on c1c3: want the 900 K and 20 kPa findings only:\n%s", w)
	}
}

// A cracked pool is checked by its carbon-bearing pool species (those
// with at least 1% of the fuel's carbon), against the foundational set's
// own validity notes: of an (invented) kerosene pool, only butadiene lies
// outside them, and no built-in was validated for the whole pool.
func TestPoolValidityOnFoundationalSet(t *testing.T) {
	if testing.Short() {
		t.Skip("solver set-up on 114 species")
	}
	c, err := casefile.Parse([]byte(`
[mixture]
fuel = "kero"
equivalence_ratio = 1.0
[fuels.kero]
formula = "C11.4H22.23"
lower_heating_value = "43.56 MJ/kg"
[fuels.kero.cracking]
yields = { C2H4 = 2.6, CH4 = 0.8, C3H6 = 0.5, C4H6 = 0.6, C2H2 = 0.8, H2 = 0.2, C3H8 = 0.001 }
`), "kero.toml")
	if err != nil {
		t.Fatal(err)
	}
	if c.Mechanism != casefile.FoundationalMechanism {
		t.Fatalf("a pool that names no mechanism burns on %q", c.Mechanism)
	}
	st, err := New(c, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got := strings.Join(st.ValidityFuels(), " "); got != "C2H2 C2H4 C3H6 C4H6 CH4" {
		t.Errorf("pool species checked: %s; want C2H2 C2H4 C3H6 C4H6 CH4 (not H2, not the trace C3H8)", got)
	}
	w := st.ValidityWarnings(st.BaseCondition())
	if len(w) != 1 || !strings.Contains(w[0], "mechanism ranzi2012-c1c3: C4H6 is not among the fuels it was validated for") {
		t.Errorf("warnings %q", w)
	}
}
