package casefile

import (
	"path/filepath"
	"strings"
	"testing"
)

// [sensitivity]: absent means off; the side file is resolved against the
// case file's folder; a factor below 1 is refused with the key and line.
func TestSensitivityTable(t *testing.T) {
	c, err := Parse([]byte(minimal), "case.toml")
	if err != nil {
		t.Fatal(err)
	}
	if c.Sensitivity != (SensitivitySettings{}) {
		t.Errorf("no [sensitivity] table gave %+v, want the zero value (off)", c.Sensitivity)
	}
	src := minimal + "[sensitivity]\nenabled = true\ndefault_uncertainty_factor = 3\nuncertainty_factors = \"f.toml\"\n"
	c, err = Parse([]byte(src), filepath.Join("cases", "case.toml"))
	if err != nil {
		t.Fatal(err)
	}
	want := SensitivitySettings{Enabled: true, DefaultUncertaintyFactor: 3, FactorsFile: filepath.Join("cases", "f.toml")}
	if c.Sensitivity != want {
		t.Errorf("got %+v, want %+v", c.Sensitivity, want)
	}
	_, err = Parse([]byte(minimal+"[sensitivity]\ndefault_uncertainty_factor = 0.5\n"), "case.toml")
	if err == nil || !strings.Contains(err.Error(), "case.toml:12: sensitivity.default_uncertainty_factor") {
		t.Errorf("factor 0.5: error %v, want one naming case.toml:12 and the key", err)
	}
}

// The factor side file: entries sorted by key with their lines; errors
// name the file and line.
func TestParseUncertaintyFactors(t *testing.T) {
	src := "# test\n[uncertainty_factors]\n\"H + O2 <=> O + OH\" = 1.3\n\"3\" = 5\n"
	got, err := ParseUncertaintyFactors([]byte(src), "f.toml")
	if err != nil {
		t.Fatal(err)
	}
	want := []UncertaintyFactor{{Reaction: "3", Factor: 5, Line: 4}, {Reaction: "H + O2 <=> O + OH", Factor: 1.3, Line: 3}}
	if len(got) != 2 || got[0] != want[0] || got[1] != want[1] {
		t.Errorf("got %+v, want %+v", got, want)
	}
	for _, bad := range []struct{ src, want string }{
		{"[uncertainty_factors]\n\"1\" = 0.5\n", "f.toml:2: \"1\" = 0.5"},
		{"[factors]\nx = 2\n", "f.toml:1: unknown key"},
		{"x = 2\n", "unknown key"},
		{"", "no [uncertainty_factors] table"},
	} {
		_, err := ParseUncertaintyFactors([]byte(bad.src), "f.toml")
		if err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("%q: error %v, want one containing %q", bad.src, err, bad.want)
		}
	}
}
