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
