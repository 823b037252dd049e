package chem

import (
	"slices"
	"strings"
	"testing"

	"flame1d/thermo"
)

// Names that would break the headers and columns they are copied into are
// refused (issue 11, item 5).
func TestValidateRefusesNamesWithControlCharacters(t *testing.T) {
	sp := func(name string) Species {
		return Species{Species: thermo.Species{Name: name, Composition: map[string]float64{"H": 2}}}
	}
	for _, tc := range []struct {
		m    Mechanism
		want string
	}{
		{Mechanism{Name: "ok", Elements: []string{"H"}, Species: []Species{sp("H2\nX")}}, `species name "H2\nX"`},
		{Mechanism{Name: "ok", Elements: []string{"H"}, Species: []Species{sp("H 2")}}, `species name "H 2"`},
		{Mechanism{Name: "a\nb", Elements: []string{"H"}, Species: []Species{sp("H2")}}, `mechanism name "a\nb"`},
	} {
		probs, err := tc.m.Validate()
		var all []string
		for _, p := range probs {
			all = append(all, p.Message)
		}
		if err == nil || !strings.Contains(strings.Join(all, "; "), tc.want) {
			t.Errorf("%s: %v", tc.want, all)
		}
	}
}

// The net change of H + O2 + O2 => HO2 + O2 (an explicit collider) is
// H + O2 -> HO2: the collider's zero net coefficient is left out, the order
// is that of first appearance, and a species written twice on one side
// (2 OH => H2O2 as OH + OH) adds up.
func TestNetStoichiometry(t *testing.T) {
	const H, O2, HO2, OH, H2O2 = 0, 1, 2, 3, 4
	r := Reaction{
		Reactants: []Participant{{H, 1}, {O2, 1}, {O2, 1}},
		Products:  []Participant{{HO2, 1}, {O2, 1}},
	}
	want := []Participant{{H, -1}, {O2, -1}, {HO2, 1}}
	if got := r.NetStoichiometry(); !slices.Equal(got, want) {
		t.Errorf("H + O2 + O2 => HO2 + O2: %v, want %v", got, want)
	}
	r = Reaction{Reactants: []Participant{{OH, 1}, {OH, 1}}, Products: []Participant{{H2O2, 1}}}
	want = []Participant{{OH, -2}, {H2O2, 1}}
	if got := r.NetStoichiometry(); !slices.Equal(got, want) {
		t.Errorf("OH + OH => H2O2: %v, want %v", got, want)
	}
}
