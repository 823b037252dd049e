package study

import (
	"math"
	"testing"

	"flame1d/builtin"
	"flame1d/casefile"
	"flame1d/fuel"
)

// A neat fuel entered as a cracked pool of itself (methane as a pseudo-fuel
// of formula CH4 with methane's own heating value, whose pool is one mole of
// CH4, cracking with a 1 µs time constant at every temperature) must burn
// like the neat fuel: the pseudo-fuel turns into methane within a
// micrometre of the inlet, so only the representation differs. Within 1%
// (the check asked of the pool machinery; both flames share grid criteria).
func TestNeatFuelAsItsOwnPool(t *testing.T) {
	if testing.Short() {
		t.Skip("methane flames")
	}
	c, err := casefile.Parse([]byte(`
mechanism = "smith1999-natgas"
[mixture]
fuel = { CH4 = 1 }
equivalence_ratio = 1.0
temperature = "298 K"
`), "self-pool.toml")
	if err != nil {
		t.Fatal(err)
	}
	mech, err := builtin.Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatal(err)
	}
	neat, err := NewForFuel(c, mech, c.Fuel, nil)
	if err != nil {
		t.Fatal(err)
	}
	comp := make([]float64, len(mech.Species))
	comp[mech.SpeciesIndex("CH4")] = 1
	lhv, err := neat.Set.LowerHeatingValue(comp)
	if err != nil {
		t.Fatal(err)
	}
	spec := fuel.Spec{Name: "methane-pool", Formula: "CH4", LowerHeatingValue: lhv,
		SpeciesName: "PSEUDO", Cracking: fuel.CrackingSpec{Method: "yields", Yields: map[string]float64{"CH4": 1}},
		GlobalStep: fuel.GlobalStepSpec{CrackingTime: 1e-6, ActivationEnergy: new(float64)}, // E = 0
		// GRI-Mech 3.0 transport parameters of CH4, so that only the
		// cracking representation differs.
		Transport: &fuel.TransportSpec{WellDepth: 141.4, Diameter: 3.746e-10}}
	pool, err := NewForFuel(c, mech, spec, nil)
	if err != nil {
		t.Fatal(err)
	}
	rn, err := neat.Solve(neat.BaseCondition(), nil)
	if err != nil {
		t.Fatal(err)
	}
	rp, err := pool.Solve(pool.BaseCondition(), nil)
	if err != nil {
		t.Fatal(err)
	}
	d := (rp.Summary.FlameSpeed - rn.Summary.FlameSpeed) / rn.Summary.FlameSpeed
	t.Logf("neat CH4 %.5f m/s, CH4 as its own pool %.5f m/s (%+.3f%%)", rn.Summary.FlameSpeed, rp.Summary.FlameSpeed, 100*d)
	if math.Abs(d) > 0.01 {
		t.Errorf("self-pool S_L differs from the neat fuel by %+.2f%% (> 1%%)", 100*d)
	}
}
