package sweep

import (
	"context"
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"sync/atomic"
	"testing"

	"flame1d/casefile"
	"flame1d/flame"
	"flame1d/study"
)

// Tests on real flames: hydrogen/air on the built-in burke2012-hydrogen mechanism (Burke
// et al. 2012), about 0.1-0.5 s a flame.

// countingSolver counts the solves of a real study.
type countingSolver struct {
	PointSolver
	calls *atomic.Int64
}

func (c countingSolver) Solve(cond study.Condition, start *flame.Solution) (*study.Result, bool, error) {
	c.calls.Add(1)
	return c.PointSolver.Solve(cond, start)
}

func realOptions(c *casefile.Case, jobs int) (Options, *atomic.Int64) {
	calls := &atomic.Int64{}
	return Options{Jobs: jobs, NewSolver: func() (PointSolver, error) {
		s, err := newStudySolver(c, nil)
		if err != nil {
			return nil, err
		}
		return countingSolver{s, calls}, nil
	}}, calls
}

func TestContinuationMatchesColdStarts(t *testing.T) {
	if testing.Short() {
		t.Skip("hydrogen flames")
	}
	c := sweepCase(t, "equivalence_ratio = { from = 0.8, to = 1.4, step = 0.1 }")
	cont := filepath.Join(t.TempDir(), "continuation")
	runSweep(t, c, cont, Options{Jobs: 2})
	cold := filepath.Join(t.TempDir(), "cold")
	runSweep(t, c, cold, Options{Jobs: 2, ColdStarts: true})
	read := func(dir string) map[string]*Record {
		out := map[string]*Record{}
		for _, phi := range []string{"0.800", "0.900", "1.000", "1.100", "1.200", "1.300", "1.400"} {
			id := "phi" + phi + "_T298.0_P101325"
			out[id] = readRecord(t, dir, id)
		}
		return out
	}
	a, b := read(cont), read(cold)
	itersCont, itersCold, compared := 0, 0, 0
	for id, ra := range a {
		rb := b[id]
		if ra.Status != Solved {
			t.Errorf("%s: continuation %s: %s", id, ra.Status, ra.Reason)
			continue
		}
		if rb.Status != Solved {
			// A cold start failing where continuation succeeds is the
			// solver's robustness, not the sweep's concern; nothing to compare.
			t.Logf("%s: continuation solved, cold start failed (%s)", id, rb.Reason)
			continue
		}
		compared++
		rel := ra.FlameSpeed/rb.FlameSpeed - 1
		t.Logf("%s: S_L %.5f m/s by continuation from %s, %.5f m/s cold (%+.1e); %d vs %d Newton iterations",
			id, ra.FlameSpeed, ra.ContinuedFrom, rb.FlameSpeed, rel, ra.NewtonIterations, rb.NewtonIterations)
		// Both flames satisfy the same grid criteria on different grids;
		// their speeds agree within the discretisation error of those
		// criteria, well under 1e-3 (common practice, no source).
		if math.Abs(rel) > 1e-3 {
			t.Errorf("%s: continuation S_L %.6f differs from the cold start's %.6f by %.1e (> 1e-3)", id, ra.FlameSpeed, rb.FlameSpeed, rel)
		}
		if ra.ContinuedFrom != ColdStart {
			itersCont += ra.NewtonIterations
			itersCold += rb.NewtonIterations
		}
	}
	if compared < 4 {
		t.Fatalf("only %d of 7 points could be compared with a cold start", compared)
	}
	// Continuation must save work: fewer Newton iterations than cold starts
	// over the points that continued.
	t.Logf("Newton iterations at the continued points: %d by continuation, %d from cold starts", itersCont, itersCold)
	if itersCont >= itersCold {
		t.Errorf("continuation took %d Newton iterations, cold starts %d", itersCont, itersCold)
	}
}

func TestRealShardsRestartAndJobsGiveOneTable(t *testing.T) {
	if testing.Short() {
		t.Skip("hydrogen flames")
	}
	const table = "equivalence_ratio = [0.8, 1.0, 1.2]\ntemperature = [\"298 K\", \"400 K\"]"
	c := sweepCase(t, table)
	single := filepath.Join(t.TempDir(), "single")
	opt, _ := realOptions(c, 2)
	runSweep(t, c, single, opt)
	want := reproducible(t, single)

	// Two shards, each alone on one worker, then merged.
	root := t.TempDir()
	var dirs []string
	for i := 0; i < 2; i++ {
		dir := filepath.Join(root, fmt.Sprintf("shard-%d", i))
		opt, calls := realOptions(c, 1)
		opt.Shard = Shard{Index: i, Count: 2}
		runSweep(t, c, dir, opt)
		if calls.Load() != 3 {
			t.Errorf("shard %d: %d solves, want 3", i, calls.Load())
		}
		dirs = append(dirs, dir)
	}
	merged := filepath.Join(root, "merged")
	if _, err := Merge(dirs, merged); err != nil {
		t.Fatal(err)
	}
	sameTables(t, "merged shards vs single run", reproducible(t, merged), want)

	// A run stopped after two flames, then resumed.
	dir := filepath.Join(t.TempDir(), "resumed")
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	opt, calls := realOptions(c, 1)
	opt.Progress = func(p Progress) {
		if p.Done == 2 {
			cancel()
		}
	}
	if _, err := Run(ctx, c, dir, opt); !errors.Is(err, ErrInterrupted) {
		t.Fatalf("stopped run: %v", err)
	}
	if calls.Load() != 2 {
		t.Fatalf("stopped run made %d solves, want 2", calls.Load())
	}
	opt, calls = realOptions(c, 2)
	s := runSweep(t, c, dir, opt)
	if calls.Load() != 4 || s.Reused != 2 {
		t.Errorf("resumed run made %d solves and kept %d points, want 4 and 2", calls.Load(), s.Reused)
	}
	sameTables(t, "resumed vs single run", reproducible(t, dir), want)
}

// studySolver reports a cold start as cold and a continuation as
// continued (study.Result.ColdStart).
func TestStudySolverSeesColdStarts(t *testing.T) {
	if testing.Short() {
		t.Skip("hydrogen flames")
	}
	c := sweepCase(t, "equivalence_ratio = [1.0, 1.1]")
	s, err := newStudySolver(c, nil)
	if err != nil {
		t.Fatal(err)
	}
	res, cold, err := s.Solve(study.Condition{Phi: 1.0, T: 298, P: 101325}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !cold || !res.ColdStart {
		t.Errorf("cold start reported as cold=%v, ColdStart=%v; want both true", cold, res.ColdStart)
	}
	next, cold, err := s.Solve(study.Condition{Phi: 1.1, T: 298, P: 101325}, res.Solution)
	if err != nil {
		t.Fatal(err)
	}
	if cold || next.ColdStart {
		t.Errorf("continuation reported as cold=%v, ColdStart=%v; want both false", cold, next.ColdStart)
	}
}
