package casefile

import (
	"errors"
	"reflect"
	"strings"
	"testing"
)

const sweepBase = `mechanism = "burke2012-hydrogen"
[mixture]
fuel = { H2 = 1 }
equivalence_ratio = 1.0
temperature = "300 K"
pressure = "1 atm"
`

func TestSweepValues(t *testing.T) {
	for _, tc := range []struct {
		name       string
		table      string
		phi, T, P  []float64
		continueAt string
	}{
		{"list of numbers", "equivalence_ratio = [1.2, 0.8, 1.0]",
			[]float64{0.8, 1.0, 1.2}, []float64{300}, []float64{101325}, ""},
		// 0.6 + k*0.1 accumulates round-off; the values must be the written ones.
		{"step range", "equivalence_ratio = { from = 0.6, to = 1.8, step = 0.1 }",
			[]float64{0.6, 0.7, 0.8, 0.9, 1.0, 1.1, 1.2, 1.3, 1.4, 1.5, 1.6, 1.7, 1.8}, []float64{300}, []float64{101325}, ""},
		{"step range stopping short of to", "equivalence_ratio = { from = 0.7, to = 1.0, step = 0.2 }",
			[]float64{0.7, 0.9}, []float64{300}, []float64{101325}, ""},
		{"count range with units", `temperature = { from = "300 K", to = "600 K", count = 4 }`,
			[]float64{1.0}, []float64{300, 400, 500, 600}, []float64{101325}, ""},
		// 25 C = 298.15 K (ISO 80000-5); a step in C is a difference of 50 K.
		{"temperature step in an offset unit", `temperature = { from = "25 C", to = "125 C", step = "50 C" }`,
			[]float64{1.0}, []float64{298.15, 348.15, 398.15}, []float64{101325}, ""},
		// 1 atm = 101325 Pa exactly; 1 bar = 1e5 Pa.
		{"pressure list with mixed units", `pressure = ["5 bar", "1 atm", 200000]`,
			[]float64{1.0}, []float64{300}, []float64{101325, 2e5, 5e5}, ""},
		{"log spacing", `pressure = { from = "1 bar", to = "100 bar", count = 3, spacing = "log" }`,
			[]float64{1.0}, []float64{300}, []float64{1e5, 1e6, 1e7}, ""},
		{"single value and chain variable", "temperature = [300, 350]\npressure = \"2 bar\"\ncontinue_along = \"temperature\"",
			[]float64{1.0}, []float64{300, 350}, []float64{2e5}, "temperature"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := Parse([]byte(sweepBase+"[sweep]\n"+tc.table+"\n"), "case.toml")
			if err != nil {
				t.Fatal(err)
			}
			s := c.Sweep
			if s == nil {
				t.Fatal("Sweep is nil")
			}
			for _, v := range []struct {
				name      string
				got, want []float64
			}{{"equivalence ratio", s.EquivalenceRatio, tc.phi}, {"temperature", s.Temperature, tc.T}, {"pressure", s.Pressure, tc.P}} {
				if !reflect.DeepEqual(v.got, v.want) {
					t.Errorf("%s = %v, want %v", v.name, v.got, v.want)
				}
			}
			if s.ContinueAlong != tc.continueAt {
				t.Errorf("ContinueAlong = %q, want %q", s.ContinueAlong, tc.continueAt)
			}
		})
	}
}

func TestNoSweepTable(t *testing.T) {
	c, err := Parse([]byte(sweepBase), "case.toml")
	if err != nil {
		t.Fatal(err)
	}
	if c.Sweep != nil {
		t.Errorf("Sweep = %+v for a case without [sweep]", c.Sweep)
	}
}

func TestSweepErrors(t *testing.T) {
	for _, tc := range []struct {
		table string
		key   string
		line  int // 0: do not check
		want  string
	}{
		{"equivalence_ratio = { from = 0.6, to = 1.8, stp = 0.1 }", "sweep.equivalence_ratio", 8, `unknown range key "stp"`},
		{"equivalence_ratio = { from = 1.2, to = 0.8, step = 0.1 }", "sweep.equivalence_ratio", 8, "runs backwards"},
		{"equivalence_ratio = { from = 0.8, to = 1.2, step = 0.1, count = 3 }", "sweep.equivalence_ratio", 8, "exactly one of step or count"},
		{"equivalence_ratio = { from = 0.8, to = 1.2 }", "sweep.equivalence_ratio", 8, "exactly one of step or count"},
		{"equivalence_ratio = { from = 0.8, to = 1.2, step = 0 }", "sweep.equivalence_ratio", 8, "step must be positive"},
		{"equivalence_ratio = { to = 1.2, step = 0.1 }", "sweep.equivalence_ratio", 8, `needs "from"`},
		{`equivalence_ratio = ["0.8", 1.0]`, "sweep.equivalence_ratio", 8, "plain number"},
		{"equivalence_ratio = [0.8, 1.0, 0.8]", "sweep.equivalence_ratio", 8, "listed twice"},
		{"equivalence_ratio = []", "sweep.equivalence_ratio", 8, "empty list"},
		{"equivalence_ratio = [0.8, -1.0]", "sweep.equivalence_ratio", 8, "must be positive"},
		{"equivalence_ratio = { from = 0.1, to = 90, step = 0.01 }", "sweep.equivalence_ratio", 8, "at most 1000"},
		{`temperature = ["300 K", "2500 K"]`, "sweep.temperature", 8, "150-2000 K"},
		{`temperature = ["300 furlongs"]`, "sweep.temperature", 8, "unknown temperature unit"},
		{`pressure = { from = "1 atm", to = "10 atm", step = 1, spacing = "log" }`, "sweep.pressure", 8, "needs count"},
		{`pressure = { from = 0, to = 1e6, count = 3, spacing = "log" }`, "sweep.pressure", 8, "needs a positive from"},
		{`pressure = { from = "1 atm", to = "10 atm", count = 3, spacing = "cubic" }`, "sweep.pressure", 8, "spacing must be"},
		{`pressure = { from = "1 atm", to = "10 atm", count = 1 }`, "sweep.pressure", 8, "count = 1 needs from = to"},
		{`pressure = true`, "sweep.pressure", 8, "got true or false"},
		{`continue_along = "phi"`, "sweep.continue_along", 8, "not a swept variable"},
		{`continue_along = "pressure"`, "sweep", 7, "sweeps nothing"},
		{"equivalence_ratio = [1.0]\npressures = [1]", "sweep.pressures", 9, "unknown key"},
	} {
		t.Run(tc.table, func(t *testing.T) {
			_, err := Parse([]byte(sweepBase+"[sweep]\n"+tc.table+"\n"), "case.toml")
			if err == nil {
				t.Fatal("no error")
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %q does not say %q", err, tc.want)
			}
			var fe *FieldError
			if !errors.As(err, &fe) {
				t.Fatalf("error %T is not a *FieldError", err)
			}
			if fe.Key != tc.key {
				t.Errorf("key %q, want %q", fe.Key, tc.key)
			}
			if tc.line != 0 && fe.Line != tc.line {
				t.Errorf("line %d, want %d (%v)", fe.Line, tc.line, err)
			}
		})
	}
}
