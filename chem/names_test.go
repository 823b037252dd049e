package chem

import (
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
