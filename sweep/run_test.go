package sweep

import (
	"context"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"sync/atomic"
	"testing"

	"flame1d/flame"
	"flame1d/study"
)

const fakeSweep = `equivalence_ratio = { from = 0.6, to = 1.4, step = 0.1 }
temperature = ["298 K", "400 K"]
pressure = ["1 atm", "5 atm"]`

func TestRunWritesEveryPoint(t *testing.T) {
	c := sweepCase(t, fakeSweep)
	dir := filepath.Join(t.TempDir(), "out")
	opt, calls := fakeOptions(3, nil)
	s := runSweep(t, c, dir, opt)
	if s.Points != 36 || s.Solved != 36 || s.Attempted != 36 || calls.Load() != 36 {
		t.Fatalf("summary %+v, %d solver calls; want 36 points solved with 36 calls", s, calls.Load())
	}
	tab, rows := readRows(t, dir)
	for _, r := range rows {
		// The fake's S_L carries 1e-9 times its start's phi.
		if d := r.FlameSpeed - fakeSpeed(r.Condition); d < 0 || d > 2e-9 {
			t.Errorf("%s: S_L %v, fake gives %v", r.ID, r.FlameSpeed, fakeSpeed(r.Condition))
		}
		for _, f := range []string{"profile.csv", "summary.txt", "summary.json", restartName, recordName} {
			if _, err := os.Stat(filepath.Join(pointDir(dir, r.ID), f)); err != nil {
				t.Errorf("%s: %v", r.ID, err)
			}
		}
	}
	// Heads start cold; every other point from its neighbour towards phi 1.0.
	rec := readRecord(t, dir, "phi1.000_T400.0_P506625")
	if rec.ContinuedFrom != ColdStart {
		t.Errorf("head continued from %q, want cold", rec.ContinuedFrom)
	}
	rec = readRecord(t, dir, "phi0.700_T400.0_P506625")
	if rec.ContinuedFrom != "phi0.800_T400.0_P506625" {
		t.Errorf("phi 0.7 continued from %q, want phi0.800_T400.0_P506625", rec.ContinuedFrom)
	}
	if !strings.Contains(strings.Join(tab.Comments, "\n"), "model predictions") {
		t.Errorf("results header lacks the safety note: %q", tab.Comments)
	}
	for _, v := range []Variable{EquivalenceRatio, Temperature, Pressure} {
		for _, ext := range []string{".svg", ".png"} {
			if fi, err := os.Stat(filepath.Join(dir, PlotName(v)+ext)); err != nil || fi.Size() == 0 {
				t.Errorf("plot %s%s: %v", PlotName(v), ext, err)
			}
		}
	}
}

func TestFailedPointsAreReportedAndSkipped(t *testing.T) {
	// phi 0.8 never converges: phi 0.7 must continue from 0.9 (the nearest
	// solved neighbour). phi 1.2 fails from both its solved neighbours
	// (1.1 and 1.0) but converges from a cold start.
	c := sweepCase(t, "equivalence_ratio = { from = 0.6, to = 1.4, step = 0.1 }")
	dir := t.TempDir()
	fail := func(cond study.Condition, start *flame.Solution) error {
		if err := failAt(false, 0.8)(cond, start); err != nil {
			return err
		}
		return failAt(true, 1.2)(cond, start)
	}
	opt, _ := fakeOptions(2, fail)
	s := runSweep(t, c, dir, opt)
	if s.Solved != 8 || s.Failed != 1 || len(s.Failures) != 1 || s.Failures[0].ID != "phi0.800_T298.0_P101325" {
		t.Fatalf("summary %+v, want 8 solved and phi 0.8 failed", s)
	}
	rec := readRecord(t, dir, "phi0.800_T298.0_P101325")
	// Attempts: from phi 0.9, from phi 1.0 (the next solved ancestor), cold,
	// and, once the chain is done, from phi 0.7 (the repair).
	var starts []string
	for _, a := range rec.Attempts {
		starts = append(starts, a.Start)
		if !strings.Contains(a.Error, "did not converge") {
			t.Errorf("attempt from %s: error %q", a.Start, a.Error)
		}
	}
	if strings.Join(starts, " ") != "phi0.900_T298.0_P101325 phi1.000_T298.0_P101325 cold phi0.700_T298.0_P101325" {
		t.Errorf("attempts from %v", starts)
	}
	// From the nearest neighbour the step is halved twice (steps.go).
	if via := fmt.Sprint(rec.Attempts[0].Intermediate); via != "[0.85 0.825]" {
		t.Errorf("first attempt went through %s, want [0.85 0.825]", via)
	}
	if !strings.Contains(rec.Reason, "4 attempt(s) failed") || !strings.Contains(rec.Reason, "phi 0.8") {
		t.Errorf("reason %q", rec.Reason)
	}
	if _, err := os.Stat(filepath.Join(pointDir(dir, rec.ID), "profile.csv")); err == nil {
		t.Error("a failed point has a profile")
	}
	if r := readRecord(t, dir, "phi0.700_T298.0_P101325"); r.ContinuedFrom != "phi0.900_T298.0_P101325" {
		t.Errorf("phi 0.7 continued from %q, want phi 0.9", r.ContinuedFrom)
	}
	if r := readRecord(t, dir, "phi1.200_T298.0_P101325"); r.ContinuedFrom != ColdStart || len(r.Attempts) != 3 {
		t.Errorf("phi 1.2: continued from %q after %d attempts, want cold after 3", r.ContinuedFrom, len(r.Attempts))
	}
	tab, rows := readRows(t, dir)
	for k, r := range rows {
		if r.ID != rec.ID {
			continue
		}
		raw := tab.Rows[k]
		for _, col := range []string{ColFlameSpeed, ColBurnedT, ColAdiabaticT, ColThermalThickness, ColPeakHeatRelease, ColGridPoints} {
			if v := raw[Column(col)]; v != "" {
				t.Errorf("failed row has %s = %q, want empty", col, v)
			}
		}
		if r.Status != Failed || !strings.Contains(r.Reason, "did not converge") || strings.Contains(r.Reason, "\n") {
			t.Errorf("failed row: status %s reason %q", r.Status, r.Reason)
		}
	}

	// A rerun keeps the failed point; --retry-failed tries it again.
	opt2, calls := fakeOptions(2, fail)
	s = runSweep(t, c, dir, opt2)
	if calls.Load() != 0 || s.Reused != 9 {
		t.Errorf("rerun made %d solver calls and reused %d points, want 0 and 9", calls.Load(), s.Reused)
	}
	opt3, calls := fakeOptions(2, nil)
	opt3.RetryFailed = true
	s = runSweep(t, c, dir, opt3)
	if calls.Load() != 1 || s.Failed != 0 {
		t.Errorf("retry made %d calls leaving %d failed, want 1 call and none failed", calls.Load(), s.Failed)
	}
}

func TestRestartAfterInterruption(t *testing.T) {
	c := sweepCase(t, fakeSweep)
	ref := filepath.Join(t.TempDir(), "ref")
	opt, _ := fakeOptions(2, nil)
	runSweep(t, c, ref, opt)
	want := reproducible(t, ref)

	dir := filepath.Join(t.TempDir(), "run")
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	opt, calls := fakeOptions(2, nil)
	opt.Progress = func(p Progress) {
		if p.Done == 11 && p.Record != nil {
			cancel()
		}
	}
	s, err := Run(ctx, c, dir, opt)
	if !errors.Is(err, ErrInterrupted) {
		t.Fatalf("interrupted run: error %v, want ErrInterrupted", err)
	}
	// Up to Jobs-1 points already dispatched finish after the cancel.
	committed := s.Solved
	if committed < 11 || committed > 12 || s.Pending != 36-committed || int(calls.Load()) != committed {
		t.Fatalf("after interruption: %+v with %d calls", s, calls.Load())
	}
	pending := 0
	for _, r := range reproducible(t, dir) {
		if r[Column(ColStatus)] == string(Pending) {
			pending++
		}
	}
	if pending != 36-committed {
		t.Errorf("interrupted table has %d pending rows, want %d", pending, 36-committed)
	}

	opt, calls = fakeOptions(2, nil)
	s = runSweep(t, c, dir, opt)
	if int(calls.Load()) != 36-committed || s.Reused != committed {
		t.Errorf("resumed run made %d solver calls and reused %d, want %d and %d", calls.Load(), s.Reused, 36-committed, committed)
	}
	sameTables(t, "resumed vs uninterrupted", reproducible(t, dir), want)
}

func TestJobsDoNotChangeResults(t *testing.T) {
	c := sweepCase(t, fakeSweep)
	var tables [][][]string
	for _, j := range []int{1, 4} {
		dir := filepath.Join(t.TempDir(), "j")
		opt, _ := fakeOptions(j, nil)
		runSweep(t, c, dir, opt)
		tables = append(tables, reproducible(t, dir))
	}
	sameTables(t, "-j 4 vs -j 1", tables[1], tables[0])
}

func TestFolderHoldsOneSweep(t *testing.T) {
	dir := t.TempDir()
	opt, _ := fakeOptions(1, nil)
	runSweep(t, sweepCase(t, "equivalence_ratio = [0.8, 1.0, 1.2]"), dir, opt)
	for _, tc := range []struct {
		table string
		shard Shard
		want  []string
	}{
		{"equivalence_ratio = [0.8, 1.0, 1.3]", Shard{}, []string{"sweep.equivalence_ratio: [0.8, 1, 1.2], now [0.8, 1, 1.3]", "new output folder"}},
		{"equivalence_ratio = [0.8, 1.0, 1.2]\npressure = \"2 atm\"", Shard{}, []string{"sweep.pressure [Pa]: [101325], now [202650]"}},
		{"equivalence_ratio = [0.8, 1.0, 1.2]\ntemperature = [298, 350]", Shard{1, 2}, []string{"shard: 0/1, now 1/2"}},
	} {
		opt, calls := fakeOptions(1, nil)
		opt.Shard = tc.shard
		_, err := Run(context.Background(), sweepCase(t, tc.table), dir, opt)
		if err == nil {
			t.Fatalf("%q: no error", tc.table)
		}
		for _, w := range tc.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%q: error %q does not say %q", tc.table, err, w)
			}
		}
		if calls.Load() != 0 {
			t.Errorf("%q: %d solver calls after a refused folder", tc.table, calls.Load())
		}
	}
	other := t.TempDir()
	if err := os.WriteFile(filepath.Join(other, "notes.txt"), []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err := Run(context.Background(), sweepCase(t, "equivalence_ratio = [0.8, 1.0]"), other, opt)
	if err == nil || !strings.Contains(err.Error(), "not empty") {
		t.Errorf("non-empty folder: error %v", err)
	}
}

func TestWriteFailureStopsTheSweep(t *testing.T) {
	// A file where the points folder belongs makes every commit fail
	// (permissions would not stop root).
	dir := t.TempDir()
	c := sweepCase(t, "equivalence_ratio = [0.8, 1.0, 1.2]")
	opt, _ := fakeOptions(1, nil)
	if _, err := claimFolder(dir, &Manifest{Format: manifestFormat, Definition: mustDefinition(t, c), Shard: Shard{0, 1}}); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, pointsDir), []byte("in the way"), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err := Run(context.Background(), c, dir, opt)
	if err == nil || errors.Is(err, ErrInterrupted) || !strings.Contains(err.Error(), "sweep point") {
		t.Errorf("error %v, want a write failure naming the point", err)
	}
}

func TestAnotherBuildIsWarnedAbout(t *testing.T) {
	dir := t.TempDir()
	c := sweepCase(t, "equivalence_ratio = [0.8, 1.0, 1.2]")
	opt, _ := fakeOptions(1, nil)
	if s := runSweep(t, c, dir, opt); len(s.Warnings) != 0 {
		t.Fatalf("fresh folder: warnings %q", s.Warnings)
	}
	m, err := ReadManifest(dir)
	if err != nil {
		t.Fatal(err)
	}
	if m.Program != ProgramIdentity() || !strings.Contains(m.Program, "executable sha256") {
		t.Errorf("manifest program %q, this is %q", m.Program, ProgramIdentity())
	}
	m.Program = "flame1d v0.0.1 revision 0123abc"
	if err := m.write(dir); err != nil {
		t.Fatal(err)
	}
	s := runSweep(t, c, dir, opt)
	if len(s.Warnings) != 1 || !strings.Contains(s.Warnings[0], "another build") || !strings.Contains(s.Warnings[0], "v0.0.1") {
		t.Errorf("warnings %q, want one about the other build", s.Warnings)
	}
}

// jump is the change of equivalence ratio from a fake solve's start.
func jump(c study.Condition, start *flame.Solution) float64 {
	if start == nil {
		return 0
	}
	return math.Abs(c.Phi - start.AnchorX)
}

func TestFailedStepIsHalved(t *testing.T) {
	// Steps of the equivalence ratio above 0.2 fail.
	fail := func(c study.Condition, s *flame.Solution) error {
		if jump(c, s) > 0.2+1e-9 {
			return errFake
		}
		return nil
	}
	options := func() (Options, *atomic.Int64) {
		calls := &atomic.Int64{}
		return Options{Jobs: 1, NewSolver: func() (PointSolver, error) {
			m, err := fakeMechanism()
			return &fakeSolver{calls: calls, mech: m, fail: fail}, err
		}}, calls
	}
	c := sweepCase(t, "equivalence_ratio = [0.7, 1.0, 1.3, 1.4]")
	ref := t.TempDir()
	opt, calls := options()
	runSweep(t, c, ref, opt)
	// 1.0 cold; 0.7 and 1.3 fail at 0.3 and go through 0.85 and 1.15; 1.4 direct.
	if calls.Load() != 8 {
		t.Errorf("%d solves, want 8", calls.Load())
	}
	for _, tc := range []struct{ id, via string }{
		{"phi0.700_T298.0_P101325", "[0.85]"}, {"phi1.300_T298.0_P101325", "[1.15]"}, {"phi1.400_T298.0_P101325", "[]"},
	} {
		r := readRecord(t, ref, tc.id)
		if r.Status != Solved || len(r.Attempts) != 1 || fmt.Sprint(r.Attempts[0].Intermediate) != tc.via {
			t.Errorf("%s: %s in %d attempt(s) via %v, want solved in one via %s", tc.id, r.Status, len(r.Attempts), r.Attempts[0].Intermediate, tc.via)
		}
	}
	// The fake's S_L carries the start's phi: 1.3 started from 1.15.
	r := readRecord(t, ref, "phi1.300_T298.0_P101325")
	if d := r.FlameSpeed - fakeSpeed(r.Condition()) - 1.15e-9; math.Abs(d) > 1e-15 {
		t.Errorf("phi 1.3 did not start from the intermediate 1.15 (S_L off by %g)", d)
	}
	if r.NewtonIterations != 14 {
		t.Errorf("phi 1.3: %d Newton iterations, want 14 (two solves)", r.NewtonIterations)
	}

	// A run stopped after two points and resumed takes the same steps.
	dir := t.TempDir()
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	opt, _ = options()
	opt.Progress = func(p Progress) {
		if p.Done == 2 {
			cancel()
		}
	}
	if _, err := Run(ctx, c, dir, opt); !errors.Is(err, ErrInterrupted) {
		t.Fatal(err)
	}
	opt, _ = options()
	runSweep(t, c, dir, opt)
	sameTables(t, "resumed vs uninterrupted", reproducible(t, dir), reproducible(t, ref))
}

func TestFailedHeadIsRepairedFromItsBranch(t *testing.T) {
	// The head (phi 1.0) never converges from a cold start; its branches
	// start cold instead, and the head is then solved from phi 0.9.
	fail := func(c study.Condition, s *flame.Solution) error {
		if s == nil && math.Abs(c.Phi-1.0) < 1e-9 {
			return errFake
		}
		return nil
	}
	// Head: nearest the middle of 0.9-1.2 (1.05), the tie to the leaner 1.0.
	c := sweepCase(t, "equivalence_ratio = [0.9, 1.0, 1.1, 1.2]")
	ref := t.TempDir()
	opt, calls := fakeOptions(2, fail)
	s := runSweep(t, c, ref, opt)
	if s.Solved != 4 || s.Repaired != 1 || calls.Load() != 5 {
		t.Fatalf("summary %+v after %d solves; want 4 solved, 1 repaired, 5 solves", s, calls.Load())
	}
	r := readRecord(t, ref, "phi1.000_T298.0_P101325")
	if r.Status != Solved || r.ContinuedFrom != "phi0.900_T298.0_P101325" || len(r.Attempts) != 2 || r.Attempts[0].Start != ColdStart {
		t.Errorf("head: %s from %s after attempts %+v", r.Status, r.ContinuedFrom, r.Attempts)
	}
	for _, id := range []string{"phi0.900_T298.0_P101325", "phi1.100_T298.0_P101325"} {
		if r := readRecord(t, ref, id); r.ContinuedFrom != ColdStart {
			t.Errorf("%s continued from %s, want cold", id, r.ContinuedFrom)
		}
	}

	// Stopped after the last point but before the repair: the run says it
	// is unfinished, and the rerun repairs just as the uninterrupted run.
	dir := t.TempDir()
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	opt, _ = fakeOptions(1, fail)
	opt.Progress = func(p Progress) {
		if p.Done == p.Total && p.Record != nil {
			cancel()
		}
	}
	if _, err := Run(ctx, c, dir, opt); !errors.Is(err, ErrInterrupted) {
		t.Fatalf("run stopped before the repair: error %v, want ErrInterrupted", err)
	}
	opt, calls = fakeOptions(1, fail)
	if s := runSweep(t, c, dir, opt); s.Repaired != 1 || calls.Load() != 1 {
		t.Errorf("rerun repaired %d with %d solves, want 1 and 1", s.Repaired, calls.Load())
	}
	sameTables(t, "resumed vs uninterrupted", reproducible(t, dir), reproducible(t, ref))
}

// readRows reads a sweep folder's results table and parses its rows.
func readRows(t *testing.T, dir string) (*Table, []Row) {
	t.Helper()
	tab, err := ReadResults(filepath.Join(dir, ResultsName))
	if err != nil {
		t.Fatal(err)
	}
	rows, err := tab.Parsed()
	if err != nil {
		t.Fatal(err)
	}
	return tab, rows
}
