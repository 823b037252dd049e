package casefile

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"flame1d/internal/tomlpos"
	"flame1d/units"
)

// SweepSettings mirror the [sweep] table: the values taken by each swept
// variable, sorted ascending and free of repeats. A variable the table does
// not mention holds the single value of [mixture]. Documented in
// docs/sweeps.md.
type SweepSettings struct {
	EquivalenceRatio []float64 // -
	Temperature      []float64 // unburned, K
	Pressure         []float64 // Pa
	// ContinueAlong names the variable along which continuation chains
	// run: "equivalence_ratio", "temperature", "pressure", or "" to let the
	// sweep choose (the equivalence ratio when it takes several values).
	ContinueAlong string
}

// Sweep variable keys, as written in the [sweep] table.
const (
	SweepEquivalenceRatio = "equivalence_ratio"
	SweepTemperature      = "temperature"
	SweepPressure         = "pressure"
)

// Bounds on the size of a sweep: a typing slip such as step = 1e-6 must not
// start a run of millions of flames.
const (
	maxSweepValues = 1000
	maxSweepPoints = 100000
)

// rawSweep is the [sweep] table as decoded.
type rawSweep struct {
	EquivalenceRatio *sweepValue `toml:"equivalence_ratio"`
	Temperature      *sweepValue `toml:"temperature"`
	Pressure         *sweepValue `toml:"pressure"`
	ContinueAlong    string      `toml:"continue_along"`
}

// sweepValue keeps a swept variable's TOML value as written: a number, a
// string with units, a list of those, or a range table. Decoding it through
// UnmarshalTOML marks the keys of a range table as known to the decoder; they
// are checked here instead.
type sweepValue struct{ v any }

func (s *sweepValue) UnmarshalTOML(v any) error {
	s.v = v
	return nil
}

// sweepVariable describes how one swept variable is read and bounded.
type sweepVariable struct {
	key       string
	dim       units.Dimension
	unitless  bool
	valid     func(v float64) bool // the same bounds as [mixture]
	rangeText string
}

var sweepVariables = []sweepVariable{
	{key: SweepEquivalenceRatio, unitless: true, valid: func(v float64) bool { return v > 0 && v < 100 },
		rangeText: "must be positive and below 100"},
	{key: SweepTemperature, dim: units.Temperature, valid: func(v float64) bool { return v > 150 && v < 2000 },
		rangeText: "unburned temperature must lie in 150-2000 K"},
	{key: SweepPressure, dim: units.Pressure, valid: func(v float64) bool { return v >= 100 && v <= 1e8 },
		rangeText: "pressure must lie in 100 Pa - 100 MPa"},
}

// parseSweep checks the [sweep] table and expands its lists and ranges; it
// returns nil when the case has no [sweep] table.
func parseSweep(rs *rawSweep, c *Case, src []byte, file string) (*SweepSettings, error) {
	if rs == nil {
		return nil, nil
	}
	fe := keyErrors(src, file)
	s := &SweepSettings{ContinueAlong: rs.ContinueAlong}
	given := map[string]*sweepValue{
		SweepEquivalenceRatio: rs.EquivalenceRatio, SweepTemperature: rs.Temperature, SweepPressure: rs.Pressure,
	}
	base := map[string]float64{
		SweepEquivalenceRatio: c.EquivalenceRatio, SweepTemperature: c.Temperature, SweepPressure: c.Pressure,
	}
	dest := map[string]*[]float64{
		SweepEquivalenceRatio: &s.EquivalenceRatio, SweepTemperature: &s.Temperature, SweepPressure: &s.Pressure,
	}
	switch s.ContinueAlong {
	case "", SweepEquivalenceRatio, SweepTemperature, SweepPressure:
	default:
		return nil, fe("sweep.continue_along", "%q is not a swept variable: use %q, %q or %q",
			s.ContinueAlong, SweepEquivalenceRatio, SweepTemperature, SweepPressure)
	}
	swept := 0
	total := 1
	for _, sv := range sweepVariables {
		key := "sweep." + sv.key
		vals := []float64{base[sv.key]}
		if g := given[sv.key]; g != nil {
			var err error
			if vals, err = sv.expand(g.v); err != nil {
				return nil, fe(key, "%v", err)
			}
			for _, v := range vals {
				if !sv.valid(v) {
					return nil, fe(key, "value %g: %s", v, sv.rangeText)
				}
			}
			if len(vals) > maxSweepValues {
				return nil, fe(key, "%d values; at most %d per variable (check the step or count)", len(vals), maxSweepValues)
			}
			sort.Float64s(vals)
			for i := 1; i < len(vals); i++ {
				if vals[i] == vals[i-1] {
					return nil, fe(key, "value %g is listed twice", vals[i])
				}
			}
			swept++
		}
		*dest[sv.key] = vals
		total *= len(vals)
	}
	if swept == 0 {
		return nil, fe("sweep", "the table sweeps nothing: give equivalence_ratio, temperature or pressure as a list or a range, "+
			"e.g. equivalence_ratio = { from = 0.6, to = 1.4, step = 0.1 }")
	}
	if total > maxSweepPoints {
		return nil, fe("sweep", "%d conditions; at most %d in one sweep (split it into several case files)", total, maxSweepPoints)
	}
	return s, nil
}

// expand turns one written value, list or range into values in SI units.
func (sv sweepVariable) expand(v any) ([]float64, error) {
	switch x := v.(type) {
	case []any:
		if len(x) == 0 {
			return nil, fmt.Errorf("empty list")
		}
		out := make([]float64, len(x))
		for i, e := range x {
			f, err := sv.scalar(e)
			if err != nil {
				return nil, fmt.Errorf("item %d: %v", i+1, err)
			}
			out[i] = f
		}
		return out, nil
	case map[string]any:
		return sv.expandRange(x)
	default:
		f, err := sv.scalar(x)
		if err != nil {
			return nil, err
		}
		return []float64{f}, nil
	}
}

// scalar converts a number (SI) or a string with units.
func (sv sweepVariable) scalar(v any) (float64, error) {
	var f float64
	switch x := v.(type) {
	case int64:
		f = float64(x)
	case float64:
		f = x
	case string:
		if sv.unitless {
			return 0, fmt.Errorf("%q: the equivalence ratio is a plain number, written without quotes", x)
		}
		var err error
		if f, err = units.Parse(x, sv.dim); err != nil {
			return 0, err
		}
	default:
		return 0, fmt.Errorf("expected a number, a string with units, a list or a range table, got %s", tomlpos.TypeName(v))
	}
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return 0, fmt.Errorf("%v is not a finite number", v)
	}
	return RoundSignificant(f), nil
}

// expandRange reads { from, to, step } or { from, to, count [, spacing] }.
// With a step the values are from, from+step, ... up to the last not beyond
// to; with a count they are count values from from to to inclusive, equally
// spaced (spacing = "linear", the default) or in geometric progression
// (spacing = "log").
func (sv sweepVariable) expandRange(t map[string]any) ([]float64, error) {
	allowed := map[string]bool{"from": true, "to": true, "step": true, "count": true, "spacing": true}
	keys := make([]string, 0, len(t))
	for k := range t {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		if !allowed[k] {
			return nil, fmt.Errorf("unknown range key %q (a range has from, to and either step or count, optionally spacing)", k)
		}
	}
	from, err := sv.rangeEnd(t, "from")
	if err != nil {
		return nil, err
	}
	to, err := sv.rangeEnd(t, "to")
	if err != nil {
		return nil, err
	}
	if to < from {
		return nil, fmt.Errorf("range runs backwards: to (%g) is below from (%g)", to, from)
	}
	stepV, hasStep := t["step"]
	countV, hasCount := t["count"]
	if hasStep == hasCount {
		return nil, fmt.Errorf("a range needs exactly one of step or count")
	}
	spacing := "linear"
	if sp, ok := t["spacing"]; ok {
		s, isStr := sp.(string)
		if !isStr || (s != "linear" && s != "log") {
			return nil, fmt.Errorf(`spacing must be "linear" or "log"`)
		}
		spacing = s
	}
	if hasStep {
		if spacing != "linear" {
			return nil, fmt.Errorf(`spacing = "log" needs count, not step`)
		}
		step, err := sv.stepSize(stepV)
		if err != nil {
			return nil, err
		}
		n := math.Floor((to-from)/step + 1e-9)
		if n+1 > maxSweepValues {
			return nil, fmt.Errorf("step %g from %g to %g gives %s values; at most %d", step, from, to, countText(n+1), maxSweepValues)
		}
		out := make([]float64, 0, int(n)+1)
		for i := 0; i <= int(n); i++ {
			out = append(out, RoundSignificant(from+float64(i)*step))
		}
		return out, nil
	}
	count, ok := countV.(int64)
	if !ok || count < 1 {
		return nil, fmt.Errorf("count must be a positive whole number (got %v)", countV)
	}
	if count > maxSweepValues {
		return nil, fmt.Errorf("count %d; at most %d", count, maxSweepValues)
	}
	if count == 1 {
		if from != to {
			return nil, fmt.Errorf("count = 1 needs from = to (got %g and %g)", from, to)
		}
		return []float64{from}, nil
	}
	if spacing == "log" && !(from > 0) {
		return nil, fmt.Errorf(`spacing = "log" needs a positive from (got %g)`, from)
	}
	out := make([]float64, count)
	for i := range out {
		f := float64(i) / float64(count-1)
		if spacing == "log" {
			out[i] = RoundSignificant(from * math.Pow(to/from, f))
		} else {
			out[i] = RoundSignificant(from + f*(to-from))
		}
	}
	return out, nil
}

func (sv sweepVariable) rangeEnd(t map[string]any, key string) (float64, error) {
	v, ok := t[key]
	if !ok {
		return 0, fmt.Errorf("range needs %q", key)
	}
	f, err := sv.scalar(v)
	if err != nil {
		return 0, fmt.Errorf("%s: %v", key, err)
	}
	return f, nil
}

// stepSize reads a range step. A temperature step is a difference, so an
// offset unit ("50 C") converts by its scale alone.
func (sv sweepVariable) stepSize(v any) (float64, error) {
	step, err := sv.scalar(v)
	if err != nil {
		return 0, fmt.Errorf("step: %v", err)
	}
	if x, ok := v.(string); ok {
		// No unit name starts with a digit, sign, point or e/E.
		if unit := strings.TrimLeft(x, "0123456789.+-eE \t"); unit != "" {
			zero, err := units.Parse("0 "+unit, sv.dim)
			if err != nil {
				return 0, fmt.Errorf("step: %v", err)
			}
			step -= zero
		}
	}
	if !(step > 0) {
		return 0, fmt.Errorf("step must be positive (got %v)", v)
	}
	return step, nil
}

// countText writes a count a person can read: whole numbers up to a
// million, "about 1.2e+300" beyond.
func countText(n float64) string {
	if n < 1e6 {
		return strconv.FormatFloat(n, 'f', 0, 64)
	}
	return "about " + strconv.FormatFloat(n, 'g', 2, 64)
}

// RoundSignificant rounds to 12 significant digits, so that ranges built by
// repeated addition give the values a person would write (0.6 + 7*0.1 is
// 1.3, not 1.2999999999999998) and point names stay stable.
func RoundSignificant(v float64) float64 {
	r, err := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	if err != nil {
		return v
	}
	return r
}
