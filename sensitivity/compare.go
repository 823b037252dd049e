package sensitivity

import (
	"errors"
	"math"
	"sort"
)

// Pair is one reaction's rate-constant coefficient for two fuels, matched
// by equation; a reaction missing on one side has 0 there (the
// pseudo-fuel's cracking step exists only for the real fuel).
type Pair struct {
	Equation string
	A, B     float64
}

// Difference returns B - A.
func (p Pair) Difference() float64 { return p.B - p.A }

// Comparison sets two fuels' rate-constant sensitivities side by side.
type Comparison struct {
	// MostImportant are the reactions in the top n of either fuel, by the
	// larger magnitude of the two.
	MostImportant []Pair
	// MostDifferent are the n reactions whose coefficients differ most.
	MostDifferent []Pair
}

// Compare pairs the rate-constant coefficients of two analyses by equation
// and returns the n reactions that matter most for either fuel and the n
// whose coefficients differ most.
func Compare(a, b *Analysis, n int) (*Comparison, error) {
	if a == nil || b == nil {
		return nil, errNoSensitivity
	}
	index := map[string]int{}
	var pairs []Pair
	add := func(an *Analysis, first bool) {
		for _, c := range an.Coefficients {
			if c.Kind != RateConstant {
				continue
			}
			k := equationKey(c.Parameter)
			i, ok := index[k]
			if !ok {
				i = len(pairs)
				index[k] = i
				pairs = append(pairs, Pair{Equation: c.Parameter})
			}
			// Duplicate steps of one equation add: scaling all of them
			// scales the reaction.
			if first {
				pairs[i].A += c.Value
			} else {
				pairs[i].B += c.Value
			}
		}
	}
	add(a, true)
	add(b, false)
	top := func(key func(Pair) float64) []Pair {
		s := append([]Pair(nil), pairs...)
		sort.SliceStable(s, func(i, j int) bool { return key(s[i]) > key(s[j]) })
		return s[:min(n, len(s))]
	}
	return &Comparison{
		MostImportant: top(func(p Pair) float64 { return math.Max(math.Abs(p.A), math.Abs(p.B)) }),
		MostDifferent: top(func(p Pair) float64 { return math.Abs(p.Difference()) }),
	}, nil
}

// errNoSensitivity is returned by Compare when a side has no analysis.
var errNoSensitivity = errors.New("compare sensitivities: a fuel has no sensitivity analysis")
