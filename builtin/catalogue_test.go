package builtin

import (
	"encoding/json"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
)

// TestCatalogue: every built-in is listed with its published size, its
// citation and what it was validated for; the fuels named are species of
// the mechanism, and the cracked-pool species of a heavy fuel lie outside
// GRI-Mech 3.0 but inside the CRECK set.
func TestCatalogue(t *testing.T) {
	entries, err := Catalogue()
	if err != nil {
		t.Fatal(err)
	}
	names := Names()
	if len(entries) != len(names) {
		t.Fatalf("%d entries for %d built-ins", len(entries), len(names))
	}
	want := map[string]struct {
		species, reactions int
		title, citation    string
		fuel               string
	}{
		// Sizes: GRI-Mech 3.0 release (Smith et al. 1999); Burke et al. 2012
		// posted file; Lu et al. 2009; c0c4/PROVENANCE.md.
		"smith1999-natgas":   {53, 325, "GRI-Mech 3.0", "G. P. Smith", "CH4"},
		"burke2012-hydrogen": {13, 27, "hydrogen/oxygen", "M. P. Burke", "H2"},
		"lu2009-heptane":     {68, 283, "n-heptane", "T. Lu", "nc7h16"},
		"ranzi2012-c1c3":     {114, 1999, "CRECK C1-C3", "E. Ranzi", "C2H4"},
	}
	for i, e := range entries {
		if e.Name != names[i] {
			t.Errorf("entry %d is %s, want %s", i, e.Name, names[i])
		}
		w, ok := want[e.Name]
		if !ok {
			t.Errorf("built-in %s has no expectation in this test", e.Name)
			continue
		}
		if e.Species != w.species || e.Reactions != w.reactions || !strings.Contains(e.Title, w.title) ||
			!strings.HasPrefix(e.Citation, w.citation) || strings.Contains(e.Title, "\n") {
			t.Errorf("%s: %+v", e.Name, e)
		}
		if !strings.Contains(e.ValidFor, w.fuel) || len(e.Fuels) == 0 || !strings.Contains(e.ValiditySource, "from memory") {
			t.Errorf("%s: validity %q, fuels %v, source %q", e.Name, e.ValidFor, e.Fuels, e.ValiditySource)
		}
		m, err := Mechanism(e.Name)
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range e.Fuels {
			if m.SpeciesIndex(f) < 0 {
				t.Errorf("%s: validated fuel %s is not a species", e.Name, f)
			}
		}
	}
	gri, _ := Mechanism("smith1999-natgas")
	creck, _ := Mechanism("ranzi2012-c1c3")
	pool := chem.FlameConditions{Species: []string{"CH4", "C2H4", "C3H6", "H2"}, Pressure: thermo.OneAtmosphere, EquivalenceRatio: 1}
	if notes := gri.Validity.Outside(pool); len(notes) != 3 || !strings.Contains(notes[0], "C2H4") {
		t.Errorf("pool on GRI-Mech 3.0: %q, want C2H4, C3H6 and H2 flagged", notes)
	}
	if notes := creck.Validity.Outside(pool); len(notes) != 0 {
		t.Errorf("pool on the CRECK set: %q, want none", notes)
	}
	// The JSON form carries units in its keys and leaves out what is not stated.
	b, err := json.Marshal(entries)
	if err != nil {
		t.Fatal(err)
	}
	js := string(b)
	for _, k := range []string{`"name":"ranzi2012-c1c3"`, `"species":114`, `"reactions":1999`, `"pressure_range_Pa":[1333.22`, `"validated_fuels":["H2"]`} {
		if !strings.Contains(js, k) {
			t.Errorf("JSON lacks %s", k)
		}
	}
	if strings.Contains(js, `"unburned_temperature_range_K"`) {
		t.Error("JSON lists an unburned-temperature range no built-in states")
	}
}

func BenchmarkCatalogue(b *testing.B) {
	for b.Loop() {
		if _, err := Catalogue(); err != nil {
			b.Fatal(err)
		}
	}
}

// TestCovering: the built-in suggested for a set of fuel species is one
// validated for all of them (validity tables of the built-ins).
func TestCovering(t *testing.T) {
	cases := []struct {
		species []string
		want    []string
	}{
		{[]string{"CH4", "C2H4", "C3H6", "H2"}, []string{"ranzi2012-c1c3"}}, // a cracked pool
		{[]string{"H2"}, []string{"burke2012-hydrogen", "ranzi2012-c1c3"}},
		{[]string{"CH4", "C2H6"}, []string{"ranzi2012-c1c3", "smith1999-natgas"}},
		{[]string{"NC7H16"}, []string{"lu2009-heptane"}}, // case differs from the file's nc7h16
		{[]string{"C6H6"}, nil}, // benzene: a product in ranzi2012-c1c3, not a validated fuel
	}
	for _, c := range cases {
		got, err := Covering(c.species)
		if err != nil {
			t.Fatal(err)
		}
		if strings.Join(got, ",") != strings.Join(c.want, ",") {
			t.Errorf("Covering(%v) = %v, want %v", c.species, got, c.want)
		}
	}
}
