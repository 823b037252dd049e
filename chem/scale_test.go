package chem_test

import (
	"testing"

	"flame1d/chem"
)

// TestWithRateMultipliers: scaling a step's rate constant by f multiplies
// its forward and reverse rates of progress by exactly f for every rate
// form (the identity behind d omega_k/d ln A_i = nu_ki q_i), leaves the
// other steps and the original mechanism untouched.
func TestWithRateMultipliers(t *testing.T) {
	rev := griMethylRecombination(true)
	expl := rxn("H+O2=O+OH", chem.Elementary)
	expl.Rate = chem.Arrhenius{A: 3.5e9, B: -0.4, E: 7e4}
	expl.ReverseRate = &chem.Arrhenius{A: 4e7, B: 0.1, E: 2.2e5}
	act := griMethylRecombination(false)
	act.Form = chem.ChemicallyActivated
	tb := rxn("H+O=OH", chem.ThreeBody)
	tb.Rate = chem.Arrhenius{A: 5e5, B: -1, E: 0}
	tb.ThirdBody = &chem.ThirdBody{Default: 1}
	table, cheb := tableReaction(), chebReaction()
	for _, r := range []*chem.Reaction{&rev, &act, &table, &cheb} {
		r.Duplicate = true // same equations, different forms: deliberate repeats
	}
	base := handMechanism(rev, expl, act, table, cheb, tb)
	n := len(base.Reactions)
	C := make([]float64, len(handSpecies))
	for k := range C {
		C[k] = 0.5 + 0.1*float64(k)
	}
	rates := func(m *chem.Mechanism) (fw, rv []float64) {
		k := mustKinetics(t, m)
		fw, rv = make([]float64, n), make([]float64, n)
		k.RatesOfProgress(1400, C, fw, rv, make([]float64, n))
		return fw, rv
	}
	f0, r0 := rates(base)
	for i := 0; i < n; i++ {
		mult := make([]float64, n)
		for j := range mult {
			mult[j] = 1
		}
		mult[i] = 1.7
		scaled, err := base.WithRateMultipliers(mult)
		if err != nil {
			t.Fatal(err)
		}
		f1, r1 := rates(scaled)
		for j := 0; j < n; j++ {
			want := 1.0
			if j == i {
				want = 1.7
			}
			if f0[j] != 0 && relErr(f1[j]/f0[j], want) > 1e-12 {
				t.Errorf("scaling step %d (%s): forward rate of step %d changed by %.15g, want %g", i, base.Reactions[i].Equation, j, f1[j]/f0[j], want)
			}
			if r0[j] != 0 && relErr(r1[j]/r0[j], want) > 1e-12 {
				t.Errorf("scaling step %d (%s): reverse rate of step %d changed by %.15g, want %g", i, base.Reactions[i].Equation, j, r1[j]/r0[j], want)
			}
		}
	}
	if f, _ := rates(base); relErr(f[0], f0[0]) != 0 || relErr(f[4], f0[4]) != 0 {
		t.Error("the original mechanism changed")
	}
	if _, err := base.WithRateMultipliers(make([]float64, n)); err == nil {
		t.Error("zero multipliers accepted")
	}
}
