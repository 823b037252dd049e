package casefile

import (
	"strings"
	"testing"
)

func TestParseComposition(t *testing.T) {
	cases := []struct {
		in   string
		want map[string]float64
	}{
		{"CH4", map[string]float64{"CH4": 1}},
		{" CH4=0.9, C2H6=0.1 ", map[string]float64{"CH4": 0.9, "C2H6": 0.1}},
		{"O2=21,N2=79", map[string]float64{"O2": 21, "N2": 79}},
		{"{ O2 = 0.21, N2 = 0.79 }", map[string]float64{"O2": 0.21, "N2": 0.79}}, // the case file's inline table
		{`{ "CH2(S)" = 1 }`, map[string]float64{"CH2(S)": 1}},
		{"H2=1,", map[string]float64{"H2": 1}},
		{"H2=1e-3", map[string]float64{"H2": 1e-3}},
	}
	for _, c := range cases {
		got, err := ParseComposition("--x", c.in)
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if len(got) != len(c.want) {
			t.Errorf("%q: %v, want %v", c.in, got, c.want)
		}
		for k, v := range c.want {
			if got[k] != v {
				t.Errorf("%q: %s = %v, want %v", c.in, k, got[k], v)
			}
		}
	}
	for _, c := range []struct{ in, want string }{
		{"", `--oxidizer "": empty composition`},
		{" , ", "empty composition"},
		{"{O2=1", "closing"},
		{"=0.5", "missing or blank-containing species name"},
		{"C H4=1", "blank-containing"},
		{"CH4=-1", "non-negative number"},
		{"CH4=inf", "non-negative number"},
		{"CH4=abc", "non-negative number"},
		{"CH4=1,CH4=2", "species CH4 given twice"},
		{"CH4,C2H6=0.1", "give every species of a blend an amount"},
		{"O2:0.21,N2:0.79", `--oxidizer "O2:0.21,N2:0.79": "O2:0.21": write each species as NAME=value, e.g. O2=0.21`},
	} {
		_, err := ParseComposition("--oxidizer", c.in)
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "--oxidizer ") {
			t.Errorf("%q: err = %v, want one naming the flag and containing %q", c.in, err, c.want)
		}
	}
}
