package thermo_test

import (
	"errors"
	"math"
	"math/rand"
	"strconv"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
)

// dryAir is 20.95 % O2, 78.09 % N2, 0.93 % Ar by volume (ISO 2533:1975
// standard atmosphere composition, CO2 and trace gases folded into Ar),
// so that every element of GRI-Mech 3.0 is present.
var dryAir = map[string]float64{"O2": 0.2095, "N2": 0.7812, "AR": 0.0093}

// air2179 is the 21/79 O2/N2 "air" of combustion textbooks.
var air2179 = map[string]float64{"O2": 0.21, "N2": 0.79}

func premixed(t testing.TB, s *thermo.SpeciesSet, fuel, ox map[string]float64, phi float64) []float64 {
	t.Helper()
	X, err := s.PremixedMoleFractions(moles(t, s, fuel), moles(t, s, ox), phi)
	if err != nil {
		t.Fatal(err)
	}
	return X
}

// checkOptimality asserts the equilibrium conditions on a result: every gas
// species taking part satisfies g°/RT + ln(X P/P°) = sum_e a_ek λ_e/RT
// (Gordon & McBride 1994, NASA RP-1311, eq. 2.11 with 2.2), every
// condensed species present has g°/RT = sum_e a_ek λ_e/RT, every absent
// one a non-negative driving force, elements conserved to 1e-10, and no
// NaN anywhere.
func checkOptimality(t *testing.T, label string, s *thermo.SpeciesSet, r *thermo.EquilibriumResult, initial []float64, exclude []bool) {
	t.Helper()
	lp := math.Log(r.P / thermo.StandardPressure)
	worst := 0.0
	for k := range s.Species {
		sp := &s.Species[k]
		if math.IsNaN(r.Moles[k]) || math.IsNaN(r.MoleFractions[k]) || math.IsNaN(r.LnMoleFractions[k]) {
			t.Fatalf("%s: NaN for %s", label, sp.Name)
		}
		if exclude != nil && exclude[k] {
			if r.Moles[k] != 0 {
				t.Errorf("%s: excluded %s has %g mol", label, sp.Name, r.Moles[k])
			}
			continue
		}
		lam, present := 0.0, true
		for e := range s.Elements {
			if a := s.Atoms(k, e); a != 0 {
				if math.IsInf(r.ElementPotentials[e], -1) {
					present = false
				}
				lam += a * r.ElementPotentials[e]
			}
		}
		if !present {
			continue
		}
		g := sp.Thermo.GRT(r.T)
		if sp.Condensed {
			d := g - lam
			if r.Moles[k] > 0 {
				worst = math.Max(worst, math.Abs(d))
			} else if d < -1e-9 {
				t.Errorf("%s: absent condensed %s has driving force %g < 0", label, sp.Name, d)
			}
			continue
		}
		worst = math.Max(worst, math.Abs(g+r.LnMoleFractions[k]+lp-lam))
	}
	if worst > 1e-9 {
		t.Errorf("%s: optimality residual %g", label, worst)
	}
	b0 := make([]float64, len(s.Elements))
	b1 := make([]float64, len(s.Elements))
	s.ElementMoles(initial, b0)
	s.ElementMoles(r.Moles, b1)
	for e := range b0 {
		if b0[e] == 0 {
			if b1[e] != 0 {
				t.Errorf("%s: element %s created", label, s.Elements[e])
			}
			continue
		}
		if d := math.Abs(b1[e]-b0[e]) / b0[e]; d > 1e-10 {
			t.Errorf("%s: element %s conserved only to %g (relative)", label, s.Elements[e], d)
		}
	}
	if r.ElementResidual > 1e-10 {
		t.Errorf("%s: reported element residual %g", label, r.ElementResidual)
	}
	sum := 0.0
	for _, x := range r.MoleFractions {
		sum += x
	}
	if math.Abs(sum-1) > 1e-12 {
		t.Errorf("%s: gas mole fractions sum to %v", label, sum)
	}
}

// massActionResidual returns, over every reversible reaction, the largest
// |ln Kp - sum ν ln(X P/P°)| with ln Kp = -sum ν g°/RT, relative to
// max(1, sum |ν g°/RT|): the law of mass action in the form of e.g.
// Turns (2012), An Introduction to Combustion, eq. 2.66.
func massActionResidual(m *chem.Mechanism, s *thermo.SpeciesSet, r *thermo.EquilibriumResult) (worst float64, tested int) {
	lp := math.Log(r.P / thermo.StandardPressure)
	for _, rx := range m.Reactions {
		if !rx.Reversible {
			continue
		}
		lnKp, lhs, scale := 0.0, 0.0, 1.0
		ok := true
		term := func(ps []chem.Participant, sign float64) {
			for _, p := range ps {
				k := p.Species
				if math.IsInf(r.LnMoleFractions[k], -1) {
					ok = false
				}
				g := s.Species[k].Thermo.GRT(r.T)
				lnKp -= sign * p.Coefficient * g
				lhs += sign * p.Coefficient * (r.LnMoleFractions[k] + lp)
				scale += math.Abs(p.Coefficient * g)
			}
		}
		term(rx.Products, 1)
		term(rx.Reactants, -1)
		if !ok {
			continue
		}
		tested++
		worst = math.Max(worst, math.Abs(lnKp-lhs)/scale)
	}
	return worst, tested
}

func TestEquilibriumLawOfMassAction(t *testing.T) {
	m, s := natgasMechanism(t)
	states := []struct {
		label string
		phi   float64
		T, P  float64 // T = 0: adiabatic from 298.15 K
	}{
		{"CH4/air phi=1 adiabatic 1 atm", 1, 0, thermo.OneAtmosphere},
		{"CH4/air phi=0.6 1500 K 1 atm", 0.6, 1500, thermo.OneAtmosphere},
		{"CH4/air phi=1.5 2200 K 20 atm", 1.5, 2200, 20 * thermo.OneAtmosphere},
		{"CH4/air phi=3 1000 K 1 atm", 3, 1000, thermo.OneAtmosphere},
		{"CH4/air phi=1 4000 K 0.1 atm", 1, 4000, 0.1 * thermo.OneAtmosphere},
	}
	for _, st := range states {
		X := premixed(t, s, map[string]float64{"CH4": 1}, dryAir, st.phi)
		var r *thermo.EquilibriumResult
		var err error
		if st.T == 0 {
			r, err = s.AdiabaticFlame(thermo.ReferenceTemperature, st.P, X, thermo.EquilibriumOptions{})
		} else {
			r, err = s.EquilibrateTP(st.T, st.P, X, thermo.EquilibriumOptions{})
		}
		if err != nil {
			t.Fatalf("%s: %v", st.label, err)
		}
		checkOptimality(t, st.label, s, r, X, nil)
		worst, n := massActionResidual(m, s, r)
		if n < 300 {
			t.Errorf("%s: only %d reversible reactions tested", st.label, n)
		}
		// Exact in exact arithmetic; 1e-10 leaves room for round-off in
		// polynomial evaluation.
		if worst > 1e-10 {
			t.Errorf("%s: law of mass action violated, relative residual %g", st.label, worst)
		}
		t.Logf("%s: T %.2f K, %d iterations, %d reactions, mass-action residual %.2g, element residual %.2g",
			st.label, r.T, r.Iterations, n, worst, r.ElementResidual)
	}
}

func TestAdiabaticFlameTemperature(t *testing.T) {
	s := natgasSet(t)
	// Stoichiometric fuel/air (21 % O2, 79 % N2) from 298 K at 1 atm, full
	// equilibrium: CH4 2226 K, H2 2383 K (Turns, An Introduction to
	// Combustion, 3rd ed. 2012, and Glassman & Yetter, Combustion, 4th ed.
	// 2008, flame-temperature tables; from memory). Bound 0.5 % (11-12 K):
	// the tabulated values come from older thermo data than GRI-Mech 3.0.
	cases := []struct {
		fuel string
		want float64
	}{
		{"CH4", 2226},
		{"H2", 2383},
	}
	for _, c := range cases {
		X := premixed(t, s, map[string]float64{c.fuel: 1}, air2179, 1)
		r, err := s.AdiabaticFlame(298.15, thermo.OneAtmosphere, X, thermo.EquilibriumOptions{})
		if err != nil {
			t.Fatal(err)
		}
		checkOptimality(t, c.fuel, s, r, X, nil)
		if relDiff(r.T, c.want) > 0.005 {
			t.Errorf("%s/air: adiabatic flame temperature %.1f K, published %.0f K", c.fuel, r.T, c.want)
		}
		t.Logf("%s/air: T_ad = %.2f K (%d iterations)", c.fuel, r.T, r.Iterations)
		// Energy conservation: products at T_ad carry the reactants' enthalpy.
		Y0 := make([]float64, s.Len())
		Y1 := make([]float64, s.Len())
		s.MoleToMass(X, Y0)
		s.MoleToMass(r.MoleFractions, Y1)
		h0, h1 := s.EnthalpyMass(298.15, Y0), s.EnthalpyMass(r.T, Y1)
		if math.Abs(h1-h0) > 1e-9*s.CpMass(r.T, Y1)*r.T {
			t.Errorf("%s: enthalpy not conserved: %.9g vs %.9g J/kg", c.fuel, h1, h0)
		}
		// The TP equilibrium at T_ad is the same state.
		rt, err := s.EquilibrateTP(r.T, r.P, X, thermo.EquilibriumOptions{})
		if err != nil {
			t.Fatal(err)
		}
		for k := range X {
			if math.Abs(rt.MoleFractions[k]-r.MoleFractions[k]) > 1e-11 {
				t.Errorf("%s: TP and HP disagree on %s: %g vs %g", c.fuel, s.Species[k].Name, rt.MoleFractions[k], r.MoleFractions[k])
			}
		}
	}
	// Lean flames are cooler than stoichiometric ones, and the maximum lies
	// slightly rich (Turns 2012, Fig. 2.14 for CH4; common knowledge).
	Tad := func(phi float64) float64 {
		r, err := s.AdiabaticFlame(298.15, thermo.OneAtmosphere, premixed(t, s, map[string]float64{"CH4": 1}, air2179, phi), thermo.EquilibriumOptions{})
		if err != nil {
			t.Fatal(err)
		}
		return r.T
	}
	t07, t10, t105, t13 := Tad(0.7), Tad(1.0), Tad(1.05), Tad(1.3)
	if !(t07 < t10 && t10 < t105 && t13 < t105) {
		t.Errorf("T_ad(phi): 0.7 %.0f, 1.0 %.0f, 1.05 %.0f, 1.3 %.0f K: maximum not slightly rich", t07, t10, t105, t13)
	}
}

func TestEquilibriumAnalyticCases(t *testing.T) {
	s := natgasSet(t)
	only := func(names ...string) []bool {
		mask := make([]bool, s.Len())
		for k := range mask {
			mask[k] = true
		}
		for _, n := range names {
			mask[s.Index(n)] = false
		}
		return mask
	}
	// 1. H2 <=> 2H alone at 5000 K, 1 atm: X_H^2/X_H2 = Kp, so with
	// X_H2 = 1 - X_H, X_H = (-Kp + sqrt(Kp^2 + 4 Kp))/2 (closed form).
	{
		mask := only("H2", "H")
		T := 5000.0
		r, err := s.EquilibrateTP(T, thermo.OneAtmosphere, moles(t, s, map[string]float64{"H2": 1}), thermo.EquilibriumOptions{Exclude: mask})
		if err != nil {
			t.Fatal(err)
		}
		kp := math.Exp(-(2*s.Species[s.Index("H")].Thermo.GRT(T) - s.Species[s.Index("H2")].Thermo.GRT(T)))
		xH := (-kp + math.Sqrt(kp*kp+4*kp)) / 2
		if got := r.MoleFractions[s.Index("H")]; relDiff(got, xH) > 1e-11 {
			t.Errorf("H2 dissociation at 5000 K: X_H %.15g, closed form %.15g", got, xH)
		}
	}
	// 2. N2 + O2 <=> 2 NO alone, 21/79 air at 2000 K: 4x^2 = Kp (0.79-x)(0.21-x)
	// per mole of air, x the O2 consumed.
	{
		mask := only("N2", "O2", "NO")
		T := 2000.0
		r, err := s.EquilibrateTP(T, thermo.OneAtmosphere, moles(t, s, air2179), thermo.EquilibriumOptions{Exclude: mask})
		if err != nil {
			t.Fatal(err)
		}
		g := func(n string) float64 { return s.Species[s.Index(n)].Thermo.GRT(T) }
		kp := math.Exp(-(2*g("NO") - g("N2") - g("O2")))
		a, b, c := 4-kp, kp*(0.79+0.21), -kp*0.79*0.21
		x := (-b + math.Sqrt(b*b-4*a*c)) / (2 * a)
		if got := r.MoleFractions[s.Index("NO")]; relDiff(got, 2*x) > 1e-11 {
			t.Errorf("NO in air at 2000 K: X_NO %.15g, closed form %.15g", got, 2*x)
		}
		checkOptimality(t, "N2/O2/NO", s, r, moles(t, s, air2179), mask)
	}
}

func TestEquilibriumRobustness(t *testing.T) {
	s := natgasSet(t)
	type state struct {
		label string
		n     []float64
		T, P  float64
	}
	var cases []state
	rich := premixed(t, s, map[string]float64{"CH4": 1}, dryAir, 3)
	for _, T := range []float64{300, 600, 1000, 1500, 2000, 3000, 4000, 5000} {
		cases = append(cases, state{"CH4/air phi=3", rich, T, thermo.OneAtmosphere})
	}
	stoich := premixed(t, s, map[string]float64{"CH4": 1}, dryAir, 1)
	for _, T := range []float64{300, 800, 5000} {
		cases = append(cases, state{"CH4/air phi=1", stoich, T, thermo.OneAtmosphere})
	}
	nearInert := moles(t, s, map[string]float64{"N2": 1, "O2": 1e-12})
	for _, T := range []float64{300, 1500, 3000} {
		cases = append(cases, state{"N2 + 1e-12 O2", nearInert, T, thermo.OneAtmosphere})
	}
	traceAr := moles(t, s, map[string]float64{"CH4": 0.095, "O2": 0.19, "N2": 0.715, "AR": 1e-20})
	cases = append(cases, state{"CH4/O2/N2 + 1e-20 Ar", traceAr, 2000, 5 * thermo.OneAtmosphere})
	hot := moles(t, s, map[string]float64{"H2O": 1, "CO2": 1, "N2": 1})
	cases = append(cases, state{"H2O/CO2/N2 5000 K", hot, 5000, thermo.OneAtmosphere},
		state{"H2O/CO2/N2 5000 K 0.01 atm", hot, 5000, 0.01 * thermo.OneAtmosphere},
		state{"H2O/CO2/N2 300 K 100 atm", hot, 300, 100 * thermo.OneAtmosphere})
	pureH2 := moles(t, s, map[string]float64{"H2": 1})
	cases = append(cases, state{"pure H2 300 K", pureH2, 300, thermo.OneAtmosphere})

	for _, c := range cases {
		label := c.label + " " + fmtT(c.T)
		r, err := s.EquilibrateTP(c.T, c.P, c.n, thermo.EquilibriumOptions{})
		if err != nil {
			t.Errorf("%s: %v", label, err)
			continue
		}
		checkOptimality(t, label, s, r, c.n, nil)
	}

	// Trace species far below 1e-30 keep finite logarithms: O atoms in air
	// at 300 K are near 1e-40 (ln K of O2 <=> 2 O at 300 K is about -186).
	r, err := s.EquilibrateTP(300, thermo.OneAtmosphere, moles(t, s, air2179), thermo.EquilibriumOptions{})
	if err != nil {
		t.Fatal(err)
	}
	lnO := r.LnMoleFractions[s.Index("O")]
	if !(lnO < math.Log(1e-30)) || math.IsInf(lnO, 0) {
		t.Errorf("O in air at 300 K: ln X = %g, want finite and below ln 1e-30", lnO)
	}
	// At 5000 K, 1 atm, water is mostly dissociated (JANAF Kp values put
	// X_H2O below 5 %; from memory) and oxygen and hydrogen are mainly atoms.
	r, err = s.EquilibrateTP(5000, thermo.OneAtmosphere, hot, thermo.EquilibriumOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if x := r.MoleFractions[s.Index("H2O")]; x > 0.05 {
		t.Errorf("5000 K: X_H2O = %g, want strongly dissociated", x)
	}
	if r.MoleFractions[s.Index("O")] < r.MoleFractions[s.Index("O2")] || r.MoleFractions[s.Index("H")] < r.MoleFractions[s.Index("H2")] {
		t.Errorf("5000 K: atoms should dominate: O %g O2 %g H %g H2 %g", r.MoleFractions[s.Index("O")],
			r.MoleFractions[s.Index("O2")], r.MoleFractions[s.Index("H")], r.MoleFractions[s.Index("H2")])
	}
}

func fmtT(T float64) string { return strconv.FormatFloat(T, 'g', -1, 64) + " K" }

func TestEquilibriumGraphite(t *testing.T) {
	extra := sharedThermo(t, "thermo-extra")
	s0 := natgasSet(t).Species
	var graphite *thermo.Species
	for i := range extra {
		if extra[i].Name == "CSOLID" {
			graphite = &extra[i]
		}
	}
	if graphite == nil {
		t.Skip("CSOLID not in thermo-extra")
	}
	// The record is flagged as gas in the file (see its PROVENANCE.md); it is
	// graphite's thermo and is used here as the pure condensed phase.
	c := *graphite
	c.Condensed = true
	s, err := thermo.NewSpeciesSet(append(s0, c))
	if err != nil {
		t.Fatal(err)
	}
	iC, iCH4, iH2 := s.Index("CSOLID"), s.Index("CH4"), s.Index("H2")

	// Cracking of a C11H22-like fuel (C:H = 1:2; carried as 5.5 C2H4, the same
	// elements) at 1300 K, 10 bar: carbon deposits, the gas is H2 with some CH4.
	fuel := moles(t, s, map[string]float64{"C2H4": 5.5})
	T, P := 1300.0, 10e5
	r, err := s.EquilibrateTP(T, P, fuel, thermo.EquilibriumOptions{})
	if err != nil {
		t.Fatal(err)
	}
	checkOptimality(t, "C11H22-like cracking", s, r, fuel, nil)
	if !(r.Moles[iC] > 5) {
		t.Errorf("graphite %g mol, want most of the 11 mol of carbon", r.Moles[iC])
	}
	// C(s) + 2 H2 <=> CH4 with unit graphite activity:
	// X_CH4 / X_H2^2 = Kp (P/P°), ln Kp = -(g_CH4 - g_C - 2 g_H2)/RT.
	g := func(k int) float64 { return s.Species[k].Thermo.GRT(T) }
	lnKp := -(g(iCH4) - g(iC) - 2*g(iH2))
	lhs := r.LnMoleFractions[iCH4] - 2*r.LnMoleFractions[iH2] - math.Log(P/thermo.StandardPressure)
	if math.Abs(lhs-lnKp) > 1e-9 {
		t.Errorf("C(s) + 2H2 = CH4: ln(X_CH4/X_H2^2 P°/P) = %.12g, ln Kp = %.12g", lhs, lnKp)
	}
	t.Logf("cracking at 1300 K, 10 bar: graphite %.4f of 11 mol C, X_H2 %.4f, X_CH4 %.4f, %d iterations",
		r.Moles[iC], r.MoleFractions[iH2], r.MoleFractions[iCH4], r.Iterations)

	// Stoichiometric CH4/air at the same state: no carbon, and graphite's
	// driving force is non-negative (checked in checkOptimality).
	X := premixed(t, s, map[string]float64{"CH4": 1}, air2179, 1)
	r, err = s.EquilibrateTP(T, P, X, thermo.EquilibriumOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if r.Moles[iC] != 0 {
		t.Errorf("stoichiometric CH4/air deposits %g mol graphite", r.Moles[iC])
	}
	checkOptimality(t, "CH4/air with graphite allowed", s, r, X, nil)

	// Adiabatic very rich CH4/O2 (phi 4): solid carbon in the products is
	// predicted, and the phase set must be found with T.
	Xr := premixed(t, s, map[string]float64{"CH4": 1}, map[string]float64{"O2": 1}, 4)
	r, err = s.AdiabaticFlame(298.15, thermo.OneAtmosphere, Xr, thermo.EquilibriumOptions{})
	if err != nil {
		t.Fatal(err)
	}
	checkOptimality(t, "CH4/O2 phi=4 adiabatic", s, r, Xr, nil)
	t.Logf("CH4/O2 phi=4 adiabatic: T %.1f K, graphite %.4g mol per mol of mixture", r.T, r.Moles[iC])
}

func TestEquilibriumExclusion(t *testing.T) {
	s := natgasSet(t)
	X := premixed(t, s, map[string]float64{"CH4": 1}, air2179, 1)
	var names []string
	for _, sp := range s.Species {
		if _, ok := sp.Composition["N"]; ok && sp.Name != "N2" {
			names = append(names, sp.Name)
		}
	}
	mask, err := s.ExcludeMask(names)
	if err != nil {
		t.Fatal(err)
	}
	full, err := s.AdiabaticFlame(298.15, thermo.OneAtmosphere, X, thermo.EquilibriumOptions{})
	if err != nil {
		t.Fatal(err)
	}
	noNOx, err := s.AdiabaticFlame(298.15, thermo.OneAtmosphere, X, thermo.EquilibriumOptions{Exclude: mask})
	if err != nil {
		t.Fatal(err)
	}
	checkOptimality(t, "no NOx", s, noNOx, X, mask)
	if k := s.Index("NO"); noNOx.Moles[k] != 0 || !(full.Moles[k] > 0) {
		t.Errorf("NO: %g mol with exclusion, %g without", noNOx.Moles[k], full.Moles[k])
	}
	// NO formation is endothermic (Δh_f = +90 kJ/mol): suppressing it leaves
	// the products slightly hotter.
	if !(noNOx.T > full.T) {
		t.Errorf("T without NOx %.2f K, with %.2f K: want hotter", noNOx.T, full.T)
	}
	if _, err := s.ExcludeMask([]string{"XYZ"}); err == nil {
		t.Error("unknown species in exclusion list: want error")
	}
	// Excluding every carrier of an element present is an error, not NaN.
	var cNames []string
	for _, sp := range s.Species {
		if _, ok := sp.Composition["C"]; ok {
			cNames = append(cNames, sp.Name)
		}
	}
	cmask, _ := s.ExcludeMask(cNames)
	if _, err := s.EquilibrateTP(2000, thermo.OneAtmosphere, X, thermo.EquilibriumOptions{Exclude: cmask}); err == nil ||
		!strings.Contains(err.Error(), "element C") {
		t.Errorf("all carbon carriers excluded: error %v", err)
	}
}

func TestEquilibriumInputErrors(t *testing.T) {
	s := natgasSet(t)
	X := premixed(t, s, map[string]float64{"CH4": 1}, air2179, 1)
	neg := append([]float64(nil), X...)
	neg[0] = -1
	nan := append([]float64(nil), X...)
	nan[1] = math.NaN()
	cases := []struct {
		label string
		run   func() error
		msg   string
	}{
		{"T zero", func() error { _, err := s.EquilibrateTP(0, 1e5, X, thermo.EquilibriumOptions{}); return err }, "temperature"},
		{"P negative", func() error { _, err := s.EquilibrateTP(1000, -1, X, thermo.EquilibriumOptions{}); return err }, "pressure"},
		{"negative moles", func() error { _, err := s.EquilibrateTP(1000, 1e5, neg, thermo.EquilibriumOptions{}); return err }, "initial amount"},
		{"NaN moles", func() error { _, err := s.EquilibrateTP(1000, 1e5, nan, thermo.EquilibriumOptions{}); return err }, "initial amount"},
		{"short", func() error { _, err := s.EquilibrateTP(1000, 1e5, X[:3], thermo.EquilibriumOptions{}); return err }, "entries"},
		{"empty", func() error {
			_, err := s.EquilibrateTP(1000, 1e5, make([]float64, s.Len()), thermo.EquilibriumOptions{})
			return err
		}, "empty"},
		{"bad mask", func() error {
			_, err := s.EquilibrateTP(1000, 1e5, X, thermo.EquilibriumOptions{Exclude: []bool{true}})
			return err
		}, "mask"},
		{"h NaN", func() error { _, err := s.EquilibrateHP(math.NaN(), 1e5, X, thermo.EquilibriumOptions{}); return err }, "enthalpy"},
		{"h unreachable", func() error { _, err := s.EquilibrateHP(1e9, 1e5, X, thermo.EquilibriumOptions{}); return err }, "limit"},
		{"too few iterations", func() error {
			_, err := s.EquilibrateTP(2000, 1e5, X, thermo.EquilibriumOptions{MaxIterations: 2})
			if err != nil && !errors.Is(err, thermo.ErrNotConverged) {
				return errors.New("not ErrNotConverged: " + err.Error())
			}
			return err
		}, "not converged"},
	}
	for _, c := range cases {
		err := c.run()
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%s: error %v, want one containing %q", c.label, err, c.msg)
		}
	}
}

func BenchmarkAdiabaticFlameGRI30(b *testing.B) {
	s := natgasSet(b)
	X, err := s.PremixedMoleFractions(moles(b, s, map[string]float64{"CH4": 1}), moles(b, s, dryAir), 1)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := s.AdiabaticFlame(298.15, thermo.OneAtmosphere, X, thermo.EquilibriumOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

// TestEquilibriumRandomStates runs TP and HP equilibria of random C/H/O/N/Ar
// mixtures (amounts spread over 25 decades, 250-6000 K, 1e2-1e8 Pa) and
// asserts the optimality conditions and element balance of each: a
// regression guard for the step control and the singular-matrix fallbacks.
func TestEquilibriumRandomStates(t *testing.T) {
	s := natgasSet(t)
	rng := rand.New(rand.NewSource(1))
	names := []string{"CH4", "O2", "N2", "H2", "H2O", "CO2", "AR", "C2H6", "CO", "NH3", "HCN", "C2H2", "CH3OH", "NO2", "OH", "O", "H", "N2O"}
	trials := 4000
	if testing.Short() {
		trials = 500
	}
	maxIter := 0
	for trial := 0; trial < trials; trial++ {
		n := make([]float64, s.Len())
		sum := 0.0
		for _, nm := range names {
			if rng.Float64() < 0.5 {
				n[s.Index(nm)] = math.Pow(10, -25*rng.Float64()*rng.Float64())
				sum += n[s.Index(nm)]
			}
		}
		if sum == 0 {
			continue
		}
		T := 250 + 5750*rng.Float64()
		P := math.Pow(10, 2+6*rng.Float64())
		var r *thermo.EquilibriumResult
		var err error
		if trial%2 == 0 {
			r, err = s.EquilibrateTP(T, P, n, thermo.EquilibriumOptions{})
		} else {
			r, err = s.AdiabaticFlame(250+1750*rng.Float64(), P, n, thermo.EquilibriumOptions{})
		}
		if err != nil {
			t.Errorf("trial %d: %v", trial, err)
			continue
		}
		maxIter = max(maxIter, r.Iterations)
		checkOptimality(t, "trial "+strconv.Itoa(trial), s, r, n, nil)
	}
	t.Logf("%d random states, at most %d iterations", trials, maxIter)
}

func BenchmarkTemperatureFromEnthalpyGRI30(b *testing.B) {
	s := natgasSet(b)
	r, err := s.AdiabaticFlame(298.15, thermo.OneAtmosphere, premixed(b, s, map[string]float64{"CH4": 1}, dryAir, 1), thermo.EquilibriumOptions{})
	if err != nil {
		b.Fatal(err)
	}
	Y := make([]float64, s.Len())
	s.MoleToMass(r.MoleFractions, Y)
	h := s.EnthalpyMass(1900, Y)
	for b.Loop() {
		if _, err := s.TemperatureFromEnthalpy(h, Y, 1500); err != nil {
			b.Fatal(err)
		}
	}
}
