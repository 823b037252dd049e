package sweep

import (
	"container/heap"
	"context"
	"errors"
	"fmt"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"flame1d/casefile"
	"flame1d/flame"
	"flame1d/output"
	"flame1d/study"
)

// PointSolver solves the flame at one condition. start, when non-nil, is
// the converged state of a neighbour to continue from, as ReadStart read
// it. cold reports whether a cold start was tried: on success, whether the
// result came from one.
//
// A PointSolver is used by one goroutine at a time; the sweep makes one per
// worker.
type PointSolver interface {
	Solve(c study.Condition, start *flame.Solution) (res *study.Result, cold bool, err error)
	// ReadStart reads the converged state that a committed point left in
	// its folder.
	ReadStart(pointDir string) (*flame.Solution, error)
}

// Options control a sweep run.
type Options struct {
	// Jobs is the number of points solved at the same time; 0 means
	// runtime.NumCPU(). Only independent points run together: the heads of
	// different chains and the two branches of a chain.
	Jobs int
	// Shard selects one slice of the sweep (zero value: all of it).
	Shard Shard
	// ColdStarts solves every point from a cold start, without
	// continuation: slower, for checking continuation.
	ColdStarts bool
	// RetryFailed solves again the points a previous run committed as
	// failed; by default they are kept as they are.
	RetryFailed bool
	// Progress, when non-nil, is called once before the first point
	// (Done = 0, Record nil) and after each point is committed, from one
	// goroutine at a time.
	Progress func(Progress)
	// NewSolver makes one worker's solver; nil makes a study.Study of the
	// case per worker.
	NewSolver func() (PointSolver, error)
}

// Progress reports one committed point.
type Progress struct {
	Done, Total int // points finished and to be solved in this run
	Record      *Record
}

// Summary is the outcome of a run.
type Summary struct {
	Dir    string
	Points int // in this shard
	// Solved, Failed and Pending count the shard's points after the run.
	Solved, Failed, Pending int
	// Reused counts points committed by an earlier run and not solved again.
	Reused int
	// Attempted counts the points this run tried to solve.
	Attempted int
	// Repaired counts failed points this run solved again from a neighbour
	// that converged later (see repairFor).
	Repaired int
	Failures []*Record
	WallTime time.Duration
	// Warnings are worth a look but did not stop the run.
	Warnings []string
}

// ErrInterrupted is returned when the context is cancelled before the
// sweep is complete; everything committed so far is kept.
var ErrInterrupted = errors.New("sweep interrupted")

// maxNeighbourStarts is how many solved ancestors a point tries to continue
// from before a cold start.
const maxNeighbourStarts = 2

// Run solves the sweep of a case (or one shard of it) into dir. Points
// already committed in dir by an earlier run of the same sweep are kept;
// a different sweep in dir is an error that names the difference.
func Run(ctx context.Context, c *casefile.Case, dir string, opt Options) (*Summary, error) {
	began := time.Now()
	mech, err := study.LoadMechanism(c)
	if err != nil {
		return nil, err
	}
	def, err := DefinitionOf(c, mech, opt.ColdStarts)
	if err != nil {
		return nil, err
	}
	plan, err := NewPlan(def)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", c.File, err)
	}
	shard := opt.Shard.normal()
	points, err := plan.ShardPoints(shard)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", c.File, err)
	}
	m := &Manifest{Format: manifestFormat, Title: c.Title, Definition: def, Shard: shard, Program: ProgramIdentity(), Note: output.SafetyNote}
	warning, err := claimFolder(dir, m)
	if err != nil {
		return nil, err
	}
	// A killed run may have left a point's unfinished folder behind.
	output.RemoveLeftovers(filepath.Join(dir, pointsDir), "")
	recs, err := readRecords(dir, plan, points)
	if err != nil {
		return nil, err
	}
	if opt.RetryFailed {
		for i, r := range recs {
			if r.Status == Failed {
				delete(recs, i)
			}
		}
	}
	r := &runner{dir: dir, title: c.Title, plan: plan, points: points, recs: recs, opt: opt}
	reused := len(recs)
	if r.opt.NewSolver == nil {
		r.opt.NewSolver = func() (PointSolver, error) { return newStudySolver(c, r.threads) }
	}
	if err := r.writeResults(); err != nil {
		return nil, err
	}
	attempted, stopped, runErr := r.schedule(ctx)
	// The table is built once, from the committed records, also after an
	// interruption; a killed run leaves it stale, and the next run into
	// the folder rebuilds it from the records.
	if err := r.writeResults(); err != nil && runErr == nil {
		runErr = err
	}
	plotErr := writePlots(dir, c.Title, plan, points, r.recs)
	s := &Summary{Dir: dir, Points: len(points), Reused: reused, Attempted: attempted, Repaired: r.repaired, WallTime: time.Since(began)}
	if warning != "" {
		s.Warnings = append(s.Warnings, warning)
	}
	for _, i := range points {
		switch rec := r.recs[i]; {
		case rec == nil:
			s.Pending++
		case rec.Status == Solved:
			s.Solved++
		default:
			s.Failed++
			s.Failures = append(s.Failures, rec)
		}
	}
	if runErr != nil {
		return s, runErr
	}
	if plotErr != nil {
		return s, plotErr
	}
	if s.Pending > 0 || stopped {
		return s, fmt.Errorf("%w: %d of %d points committed in %s; run the same command again to solve the other %d and retry the failed ones from their neighbours",
			ErrInterrupted, len(points)-s.Pending, len(points), dir, s.Pending)
	}
	return s, nil
}

type runner struct {
	dir    string
	title  string
	plan   *Plan
	points []int
	recs   map[int]*Record // committed points; written by the coordinating goroutine only
	opt    Options
	// repaired counts failed points solved again from a neighbour.
	repaired int
	active   atomic.Int32 // solves in progress
}

// threads is the number of residual-evaluation goroutines for the next
// solve: the cores shared among the solves in progress. The residual is
// evaluated point by point, so results do not depend on it.
func (r *runner) threads() int {
	n := runtime.NumCPU() / max(1, int(r.active.Load()))
	return max(1, n)
}

func (r *runner) writeResults() error {
	t := &Table{Comments: resultsComments(r.title, r.plan.Definition)}
	for _, i := range r.points {
		t.Rows = append(t.Rows, rowOf(r.plan.Points[i], r.recs[i]))
	}
	return output.WriteFileAtomic(filepath.Join(r.dir, ResultsName), t.WriteCSV)
}

type task struct {
	point  int
	starts []int // solved neighbours to continue from, nearest first
	// repair: the point was committed as failed; the new attempts add to
	// the previous ones (and their time), and no cold start is tried again.
	repair       bool
	previous     []Attempt
	previousTime float64
}

type outcome struct {
	point  int
	repair bool
	rec    *Record
	err    error // failure to commit: stops the sweep
}

// schedule solves the pending points on opt.Jobs workers. A point is ready
// when its parent is committed (solved or failed); the ready point with the
// most work waiting below it goes first. Once every point of a chain is
// committed, its failed points are repaired (see repairFor). It returns how
// many points it attempted and whether work was left undone because the
// context was cancelled.
func (r *runner) schedule(ctx context.Context) (attempted int, stopped bool, err error) {
	plan := r.plan
	inRun := make(map[int]bool)
	for _, i := range r.points {
		if r.recs[i] == nil {
			inRun[i] = true
		}
	}
	total := len(inRun)
	children := make([][]int, len(plan.Points))
	for _, i := range r.points {
		if p := plan.Points[i].Parent; p >= 0 {
			children[p] = append(children[p], i)
		}
	}
	q := &readyQueue{depth: plan.depths()}
	isReady := func(i int) bool {
		p := plan.Points[i].Parent
		return r.opt.ColdStarts || p < 0 || r.recs[p] != nil
	}
	for _, i := range r.points {
		if inRun[i] && isReady(i) {
			heap.Push(q, i)
		}
	}
	// One repair at a time per chain, so that the order of repairs, and
	// with it every result, does not depend on timing.
	var repairs []task
	repairing := map[int]bool{}
	queueRepair := func(chain int) {
		if repairing[chain] {
			return
		}
		if t, ok := r.repairFor(chain); ok {
			repairs = append(repairs, t)
			repairing[chain] = true
		}
	}
	chains := map[int]bool{}
	for _, i := range r.points {
		chains[plan.Points[i].Chain] = true
	}
	for c := range plan.Chains {
		if chains[c] {
			queueRepair(c)
		}
	}
	if total == 0 && len(repairs) == 0 {
		return 0, false, nil
	}
	if r.opt.Progress != nil {
		r.opt.Progress(Progress{Total: total})
	}
	jobs := r.opt.Jobs
	if jobs <= 0 {
		jobs = runtime.NumCPU()
	}
	jobs = max(1, min(jobs, total+len(repairs)))
	tasks := make(chan task)
	done := make(chan outcome)
	var wg sync.WaitGroup
	for w := 0; w < jobs; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			r.work(tasks, done)
		}()
	}
	var fatal error
	cancelled := false
	ctxDone := ctx.Done()
	running, finished := 0, 0
	for {
		var send chan<- task
		var next task
		fromRepairs := false
		if fatal == nil && !cancelled && ctx.Err() == nil {
			switch {
			case q.Len() > 0:
				send, next = tasks, task{point: q.items[0], starts: r.startsFor(q.items[0])}
			case len(repairs) > 0:
				send, next, fromRepairs = tasks, repairs[0], true
			}
		}
		if send == nil && running == 0 {
			break
		}
		select {
		case send <- next:
			if fromRepairs {
				repairs = repairs[1:]
			} else {
				heap.Pop(q)
				attempted++
			}
			running++
			r.active.Add(1)
		case o := <-done:
			running--
			r.active.Add(-1)
			if o.err != nil {
				if fatal == nil {
					fatal = o.err
				}
				continue
			}
			chain := plan.Points[o.point].Chain
			r.recs[o.point] = o.rec
			if o.repair {
				repairing[chain] = false
				if o.rec.Status == Solved {
					r.repaired++
				}
			} else {
				finished++
				for _, ch := range children[o.point] {
					if inRun[ch] && !r.opt.ColdStarts {
						heap.Push(q, ch)
					}
				}
			}
			queueRepair(chain)
			if r.opt.Progress != nil && !o.repair {
				r.opt.Progress(Progress{Done: finished, Total: total, Record: o.rec})
			}
		case <-ctxDone:
			cancelled = true
			ctxDone = nil
		}
	}
	close(tasks)
	wg.Wait()
	stopped = ctx.Err() != nil && (q.Len() > 0 || len(repairs) > 0)
	return attempted, stopped, fatal
}

// repairFor returns the next repair of a chain whose points are all
// committed: its first failed point (in chain order) with an adjacent point
// along the chain that is solved and has not been tried as its start. A
// failed chain head, for example, is retried from a branch point that
// converged from a cold start. The outcome depends only on committed
// records, so a resumed sweep repairs exactly as an uninterrupted one.
func (r *runner) repairFor(chain int) (task, bool) {
	if r.opt.ColdStarts {
		return task{}, false
	}
	members := r.plan.Chains[chain]
	for _, m := range members {
		if r.recs[m] == nil {
			return task{}, false
		}
	}
	line := append([]int(nil), members...)
	sort.Slice(line, func(a, b int) bool {
		return r.plan.Along.of(r.plan.Points[line[a]].Condition) < r.plan.Along.of(r.plan.Points[line[b]].Condition)
	})
	pos := make(map[int]int, len(line))
	for k, m := range line {
		pos[m] = k
	}
	for _, m := range members {
		rec := r.recs[m]
		if rec.Status != Failed {
			continue
		}
		tried := map[string]bool{}
		for _, a := range rec.Attempts {
			tried[a.Start] = true
		}
		var starts []int
		for _, k := range []int{pos[m] - 1, pos[m] + 1} {
			if k < 0 || k >= len(line) {
				continue
			}
			if n := r.recs[line[k]]; n.Status == Solved && !tried[n.ID] {
				starts = append(starts, line[k])
			}
		}
		if len(starts) > 0 {
			return task{point: m, starts: starts, repair: true, previous: rec.Attempts, previousTime: rec.WallTimeS}, true
		}
	}
	return task{}, false
}

// startsFor lists the solved ancestors a point continues from, nearest
// first. Ancestors are committed before their descendants are dispatched,
// so the list depends only on the outcomes, never on timing.
func (r *runner) startsFor(i int) []int {
	if r.opt.ColdStarts {
		return nil
	}
	var out []int
	for _, a := range r.plan.Ancestors(i) {
		if rec := r.recs[a]; rec != nil && rec.Status == Solved {
			out = append(out, a)
			if len(out) == maxNeighbourStarts {
				break
			}
		}
	}
	return out
}

// work is one worker: it makes its own solver on first use and solves and
// commits the points it is given.
func (r *runner) work(tasks <-chan task, done chan<- outcome) {
	var solver PointSolver
	var solverErr error
	for t := range tasks {
		if solver == nil && solverErr == nil {
			solver, solverErr = r.opt.NewSolver()
		}
		if solverErr != nil {
			done <- outcome{point: t.point, repair: t.repair, err: solverErr}
			continue
		}
		rec, err := r.solvePoint(solver, t)
		done <- outcome{point: t.point, repair: t.repair, rec: rec, err: err}
	}
}

// solvePoint tries each start in turn (walking to the point, see steps.go),
// then a cold start if none was tried, and
// commits the point. Only a failure to write is returned as an error; a
// flame that does not converge is a failed record.
func (r *runner) solvePoint(solver PointSolver, t task) (*Record, error) {
	pt := r.plan.Points[t.point]
	began := time.Now()
	rec := &Record{ID: pt.ID, EquivalenceRatio: pt.Condition.Phi, UnburnedTemperatureK: pt.Condition.T, PressurePa: pt.Condition.P}
	if t.repair {
		rec.Attempts = append(rec.Attempts, t.previous...)
		rec.WallTimeS = t.previousTime
	}
	var res *study.Result
	triedCold := t.repair
	try := func(startID string, w walkResult, t0 time.Time) {
		triedCold = triedCold || w.triedCold
		a := Attempt{Start: startID, Intermediate: w.steps, NewtonIterations: w.iterations}
		err := w.err
		if err == nil {
			if w.cold {
				a.Start = ColdStart
			}
			err = rec.fill(w.res)
		}
		a.WallTimeS = time.Since(t0).Seconds()
		if err != nil {
			a.Error = oneLine(err.Error())
		} else {
			res = w.res
			rec.ContinuedFrom, rec.NewtonIterations = a.Start, w.iterations
		}
		rec.Attempts = append(rec.Attempts, a)
	}
	for k, s := range t.starts {
		t0 := time.Now()
		from := r.plan.Points[s]
		start, err := solver.ReadStart(pointDir(r.dir, from.ID))
		if err != nil {
			rec.Attempts = append(rec.Attempts, Attempt{Start: from.ID, Error: oneLine(err.Error())})
			continue
		}
		if try(from.ID, walk(solver, r.plan.Along, pt.Condition, from.Condition, start, k == 0), t0); res != nil {
			break
		}
	}
	if res == nil && !triedCold {
		t0 := time.Now()
		out, _, err := solver.Solve(pt.Condition, nil)
		w := walkResult{res: out, cold: true, triedCold: true, err: err}
		if err == nil {
			w.iterations = out.Summary.NewtonIterations
		}
		try(ColdStart, w, t0)
	}
	rec.WallTimeS += time.Since(began).Seconds()
	if res == nil {
		rec.Status = Failed
		rec.Reason = failureReason(rec.Attempts)
	} else {
		rec.Status = Solved
	}
	if err := commitPoint(r.dir, rec, res); err != nil {
		return nil, fmt.Errorf("sweep point %s: %w", pt.ID, err)
	}
	return rec, nil
}

func failureReason(attempts []Attempt) string {
	starts := make([]string, len(attempts))
	for i, a := range attempts {
		starts[i] = a.Start
	}
	last := attempts[len(attempts)-1]
	return fmt.Sprintf("%d attempt(s) failed (starts: %s); last: %s", len(attempts), strings.Join(starts, ", "), last.Error)
}

// readyQueue orders ready points by the work waiting below them, then by
// table order.
type readyQueue struct {
	items []int
	depth []int
}

func (q *readyQueue) Len() int { return len(q.items) }
func (q *readyQueue) Less(a, b int) bool {
	ia, ib := q.items[a], q.items[b]
	if q.depth[ia] != q.depth[ib] {
		return q.depth[ia] > q.depth[ib]
	}
	return ia < ib
}
func (q *readyQueue) Swap(a, b int) { q.items[a], q.items[b] = q.items[b], q.items[a] }
func (q *readyQueue) Push(x any)    { q.items = append(q.items, x.(int)) }
func (q *readyQueue) Pop() any {
	n := len(q.items)
	x := q.items[n-1]
	q.items = q.items[:n-1]
	return x
}

// studySolver is the production PointSolver: a study.Study of the case.
type studySolver struct {
	st      *study.Study
	threads func() int
}

func newStudySolver(c *casefile.Case, threads func() int) (*studySolver, error) {
	st, err := study.New(c, nil)
	if err != nil {
		return nil, err
	}
	return &studySolver{st: st, threads: threads}, nil
}

// restartName is the converged-state file study.WriteFlameTables writes beside
// every profile; continuation reads it back, so that a resumed sweep starts
// each point from exactly the numbers an uninterrupted one does.
const restartName = "restart.csv"

func (s *studySolver) ReadStart(pointDir string) (*flame.Solution, error) {
	return s.st.ReadRestart(filepath.Join(pointDir, restartName))
}

func (s *studySolver) Solve(c study.Condition, start *flame.Solution) (*study.Result, bool, error) {
	if s.threads != nil && s.st.Case.Solver.Workers == 0 {
		s.st.Settings.Workers = s.threads()
	}
	res, err := s.st.Solve(c, start)
	if err != nil {
		// Study.Solve falls back to a cold start before it gives up.
		return nil, true, err
	}
	return res, res.ColdStart, nil
}
