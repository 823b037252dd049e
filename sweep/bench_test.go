package sweep

import (
	"context"
	"fmt"
	"path/filepath"
	"testing"

	"flame1d/casefile"
)

// benchmarkSweep times whole sweeps of a case: by continuation and from
// cold starts, on one and on two workers. Each iteration solves every flame
// into a fresh folder. Reported besides ns/op: flames solved and Newton
// iterations per sweep.
func benchmarkSweep(b *testing.B, src string) {
	c, err := casefile.Parse([]byte(src), filepath.Join(b.TempDir(), "bench.toml"))
	if err != nil {
		b.Fatal(err)
	}
	for _, mode := range []struct {
		name string
		cold bool
	}{{"continuation", false}, {"cold", true}} {
		for _, jobs := range []int{1, 2} {
			b.Run(fmt.Sprintf("%s/j%d", mode.name, jobs), func(b *testing.B) {
				var solved, iterations int
				for i := 0; i < b.N; i++ {
					dir := filepath.Join(b.TempDir(), "out")
					s, err := Run(context.Background(), c, dir, Options{Jobs: jobs, ColdStarts: mode.cold})
					if err != nil {
						b.Fatal(err)
					}
					solved = s.Solved
					iterations = 0
					for _, r := range mustRecords(b, dir) {
						iterations += r.NewtonIterations
					}
				}
				b.ReportMetric(float64(solved), "flames")
				b.ReportMetric(float64(iterations), "newton-iters")
			})
		}
	}
}

func mustRecords(b *testing.B, dir string) map[int]*Record {
	m, err := ReadManifest(dir)
	if err != nil {
		b.Fatal(err)
	}
	plan, err := NewPlan(m.Definition)
	if err != nil {
		b.Fatal(err)
	}
	all := make([]int, len(plan.Points))
	for i := range all {
		all[i] = i
	}
	recs, err := readRecords(dir, plan, all)
	if err != nil {
		b.Fatal(err)
	}
	return recs
}

// BenchmarkMethaneSweep is the reference sweep: 13 CH4/air flames, phi
// 0.6-1.8, 298 K, 1 atm, GRI-Mech 3.0 (examples/sweeps/methane-phi.toml).
func BenchmarkMethaneSweep(b *testing.B) {
	benchmarkSweep(b, `mechanism = "smith1999-natgas"
[mixture]
fuel = { CH4 = 1.0 }
equivalence_ratio = 1.0
temperature = "298 K"
pressure = "1 atm"
[sweep]
equivalence_ratio = { from = 0.6, to = 1.8, step = 0.1 }
`)
}

// BenchmarkHydrogenSweep is a quick sweep: 11 H2/air flames, phi 0.6-1.6,
// 298 K, 1 atm, burke2012-hydrogen.
func BenchmarkHydrogenSweep(b *testing.B) {
	benchmarkSweep(b, `mechanism = "burke2012-hydrogen"
[mixture]
fuel = { H2 = 1.0 }
equivalence_ratio = 1.0
temperature = "298 K"
[sweep]
equivalence_ratio = { from = 0.6, to = 1.6, step = 0.1 }
`)
}
