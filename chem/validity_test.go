package chem

import (
	"reflect"
	"strings"
	"testing"

	"flame1d/thermo"
)

// The ranges below are invented test data, not a published statement.
func testValidity() *Validity {
	return &Validity{
		Fuels:            []string{"CH4", "C2H6"},
		Temperature:      [2]float64{300, 0},
		Pressure:         [2]float64{10 * thermo.OneAtmosphere / 760, 10 * thermo.OneAtmosphere},
		EquivalenceRatio: [2]float64{0.5, 1.5},
	}
}

func TestValidityOutside(t *testing.T) {
	v := testValidity()
	atm := thermo.OneAtmosphere
	cases := []struct {
		name string
		c    FlameConditions
		want []string // substrings, one per note, in order
	}{
		{"inside", FlameConditions{Species: []string{"CH4"}, Temperature: 300, Pressure: atm, EquivalenceRatio: 1}, nil},
		{"unchecked zeros", FlameConditions{Species: []string{"C2H6"}}, nil},
		{"open upper temperature bound", FlameConditions{Temperature: 900}, nil},
		{"pool species outside", FlameConditions{Species: []string{"CH4", "C2H4", "C3H8"}},
			[]string{"C2H4 is not among the fuels it was validated for (CH4, C2H6)", "C3H8 is not among"}},
		{"cold", FlameConditions{Temperature: 250}, []string{"unburned temperature 250 K is outside its validated range from 300 K"}},
		{"high pressure", FlameConditions{Pressure: 20 * atm}, []string{"pressure 20 atm is outside its validated range 0.0132-10 atm"}},
		{"rich", FlameConditions{EquivalenceRatio: 1.6}, []string{"equivalence ratio 1.6 is outside its validated range 0.5-1.5"}},
		{"lean", FlameConditions{EquivalenceRatio: 0.4}, []string{"equivalence ratio 0.4"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got := v.Outside(c.c)
			if len(got) != len(c.want) {
				t.Fatalf("Outside = %q, want %d notes", got, len(c.want))
			}
			for i, w := range c.want {
				if !strings.Contains(got[i], w) {
					t.Errorf("note %d = %q, want it to contain %q", i+1, got[i], w)
				}
			}
		})
	}
	var none *Validity
	if got := none.Outside(FlameConditions{Species: []string{"C2H4"}, Pressure: 1e9}); got != nil {
		t.Errorf("nil validity: %q", got)
	}
	noFuels := &Validity{Pressure: [2]float64{0, 2 * atm}}
	if got := noFuels.Outside(FlameConditions{Species: []string{"C2H4"}, Pressure: atm}); got != nil {
		t.Errorf("validity without fuels checked species: %q", got)
	}
}

func TestValiditySummary(t *testing.T) {
	cases := []struct {
		v    *Validity
		want string
	}{
		{testValidity(), "fuels CH4, C2H6; unburned temperature from 300 K; pressure 0.0132-10 atm; equivalence ratio 0.5-1.5"},
		{&Validity{Temperature: [2]float64{300, 700}}, "unburned temperature 300-700 K"},
		{&Validity{Pressure: [2]float64{0, 5 * thermo.OneAtmosphere}}, "pressure up to 5 atm"},
		{&Validity{Source: "a paper"}, "not stated"},
		{nil, "not stated"},
	}
	for _, c := range cases {
		if got := c.v.Summary(); !reflect.DeepEqual(got, c.want) {
			t.Errorf("Summary = %q, want %q", got, c.want)
		}
	}
}
