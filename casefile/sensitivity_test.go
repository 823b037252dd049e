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
