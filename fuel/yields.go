package fuel

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"flame1d/internal/dense"
	"flame1d/thermo"
)

// Adjustment records one change made to a measured yield while closing the
// element balances.
type Adjustment struct {
	Species string  `json:"species"`
	Given   float64 `json:"given_mol_per_mol_fuel"`
	Closed  float64 `json:"closed_mol_per_mol_fuel"`
	Reason  string  `json:"reason"`
}

func (a Adjustment) String() string {
	return fmt.Sprintf("%s: %.6g -> %.6g mol/mol fuel (%s)", a.Species, a.Given, a.Closed, a.Reason)
}

// poolAmounts is a pool on a species set: indices into the set and moles
// per mole of fuel.
type poolAmounts struct {
	index []int
	moles []float64
}

// yieldTolerance is the relative element residual below which measured
// yields are taken to close as given (no adjustment): round-off of the
// yields' own arithmetic, well below any measurement.
const yieldTolerance = 1e-12

// CloseYields turns measured yields (moles of pool species per mole of
// fuel, possibly incomplete) into a pool that holds exactly the fuel's
// atoms. The closure unknowns are a common scale factor s on every given
// yield (when scale is true) and one amount change per balance species;
// the equations are the C, H (and, when the fuel or a pool species holds
// it, O) balances
//
//	s sum_i a_ei y_i + sum_j a_ej d_j = f_e,
//
// which must be as many as the unknowns. Yields that already close to
// 1e-12 are kept unchanged. A closure that would need a negative amount,
// or a non-positive scale, is refused with an explanation. Balance
// defaults to H2 (H2 and CO for a fuel with oxygen); the species names are
// those of set.
func CloseYields(set *thermo.SpeciesSet, f Formula, yields map[string]float64, balance []string, scale bool) (*poolAmounts, []Adjustment, error) {
	if len(yields) == 0 {
		return nil, nil, fmt.Errorf("cracking.yields is empty: give moles of pool species per mole of fuel, e.g. yields = { C2H4 = 3.0, CH4 = 1.2 }")
	}
	names := make([]string, 0, len(yields))
	for n := range yields {
		names = append(names, n)
	}
	sort.Strings(names)
	p := &poolAmounts{}
	pos := map[int]int{} // set index -> position in p
	hasO := f.O > 0
	add := func(what, name string) (int, error) {
		k := set.Index(name)
		if k < 0 {
			return 0, fmt.Errorf("%s: species %q is not in the mechanism%s", what, name, setSuggestion(set, name))
		}
		sp := &set.Species[k]
		if sp.Condensed {
			return 0, fmt.Errorf("%s: %s is a condensed species; a flame pool is gas", what, sp.Name)
		}
		c, h, o, other := speciesAtoms(sp.Composition)
		if other {
			return 0, fmt.Errorf("%s: %s holds elements other than C, H and O, which the fuel does not have", what, sp.Name)
		}
		if c == 0 && h == 0 {
			return 0, fmt.Errorf("%s: %s holds neither carbon nor hydrogen and cannot be a cracking product", what, sp.Name)
		}
		if o > 0 {
			hasO = true
		}
		if i, ok := pos[k]; ok {
			return i, nil
		}
		pos[k] = len(p.index)
		p.index = append(p.index, k)
		p.moles = append(p.moles, 0)
		return pos[k], nil
	}
	given := make([]float64, 0, len(names))
	for _, n := range names {
		y := yields[n]
		if !(y >= 0) || math.IsInf(y, 0) {
			return nil, nil, fmt.Errorf("cracking.yields: %s = %g: yields must be non-negative numbers (mol per mol fuel)", n, y)
		}
		i, err := add("cracking.yields", n)
		if err != nil {
			return nil, nil, err
		}
		if i < len(given) {
			return nil, nil, fmt.Errorf("cracking.yields: %s is given twice (names differ only in case)", set.Species[p.index[i]].Name)
		}
		given = append(given, y)
		p.moles[i] = y
	}
	if len(balance) == 0 {
		balance = []string{"H2"}
		if f.O > 0 {
			balance = append(balance, "CO")
		}
	}
	bal := make([]int, len(balance))
	for j, n := range balance {
		i, err := add("cracking.balance", strings.TrimSpace(n))
		if err != nil {
			return nil, nil, err
		}
		for _, b := range bal[:j] {
			if b == i {
				return nil, nil, fmt.Errorf("cracking.balance names %s twice", set.Species[p.index[i]].Name)
			}
		}
		bal[j] = i
	}
	for len(given) < len(p.index) {
		given = append(given, 0)
	}

	elems := []string{"C", "H"}
	if hasO {
		elems = append(elems, "O")
	}
	nE := len(elems)
	atoms := func(i int, e string) float64 { return atomCount(set.Species[p.index[i]].Composition, e) }
	target := make([]float64, nE)
	held := make([]float64, nE)
	for r, e := range elems {
		target[r] = f.element(e)
		for i := range p.index {
			held[r] += atoms(i, e) * given[i]
		}
	}
	totalAtoms := f.C + f.H + f.O
	closes := true
	for r := range elems {
		if math.Abs(held[r]-target[r]) > yieldTolerance*math.Max(target[r], 1e-3*totalAtoms) {
			closes = false
		}
	}
	if closes {
		return p.withoutEmpty(given), nil, nil
	}

	nU := len(bal)
	if scale {
		nU++
	}
	if nU != nE {
		return nil, nil, fmt.Errorf("cracking: closing the %s balances needs exactly %d adjustable amounts, but scale_to_carbon = %v and balance = [%s] give %d; %s",
			strings.Join(elems, ", "), nE, scale, strings.Join(speciesNames(set, p.index, bal), ", "), nU, closureHint(nE, nU, hasO))
	}
	M := make([]float64, nE*nE)
	rhs := make([]float64, nE)
	for r, e := range elems {
		c := 0
		if scale {
			M[r*nE] = held[r]
			c = 1
			rhs[r] = target[r]
		} else {
			rhs[r] = target[r] - held[r]
		}
		for j, i := range bal {
			M[r*nE+c+j] = atoms(i, e)
		}
	}
	sol := rhs
	if err := dense.Solve(M, sol, nE, 1e12); err != nil {
		return nil, nil, fmt.Errorf("cracking: the closure unknowns (%s) cannot close the %s balances independently: %s",
			closureUnknowns(set, p.index, bal, scale), strings.Join(elems, ", "), singularHint(scale, given))
	}
	s := 1.0
	if scale {
		s = sol[0]
		sol = sol[1:]
		if !(s > 0) {
			return nil, nil, fmt.Errorf("cracking: closing the balances needs the given yields scaled by %.4g, which is not positive: the balance species [%s] alone would have to carry more than the fuel's atoms; check the yields and the formula",
				s, strings.Join(speciesNames(set, p.index, bal), ", "))
		}
	}
	isBal := map[int]int{}
	for j, i := range bal {
		isBal[i] = j
	}
	for i := range p.moles {
		p.moles[i] = s * given[i]
		if j, ok := isBal[i]; ok {
			p.moles[i] += sol[j]
		}
	}
	for i, n := range p.moles {
		if n >= 0 {
			continue
		}
		if n > -1e-13*totalAtoms {
			p.moles[i] = 0
			continue
		}
		return nil, nil, negativeClosure(set, f, p, given, bal, i, s)
	}
	var adj []Adjustment
	for i, k := range p.index {
		if math.Abs(p.moles[i]-given[i]) <= 1e-12*math.Max(given[i], 1e-12) {
			continue
		}
		reason := fmt.Sprintf("all given yields scaled by %.8g to hold the fuel's atoms", s)
		// A balance change at round-off (or a negative zero) is none: the
		// scaling alone closed the balances.
		if j, ok := isBal[i]; ok && math.Abs(sol[j]) > 1e-12*math.Max(1, math.Abs(p.moles[i])) {
			reason = fmt.Sprintf("balance species: %+.6g mol/mol fuel to close the %s balances", sol[j], strings.Join(elems, ", "))
			if scale && given[i] > 0 {
				reason += fmt.Sprintf(" after scaling by %.8g", s)
			}
		}
		adj = append(adj, Adjustment{Species: set.Species[k].Name, Given: given[i], Closed: p.moles[i], Reason: reason})
	}
	return p.withoutEmpty(given), adj, nil
}

// withoutEmpty drops the species that end at zero and were not given
// (balance species the closure did not need).
func (p *poolAmounts) withoutEmpty(given []float64) *poolAmounts {
	keep := 0
	for i := range p.index {
		if p.moles[i] == 0 && given[i] == 0 {
			continue
		}
		p.index[keep], p.moles[keep] = p.index[i], p.moles[i]
		keep++
	}
	p.index, p.moles = p.index[:keep], p.moles[:keep]
	return p
}

func speciesNames(set *thermo.SpeciesSet, index, which []int) []string {
	out := make([]string, len(which))
	for j, i := range which {
		out[j] = set.Species[index[i]].Name
	}
	return out
}

func closureUnknowns(set *thermo.SpeciesSet, index, bal []int, scale bool) string {
	parts := speciesNames(set, index, bal)
	if scale {
		parts = append([]string{"common scale factor"}, parts...)
	}
	return strings.Join(parts, ", ")
}

func closureHint(nE, nU int, hasO bool) string {
	if nU < nE {
		if hasO {
			return "add a balance species for each missing unknown (an oxygen carrier such as CO or H2O for the O balance)"
		}
		return "add a balance species (e.g. balance = [\"H2\"]) or set scale_to_carbon = true"
	}
	return "name fewer balance species, or set scale_to_carbon = false when the balance species close every element themselves"
}

func singularHint(scale bool, given []float64) string {
	sum := 0.0
	for _, g := range given {
		sum += g
	}
	if scale && sum == 0 {
		return "only balance species are given, so scaling has nothing to act on; give measured yields or set scale_to_carbon = false"
	}
	return "two unknowns change the elements in the same proportion (e.g. two balance species of equal H/C, or a balance species with the same make-up as the given yields); choose balance species of different H/C"
}

// negativeClosure explains a closure that needs species i at a negative
// amount.
func negativeClosure(set *thermo.SpeciesSet, f Formula, p *poolAmounts, given []float64, bal []int, i int, s float64) error {
	var c, h float64
	for j, k := range p.index {
		isBal := false
		for _, b := range bal {
			isBal = isBal || b == j
		}
		if isBal {
			continue
		}
		cj, hj, _, _ := speciesAtoms(set.Species[k].Composition)
		c += cj * given[j]
		h += hj * given[j]
	}
	name := set.Species[p.index[i]].Name
	msg := fmt.Sprintf("cracking: the measured yields cannot come from this fuel: closing the balances needs %s = %.4g mol per mol fuel (given %.4g), a negative amount",
		name, p.moles[i], given[i])
	if c > 0 {
		hc := h / c
		switch {
		case hc > f.HToC():
			msg += fmt.Sprintf(". The given yields (without the balance species) carry H/C = %.4g, richer in hydrogen than the fuel (H/C = %.4g); "+
				"a fuel cannot crack into a pool with more hydrogen per carbon than itself. Check the formula and the yields, "+
				"or name a hydrogen-poorer balance species (e.g. C2H2 or an aromatic) in cracking.balance", hc, f.HToC())
		case hc < f.HToC():
			msg += fmt.Sprintf(". The given yields (without the balance species) carry H/C = %.4g, poorer in hydrogen than the fuel (H/C = %.4g); "+
				"name a hydrogen-richer balance species (H2, CH4) in cracking.balance", hc, f.HToC())
		}
	}
	if s != 1 {
		msg += fmt.Sprintf(" (after scaling the given yields by %.6g)", s)
	}
	return fmt.Errorf("%s", msg)
}

// setSuggestion names the species of set closest to name.
func setSuggestion(set *thermo.SpeciesSet, name string) string {
	return nearestName(name, set.Len(), func(i int) string { return set.Species[i].Name })
}
