package chem

import (
	"fmt"
	"math"

	"flame1d/thermo"
)

// Kinetics evaluates reaction rates for one mechanism: forward and reverse
// rate constants, rates of progress, net molar production rates, heat
// release and their derivatives.
//
// A Kinetics is built once by NewKinetics. It is not safe for concurrent use:
// it keeps work arrays and a cache of the temperature-dependent quantities
// (rate constants, equilibrium constants, species g/RT and h/RT) of the last
// temperature seen, so that repeated calls at one temperature with different
// concentrations skip the exponentials. Clone gives an independent evaluator
// per goroutine; clones share the immutable reaction data.
//
// Every method takes the temperature T [K] and the molar concentrations C
// [mol/m^3], one per species. T must be positive and finite (a caller's
// invalid iterate T <= 0 yields NaN results; nothing panics). Where a rate
// depends on pressure (pressure tables and Chebyshev series) the pressure is
// the ideal-gas value P = (sum_k C_k) R T [Pa]. Slices shorter than the
// mechanism needs are a programming error and panic.
//
// Conventions, for all forms:
//
//   - Arrhenius k = A T^b exp(-E/(R T)) is evaluated as
//     sign(A) exp(ln|A| + b ln T - E/(R T)), so extreme published parameters
//     (A = 1.6e88 with b = -21) neither overflow nor lose digits in the
//     intermediate T^b; negative A is kept (duplicate steps whose sum is the
//     physical rate), A = 0 gives k = 0, b = E = 0 gives k = A without an
//     exponential.
//   - The forward rate of progress is kf [M] prod_k C_k^a_k; the exponent a_k
//     is the reactant's stoichiometric coefficient unless Orders gives it;
//     reverse likewise with the products and ReverseOrders. [M] is present
//     only for the ThreeBody form.
//   - Integer exponents up to 6 are applied by repeated multiplication, so a slightly
//     negative concentration (a Newton iterate) gives a small, smooth, signed
//     rate. For non-integer positive exponents, negative concentrations are
//     clipped to 0 (C^a is not real for C < 0). Negative exponents use
//     max(C, 1e-30 mol/m^3) so that a vanishing species gives a large but
//     finite rate instead of +Inf.
//   - The reverse rate constant is kr = kf/Kc with Kc the equilibrium
//     constant in concentration units (EquilibriumConstants; 1/Kc is
//     limited to [e^-700, e^700], see maxExpArg), unless the reaction gives
//     ReverseRate, which is then used as kr for every form (an Arrhenius
//     function of T only; it is not modulated by falloff or pressure).
//   - Collision efficiencies for [M] apply to ThreeBody, Falloff and
//     ChemicallyActivated reactions; a ThirdBody on a PressureTable or
//     Chebyshev reaction is ignored (their data already hold the pressure
//     dependence).
type Kinetics struct {
	m *kineticsModel // immutable, shared between clones
	w kineticsWork   // per-instance work arrays and per-T cache
}

// arrhenius is one Arrhenius set prepared for evaluation:
// k = sign exp(lnA + b ln T - eR/T), or the constant a when b = E = 0
// (a third of GRI-Mech 3.0's steps: no exponential needed).
type arrhenius struct {
	lnA, b, eR, sign float64 // eR = E/R in K
	a                float64 // A itself
	constant         bool
}

func newArrhenius(a Arrhenius) (arrhenius, error) {
	if !finite(a.A) || !finite(a.B) || !finite(a.E) {
		return arrhenius{}, fmt.Errorf("Arrhenius parameters A=%g b=%g E=%g J/mol must be finite", a.A, a.B, a.E)
	}
	r := arrhenius{b: a.B, eR: a.E / thermo.GasConstant, a: a.A, constant: a.B == 0 && a.E == 0}
	switch {
	case a.A > 0:
		r.lnA, r.sign = math.Log(a.A), 1
	case a.A < 0:
		r.lnA, r.sign = math.Log(-a.A), -1
	default: // A = 0: k = 0 at every T
		r.constant = true
	}
	return r, nil
}

// value returns k(T).
func (a *arrhenius) value(lnT, invT float64) float64 {
	if a.constant {
		return a.a
	}
	return a.sign * math.Exp(a.lnA+a.b*lnT-a.eR*invT)
}

// dlnkdT returns d ln k/dT = (b + E/(RT))/T.
func (a *arrhenius) dlnkdT(invT float64) float64 { return (a.b + a.eR*invT) * invT }

// logAbs returns ln|k(T)| (meaningful only when sign != 0).
func (a *arrhenius) logAbs(lnT, invT float64) float64 {
	return a.lnA + a.b*lnT - a.eR*invT
}

type reverseKind uint8

const (
	irreversible reverseKind = iota
	reverseFromKc
	reverseExplicit
)

// reactionData is a reaction prepared for evaluation. Ranges index the flat
// slices of kineticsModel.
type reactionData struct {
	form     RateForm
	reverse  reverseKind
	thirdBdy int32 // index into the third-body sets, -1 when none is used
	sub      int32 // index into falloffs, plogs or chebs, by form
	rate     arrhenius
	revRate  arrhenius
	fBeg     int32 // forward concentration factors [fBeg, fEnd)
	fEnd     int32
	rBeg     int32 // reverse concentration factors [rBeg, rEnd)
	rEnd     int32
	nuBeg    int32 // net stoichiometry (products minus reactants) [nuBeg, nuEnd)
	nuEnd    int32
	dnu      float64 // sum of net stoichiometric coefficients
}

type broadening uint8

const (
	lindemann broadening = iota
	troeForm
	sriForm
)

type falloffData struct {
	low, high arrhenius
	chemAct   bool
	kind      broadening
	// Troe
	a, t3, t1, t2 float64
	hasT3, hasT1  bool // false when the author wrote T3 = 0 or T1 = 0: that term is dropped
	hasT2         bool
	// SRI
	sa, sb, sc, lnSD, se float64
	hasSC                bool // false when c = 0: the exp(-T/c) term is dropped
}

type plogData struct {
	lvlBeg, lvlEnd int32 // distinct pressures [lvlBeg, lvlEnd)
}

type chebData struct {
	nT, nP   int
	coefBeg  int // Coeffs[i][j] at coef[coefBeg + i*nP + j]
	cacheBeg int // per-T contraction a_j(T) at chebA[cacheBeg + j]
	invTMin  float64
	invTMax  float64
	lgPMin   float64 // log10 PMin (Pa)
	lgPMax   float64
	dPrdlnP  float64 // 2/(ln PMax - ln PMin)
}

// kineticsModel is the immutable, shareable part of a Kinetics.
type kineticsModel struct {
	nsp    int
	thermo []thermo.NASA7
	rx     []reactionData

	facs []factor // concentration factors of all reactions
	nus  []stoich // net stoichiometry of all reactions

	// Compact per-reaction copies of the above for the hot loops: fixed
	// slots, padded with species index nsp (a constant 1 in the extended
	// concentration vector).
	mass []massAction

	// Per-T work lists. kcRx: reversible steps without explicit reverse
	// (1/Kc needed), with kcs parallel to it. arrRx: Elementary and
	// ThreeBody steps whose k is not a constant, with their Arrhenius
	// parameters in parallel slices (constants are stored once in newWork).
	// simpleKcRx: the Elementary and ThreeBody members of kcRx. explRx:
	// steps with an explicit reverse rate.
	kcRx       []int32
	kcs        []kcProduct
	arrRx      []int32
	arrLnA     []float64
	arrB       []float64
	arrER      []float64
	arrSign    []float64
	simpleKcRx []int32
	explRx     []int32

	// The net stoichiometry by species (transpose of nus): species k has
	// entries [bySpBeg[k], bySpBeg[k+1]) of (reaction, nu), reactions
	// ascending, so wdot_k is gathered in the same order as the Jacobian
	// scatters it.
	bySpBeg []int32
	bySpRx  []int32
	bySpNu  []float64

	// tbEff holds the collision efficiency of every species for each
	// distinct third-body set: set t at [t*nsp, (t+1)*nsp). Dense, so that
	// [M] = sum_k eff_k C_k is a sum of non-negative terms (no cancellation
	// when a zero-efficiency species dominates).
	tbEff      []float64
	ntb        int
	tbNeedsLog []bool // set t is the collider of a falloff step: log10 [M] is needed

	// pdep lists the reactions whose rate constant depends on C (falloff)
	// or P (tables, Chebyshev); the others are complete after the per-T stage.
	pdep []int32

	falloffs []falloffData

	plogs     []plogData
	lvlLnP    []float64
	lvlSetBeg []int32 // level l has sets [lvlSetBeg[l], lvlSetBeg[l+1])
	sets      []arrhenius

	chebs      []chebData
	chebCoef   []float64
	chebCache  int // total a_j entries
	maxChebLen int // longest T or P series

	maxSparse int // largest number of concentration factors of one reaction
}

// kineticsWork holds the per-instance arrays.
type kineticsWork struct {
	lastT     float64 // temperature of the cached per-T quantities; NaN when empty
	derivT    float64 // temperature of the cached per-T derivatives; NaN when none
	lnT, invT float64
	gRT, hRT  []float64
	gPow      []float64 // per species exp(g/RT), exp(-g/RT), exp(2g/RT), exp(-2g/RT); then 1
	absG      []float64 // |g/RT| per species; then 0
	stdPow    [5]float64
	invKc     []float64 // 1/Kc of reversible steps without explicit reverse
	dlnKcdT   []float64 // d ln Kc/dT, same steps
	foT       []float64 // per falloff, foStride entries: see falloffData.temperature
	lvlK      []float64 // per pressure level: summed k, dk/dT, ln k (k > 0 only)
	chebA     []float64 // per Chebyshev: a_j(T), da_j/dT (two blocks)
	phi, dphi []float64 // Chebyshev polynomial scratch
	ctot, lnP float64
	thirdBody []float64 // [M] per set
	lgM       []float64 // log10 [M] per set (-Inf for [M] <= 0)
	kf, kr    []float64 // rate constants at (T, C); those of pdep reactions set per call
	dkfdT     []float64 // total derivatives at constant C
	dkrdT     []float64
	dkfdX     []float64 // falloff: dkf/d[M]; pressure forms: dkf/d ln P
	facVal    []float64 // factor values C^a (Jacobian only)
	cx        []float64 // C extended by the padding slot
	mult      []float64 // 1, then [M] of each third-body set
	fwd, rev  []float64
	net       []float64
	wdot      []float64
	sparseSp  []int32
	sparseVal []float64
}

// Numerical guards; each keeps a result finite where the formula is not.
const (
	// maxExpArg bounds |ln(1/Kc)| when 1/Kc multiplies a rate constant, so
	// that kr = kf/Kc can neither overflow nor form 0*Inf. A reaction whose
	// equilibrium constant exceeds e^700 ~ 1e304 has a reverse rate that is
	// negligible next to its forward rate (and vice versa); such values
	// only occur with |ΔG°| > 700 RT, e.g. above 1450 kJ/mol at 250 K.
	maxExpArg = 700.0
	// prFloor is the smallest reduced pressure passed to the broadening
	// functions: log10 Pr stays finite at [M] = 0. F is frozen below it, a
	// state that needs k0 [M]/k_inf < 1e-100 and does not occur in flames.
	prFloor = 1e-100
	// positiveFloor replaces a non-positive Troe Fcent or SRI base before
	// its logarithm (only reachable with unphysical parameters).
	positiveFloor = 1e-300
	// negOrderFloor is the smallest concentration [mol/m^3] raised to a
	// negative exponent.
	negOrderFloor = 1e-30
	// derivFloor is the smallest concentration [mol/m^3] at which the
	// derivative a C^(a-1) of a fractional power 0 < a < 1 is evaluated; it
	// is singular at C = 0.
	derivFloor = 1e-100
)

// lnStdOverR is ln(P°/R) with P° = thermo.StandardPressure, so that
// ln(P°/(R T)) = lnStdOverR - ln T.
var lnStdOverR = math.Log(thermo.StandardPressure / thermo.GasConstant)

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// NewKinetics prepares the rate evaluation of m. It validates the mechanism
// (Mechanism.Validate) and the rate parameters it needs: finite Arrhenius
// parameters, positive A in falloff limits, positive SRI d, positive sorted
// table pressures, rectangular Chebyshev coefficients.
func NewKinetics(m *Mechanism) (*Kinetics, error) {
	if m == nil {
		return nil, fmt.Errorf("kinetics: nil mechanism")
	}
	if _, err := m.Validate(); err != nil {
		return nil, fmt.Errorf("kinetics for mechanism %q: %w", m.Name, err)
	}
	km := &kineticsModel{nsp: len(m.Species), lvlSetBeg: []int32{0}}
	km.thermo = make([]thermo.NASA7, km.nsp)
	for i := range m.Species {
		km.thermo[i] = m.Species[i].Thermo
	}
	km.rx = make([]reactionData, len(m.Reactions))
	for i := range m.Reactions {
		if err := km.addReaction(&m.Reactions[i], &km.rx[i]); err != nil {
			return nil, fmt.Errorf("kinetics: reaction %d (%s): %w", i+1, m.Reactions[i].Equation, err)
		}
		km.addToLists(int32(i))
	}
	km.indexBySpecies()
	k := &Kinetics{m: km}
	k.w = km.newWork()
	return k, nil
}

// Clone returns an evaluator sharing k's immutable data with its own work
// arrays, for use in another goroutine.
func (k *Kinetics) Clone() *Kinetics {
	return &Kinetics{m: k.m, w: k.m.newWork()}
}

// NumSpecies returns the number of species (length of C and wdot).
func (k *Kinetics) NumSpecies() int { return k.m.nsp }

// NumReactions returns the number of reactions.
func (k *Kinetics) NumReactions() int { return len(k.m.rx) }

func (km *kineticsModel) newWork() kineticsWork {
	n, K := len(km.rx), km.nsp
	f := func(n int) []float64 { return make([]float64, n) }
	w := kineticsWork{
		lastT: math.NaN(), derivT: math.NaN(),
		gRT: f(K), hRT: f(K), gPow: f(4*K + 1), absG: f(K + 1),
		invKc: f(n), dlnKcdT: f(n),
		foT:       f(foStride * len(km.falloffs)),
		lvlK:      f(3 * len(km.lvlLnP)),
		chebA:     f(2 * km.chebCache),
		phi:       f(km.maxChebLen),
		dphi:      f(km.maxChebLen),
		thirdBody: f(km.ntb), lgM: f(km.ntb),
		cx: f(K + 1), mult: f(km.ntb + 1),
		kf: f(n), kr: f(n), dkfdT: f(n), dkrdT: f(n), dkfdX: f(n),
		facVal: f(len(km.facs)),
		fwd:    f(n), rev: f(n), net: f(n),
		wdot:      f(K),
		sparseSp:  make([]int32, km.maxSparse),
		sparseVal: f(km.maxSparse),
	}
	for i := range km.rx { // constant rate constants, never recomputed
		if r := &km.rx[i]; (r.form == Elementary || r.form == ThreeBody) && r.rate.constant {
			w.kf[i] = r.rate.a
		}
	}
	return w
}

// checkLen panics on a programming error: a slice shorter than the model
// needs. (Lengths are fixed by the mechanism, not by user input.)
func checkLen(name string, got, want int) {
	if got < want {
		panic(fmt.Sprintf("chem.Kinetics: len(%s) = %d, need %d", name, got, want))
	}
}

// NetProductionRates writes wdot_k = sum_r nu_kr q_r [mol/(m^3 s)], the net
// molar production rate of each species at (T, C); q_r is the net rate of
// progress (RatesOfProgress).
func (k *Kinetics) NetProductionRates(T float64, C, wdot []float64) {
	K := k.m.nsp
	checkLen("C", len(C), K)
	checkLen("wdot", len(wdot), K)
	k.update(T, C, false)
	k.progress(C, wdot[:K])
}

// RatesOfProgress writes, per reaction, the forward rate of progress
// kf [M] prod C^a, the reverse rate kr [M] prod C^b and their difference
// [mol/(m^3 s)]. [M] is present for the ThreeBody form only. Irreversible
// reactions have reverse = 0.
func (k *Kinetics) RatesOfProgress(T float64, C, forward, reverse, net []float64) {
	n := len(k.m.rx)
	checkLen("C", len(C), k.m.nsp)
	checkLen("forward", len(forward), n)
	checkLen("reverse", len(reverse), n)
	checkLen("net", len(net), n)
	k.update(T, C, false)
	k.progress(C, nil)
	copy(forward, k.w.fwd)
	copy(reverse, k.w.rev)
	copy(net, k.w.net)
}

// RateConstants writes the forward and reverse rate constants at (T, C), in
// SI units (m^3/mol)^(n-1)/s for the order n of the mass-action product.
// Included: the Arrhenius expression, for Falloff and ChemicallyActivated the
// whole pressure dependence (Pr, hence [M], and the broadening F), for
// PressureTable and Chebyshev the value at P = (sum C) R T. Excluded: the
// third-body concentration [M] of the ThreeBody form, which multiplies the
// rate of progress. kr is kf/Kc, or the explicit ReverseRate, or 0 for
// irreversible reactions.
func (k *Kinetics) RateConstants(T float64, C, kf, kr []float64) {
	n := len(k.m.rx)
	checkLen("C", len(C), k.m.nsp)
	checkLen("kf", len(kf), n)
	checkLen("kr", len(kr), n)
	k.update(T, C, false)
	copy(kf, k.w.kf)
	copy(kr, k.w.kr)
}

// EquilibriumConstants writes, for every reaction (reversible or not), the
// equilibrium constant in concentration units
//
//	Kc = exp(-sum_k nu_k g°_k/(R T)) (P°/(R T))^Δν,  Δν = sum_k nu_k,
//
// (SI: (mol/m^3)^Δν), with nu_k the net stoichiometric coefficients (products
// minus reactants), g°_k from the NASA-7 polynomials and P° =
// thermo.StandardPressure. A value beyond the float64 range is returned as
// +Inf or 0.
func (k *Kinetics) EquilibriumConstants(T float64, Kc []float64) {
	checkLen("Kc", len(Kc), len(k.m.rx))
	k.setTemperature(T, false)
	lnStd := lnStdOverR - k.w.lnT
	for i := range k.m.rx {
		r := &k.m.rx[i]
		sg := 0.0
		for _, s := range k.m.nus[r.nuBeg:r.nuEnd] {
			sg += s.nu * k.w.gRT[s.sp]
		}
		Kc[i] = math.Exp(-sg + r.dnu*lnStd)
	}
}

// HeatReleaseRate returns the volumetric heat release rate
// -sum_k h_k(T) wdot_k [W/m^3], h_k the molar enthalpy (NASA-7, including
// the enthalpy of formation). Positive in an exothermic flame.
func (k *Kinetics) HeatReleaseRate(T float64, C []float64) float64 {
	k.NetProductionRates(T, C, k.w.wdot)
	s := 0.0
	for i, h := range k.w.hRT {
		s += h * k.w.wdot[i]
	}
	return -s * thermo.GasConstant * T
}

// update brings the per-T cache to T and completes the rate constants of
// the C- and P-dependent reactions at (T, C). With derivs, the derivatives
// used by ProductionRateDerivatives are made valid too.
func (k *Kinetics) update(T float64, C []float64, derivs bool) {
	k.setTemperature(T, derivs)
	m, w := k.m, &k.w
	K := m.nsp
	C = C[:K]
	ctot := 0.0
	for _, c := range C {
		ctot += c
	}
	w.ctot = ctot
	if P := ctot * thermo.GasConstant * T; P > 0 {
		w.lnP = math.Log(P)
	} else {
		w.lnP = math.Inf(-1) // below every table: the lowest-pressure data apply
	}
	for t := range w.thirdBody {
		eff := m.tbEff[t*K : t*K+K]
		s := 0.0
		for j, c := range C {
			s += eff[j] * c
		}
		w.thirdBody[t] = s
		switch {
		case !m.tbNeedsLog[t]:
		case s > 0:
			w.lgM[t] = math.Log10(s)
		default:
			w.lgM[t] = math.Inf(-1)
		}
	}
	for _, i := range m.pdep {
		r := &m.rx[i]
		switch r.form {
		case Falloff, ChemicallyActivated:
			k.falloffRate(int(i), r)
		case PressureTable:
			k.tableRate(int(i), r)
		case Chebyshev:
			k.chebyshevRate(int(i), r)
		}
		if r.reverse == reverseFromKc {
			kr := w.kf[i] * w.invKc[i]
			w.kr[i] = kr
			if derivs {
				w.dkrdT[i] = w.dkfdT[i]*w.invKc[i] - kr*w.dlnKcdT[i]
			}
		}
	}
}

// setTemperature fills the per-T cache unless it already holds T: species
// g/RT and h/RT, 1/Kc where the reverse needs it, complete rate constants
// of the Elementary and ThreeBody forms and of explicit reverse rates, and
// the T-dependent parts of the other forms. With derivs it also fills the
// T-derivatives of those rate constants and d ln Kc/dT (only the Jacobian
// needs them).
func (k *Kinetics) setTemperature(T float64, derivs bool) {
	w := &k.w
	if T != w.lastT {
		k.temperatureValues(T)
	}
	if derivs && T != w.derivT {
		k.temperatureDerivatives()
	}
}

func (k *Kinetics) temperatureValues(T float64) {
	m, w := k.m, &k.w
	lnT, invT := math.Log(T), 1/T
	w.lnT, w.invT = lnT, invT
	K := m.nsp
	for i := range m.thermo {
		p := &m.thermo[i]
		h := p.HRT(T)
		g := h - p.SR(T) // = p.GRT(T), without evaluating h twice
		w.hRT[i], w.gRT[i] = h, g
		w.absG[i] = math.Abs(g)
		up, down := math.Exp(g), 0.0
		if up != 0 {
			down = 1 / up
		}
		gp := w.gPow[4*i : 4*i+4]
		gp[0], gp[1], gp[2], gp[3] = up, down, up*up, down*down
	}
	w.gPow[4*K] = 1
	lnStd := lnStdOverR - lnT
	rt := thermo.GasConstant * T / thermo.StandardPressure
	w.stdPow = [5]float64{1 / (rt * rt), 1 / rt, 1, rt, rt * rt}
	for j, i := range m.arrRx {
		w.kf[i] = m.arrSign[j] * math.Exp(m.arrLnA[j]+m.arrB[j]*lnT-m.arrER[j]*invT)
	}
	// 1/Kc = exp(sum nu g/RT) (RT/P°)^Δν as a product of the cached
	// species factors where no partial product can leave the float range:
	// |ln| of every partial product <= sum |nu g/RT| + 2 |ln(P°/RT)|.
	bound := maxExpArg - 2*math.Abs(lnStd)
	g, a := w.gPow, w.absG
	for j, i := range m.kcRx {
		kp := &m.kcs[j]
		size := kp.nuA[0]*a[kp.sp[0]] + kp.nuA[1]*a[kp.sp[1]] + kp.nuA[2]*a[kp.sp[2]] + kp.nuA[3]*a[kp.sp[3]]
		if kp.usable && size < bound {
			w.invKc[i] = w.stdPow[kp.std] * g[kp.idx[0]] * g[kp.idx[1]] * g[kp.idx[2]] * g[kp.idx[3]]
		} else {
			w.invKc[i] = k.inverseKcByExp(int(i), lnStd)
		}
	}
	for _, i := range m.simpleKcRx {
		w.kr[i] = w.kf[i] * w.invKc[i]
	}
	for _, i := range m.explRx {
		w.kr[i] = m.rx[i].revRate.value(lnT, invT)
	}
	for f := range m.falloffs {
		m.falloffs[f].temperature(T, lnT, invT, w.foT[foStride*f:foStride*(f+1)])
	}
	for l := range m.lvlLnP {
		s, ds := 0.0, 0.0
		for e := m.lvlSetBeg[l]; e < m.lvlSetBeg[l+1]; e++ {
			v := m.sets[e].value(lnT, invT)
			s += v
			ds += v * m.sets[e].dlnkdT(invT)
		}
		lk := 0.0 // read only when s > 0
		if s > 0 {
			lk = math.Log(s)
		}
		w.lvlK[3*l], w.lvlK[3*l+1], w.lvlK[3*l+2] = s, ds, lk
	}
	for c := range m.chebs {
		k.chebyshevTemperature(&m.chebs[c], invT)
	}
	w.lastT, w.derivT = T, math.NaN()
}

// temperatureDerivatives fills d ln Kc/dT = (sum nu h/RT - Δν)/T and the
// T-derivatives of the rate constants completed per T, at the cached T.
func (k *Kinetics) temperatureDerivatives() {
	m, w := k.m, &k.w
	invT := w.invT
	for _, i := range m.kcRx {
		r := &m.rx[i]
		sh := 0.0
		for _, s := range m.nus[r.nuBeg:r.nuEnd] {
			sh += s.nu * w.hRT[s.sp]
		}
		w.dlnKcdT[i] = (sh - r.dnu) * invT
	}
	for j, i := range m.arrRx {
		w.dkfdT[i] = w.kf[i] * (m.arrB[j] + m.arrER[j]*invT) * invT
	}
	for _, i := range m.simpleKcRx {
		w.dkrdT[i] = w.dkfdT[i]*w.invKc[i] - w.kr[i]*w.dlnKcdT[i]
	}
	for _, i := range m.explRx {
		w.dkrdT[i] = w.kr[i] * m.rx[i].revRate.dlnkdT(invT)
	}
	w.derivT = w.lastT
}

// kcProduct prepares 1/Kc of a reaction as a product of cached factors:
// gPow[idx[0..3]] (exp(nu g/RT) for nu = ±1, ±2) and stdPow[std]
// ((RT/P°)^Δν for |Δν| <= 2).
type kcProduct struct {
	idx    [4]int32
	std    int32
	sp     [4]int32   // the species (padding: nsp, where absG is 0)
	nuA    [4]float64 // their |nu|
	usable bool       // at most 4 net species, |nu| <= 2, |Δν| <= 2
}

// inverseKcByExp returns 1/Kc = exp(sum nu g/RT) (R T/P°)^Δν for reaction
// i through one exponential of the summed logarithm, limited to
// [e^-maxExpArg, e^maxExpArg]: the path for non-integer or large
// coefficients and for extreme g/RT.
func (k *Kinetics) inverseKcByExp(i int, lnStd float64) float64 {
	m, w := k.m, &k.w
	r := &m.rx[i]
	sg := 0.0
	for _, s := range m.nus[r.nuBeg:r.nuEnd] {
		sg += s.nu * w.gRT[s.sp]
	}
	return math.Exp(math.Max(-maxExpArg, math.Min(maxExpArg, sg-r.dnu*lnStd)))
}

// powFactor returns C^a for a non-unit exponent a, with the guards of the
// Kinetics doc: C clipped to 0 for a > 0, floored at negOrderFloor for a < 0.
func powFactor(c, a float64) float64 {
	if a > 0 {
		if c <= 0 {
			return 0
		}
		return math.Pow(c, a)
	}
	return math.Pow(math.Max(c, negOrderFloor), a)
}

// powFactorDeriv returns d(powFactor(c, a))/dc. It is 0 where powFactor is
// flat (clipped or floored); for 0 < a < 1 it is evaluated at
// max(C, derivFloor), being singular at C = 0.
func powFactorDeriv(c, a float64) float64 {
	if a > 0 {
		if c <= 0 {
			return 0
		}
		if a < 1 {
			c = math.Max(c, derivFloor)
		}
		return a * math.Pow(c, a-1)
	}
	if c <= negOrderFloor {
		return 0
	}
	return a * math.Pow(c, a-1)
}

// factor is one concentration factor C_sp^ord of a rate of progress.
type factor struct {
	sp  int32
	ord float64 // 1 for each repeated entry of an integer order
}

// stoich is one net stoichiometric coefficient of a reaction.
type stoich struct {
	sp int32
	nu float64
}

// product returns prod C^a over the factors fs and, when vals is not nil,
// keeps each factor's value there (for the Jacobian).
func product(C []float64, fs []factor, vals []float64) float64 {
	p := 1.0
	for e, f := range fs {
		c := C[f.sp]
		if f.ord != 1 {
			c = powFactor(c, f.ord)
		}
		if vals != nil {
			vals[e] = c
		}
		p *= c
	}
	return p
}

// massAction holds up to three unit-order concentration factors per
// direction and the rate multiplier slot (0: 1; 1+t: [M] of set t, for the
// ThreeBody form). general: more factors or other orders, use facs.
type massAction struct {
	f, r    [3]int32
	mult    int32
	general bool
}

// progress computes the forward, reverse and net rates of progress from the
// rate constants of the last update and, when wdot is not nil, the net
// production rates. Operation order matches ProductionRateDerivatives, so
// both give bitwise the same wdot.
func (k *Kinetics) progress(C, wdot []float64) {
	m, w := k.m, &k.w
	K := m.nsp
	cx := w.cx
	copy(cx, C[:K])
	cx[K] = 1
	w.mult[0] = 1
	copy(w.mult[1:], w.thirdBody)
	for i := range m.rx {
		ma := &m.mass[i]
		var pf, pr float64
		if !ma.general {
			pf = cx[ma.f[0]] * cx[ma.f[1]] * cx[ma.f[2]]
			pr = cx[ma.r[0]] * cx[ma.r[1]] * cx[ma.r[2]]
		} else {
			r := &m.rx[i]
			pf = product(C, m.facs[r.fBeg:r.fEnd], nil)
			pr = product(C, m.facs[r.rBeg:r.rEnd], nil)
		}
		M := w.mult[ma.mult]
		f := w.kf[i] * pf * M
		b := w.kr[i] * pr * M
		w.fwd[i], w.rev[i], w.net[i] = f, b, f-b
	}
	if wdot == nil {
		return
	}
	net := w.net
	for sp := range wdot[:K] {
		s := 0.0
		for e := m.bySpBeg[sp]; e < m.bySpBeg[sp+1]; e++ {
			s += m.bySpNu[e] * net[m.bySpRx[e]]
		}
		wdot[sp] = s
	}
}
