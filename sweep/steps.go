package sweep

import (
	"math"

	"flame1d/casefile"
	"flame1d/flame"
	"flame1d/study"
)

// When continuation from the nearest solved neighbour fails (and so does
// the cold start Study.Solve falls back to), the step is retried at half the
// size through an intermediate condition, down to minStepFraction of the
// distance: natural-parameter continuation with step halving (Allgower &
// Georg 1990, "Numerical Continuation Methods", ch. 6). Intermediate
// conditions serve as starts only and are not reported. Every failed solve
// costs a cold start too, so the halving stops at a quarter of the step:
// a point beyond the flammability limit must not cost dozens of solves.
//
// Step-size control that also shortened steps after a hard solve (one that
// needed pseudo-time stepping) was tried on the CH4/air GRI-Mech 3.0 sweep
// of bench_test.go and made it slower: the shorter rich-side steps were no
// easier for the solver. Steps are therefore the chain's own unless one
// fails.
const minStepFraction = 1.0 / 4

// coord maps a chain variable to the coordinate steps are measured in: the
// value itself, or ln P for pressure, whose effects scale with its ratio.
func (v Variable) coord(x float64) float64 {
	if v == Pressure {
		return math.Log(x)
	}
	return x
}

func (v Variable) uncoord(u float64) float64 {
	if v == Pressure {
		return math.Exp(u)
	}
	return u
}

func (v Variable) with(c study.Condition, x float64) study.Condition {
	switch v {
	case Temperature:
		c.T = x
	case Pressure:
		c.P = x
	default:
		c.Phi = x
	}
	return c
}

// walkResult is the outcome of one attempt to continue to a point.
type walkResult struct {
	res *study.Result
	// cold: the final solve fell back to a cold start.
	cold bool
	// triedCold: some solve of the walk tried a cold start.
	triedCold bool
	// steps are the intermediate values of the chain variable solved on
	// the way.
	steps      []float64
	iterations int // Newton iterations of all successful solves
	err        error
}

// walk continues from start (the solved condition from) to the point's
// condition along the chain variable; with halve, it halves the step after
// a failure.
func walk(solver PointSolver, along Variable, target, from study.Condition, start *flame.Solution, halve bool) walkResult {
	x0, x1 := along.coord(along.of(from)), along.coord(along.of(target))
	dist := math.Abs(x1 - x0)
	sign := 1.0
	if x1 < x0 {
		sign = -1
	}
	h := dist
	var w walkResult
	cur, x := start, x0
	for {
		next, last := x+sign*h, false
		if (x1-next)*sign <= 1e-9*dist {
			next, last = x1, true
		}
		cond := target
		if !last {
			cond = along.with(target, casefile.RoundSignificant(along.uncoord(next)))
		}
		out, cold, err := solver.Solve(cond, cur)
		w.triedCold = w.triedCold || cold
		if err != nil {
			if !halve || h/2 < minStepFraction*dist*(1-1e-9) {
				w.err = err
				return w
			}
			h /= 2
			continue
		}
		w.iterations += out.Summary.NewtonIterations
		if last {
			w.res, w.cold = out, cold
			return w
		}
		w.steps = append(w.steps, along.of(cond))
		cur, x = out.Solution, next
	}
}
