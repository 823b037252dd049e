package sweep

import (
	"math"

	"flame1d/casefile"
	"flame1d/flame"
	"flame1d/study"
)

// Step-size control along a chain. Natural-parameter continuation converges
// fastest with steps matched to how hard the solution changes (Allgower &
// Georg 1990, "Numerical Continuation Methods", ch. 6; Deuflhard 2004,
// "Newton Methods for Nonlinear Problems", sec. 5.1): a continuation solve
// that needed pseudo-time stepping halves the step for the next one; one
// that converged in a few Newton iterations without it doubles the step.
// When the recommended step is shorter than the distance to the next point
// of the chain, the walk solves intermediate conditions on the way; they
// serve as starts only and are not reported. A failed step is retried at
// half the size, down to minStepFraction of the distance.
const (
	easyIterations  = 25
	minStepFraction = 1.0 / 8
)

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
	iterations int     // Newton iterations of all solves
	nextStep   float64 // recommended step from the point on
	err        error
}

// walk continues from start (the solved condition from) to the point's
// condition along the chain variable, with the step recommended by the
// start's solve (0: the whole distance at once).
func walk(solver PointSolver, along Variable, target, from study.Condition, start *flame.Solution, step float64) walkResult {
	x0, x1 := along.coord(along.of(from)), along.coord(along.of(target))
	dist := math.Abs(x1 - x0)
	sign := 1.0
	if x1 < x0 {
		sign = -1
	}
	h := dist
	if step > 0 && step < dist {
		h = step
	}
	hMin := math.Min(h, minStepFraction*dist)
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
			if h/2 < hMin*(1-1e-9) {
				w.err = err
				return w
			}
			h /= 2
			continue
		}
		w.iterations += out.Summary.NewtonIterations
		switch {
		case out.Solution.Stats.TimeSteps > 0:
			h = math.Max(h/2, hMin)
		case out.Summary.NewtonIterations <= easyIterations:
			h *= 2
		}
		if last {
			w.res, w.cold, w.nextStep = out, cold, h
			return w
		}
		w.steps = append(w.steps, along.of(cond))
		cur, x = out.Solution, next
	}
}
