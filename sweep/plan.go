// Package sweep solves a family of freely propagating flames declared by a
// case file's [sweep] table (equivalence ratio, unburned temperature and
// pressure, as lists or ranges) by continuation: each flame starts from the
// converged flame of its nearest neighbour along a continuation chain.
//
// The sweep is laid out as a forest. Each chain is the line of conditions
// along one variable (the equivalence ratio, unless the case says otherwise)
// at fixed values of the others. Its head is solved from a cold start; the
// chain then walks outwards from the head both ways, each point continuing
// from the one before it. Along the equivalence ratio the head is the point
// nearest the middle of the range, held between 0.9 and 1.25 where flames
// are fast and a cold start converges most readily (common practice, no
// source), so that the two branches are balanced; along temperature or
// pressure it is the middle value.
//
// A point whose continuation fails is retried (steps.go, run.go), and once
// a chain is committed its failed points are retried from adjacent solved
// points (repairFor).
//
// Because every point's start is fixed by the layout and the committed
// outcomes, not by timing, the results do not depend on how many chains run
// in parallel (-j), on how the sweep is split into shards, or on whether it
// was interrupted and resumed: a point's start is read back from the
// committed restart.csv of its neighbour.
//
// Output layout of a sweep folder (docs/sweeps.md):
//
//	sweep.json            manifest: the sweep definition, the shard, the flame1d build
//	results.csv           one row per condition (see results.go)
//	points/<id>/          profile.csv, restart.csv, summary.txt, summary.json (study.WriteFlameTables),
//	                      point.json (the point's record; written last, it commits the point)
//	S_L-vs-<variable>.svg/.png   flame speed against each swept variable
package sweep

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"flame1d/casefile"
	"flame1d/study"
)

// Variable is a swept quantity.
type Variable int

const (
	EquivalenceRatio Variable = iota // -
	Temperature                      // unburned, K
	Pressure                         // Pa
)

// Key returns the variable's case-file key.
func (v Variable) Key() string {
	switch v {
	case EquivalenceRatio:
		return casefile.SweepEquivalenceRatio
	case Temperature:
		return casefile.SweepTemperature
	case Pressure:
		return casefile.SweepPressure
	}
	return fmt.Sprintf("Variable(%d)", int(v))
}

// Label returns the variable as an axis label with its unit.
func (v Variable) Label() string {
	switch v {
	case EquivalenceRatio:
		return "equivalence ratio [-]"
	case Temperature:
		return "unburned temperature [K]"
	case Pressure:
		return "pressure [Pa]"
	}
	return v.Key()
}

func variableOf(key string) (Variable, bool) {
	for _, v := range []Variable{EquivalenceRatio, Temperature, Pressure} {
		if v.Key() == key {
			return v, true
		}
	}
	return 0, false
}

func (v Variable) of(c study.Condition) float64 {
	switch v {
	case Temperature:
		return c.T
	case Pressure:
		return c.P
	}
	return c.Phi
}

// A chain along the equivalence ratio starts at the point nearest the
// middle of its range, held within [headPhiMin, headPhiMax]: near
// stoichiometric, where hydrocarbon and hydrogen flames are fastest and a
// cold start converges most readily (common practice, no source), and as
// central as that allows, so that the two branches walking out from the
// head are of similar length and run in parallel to similar ends.
const (
	headPhiMin = 0.9
	headPhiMax = 1.25
)

// Point is one condition of a sweep.
type Point struct {
	ID        string
	Condition study.Condition
	// Chain is the index of the continuation chain the point belongs to.
	Chain int
	// Parent is the index (in Plan.Points) of the neighbour the point
	// continues from; -1 for a chain head, which starts cold.
	Parent int
}

// Plan is the deterministic layout of a sweep: its points in table order
// (pressure outermost, then temperature, then equivalence ratio, each
// ascending) and its continuation chains.
type Plan struct {
	Definition Definition
	Along      Variable
	Points     []Point
	// Chains lists, for each chain, its point indices: the head first,
	// then each later point after its parent.
	Chains [][]int
	index  map[string]int // point index by id
}

// NewPlan lays out the points and chains of a sweep definition.
func NewPlan(d Definition) (*Plan, error) {
	values := [3][]float64{d.EquivalenceRatios, d.TemperaturesK, d.PressuresPa}
	for v, vals := range values {
		if len(vals) == 0 {
			return nil, fmt.Errorf("sweep definition has no %s values", Variable(v).Key())
		}
		for i := 1; i < len(vals); i++ {
			if !(vals[i] > vals[i-1]) {
				return nil, fmt.Errorf("sweep definition: %s values are not strictly ascending", Variable(v).Key())
			}
		}
	}
	along, err := chooseAlong(d)
	if err != nil {
		return nil, err
	}
	p := &Plan{Definition: d, Along: along}
	nPhi, nT := len(values[0]), len(values[1])
	index := func(iPhi, iT, iP int) int { return (iP*nT+iT)*nPhi + iPhi }
	for _, P := range values[2] {
		for _, T := range values[1] {
			for _, phi := range values[0] {
				p.Points = append(p.Points, Point{Condition: study.Condition{Phi: phi, T: T, P: P}, Parent: -1})
			}
		}
	}
	if err := p.assignIDs(); err != nil {
		return nil, err
	}
	// One chain per combination of the other two variables, in table order.
	line := values[along]
	head := chainHead(along, line)
	for iP := range values[2] {
		for iT := range values[1] {
			for iPhi := range values[0] {
				pos := [3]int{iPhi, iT, iP}
				if pos[along] != 0 {
					continue
				}
				at := func(i int) int {
					q := pos
					q[along] = i
					return index(q[0], q[1], q[2])
				}
				chain := len(p.Chains)
				members := []int{at(head)}
				// Walk outwards from the head, alternating sides so that a
				// chain's two branches become ready at the same time.
				for step := 1; head-step >= 0 || head+step < len(line); step++ {
					if i := head + step; i < len(line) {
						p.Points[at(i)].Parent = at(i - 1)
						members = append(members, at(i))
					}
					if i := head - step; i >= 0 {
						p.Points[at(i)].Parent = at(i + 1)
						members = append(members, at(i))
					}
				}
				for _, m := range members {
					p.Points[m].Chain = chain
				}
				p.Chains = append(p.Chains, members)
			}
		}
	}
	return p, nil
}

// chooseAlong picks the chain variable: the one the case names, else the
// equivalence ratio when it takes several values, else temperature, else
// pressure.
func chooseAlong(d Definition) (Variable, error) {
	if d.ContinueAlong != "" {
		v, ok := variableOf(d.ContinueAlong)
		if !ok {
			return 0, fmt.Errorf("sweep definition: continue_along %q is not a swept variable", d.ContinueAlong)
		}
		return v, nil
	}
	switch {
	case len(d.EquivalenceRatios) > 1:
		return EquivalenceRatio, nil
	case len(d.TemperaturesK) > 1:
		return Temperature, nil
	case len(d.PressuresPa) > 1:
		return Pressure, nil
	}
	return EquivalenceRatio, nil
}

// chainHead returns the index of a chain's head among the ascending values
// of its variable: for the equivalence ratio, nearest the middle of the range
// clamped to [headPhiMin, headPhiMax] (ties to the leaner value); the lower
// middle value otherwise.
func chainHead(along Variable, line []float64) int {
	if along != EquivalenceRatio {
		return (len(line) - 1) / 2
	}
	target := math.Min(math.Max(0.5*(line[0]+line[len(line)-1]), headPhiMin), headPhiMax)
	best := 0
	for i, v := range line {
		if math.Abs(v-target) < math.Abs(line[best]-target)-1e-9 {
			best = i
		}
	}
	return best
}

// PointID names a condition: equivalence ratio with at least three
// decimals, temperature in K with at least one, pressure in Pa with none,
// each with more decimals when needed to tell the value apart
// (phi0.800_T298.0_P101325).
func PointID(c study.Condition) string {
	return "phi" + shortest(c.Phi, 3) + "_T" + shortest(c.T, 1) + "_P" + shortest(c.P, 0)
}

// shortest formats v with at least min decimals and as many more (up to 12)
// as needed for the text to read back within 1e-12 relative.
func shortest(v float64, min int) string {
	for d := min; d < 12; d++ {
		s := strconv.FormatFloat(v, 'f', d, 64)
		if back, err := strconv.ParseFloat(s, 64); err == nil && math.Abs(back-v) <= 1e-12*math.Abs(v) {
			return s
		}
	}
	return strconv.FormatFloat(v, 'f', 12, 64)
}

func (p *Plan) assignIDs() error {
	p.index = make(map[string]int, len(p.Points))
	for i := range p.Points {
		id := PointID(p.Points[i].Condition)
		if j, dup := p.index[id]; dup {
			return fmt.Errorf("sweep points %v and %v have the same name %s", p.Points[j].Condition, p.Points[i].Condition, id)
		}
		p.index[id] = i
		p.Points[i].ID = id
	}
	return nil
}

// Index returns the index of the point with that id.
func (p *Plan) Index(id string) (int, bool) {
	i, ok := p.index[id]
	return i, ok
}

// Shard is one of Count deterministic slices of a sweep; chains are never
// split, so every point's neighbour is solved in the same shard. The zero
// value and {0, 1} are the whole sweep.
type Shard struct {
	Index int `json:"index"`
	Count int `json:"count"`
}

// ParseShard reads "I/N" (0 <= I < N), as given to --shard.
func ParseShard(s string) (Shard, error) {
	a, b, ok := strings.Cut(strings.TrimSpace(s), "/")
	i, err1 := strconv.Atoi(strings.TrimSpace(a))
	n, err2 := strconv.Atoi(strings.TrimSpace(b))
	if !ok || err1 != nil || err2 != nil {
		return Shard{}, fmt.Errorf("shard %q: write it as I/N, e.g. 0/4 for the first of four shards", s)
	}
	sh := Shard{Index: i, Count: n}
	if err := sh.check(); err != nil {
		return Shard{}, err
	}
	return sh, nil
}

func (s Shard) normal() Shard {
	if s.Count == 0 {
		return Shard{0, 1}
	}
	return s
}

func (s Shard) check() error {
	if s.Count < 1 || s.Index < 0 || s.Index >= s.Count {
		return fmt.Errorf("shard %d/%d: the index counts from 0 and must be below the number of shards", s.Index, s.Count)
	}
	return nil
}

func (s Shard) String() string {
	s = s.normal()
	return fmt.Sprintf("%d/%d", s.Index, s.Count)
}

// ShardOfChain returns the shard that solves chain c: chains are dealt out
// in table order, c mod Count, so that the chains at the costly high
// pressures spread over all shards.
func ShardOfChain(c, count int) int { return c % count }

// ShardPoints returns the indices of the points in a shard, in table order.
// A sweep with fewer chains than shards cannot be split that finely.
func (p *Plan) ShardPoints(s Shard) ([]int, error) {
	s = s.normal()
	if err := s.check(); err != nil {
		return nil, err
	}
	if s.Count > len(p.Chains) {
		return nil, fmt.Errorf("shard %v: this sweep has %d continuation chain(s) (one per %s), so it splits into at most %d shard(s)",
			s, len(p.Chains), p.otherVariables(), len(p.Chains))
	}
	var out []int
	for i, pt := range p.Points {
		if ShardOfChain(pt.Chain, s.Count) == s.Index {
			out = append(out, i)
		}
	}
	return out, nil
}

func (p *Plan) otherVariables() string {
	var names []string
	for _, v := range []Variable{EquivalenceRatio, Temperature, Pressure} {
		if v != p.Along {
			names = append(names, strings.ReplaceAll(v.Key(), "_", " "))
		}
	}
	return strings.Join(names, "-")
}

// Ancestors returns point i's ancestors along its chain, nearest first.
func (p *Plan) Ancestors(i int) []int {
	var out []int
	for a := p.Points[i].Parent; a >= 0; a = p.Points[a].Parent {
		out = append(out, a)
	}
	return out
}

// depths returns, for every point, the length of the longest path of
// descendants below it: the work that waits on it. The scheduler starts the
// deepest ready point first.
func (p *Plan) depths() []int {
	d := make([]int, len(p.Points))
	for _, chain := range p.Chains {
		// Members are listed parents before children; walk backwards.
		for k := len(chain) - 1; k >= 0; k-- {
			i := chain[k]
			if par := p.Points[i].Parent; par >= 0 && d[i]+1 > d[par] {
				d[par] = d[i] + 1
			}
		}
	}
	return d
}

// sortedKeys returns a map's keys in order (for stable messages).
func sortedKeys[V any](m map[string]V) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}
