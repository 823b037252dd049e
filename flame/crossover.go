package flame

import (
	"fmt"
	"math"

	"flame1d/chem"
	"flame1d/thermo"
)

// The chain-branching crossover: below the temperature at which
//
//	2 · rate(H + O2 → O + OH) = rate(H + O2 (+M) → HO2 (+M)),
//
// the H atoms that branching needs are taken by the chain-terminating
// addition faster than they multiply, so hydrogen-oxygen chemistry cannot
// run away (the extended second explosion limit; Glassman & Yetter,
// Combustion, 4th ed. 2008, §3.3, and Law, Combustion Physics 2006, §8.2).
// The crossover rises with pressure ([M] grows): about 900-950 K at 1 atm
// (from memory). A premixed flame whose adiabatic temperature lies near or
// below it is extremely slow or has no steady planar solution in the model;
// the failure message says so.

// crossoverMargin is how far (K) above the crossover of the burned gas an
// adiabatic temperature counts as near it. On Burke et al. (2012), H2/air at
// phi 0.3 failed to start at 300 K/10 atm, 300 K/40 atm and 500 K/40 atm,
// adiabatic temperatures 77, 303 and 128 K below the crossover, and
// converged at 500 K/10 atm (99 K above; 0.0175 m/s) and 300 K/1 atm (194 K
// above; 0.031 m/s). 50 K flags the cases below and those closer than the
// slowest flame that converged (common practice, no source).
const crossoverMargin = 50

// chainReactions lists the reactions whose net change is H + O2 → O + OH
// (branching) and H + O2 → HO2 (termination, whatever the collider: a
// pressure-dependent form, [M], or an explicit species on both sides).
type chainReactions struct {
	branching, termination []int
	h, o2                  int // species indices
}

// findChainReactions returns the H/O2 chain reactions of m, or ok = false
// when m lacks H, O2, O, OH or HO2 or either kind of reaction.
func findChainReactions(m *chem.Mechanism) (chainReactions, bool) {
	idx := map[string]int{}
	for _, name := range []string{"H", "O2", "O", "OH", "HO2"} {
		i := m.SpeciesIndexFold(name)
		if i < 0 {
			return chainReactions{}, false
		}
		idx[name] = i
	}
	net := func(r *chem.Reaction) map[int]float64 {
		d := map[int]float64{}
		for _, p := range r.NetStoichiometry() {
			d[p.Species] = p.Coefficient
		}
		return d
	}
	same := func(d map[int]float64, want map[string]float64) bool {
		if len(d) != len(want) {
			return false
		}
		for name, v := range want {
			if d[idx[name]] != v {
				return false
			}
		}
		return true
	}
	cr := chainReactions{h: idx["H"], o2: idx["O2"]}
	for i := range m.Reactions {
		d := net(&m.Reactions[i])
		switch {
		case same(d, map[string]float64{"H": -1, "O2": -1, "O": 1, "OH": 1}):
			cr.branching = append(cr.branching, i)
		case same(d, map[string]float64{"H": -1, "O2": -1, "HO2": 1}):
			cr.termination = append(cr.termination, i)
		}
	}
	return cr, len(cr.branching) > 0 && len(cr.termination) > 0
}

// crossoverTemperature returns the chain-branching crossover temperature
// (K) at pressure P (Pa) in a gas of mass fractions Y (its collision
// efficiencies weigh [M]), and ok = false when the mechanism has no H/O2
// chain reactions or no crossover lies in 500-3000 K.
func crossoverTemperature(ph *physics, P float64, Y []float64) (float64, bool) {
	cr, ok := findChainReactions(ph.mech)
	if !ok {
		return 0, false
	}
	kin := ph.kinetics.Clone()
	nr := kin.NumReactions()
	fwd, rev, net := make([]float64, nr), make([]float64, nr), make([]float64, nr)
	C := make([]float64, ph.nSpecies)
	// excess is 2 r_branching - r_termination at T, with traces of H and O2
	// added so both rates are defined wherever the gas holds none.
	excess := func(T float64) float64 {
		sumYW := 0.0
		for k, y := range Y {
			sumYW += y / ph.molarMass[k]
		}
		ctot := P / (thermo.GasConstant * T)
		for k, y := range Y {
			C[k] = ctot * (y / ph.molarMass[k]) / sumYW
		}
		C[cr.h] += 1e-9 * ctot
		C[cr.o2] += 1e-9 * ctot
		kin.RatesOfProgress(T, C, fwd, rev, net)
		b, t := 0.0, 0.0
		for _, i := range cr.branching {
			b += fwd[i]
		}
		for _, i := range cr.termination {
			t += fwd[i]
		}
		return 2*b - t
	}
	lo, hi := 500.0, 3000.0
	if excess(lo) >= 0 || excess(hi) <= 0 {
		return 0, false
	}
	for hi-lo > 0.5 {
		mid := 0.5 * (lo + hi)
		if excess(mid) < 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi), true
}

// crossoverNote explains a failed cold start whose adiabatic temperature
// Tad lies near or below the chain-branching crossover of the burned gas
// eq at the inlet pressure; "" otherwise.
func crossoverNote(ph *physics, in Inlet, eq equilibriumState) string {
	Tx, ok := crossoverTemperature(ph, in.P, eq.Y)
	if !ok || eq.T > Tx+crossoverMargin || math.IsNaN(Tx) {
		return ""
	}
	where := "only %.0f K above"
	d := eq.T - Tx
	if d < 0 {
		where, d = "%.0f K below", -d
	}
	return fmt.Sprintf("the adiabatic flame temperature %.0f K lies "+where+" the temperature (%.0f K at this pressure) at which "+
		"chain branching H + O2 -> O + OH and chain termination H + O2 (+M) -> HO2 (+M) balance; near or below it the model's flame is "+
		"extremely slow or has no steady planar solution. A hotter mixture (preheat, richer, less diluted) or a lower pressure moves away from it",
		eq.T, d, Tx)
}
