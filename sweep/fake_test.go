package sweep

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"sync/atomic"
	"testing"

	"flame1d/builtin"
	"flame1d/casefile"
	"flame1d/chem"
	"flame1d/flame"
	"flame1d/output"
	"flame1d/study"
)

// fakeSolver stands in for the flame solver in tests of the sweep logic.
// Its flame speed is a smooth function of the condition plus 1e-9 times the
// equivalence ratio of the state it started from, so a point solved from a
// different start than expected changes the results table. Its solutions
// live on the burke2012-hydrogen mechanism so that study.WriteFlame can write them; the
// equivalence ratio is kept in AnchorX, which the restart file carries.
type fakeSolver struct {
	calls *atomic.Int64
	mech  *chem.Mechanism
	// fail, when non-nil, returns the error of a solve (nil: converge).
	fail func(c study.Condition, start *flame.Solution) error
}

var fakeMechanism = sync.OnceValues(func() (*chem.Mechanism, error) { return builtin.Load("burke2012-hydrogen") })

func (f *fakeSolver) ReadStart(dir string) (*flame.Solution, error) {
	file, err := os.Open(filepath.Join(dir, restartName))
	if err != nil {
		return nil, err
	}
	defer file.Close()
	return flame.ReadRestart(file, dir, f.mech)
}

func (f *fakeSolver) Solve(c study.Condition, start *flame.Solution) (*study.Result, bool, error) {
	f.calls.Add(1)
	if f.fail != nil {
		if err := f.fail(c, start); err != nil {
			return nil, start == nil, err
		}
	}
	startPhi := 0.0
	if start != nil {
		startPhi = start.AnchorX
	}
	sl := fakeSpeed(c) + 1e-9*startPhi
	K := len(f.mech.Species)
	y := make([]float64, K)
	y[0] = 1
	temps := []float64{c.T, 800, 1800, 2000}
	u := make([]float64, len(temps)*(K+2))
	for j, T := range temps {
		u[j*(K+2)] = T
		copy(u[j*(K+2)+1:], y)
		u[j*(K+2)+K+1] = sl
	}
	sol := &flame.Solution{Mechanism: f.mech, Inlet: flame.Inlet{T: c.T, P: c.P, Y: y}, X: []float64{0, 0.003, 0.006, 0.01},
		U: u, AnchorX: c.Phi, AnchorT: c.T + 400, AdiabaticT: 2000 + 100*c.Phi, InitialLength: 0.01}
	var names []string
	for _, sp := range f.mech.Species {
		names = append(names, sp.Name)
	}
	prof := &flame.Profile{Species: names, X: sol.X, T: temps, Velocity: []float64{sl, 2 * sl, 4 * sl, 5 * sl},
		Density: []float64{1, 0.5, 0.25, 0.2}, HeatRelease: []float64{0, 1e8, 1e7, 0}, MoleFractions: [][]float64{y, y, y, y}}
	sum := &output.FlameSummary{Mechanism: "fake", EquivalenceRatio: c.Phi, UnburnedTemperatureK: c.T, PressurePa: c.P,
		Converged: true, FlameSpeed: sl, BurnedTemperature: 1999 + 100*c.Phi, AdiabaticTemperature: 2000 + 100*c.Phi,
		ThermalThickness: 4e-4, PeakHeatReleaseX: 0.002, GridPoints: 4, NewtonIterations: 7, Note: output.SafetyNote}
	return &study.Result{Condition: c, Solution: sol, Profile: prof, Summary: sum}, start == nil, nil
}

// fakeSpeed is a Metghalchi-Keck-shaped function of the condition, m/s.
func fakeSpeed(c study.Condition) float64 {
	return (0.4 - 1.2*(c.Phi-1.05)*(c.Phi-1.05)) * math.Pow(c.T/298, 1.8) * math.Pow(c.P/101325, -0.3)
}

// fakeOptions returns options running the fake solver and its call counter.
func fakeOptions(jobs int, fail func(study.Condition, *flame.Solution) error) (Options, *atomic.Int64) {
	calls := &atomic.Int64{}
	return Options{Jobs: jobs, NewSolver: func() (PointSolver, error) {
		m, err := fakeMechanism()
		return &fakeSolver{calls: calls, mech: m, fail: fail}, err
	}}, calls
}

// sweepCase parses a case on the built-in burke2012-hydrogen mechanism with the given
// [sweep] table.
func sweepCase(t testing.TB, sweepTable string) *casefile.Case {
	t.Helper()
	src := "title = \"test sweep\"\nmechanism = \"burke2012-hydrogen\"\n[mixture]\nfuel = { H2 = 1 }\nequivalence_ratio = 1.0\ntemperature = \"298 K\"\n[sweep]\n" + sweepTable + "\n"
	c, err := casefile.Parse([]byte(src), filepath.Join(t.TempDir(), "case.toml"))
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func runSweep(t testing.TB, c *casefile.Case, dir string, opt Options) *Summary {
	t.Helper()
	s, err := Run(context.Background(), c, dir, opt)
	if err != nil {
		t.Fatalf("sweep into %s: %v", dir, err)
	}
	return s
}

// reproducible returns a results table's rows without the wall-time column,
// the one column that differs between runs.
func reproducible(t testing.TB, dir string) [][]string {
	t.Helper()
	tab, err := ReadResults(filepath.Join(dir, ResultsName))
	if err != nil {
		t.Fatal(err)
	}
	wt := Column(ColWallTime)
	out := make([][]string, len(tab.Rows))
	for i, r := range tab.Rows {
		row := append([]string(nil), r...)
		row[wt] = ""
		out[i] = row
	}
	return out
}

func sameTables(t testing.TB, what string, got, want [][]string) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s: %d rows, want %d", what, len(got), len(want))
	}
	for i := range want {
		if strings.Join(got[i], ",") != strings.Join(want[i], ",") {
			t.Errorf("%s: row %d differs:\n got  %v\n want %v", what, i+1, got[i], want[i])
		}
	}
}

func readRecord(t testing.TB, dir, id string) *Record {
	t.Helper()
	b, err := os.ReadFile(filepath.Join(pointDir(dir, id), recordName))
	if err != nil {
		t.Fatal(err)
	}
	var r Record
	if err := json.Unmarshal(b, &r); err != nil {
		t.Fatal(err)
	}
	return &r
}

var errFake = errors.New("fake: flame did not converge")

// failAt fails every solve at the listed equivalence ratios; with
// onlyContinued, only solves that start from a neighbour.
func failAt(onlyContinued bool, phis ...float64) func(study.Condition, *flame.Solution) error {
	return func(c study.Condition, start *flame.Solution) error {
		for _, p := range phis {
			if math.Abs(c.Phi-p) < 1e-9 && (start != nil || !onlyContinued) {
				return fmt.Errorf("%w at phi %g", errFake, c.Phi)
			}
		}
		return nil
	}
}

func mustDefinition(t testing.TB, c *casefile.Case) Definition {
	t.Helper()
	mech, err := study.LoadMechanism(c)
	if err != nil {
		t.Fatal(err)
	}
	d, err := DefinitionOf(c, mech, false)
	if err != nil {
		t.Fatal(err)
	}
	return d
}
