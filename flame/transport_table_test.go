package flame_test

import (
	"fmt"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"

	"flame1d/flame"
	"flame1d/thermo"
)

// TestTransportModelTable recomputes the flame-speed table of
// docs/transport.md: H2/air (Burke et al. 2012) at phi 0.5, 1, 2 and
// CH4/air (GRI-Mech 3.0) at phi 0.8, 1, 1.2, 298 K, 1 atm, central
// convection, with mixture-averaged and multicomponent diffusion, thermal
// diffusion off and on. Each flame is solved on the default grid criteria
// and again, from a cold start, with max_change and max_gradient_change
// halved; where the halved cold start fails, the halved solve continues from
// the converged default-grid solution (Solver.SolveFrom), with three times
// the default number of refinements if need be, and the line says so. The test fails when a halved solve fails both ways or when halving
// moves S_L by more than 0.2% (the table's stated grid convergence).
//
// It runs on request only (tens of minutes for the GRI-Mech multicomponent
// solves): FLAME1D_TRANSPORT_TABLE=all, or comma-separated substrings that
// a cell name must all contain ("H2/air", "CH4/air,MC", "phi=1.0 MA, Soret"),
// alternatives separated by "|".
// FLAME1D_TRANSPORT_TABLE_HALVED=continuation solves every halved case from
// the default-grid solution instead of from a cold start (cheaper);
// FLAME1D_TRANSPORT_TABLE_CHAIN=1 solves the first selected case of a
// mixture from the upwind flame (cold start) continued to the central
// scheme, and each later one from the previous case's solution
// (Solver.SolveFrom: another transport model directly, another phi through
// an upwind solution),
// which the GRI-Mech cases need on a loaded machine;
// FLAME1D_TRANSPORT_TABLE_PROGRESS=1 prints the solver's progress;
// FLAME1D_TRANSPORT_TABLE_PHIS="1.0,0.9,0.8" replaces the equivalence
// ratios (and their order, for a chain of continuations in phi).
func TestTransportModelTable(t *testing.T) {
	sel := os.Getenv("FLAME1D_TRANSPORT_TABLE")
	if sel == "" {
		t.Skip("set FLAME1D_TRANSPORT_TABLE=all (or a cell-name substring) to recompute the docs/transport.md table")
	}
	continueOnly := os.Getenv("FLAME1D_TRANSPORT_TABLE_HALVED") == "continuation"
	chain := os.Getenv("FLAME1D_TRANSPORT_TABLE_CHAIN") != ""
	mixtures := []struct {
		mech, fuel string
		phis       []float64
	}{
		{"burke2012-hydrogen", "H2", []float64{0.5, 1.0, 2.0}},
		{"smith1999-natgas", "CH4", []float64{0.8, 1.0, 1.2}},
	}
	models := []struct {
		name      string
		diffusion flame.DiffusionModel
		noSoret   bool
	}{
		{"MA, no Soret", flame.MixtureAveraged, true},
		{"MA, Soret", flame.MixtureAveraged, false},
		{"MC, no Soret", flame.Multicomponent, true},
		{"MC, Soret", flame.Multicomponent, false},
	}
	if v := os.Getenv("FLAME1D_TRANSPORT_TABLE_PHIS"); v != "" {
		var phis []float64
		for _, f := range strings.Split(v, ",") {
			phi, err := strconv.ParseFloat(f, 64)
			if err != nil {
				t.Fatalf("FLAME1D_TRANSPORT_TABLE_PHIS: %v", err)
			}
			phis = append(phis, phi)
		}
		for i := range mixtures {
			mixtures[i].phis = phis
		}
	}
	for _, mx := range mixtures {
		var s *flame.Solver
		var last *flame.Solution // the previous cell's default-grid solution
		lastPhi := 0.0
		for _, phi := range mx.phis {
			for _, md := range models {
				cell := fmt.Sprintf("%s/air phi=%.1f %s", mx.fuel, phi, md.name)
				if !selected(cell, sel) {
					continue
				}
				if s == nil {
					_, s = solverFor(t, mx.mech)
				}
				in := inlet(t, s.Mechanism(), map[string]float64{mx.fuel: 1}, phi, 298, thermo.OneAtmosphere)
				set := flame.DefaultSettings()
				set.CentralConvection = true
				set.Diffusion = md.diffusion
				set.NoThermalDiffusion = md.noSoret
				set.Workers = 1
				if os.Getenv("FLAME1D_TRANSPORT_TABLE_PROGRESS") != "" {
					set.Progress = func(p flame.Progress) {
						fmt.Printf("%s  %s: %s, %d points, residual %.3g %s\n", time.Now().Format("15:04:05"), cell, p.Stage, p.Points, p.ResidualNorm, p.Message)
					}
				}
				var coarse *flame.Solution
				start := "cold start"
				if chain && last != nil {
					start = "continued"
					from := last
					if lastPhi != phi {
						// A step in phi is taken with upwind convection,
						// which converges where the central scheme stalls,
						// then continued to the central scheme.
						start = fmt.Sprintf("continued from phi=%.1f upwind, then to central", lastPhi)
						up := set
						up.CentralConvection = false
						var err error
						if from, err = s.SolveFrom(last, in, up); err != nil {
							t.Errorf("%s: upwind continuation from phi=%.1f: %v", cell, lastPhi, err)
							continue
						}
					}
					var err error
					if coarse, err = s.SolveFrom(from, in, set); err != nil {
						t.Errorf("%s: continuation from the previous cell: %v", cell, err)
						continue
					}
				} else if chain {
					// Seed the chain with the upwind flame (the robust cold
					// start), then continue to the central scheme.
					start = "upwind cold start, continued to central"
					up := set
					up.CentralConvection = false
					seed, _ := solve(t, s, in, up)
					var err error
					if coarse, err = s.SolveFrom(seed, in, set); err != nil {
						t.Errorf("%s: central from the upwind flame: %v", cell, err)
						continue
					}
				} else {
					coarse, _ = solve(t, s, in, set)
				}
				last, lastPhi = coarse, phi
				pc, err := s.Profile(coarse)
				if err != nil {
					t.Fatal(err)
				}
				half := set
				half.Grid.MaxChange /= 2
				half.Grid.MaxGradientChange /= 2
				var fine *flame.Solution
				how := "continuation from the default-grid solution"
				if !continueOnly {
					how = "cold start"
					if fine, err = s.Solve(in, half); err != nil {
						how = fmt.Sprintf("continuation from the default-grid solution (cold start: %v)", err)
					}
				}
				if continueOnly || err != nil {
					fine, err = s.SolveFrom(coarse, in, half)
				}
				if err != nil {
					// The halved criteria may need more solve/refine cycles
					// than the default allows.
					how += fmt.Sprintf("; continuation: %v; continuation with at most %d refinements", err, 3*half.MaxRefinements)
					more := half
					more.MaxRefinements = 3 * half.MaxRefinements
					fine, err = s.SolveFrom(coarse, in, more)
				}
				if err != nil {
					t.Errorf("%s: halved criteria: %s: %v", cell, how, err)
					continue
				}
				pf, err := s.Profile(fine)
				if err != nil {
					t.Fatal(err)
				}
				change := pf.FlameSpeed/pc.FlameSpeed - 1
				fmt.Printf("TABLE %-28s S_L %.5f m/s (%s; %d points, %d Newton, %d Jacobians) halved %.5f m/s (%d points, %d Newton; %s): %+.3f%%\n",
					cell, pc.FlameSpeed, start, coarse.Points(), coarse.Stats.NewtonIterations, coarse.Stats.JacobianEvaluations,
					pf.FlameSpeed, fine.Points(), fine.Stats.NewtonIterations, how, 100*change)
				if change > 0.002 || change < -0.002 {
					t.Errorf("%s: halving the grid criteria moves S_L by %+.3f%%, more than 0.2%%", cell, 100*change)
				}
			}
		}
	}
}

// selected reports whether a table cell is chosen by sel: "all", or
// alternatives separated by "|", each of comma-separated substrings that
// the cell name must all contain.
func selected(cell, sel string) bool {
	if sel == "all" {
		return true
	}
	for _, alt := range strings.Split(sel, "|") {
		all := true
		for _, part := range strings.Split(alt, ",") {
			all = all && strings.Contains(cell, part)
		}
		if all {
			return true
		}
	}
	return false
}
