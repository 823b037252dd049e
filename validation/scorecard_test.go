package validation

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/builtin"
	"flame1d/casefile"
)

// Deviation and distance outside the band, by hand: measured 0.40 m/s in
// [0.38, 0.42].
func TestScore(t *testing.T) {
	for _, tc := range []struct{ pred, dev, out float64 }{
		{0.40, 0, 0},
		{0.41, 0.025, 0},
		{0.441, 0.1025, 0.05},
		{0.361, -0.0975, -0.05},
	} {
		o := Outcome{Point: Point{Speed: 0.40, Low: 0.38, High: 0.42}}
		o.score(tc.pred)
		if math.Abs(o.Deviation-tc.dev) > 1e-12 || math.Abs(o.OutsideBand-tc.out) > 1e-12 || o.Status != Solved {
			t.Errorf("predicted %g: deviation %g, outside %g; want %g, %g", tc.pred, o.Deviation, o.OutsideBand, tc.dev, tc.out)
		}
	}
	a, b := &Outcome{Status: Solved, Deviation: 0.03}, &Outcome{Status: Solved, Deviation: -0.04, OutsideBand: -0.01}
	s := scoreOf("x", []*Outcome{a, b, {Status: Failed}, {Status: NotRepresented}})
	if math.Abs(s.RMS-math.Sqrt((0.03*0.03+0.04*0.04)/2)) > 1e-15 || s.Worst != b || s.WorstOutside != b || s.Solved != 2 || s.Failed != 1 || s.NotRepresented != 1 || s.WithinBand != 1 {
		t.Errorf("score %+v", s)
	}
	for _, tc := range []struct {
		T, P float64
		want string
	}{{298, 101325, "298 K, 1 atm"}, {300, 5e5, "300 K, 0.5 MPa"}, {353.15, 2 * 101325, "353.2 K, 2 atm"}} {
		if got := Conditions(tc.T, tc.P); got != tc.want {
			t.Errorf("Conditions(%g, %g) = %q, want %q", tc.T, tc.P, got, tc.want)
		}
	}
}

// The fuel is found by name (any letter case) with matching atoms, and
// air by O2 and N2; a mechanism without them says which species it lacks.
func TestRepresent(t *testing.T) {
	sets, err := Bundled()
	if err != nil {
		t.Fatal(err)
	}
	heptane, _ := SelectFuels(sets, []string{"n-heptane"})
	propane, _ := SelectFuels(sets, []string{"C3H8"})
	for _, tc := range []struct {
		mech   string
		set    *Dataset
		fuel   string // mechanism species; "" when not represented
		reason string
	}{
		{"lu2009-heptane", heptane[0], "nc7h16", ""},
		{"smith1999-natgas", propane[0], "C3H8", ""},
		{"smith1999-natgas", heptane[0], "", "mechanism smith1999-natgas has no n-heptane species (looked for NC7H16, C7H16, N-C7H16 of formula C7H16)"},
	} {
		m, err := builtin.Mechanism(tc.mech)
		if err != nil {
			t.Fatal(err)
		}
		spec, air, reason := represent(m, tc.mech, tc.set)
		if reason != tc.reason {
			t.Errorf("%s on %s: reason %q, want %q", tc.set.Fuel, tc.mech, reason, tc.reason)
		}
		if tc.fuel != "" && (spec.Composition[tc.fuel] != 1 || len(air) != 2) {
			t.Errorf("%s on %s: fuel %v, air %v", tc.set.Fuel, tc.mech, spec.Composition, air)
		}
	}
	if got, _ := parseAtoms("C7H16"); got["C"] != 7 || got["H"] != 16 || len(got) != 2 {
		t.Errorf("parseAtoms(C7H16) = %v", got)
	}
	if !sameAtoms(map[string]float64{"c": 3, "h": 8, "o": 0}, map[string]float64{"C": 3, "H": 8}) || sameAtoms(map[string]float64{"C": 3, "H": 6}, map[string]float64{"C": 3, "H": 8}) {
		t.Error("sameAtoms")
	}
}

// Hydrogen/air on the Burke et al. (2012) mechanism, all six bundled
// points: every one solves, and the scorecard's files name the mechanism.
// Measured when written: RMS 3.5%, worst -5.5% at phi 0.7; after the
// thermal-diffusion change (main at 9e94659): RMS 2.1%, worst +3.6% at
// phi 1.2; all inside their bands (Dowdy et al. 1990, Tse et al. 2000, Kwon & Faeth 2001,
// Lamoureux et al. 2003; from memory) - the mechanism was validated
// against these data by its authors.
func TestHydrogenScorecard(t *testing.T) {
	if testing.Short() {
		t.Skip("six hydrogen flames")
	}
	sc := runFuels(t, "burke2012-hydrogen", nil, "H2")
	h := sc.Fuels[0]
	if h.Solved != 6 || h.RMS > 0.05 || h.WithinBand != 6 {
		t.Errorf("H2 on burke2012-hydrogen: %d of 6 solved, RMS %.3f, %d within band; want 6, <= 0.05, 6", h.Solved, h.RMS, h.WithinBand)
	}
	dir := t.TempDir()
	if err := sc.WriteFiles(dir); err != nil {
		t.Fatal(err)
	}
	for _, f := range []string{PointsName, SummaryName, PlotName("H2", ".png"), PlotName("H2", ".svg")} {
		b, err := os.ReadFile(filepath.Join(dir, f))
		if err != nil {
			t.Fatal(err)
		}
		if !strings.HasSuffix(f, ".png") && !strings.Contains(string(b), "burke2012-hydrogen") {
			t.Errorf("%s does not name the mechanism", f)
		}
	}
	var buf bytes.Buffer
	if err := sc.WriteJSON(&buf); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Overall struct {
			RMS *float64 `json:"rms_deviation"`
		} `json:"overall"`
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil || doc.Overall.RMS == nil || *doc.Overall.RMS != h.RMS {
		t.Errorf("JSON overall RMS %v (err %v), want %g", doc.Overall.RMS, err, h.RMS)
	}
}

// The foundational C0-C4 set (ranzi2012-c1c3, Ranzi et al. 2012), the
// subset of the issue-13 check that CI runs: at 298 K and 1 atm, methane
// lean, stoichiometric and rich (phi 0.8, 1.0, 1.2: one continuation
// chain), and ethylene, propane and hydrogen at phi 1. Each prediction
// must lie within 5% of its measured band (outside_band), and the subset's
// RMS deviation be at most 5% (the check of issue 13). Measured values:
// validation/data (Vagelopoulos & Egolfopoulos 1998, Bosschaart & de Goey
// 2004, Jomaas et al. 2005, Kumar et al. 2008, Dowdy et al. 1990 and
// others; from memory). The full scorecard, all 54 points the set can
// represent, is the README's table and BenchmarkScorecardFoundational.
func TestFoundationalSubset(t *testing.T) {
	if testing.Short() {
		t.Skip("six flames on 114 species")
	}
	ciPoint := func(p Point) bool {
		if p.Elevated() {
			return false
		}
		return p.Phi == 1 || p.Fuel == "CH4" && (p.Phi == 0.8 || p.Phi == 1.2)
	}
	sc := runFuels(t, casefile.FoundationalMechanism, ciPoint, "CH4", "C2H4", "C3H8", "H2")
	if sc.Overall.Points != 6 {
		t.Fatalf("%d points selected, want 6 (CH4 phi 0.8, 1, 1.2; C2H4, C3H8, H2 phi 1)", sc.Overall.Points)
	}
	for _, o := range sc.Outcomes {
		t.Logf("%s (%d Newton iterations)", o.progressLine(), o.NewtonIterations)
		if o.Status != Solved {
			t.Errorf("%s phi %g: %s: %s", o.Fuel, o.Phi, o.Status, o.Reason)
			continue
		}
		if math.Abs(o.OutsideBand) > 0.05 {
			t.Errorf("%s phi %g: %.4f m/s is %+.1f%% outside the measured band %.3f-%.3f", o.Fuel, o.Phi, o.Predicted, 100*o.OutsideBand, o.Low, o.High)
		}
	}
	if sc.Overall.RMS > 0.05 {
		t.Errorf("RMS deviation of the subset %.1f%%, want at most 5%%", 100*sc.Overall.RMS)
	}
}

// runFuels scores the bundled points of the fuels on a built-in: all of
// them, or those for which keep, when not nil, is true.
func runFuels(t testing.TB, name string, keep func(Point) bool, fuels ...string) *Scorecard {
	t.Helper()
	sets, err := Bundled()
	if err != nil {
		t.Fatal(err)
	}
	if sets, err = SelectFuels(sets, fuels); err != nil {
		t.Fatal(err)
	}
	mech, err := builtin.Mechanism(name)
	if err != nil {
		t.Fatal(err)
	}
	if keep != nil {
		for i, d := range sets {
			sub := *d
			sub.Points = nil
			for _, p := range d.Points {
				if keep(p) {
					sub.Points = append(sub.Points, p)
				}
			}
			sets[i] = &sub
		}
	}
	sc, err := Run(name, mech, sets, Options{Jobs: 2})
	if err != nil {
		t.Fatal(err)
	}
	return sc
}
