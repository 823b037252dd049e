package fuel

import (
	"fmt"
	"math"

	"flame1d/internal/dense"
	"flame1d/thermo"
)

// combustionEnthalpies returns h(298.15 K) in J/mol of CO2, H2O (gas) and
// O2 from the set's own thermo, found by composition, so that heating
// values round-trip with thermo.SpeciesSet.LowerHeatingValue.
func combustionEnthalpies(set *thermo.SpeciesSet) (hCO2, hH2O, hO2 float64, err error) {
	find := func(c, h, o float64, name string) (float64, error) {
		for k := range set.Species {
			sp := &set.Species[k]
			if sp.Condensed {
				continue
			}
			cc, hh, oo, other := speciesAtoms(sp.Composition)
			if !other && cc == c && hh == h && oo == o {
				return sp.FormationEnthalpy(), nil
			}
		}
		return 0, fmt.Errorf("the mechanism has no %s species, needed to relate the heating value to the enthalpy of formation", name)
	}
	if hCO2, err = find(1, 0, 2, "CO2"); err != nil {
		return
	}
	if hH2O, err = find(0, 2, 1, "H2O"); err != nil {
		return
	}
	hO2, err = find(0, 0, 2, "O2")
	return
}

// FormationEnthalpyFromLHV returns the enthalpy of formation at 298.15 K
// (J/mol) of a fuel of formula f whose lower heating value is lhv (J/kg):
// from the complete combustion C_xH_yO_z + (x + y/4 - z/2) O2 -> x CO2 +
// (y/2) H2O(g),
//
//	Δh_f(fuel) = LHV W + x h(CO2) + (y/2) h(H2O) - (x + y/4 - z/2) h(O2)
//
// with the product enthalpies from the set.
func FormationEnthalpyFromLHV(set *thermo.SpeciesSet, f Formula, lhv float64) (float64, error) {
	hCO2, hH2O, hO2, err := combustionEnthalpies(set)
	if err != nil {
		return 0, err
	}
	return lhv*f.MolarMass() + f.C*hCO2 + f.H/2*hH2O - f.OxygenDemand()*hO2, nil
}

// HHVMinusLHV returns HHV - LHV in J/kg for formula f: the condensation
// enthalpy of the product water, (y/2) Δh_vap(H2O, 298.15 K) / W.
func HHVMinusLHV(f Formula) float64 {
	return f.H / 2 * thermo.WaterVaporisationEnthalpy / f.MolarMass()
}

// EstimateStandardEntropy returns an estimate of s°(298.15 K, 1 atm) in
// J/(mol K) for the gaseous fuel from its formula:
//
//	s° ≈ 150.0 + 35.3 n_C + 1.9 n_H
//
// an atom-additive fit through the ideal-gas entropies of the n-alkanes
// and 1-alkenes (n-hexane 388.4, 1-hexene 384.6 J/(mol K) and the mean
// increment of 39.1 J/(mol K) per CH2 between C4 and C6; NIST Chemistry
// WebBook values quoted from memory). Oxygen is ignored. Branched and
// cyclic isomers have lower entropies (cyclohexane is some 85 J/(mol K)
// below 1-hexene), so the estimate is an upper-end value for real fuels.
// It matters only for reverse rates and equilibria that involve the
// pseudo-species: the global cracking step is irreversible, and the flame
// does not use it otherwise.
func EstimateStandardEntropy(f Formula) float64 { return 150.0 + 35.3*f.C + 1.9*f.H }

// Temperature limits of the pseudo-species polynomials, K.
const pseudoTMid = 1000.0

// PseudoThermo fits NASA-7 polynomials for a lumped fuel that cracks to
// the pool p (moles of set species per mole of fuel):
//
//   - cp(T) = sum_i ν_i cp_i(T), the pool's heat capacity per mole of fuel
//     (atom and group additivity: the pool holds the same atoms; the
//     extra molecules' translations and rotations roughly offset the
//     vibrations lost with the broken bonds); fitted by least squares on
//     [TLow, 1000 K] and [1000 K, THigh], with cp and dcp/dT continuous at
//     1000 K, TLow and THigh being the narrowest fitted range of the pool
//     species (TLow at most 298.15 K);
//   - h(298.15 K) = hf exactly (the enthalpy of formation from the heating
//     value), h continuous at 1000 K;
//   - s°(298.15 K) = s298 (J/(mol K)), s continuous at 1000 K.
//
// It returns the polynomials and the largest relative deviation of the
// fitted cp from the pool sum on the fitting samples.
func PseudoThermo(set *thermo.SpeciesSet, p *poolAmounts, hf, s298 float64) (thermo.NASA7, float64, error) {
	tLow, tHigh := 0.0, math.Inf(1)
	for _, k := range p.index {
		th := &set.Species[k].Thermo
		tLow = math.Max(tLow, th.TLow)
		tHigh = math.Min(tHigh, th.THigh)
	}
	tLow = math.Min(tLow, thermo.ReferenceTemperature)
	if !(tHigh > pseudoTMid+100) {
		return thermo.NASA7{}, 0, fmt.Errorf("pseudo-species thermo: the pool species' common fitted range ends at %g K, too low to build polynomials up to flame temperatures", tHigh)
	}
	poolCpR := func(T float64) float64 {
		c := 0.0
		for i, k := range p.index {
			c += p.moles[i] * set.Species[k].Thermo.CpR(T)
		}
		return c
	}
	// Unknowns: low α0..α4, high α0..α4 in τ = T/1000; constraints on cp and
	// dcp/dτ at τ = 1. Solved as the KKT system of equality-constrained
	// least squares.
	const nS = 80
	type sample struct{ tau, cp float64 }
	var lo, hi []sample
	for i := 0; i < nS; i++ {
		// Chebyshev-like clustering toward the ends of each range.
		u := 0.5 - 0.5*math.Cos(math.Pi*float64(i)/float64(nS-1))
		T := tLow + u*(pseudoTMid-tLow)
		lo = append(lo, sample{T / 1000, poolCpR(T)})
		T = pseudoTMid + u*(tHigh-pseudoTMid)
		hi = append(hi, sample{T / 1000, poolCpR(T)})
	}
	const n = 12 // 10 coefficients + 2 multipliers
	K := make([]float64, n*n)
	r := make([]float64, n)
	accumulate := func(ss []sample, off int) {
		for _, s := range ss {
			w := 1 / (s.cp * s.cp) // relative least squares
			pw := [5]float64{1, s.tau, s.tau * s.tau, s.tau * s.tau * s.tau, s.tau * s.tau * s.tau * s.tau}
			for a := 0; a < 5; a++ {
				for b := 0; b < 5; b++ {
					K[(off+a)*n+off+b] += w * pw[a] * pw[b]
				}
				r[off+a] += w * pw[a] * s.cp
			}
		}
	}
	accumulate(lo, 0)
	accumulate(hi, 5)
	// cp continuity: sum α_low - sum α_high = 0 at τ = 1; slope likewise.
	for a := 0; a < 5; a++ {
		K[10*n+a], K[10*n+5+a] = 1, -1
		K[a*n+10], K[(5+a)*n+10] = 1, -1
		d := float64(a)
		K[11*n+a], K[11*n+5+a] = d, -d
		K[a*n+11], K[(5+a)*n+11] = d, -d
	}
	// The slope row is zero for a = 0; the system stays regular because
	// the continuity rows are independent. The normal equations in powers
	// of T/1000 (up to 5) have condition numbers near 1e11, which keeps
	// about five significant digits; the fitted cp is compared with the
	// pool's below and the deviation reported.
	sol := r
	if err := dense.Solve(K, sol, n, 1e15); err != nil {
		return thermo.NASA7{}, 0, fmt.Errorf("pseudo-species thermo: cp fit failed: %v", err)
	}
	var poly thermo.NASA7
	poly.TLow, poly.TMid, poly.THigh = tLow, pseudoTMid, tHigh
	for a := 0; a < 5; a++ {
		sc := math.Pow(1e-3, float64(a))
		poly.Low[a] = sol[a] * sc
		poly.High[a] = sol[5+a] * sc
	}
	// Enthalpy: h/R = a6 + ∫cp/R dT; a6 from h(298.15) = hf, then continuity.
	const Tref = thermo.ReferenceTemperature
	poly.Low[5] = 0
	poly.Low[5] = hf/thermo.GasConstant - Tref*poly.HRT(Tref)
	lowOnly := thermo.NASA7{TMid: math.Inf(1), Low: poly.Low}
	highOnly := thermo.NASA7{TMid: math.Inf(-1), High: poly.High}
	poly.High[5] = 0
	highOnly.High[5] = 0
	poly.High[5] = pseudoTMid * (lowOnly.HRT(pseudoTMid) - highOnly.HRT(pseudoTMid))
	poly.Low[6] = 0
	lowOnly.Low[6] = 0
	poly.Low[6] = s298/thermo.GasConstant - lowOnly.SR(Tref)
	lowOnly.Low[6] = poly.Low[6]
	highOnly.High[6] = 0
	poly.High[6] = lowOnly.SR(pseudoTMid) - highOnly.SR(pseudoTMid)

	worst := 0.0
	for _, ss := range [][]sample{lo, hi} {
		for _, s := range ss {
			worst = math.Max(worst, math.Abs(poly.CpR(s.tau*1000)-s.cp)/s.cp)
		}
	}
	return poly, worst, nil
}
