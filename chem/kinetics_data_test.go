package chem_test

import (
	"math"
	"math/rand/v2"
	"strings"
	"sync"
	"testing"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/thermo"
)

// Tests on published mechanisms: GRI-Mech 3.0 (Smith et al. 1999) and the
// n-heptane skeletal mechanism of Lu, Law, Yoo & Chen, Combust. Flame 156
// (2009) 1542, as shipped in package builtin (converted from the published
// files).

var (
	builtinMu   sync.Mutex
	builtinMech = map[string]*chem.Mechanism{}
)

// publishedMechanism returns a built-in mechanism (parsed once per test
// binary; the tests only read it).
func publishedMechanism(tb testing.TB, name string) *chem.Mechanism {
	tb.Helper()
	builtinMu.Lock()
	defer builtinMu.Unlock()
	if m, ok := builtinMech[name]; ok {
		return m
	}
	m, err := builtin.Mechanism(name)
	if err != nil {
		tb.Fatalf("built-in mechanism %s: %v", name, err)
	}
	builtinMech[name] = m
	return m
}

// flameState returns concentrations [mol/m^3] at (T, P) from the given mole
// fractions (species names as in the mechanism); every other species gets
// the floor fraction so that every reaction runs. The mixtures are invented
// to resemble the reaction zone of a premixed flame (radicals ~1e-3).
func flameState(tb testing.TB, m *chem.Mechanism, T, P float64, x map[string]float64, floor float64) []float64 {
	tb.Helper()
	X := make([]float64, len(m.Species))
	for i := range X {
		X[i] = floor
	}
	for name, v := range x {
		i := m.SpeciesIndex(name)
		if i < 0 {
			tb.Fatalf("species %q not in mechanism %s", name, m.Name)
		}
		X[i] = v
	}
	sum := 0.0
	for _, v := range X {
		sum += v
	}
	ctot := P / (thermo.GasConstant * T)
	for i := range X {
		X[i] *= ctot / sum
	}
	return X
}

// methaneFlameMidpoint is a stoichiometric CH4/air flame near its heat
// release peak (T ~ 1800 K): composition invented, typical magnitudes.
var methaneFlameMidpoint = map[string]float64{
	"CH4": 0.01, "O2": 0.05, "N2": 0.71, "H2O": 0.14, "CO2": 0.05, "CO": 0.025, "H2": 0.01,
	"H": 2e-3, "O": 1e-3, "OH": 3e-3, "HO2": 1e-4, "H2O2": 1e-5, "CH3": 5e-4, "CH2O": 2e-4,
	"HCO": 1e-5, "NO": 1e-5, "AR": 0.0085,
}

// heptaneFlameState is a lean n-heptane/air reaction zone (invented).
var heptaneFlameState = map[string]float64{
	"nc7h16": 2e-3, "o2": 0.1, "n2": 0.72, "h2o": 0.09, "co2": 0.05, "co": 0.02, "h2": 5e-3,
	"h": 1e-3, "o": 1e-3, "oh": 2e-3, "ho2": 1e-4, "ch3": 3e-4, "c2h4": 2e-3, "c3h6": 5e-4, "ch2o": 2e-4,
}

func griState(tb testing.TB) (*chem.Mechanism, []float64) {
	m := publishedMechanism(tb, "smith1999-natgas")
	return m, flameState(tb, m, 1800, thermo.OneAtmosphere, methaneFlameMidpoint, 1e-8)
}

// randomState draws T in [Tlo, Thi] and log-uniform concentrations in
// [1e-12, 10] mol/m^3.
func randomState(rng *rand.Rand, K int, Tlo, Thi float64) (float64, []float64) {
	C := make([]float64, K)
	for i := range C {
		C[i] = math.Pow(10, -12+13*rng.Float64())
	}
	return Tlo + (Thi-Tlo)*rng.Float64(), C
}

// TestPublishedKfOverKrIsKc: for every reversible reaction of GRI-Mech 3.0
// and the n-heptane set whose reverse comes from thermodynamics, kf/kr = Kc,
// with Kc from EquilibriumConstants (one exponential of ln Kc) and kr from
// the rate path (mostly products of per-species factors): to round-off,
// 1e-12 relative covering |ln Kc| up to ~1e3 times the unit round-off.
func TestPublishedKfOverKrIsKc(t *testing.T) {
	for _, set := range []string{"smith1999-natgas", "lu2009-heptane"} {
		m := publishedMechanism(t, set)
		k := mustKinetics(t, m)
		N := k.NumReactions()
		kf, kr, Kc := make([]float64, N), make([]float64, N), make([]float64, N)
		rng := rand.New(rand.NewPCG(1, 2))
		checked := 0
		// Random states plus the ends of the range, where 1/Kc leaves the
		// product-of-factors path for the exponential one (large |g/RT|).
		for _, Tfix := range []float64{0, 0, 0, 0, 0, 250, 4000} {
			T, C := randomState(rng, k.NumSpecies(), 300, 3000)
			if Tfix > 0 {
				T = Tfix
			}
			k.RateConstants(T, C, kf, kr)
			k.EquilibriumConstants(T, Kc)
			for i, r := range m.Reactions {
				if !r.Reversible || r.ReverseRate != nil {
					continue
				}
				checked++
				if relErr(kf[i]/kr[i], Kc[i]) > 1e-12 {
					t.Errorf("%s reaction %d (%s) at %.0f K: kf/kr = %.14g, Kc = %.14g", set, i+1, r.Equation, T, kf[i]/kr[i], Kc[i])
				}
			}
		}
		if checked == 0 {
			t.Errorf("%s: no reversible reaction without explicit reverse found", set)
		}
		t.Logf("%s: %d kf/kr = Kc checks", set, checked)
	}
}

// TestPublishedDetailedBalance: for each reversible GRI-Mech 3.0 reaction,
// concentrations whose quotient prod C^nu equals Kc give a net rate of
// progress of zero (relative 1e-10 of the forward rate: the quotient is
// set through exp/log of numbers up to ~100).
func TestPublishedDetailedBalance(t *testing.T) {
	m := publishedMechanism(t, "smith1999-natgas")
	k := mustKinetics(t, m)
	N := k.NumReactions()
	f, b, n, Kc := make([]float64, N), make([]float64, N), make([]float64, N), make([]float64, N)
	_, base := griState(t)
	worst := 0.0
	for _, T := range []float64{800, 1800, 2600} {
		k.EquilibriumConstants(T, Kc)
		for i, r := range m.Reactions {
			if !r.Reversible || r.ReverseRate != nil || len(r.Orders) > 0 || len(r.ReverseOrders) > 0 {
				continue
			}
			C := append([]float64(nil), base...)
			nu := map[int]float64{}
			for _, p := range r.Reactants {
				nu[p.Species] -= p.Coefficient
			}
			for _, p := range r.Products {
				nu[p.Species] += p.Coefficient
			}
			adj := -1
			for _, p := range r.Products {
				if nu[p.Species] != 0 {
					adj = p.Species
				}
			}
			lnQ := 0.0
			for s, v := range nu {
				if s != adj {
					lnQ += v * math.Log(C[s])
				}
			}
			C[adj] = math.Exp((math.Log(Kc[i]) - lnQ) / nu[adj])
			k.RatesOfProgress(T, C, f, b, n)
			rel := math.Abs(n[i]) / f[i]
			worst = math.Max(worst, rel)
			if !(f[i] > 0) || rel > 1e-10 {
				t.Errorf("reaction %d (%s) at %g K: forward %.6g, net %.3g at Q = Kc", i+1, r.Equation, T, f[i], n[i])
			}
		}
	}
	t.Logf("largest |net|/forward at Q = Kc: %.2g", worst)
}

// elementMatrix returns a[e][k], atoms of element e in species k.
func elementMatrix(m *chem.Mechanism) [][]float64 {
	a := make([][]float64, len(m.Elements))
	for e, el := range m.Elements {
		a[e] = make([]float64, len(m.Species))
		for k := range m.Species {
			for sym, n := range m.Species[k].Composition {
				if strings.EqualFold(sym, el) {
					a[e][k] += n
				}
			}
		}
	}
	return a
}

// TestPublishedConservation: every reaction is element-balanced, so
// sum_k a_ek wdot_k = 0 for every element and sum_k W_k wdot_k = 0 (mass)
// at any state; in floating point to round-off of the gross rates
// G_k = sum_r |nu_kr| (forward_r + reverse_r): the test allows 1e-13 of
// sum_k a_ek G_k (about 500 unit round-offs).
func TestPublishedConservation(t *testing.T) {
	for _, set := range []string{"smith1999-natgas", "lu2009-heptane"} {
		m := publishedMechanism(t, set)
		k := mustKinetics(t, m)
		K, N := k.NumSpecies(), k.NumReactions()
		a := elementMatrix(m)
		W, err := m.MolarMasses()
		if err != nil {
			t.Fatal(err)
		}
		wdot, f, b, n := make([]float64, K), make([]float64, N), make([]float64, N), make([]float64, N)
		rng := rand.New(rand.NewPCG(3, 4))
		worst := 0.0
		for trial := 0; trial < 20; trial++ {
			T, C := randomState(rng, K, 300, 3500)
			k.NetProductionRates(T, C, wdot)
			k.RatesOfProgress(T, C, f, b, n)
			gross := make([]float64, K)
			for r := range m.Reactions {
				for _, side := range [][]chem.Participant{m.Reactions[r].Reactants, m.Reactions[r].Products} {
					for _, p := range side {
						gross[p.Species] += p.Coefficient * (math.Abs(f[r]) + math.Abs(b[r]))
					}
				}
			}
			rows := append(a, W)
			for e, row := range rows {
				s, scale := 0.0, 0.0
				for i := range row {
					s += row[i] * wdot[i]
					scale += row[i] * gross[i]
				}
				if scale == 0 {
					continue
				}
				worst = math.Max(worst, math.Abs(s)/scale)
				if math.Abs(s) > 1e-13*scale {
					what := "mass"
					if e < len(m.Elements) {
						what = "element " + m.Elements[e]
					}
					t.Errorf("%s at %.0f K: %s not conserved: sum %.3g, gross %.3g", set, T, what, s, scale)
				}
			}
		}
		t.Logf("%s: largest relative imbalance %.2g", set, worst)
	}
}

// TestPublishedFinite: no NaN or Inf from zero concentrations, a flame
// state and random states over 250-4000 K, in rates, rate constants,
// derivatives and heat release, including the n-heptane set's extreme
// pre-exponentials (1.625E+88 T^-21.01 and its 5.2E+80 T^-19.67 reverse).
func TestPublishedFinite(t *testing.T) {
	for _, set := range []string{"smith1999-natgas", "lu2009-heptane"} {
		m := publishedMechanism(t, set)
		k := mustKinetics(t, m)
		K, N := k.NumSpecies(), k.NumReactions()
		wdot, dWdC, dWdT := make([]float64, K), make([]float64, K*K), make([]float64, K)
		kf, kr, f, b, n := make([]float64, N), make([]float64, N), make([]float64, N), make([]float64, N), make([]float64, N)
		x := methaneFlameMidpoint
		if set != "smith1999-natgas" {
			x = heptaneFlameState
		}
		rng := rand.New(rand.NewPCG(5, 6))
		for T := 250.0; T <= 4000; T += 125 {
			_, rc := randomState(rng, K, 0, 0)
			for name, C := range map[string][]float64{
				"zero":   make([]float64, K),
				"flame":  flameState(t, m, T, thermo.OneAtmosphere, x, 1e-12),
				"random": rc,
			} {
				k.ProductionRateDerivatives(T, C, wdot, dWdC, dWdT)
				k.RateConstants(T, C, kf, kr)
				k.RatesOfProgress(T, C, f, b, n)
				hrr := k.HeatReleaseRate(T, C)
				for _, arr := range [][]float64{wdot, dWdC, dWdT, kf, kr, f, b, n, {hrr}} {
					for i, v := range arr {
						if math.IsNaN(v) || math.IsInf(v, 0) {
							t.Fatalf("%s, %s state, T = %g K: non-finite %g at index %d", set, name, T, v, i)
						}
					}
				}
			}
		}
	}
}

// TestPublishedJacobian: analytic derivatives against finite differences
// (checkJacobian) for GRI-Mech 3.0 at the methane flame midpoint and for the
// n-heptane set at 1500 K. The temperatures avoid every species' NASA-7
// midpoint, where dh/dT jumps.
func TestPublishedJacobian(t *testing.T) {
	for _, c := range []struct {
		set string
		T   float64
		x   map[string]float64
	}{
		{"smith1999-natgas", 1800, methaneFlameMidpoint},
		{"smith1999-natgas", 1100, methaneFlameMidpoint},
		{"lu2009-heptane", 1500, heptaneFlameState},
	} {
		m := publishedMechanism(t, c.set)
		for _, s := range m.Species {
			if math.Abs(s.Thermo.TMid-c.T) < 1 {
				t.Fatalf("%s: test temperature %g K within 1 K of %s's polynomial midpoint", c.set, c.T, s.Name)
			}
		}
		k := mustKinetics(t, m)
		w := checkJacobian(t, m, k, c.T, flameState(t, m, c.T, thermo.OneAtmosphere, c.x, 1e-8), 1e-7)
		t.Logf("%s at %g K: largest relative deviation beyond the FD error estimate %.2g", c.set, c.T, w)
	}
}

// TestPublishedBranchingReaction: the importer's H+O2<=>O+OH of GRI-Mech 3.0
// carries the parameters that TestHydrogenOxygenBranchingRate checked
// against Baulch et al. 2005.
func TestPublishedBranchingReaction(t *testing.T) {
	m, C := griState(t)
	k := mustKinetics(t, m)
	kf, _ := rateConstants(k, 2000, C)
	want := 2.650e16 * 1e-6 * math.Pow(2000, -0.6707) * math.Exp(-17041*calorie/(thermo.GasConstant*2000))
	for i, r := range m.Reactions {
		if strings.ReplaceAll(r.Equation, " ", "") == "H+O2<=>O+OH" {
			if relErr(kf[i], want) > 1e-12 {
				t.Errorf("GRI H+O2<=>O+OH at 2000 K: k = %.12g, want %.12g", kf[i], want)
			}
			return
		}
	}
	t.Error("H+O2<=>O+OH not found in GRI-Mech 3.0")
}

// TestPublishedNoAllocations: zero allocations also on a full mechanism.
func TestPublishedNoAllocations(t *testing.T) {
	m, C := griState(t)
	k := mustKinetics(t, m)
	K := k.NumSpecies()
	wdot, dWdC, dWdT := make([]float64, K), make([]float64, K*K), make([]float64, K)
	T := 1800.0
	if a := testing.AllocsPerRun(20, func() { T += 1; k.NetProductionRates(T, C, wdot) }); a != 0 {
		t.Errorf("NetProductionRates: %g allocations per call", a)
	}
	if a := testing.AllocsPerRun(20, func() { k.ProductionRateDerivatives(T, C, wdot, dWdC, dWdT) }); a != 0 {
		t.Errorf("ProductionRateDerivatives: %g allocations per call", a)
	}
}
