package chem_test

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
)

// Hand-built mechanisms for the form-specific tests. Thermo: NASA-7 records
// copied from GRI-Mech 3.0 thermo30.dat (Smith et al. 1999), high range
// first as in the file.

const calorie = 4.184 // J, thermochemical calorie: the default energy unit of published mechanisms

var handThermo = map[string]struct {
	comp       map[string]float64
	lo, mid, h float64
	high, low  [7]float64
}{
	"H": {map[string]float64{"H": 1}, 200, 1000, 3500,
		[7]float64{2.50000001e+00, -2.30842973e-11, 1.61561948e-14, -4.73515235e-18, 4.98197357e-22, 2.54736599e+04, -4.46682914e-01},
		[7]float64{2.50000000e+00, 7.05332819e-13, -1.99591964e-15, 2.30081632e-18, -9.27732332e-22, 2.54736599e+04, -4.46682853e-01}},
	"O": {map[string]float64{"O": 1}, 200, 1000, 3500,
		[7]float64{2.56942078e+00, -8.59741137e-05, 4.19484589e-08, -1.00177799e-11, 1.22833691e-15, 2.92175791e+04, 4.78433864e+00},
		[7]float64{3.16826710e+00, -3.27931884e-03, 6.64306396e-06, -6.12806624e-09, 2.11265971e-12, 2.91222592e+04, 2.05193346e+00}},
	"OH": {map[string]float64{"O": 1, "H": 1}, 200, 1000, 3500,
		[7]float64{3.09288767e+00, 5.48429716e-04, 1.26505228e-07, -8.79461556e-11, 1.17412376e-14, 3.85865700e+03, 4.47669610e+00},
		[7]float64{3.99201543e+00, -2.40131752e-03, 4.61793841e-06, -3.88113333e-09, 1.36411470e-12, 3.61508056e+03, -1.03925458e-01}},
	"H2": {map[string]float64{"H": 2}, 200, 1000, 3500,
		[7]float64{3.33727920e+00, -4.94024731e-05, 4.99456778e-07, -1.79566394e-10, 2.00255376e-14, -9.50158922e+02, -3.20502331e+00},
		[7]float64{2.34433112e+00, 7.98052075e-03, -1.94781510e-05, 2.01572094e-08, -7.37611761e-12, -9.17935173e+02, 6.83010238e-01}},
	"O2": {map[string]float64{"O": 2}, 200, 1000, 3500,
		[7]float64{3.28253784e+00, 1.48308754e-03, -7.57966669e-07, 2.09470555e-10, -2.16717794e-14, -1.08845772e+03, 5.45323129e+00},
		[7]float64{3.78245636e+00, -2.99673416e-03, 9.84730201e-06, -9.68129509e-09, 3.24372837e-12, -1.06394356e+03, 3.65767573e+00}},
	"H2O": {map[string]float64{"H": 2, "O": 1}, 200, 1000, 3500,
		[7]float64{3.03399249e+00, 2.17691804e-03, -1.64072518e-07, -9.70419870e-11, 1.68200992e-14, -3.00042971e+04, 4.96677010e+00},
		[7]float64{4.19864056e+00, -2.03643410e-03, 6.52040211e-06, -5.48797062e-09, 1.77197817e-12, -3.02937267e+04, -8.49032208e-01}},
	"HO2": {map[string]float64{"H": 1, "O": 2}, 200, 1000, 3500,
		[7]float64{4.01721090e+00, 2.23982013e-03, -6.33658150e-07, 1.14246370e-10, -1.07908535e-14, 1.11856713e+02, 3.78510215e+00},
		[7]float64{4.30179801e+00, -4.74912051e-03, 2.11582891e-05, -2.42763894e-08, 9.29225124e-12, 2.94808040e+02, 3.71666245e+00}},
	"N2": {map[string]float64{"N": 2}, 300, 1000, 5000,
		[7]float64{0.02926640e+02, 0.14879768e-02, -0.05684760e-05, 0.10097038e-09, -0.06753351e-13, -0.09227977e+04, 0.05980528e+02},
		[7]float64{0.03298677e+02, 0.14082404e-02, -0.03963222e-04, 0.05641515e-07, -0.02444854e-10, -0.10208999e+04, 0.03950372e+02}},
	"AR": {map[string]float64{"AR": 1}, 300, 1000, 5000,
		[7]float64{2.5, 0, 0, 0, 0, -0.07453750e+04, 0.04366000e+02},
		[7]float64{2.5, 0, 0, 0, 0, -0.07453750e+04, 0.04366000e+02}},
	"CH3": {map[string]float64{"C": 1, "H": 3}, 200, 1000, 3500,
		[7]float64{2.28571772e+00, 7.23990037e-03, -2.98714348e-06, 5.95684644e-10, -4.67154394e-14, 1.67755843e+04, 8.48007179e+00},
		[7]float64{3.67359040e+00, 2.01095175e-03, 5.73021856e-06, -6.87117425e-09, 2.54385734e-12, 1.64449988e+04, 1.60456433e+00}},
	"CH4": {map[string]float64{"C": 1, "H": 4}, 200, 1000, 3500,
		[7]float64{7.48514950e-02, 1.33909467e-02, -5.73285809e-06, 1.22292535e-09, -1.01815230e-13, -9.46834459e+03, 1.84373180e+01},
		[7]float64{5.14987613e+00, -1.36709788e-02, 4.91800599e-05, -4.84743026e-08, 1.66693956e-11, -1.02466476e+04, -4.64130376e+00}},
}

// handSpecies is the species order of every hand-built mechanism.
var handSpecies = []string{"H", "O", "OH", "H2", "O2", "H2O", "HO2", "N2", "AR", "CH3", "CH4"}

func hIdx(name string) int {
	for i, s := range handSpecies {
		if s == name {
			return i
		}
	}
	panic("unknown hand species " + name)
}

// side parses "2OH+H2" into participants.
func side(s string) []chem.Participant {
	var ps []chem.Participant
	for _, term := range strings.Split(s, "+") {
		n := 0
		for n < len(term) && (term[n] >= '0' && term[n] <= '9' || term[n] == '.') {
			n++
		}
		coef := 1.0
		if n > 0 {
			coef, _ = strconv.ParseFloat(term[:n], 64)
		}
		ps = append(ps, chem.Participant{Species: hIdx(term[n:]), Coefficient: coef})
	}
	return ps
}

// rxn returns a reaction "lhs=rhs" (reversible) or "lhs=>rhs".
func rxn(eq string, form chem.RateForm) chem.Reaction {
	rev := !strings.Contains(eq, "=>")
	parts := strings.SplitN(strings.Replace(eq, "=>", "=", 1), "=", 2)
	return chem.Reaction{Equation: eq, Reactants: side(parts[0]), Products: side(parts[1]), Reversible: rev, Form: form}
}

func handMechanism(reactions ...chem.Reaction) *chem.Mechanism {
	m := &chem.Mechanism{Name: "hand", Elements: []string{"H", "O", "C", "N", "AR"}}
	for _, name := range handSpecies {
		d := handThermo[name]
		m.Species = append(m.Species, chem.Species{Species: thermo.Species{
			Name: name, Composition: d.comp,
			Thermo: thermo.NASA7{TLow: d.lo, TMid: d.mid, THigh: d.h, Low: d.low, High: d.high},
		}})
	}
	m.Reactions = reactions
	return m
}

func mustKinetics(t testing.TB, m *chem.Mechanism) *chem.Kinetics {
	t.Helper()
	k, err := chem.NewKinetics(m)
	if err != nil {
		t.Fatalf("NewKinetics: %v", err)
	}
	return k
}

// bath returns concentrations of pure N2 at (T, P) plus the given trace
// species [mol/m^3].
func bath(T, P float64, trace map[string]float64) []float64 {
	C := make([]float64, len(handSpecies))
	C[hIdx("N2")] = P / (thermo.GasConstant * T)
	for s, v := range trace {
		C[hIdx(s)] = v
	}
	return C
}

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got/want - 1)
}

func rateConstants(k *chem.Kinetics, T float64, C []float64) (kf, kr []float64) {
	kf = make([]float64, k.NumReactions())
	kr = make([]float64, k.NumReactions())
	k.RateConstants(T, C, kf, kr)
	return kf, kr
}

// GRI-Mech 3.0 (Smith et al. 1999) reaction 52, H+CH3(+M)<=>CH4(+M):
// k_inf = 13.90E+15 T^-0.534 exp(-536 cal/mol/RT) cm^3/(mol s),
// k0 = 2.620E+33 T^-4.760 exp(-2440 cal/mol/RT) cm^6/(mol^2 s),
// TROE a = 0.7830, T3 = 74, T1 = 2941, T2 = 6964; efficiencies H2 2, H2O 6,
// CH4 3, AR 0.7 (CO, CO2, C2H6 not in the hand species set).
func griMethylRecombination(troe bool) chem.Reaction {
	r := rxn("H+CH3=CH4", chem.Falloff)
	r.ThirdBody = &chem.ThirdBody{Default: 1, Efficiencies: map[int]float64{
		hIdx("H2"): 2, hIdx("H2O"): 6, hIdx("CH4"): 3, hIdx("AR"): 0.7}}
	r.FalloffRate = &chem.FalloffRate{
		High: chem.Arrhenius{A: 13.90e15 * 1e-6, B: -0.534, E: 536 * calorie},
		Low:  chem.Arrhenius{A: 2.620e33 * 1e-12, B: -4.760, E: 2440 * calorie},
	}
	if troe {
		r.FalloffRate.Troe = &chem.Troe{A: 0.7830, T3: 74, T1: 2941, T2: 6964, HasT2: true}
	}
	return r
}

func arrhenius(a chem.Arrhenius, T float64) float64 {
	return a.A * math.Pow(T, a.B) * math.Exp(-a.E/(thermo.GasConstant*T))
}

// TestTroeHandCalculation compares the Troe falloff of GRI-Mech 3.0's
// H+CH3(+M)<=>CH4(+M) with a calculation done by hand (a pocket calculator
// on the formulas of Gilbert, Luther & Troe, Ber. Bunsenges. Phys. Chem. 87
// (1983) 169), at T = 1500 K in N2 at 1 atm:
//
//	[M]    = 101325/(8.314462618*1500)                  = 8.124397583 mol/m^3
//	k_inf  = 13.90e9 * 1500^-0.534 exp(-536*4.184/(R*1500))  = 2.338236781e8 m^3/(mol s)
//	k0     = 2.620e21 * 1500^-4.76 exp(-2440*4.184/(R*1500)) = 8.802504841e5 m^6/(mol^2 s)
//	Pr     = k0 [M]/k_inf                               = 0.03058503297  (log10 = -1.514491047)
//	Fcent  = 0.217 e^(-1500/74) + 0.783 e^(-1500/2941) + e^(-6964/1500) = 0.4798056282
//	log10 Fcent = -0.318934662
//	c = -0.4 - 0.67 log Fcent = -0.1863137765;  n = 0.75 - 1.27 log Fcent = 1.155047021
//	f1 = (log Pr + c)/(n - 0.14 (log Pr + c))           = -1.220825458
//	log10 F = log Fcent/(1 + f1^2)                      = -0.1280648759;  F = 0.7446207325
//	k = k_inf Pr/(1+Pr) F                               = 5.167122218e6 m^3/(mol s)
func TestTroeHandCalculation(t *testing.T) {
	k := mustKinetics(t, handMechanism(griMethylRecombination(true)))
	T := 1500.0
	kf, _ := rateConstants(k, T, bath(T, thermo.OneAtmosphere, nil))
	// The hand values are given to 10 digits; the calculation uses the same R
	// and calorie, so agreement is to round-off of those digits.
	if e := relErr(kf[0], 5.167122218e6); e > 1e-9 {
		t.Errorf("Troe k = %.10g, hand calculation 5.167122218e6 (rel. error %.2g)", kf[0], e)
	}
}

// TestFalloffLimits checks the two limits of the falloff forms: k -> k0 [M]
// as [M] -> 0 and k -> k_inf as [M] -> infinity (Lindemann, and the
// 3-parameter SRI whose F -> 1 at both ends since X = 1/(1+log^2 Pr) -> 0);
// and for chemical activation k -> k0 at low and k_inf/[M] at high [M]. With
// Lindemann the deviation from the limit is exactly Pr (low) or 1/Pr (high),
// so a [M] giving Pr = 1e-8 or 1e8 leaves a relative 1e-8. SRI
// converges as X ~ 1/log^2 Pr: with Pr = 1e-8 (1e8), X = 1/65 and
// |ln F| = X |ln B| <= 0.02 for B in [0.3, 1], so the tolerance there is 3%.
func TestFalloffLimits(t *testing.T) {
	T := 1500.0
	base := griMethylRecombination(false)
	fr := base.FalloffRate
	k0, kInf := arrhenius(fr.Low, T), arrhenius(fr.High, T)
	Mat := func(Pr float64) float64 { return Pr * kInf / k0 }

	sri := griMethylRecombination(false)
	sri.FalloffRate = &chem.FalloffRate{Low: fr.Low, High: fr.High, SRI: &chem.SRI{A: 0.45, B: 797, C: 979, D: 1, E: 0}}
	act := rxn("H+CH3=CH4", chem.ChemicallyActivated)
	act.ThirdBody, act.FalloffRate = base.ThirdBody, base.FalloffRate

	tests := []struct {
		name      string
		r         chem.Reaction
		Pr        float64
		want      func(M float64) float64
		tol       float64
		rationale string
	}{
		{"Lindemann low", base, 1e-8, func(M float64) float64 { return k0 * M }, 2e-8, "deviation = Pr"},
		{"Lindemann high", base, 1e8, func(float64) float64 { return kInf }, 2e-8, "deviation = 1/Pr"},
		{"SRI low", sri, 1e-8, func(M float64) float64 { return k0 * M }, 0.03, "X = 1/65"},
		{"SRI high", sri, 1e8, func(float64) float64 { return kInf }, 0.03, "X = 1/65"},
		{"activated low", act, 1e-8, func(float64) float64 { return k0 }, 2e-8, "deviation = Pr"},
		{"activated high", act, 1e8, func(M float64) float64 { return kInf / M }, 2e-8, "deviation = 1/Pr"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			k := mustKinetics(t, handMechanism(tc.r))
			M := Mat(tc.Pr)
			C := make([]float64, len(handSpecies))
			C[hIdx("N2")] = M // efficiency 1
			kf, _ := rateConstants(k, T, C)
			if e := relErr(kf[0], tc.want(M)); e > tc.tol {
				t.Errorf("k = %.6g, limit %.6g: rel. error %.2g > %.2g (%s)", kf[0], tc.want(M), e, tc.tol, tc.rationale)
			}
		})
	}
	// And the SRI limits do tighten: Pr = 1e-30 (X = 1/901) is closer than 1e-8.
	k := mustKinetics(t, handMechanism(sri))
	C := make([]float64, len(handSpecies))
	C[hIdx("N2")] = Mat(1e-8)
	kf8, _ := rateConstants(k, T, C)
	e8 := relErr(kf8[0], k0*C[hIdx("N2")])
	C[hIdx("N2")] = Mat(1e-30)
	kf30, _ := rateConstants(k, T, C)
	e30 := relErr(kf30[0], k0*C[hIdx("N2")])
	if !(e30 < e8/10) {
		t.Errorf("SRI low-pressure deviation does not shrink: %.3g at Pr=1e-8, %.3g at Pr=1e-30", e8, e30)
	}
}

// TestSRIHandCalculation: 5-parameter SRI (Stewart, Larson & Golden,
// Combust. Flame 75 (1989) 25) with parameters invented for the test,
// a = 0.5, b = 200 K, c = 1000 K, d = 1.2, e = 0.1, k0 = 5e10 T^-1
// exp(-1e4 J/mol/RT) m^6/(mol^2 s), k_inf = 2e7 T^0.2 exp(-5e3 J/mol/RT)
// m^3/(mol s), at T = 1200 K and [M] = 10 mol/m^3. By hand:
//
//	k0 = 1.529355998e7,  k_inf = 5.002949983e7,  Pr = 3.05690843 (log10 = 0.4852824296)
//	X = 1/(1 + 0.4852824296^2)             = 0.8093895426
//	B = 0.5 e^(-200/1200) + e^(-1200/1000) = 0.7244350744
//	F = 1.2 B^X 1200^0.1 = 1.2 * B^X * 2.031973897 = 1.878384107
//	k = k_inf Pr/(1+Pr) F                  = 7.081052109e7 m^3/(mol s)
func TestSRIHandCalculation(t *testing.T) {
	r := rxn("H+CH3=CH4", chem.Falloff)
	r.ThirdBody = &chem.ThirdBody{Default: 1}
	r.FalloffRate = &chem.FalloffRate{
		Low:  chem.Arrhenius{A: 5e10, B: -1, E: 1e4},
		High: chem.Arrhenius{A: 2e7, B: 0.2, E: 5e3},
		SRI:  &chem.SRI{A: 0.5, B: 200, C: 1000, D: 1.2, E: 0.1},
	}
	k := mustKinetics(t, handMechanism(r))
	C := make([]float64, len(handSpecies))
	C[hIdx("AR")] = 10
	kf, _ := rateConstants(k, 1200, C)
	if e := relErr(kf[0], 7.081052109e7); e > 1e-9 {
		t.Errorf("SRI k = %.10g, hand calculation 7.081052109e7 (rel. error %.2g)", kf[0], e)
	}
}

// tableReaction is an irreversible H+O2=>O+OH with a pressure table invented
// for the test: one set at 0.1 atm, two (one with negative A) at 1 atm, one
// at 10 atm. Units SI (m^3/(mol s), J/mol).
func tableReaction() chem.Reaction {
	r := rxn("H+O2=>O+OH", chem.PressureTable)
	atm := thermo.OneAtmosphere
	r.PressureRates = []chem.PressureRate{
		{P: 0.1 * atm, Rate: chem.Arrhenius{A: 1e8, B: 0, E: 1e4}},
		{P: atm, Rate: chem.Arrhenius{A: 3e8, B: 0, E: 1.2e4}},
		{P: atm, Rate: chem.Arrhenius{A: -1e8, B: 0.1, E: 2e4}},
		{P: 10 * atm, Rate: chem.Arrhenius{A: 5e8, B: -0.1, E: 1.5e4}},
	}
	return r
}

// TestPressureTable: at a tabulated pressure k is that pressure's set (the
// sum of its sets, the negative one included), between pressures ln k is
// linear in ln P, outside the table the end set applies. The reference
// values use math.Pow directly, not the logarithmic evaluation.
func TestPressureTable(t *testing.T) {
	r := tableReaction()
	k := mustKinetics(t, handMechanism(r))
	T := 1200.0
	atm := thermo.OneAtmosphere
	set := func(n int) float64 { return arrhenius(r.PressureRates[n].Rate, T) }
	k1, k2, k3 := set(0), set(1)+set(2), set(3)
	if !(set(2) < 0 && k2 > 0) {
		t.Fatalf("test data: want a negative set with a positive sum, got %g + %g", set(1), set(2))
	}
	logLinear := func(P, Pa, Pb, ka, kb float64) float64 {
		f := math.Log(P/Pa) / math.Log(Pb/Pa)
		return math.Exp(math.Log(ka) + f*(math.Log(kb)-math.Log(ka)))
	}
	tests := []struct {
		name string
		P    float64
		want float64
	}{
		{"at 0.1 atm", 0.1 * atm, k1},
		{"at 1 atm (sum of two sets)", atm, k2},
		{"at 10 atm", 10 * atm, k3},
		{"geometric middle of 0.1 and 1 atm", math.Sqrt(0.1) * atm, math.Sqrt(k1 * k2)},
		{"at 0.3 atm", 0.3 * atm, logLinear(0.3*atm, 0.1*atm, atm, k1, k2)},
		{"at 4 atm", 4 * atm, logLinear(4*atm, atm, 10*atm, k2, k3)},
		{"below the table", 0.001 * atm, k1},
		{"above the table", 1000 * atm, k3},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			kf, _ := rateConstants(k, T, bath(T, tc.P, nil))
			// The pressure is rebuilt from sum(C) R T: a few ulp.
			if e := relErr(kf[0], tc.want); e > 1e-12 {
				t.Errorf("k(%g Pa) = %.12g, want %.12g (rel. error %.2g)", tc.P, kf[0], tc.want, e)
			}
		})
	}
}

// TestPressureTableNonPositiveLevel: a level whose sets sum to a negative
// value has no logarithm; k is then linear in ln P towards it (documented
// fallback) and stays finite.
func TestPressureTableNonPositiveLevel(t *testing.T) {
	r := tableReaction()
	r.PressureRates[2].Rate.A = -1e10 // 1 atm level now sums negative at 1200 K
	k := mustKinetics(t, handMechanism(r))
	T := 1200.0
	atm := thermo.OneAtmosphere
	k1 := arrhenius(r.PressureRates[0].Rate, T)
	k2 := arrhenius(r.PressureRates[1].Rate, T) + arrhenius(r.PressureRates[2].Rate, T)
	if k2 >= 0 {
		t.Fatalf("test data: 1 atm level should be negative, is %g", k2)
	}
	P := 0.3 * atm
	f := math.Log(P/(0.1*atm)) / math.Log(10)
	kf, _ := rateConstants(k, T, bath(T, P, nil))
	if want := k1 + f*(k2-k1); relErr(kf[0], want) > 1e-12 {
		t.Errorf("k = %.12g, linear-in-ln-P value %.12g", kf[0], want)
	}
}

// chebReaction: Chebyshev coefficients invented for the test,
// 300-2500 K, 1e3-1e7 Pa, SI units.
func chebReaction() chem.Reaction {
	r := rxn("H+O2=>O+OH", chem.Chebyshev)
	r.ChebyshevRate = &chem.ChebyshevRate{TMin: 300, TMax: 2500, PMin: 1e3, PMax: 1e7,
		Coeffs: [][]float64{{8.0, 0.5}, {-1.2, 0.1}, {0.3, -0.05}}}
	return r
}

// TestChebyshevHandEvaluation, by hand at T = 1000 K, P = 1e6 Pa:
//
//	Tr = (2/1000 - 1/300 - 1/2500)/(1/2500 - 1/300) = 13/22 = 0.590909...
//	Pr = (2*6 - 3 - 7)/(7 - 3)                       = 0.5
//	T0..T2(Tr) = 1, 13/22, 2(13/22)^2 - 1 = -73/242;  T0, T1(Pr) = 1, 0.5
//	log10 k = (8 + 0.5*0.5) + (13/22)(-1.2 + 0.1*0.5) + (-73/242)(0.3 - 0.05*0.5)
//	        = 8.25 - 0.6795454545 - 0.0829545455 = 7.4875 exactly
//
// and outside the ranges the value at the nearest boundary.
func TestChebyshevHandEvaluation(t *testing.T) {
	k := mustKinetics(t, handMechanism(chebReaction()))
	kAt := func(T, P float64) float64 {
		kf, _ := rateConstants(k, T, bath(T, P, nil))
		return kf[0]
	}
	if got, want := kAt(1000, 1e6), math.Pow(10, 7.4875); relErr(got, want) > 1e-13 {
		t.Errorf("k(1000 K, 1e6 Pa) = %.14g, hand value 10^7.4875 = %.14g", got, want)
	}
	clamps := []struct {
		name               string
		T, P, Tedge, Pedge float64
	}{
		{"T below range", 200, 1e5, 300, 1e5},
		{"T above range", 3000, 1e5, 2500, 1e5},
		{"P below range", 1000, 10, 1000, 1e3},
		{"P above range", 1000, 1e9, 1000, 1e7},
	}
	for _, c := range clamps {
		if got, want := kAt(c.T, c.P), kAt(c.Tedge, c.Pedge); relErr(got, want) > 1e-12 {
			t.Errorf("%s: k = %.12g, boundary value %.12g", c.name, got, want)
		}
	}
}

// TestEquilibriumConstantJANAF compares Kc of 2H2 + O2 <=> 2H2O, converted to
// Kp = Kc (RT/P°)^Δν with Δν = -1, with twice log10 Kf of H2O(g) from the
// JANAF Tables, 4th ed. (Chase 1998), H2O(g): log Kf = 10.060 (1000 K), 3.540
// (2000 K), 1.344 (3000 K) (from memory, via ΔfG° = -192.590, -135.528,
// -77.163 kJ/mol). Tolerance 0.015 in log10 Kp: JANAF's 1 bar standard
// state against flame1d's 1 atm shifts log10 Kp by Δν log10(1.01325) =
// -0.0057 here, and the GRI-Mech polynomials differ from JANAF by up to
// ~0.3 kJ/mol in ΔfG°(H2O) near 3000 K (0.005 in log Kf per H2O, 0.01 for
// two). Observed: -0.003 (1000 K), -0.0004 (2000 K), +0.009 (3000 K). A
// wrong (P°/RT)^Δν factor would be off by more than 1.
func TestEquilibriumConstantJANAF(t *testing.T) {
	k := mustKinetics(t, handMechanism(rxn("2H2+O2=2H2O", chem.Elementary)))
	Kc := make([]float64, 1)
	for _, c := range []struct{ T, logKf float64 }{{1000, 10.060}, {2000, 3.540}, {3000, 1.344}} {
		k.EquilibriumConstants(c.T, Kc)
		logKp := math.Log10(Kc[0]) - math.Log10(thermo.GasConstant*c.T/thermo.StandardPressure)
		d := logKp - 2*c.logKf
		if math.Abs(d) > 0.015 {
			t.Errorf("T = %g K: log10 Kp = %.4f, JANAF 2 log Kf = %.4f (diff %.4f)", c.T, logKp, 2*c.logKf, d)
		}
		t.Logf("T = %g K: log10 Kp = %.4f, JANAF %.4f", c.T, logKp, 2*c.logKf)
	}
}

// TestHeatReleaseFormationEnthalpy: for 2H2 + O2 => 2H2O alone at 298.15 K
// the heat release is -2 ΔfH°(H2O, g) q with ΔfH° = -241.826 ± 0.040 kJ/mol
// (CODATA Key Values, Cox, Wagman & Medvedev 1989). Tolerance 2e-4: the
// GRI polynomial gives -241.825 kJ/mol, within the CODATA uncertainty.
func TestHeatReleaseFormationEnthalpy(t *testing.T) {
	r := rxn("2H2+O2=>2H2O", chem.Elementary)
	r.Rate = chem.Arrhenius{A: 1e3}
	k := mustKinetics(t, handMechanism(r))
	T := 298.15
	C := bath(T, thermo.OneAtmosphere, map[string]float64{"H2": 2, "O2": 1, "H2O": 0.5})
	q := 1e3 * 2 * 2 * 1 // A [H2]^2 [O2]
	want := 2 * 241826.0 * q
	got := k.HeatReleaseRate(T, C)
	if relErr(got, want) > 2e-4 {
		t.Errorf("heat release %.6g W/m^3, want %.6g (2 x 241.826 kJ/mol x q)", got, want)
	}
	t.Logf("heat release %.7g W/m^3, CODATA-based %.7g (rel. %.2g)", got, want, relErr(got, want))
}

// TestDetailedBalanceHand: concentrations whose quotient equals Kc give zero
// net rate for an elementary, a three-body and a falloff step, with the
// reverse from Kc. Exact up to round-off (1e-12 of the forward rate).
func TestDetailedBalanceHand(t *testing.T) {
	tb := rxn("H+O2=HO2", chem.ThreeBody)
	tb.Rate = chem.Arrhenius{A: 6.4e8, B: -0.8}
	tb.ThirdBody = &chem.ThirdBody{Default: 1, Efficiencies: map[int]float64{hIdx("H2O"): 12}}
	el := rxn("H+O2=O+OH", chem.Elementary)
	el.Rate = chem.Arrhenius{A: 2.65e10, B: -0.6707, E: 17041 * calorie}
	for _, r := range []chem.Reaction{el, tb, griMethylRecombination(true)} {
		k := mustKinetics(t, handMechanism(r))
		for _, T := range []float64{600, 1500, 2500} {
			C := bath(T, thermo.OneAtmosphere, map[string]float64{"H": 1e-3, "O2": 1, "O": 2e-3, "OH": 3e-3, "HO2": 1e-4, "CH3": 1e-3, "CH4": 0.1, "H2O": 0.5})
			balanceLast(k, r, T, C)
			f, b, n := make([]float64, 1), make([]float64, 1), make([]float64, 1)
			k.RatesOfProgress(T, C, f, b, n)
			if !(f[0] > 0) || math.Abs(n[0]) > 1e-12*f[0] {
				t.Errorf("%s at %g K: forward %.6g, net %.3g at Q = Kc", r.Equation, T, f[0], n[0])
			}
		}
	}
}

// balanceLast sets the concentration of the reaction's last product so that
// prod C^nu (net stoichiometry) equals Kc.
func balanceLast(k *chem.Kinetics, r chem.Reaction, T float64, C []float64) {
	Kc := make([]float64, k.NumReactions())
	k.EquilibriumConstants(T, Kc)
	nu := map[int]float64{}
	for _, p := range r.Reactants {
		nu[p.Species] -= p.Coefficient
	}
	for _, p := range r.Products {
		nu[p.Species] += p.Coefficient
	}
	last := r.Products[len(r.Products)-1].Species
	lnQ := 0.0
	for s, v := range nu {
		if s != last {
			lnQ += v * math.Log(C[s])
		}
	}
	C[last] = math.Exp((math.Log(Kc[0]) - lnQ) / nu[last])
}

// allForms is a hand mechanism with every rate form and option: elementary,
// three-body, Troe falloff (GRI-Mech 3.0 parameters), chemically activated
// SRI, Lindemann, pressure table, Chebyshev, fractional and negative orders,
// an explicit reverse rate and a duplicate pair with a negative A. Rate
// parameters other than GRI's are invented (SI units).
func allForms() *chem.Mechanism {
	el := rxn("H+O2=O+OH", chem.Elementary)
	el.Rate = chem.Arrhenius{A: 2.65e10, B: -0.6707, E: 17041 * calorie}

	tb := rxn("H+O2=HO2", chem.ThreeBody)
	tb.Rate = chem.Arrhenius{A: 6.4e8, B: -0.8}
	tb.ThirdBody = &chem.ThirdBody{Default: 1, Efficiencies: map[int]float64{hIdx("H2O"): 12, hIdx("AR"): 0}}

	act := rxn("O+H2=H+OH", chem.ChemicallyActivated)
	act.ThirdBody = &chem.ThirdBody{Default: 1.2, Efficiencies: map[int]float64{hIdx("N2"): 1}}
	act.FalloffRate = &chem.FalloffRate{
		Low:  chem.Arrhenius{A: 5e7, B: 0.3, E: 3e4},
		High: chem.Arrhenius{A: 2e6, B: 0.5, E: 2e4},
		SRI:  &chem.SRI{A: 0.6, B: 300, C: 900, D: 1.1, E: -0.05},
	}

	lind := rxn("H+OH=H2O", chem.Falloff)
	lind.ThirdBody = &chem.ThirdBody{Default: 1, Efficiencies: map[int]float64{hIdx("H2O"): 6}}
	lind.FalloffRate = &chem.FalloffRate{Low: chem.Arrhenius{A: 4e10, B: -2}, High: chem.Arrhenius{A: 1e8, B: 0.2}}

	table := rxn("OH+H2=H+H2O", chem.PressureTable)
	atm := thermo.OneAtmosphere
	table.PressureRates = []chem.PressureRate{
		{P: 0.3 * atm, Rate: chem.Arrhenius{A: 2e2, B: 1.5, E: 1.4e4}},
		{P: 3 * atm, Rate: chem.Arrhenius{A: 5e2, B: 1.4, E: 1.5e4}},
		{P: 3 * atm, Rate: chem.Arrhenius{A: -1e2, B: 1.3, E: 1.7e4}},
	}

	cheb := rxn("HO2+H=2OH", chem.Chebyshev)
	cheb.ChebyshevRate = &chem.ChebyshevRate{TMin: 300, TMax: 3000, PMin: 1e4, PMax: 1e6,
		Coeffs: [][]float64{{7.5, 0.4, -0.1}, {-0.9, 0.15, 0.02}, {0.2, -0.05, 0.01}, {0.05, 0.01, 0}}}

	frac := rxn("2H2+O2=>2H2O", chem.Elementary)
	frac.Rate = chem.Arrhenius{A: 1e5, E: 4e4}
	frac.Orders = map[int]float64{hIdx("H2"): 1.5, hIdx("O2"): 0.75, hIdx("H2O"): -0.2}

	expl := rxn("H+HO2=H2+O2", chem.Elementary)
	expl.Rate = chem.Arrhenius{A: 1.7e7, E: 3.5e3}
	expl.ReverseRate = &chem.Arrhenius{A: 4e7, B: 0.1, E: 2.2e5}
	expl.ReverseOrders = map[int]float64{hIdx("O2"): 1.3}

	dup1 := rxn("2OH=O+H2O", chem.Elementary)
	dup1.Rate = chem.Arrhenius{A: 3e4, B: 1.1, E: 1e3}
	dup1.Duplicate = true
	dup2 := dup1
	dup2.Rate = chem.Arrhenius{A: -1e4, B: 1.0, E: 5e3}

	troe := griMethylRecombination(true)
	return handMechanism(el, tb, act, lind, table, cheb, frac, expl, dup1, dup2, troe)
}

// flameLikeHand: a hot mixture with all hand species present (mole
// fractions invented, radicals ~1e-3).
func flameLikeHand(T, P float64) []float64 {
	x := map[string]float64{"H": 2e-3, "O": 1e-3, "OH": 4e-3, "H2": 0.02, "O2": 0.05, "H2O": 0.15,
		"HO2": 1e-5, "N2": 0.7, "AR": 0.01, "CH3": 1e-4, "CH4": 1e-3}
	ctot := P / (thermo.GasConstant * T)
	C := make([]float64, len(handSpecies))
	sum := 0.0
	for _, v := range x {
		sum += v
	}
	for s, v := range x {
		C[hIdx(s)] = v / sum * ctot
	}
	return C
}

// checkJacobian compares ProductionRateDerivatives with central finite
// differences of NetProductionRates. Each entry is differenced with steps h
// and h/2; their disagreement estimates the truncation error. Round-off of a
// difference is bounded by 1e-15 G_i/h, G_i = sum_r |nu_ir| (forward_r +
// reverse_r) the gross rate behind wdot_i (wdot_i can be a small residual of
// large opposing rates). The analytic value must lie within rtol of the
// larger magnitude plus 4 truncation estimates plus the round-off bound.
// Returns the largest relative deviation beyond the two error estimates.
func checkJacobian(t *testing.T, m *chem.Mechanism, k *chem.Kinetics, T float64, C []float64, rtol float64) float64 {
	t.Helper()
	K, N := k.NumSpecies(), k.NumReactions()
	wdot, dWdC, dWdT := make([]float64, K), make([]float64, K*K), make([]float64, K)
	k.ProductionRateDerivatives(T, C, wdot, dWdC, dWdT)
	ref := make([]float64, K)
	k.NetProductionRates(T, C, ref)
	for i := range ref {
		if wdot[i] != ref[i] {
			t.Fatalf("wdot from the Jacobian call differs from NetProductionRates: species %d %g vs %g", i, wdot[i], ref[i])
		}
	}
	f, b, n := make([]float64, N), make([]float64, N), make([]float64, N)
	k.RatesOfProgress(T, C, f, b, n)
	gross := make([]float64, K)
	for r := range m.Reactions {
		for _, p := range m.Reactions[r].Reactants {
			gross[p.Species] += p.Coefficient * (math.Abs(f[r]) + math.Abs(b[r]))
		}
		for _, p := range m.Reactions[r].Products {
			gross[p.Species] += p.Coefficient * (math.Abs(f[r]) + math.Abs(b[r]))
		}
	}
	ctot := 0.0
	for _, c := range C {
		ctot += c
	}
	plus, minus := make([]float64, K), make([]float64, K)
	Cp := append([]float64(nil), C...)
	central := func(eval func(x float64, out []float64), x, h float64) []float64 {
		eval(x+h, plus)
		eval(x-h, minus)
		d := make([]float64, K)
		for i := range d {
			d[i] = (plus[i] - minus[i]) / (2 * h)
		}
		return d
	}
	worst := 0.0
	compare := func(what string, col func(i int) float64, d1, d2 []float64, h float64) {
		for i := 0; i < K; i++ {
			a := col(i)
			est := 4*math.Abs(d1[i]-d2[i]) + 1e-15*gross[i]/h
			s := math.Max(math.Abs(a), math.Abs(d2[i]))
			dev := math.Abs(a - d2[i])
			if dev > rtol*s+est {
				t.Errorf("%s, species %d: analytic %.10g, finite difference %.10g (estimated FD error %.2g)", what, i, a, d2[i], est)
			}
			if s > 0 {
				worst = math.Max(worst, (dev-est)/s)
			}
		}
	}
	for j := 0; j < K; j++ {
		// Not smaller than 1e-7 of the total (sums over C lose digits to a
		// smaller step), not larger than a tenth of C_j (no sign change).
		h := math.Min(math.Max(1e-4*C[j], 1e-7*ctot), 0.1*C[j])
		if h == 0 {
			continue
		}
		eval := func(x float64, out []float64) {
			Cp[j] = x
			k.NetProductionRates(T, Cp, out)
			Cp[j] = C[j]
		}
		compare("d wdot/dC_"+strconv.Itoa(j), func(i int) float64 { return dWdC[i*K+j] },
			central(eval, C[j], h), central(eval, C[j], h/2), h/2)
	}
	// T differences recompute the per-T cache: T +- h are new temperatures.
	evalT := func(x float64, out []float64) { k.NetProductionRates(x, C, out) }
	compare("d wdot/dT", func(i int) float64 { return dWdT[i] }, central(evalT, T, 0.02), central(evalT, T, 0.01), 0.01)
	return math.Max(worst, 0)
}

// TestJacobianAllForms checks the analytic derivatives of every rate form
// against central finite differences (a convergence check of the
// differences themselves is built in: steps h and h/2). rtol 1e-7: the
// difference error at h/2 is already estimated; this only absorbs what the
// estimate misses.
func TestJacobianAllForms(t *testing.T) {
	m := allForms()
	k := mustKinetics(t, m)
	for _, st := range []struct{ T, P float64 }{
		{1600, thermo.OneAtmosphere},      // inside the table and Chebyshev ranges
		{900, 0.1 * thermo.OneAtmosphere}, // below the table, Chebyshev P clamped
		{2200, 2 * thermo.OneAtmosphere},  // between table levels
	} {
		w := checkJacobian(t, m, k, st.T, flameLikeHand(st.T, st.P), 1e-7)
		t.Logf("T = %g K, P = %g Pa: largest relative deviation beyond the FD error estimate %.2g", st.T, st.P, w)
	}
}

// TestHydrogenOxygenBranchingRate checks GRI-Mech 3.0's H+O2<=>O+OH
// (A = 2.650E+16 cm^3/(mol s), b = -0.6707, E = 17041 cal/mol) at 2000 K
// against the evaluation of Baulch et al., J. Phys. Chem. Ref. Data 34
// (2005) 757: k = 3.43e-10 T^-0.097 exp(-7560 K/T) cm^3/(molecule s), with
// an uncertainty of Δlog k = ±0.1 over 800-3500 K (expression and
// uncertainty from memory). 2000 K gives 2.25e12 cm^3/(mol s); the shock-tube
// fit of Hong et al., Proc. Combust. Inst. 33 (2011) 309, k = 1.04e14
// exp(-15286 cal/mol/RT) (from memory), gives 2.22e12.
func TestHydrogenOxygenBranchingRate(t *testing.T) {
	r := rxn("H+O2=O+OH", chem.Elementary)
	r.Rate = chem.Arrhenius{A: 2.650e16 * 1e-6, B: -0.6707, E: 17041 * calorie}
	k := mustKinetics(t, handMechanism(r))
	T := 2000.0
	kf, _ := rateConstants(k, T, bath(T, thermo.OneAtmosphere, nil))
	const avogadro = 6.02214076e23
	baulch := 3.43e-10 * math.Pow(T, -0.097) * math.Exp(-7560/T) * avogadro * 1e-6 // m^3/(mol s)
	if d := math.Abs(math.Log10(kf[0] / baulch)); d > 0.1 {
		t.Errorf("k(2000 K) = %.4g m^3/(mol s), Baulch et al. 2005 %.4g: |Δlog k| = %.3f > 0.1", kf[0], baulch, d)
	}
	hong := 1.04e14 * 1e-6 * math.Exp(-15286*calorie/(thermo.GasConstant*T))
	t.Logf("k(2000 K) = %.4g m^3/(mol s); Baulch 2005 %.4g, Hong 2011 %.4g", kf[0], baulch, hong)
	if d := math.Abs(math.Log10(kf[0] / hong)); d > 0.1 {
		t.Errorf("k(2000 K) = %.4g m^3/(mol s), Hong et al. 2011 %.4g: |Δlog k| = %.3f > 0.1", kf[0], hong, d)
	}
}

// TestExtremeArrhenius: the n-heptane skeletal mechanism of Lu et al.,
// Combust. Flame 156 (2009) 1542, has nc7h16 = h + c7h15 with A = 1.625E+88
// s^-1, b = -21.01, E = 1.395E+05 cal/mol. The reference is ln k written out
// by hand: ln k = ln 1.625e88 - 21.01 ln T - 1.395e5*4.184/(R T), with
// ln 1.625e88 = 88 ln 10 + ln 1.625 = 202.6274882 + 0.4855078 = 203.1129960.
// At 250 K the direct product A T^b = 1.6e88 * 4e-51 stays in range, but a
// parameter set of A = 1e300, b = -30 would not: both are checked.
func TestExtremeArrhenius(t *testing.T) {
	tests := []struct {
		name string
		a    chem.Arrhenius
		lnA  float64
	}{
		{"n-heptane sk68", chem.Arrhenius{A: 1.625e88, B: -21.01, E: 1.395e5 * calorie}, 203.1129960},
		{"beyond float range in A T^b", chem.Arrhenius{A: 1e300, B: -30, E: 1e5}, 300 * math.Ln10},
	}
	for _, tc := range tests {
		r := rxn("H2O=>H+OH", chem.Elementary) // a unimolecular stand-in: k in 1/s
		r.Rate = tc.a
		k := mustKinetics(t, handMechanism(r))
		for _, T := range []float64{250, 300, 1000, 2500, 4000} {
			kf, _ := rateConstants(k, T, bath(T, thermo.OneAtmosphere, nil))
			lnk := tc.lnA + tc.a.B*math.Log(T) - tc.a.E/(thermo.GasConstant*T)
			// ln k near ±200: 1e-7 absolute in ln k is the precision of the
			// 10-digit ln A written above.
			if math.IsInf(kf[0], 0) || math.IsNaN(kf[0]) || math.Abs(math.Log(kf[0])-lnk) > 1e-7 {
				t.Errorf("%s at %g K: k = %g, want exp(%.8f)", tc.name, T, kf[0], lnk)
			}
		}
	}
}

// TestNegativePreExponentialPair: a duplicate pair whose second member has
// A < 0 (as in some published sets, where only the sum is physical) gives
// the sum of the two rates; each keeps its sign, and the reverse follows.
func TestNegativePreExponentialPair(t *testing.T) {
	m := allForms()
	k := mustKinetics(t, m)
	T := 1400.0
	C := flameLikeHand(T, thermo.OneAtmosphere)
	kf, kr := rateConstants(k, T, C)
	i, j := 8, 9 // dup1, dup2 in allForms
	want := arrhenius(m.Reactions[i].Rate, T) + arrhenius(m.Reactions[j].Rate, T)
	if !(kf[j] < 0) || relErr(kf[i]+kf[j], want) > 1e-13 {
		t.Errorf("pair kf = %g + %g, want negative second and sum %g", kf[i], kf[j], want)
	}
	if !(kr[j] < 0) || relErr(kr[i]/kf[i], kr[j]/kf[j]) > 1e-13 {
		t.Errorf("pair kr = %g, %g: both should be kf/Kc", kr[i], kr[j])
	}
}

// TestReverseRateOptions: an explicit reverse rate is used as given,
// irreversible steps have kr = 0, others kr = kf/Kc.
func TestReverseRateOptions(t *testing.T) {
	m := allForms()
	k := mustKinetics(t, m)
	T := 1700.0
	kf, kr := rateConstants(k, T, flameLikeHand(T, thermo.OneAtmosphere))
	Kc := make([]float64, k.NumReactions())
	k.EquilibriumConstants(T, Kc)
	for i, r := range m.Reactions {
		var want float64
		switch {
		case !r.Reversible:
			want = 0
		case r.ReverseRate != nil:
			want = arrhenius(*r.ReverseRate, T)
		default:
			want = kf[i] / Kc[i]
		}
		if relErr(kr[i], want) > 1e-12 {
			t.Errorf("reaction %d (%s): kr = %.10g, want %.10g", i, r.Equation, kr[i], want)
		}
	}
}

// TestGuardedStates: zero, negative and tiny concentrations and the
// temperature range 250-4000 K give finite results everywhere, including
// rates, derivatives and heat release; a fractional order of a negative
// concentration contributes 0 (documented clipping), and [M] < 0 does not
// reach the falloff expression.
func TestGuardedStates(t *testing.T) {
	m := allForms()
	k := mustKinetics(t, m)
	K, N := k.NumSpecies(), k.NumReactions()
	states := map[string]func(T float64) []float64{
		"all zero":   func(float64) []float64 { return make([]float64, K) },
		"flame-like": func(T float64) []float64 { return flameLikeHand(T, thermo.OneAtmosphere) },
		"negative traces": func(T float64) []float64 {
			C := flameLikeHand(T, thermo.OneAtmosphere)
			C[hIdx("H2")], C[hIdx("HO2")], C[hIdx("H2O")] = -1e-9, -1e-12, -1e-15
			return C
		},
		"all negative": func(T float64) []float64 {
			C := flameLikeHand(T, thermo.OneAtmosphere)
			for i := range C {
				C[i] = -C[i]
			}
			return C
		},
		"denormal": func(float64) []float64 {
			C := make([]float64, K)
			for i := range C {
				C[i] = 5e-324
			}
			return C
		},
	}
	wdot, dWdC, dWdT := make([]float64, K), make([]float64, K*K), make([]float64, K)
	f, b, n, kf, kr := make([]float64, N), make([]float64, N), make([]float64, N), make([]float64, N), make([]float64, N)
	for name, state := range states {
		for T := 250.0; T <= 4000; T += 250 {
			C := state(T)
			k.ProductionRateDerivatives(T, C, wdot, dWdC, dWdT)
			k.RatesOfProgress(T, C, f, b, n)
			k.RateConstants(T, C, kf, kr)
			hrr := k.HeatReleaseRate(T, C)
			for _, arr := range [][]float64{wdot, dWdC, dWdT, f, b, n, kf, kr, {hrr}} {
				for i, v := range arr {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Fatalf("%s, T = %g K: non-finite value %g at index %d", name, T, v, i)
					}
				}
			}
		}
	}
	// Fractional orders: 2H2+O2=>2H2O with H2^1.5; negative H2 gives 0.
	T := 1500.0
	C := flameLikeHand(T, thermo.OneAtmosphere)
	C[hIdx("H2")] = -1e-6
	k.RatesOfProgress(T, C, f, b, n)
	if f[6] != 0 {
		t.Errorf("fractional order of a negative concentration: forward rate %g, want 0", f[6])
	}
}

// TestCacheAndClone: results do not depend on the call history (the per-T
// cache), and a clone used concurrently gives bitwise the same numbers.
func TestCacheAndClone(t *testing.T) {
	m := allForms()
	k := mustKinetics(t, m)
	K := k.NumSpecies()
	fresh := func(T float64, C []float64) []float64 {
		w := make([]float64, K)
		mustKinetics(t, m).NetProductionRates(T, C, w)
		return w
	}
	C1, C2 := flameLikeHand(1500, thermo.OneAtmosphere), flameLikeHand(1500, 3*thermo.OneAtmosphere)
	want1, want2 := fresh(1500, C1), fresh(1500, C2)
	w := make([]float64, K)
	Kc := make([]float64, k.NumReactions())
	for _, step := range []struct {
		T    float64
		C    []float64
		want []float64
	}{{1500, C1, want1}, {1500, C2, want2}, {900, C1, nil}, {1500, C1, want1}, {1500, C2, want2}} {
		k.EquilibriumConstants(step.T+1, Kc) // a call at another T in between
		k.NetProductionRates(step.T, step.C, w)
		for i := range step.want {
			if w[i] != step.want[i] {
				t.Fatalf("history-dependent result at T = %g: species %d %g, fresh %g", step.T, i, w[i], step.want[i])
			}
		}
	}
	done := make(chan []float64)
	for g := 0; g < 4; g++ {
		c := k.Clone()
		go func() {
			out := make([]float64, K)
			for it := 0; it < 200; it++ {
				c.NetProductionRates(1000+float64(it%3), C2, out)
			}
			c.NetProductionRates(1500, C2, out)
			done <- out
		}()
	}
	for g := 0; g < 4; g++ {
		out := <-done
		for i := range out {
			if out[i] != want2[i] {
				t.Fatalf("clone result differs: species %d %g vs %g", i, out[i], want2[i])
			}
		}
	}
}

// TestNoAllocations: the evaluation methods allocate nothing, at a repeated
// temperature (cache hit) and at a new one (cache refill).
func TestNoAllocations(t *testing.T) {
	k := mustKinetics(t, allForms())
	K, N := k.NumSpecies(), k.NumReactions()
	C := flameLikeHand(1500, thermo.OneAtmosphere)
	wdot, dWdC, dWdT := make([]float64, K), make([]float64, K*K), make([]float64, K)
	f, b, n := make([]float64, N), make([]float64, N), make([]float64, N)
	T := 1500.0
	calls := map[string]func(){
		"NetProductionRates":        func() { k.NetProductionRates(T, C, wdot) },
		"RatesOfProgress":           func() { k.RatesOfProgress(T, C, f, b, n) },
		"RateConstants":             func() { k.RateConstants(T, C, f, b) },
		"EquilibriumConstants":      func() { k.EquilibriumConstants(T, f) },
		"HeatReleaseRate":           func() { _ = k.HeatReleaseRate(T, C) },
		"ProductionRateDerivatives": func() { k.ProductionRateDerivatives(T, C, wdot, dWdC, dWdT) },
	}
	for name, call := range calls {
		if a := testing.AllocsPerRun(50, call); a != 0 {
			t.Errorf("%s, same T: %g allocations per call", name, a)
		}
		if a := testing.AllocsPerRun(50, func() { T += 0.5; call() }); a != 0 {
			t.Errorf("%s, new T each call: %g allocations per call", name, a)
		}
	}
}

// TestNewKineticsErrors: unusable rate data are refused with a message.
func TestNewKineticsErrors(t *testing.T) {
	tests := []struct {
		name   string
		edit   func(r *chem.Reaction)
		substr string
	}{
		{"NaN pre-exponential", func(r *chem.Reaction) { r.Rate.A = math.NaN() }, "finite"},
		{"falloff with negative low-pressure A", func(r *chem.Reaction) {
			*r = griMethylRecombination(true)
			r.FalloffRate.Low.A = -1
		}, "positive pre-exponentials"},
		{"SRI with d = 0", func(r *chem.Reaction) {
			*r = griMethylRecombination(false)
			r.FalloffRate.SRI = &chem.SRI{A: 0.5, B: 200, C: 1000}
		}, "d > 0"},
		{"ragged Chebyshev", func(r *chem.Reaction) {
			*r = chebReaction()
			r.ChebyshevRate.Coeffs[1] = []float64{1}
		}, "row 2"},
		{"order of an unknown species", func(r *chem.Reaction) { r.Orders = map[int]float64{99: 1} }, "out of range"},
		{"infinite order", func(r *chem.Reaction) { r.Orders = map[int]float64{0: math.Inf(1)} }, "not finite"},
		{"non-finite efficiency", func(r *chem.Reaction) {
			r.Form = chem.ThreeBody
			r.ThirdBody = &chem.ThirdBody{Default: 1, Efficiencies: map[int]float64{0: math.NaN()}}
		}, "not finite"},
		{"unbalanced", func(r *chem.Reaction) { r.Products = side("O+H2O") }, "not element-balanced"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r := rxn("H+O2=O+OH", chem.Elementary)
			r.Rate = chem.Arrhenius{A: 1e8}
			tc.edit(&r)
			_, err := chem.NewKinetics(handMechanism(r))
			if err == nil || !strings.Contains(err.Error(), tc.substr) {
				t.Errorf("error %v, want one mentioning %q", err, tc.substr)
			}
		})
	}
	if _, err := chem.NewKinetics(nil); err == nil {
		t.Error("nil mechanism accepted")
	}
}

// troeReference is the Troe falloff rate written directly from Gilbert,
// Luther & Troe (1983), for the variants of TestTroeVariants; a term whose
// T3 or T1 is 0 is dropped (flame1d's documented reading of a zero).
func troeReference(lo, hi chem.Arrhenius, tr chem.Troe, T, M float64) float64 {
	k0, kInf := arrhenius(lo, T), arrhenius(hi, T)
	Pr := k0 * M / kInf
	fc := 0.0
	if tr.T3 != 0 {
		fc += (1 - tr.A) * math.Exp(-T/tr.T3)
	}
	if tr.T1 != 0 {
		fc += tr.A * math.Exp(-T/tr.T1)
	}
	if tr.HasT2 {
		fc += math.Exp(-tr.T2 / T)
	}
	L := math.Log10(fc)
	c, n := -0.4-0.67*L, 0.75-1.27*L
	f1 := (math.Log10(Pr) + c) / (n - 0.14*(math.Log10(Pr)+c))
	return kInf * Pr / (1 + Pr) * math.Pow(10, L/(1+f1*f1))
}

// TestTroeVariants: the 3-parameter form (no T2 term), and T3 = 0 or T1 = 0
// (term dropped), against troeReference at several pressures and
// temperatures. Same formulas, different arithmetic: 1e-12.
func TestTroeVariants(t *testing.T) {
	base := griMethylRecombination(true)
	variants := map[string]chem.Troe{
		"4-parameter": *base.FalloffRate.Troe,
		"3-parameter": {A: 0.7830, T3: 74, T1: 2941},
		"T3 = 0":      {A: 0.7830, T3: 0, T1: 2941, T2: 6964, HasT2: true},
		"T1 = 0":      {A: 0.7830, T3: 74, T1: 0, T2: 6964, HasT2: true},
	}
	for name, tr := range variants {
		r := griMethylRecombination(true)
		trc := tr
		r.FalloffRate.Troe = &trc
		k := mustKinetics(t, handMechanism(r))
		for _, T := range []float64{500, 1200, 2400} {
			for _, P := range []float64{1e3, 1e5, 1e7} {
				C := bath(T, P, nil)
				kf, _ := rateConstants(k, T, C)
				want := troeReference(r.FalloffRate.Low, r.FalloffRate.High, tr, T, C[hIdx("N2")])
				if relErr(kf[0], want) > 1e-12 {
					t.Errorf("%s, T = %g K, P = %g Pa: k = %.14g, reference %.14g", name, T, P, kf[0], want)
				}
			}
		}
	}
}
