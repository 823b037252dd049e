package chem

// ProductionRateDerivatives writes the net production rates wdot (as
// NetProductionRates) and their derivatives at (T, C):
//
//	dWdC[i*K + j] = d wdot_i / d C_j   [1/s], K = NumSpecies (row-major, i rows)
//	dWdT[i]       = d wdot_i / d T at constant C   [mol/(m^3 s K)].
//
// Everything is analytic, differentiating exactly what NetProductionRates
// evaluates: the mass-action products; [M] of the ThreeBody form; the
// falloff forms through [M] (Pr and the Troe or SRI broadening F(T, Pr));
// pressure tables and Chebyshev series through P = (sum C) R T, which moves
// with every C_j and with T; Arrhenius and Kc in T (d ln Kc/dT =
// (sum_k nu_k h_k/(R T) - Δν)/T). Where NetProductionRates applies a guard
// (clipped negative C under a fractional exponent, clipped negative [M] in
// falloff, a table or Chebyshev range end, the Pr floor) the derivative is
// that of the guarded function: zero in the flat direction. The only
// deviation from exactness is at the NASA-7 midpoint temperature and at the
// tabulated pressures, where the functions have kinks and one side's
// derivative is returned.
func (k *Kinetics) ProductionRateDerivatives(T float64, C, wdot, dWdC, dWdT []float64) {
	m, w := k.m, &k.w
	K := m.nsp
	checkLen("C", len(C), K)
	checkLen("wdot", len(wdot), K)
	checkLen("dWdC", len(dWdC), K*K)
	checkLen("dWdT", len(dWdT), K)
	k.update(T, C, true)
	clear(wdot[:K])
	clear(dWdC[:K*K])
	clear(dWdT[:K])
	for i := range m.rx {
		r := &m.rx[i]
		kf, kr := w.kf[i], w.kr[i]
		pf := product(C, m.facs[r.fBeg:r.fEnd], w.facVal[r.fBeg:r.fEnd])
		pr := 0.0
		if r.reverse != irreversible {
			pr = product(C, m.facs[r.rBeg:r.rEnd], w.facVal[r.rBeg:r.rEnd])
		}
		mf := 1.0
		if r.form == ThreeBody {
			mf = w.thirdBody[r.thirdBdy]
		}
		// Same operation order as progress: wdot is bitwise that of
		// NetProductionRates.
		fw, bw := kf*pf, kr*pr
		if r.form == ThreeBody {
			fw *= mf
			bw *= mf
		}
		q := fw - bw
		dqdT := (w.dkfdT[i]*pf - w.dkrdT[i]*pr) * mf

		// Mass-action part: sparse entries (species, dq/dC).
		ns := 0
		ns = k.productDerivs(C, r.fBeg, r.fEnd, kf*mf, ns)
		if r.reverse != irreversible {
			ns = k.productDerivs(C, r.rBeg, r.rEnd, -kr*mf, ns)
		}
		// Part of the rate constants' dependence on C shared by kf and,
		// through kr = kf/Kc, by kr: d q/d X = dkf/dX (pf - pr/Kc).
		shared := pf
		if r.reverse == reverseFromKc {
			shared -= w.invKc[i] * pr
		}
		// dq/dC_j = tb eff_j + uniform + the sparse entries of species j.
		tb, uniform := 0.0, 0.0
		switch r.form {
		case ThreeBody:
			tb = kf*pf - kr*pr
		case Falloff, ChemicallyActivated:
			tb = w.dkfdX[i] * shared
		case PressureTable, Chebyshev:
			// d ln P/d C_j = 1/sum(C) for every j; dkfdX = dkf/d ln P is
			// non-zero only inside the pressure range, so sum(C) > 0.
			if g := w.dkfdX[i]; g != 0 {
				uniform = g / w.ctot * shared
			}
		}
		var eff []float64
		if tb != 0 {
			eff = m.tbEff[int(r.thirdBdy)*K : int(r.thirdBdy+1)*K]
		}
		for _, st := range m.nus[r.nuBeg:r.nuEnd] {
			sp, nu := int(st.sp), st.nu
			wdot[sp] += nu * q
			dWdT[sp] += nu * dqdT
			row := dWdC[sp*K : sp*K+K]
			if eff != nil {
				g := nu * tb
				for j, v := range eff {
					row[j] += g * v
				}
			}
			if uniform != 0 {
				u := nu * uniform
				for j := range row {
					row[j] += u
				}
			}
			for s := 0; s < ns; s++ {
				row[w.sparseSp[s]] += nu * w.sparseVal[s]
			}
		}
	}
}

// productDerivs appends scale * d(prod)/dC_sp for every factor of the range
// (factor values kept by the last product call) to the sparse list.
func (k *Kinetics) productDerivs(C []float64, beg, end int32, scale float64, ns int) int {
	m, w := k.m, &k.w
	for e := beg; e < end; e++ {
		d := 1.0
		f := m.facs[e]
		if f.ord != 1 {
			d = powFactorDeriv(C[f.sp], f.ord)
		}
		if d == 0 {
			continue
		}
		d *= scale
		for o := beg; o < end; o++ {
			if o != e {
				d *= w.facVal[o]
			}
		}
		w.sparseSp[ns], w.sparseVal[ns] = f.sp, d
		ns++
	}
	return ns
}
