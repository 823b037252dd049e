package sensitivity_test

import (
	"math"
	"strings"
	"testing"

	"flame1d/builtin"
	"flame1d/casefile"
	"flame1d/sensitivity"
)

// TestBandByHand: two steps with S = 0.5 and -0.2, f = 2 and 4:
// σ(ln S_L) = sqrt((0.5 ln2/2)^2 + (0.2 ln4/2)^2) = sqrt(0.0300283 + 0.0192181)
// = 0.2219153, so σ(S_L) = 0.3 × 0.2219153 = 0.0665746 m/s (by hand).
func TestBandByHand(t *testing.T) {
	sigma, err := sensitivity.Band(0.3, []float64{0.5, -0.2}, []float64{2, 4})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(sigma-0.0665746) > 1e-7 {
		t.Errorf("σ = %.7f, want 0.0665746", sigma)
	}
	if _, err := sensitivity.Band(0.3, []float64{0.5}, []float64{0.5}); err == nil {
		t.Error("a factor below 1 was accepted")
	}
	if got, want := sensitivity.FormatBand(0.36, 0.0213), "S_L = 0.360 ± 0.021 m/s (1σ, rate constants)"; got != want {
		t.Errorf("FormatBand = %q, want %q", got, want)
	}
}

// TestMatchFactors: by equation (spaces ignored), by number, the
// mechanism's own factor, the default; errors name the file and line.
func TestMatchFactors(t *testing.T) {
	m, err := builtin.Mechanism("burke2012-hydrogen")
	if err != nil {
		t.Fatal(err)
	}
	// Reaction 1 as the mechanism writes it, with spaces put around "+".
	spaced := strings.Join(strings.Split(m.Reactions[0].Equation, "+"), " + ")
	got, err := sensitivity.MatchFactors([]casefile.UncertaintyFactor{{Reaction: spaced, Factor: 1.3, Line: 3}, {Reaction: "3", Factor: 5, Line: 4}}, "f.toml", m)
	if err != nil {
		t.Fatal(err)
	}
	if got[0] != 1.3 || got[2] != 5 || len(got) != 2 {
		t.Errorf("factors %v, want reaction 1 -> 1.3 and reaction 3 -> 5", got)
	}
	m.Reactions[4].UncertaintyFactor = 3
	f := sensitivity.Factors(m, got, 0)
	if f[0] != 1.3 || f[2] != 5 || f[4] != 3 || f[5] != sensitivity.DefaultUncertaintyFactor {
		t.Errorf("Factors = %v", f[:6])
	}
	for _, bad := range []struct {
		e    []casefile.UncertaintyFactor
		want string
	}{
		{[]casefile.UncertaintyFactor{{Reaction: "X+Y=Z", Factor: 2, Line: 2}}, "f.toml:2: mechanism"},
		{[]casefile.UncertaintyFactor{{Reaction: "999", Factor: 2, Line: 2}}, "f.toml:2: reaction number 999"},
		{[]casefile.UncertaintyFactor{{Reaction: "1", Factor: 2, Line: 2}, {Reaction: spaced, Factor: 2, Line: 3}}, "f.toml:3: reaction 1"},
	} {
		_, err := sensitivity.MatchFactors(bad.e, "f.toml", m)
		if err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("%+v: error %v, want one containing %q", bad.e, err, bad.want)
		}
	}
}

// TestCompare: reactions matched by equation, a step of one side only has
// 0 on the other, ordered by importance and by difference.
func TestCompare(t *testing.T) {
	a := &sensitivity.Analysis{Coefficients: []sensitivity.Coefficient{
		{Kind: sensitivity.RateConstant, Parameter: "H+O2<=>O+OH", Value: 0.5},
		{Kind: sensitivity.RateConstant, Parameter: "CO+OH<=>CO2+H", Value: 0.1},
		{Kind: sensitivity.Diffusion, Parameter: "H", Value: 0.9},
	}}
	b := &sensitivity.Analysis{Coefficients: []sensitivity.Coefficient{
		{Kind: sensitivity.RateConstant, Parameter: "H + O2 <=> O + OH", Value: 0.45},
		{Kind: sensitivity.RateConstant, Parameter: "CO+OH<=>CO2+H", Value: 0.3},
		{Kind: sensitivity.RateConstant, Parameter: "FUEL=>POOL", Value: -0.05},
	}}
	c, err := sensitivity.Compare(a, b, 2)
	if err != nil {
		t.Fatal(err)
	}
	if len(c.MostImportant) != 2 || c.MostImportant[0].Equation != "H+O2<=>O+OH" || c.MostImportant[0].B != 0.45 {
		t.Errorf("most important %+v", c.MostImportant)
	}
	if c.MostDifferent[0].Equation != "CO+OH<=>CO2+H" || math.Abs(c.MostDifferent[0].Difference()-0.2) > 1e-15 {
		t.Errorf("most different %+v", c.MostDifferent)
	}
}
