package study

import (
	"math"
	"testing"

	"flame1d/builtin"
	"flame1d/casefile"
	"flame1d/chem"
	"flame1d/fuel"
	"flame1d/sensitivity"
)

// Pool-yield sensitivities equal finite differences within 2%: a C3H8 fuel
// entered as the measured pool 1 C2H4 + 0.9 CH4 (scaled to the carbon and
// closed with 0.069 H2 by the fuel package) with propane's lower
// heating value, 46.35 MJ/kg (NIST Chemistry WebBook, from memory), burnt
// in air at phi = 1 and 500 K (the pre-cracked inlet enters some 100 K
// colder) on GRI-Mech 3.0, in both pool modes. The finite
// differences re-solve the flame on its grid with the yield multiplied and
// divided by 1.01 and the fuel resolved again (closure and heating value
// re-applied); S_L = m/rho_u with the perturbed inlet's density.
func TestPoolYieldSensitivities(t *testing.T) {
	if testing.Short() {
		t.Skip("methane-size flames on GRI-Mech 3.0")
	}
	c, err := casefile.Parse([]byte("mechanism = \"smith1999-natgas\"\n[mixture]\nfuel = { CH4 = 1 }\nequivalence_ratio = 1.0\ntemperature = \"500 K\"\n"), "pool-yields.toml")
	if err != nil {
		t.Fatal(err)
	}
	mech, err := builtin.Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatal(err)
	}
	for _, mode := range []string{fuel.ModePreCracked, fuel.ModeFiniteRate} {
		spec := fuel.Spec{Name: "pool-" + mode, Formula: "C3H8", LowerHeatingValue: 46.35e6, Mode: mode,
			Cracking: fuel.CrackingSpec{Method: fuel.MethodYields, Yields: map[string]float64{"C2H4": 1, "CH4": 0.9}},
			// C3H8 of GRI-Mech 3.0's transport file (from memory).
			Transport: &fuel.TransportSpec{WellDepth: 266.8, Diameter: 4.982e-10}}
		st, err := NewForFuel(c, mech, spec, nil)
		if err != nil {
			t.Fatal(err)
		}
		st.Settings.RelTol = 1e-9
		r, err := st.Solve(st.BaseCondition(), nil)
		if err != nil {
			t.Fatal(err)
		}
		if err := st.Sensitivity(r); err != nil {
			t.Fatal(err)
		}
		perts, err := st.poolYieldPerturbations(r.Condition)
		if err != nil {
			t.Fatal(err)
		}
		if len(perts) != 2 {
			t.Fatalf("%s: %d pool-yield parameters, want C2H4 and CH4", mode, len(perts))
		}
		for _, pt := range perts {
			speed := func(side int) float64 {
				pp := pt.Plus
				if side < 0 {
					pp = pt.Minus
				}
				alt, err := st.Solver.WithReactions(pp.Mechanism)
				if err != nil {
					t.Fatal(err)
				}
				sol, err := alt.SolveOnGrid(r.Solution, pp.Inlet, st.Settings)
				if err != nil {
					t.Fatal(err)
				}
				prof, err := alt.Profile(sol)
				if err != nil {
					t.Fatal(err)
				}
				return prof.FlameSpeed
			}
			fd := math.Log(speed(1)/speed(-1)) / (2 * pt.Step)
			adj := math.NaN()
			for _, co := range r.Sensitivity.Coefficients {
				if co.Kind == sensitivity.PoolYield && co.Parameter == pt.Name {
					adj = co.Value
				}
			}
			t.Logf("%s, S_L %.4f m/s: yield of %s: adjoint %+.5f, finite differences %+.5f", mode, r.Summary.FlameSpeed, pt.Name, adj, fd)
			if !(math.Abs(adj-fd) <= 0.02*math.Abs(fd)) {
				t.Errorf("%s: yield of %s: adjoint %.5f, finite differences %.5f: more than 2%% apart", mode, pt.Name, adj, fd)
			}
		}
		if mode == fuel.ModeFiniteRate {
			checkGlobalStep(t, st, r)
		}
	}
}

// checkGlobalStep compares the global cracking step's rate-constant and
// activation-energy coefficients with central differences (A or E times
// 1 ± 1%, the flame re-solved on its grid), within 2%.
func checkGlobalStep(t *testing.T, st *Study, r *Result) {
	t.Helper()
	m := st.Mechanism
	last := len(m.Reactions) - 1
	for _, kind := range []sensitivity.Kind{sensitivity.RateConstant, sensitivity.ActivationEnergy} {
		speed := func(f float64) float64 {
			mm := *m
			mm.Reactions = append([]chem.Reaction(nil), m.Reactions...)
			if kind == sensitivity.RateConstant {
				mm.Reactions[last].Rate.A *= f
			} else {
				mm.Reactions[last].Rate.E *= f
			}
			alt, err := st.Solver.WithReactions(&mm)
			if err != nil {
				t.Fatal(err)
			}
			sol, err := alt.SolveOnGrid(r.Solution, r.Solution.Inlet, st.Settings)
			if err != nil {
				t.Fatal(err)
			}
			return sol.MassFlux()
		}
		fd := math.Log(speed(1.01)/speed(1/1.01)) / (2 * math.Log(1.01))
		adj := math.NaN()
		for _, co := range r.Sensitivity.Coefficients {
			if co.Kind == kind && co.Reaction == last+1 {
				adj = co.Value
			}
		}
		t.Logf("global step %s, %s: adjoint %+.5f, finite differences %+.5f", m.Reactions[last].Equation, kind, adj, fd)
		if !(math.Abs(adj-fd) <= 0.02*math.Abs(fd)) {
			t.Errorf("global step %s: adjoint %.5f, finite differences %.5f: more than 2%% apart", kind, adj, fd)
		}
	}
}
