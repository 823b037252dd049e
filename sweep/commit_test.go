package sweep

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"
	"time"
)

// Committing a point writes its own folder only; the results table is
// built when the run starts and once when it ends, not after every point
// (issue 11, item 9: a 100 000-point sweep rewrote and synced the whole
// table 100 000 times). The table at the end is complete, and a point's
// folder holds no temporary files.
func TestTableIsBuiltOncePerRun(t *testing.T) {
	c := sweepCase(t, fakeSweep)
	dir := filepath.Join(t.TempDir(), "run")
	table := filepath.Join(dir, ResultsName)
	var first os.FileInfo
	rewritten := 0
	opt, _ := fakeOptions(2, nil)
	opt.Progress = func(p Progress) {
		info, err := os.Stat(table)
		if err != nil {
			t.Fatal(err)
		}
		if first == nil {
			first = info
		} else if !os.SameFile(first, info) || !info.ModTime().Equal(first.ModTime()) {
			rewritten++
		}
	}
	runSweep(t, c, dir, opt)
	if rewritten > 0 {
		t.Errorf("results.csv was rewritten during the run (%d of 36 commits)", rewritten)
	}
	for _, r := range reproducible(t, dir) {
		if r[Column(ColStatus)] != string(Solved) {
			t.Fatalf("final table row %v is not solved", r)
		}
	}
	left, _ := filepath.Glob(filepath.Join(dir, pointsDir, ".*"))
	if len(left) > 0 {
		t.Errorf("temporary folders left in points/: %v", left)
	}
}

// benchPlan lays out a sweep of n points (n a multiple of 100): 100
// equivalence ratios by n/100 temperatures.
func benchPlan(b *testing.B, n int) *Plan {
	d := Definition{PressuresPa: []float64{101325}}
	for i := 0; i < 100; i++ {
		d.EquivalenceRatios = append(d.EquivalenceRatios, 0.5+0.01*float64(i))
	}
	for i := 0; i < n/100; i++ {
		d.TemperaturesK = append(d.TemperaturesK, 300+0.5*float64(i))
	}
	p, err := NewPlan(d)
	if err != nil {
		b.Fatal(err)
	}
	return p
}

// BenchmarkCommitPoint is the sweep's cost to commit one point, in sweeps
// of 100 to 10 000 points: the point's folder (here a failed point's
// point.json) written, synced and swapped into place, and the record kept.
// It must not grow with the number of points (issue 11, item 9).
func BenchmarkCommitPoint(b *testing.B) {
	for _, n := range []int{100, 1000, 10000} {
		b.Run(fmt.Sprintf("points=%d", n), func(b *testing.B) {
			plan := benchPlan(b, n)
			dir := b.TempDir()
			recs := make(map[int]*Record, n)
			i := 0
			for b.Loop() {
				k := i % n
				pt := plan.Points[k]
				rec := &Record{ID: pt.ID, EquivalenceRatio: pt.Condition.Phi, UnburnedTemperatureK: pt.Condition.T,
					PressurePa: pt.Condition.P, Status: Failed, Reason: "bench", Attempts: []Attempt{{Start: ColdStart, Error: "bench"}}}
				if err := commitPoint(dir, rec, nil); err != nil {
					b.Fatal(err)
				}
				recs[k] = rec
				i++
			}
		})
	}
}

// BenchmarkResultsTable is the cost of building results.csv, linear in the
// points; a run pays it twice (start and end), where it used to pay it
// after every point.
func BenchmarkResultsTable(b *testing.B) {
	for _, n := range []int{100, 1000, 10000} {
		b.Run(fmt.Sprintf("points=%d", n), func(b *testing.B) {
			plan := benchPlan(b, n)
			r := &runner{dir: b.TempDir(), plan: plan, recs: map[int]*Record{}}
			for i := range plan.Points {
				r.points = append(r.points, i)
				r.recs[i] = &Record{ID: plan.Points[i].ID, Status: Failed, Reason: "bench", WallTimeS: float64(i) * time.Millisecond.Seconds()}
			}
			for b.Loop() {
				if err := r.writeResults(); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
