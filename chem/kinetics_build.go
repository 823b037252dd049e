package chem

import (
	"fmt"
	"math"
	"sort"
)

// maxRepeatedOrder is the largest integer exponent applied by repeated
// multiplication; larger ones go through math.Pow.
const maxRepeatedOrder = 6

// addReaction prepares reaction r into d, appending to the flat slices.
func (km *kineticsModel) addReaction(r *Reaction, d *reactionData) error {
	d.form = r.Form
	d.thirdBdy = -1
	switch {
	case !r.Reversible:
		d.reverse = irreversible
	case r.ReverseRate != nil:
		d.reverse = reverseExplicit
		rr, err := newArrhenius(*r.ReverseRate)
		if err != nil {
			return fmt.Errorf("reverse rate: %w", err)
		}
		d.revRate = rr
	default:
		d.reverse = reverseFromKc
	}

	var err error
	d.fBeg = int32(len(km.facs))
	if err = km.addFactors(r.Reactants, r.Orders); err != nil {
		return fmt.Errorf("forward orders: %w", err)
	}
	d.fEnd = int32(len(km.facs))
	d.rBeg = d.fEnd
	if d.reverse != irreversible {
		if err = km.addFactors(r.Products, r.ReverseOrders); err != nil {
			return fmt.Errorf("reverse orders: %w", err)
		}
	}
	d.rEnd = int32(len(km.facs))
	d.nuBeg = int32(len(km.nus))
	km.addNetStoichiometry(r, d)
	d.nuEnd = int32(len(km.nus))

	switch r.Form {
	case Elementary:
		d.rate, err = newArrhenius(r.Rate)
	case ThreeBody:
		if d.rate, err = newArrhenius(r.Rate); err == nil {
			d.thirdBdy, err = km.addThirdBody(r.ThirdBody)
		}
	case Falloff, ChemicallyActivated:
		if d.thirdBdy, err = km.addThirdBody(r.ThirdBody); err == nil {
			d.sub = int32(len(km.falloffs))
			err = km.addFalloff(r.FalloffRate, r.Form == ChemicallyActivated)
		}
	case PressureTable:
		d.sub = int32(len(km.plogs))
		err = km.addTable(r.PressureRates)
	case Chebyshev:
		d.sub = int32(len(km.chebs))
		err = km.addChebyshev(r.ChebyshevRate)
	default:
		err = fmt.Errorf("unknown rate form %d", r.Form)
	}
	if err != nil {
		return err
	}
	km.maxSparse = max(km.maxSparse, int(d.rEnd-d.fBeg))
	km.addCompact(d)
	return nil
}

// addCompact appends the fixed-slot copies of d's factors and 1/Kc product
// (see massAction, kcProduct).
func (km *kineticsModel) addCompact(d *reactionData) {
	pad := int32(km.nsp)
	ma := massAction{f: [3]int32{pad, pad, pad}, r: [3]int32{pad, pad, pad}}
	slots := func(fs []factor, dst *[3]int32) {
		if len(fs) > 3 {
			ma.general = true
			return
		}
		for n, f := range fs {
			if f.ord != 1 {
				ma.general = true
			}
			dst[n] = f.sp
		}
	}
	slots(km.facs[d.fBeg:d.fEnd], &ma.f)
	slots(km.facs[d.rBeg:d.rEnd], &ma.r)
	if d.form == ThreeBody {
		ma.mult = 1 + d.thirdBdy
	}
	km.mass = append(km.mass, ma)

	nus := km.nus[d.nuBeg:d.nuEnd]
	one := int32(4 * km.nsp)
	kp := kcProduct{idx: [4]int32{one, one, one, one}, std: int32(d.dnu) + 2, sp: [4]int32{pad, pad, pad, pad},
		usable: len(nus) <= 4 && d.dnu == math.Trunc(d.dnu) && math.Abs(d.dnu) <= 2}
	code := map[float64]int32{1: 0, -1: 1, 2: 2, -2: 3} // gPow slot of exp(nu g/RT)
	for n, st := range nus {
		if n >= 4 {
			break
		}
		kp.sp[n], kp.nuA[n] = st.sp, math.Abs(st.nu)
		c, ok := code[st.nu]
		kp.usable = kp.usable && ok
		kp.idx[n] = 4*st.sp + c
	}
	if !kp.usable {
		kp.std = 2
	}
	if d.reverse == reverseFromKc {
		km.kcs = append(km.kcs, kp)
	}
}

// addToLists enters reaction i into the per-T and per-call work lists.
func (km *kineticsModel) addToLists(i int32) {
	d := &km.rx[i]
	simple := d.form == Elementary || d.form == ThreeBody
	if !simple {
		km.pdep = append(km.pdep, i)
	}
	if d.form == Falloff || d.form == ChemicallyActivated {
		km.tbNeedsLog[d.thirdBdy] = true
	}
	if simple && !d.rate.constant {
		km.arrRx = append(km.arrRx, i)
		km.arrLnA = append(km.arrLnA, d.rate.lnA)
		km.arrB = append(km.arrB, d.rate.b)
		km.arrER = append(km.arrER, d.rate.eR)
		km.arrSign = append(km.arrSign, d.rate.sign)
	}
	switch d.reverse {
	case reverseFromKc:
		km.kcRx = append(km.kcRx, i)
		if simple {
			km.simpleKcRx = append(km.simpleKcRx, i)
		}
	case reverseExplicit:
		km.explRx = append(km.explRx, i)
	}
}

// addFactors appends the concentration factors of one side: each species'
// combined coefficient, or its order from orders; species that appear only
// in orders are added with that order. Integer orders 1..maxRepeatedOrder
// become repeated unit entries.
func (km *kineticsModel) addFactors(side []Participant, orders map[int]float64) error {
	var sp []int
	coef := map[int]float64{}
	for _, p := range side {
		if _, seen := coef[p.Species]; !seen {
			sp = append(sp, p.Species)
		}
		coef[p.Species] += p.Coefficient
	}
	extra := make([]int, 0, len(orders))
	for s, o := range orders {
		if s < 0 || s >= km.nsp {
			return fmt.Errorf("species index %d out of range", s)
		}
		if !finite(o) {
			return fmt.Errorf("order %g of species %d is not finite", o, s)
		}
		if _, onSide := coef[s]; !onSide {
			extra = append(extra, s)
		}
	}
	sort.Ints(extra)
	for _, s := range append(sp, extra...) {
		o, given := orders[s]
		if !given {
			o = coef[s]
		}
		switch {
		case o == 0:
		case o == math.Trunc(o) && o > 0 && o <= maxRepeatedOrder:
			for n := 0; n < int(o); n++ {
				km.facs = append(km.facs, factor{sp: int32(s), ord: 1})
			}
		default:
			km.facs = append(km.facs, factor{sp: int32(s), ord: o})
		}
	}
	return nil
}

// addNetStoichiometry appends products-minus-reactants coefficients (zero
// net entries dropped) and sets Δν of d.
func (km *kineticsModel) addNetStoichiometry(r *Reaction, d *reactionData) {
	d.dnu = 0
	for _, p := range r.NetStoichiometry() {
		km.nus = append(km.nus, stoich{sp: int32(p.Species), nu: p.Coefficient})
		d.dnu += p.Coefficient
	}
}

// addThirdBody returns the index of the collider set tb, adding it unless
// an identical set exists (published mechanisms repeat a few sets many times).
func (km *kineticsModel) addThirdBody(tb *ThirdBody) (int32, error) {
	if tb == nil {
		return -1, fmt.Errorf("no collision efficiencies")
	}
	if !finite(tb.Default) {
		return -1, fmt.Errorf("default collision efficiency %g is not finite", tb.Default)
	}
	eff := make([]float64, km.nsp)
	for i := range eff {
		eff[i] = tb.Default
	}
	for s, e := range tb.Efficiencies {
		if s < 0 || s >= km.nsp {
			return -1, fmt.Errorf("collision efficiency for species index %d out of range", s)
		}
		if !finite(e) {
			return -1, fmt.Errorf("collision efficiency %g of species %d is not finite", e, s)
		}
		eff[s] = e
	}
	K := km.nsp
next:
	for t := 0; t < km.ntb; t++ {
		for j, e := range km.tbEff[t*K : t*K+K] {
			if e != eff[j] {
				continue next
			}
		}
		return int32(t), nil
	}
	km.tbEff = append(km.tbEff, eff...)
	km.tbNeedsLog = append(km.tbNeedsLog, false)
	km.ntb++
	return int32(km.ntb - 1), nil
}

func (km *kineticsModel) addFalloff(f *FalloffRate, chemAct bool) error {
	if f == nil {
		return fmt.Errorf("falloff form without limits")
	}
	if !(f.Low.A > 0) || !(f.High.A > 0) {
		return fmt.Errorf("falloff limits need positive pre-exponentials (low %g, high %g)", f.Low.A, f.High.A)
	}
	low, err := newArrhenius(f.Low)
	if err != nil {
		return fmt.Errorf("low-pressure limit: %w", err)
	}
	high, err := newArrhenius(f.High)
	if err != nil {
		return fmt.Errorf("high-pressure limit: %w", err)
	}
	fd := falloffData{low: low, high: high, chemAct: chemAct}
	switch {
	case f.Troe != nil && f.SRI != nil:
		return fmt.Errorf("both Troe and SRI broadening given")
	case f.Troe != nil:
		t := f.Troe
		if !finite(t.A) || !finite(t.T3) || !finite(t.T1) || (t.HasT2 && !finite(t.T2)) {
			return fmt.Errorf("Troe parameters a=%g T3=%g T1=%g T2=%g must be finite", t.A, t.T3, t.T1, t.T2)
		}
		fd.kind = troeForm
		fd.a, fd.t3, fd.t1, fd.t2 = t.A, t.T3, t.T1, t.T2
		fd.hasT3, fd.hasT1, fd.hasT2 = t.T3 != 0, t.T1 != 0, t.HasT2
	case f.SRI != nil:
		s := f.SRI
		if !finite(s.A) || !finite(s.B) || !finite(s.C) || !finite(s.E) || !(s.D > 0) || !finite(s.D) {
			return fmt.Errorf("SRI parameters a=%g b=%g c=%g d=%g e=%g: need finite values and d > 0 (d = 1 in the 3-parameter form)",
				s.A, s.B, s.C, s.D, s.E)
		}
		fd.kind = sriForm
		fd.sa, fd.sb, fd.sc, fd.lnSD, fd.se = s.A, s.B, s.C, math.Log(s.D), s.E
		fd.hasSC = s.C != 0
	}
	km.falloffs = append(km.falloffs, fd)
	return nil
}

// addTable groups the sets by pressure (equal pressures summed).
func (km *kineticsModel) addTable(rates []PressureRate) error {
	if len(rates) == 0 {
		return fmt.Errorf("pressure table with no pressures")
	}
	pd := plogData{lvlBeg: int32(len(km.lvlLnP))}
	for n, pr := range rates {
		if !(pr.P > 0) || math.IsInf(pr.P, 0) {
			return fmt.Errorf("pressure table entry %d: pressure %g Pa must be positive and finite", n+1, pr.P)
		}
		if n > 0 && pr.P < rates[n-1].P {
			return fmt.Errorf("pressure table not sorted by pressure at entry %d", n+1)
		}
		a, err := newArrhenius(pr.Rate)
		if err != nil {
			return fmt.Errorf("pressure table entry %d (%g Pa): %w", n+1, pr.P, err)
		}
		if n == 0 || pr.P != rates[n-1].P {
			if n > 0 {
				km.lvlSetBeg = append(km.lvlSetBeg, int32(len(km.sets)))
			}
			km.lvlLnP = append(km.lvlLnP, math.Log(pr.P))
		}
		km.sets = append(km.sets, a)
	}
	km.lvlSetBeg = append(km.lvlSetBeg, int32(len(km.sets)))
	pd.lvlEnd = int32(len(km.lvlLnP))
	km.plogs = append(km.plogs, pd)
	return nil
}

func (km *kineticsModel) addChebyshev(c *ChebyshevRate) error {
	if c == nil || len(c.Coeffs) == 0 || len(c.Coeffs[0]) == 0 {
		return fmt.Errorf("Chebyshev form with no coefficients")
	}
	if !(c.TMin > 0 && c.TMax > c.TMin && c.PMin > 0 && c.PMax > c.PMin) || math.IsInf(c.TMax, 0) || math.IsInf(c.PMax, 0) {
		return fmt.Errorf("Chebyshev ranges need 0 < TMin < TMax and 0 < PMin < PMax (finite)")
	}
	nT, nP := len(c.Coeffs), len(c.Coeffs[0])
	cd := chebData{
		nT: nT, nP: nP,
		coefBeg:  len(km.chebCoef),
		cacheBeg: km.chebCache,
		invTMin:  1 / c.TMin, invTMax: 1 / c.TMax,
		lgPMin: math.Log10(c.PMin), lgPMax: math.Log10(c.PMax),
		dPrdlnP: 2 / (math.Log(c.PMax) - math.Log(c.PMin)),
	}
	for i, row := range c.Coeffs {
		if len(row) != nP {
			return fmt.Errorf("Chebyshev coefficients: row %d has %d entries, row 1 has %d", i+1, len(row), nP)
		}
		for j, v := range row {
			if !finite(v) {
				return fmt.Errorf("Chebyshev coefficient (%d,%d) = %g is not finite", i+1, j+1, v)
			}
		}
		km.chebCoef = append(km.chebCoef, row...)
	}
	km.chebCache += nP
	km.maxChebLen = max(km.maxChebLen, nT, nP)
	km.chebs = append(km.chebs, cd)
	return nil
}

// indexBySpecies builds the species-major copy of the net stoichiometry.
func (km *kineticsModel) indexBySpecies() {
	km.bySpBeg = make([]int32, km.nsp+1)
	for _, st := range km.nus {
		km.bySpBeg[st.sp+1]++
	}
	for k := 0; k < km.nsp; k++ {
		km.bySpBeg[k+1] += km.bySpBeg[k]
	}
	km.bySpRx = make([]int32, len(km.nus))
	km.bySpNu = make([]float64, len(km.nus))
	next := append([]int32(nil), km.bySpBeg[:km.nsp]...)
	for i := range km.rx {
		for _, st := range km.nus[km.rx[i].nuBeg:km.rx[i].nuEnd] {
			km.bySpRx[next[st.sp]], km.bySpNu[next[st.sp]] = int32(i), st.nu
			next[st.sp]++
		}
	}
}
