package flame

import (
	"fmt"
	"path/filepath"
	"testing"
	"time"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/chem/keyblock"
	"flame1d/internal/shareddata"
	"flame1d/newton"
	"flame1d/thermo"
)

// BenchmarkScaling measures one residual, one Jacobian and one block
// factorisation on the start-up profiles of a stoichiometric fuel/air flame
// at 100, 200 and 400 points, for 13 species (Burke et al. 2012 H2/O2), 53
// (GRI-Mech 3.0) and 114 (CRECK C1-C3, read from ../shared when present).
// It reports each per point (µs/point): constant per-point costs across the
// three grids show the cost linear in the number of points.
func BenchmarkScaling(b *testing.B) {
	sets := []struct{ name, fuel string }{
		{"burke2012-hydrogen", "H2"}, {"smith1999-natgas", "CH4"}, {"c0c4", "C2H4"},
	}
	for _, set := range sets {
		var m *chem.Mechanism
		if set.name == "c0c4" {
			dir := filepath.Join(shareddata.MechanismsDir(b), "c0c4")
			var err error
			if m, _, err = keyblock.ReadFiles(filepath.Join(dir, "mech.inp"), filepath.Join(dir, "thermo.dat"), filepath.Join(dir, "transport.dat")); err != nil {
				b.Fatal(err)
			}
		} else {
			var err error
			if m, err = builtin.Mechanism(set.name); err != nil {
				b.Fatal(err)
			}
		}
		s, err := NewSolver(m)
		if err != nil {
			b.Fatal(err)
		}
		in := stoichiometricAir(b, s, set.fuel)
		eq, err := adiabaticEquilibrium(s.ph, in)
		if err != nil {
			b.Fatal(err)
		}
		for _, n := range []int{100, 200, 400} {
			b.Run(fmt.Sprintf("K=%d/points=%d", s.ph.nSpecies, n), func(b *testing.B) {
				g, err := s.initialGuess(in, eq, withDefaults(Settings{InitialPoints: n, Workers: 1}), 0.4)
				if err != nil {
					b.Fatal(err)
				}
				pr := s.problemFor(g, withDefaults(Settings{Workers: 1}))
				J := newton.NewBlockTridiagonal(pr.n, pr.b)
				f := make([]float64, len(g.U))
				var tr, tj, tf time.Duration
				for b.Loop() {
					t0 := time.Now()
					if err := pr.Residual(g.U, f); err != nil {
						b.Fatal(err)
					}
					t1 := time.Now()
					J.Zero()
					if err := pr.Jacobian(g.U, f, J); err != nil {
						b.Fatal(err)
					}
					t2 := time.Now()
					if err := J.Factor(); err != nil {
						b.Fatal(err)
					}
					tr, tj, tf = tr+t1.Sub(t0), tj+t2.Sub(t1), tf+time.Since(t2)
				}
				perPoint := func(d time.Duration) float64 { return float64(d.Microseconds()) / float64(b.N*pr.n) }
				b.ReportMetric(perPoint(tr), "residual-us/point")
				b.ReportMetric(perPoint(tj), "jacobian-us/point")
				b.ReportMetric(perPoint(tf), "factor-us/point")
			})
		}
	}
}

// stoichiometricAir is the stoichiometric fuel/air inlet at 298 K, 1 atm for
// a fuel CxHyOz of the mechanism: x + y/4 - z/2 moles of O2 per mole of fuel.
func stoichiometricAir(b testing.TB, s *Solver, fuel string) Inlet {
	b.Helper()
	m := s.ph.mech
	kf := m.SpeciesIndex(fuel)
	if kf < 0 {
		b.Fatalf("%s not in %s", fuel, m.Name)
	}
	c := m.Species[kf].Composition
	o2 := c["C"] + c["H"]/4 - c["O"]/2
	K := s.ph.nSpecies
	X := make([]float64, K)
	X[kf] = 1
	X[m.SpeciesIndex("O2")] = o2
	X[m.SpeciesIndex("N2")] = o2 * 79 / 21
	Y := make([]float64, K)
	sum := 0.0
	for k := range X {
		Y[k] = X[k] * s.ph.molarMass[k]
		sum += Y[k]
	}
	for k := range Y {
		Y[k] /= sum
	}
	return Inlet{T: 298, P: thermo.OneAtmosphere, Y: Y}
}
