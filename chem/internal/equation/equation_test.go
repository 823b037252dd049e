package equation

import (
	"fmt"
	"strings"
	"testing"
)

// TestParseEquation covers the ways published and hand-written equations
// are spelled.
func TestParseEquation(t *testing.T) {
	names := []string{"H", "O2", "HO2", "OH", "O", "H2O", "CH2(S)", "CH3", "AR", "c4h8-1", "A+", "+B", "X", "1-C4H8", "C4H8", "A", "B"}
	index := func(s string) int {
		for i, n := range names {
			if n == s {
				return i
			}
		}
		return -1
	}
	show := func(e Equation) string {
		side := func(ps []participantView) string { return fmt.Sprint(ps) }
		var r, p []participantView
		for _, x := range e.Reactants {
			r = append(r, participantView{names[x.Species], x.Coefficient})
		}
		for _, x := range e.Products {
			p = append(p, participantView{names[x.Species], x.Coefficient})
		}
		s := side(r) + map[bool]string{true: " <=> ", false: " => "}[e.Reversible] + side(p)
		switch e.Collider {
		case PlusM:
			s += " +M"
		case FalloffM:
			s += " (+M)"
		case FalloffSpecific:
			s += " (+" + names[e.Specific] + ")"
		}
		return s
	}
	cases := []struct{ in, want string }{
		{"H + O2 <=> O + OH", "[{H 1} {O2 1}] <=> [{O 1} {OH 1}]"},
		{"H+O2<=>O+OH", "[{H 1} {O2 1}] <=> [{O 1} {OH 1}]"},
		{"H+O2=O+OH", "[{H 1} {O2 1}] <=> [{O 1} {OH 1}]"},
		{"H+O2=>O+OH", "[{H 1} {O2 1}] => [{O 1} {OH 1}]"},
		{"2O+M<=>O2+M", "[{O 2}] <=> [{O2 1}] +M"},
		{"O + O + m = O2 + m", "[{O 2}] <=> [{O2 1}] +M"},
		{"H + O2 (+M) <=> HO2 (+M)", "[{H 1} {O2 1}] <=> [{HO2 1}] (+M)"},
		{"H+O2(+AR)<=>HO2(+AR)", "[{H 1} {O2 1}] <=> [{HO2 1}] (+AR)"},
		{"CH3 + OH <=> CH2(S) + H2O", "[{CH3 1} {OH 1}] <=> [{CH2(S) 1} {H2O 1}]"},
		{"c4h8-1 + 0.5 O2 => X + 2.5X", "[{c4h8-1 1} {O2 0.5}] => [{X 3.5}]"},
		{"1e-05 X + 1e+06 H => 1e-05 X + 1e+06 H", "[{X 1e-05} {H 1e+06}] => [{X 1e-05} {H 1e+06}]"},
		{"A+ + +B <=> X + X", "[{A+ 1} {+B 1}] <=> [{X 2}]"},
		{"1-C4H8 <=> C4H8", "[{1-C4H8 1}] <=> [{C4H8 1}]"},
	}
	for _, c := range cases {
		e, err := Parse(c.in, index)
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if got := show(e); got != c.want {
			t.Errorf("%q read as %s, want %s", c.in, got, c.want)
		}
	}
	bad := []struct{ in, want string }{
		{"H + O2 -> O + OH", "no arrow"},
		{"H + O2 <=> O + OH <=> X", "more than one arrow"},
		{"H + O3 <=> O + OH", `unknown species "O3"`},
		{"H + O2 (+M) <=> HO2", "both sides"},
		{"H + O2 (+M) <=> HO2 (+AR)", "(+M) on the left does not match (+AR)"},
		{"H + O2 + M <=> HO2", "both sides"},
		{"H + O2 (+M) + X <=> HO2 (+M) + X", "must end its side"},
		{"H + M + M <=> HO2 + M + M", "only once"},
		{"H + O2 (+M) <=> HO2 (+M) + M", "must end its side"},
		{"H + O2 (+NE) <=> HO2 (+NE)", "unknown collider"},
		{"A++B <=> X", "more than one way"},
		{" <=> X", "empty"},
		{"H + + O2 <=> HO2", "empty term"},
		{"H + O2 <=> HO2 +", "empty term"},
		{"M <=> M", "no species"},
	}
	for _, c := range bad {
		_, err := Parse(c.in, index)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: error %v, want one containing %q", c.in, err, c.want)
		}
	}
}

type participantView struct {
	name string
	c    float64
}

// TestParseLongSide: a side of many terms is split in linear time (the
// split search is bounded by maxPlusInName) and merged.
func TestParseLongSide(t *testing.T) {
	names := []string{"X", "Y"}
	index := func(s string) int {
		for i, n := range names {
			if n == s {
				return i
			}
		}
		return -1
	}
	left := strings.Repeat("X+", 4999) + "X"
	e, err := Parse(left+" <=> Y", index)
	if err != nil {
		t.Fatal(err)
	}
	if len(e.Reactants) != 1 || e.Reactants[0].Coefficient != 5000 {
		t.Errorf("read %v, want 5000 X", e.Reactants)
	}
}
