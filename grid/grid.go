// Package grid adapts a 1-D mesh to the solution of a two-point
// boundary-value problem. It knows nothing of the physics: it sees a strictly
// increasing grid x (m) and a point-major solution u, u[j*block+c] being
// component c at point j, and decides where points are added or removed so
// that every tested component is resolved to the limits set in Criteria.
//
// Three tests mark intervals for splitting (for tested component c with range
// R_c = max_j u_c,j - min_j u_c,j over the whole domain):
//
//	slope:      |u_c,j+1 - u_c,j|   <= MaxChange * R_c                      interval j
//	curvature:  |s_c,j - s_c,j-1|   <= MaxGradientChange * (max_j s_c,j - min_j s_c,j)  point j
//	ratio:      h_j / h_j±1         <= MaxSpacingRatio                            neighbours
//
// with h_j = x_j+1 - x_j and s_c,j = (u_c,j+1 - u_c,j)/h_j the slope of
// interval j. The slope and curvature tests are the adaptive-grid criteria
// for flames of Smooke (1982, J. Comput. Phys. 48, 72-105; from memory),
// which equidistribute the change of the solution and of its slope over the
// intervals. The bound on neighbouring interval sizes keeps the three-point
// difference formulas of a solver on the grid close to their uniform-grid
// accuracy.
package grid

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"
)

// ErrTooManyPoints is returned (wrapped) by Analyse and Refine when the
// refined grid would hold more than Criteria.MaxPoints points.
var ErrTooManyPoints = errors.New("grid: too many points")

// Criteria sets how finely a solution is resolved. Messages name each
// field by its case-file key ([grid] max_change, max_gradient_change,
// max_spacing_ratio, removal_margin, max_points). MaxChange, MaxGradientChange and RemovalMargin are
// dimensionless fractions; MinRange is in the units of the solution
// components.
type Criteria struct {
	// MaxSpacingRatio is the largest allowed ratio of neighbouring interval sizes (> 1).
	MaxSpacingRatio float64
	// MaxChange is the largest allowed |u_j+1 - u_j| of a tested component, as a
	// fraction of that component's range over the domain, in (0, 1].
	MaxChange float64
	// MaxGradientChange is the largest allowed change of slope between neighbouring
	// intervals, as a fraction of the range of the slope over the domain, in
	// (0, 1].
	MaxGradientChange float64
	// RemovalMargin, if > 0, lets Analyse remove points where every test still holds
	// with RemovalMargin times its limit after the removal; in [0, 1). Points next to
	// an interval refined in the same call are never removed. 0 turns pruning
	// off.
	RemovalMargin float64
	// MaxPoints is the largest number of points refinement may produce;
	// 0 means no limit.
	MaxPoints int
	// MinRange is the smallest range (absolute, in the component's unit) a
	// component must span over the domain to be tested; flatter components,
	// such as trace species, are ignored.
	MinRange float64
}

// DefaultCriteria returns criteria suited to a premixed flame solved for
// temperature and mass fractions: a change of at most 5% of the range per
// interval, 10% of the slope range per point, neighbouring intervals within a
// factor 2.5, no pruning, at most 2000 points, and components with a range
// below 1e-9 left untested (values in the range used by flame codes; common
// practice, no source).
func DefaultCriteria() Criteria {
	return Criteria{MaxSpacingRatio: 2.5, MaxChange: 0.05, MaxGradientChange: 0.1, RemovalMargin: 0, MaxPoints: 2000, MinRange: 1e-9}
}

func (c Criteria) validate() error {
	switch {
	case !(c.MaxSpacingRatio > 1) || math.IsInf(c.MaxSpacingRatio, 0):
		return fmt.Errorf("grid: max_spacing_ratio = %g, want a finite value > 1", c.MaxSpacingRatio)
	case !(c.MaxChange > 0 && c.MaxChange <= 1):
		return fmt.Errorf("grid: max_change = %g, want a fraction in (0, 1]", c.MaxChange)
	case !(c.MaxGradientChange > 0 && c.MaxGradientChange <= 1):
		return fmt.Errorf("grid: max_gradient_change = %g, want a fraction in (0, 1]", c.MaxGradientChange)
	case !(c.RemovalMargin >= 0 && c.RemovalMargin < 1):
		return fmt.Errorf("grid: removal_margin = %g, want a fraction in [0, 1) (0 = off)", c.RemovalMargin)
	case c.MaxPoints < 0:
		return fmt.Errorf("grid: max_points = %d, want >= 0 (0 = no limit)", c.MaxPoints)
	case !(c.MinRange >= 0) || math.IsInf(c.MinRange, 0):
		return fmt.Errorf("grid: smallest tested range = %g, want a finite value >= 0", c.MinRange)
	}
	return nil
}

// Plan lists the changes Analyse decided for a grid of n points. Indices
// refer to that grid.
type Plan struct {
	// Insert lists, in ascending order, the interval (x_j, x_j+1) of each
	// point to add; len(Insert) is the number of points added. An interval
	// listed once is split at its midpoint unless At says otherwise; one
	// listed m times receives m points (Analyse does this only where a
	// single split cannot meet the MaxSpacingRatio bound).
	Insert []int
	// At, if it has the length of Insert, gives the position of each added
	// point as a fraction of its interval, in (0, 1) and increasing within an
	// interval: x = x_j + At[i]*(x_j+1 - x_j). Analyse always fills it. If
	// At is nil, an interval listed m times is divided into m+1 equal parts.
	At []float64
	// Remove lists, in ascending order and without repetition, points to
	// drop. Analyse never lists an end point, a kept point, or a point next
	// to an interval it splits.
	Remove []int
}

// Empty reports whether the plan changes nothing.
func (p Plan) Empty() bool { return len(p.Insert) == 0 && len(p.Remove) == 0 }

// Tolerances of the analysis. ratioTol absorbs the rounding of interval
// sizes recomputed from coordinates after Apply (relative error about
// eps*|x|/h), so that an applied plan is a fixed point. flatTol is the
// roundoff floor, relative to the largest magnitude of a component, below
// which its range or slope range is treated as zero: differences that small
// are rounding noise, and testing them would refine forever.
const (
	ratioTol = 1e-6
	flatTol  = 1e4 * 0x1p-52
	// hardPointLimit stops the ratio enforcement when MaxPoints is 0 (no
	// limit) and a MaxSpacingRatio close to 1 meets a badly graded grid.
	hardPointLimit = 1 << 22
)

// Analyse decides where the grid x (strictly increasing, m) must be refined
// or may be coarsened for the point-major solution u (len(u) = len(x)*block).
//
// components lists the block components tested (nil = all). keep lists
// positions that must never be removed; a point is kept when it lies within
// 1e-12 of the domain length of a keep position (positions matching no point
// protect nothing).
//
// Marking: an interval failing the slope test of any tested component is
// split at its midpoint; a point failing the curvature test has both of its
// intervals split. Then, since splits create new neighbour ratios, points
// are added until every pair of neighbouring intervals of the planned grid
// satisfies the MaxSpacingRatio bound, cascading as far as needed:
//
//   - MaxSpacingRatio >= 2: an interval larger than MaxSpacingRatio times a neighbour is
//     bisected, recursively, so new points are graded geometrically (factor
//     2) toward the finer neighbour; a mismatch h/h_nb costs about
//     log2(h/(MaxSpacingRatio*h_nb)) points.
//   - MaxSpacingRatio < 2, where bisection cannot always meet the bound: each interval
//     is divided into the least number of equal parts meeting it, found by
//     monotone iteration (counts only grow and a uniformly fine grid is a
//     solution); a mismatch costs about h/(MaxSpacingRatio*h_nb) points.
//
// If the input grid already satisfies the bound, both add at most one point
// per interval, at its midpoint.
//
// Pruning (Criteria.RemovalMargin > 0), done after marking and ratio enforcement,
// walks the interior points left to right and removes point j when j is
// neither an end point nor kept, neither of its intervals nor the intervals
// beside them is split, the previous point was not removed, and on the grid
// without j the merged interval satisfies the slope and curvature tests with
// limits scaled by RemovalMargin and the MaxSpacingRatio bound against its neighbours. Since
// RemovalMargin < 1, a pruned grid passes the next analysis unchanged unless the
// solution changes.
//
// A component is tested only if its range exceeds MinRange and the roundoff
// floor 1e4*eps*max|u_c|; its curvature only if the slope range exceeds
// 1e4*eps*max|u_c|/min h.
//
// Errors: bad sizes, fewer than 2 points, NaN or infinite values, x not
// strictly increasing, component indices out of range, invalid criteria, and
// intervals too small to split in float64 are reported. If the plan inserts
// points and the resulting count would exceed MaxPoints (> 0), the error
// wraps ErrTooManyPoints, names the counts and what to loosen, and Plan is
// zero.
// The result depends only on the arguments.
func Analyse(x, u []float64, block int, components []int, keep []float64, c Criteria) (Plan, error) {
	if err := c.validate(); err != nil {
		return Plan{}, err
	}
	if err := checkGrid(x, u, block); err != nil {
		return Plan{}, err
	}
	comps, err := testedComponents(components, block)
	if err != nil {
		return Plan{}, err
	}
	n := len(x)
	h := make([]float64, n-1)
	hmin := math.Inf(1)
	for j := range h {
		h[j] = x[j+1] - x[j]
		hmin = math.Min(hmin, h[j])
	}

	a := analysis{x: x, u: u, h: h, block: block, split: make([]int, n-1)}
	for _, comp := range comps {
		if s, ok := a.scales(comp, hmin, c); ok {
			a.tested = append(a.tested, s)
		}
	}
	for _, s := range a.tested {
		a.markSlope(s, c.MaxChange)
		a.markCurvature(s, c.MaxGradientChange)
	}
	// The ratio enforcement stops well past MaxPoints, so that the error
	// below can report the exact count in ordinary cases.
	limit := hardPointLimit
	if c.MaxPoints > 0 {
		limit = min(limit, 2*max(c.MaxPoints, n))
	}
	if !a.enforceRatio(c.MaxSpacingRatio, limit) {
		return Plan{}, fmt.Errorf("%w: refinement needs more than %d points (%d now) to meet max_spacing_ratio = %g; raise [grid] max_points (%d), loosen max_change (%g) / max_gradient_change (%g), or start from a better graded grid",
			ErrTooManyPoints, limit, n, c.MaxSpacingRatio, c.MaxPoints, c.MaxChange, c.MaxGradientChange)
	}
	var remove []int
	if c.RemovalMargin > 0 {
		remove = a.prune(keptPoints(x, keep), c)
	}

	var insert []int
	var at []float64
	for j, cuts := range a.cuts {
		prev := x[j]
		for _, t := range cuts {
			// The same expression as in Apply, so the check holds there.
			xt := x[j] + t*(x[j+1]-x[j])
			if !(xt > prev && xt < x[j+1]) {
				return Plan{}, fmt.Errorf("grid: cannot refine interval %d [%.17g, %.17g]: new points would coincide in float64; the solution varies on a scale below the resolution of x",
					j, x[j], x[j+1])
			}
			prev = xt
			insert = append(insert, j)
			at = append(at, t)
		}
	}
	if newN := n + len(insert) - len(remove); len(insert) > 0 && c.MaxPoints > 0 && newN > c.MaxPoints {
		return Plan{}, fmt.Errorf("%w: refinement needs %d points (%d now, +%d, -%d), more than max_points = %d; raise [grid] max_points or loosen max_change (%g) / max_gradient_change (%g)",
			ErrTooManyPoints, newN, n, len(insert), len(remove), c.MaxPoints, c.MaxChange, c.MaxGradientChange)
	}
	return Plan{Insert: insert, At: at, Remove: remove}, nil
}

// checkGrid validates sizes and values of a grid and its solution.
func checkGrid(x, u []float64, block int) error {
	if block < 1 {
		return fmt.Errorf("grid: block size %d, want >= 1", block)
	}
	if len(x) < 2 {
		return fmt.Errorf("grid: %d points, need at least 2", len(x))
	}
	if len(u) != len(x)*block {
		return fmt.Errorf("grid: len(u) = %d, want len(x)*block = %d*%d = %d", len(u), len(x), block, len(x)*block)
	}
	for j, xj := range x {
		if math.IsNaN(xj) || math.IsInf(xj, 0) {
			return fmt.Errorf("grid: x[%d] = %g is not finite", j, xj)
		}
		if j > 0 && !(xj > x[j-1]) {
			return fmt.Errorf("grid: x not strictly increasing: x[%d] = %g, x[%d] = %g", j-1, x[j-1], j, xj)
		}
	}
	for i, v := range u {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("grid: solution not finite at point %d, component %d: %g", i/block, i%block, v)
		}
	}
	return nil
}

// testedComponents returns the sorted, distinct component indices to test.
func testedComponents(components []int, block int) ([]int, error) {
	if components == nil {
		all := make([]int, block)
		for c := range all {
			all[c] = c
		}
		return all, nil
	}
	seen := make(map[int]bool, len(components))
	var out []int
	for _, c := range components {
		if c < 0 || c >= block {
			return nil, fmt.Errorf("grid: component %d out of range [0, %d)", c, block)
		}
		if !seen[c] {
			seen[c] = true
			out = append(out, c)
		}
	}
	sort.Ints(out)
	return out, nil
}

// keptPoints marks the points lying within 1e-12 of the domain length of a
// keep position. NaN positions match nothing.
func keptPoints(x, keep []float64) []bool {
	kept := make([]bool, len(x))
	tol := 1e-12 * (x[len(x)-1] - x[0])
	for _, xk := range keep {
		j := sort.SearchFloat64s(x, xk-tol)
		for ; j < len(x) && x[j] <= xk+tol; j++ {
			kept[j] = true
		}
	}
	return kept
}

// analysis is the working state of one Analyse call.
type analysis struct {
	x, u, h []float64
	block   int
	split   []int       // points to insert in each interval
	cuts    [][]float64 // their positions, fractions of the interval
	tested  []scale
}

// scale holds the limits of one tested component.
type scale struct {
	comp       int
	rangeU     float64 // max - min of the component
	rangeSlope float64 // max - min of its interval slopes; 0 = curvature untested
}

func (a *analysis) value(j, comp int) float64 { return a.u[j*a.block+comp] }

func (a *analysis) slope(j, comp int) float64 {
	return (a.value(j+1, comp) - a.value(j, comp)) / a.h[j]
}

// scales measures a component and reports whether it is tested.
func (a *analysis) scales(comp int, hmin float64, c Criteria) (scale, bool) {
	n := len(a.x)
	lo, hi, big := math.Inf(1), math.Inf(-1), 0.0
	for j := 0; j < n; j++ {
		v := a.value(j, comp)
		lo, hi = math.Min(lo, v), math.Max(hi, v)
		big = math.Max(big, math.Abs(v))
	}
	s := scale{comp: comp, rangeU: hi - lo}
	if !(s.rangeU > c.MinRange) || s.rangeU <= flatTol*big {
		return s, false
	}
	slo, shi := math.Inf(1), math.Inf(-1)
	for j := range a.h {
		sj := a.slope(j, comp)
		slo, shi = math.Min(slo, sj), math.Max(shi, sj)
	}
	if shi-slo > flatTol*big/hmin {
		s.rangeSlope = shi - slo
	}
	return s, true
}

func (a *analysis) markSlope(s scale, frac float64) {
	lim := frac * s.rangeU
	for j := range a.h {
		if math.Abs(a.value(j+1, s.comp)-a.value(j, s.comp)) > lim {
			a.split[j] = 1
		}
	}
}

func (a *analysis) markCurvature(s scale, frac float64) {
	if s.rangeSlope == 0 {
		return
	}
	lim := frac * s.rangeSlope
	prev := a.slope(0, s.comp)
	for j := 1; j < len(a.h); j++ {
		sj := a.slope(j, s.comp)
		if math.Abs(sj-prev) > lim {
			a.split[j-1], a.split[j] = 1, 1
		}
		prev = sj
	}
}

// enforceRatio adds points until neighbouring intervals of the planned grid
// satisfy the MaxSpacingRatio bound (see Analyse), filling a.cuts and a.split. It
// reports false if that needs more than limit points.
func (a *analysis) enforceRatio(ratio float64, limit int) bool {
	r := ratio * (1 + ratioTol)
	a.cuts = make([][]float64, len(a.h))
	ok := false
	if ratio >= 2 {
		ok = a.bisect(r, limit)
	} else {
		ok = a.equalParts(r, limit)
	}
	for j, c := range a.cuts {
		a.split[j] = len(c)
	}
	return ok
}

// piece is a sub-interval of interval j of the analysed grid: fractions
// [t0, t0+w] of it.
type piece struct {
	j     int
	t0, w float64
}

// bisect halves pieces larger than r times a neighbour until none is, with
// alternating forward and backward sweeps; each sweep carries a cascade
// across the whole grid. It terminates for r >= 2: a piece is halved only
// when larger than 2 neighbours, so both halves are larger than the
// smallest piece, which never shrinks. Halving keeps t0 and w exact binary
// fractions. It reports false if the pieces would exceed limit points.
func (a *analysis) bisect(r float64, limit int) bool {
	size := func(p piece) float64 { return p.w * a.h[p.j] }
	var pieces []piece
	for j, m := range a.split {
		if m > 0 {
			pieces = append(pieces, piece{j, 0, 0.5}, piece{j, 0.5, 0.5})
		} else {
			pieces = append(pieces, piece{j, 0, 1})
		}
	}
	out := make([]piece, 0, len(pieces))
	var changed, full bool
	// push appends p to out, first halving it while it exceeds r times
	// the last piece of out; inner is the half next to that piece.
	var push func(p piece, forward bool)
	push = func(p piece, forward bool) {
		for len(out) > 0 && size(p) > r*size(out[len(out)-1]) && !full {
			lo, hi := piece{p.j, p.t0, p.w / 2}, piece{p.j, p.t0 + p.w/2, p.w / 2}
			if forward {
				push(lo, forward)
				p = hi
			} else {
				push(hi, forward)
				p = lo
			}
			changed = true
		}
		out = append(out, p)
		full = full || len(out)+len(a.x)-len(a.h) > limit
	}
	for {
		changed = false
		for _, forward := range []bool{true, false} {
			out = out[:0]
			if forward {
				for _, p := range pieces {
					push(p, true)
				}
			} else {
				for i := len(pieces) - 1; i >= 0; i-- {
					push(pieces[i], false)
				}
				slices.Reverse(out)
			}
			if full {
				return false
			}
			pieces, out = out, pieces
		}
		if !changed {
			break
		}
	}
	for _, p := range pieces {
		if p.t0 > 0 {
			a.cuts[p.j] = append(a.cuts[p.j], p.t0)
		}
	}
	return true
}

// equalParts raises the number of equal parts of each interval until
// neighbouring parts satisfy the bound r, by monotone iteration: the counts
// only grow, and a uniformly fine grid satisfies any r > 1, so the least
// solution is reached. It reports false if the counts would exceed limit
// points.
func (a *analysis) equalParts(r float64, limit int) bool {
	parts := make([]int, len(a.h))
	total := len(a.x)
	for j, m := range a.split {
		parts[j] = m + 1
		total += m
	}
	sub := func(j int) float64 { return a.h[j] / float64(parts[j]) }
	for changed := true; changed; {
		changed = false
		for dir := 0; dir < 2; dir++ {
			for k := 0; k+1 < len(a.h); k++ {
				j, nb := k, k+1
				if dir == 1 {
					j, nb = len(a.h)-1-k, len(a.h)-2-k
				}
				lim := r * sub(nb)
				if sub(j) <= lim {
					continue
				}
				// The least count with h_j/count <= lim.
				need := math.Ceil(a.h[j] / lim)
				if need > float64(limit) {
					return false
				}
				m := int(need)
				if a.h[j]/float64(m) > lim {
					m++
				}
				total += m - parts[j]
				parts[j] = m
				changed = true
				if total > limit {
					return false
				}
			}
		}
	}
	for j, m := range parts {
		for i := 1; i < m; i++ {
			a.cuts[j] = append(a.cuts[j], float64(i)/float64(m))
		}
	}
	return true
}

// prune selects points to remove (see Analyse).
func (a *analysis) prune(kept []bool, c Criteria) []int {
	n := len(a.x)
	r := c.MaxSpacingRatio
	var remove []int
	removedPrev := false
	for j := 1; j+1 < n; j++ {
		if removedPrev {
			removedPrev = false
			continue
		}
		if kept[j] || a.split[j-1] > 0 || a.split[j] > 0 {
			continue
		}
		// Point before j-1 on the pruned grid, and the final size of the
		// interval ending at j-1.
		pp, leftSize := -1, 0.0
		if j >= 2 {
			pp = j - 2
			leftSize = a.h[j-2]
			if len(remove) > 0 && remove[len(remove)-1] == j-2 {
				pp = j - 3
				leftSize = a.x[j-1] - a.x[j-3]
			} else if a.split[j-2] > 0 {
				continue
			}
		}
		if j+1 < n-1 && a.split[j+1] > 0 {
			continue
		}
		merged := a.x[j+1] - a.x[j-1]
		if pp >= 0 && (merged > r*leftSize || leftSize > r*merged) {
			continue
		}
		if j+1 < n-1 {
			right := a.h[j+1]
			if merged > r*right || right > r*merged {
				continue
			}
		}
		if a.prunable(j, pp, merged, c) {
			remove = append(remove, j)
			removedPrev = true
		}
	}
	return remove
}

// prunable reports whether every tested component meets the slope and
// curvature tests, scaled by RemovalMargin, on the merged interval (j-1, j+1) and
// at its ends; pp is the point before j-1 on the pruned grid (-1 if none).
func (a *analysis) prunable(j, pp int, merged float64, c Criteria) bool {
	n := len(a.x)
	for _, s := range a.tested {
		du := a.value(j+1, s.comp) - a.value(j-1, s.comp)
		if math.Abs(du) > c.RemovalMargin*c.MaxChange*s.rangeU {
			return false
		}
		if s.rangeSlope == 0 {
			continue
		}
		lim := c.RemovalMargin * c.MaxGradientChange * s.rangeSlope
		sm := du / merged
		if pp >= 0 {
			sl := (a.value(j-1, s.comp) - a.value(pp, s.comp)) / (a.x[j-1] - a.x[pp])
			if math.Abs(sm-sl) > lim {
				return false
			}
		}
		if j+2 < n {
			if math.Abs(a.slope(j+1, s.comp)-sm) > lim {
				return false
			}
		}
	}
	return true
}

// Apply returns the grid and solution with the plan carried out. A point
// added at fraction t of interval (x_j, x_j+1) (see Plan.At) is placed at
// x_j + t*(x_j+1 - x_j), and every component is linearly interpolated,
// u = u_j + t*(u_j+1 - u_j): linear profiles stay exact and no new extremum
// is created; the caller's solver then re-converges the values. Removed
// points are dropped with their values. The inputs are not modified. Apply
// panics if the plan does not fit the grid (indices out of range, At of the
// wrong length or not increasing in (0, 1) within an interval), which is a
// programming error: a plan from Analyse on the same grid always fits.
func (p Plan) Apply(x, u []float64, block int) (newX, newU []float64) {
	n := len(x)
	if block < 1 || len(u) != n*block {
		panic(fmt.Sprintf("grid: Plan.Apply: len(u) = %d, want len(x)*block = %d*%d", len(u), n, block))
	}
	if p.At != nil && len(p.At) != len(p.Insert) {
		panic(fmt.Sprintf("grid: Plan.Apply: %d positions for %d insertions", len(p.At), len(p.Insert)))
	}
	fracs := make([][]float64, n)
	for i, j := range p.Insert {
		if j < 0 || j >= n-1 {
			panic(fmt.Sprintf("grid: Plan.Apply: insert in interval %d, grid has %d intervals", j, n-1))
		}
		if p.At == nil {
			fracs[j] = append(fracs[j], 0)
			continue
		}
		t, f := p.At[i], fracs[j]
		if !(t > 0 && t < 1) || (len(f) > 0 && !(t > f[len(f)-1])) {
			panic(fmt.Sprintf("grid: Plan.Apply: position %g in interval %d not increasing in (0, 1)", t, j))
		}
		fracs[j] = append(f, t)
	}
	if p.At == nil {
		for _, f := range fracs {
			for i := range f {
				f[i] = float64(i+1) / float64(len(f)+1)
			}
		}
	}
	removed := make([]bool, n)
	nRemoved := 0
	for _, j := range p.Remove {
		if j < 0 || j >= n {
			panic(fmt.Sprintf("grid: Plan.Apply: remove point %d, grid has %d points", j, n))
		}
		if !removed[j] {
			removed[j] = true
			nRemoved++
		}
	}
	m := n + len(p.Insert) - nRemoved
	newX = make([]float64, 0, m)
	newU = make([]float64, 0, m*block)
	for j := 0; j < n; j++ {
		if !removed[j] {
			newX = append(newX, x[j])
			newU = append(newU, u[j*block:(j+1)*block]...)
		}
		for _, t := range fracs[j] {
			newX = append(newX, x[j]+t*(x[j+1]-x[j]))
			for c := 0; c < block; c++ {
				lo, hi := u[j*block+c], u[(j+1)*block+c]
				newU = append(newU, lo+t*(hi-lo))
			}
		}
	}
	return newX, newU
}

// Refine analyses the grid and applies the plan (see Analyse and
// Plan.Apply). changed reports whether the grid changed. When it did not, or
// on error, the input slices themselves are returned.
func Refine(x, u []float64, block int, components []int, keep []float64, c Criteria) (newX, newU []float64, changed bool, err error) {
	return c.Refine(x, u, block, components, keep)
}

// Refine is the function Refine with c as its criteria; it lets Criteria
// serve where a solver takes any refinement rule.
func (c Criteria) Refine(x, u []float64, block int, components []int, keep []float64) (newX, newU []float64, changed bool, err error) {
	p, err := Analyse(x, u, block, components, keep, c)
	if err != nil {
		return x, u, false, err
	}
	if p.Empty() {
		return x, u, false, nil
	}
	newX, newU = p.Apply(x, u, block)
	return newX, newU, true, nil
}
