package validation

import (
	"os"
	"testing"

	"flame1d/builtin"
	"flame1d/casefile"
)

// benchmarkScorecard scores a mechanism on the bundled measurements with
// two parallel chains, as `flame1d validate -j 2` does, and reports the
// deterministic work beside the time: points solved and Newton iterations
// per scorecard.
func benchmarkScorecard(b *testing.B, name string, fuels ...string) {
	mech, err := builtin.Mechanism(name)
	if err != nil {
		b.Fatal(err)
	}
	sets, err := Bundled()
	if err != nil {
		b.Fatal(err)
	}
	if sets, err = SelectFuels(sets, fuels); err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for b.Loop() {
		sc, err := Run(name, mech, sets, Options{Jobs: 2})
		if err != nil {
			b.Fatal(err)
		}
		iters := 0
		for _, o := range sc.Outcomes {
			iters += o.NewtonIterations
		}
		b.ReportMetric(float64(sc.Overall.Solved), "points/op")
		b.ReportMetric(float64(sc.Overall.Failed), "failed/op")
		b.ReportMetric(float64(iters), "newton/op")
	}
}

// The whole scorecard on the foundational C0-C4 set (ranzi2012-c1c3, 114
// species; 54 of the bundled points are C0-C3 fuels it holds), as
// `flame1d validate -j 2`. Target of issue 13: at most 3 minutes on the
// two-core development machine. It runs for many minutes per iteration,
// so it runs only when asked for:
//
//	FLAME1D_SCORECARD_BENCH=1 go test ./validation -run '^$' -bench ScorecardFoundational -benchtime 1x -timeout 0
func BenchmarkScorecardFoundational(b *testing.B) {
	if testing.Short() || os.Getenv("FLAME1D_SCORECARD_BENCH") == "" {
		b.Skip("the whole foundational scorecard takes minutes; set FLAME1D_SCORECARD_BENCH=1")
	}
	benchmarkScorecard(b, casefile.FoundationalMechanism)
}

// Hydrogen on the Burke et al. (2012) set: the scorecard machinery on a
// small mechanism.
func BenchmarkScorecardHydrogen(b *testing.B) {
	benchmarkScorecard(b, "burke2012-hydrogen", "H2")
}
