package validation

import (
	"fmt"
	"io"
	"math"
	"runtime"
	"sort"
	"strconv"
	"strings"
	"sync"
	"time"
	"unicode"

	"flame1d/casefile"
	"flame1d/chem"
	"flame1d/fuel"
	"flame1d/study"
)

// Status says what became of a measured point.
type Status string

const (
	Solved Status = "solved"
	Failed Status = "failed"
	// NotRepresented: the mechanism lacks the fuel or air species.
	NotRepresented Status = "not represented"
)

// Outcome is one measured point with the mechanism's prediction.
type Outcome struct {
	Point
	Status Status
	Reason string // why a point failed or is not represented
	// Predicted is the computed laminar flame speed, m/s (solved points).
	Predicted float64
	// Deviation is (Predicted - Speed) / Speed.
	Deviation float64
	// OutsideBand is how far the prediction lies outside the measured
	// band, relative to the band edge it passed: (Predicted - High)/High
	// above it, (Predicted - Low)/Low below it (negative), zero within.
	OutsideBand float64
	// Work of the solve: Newton iterations and wall time (s; taken under
	// whatever load the machine had).
	NewtonIterations int
	WallTime         float64
	// Warnings say how the point's series lies outside the mechanism's
	// validity range (study.ValidityWarnings over the series).
	Warnings []string
}

// Score sums up the outcomes of one fuel, or of all.
type Score struct {
	Fuel                                   string
	Points, Solved, Failed, NotRepresented int
	WithinBand                             int // solved points inside their band
	// RMS is the root mean square of Deviation over the solved points.
	RMS float64
	// Worst is the solved point of largest |Deviation|, WorstOutside that
	// of largest |OutsideBand| (nil when none is solved).
	Worst, WorstOutside *Outcome
}

// Scorecard is a mechanism scored against the measurements.
type Scorecard struct {
	Mechanism string
	Outcomes  []Outcome // in the order of the datasets and their points
	Fuels     []Score   // one per dataset, in order
	Overall   Score
	Jobs      int
	WallTime  time.Duration
}

// Options control a scorecard run.
type Options struct {
	// Jobs is the number of flames solved at the same time; 0 means
	// runtime.NumCPU(). Each series of a fuel (one temperature and
	// pressure) is one continuation chain; chains run in parallel.
	Jobs int
	// Progress, when non-nil, receives one line per point solved.
	Progress io.Writer
	// Solver adjusts the solver settings as a case file's [solver] table
	// would; the zero value is the case-file default (thermal diffusion
	// on).
	Solver *casefile.SolverSettings
	// Grid adjusts the grid settings as a case file's [grid] table would.
	Grid casefile.GridSettings
}

// Run solves every measured point of the datasets that mechanism mech
// (named name, as the user gave it) can represent, by continuation along
// the equivalence ratio within each series, and scores the predictions.
// Points whose fuel or air species the mechanism lacks are reported as
// not represented; points that fail to converge are reported as failed
// with the reason. Neither counts in the RMS.
func Run(name string, mech *chem.Mechanism, sets []*Dataset, opt Options) (*Scorecard, error) {
	began := time.Now()
	sc := &Scorecard{Mechanism: name}
	jobs := opt.Jobs
	if jobs <= 0 {
		jobs = runtime.NumCPU()
	}
	sc.Jobs = jobs
	type chain struct {
		set     *Dataset
		spec    fuel.Spec
		air     map[string]float64
		T, P    float64
		indices []int // into sc.Outcomes
	}
	var chains []*chain
	for _, d := range sets {
		spec, air, reason := represent(mech, name, d)
		byCond := map[[2]float64]*chain{}
		for _, p := range d.Points {
			i := len(sc.Outcomes)
			sc.Outcomes = append(sc.Outcomes, Outcome{Point: p})
			if reason != "" {
				sc.Outcomes[i].Status, sc.Outcomes[i].Reason = NotRepresented, reason
				continue
			}
			key := [2]float64{p.T, p.P}
			ch := byCond[key]
			if ch == nil {
				ch = &chain{set: d, spec: spec, air: air, T: p.T, P: p.P}
				byCond[key] = ch
				chains = append(chains, ch)
			}
			ch.indices = append(ch.indices, i)
		}
	}
	// Longest chains first, so that the last chains to finish are short
	// (longest-processing-time-first scheduling).
	sort.SliceStable(chains, func(a, b int) bool { return len(chains[a].indices) > len(chains[b].indices) })
	total := 0
	for _, ch := range chains {
		total += len(ch.indices)
	}
	var solver casefile.SolverSettings
	if opt.Solver != nil {
		solver = *opt.Solver
	}
	if solver.Workers == 0 {
		solver.Workers = max(1, runtime.NumCPU()/jobs)
	}
	var (
		mu   sync.Mutex
		done int
		wg   sync.WaitGroup
		work = make(chan *chain)
	)
	solveChain := func(ch *chain) {
		c := &casefile.Case{File: ch.set.File, Title: "validation: " + ch.set.Name + " in air", Mechanism: name, TopLevelMechanism: name,
			Fuel: ch.spec, Oxidizer: ch.air, EquivalenceRatio: 1, Temperature: ch.T, Pressure: ch.P, Grid: opt.Grid, Solver: solver}
		st, err := study.NewForFuel(c, mech, ch.spec, nil)
		phis := make([]float64, len(ch.indices))
		for k, i := range ch.indices {
			phis[k] = sc.Outcomes[i].Phi
		}
		if err != nil {
			mu.Lock()
			for _, i := range ch.indices {
				sc.Outcomes[i].Status, sc.Outcomes[i].Reason = Failed, oneLine(err)
			}
			done += len(ch.indices)
			mu.Unlock()
			return
		}
		conds := make([]study.Condition, len(phis))
		for k, phi := range phis {
			conds[k] = study.Condition{Phi: phi, T: ch.T, P: ch.P}
		}
		warnings := st.ValidityWarnings(conds...)
		st.SolveAlongPhi(phis, ch.T, ch.P, func(k int, r *study.Result, err error) {
			o := &sc.Outcomes[ch.indices[k]]
			mu.Lock()
			defer mu.Unlock()
			done++
			if err != nil {
				o.Status, o.Reason = Failed, oneLine(err)
			} else {
				o.score(r.Summary.FlameSpeed)
				o.NewtonIterations, o.WallTime = r.Summary.NewtonIterations, r.Summary.WallTimeS
				r.Solution, r.Profile = nil, nil // keep only the numbers; the chain holds its own start
			}
			o.Warnings = warnings
			if opt.Progress != nil {
				fmt.Fprintf(opt.Progress, "validate: [%d/%d] %s\n", done, total, o.progressLine())
			}
		})
	}
	for w := 0; w < jobs; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for ch := range work {
				solveChain(ch)
			}
		}()
	}
	for _, ch := range chains {
		work <- ch
	}
	close(work)
	wg.Wait()
	sc.summarise(sets)
	sc.WallTime = time.Since(began)
	return sc, nil
}

// Warnings are the distinct validity warnings of all points, in order.
func (sc *Scorecard) Warnings() []string {
	seen := map[string]bool{}
	var out []string
	for _, o := range sc.Outcomes {
		for _, w := range o.Warnings {
			if !seen[w] {
				seen[w] = true
				out = append(out, w)
			}
		}
	}
	return out
}

// score fills the prediction and its deviations.
func (o *Outcome) score(predicted float64) {
	o.Status, o.Predicted = Solved, predicted
	o.Deviation = (predicted - o.Speed) / o.Speed
	switch {
	case predicted > o.High:
		o.OutsideBand = (predicted - o.High) / o.High
	case predicted < o.Low:
		o.OutsideBand = (predicted - o.Low) / o.Low
	default:
		o.OutsideBand = 0
	}
}

func (o *Outcome) progressLine() string {
	head := fmt.Sprintf("%s phi %g, %s: ", o.Fuel, o.Phi, Conditions(o.T, o.P))
	if o.Status != Solved {
		return head + string(o.Status) + ": " + o.Reason
	}
	return head + fmt.Sprintf("%.2f cm/s (measured %.1f, band %.1f-%.1f; %+.1f%%) in %.1f s",
		100*o.Predicted, 100*o.Speed, 100*o.Low, 100*o.High, 100*o.Deviation, o.WallTime)
}

// Conditions writes an unburned temperature (K) and pressure (Pa) the way
// the tables show them: "298 K, 1 atm", or "300 K, 0.5 MPa" for a
// pressure that is not a round number of atmospheres.
func Conditions(T, P float64) string {
	p := strconv.FormatFloat(P/101325, 'g', 3, 64) + " atm"
	if atm := P / 101325; math.Abs(atm*100-math.Round(atm*100)) > 1e-6*atm*100 {
		p = strconv.FormatFloat(P/1e6, 'g', 4, 64) + " MPa"
	}
	return strconv.FormatFloat(math.Round(T*10)/10, 'f', -1, 64) + " K, " + p
}

func (sc *Scorecard) summarise(sets []*Dataset) {
	sc.Fuels = nil
	var all []*Outcome
	for _, d := range sets {
		var mine []*Outcome
		for i := range sc.Outcomes {
			if sc.Outcomes[i].Fuel == d.Fuel {
				mine = append(mine, &sc.Outcomes[i])
			}
		}
		all = append(all, mine...)
		sc.Fuels = append(sc.Fuels, scoreOf(d.Fuel, mine))
	}
	sc.Overall = scoreOf("all", all)
}

func scoreOf(name string, outs []*Outcome) Score {
	s := Score{Fuel: name, Points: len(outs)}
	sum := 0.0
	for _, o := range outs {
		switch o.Status {
		case Solved:
			s.Solved++
			sum += o.Deviation * o.Deviation
			if o.OutsideBand == 0 {
				s.WithinBand++
			}
			if s.Worst == nil || math.Abs(o.Deviation) > math.Abs(s.Worst.Deviation) {
				s.Worst = o
			}
			if s.WorstOutside == nil || math.Abs(o.OutsideBand) > math.Abs(s.WorstOutside.OutsideBand) {
				s.WorstOutside = o
			}
		case Failed:
			s.Failed++
		default:
			s.NotRepresented++
		}
	}
	if s.Solved > 0 {
		s.RMS = math.Sqrt(sum / float64(s.Solved))
	}
	return s
}

// represent finds the fuel and air species of a dataset in the mechanism:
// the fuel as the first species named in d.Species (any letter case) whose
// atoms match d.Formula. The reason is empty when all are found.
func represent(m *chem.Mechanism, name string, d *Dataset) (fuel.Spec, map[string]float64, string) {
	want, err := parseAtoms(d.Formula)
	if err != nil {
		return fuel.Spec{}, nil, fmt.Sprintf("%s: formula: %v", d.File, err)
	}
	fuelName := ""
	for _, n := range d.Species {
		for i := range m.Species {
			if strings.EqualFold(m.Species[i].Name, n) && sameAtoms(m.Species[i].Composition, want) {
				fuelName = m.Species[i].Name
				break
			}
		}
		if fuelName != "" {
			break
		}
	}
	if fuelName == "" {
		return fuel.Spec{}, nil, fmt.Sprintf("mechanism %s has no %s species (looked for %s of formula %s)", name, d.Name, strings.Join(d.Species, ", "), d.Formula)
	}
	air := map[string]float64{}
	for sp, x := range casefile.DefaultOxidizer() {
		k := -1
		for i := range m.Species {
			if strings.EqualFold(m.Species[i].Name, sp) {
				k = i
			}
		}
		if k < 0 {
			return fuel.Spec{}, nil, fmt.Sprintf("mechanism %s has no %s species for air", name, sp)
		}
		air[m.Species[k].Name] = x
	}
	return fuel.Spec{Name: d.Name, Composition: map[string]float64{fuelName: 1}}, air, ""
}

// parseAtoms reads a molecular formula such as "C3H8" or "H2" into atom
// counts by element symbol (a capital letter and any lower-case ones).
func parseAtoms(formula string) (map[string]float64, error) {
	atoms := map[string]float64{}
	r := []rune(strings.TrimSpace(formula))
	for i := 0; i < len(r); {
		if !unicode.IsUpper(r[i]) {
			return nil, fmt.Errorf("%q: expected an element symbol at position %d", formula, i+1)
		}
		j := i + 1
		for j < len(r) && unicode.IsLower(r[j]) {
			j++
		}
		sym := string(r[i:j])
		k := j
		for k < len(r) && (unicode.IsDigit(r[k]) || r[k] == '.') {
			k++
		}
		n := 1.0
		if k > j {
			v, err := strconv.ParseFloat(string(r[j:k]), 64)
			if err != nil || !(v > 0) {
				return nil, fmt.Errorf("%q: count of %s is not a positive number", formula, sym)
			}
			n = v
		}
		atoms[sym] += n
		i = k
	}
	if len(atoms) == 0 {
		return nil, fmt.Errorf("empty formula")
	}
	return atoms, nil
}

// sameAtoms compares a species composition with atom counts, element
// symbols without regard to letter case.
func sameAtoms(comp, want map[string]float64) bool {
	n := 0
	for el, c := range comp {
		if c == 0 {
			continue
		}
		n++
		found := false
		for w, x := range want {
			if strings.EqualFold(w, el) {
				found = math.Abs(x-c) < 1e-9
			}
		}
		if !found {
			return false
		}
	}
	return n == len(want)
}

func oneLine(err error) string {
	s := err.Error()
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		return s[:i]
	}
	return s
}
