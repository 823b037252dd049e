package chem

import (
	"fmt"
	"math"
)

// WithRateMultipliers returns a copy of m whose reaction i has its rate
// constant multiplied by f[i], forward and reverse alike, so the
// equilibrium constant and the shape of k(T, P) are kept and the rate of
// progress q_i becomes f[i]·q_i at every state. Each form is scaled where
// that holds exactly:
//
//   - Elementary, ThreeBody: A (and the explicit reverse A) times f;
//   - Falloff, ChemicallyActivated: A of both limits times f (Pr = k0[M]/k_inf
//     and the broadening F are unchanged, so k scales by f);
//   - PressureTable: A of every set times f (logarithmic interpolation in P
//     then scales by f);
//   - Chebyshev: log10 f added to Coeffs[0][0] (phi_0 = 1).
//
// This is the "pre-exponential factor" of flame-speed sensitivity analysis
// and the rate constant whose uncertainty factor UncertaintyFactor states.
// len(f) must equal the number of reactions and every f[i] be positive and
// finite. The species, thermo and transport data are shared with m; the
// reactions are deep copies where they change.
func (m *Mechanism) WithRateMultipliers(f []float64) (*Mechanism, error) {
	if len(f) != len(m.Reactions) {
		return nil, fmt.Errorf("rate multipliers: %d values for %d reactions", len(f), len(m.Reactions))
	}
	out := *m
	out.Reactions = make([]Reaction, len(m.Reactions))
	for i := range m.Reactions {
		r := m.Reactions[i]
		fi := f[i]
		if !(fi > 0) || math.IsInf(fi, 0) {
			return nil, fmt.Errorf("rate multiplier of reaction %d (%s) is %g; it must be positive and finite", i+1, r.Equation, fi)
		}
		if fi != 1 {
			scaleRate(&r, fi)
		}
		out.Reactions[i] = r
	}
	return &out, nil
}

// scaleRate multiplies the rate constants of r (a shallow copy whose
// pointer fields it replaces) by f.
func scaleRate(r *Reaction, f float64) {
	r.Rate.A *= f
	if r.ReverseRate != nil {
		rev := *r.ReverseRate
		rev.A *= f
		r.ReverseRate = &rev
	}
	if r.FalloffRate != nil {
		fo := *r.FalloffRate
		fo.Low.A *= f
		fo.High.A *= f
		r.FalloffRate = &fo
	}
	if r.PressureRates != nil {
		pr := append([]PressureRate(nil), r.PressureRates...)
		for j := range pr {
			pr[j].Rate.A *= f
		}
		r.PressureRates = pr
	}
	if r.ChebyshevRate != nil {
		ch := *r.ChebyshevRate
		ch.Coeffs = make([][]float64, len(r.ChebyshevRate.Coeffs))
		for j, row := range r.ChebyshevRate.Coeffs {
			ch.Coeffs[j] = append([]float64(nil), row...)
		}
		if len(ch.Coeffs) > 0 && len(ch.Coeffs[0]) > 0 {
			ch.Coeffs[0][0] += math.Log10(f)
		}
		r.ChebyshevRate = &ch
	}
}
