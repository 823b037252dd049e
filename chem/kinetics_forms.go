package chem

import "math"

// Pressure-dependent rate forms. Each computes, for reaction i at the
// current (T, C), kf, its total T-derivative at constant C (which includes
// the change of P = (sum C) R T with T), and dkfdX: dkf/d[M] for falloff
// forms, dkf/d ln P for pressure tables and Chebyshev series.

// foStride is the number of cached per-T values of one falloff reaction:
// k0, k_inf, k0/k_inf, d ln k0/dT, d ln k_inf/dT, the broadening's T part
// with its derivative (log10 Fcent for Troe, ln of the SRI base), and
// log10(k0/k_inf).
const foStride = 8

// temperature fills the falloff's per-T cache c.
func (fo *falloffData) temperature(T, lnT, invT float64, c []float64) {
	l0, lInf := fo.low.logAbs(lnT, invT), fo.high.logAbs(lnT, invT)
	c[0] = math.Exp(l0)
	c[1] = math.Exp(lInf)
	if c[1] > 1e-290 && c[0] < 1e290 {
		c[2] = c[0] / c[1]
	} else { // a limit under- or overflowed (extreme T): the ratio in logarithms
		c[2] = math.Exp(math.Min(l0-lInf, maxExpArg))
	}
	c[3] = fo.low.dlnkdT(invT)
	c[4] = fo.high.dlnkdT(invT)
	c[7] = (l0 - lInf) / math.Ln10
	switch fo.kind {
	case troeForm:
		c[5], c[6] = fo.troeCenter(T, invT)
	case sriForm:
		c[5], c[6] = fo.sriBase(T, invT)
	default:
		c[5], c[6] = 0, 0
	}
}

// troeCenter returns log10 Fcent and d log10 Fcent/dT for
//
//	Fcent = (1-a) exp(-T/T3) + a exp(-T/T1) + exp(-T2/T)
//
// (Gilbert, Luther & Troe, Ber. Bunsenges. Phys. Chem. 87 (1983) 169). The
// last term is present only when the author gave T2. A term whose T3 or T1
// is written as 0 is dropped, the limit T3 -> 0+ of exp(-T/T3). Fcent <= 0
// (unphysical parameters) is floored at positiveFloor.
func (fo *falloffData) troeCenter(T, invT float64) (L, dLdT float64) {
	fc, dfc := 0.0, 0.0
	if fo.hasT3 {
		e := (1 - fo.a) * math.Exp(-T/fo.t3)
		fc += e
		dfc -= e / fo.t3
	}
	if fo.hasT1 {
		e := fo.a * math.Exp(-T/fo.t1)
		fc += e
		dfc -= e / fo.t1
	}
	if fo.hasT2 {
		e := math.Exp(-fo.t2 * invT)
		fc += e
		dfc += e * fo.t2 * invT * invT
	}
	if !(fc > positiveFloor) {
		return math.Log10(positiveFloor), 0
	}
	return math.Log10(fc), dfc / (fc * math.Ln10)
}

// sriBase returns ln B and d ln B/dT for the SRI base
// B = a exp(-b/T) + exp(-T/c) (Stewart, Larson & Golden, Combust. Flame 75
// (1989) 25). c = 0 drops the second term (its limit c -> 0+).
func (fo *falloffData) sriBase(T, invT float64) (lnB, dlnBdT float64) {
	e1 := fo.sa * math.Exp(-fo.sb*invT)
	B, dB := e1, e1*fo.sb*invT*invT
	if fo.hasSC {
		e2 := math.Exp(-T / fo.sc)
		B += e2
		dB -= e2 / fo.sc
	}
	if !(B > positiveFloor) {
		return math.Log(positiveFloor), 0
	}
	return math.Log(B), dB / B
}

// broadening returns ln F, d ln F/d ln Pr and the partial d ln F/dT at
// fixed Pr, given x = log10 Pr (already floored) and the cached T part.
//
// Troe (Gilbert, Luther & Troe 1983), with L = log10 Fcent:
//
//	c = -0.4 - 0.67 L, n = 0.75 - 1.27 L, u = x + c,
//	f1 = u/(n - 0.14 u),  log10 F = L/(1 + f1^2).
//
// Written as log10 F = L d^2/(d^2 + u^2) with d = n - 0.14 u, which is
// finite where d = 0 (there F = 1).
//
// SRI (Stewart, Larson & Golden 1989): F = d B^X T^e, X = 1/(1 + x^2).
func (fo *falloffData) broadening(x float64, c []float64, lnT, invT float64) (lnF, dlnFdlnPr, dlnFdT float64) {
	switch fo.kind {
	case troeForm:
		L, dL := c[5], c[6]
		n := 0.75 - 1.27*L
		u := x - 0.4 - 0.67*L
		d := n - 0.14*u
		s := d*d + u*u
		if s == 0 { // only for L = 0.59 (Fcent > 1): take the centre value
			return L * math.Ln10, 0, dL * math.Ln10
		}
		g := d * d / s
		s2 := s * s
		// dg/dx = -2 d u n/s^2; dg/dL = 2 d u (u d'_L - d u'_L)/s^2 with
		// u'_L = -0.67, d'_L = -1.27 + 0.14*0.67 = -1.1762.
		dgdx := -2 * d * u * n / s2
		dgdL := 2 * d * u * (-1.1762*u + 0.67*d) / s2
		return L * g * math.Ln10, L * dgdx, dL * (g + L*dgdL) * math.Ln10
	case sriForm:
		lnB, dlnB := c[5], c[6]
		X := 1 / (1 + x*x)
		// d ln F/d ln Pr = ln B dX/dx dx/d ln Pr, dx/d ln Pr = 1/ln 10.
		return fo.lnSD + X*lnB + fo.se*lnT, -2 * x * X * X * lnB / math.Ln10, X*dlnB + fo.se*invT
	}
	return 0, 0, 0
}

// falloffRate evaluates the falloff and chemically activated forms:
//
//	Pr = k0 [M]/k_inf,
//	falloff:              k = k_inf Pr/(1+Pr) F = k0 [M] F/(1+Pr),
//	chemically activated: k = k0 F/(1+Pr).
//
// A negative [M] (from negative concentrations) is clipped to 0 here; the
// falloff expressions are singular at Pr = -1.
func (k *Kinetics) falloffRate(i int, r *reactionData) {
	m, w := k.m, &k.w
	fo := &m.falloffs[r.sub]
	c := w.foT[foStride*int(r.sub) : foStride*int(r.sub+1)]
	k0, ratio, dlnk0, dlnkInf := c[0], c[2], c[3], c[4]
	M := w.thirdBody[r.thirdBdy]
	clipped := M < 0
	if clipped {
		M = 0
	}
	Pr := math.Min(ratio*M, 1e300)
	active := Pr >= prFloor
	// log10 Pr from the cached logarithms of k0/k_inf and [M] (one log per
	// collider set, not per reaction).
	x := math.Max(math.Log10(prFloor), math.Min(300, c[7]+w.lgM[r.thirdBdy]))
	lnF, dlnFdlnPr, dlnFdT := fo.broadening(x, c, w.lnT, w.invT)
	if !active {
		dlnFdlnPr = 0
	}
	F := math.Exp(lnF)
	dlnPrdT := dlnk0 - dlnkInf
	onePlus := 1 + Pr
	var kf, dlnkfdT, dkfdM float64
	if !fo.chemAct {
		kf = k0 * M * F / onePlus
		dlnkfdlnPr := 1/onePlus + dlnFdlnPr
		dlnkfdT = dlnkInf + dlnkfdlnPr*dlnPrdT + dlnFdT
		dkfdM = k0 * F / onePlus * dlnkfdlnPr
	} else {
		kf = k0 * F / onePlus
		dlnkfdT = dlnk0 + (dlnFdlnPr-Pr/onePlus)*dlnPrdT + dlnFdT
		dkfdM = -kf * ratio / onePlus
		if active {
			dkfdM += kf * dlnFdlnPr / M
		}
	}
	if clipped {
		dkfdM = 0
	}
	w.kf[i], w.dkfdT[i], w.dkfdX[i] = kf, kf*dlnkfdT, dkfdM
}

// tableRate evaluates the pressure-table form: between the bracketing
// tabulated pressures P1 <= P < P2,
//
//	ln k = ln k1 + (ln k2 - ln k1) (ln P - ln P1)/(ln P2 - ln P1),
//
// where k1, k2 are the sums of all Arrhenius sets given at P1 and P2. Below
// the lowest and above the highest pressure the end set is used unchanged
// (no extrapolation). If a bracketing sum is not positive (negative-A sets),
// the logarithm does not exist and k is interpolated linearly in ln P
// instead.
func (k *Kinetics) tableRate(i int, r *reactionData) {
	m, w := k.m, &k.w
	pl := &m.plogs[r.sub]
	lo, hi := int(pl.lvlBeg), int(pl.lvlEnd)-1
	lnP := w.lnP
	if lnP <= m.lvlLnP[lo] || lnP >= m.lvlLnP[hi] {
		j := lo
		if lnP > m.lvlLnP[lo] {
			j = hi
		}
		w.kf[i], w.dkfdT[i], w.dkfdX[i] = w.lvlK[3*j], w.lvlK[3*j+1], 0
		return
	}
	j := lo
	for lnP >= m.lvlLnP[j+1] {
		j++
	}
	k1, d1, l1 := w.lvlK[3*j], w.lvlK[3*j+1], w.lvlK[3*j+2]
	k2, d2, l2 := w.lvlK[3*j+3], w.lvlK[3*j+4], w.lvlK[3*j+5]
	span := m.lvlLnP[j+1] - m.lvlLnP[j]
	f := (lnP - m.lvlLnP[j]) / span
	var kf, dkdT, dkdlnP float64
	if k1 > 0 && k2 > 0 {
		kf = math.Exp(l1 + f*(l2-l1))
		dkdlnP = kf * (l2 - l1) / span
		dkdT = kf * ((1-f)*d1/k1 + f*d2/k2)
	} else {
		kf = k1 + f*(k2-k1)
		dkdlnP = (k2 - k1) / span
		dkdT = (1-f)*d1 + f*d2
	}
	// At constant C, d ln P/dT = 1/T.
	w.kf[i], w.dkfdT[i], w.dkfdX[i] = kf, dkdT+dkdlnP*w.invT, dkdlnP
}

// chebyshevSeries writes phi[n] = T_n(x) and dphi[n] = T_n'(x) = n U_{n-1}(x)
// (Chebyshev polynomials of the first and second kind, by their three-term
// recurrences).
func chebyshevSeries(x float64, phi, dphi []float64) {
	t0, t1 := 1.0, x
	u0, u1 := 1.0, 2*x
	phi[0], dphi[0] = 1, 0
	if len(phi) > 1 {
		phi[1], dphi[1] = x, 1
	}
	for n := 2; n < len(phi); n++ {
		t2 := 2*x*t1 - t0
		phi[n] = t2
		dphi[n] = float64(n) * u1
		t0, t1 = t1, t2
		u0, u1 = u1, 2*x*u1-u0
	}
}

func clampUnit(x float64) (float64, bool) {
	switch {
	case x < -1:
		return -1, true
	case x > 1:
		return 1, true
	}
	return x, false
}

// chebyshevTemperature contracts the T direction of the series at T:
// a_j(T) = sum_i Coeffs[i][j] T_i(Tr), and da_j/dT. T outside
// [TMin, TMax] is clamped to the range (the fit is not extrapolated).
func (k *Kinetics) chebyshevTemperature(cd *chebData, invT float64) {
	w := &k.w
	tr, clamped := clampUnit((2*invT - cd.invTMin - cd.invTMax) / (cd.invTMax - cd.invTMin))
	dTrdT := 0.0
	if !clamped {
		dTrdT = -2 * invT * invT / (cd.invTMax - cd.invTMin)
	}
	phi, dphi := w.phi[:cd.nT], w.dphi[:cd.nT]
	chebyshevSeries(tr, phi, dphi)
	coef := k.m.chebCoef[cd.coefBeg : cd.coefBeg+cd.nT*cd.nP]
	a := w.chebA[cd.cacheBeg : cd.cacheBeg+cd.nP]
	da := w.chebA[k.m.chebCache+cd.cacheBeg : k.m.chebCache+cd.cacheBeg+cd.nP]
	for j := range a {
		s, ds := 0.0, 0.0
		for i := range phi {
			c := coef[i*cd.nP+j]
			s += c * phi[i]
			ds += c * dphi[i]
		}
		a[j], da[j] = s, ds*dTrdT
	}
}

// chebyshevRate evaluates log10 k = sum_j a_j(T) T_j(Pr) with
// Pr = (2 log P - log PMin - log PMax)/(log PMax - log PMin); P outside
// [PMin, PMax] is clamped to the range.
func (k *Kinetics) chebyshevRate(i int, r *reactionData) {
	m, w := k.m, &k.w
	cd := &m.chebs[r.sub]
	lgP := w.lnP / math.Ln10
	pr, clamped := clampUnit((2*lgP - cd.lgPMin - cd.lgPMax) / (cd.lgPMax - cd.lgPMin))
	phi, dphi := w.phi[:cd.nP], w.dphi[:cd.nP]
	chebyshevSeries(pr, phi, dphi)
	a := w.chebA[cd.cacheBeg : cd.cacheBeg+cd.nP]
	da := w.chebA[m.chebCache+cd.cacheBeg : m.chebCache+cd.cacheBeg+cd.nP]
	lgk, dlgkdT, dlgkdPr := 0.0, 0.0, 0.0
	for j, p := range phi {
		lgk += a[j] * p
		dlgkdT += da[j] * p
		dlgkdPr += a[j] * dphi[j]
	}
	kf := math.Exp(math.Max(-maxExpArg, math.Min(maxExpArg, lgk*math.Ln10)))
	dkdlnP := 0.0
	if !clamped {
		dkdlnP = kf * math.Ln10 * dlgkdPr * cd.dPrdlnP
	}
	w.kf[i], w.dkfdT[i], w.dkfdX[i] = kf, kf*math.Ln10*dlgkdT+dkdlnP*w.invT, dkdlnP
}
