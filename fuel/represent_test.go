package fuel

import (
	"math"
	"strings"
	"testing"
)

func TestRepresent(t *testing.T) {
	m, _ := builtinMech(t, "lu2009-heptane")
	neat := Spec{Name: "heptane", Composition: map[string]float64{"nc7h16": 1}}
	pre := kerosene()
	pre.Name, pre.Mode = "pre", ModePreCracked
	reps, err := Represent(m, []Spec{neat, pre}, air, 0.8, 650)
	if err != nil {
		t.Fatal(err)
	}
	if len(reps) != 2 || reps[0].Kind != "neat/surrogate" || reps[1].Report == nil {
		t.Fatalf("%+v", reps)
	}
	// Neat fuel: the inlet is at the unburned temperature, mole fractions
	// sum to one, and n-heptane at phi 0.8 in air is 0.8/(0.8 + 11/0.21)
	// of the moles (C7H16 + 11 O2; exact).
	in := reps[0].Inlet
	sum := 0.0
	for _, x := range in.MoleFractions {
		sum += x
	}
	want := 0.8 / (0.8 + 11/0.21)
	if in.InletTemperature != 650 || math.Abs(sum-1) > 1e-12 || math.Abs(in.MoleFractions["nc7h16"]/want-1) > 1e-12 {
		t.Errorf("neat inlet %+v, X_fuel want %.15g", in, want)
	}
	// Pre-cracked: cracking takes heat, so the pool enters colder than the
	// unburned temperature (energy balance, fuel.PrecrackedInlet).
	if p := reps[1].Inlet; p.Error != "" || !(p.TemperatureShift < 0) || math.Abs(p.InletTemperature-650-p.TemperatureShift) > 1e-9 {
		t.Errorf("pre-cracked inlet %+v", p)
	}
	// Too cold for the pool: reported, not fatal.
	reps, err = Represent(m, []Spec{pre}, air, 0.8, 300)
	if err != nil || reps[0].Inlet.Error == "" {
		t.Errorf("cold pre-cracked inlet: %v, %+v", err, reps[0].Inlet)
	}
	bad := neat
	bad.Composition = map[string]float64{"XYZ": 1}
	if _, err := Represent(m, []Spec{bad}, air, 1, 300); err == nil || !strings.Contains(err.Error(), "fuel heptane") {
		t.Errorf("unknown species: %v", err)
	}
}
