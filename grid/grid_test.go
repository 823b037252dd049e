package grid

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"slices"
	"strings"
	"testing"
)

// front is the test profile u = tanh((x - x0)/δ) on [0, 1] with x0 = 0.5 and
// δ = 0.01: a resolved front of width δ between two flat states, the shape
// of a flame temperature profile. Its derivatives are closed-form:
// u' = sech²(t)/δ, u” = -2 tanh(t) sech²(t)/δ², t = (x - x0)/δ.
const (
	frontX0    = 0.5
	frontWidth = 0.01
)

func front(x float64) float64 { return math.Tanh((x - frontX0) / frontWidth) }

func frontD1(x float64) float64 {
	c := math.Cosh((x - frontX0) / frontWidth)
	return 1 / (c * c * frontWidth)
}

func frontD2(x float64) float64 {
	t := (x - frontX0) / frontWidth
	c := math.Cosh(t)
	return -2 * math.Tanh(t) / (c * c * frontWidth * frontWidth)
}

func sample(f func(float64) float64, x []float64) []float64 {
	u := make([]float64, len(x))
	for j, v := range x {
		u[j] = f(v)
	}
	return u
}

// refineUntilFixed refines x for the exact profile f until Refine reports no
// change, re-evaluating f at every new point, and checks after every step
// that the grid is strictly increasing and meets the MaxSpacingRatio bound.
func refineUntilFixed(t *testing.T, f func(float64) float64, x []float64, c Criteria, maxIter int) []float64 {
	t.Helper()
	for it := 0; it < maxIter; it++ {
		nx, _, changed, err := Refine(x, sample(f, x), 1, nil, nil, c)
		if err != nil {
			t.Fatalf("refinement %d on %d points: %v", it, len(x), err)
		}
		if !changed {
			return x
		}
		checkStrict(t, nx)
		if r := maxNeighbourRatio(nx); r > c.MaxSpacingRatio*(1+ratioTol) {
			t.Fatalf("refinement %d: neighbour ratio %g exceeds MaxSpacingRatio %g", it, r, c.MaxSpacingRatio)
		}
		x = nx
	}
	t.Fatalf("grid still changing after %d refinements (%d points)", maxIter, len(x))
	return nil
}

func checkStrict(t *testing.T, x []float64) {
	t.Helper()
	for j := 1; j < len(x); j++ {
		if !(x[j] > x[j-1]) {
			t.Fatalf("grid not strictly increasing at %d: %g, %g", j, x[j-1], x[j])
		}
	}
}

func maxNeighbourRatio(x []float64) float64 {
	worst := 1.0
	for j := 1; j+1 < len(x); j++ {
		a, b := x[j]-x[j-1], x[j+1]-x[j]
		worst = math.Max(worst, math.Max(a/b, b/a))
	}
	return worst
}

// interpolationError returns the largest |chord - f| over interval j,
// sampled at 64 interior points.
func interpolationError(f func(float64) float64, x []float64, j int) float64 {
	worst := 0.0
	for k := 1; k < 64; k++ {
		s := float64(k) / 64
		v := x[j] + s*(x[j+1]-x[j])
		chord := f(x[j]) + s*(f(x[j+1])-f(x[j]))
		worst = math.Max(worst, math.Abs(chord-f(v)))
	}
	return worst
}

// frontErrorBound is the leading-order bound on the piecewise-linear error
// in the core |t| <= 1 of the front implied by the criteria.
//
// The chord error on an interval of size h is h²|u”|/8 to leading order
// (linear interpolation remainder). A converged grid satisfies
//
//	slope:      h|u'| <= σR                     (|Δu| = h|u'| + O(h²))
//	curvature:  h|u''| <= KγS,  K = 2ρ/(1+ρ)    (|s_j - s_j-1| = |u''|(h_j + h_j-1)/2,
//	                                              h_j-1 >= h_j/ρ)
//
// with σ = MaxChange, γ = MaxGradientChange, ρ = MaxSpacingRatio, R = 2 the range of u and S <= 1/δ
// the range of the interval slopes (each a mean of u' in (0, 1/δ]). Hence
//
//	e <= |u''| min(σR/|u'|, KγS/|u''|)² / 8,
//
// maximised here over |t| <= 1, where h is small against δ and the
// expansion holds. For the default criteria it is 4.0e-3 (at |t| = 1).
func frontErrorBound(c Criteria) float64 {
	K := 2 * c.MaxSpacingRatio / (1 + c.MaxSpacingRatio)
	R, S := 2.0, 1/frontWidth
	worst := 0.0
	for k := -1000; k <= 1000; k++ {
		x := frontX0 + frontWidth*float64(k)/1000
		d1, d2 := math.Abs(frontD1(x)), math.Abs(frontD2(x))
		h := math.Min(c.MaxChange*R/d1, K*c.MaxGradientChange*S/d2)
		worst = math.Max(worst, d2*h*h/8)
	}
	return worst
}

// TestRefineTanhConverges refines the tanh front from 11 uniform points to a
// fixed point and checks the error of the piecewise-linear representation
// against bounds that follow from the criteria.
func TestRefineTanhConverges(t *testing.T) {
	base := DefaultCriteria()
	var prevCore, prevAll float64
	for i, scale := range []float64{1, 0.5, 0.25} {
		c := base
		c.MaxChange *= scale
		c.MaxGradientChange *= scale
		x := refineUntilFixed(t, front, Uniform(0, 1, 11), c, 60)
		u := sample(front, x)
		if p, err := Analyse(x, u, 1, nil, nil, c); err != nil || !p.Empty() {
			t.Fatalf("scale %g: converged grid gives plan %+v, err %v; want an empty plan", scale, p, err)
		}
		core, all := 0.0, 0.0
		smin, smax := math.Inf(1), math.Inf(-1)
		for j := 0; j+1 < len(x); j++ {
			s := (u[j+1] - u[j]) / (x[j+1] - x[j])
			smin, smax = math.Min(smin, s), math.Max(smax, s)
		}
		for j := 0; j+1 < len(x); j++ {
			e := interpolationError(front, x, j)
			all = math.Max(all, e)
			if math.Abs(x[j]-frontX0) <= frontWidth && math.Abs(x[j+1]-frontX0) <= frontWidth {
				core = math.Max(core, e)
			}
			// Rigorous, grid-wise: u is monotone, so the chord error is at
			// most |Δu| <= σR. Where u is convex (or concave) over
			// [x_j-1, x_j+2], the end derivatives p <= s_j <= q of interval
			// j are bracketed by the neighbouring slopes, so s_j - p and
			// q - s_j are at most γS by the curvature test, and the gap
			// between chord and tangents gives e <= h (s-p)(q-s)/(q-p)
			// <= hγS/2 (elementary geometry of convex functions).
			if e > c.MaxChange*2 {
				t.Errorf("scale %g: interval %d error %.3g > σR = %.3g", scale, j, e, c.MaxChange*2)
			}
			if j >= 1 && j+2 < len(x) && (x[j+2] < frontX0 || x[j-1] > frontX0) {
				if b := (x[j+1] - x[j]) * c.MaxGradientChange * (smax - smin) / 2; e > b {
					t.Errorf("scale %g: interval %d error %.3g > hγS/2 = %.3g", scale, j, e, b)
				}
			}
		}
		bound := frontErrorBound(c)
		t.Logf("MaxChange %.4g MaxGradientChange %.4g: %d points, core error %.3g (bound %.3g), domain error %.3g",
			c.MaxChange, c.MaxGradientChange, len(x), core, bound, all)
		if core > bound {
			t.Errorf("scale %g: core error %.3g exceeds the leading-order bound %.3g", scale, core, bound)
		}
		// Halving both criteria halves h: the core error, second order in
		// h, must fall by about 4, the tail error, limited by the first-order
		// slope test, by about 2.
		if i > 0 {
			if core > prevCore/3 {
				t.Errorf("scale %g: core error %.3g did not fall by 3 from %.3g", scale, core, prevCore)
			}
			if all > prevAll/1.5 {
				t.Errorf("scale %g: domain error %.3g did not fall by 1.5 from %.3g", scale, all, prevAll)
			}
		}
		prevCore, prevAll = core, all
	}
}

// TestRefineConcentratesWhereCurvatureIsLarge refines the front with the
// curvature test alone (MaxChange = 1 never binds on a profile of range 2 with
// at least 3 points) and checks that the finest intervals sit where |u”| is
// largest, at tanh t = ±1/√3, t = ±0.658, and not at the centre (u” = 0) or
// in the flat tails.
func TestRefineConcentratesWhereCurvatureIsLarge(t *testing.T) {
	c := DefaultCriteria()
	c.MaxChange = 1
	x := refineUntilFixed(t, front, Uniform(0, 1, 11), c, 60)
	jmin := 0
	for j := 0; j+1 < len(x); j++ {
		if x[j+1]-x[j] < x[jmin+1]-x[jmin] {
			jmin = j
		}
	}
	tmin := math.Abs((x[jmin]+x[jmin+1])/2-frontX0) / frontWidth
	hmin := x[jmin+1] - x[jmin]
	hCentre, hTail := 0.0, 0.0
	inCore := 0
	for j := 0; j+1 < len(x); j++ {
		tm := math.Abs((x[j]+x[j+1])/2-frontX0) / frontWidth
		if tm < 0.1 {
			hCentre = math.Max(hCentre, x[j+1]-x[j])
		}
		if tm > 4 {
			hTail = math.Max(hTail, x[j+1]-x[j])
		}
		if tm < 2 {
			inCore++
		}
	}
	t.Logf("%d points; finest interval %.3g at |t| = %.3f; centre %.3g, tail %.3g; %d intervals in |t| < 2",
		len(x), hmin, tmin, hCentre, hTail, inCore)
	if tmin < 0.3 || tmin > 1.1 {
		t.Errorf("finest interval at |t| = %.3f, want near the |u''| peak at 0.658", tmin)
	}
	if hCentre < 1.2*hmin {
		t.Errorf("centre interval %.3g not coarser than the finest %.3g although u'' = 0 there", hCentre, hmin)
	}
	if hTail < 20*hmin {
		t.Errorf("tail interval %.3g not much coarser than the finest %.3g", hTail, hmin)
	}
	if 2*inCore < len(x) {
		t.Errorf("only %d of %d intervals in |t| < 2 (4%% of the domain)", inCore, len(x)-1)
	}
}

// TestRefineRatioBound starts from badly graded grids (neighbour ratios up
// to 50) and checks that a single Refine meets the MaxSpacingRatio bound everywhere,
// for a flat solution (the ratio test alone acts) and for the front.
func TestRefineRatioBound(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 20; trial++ {
		n := 5 + rng.IntN(40)
		x := make([]float64, n)
		for j := 1; j < n; j++ {
			x[j] = x[j-1] + math.Pow(50, rng.Float64())
		}
		for j := range x {
			x[j] /= x[n-1]
		}
		for _, ratio := range []float64{1.5, 2.5, 4} {
			c := DefaultCriteria()
			c.MaxSpacingRatio = ratio
			for name, f := range map[string]func(float64) float64{
				"flat":  func(float64) float64 { return 1 },
				"front": front,
			} {
				nx, _, _, err := Refine(x, sample(f, x), 1, nil, nil, c)
				if err != nil {
					t.Fatalf("trial %d, %s, MaxSpacingRatio %g: %v", trial, name, ratio, err)
				}
				checkStrict(t, nx)
				if r := maxNeighbourRatio(nx); r > ratio*(1+ratioTol) {
					t.Errorf("trial %d, %s: max neighbour ratio %g after Refine, MaxSpacingRatio %g (input %g)",
						trial, name, r, ratio, maxNeighbourRatio(x))
				}
				if nx[0] != x[0] || nx[len(nx)-1] != x[n-1] {
					t.Errorf("trial %d, %s: ends moved", trial, name)
				}
			}
		}
	}
}

// TestRefineRatioFromGradedInput checks the plans for a geometric grid
// h = 1, 10, 100, 1000 (neighbour ratio 10) and a flat solution, where only
// the ratio test acts, against hand-derived closed forms. Sizes grow to the
// right, so every interval must only fit its left neighbour's last piece.
//
// MaxSpacingRatio 2.5 (bisection): 10 next to 1 -> pieces 2.5, 2.5, 5; 100 next to 5
// -> 12.5, 12.5, 25, 50; 1000 next to 50 -> 125, 125, 250, 500: 8 points,
// at fractions 1/4, 1/2 and 1/8, 1/4, 1/2 (twice).
//
// MaxSpacingRatio 1.5 (equal parts): interval j needs parts_j = ceil(h_j/(1.5 s_j-1))
// with s_j-1 its left neighbour's part: 7, 47 and 314 parts, 365 points.
func TestRefineRatioFromGradedInput(t *testing.T) {
	x := []float64{0, 1, 11, 111, 1111}
	u := make([]float64, len(x))
	c := DefaultCriteria()
	p, err := Analyse(x, u, 1, nil, nil, c)
	if err != nil {
		t.Fatal(err)
	}
	want := Plan{Insert: []int{1, 1, 2, 2, 2, 3, 3, 3}, At: []float64{0.25, 0.5, 0.125, 0.25, 0.5, 0.125, 0.25, 0.5}}
	if !reflect.DeepEqual(p, want) {
		t.Errorf("MaxSpacingRatio 2.5: plan %+v, want %+v", p, want)
	}
	c.MaxSpacingRatio = 1.5
	p, err = Analyse(x, u, 1, nil, nil, c)
	if err != nil {
		t.Fatal(err)
	}
	var wantInsert []int
	prev := 1.0
	for j, h := range []float64{10, 100, 1000} {
		parts := math.Ceil(h / (1.5 * prev))
		for i := 1; i < int(parts); i++ {
			wantInsert = append(wantInsert, j+1)
		}
		prev = h / parts
	}
	if !slices.Equal(p.Insert, wantInsert) || len(wantInsert) != 6+46+313 {
		t.Errorf("MaxSpacingRatio 1.5: %d insertions, want %d (365)", len(p.Insert), len(wantInsert))
	}
	nx, _ := p.Apply(x, u, 1)
	if r := maxNeighbourRatio(nx); r > 1.5*(1+ratioTol) {
		t.Errorf("MaxSpacingRatio 1.5: neighbour ratio %g after Apply", r)
	}
}

// TestAnalyseMaxPoints checks that a refinement exceeding MaxPoints fails
// with ErrTooManyPoints, says how many points were needed and what to
// change, and that Refine then hands back the input grid.
func TestAnalyseMaxPoints(t *testing.T) {
	x := Uniform(0, 1, 31)
	u := sample(front, x)
	free, err := Analyse(x, u, 1, nil, nil, DefaultCriteria())
	if err != nil || len(free.Insert) == 0 {
		t.Fatalf("unlimited plan %+v, err %v; want insertions", free, err)
	}
	need := len(x) + len(free.Insert)
	c := DefaultCriteria()
	c.MaxPoints = need
	if p, err := Analyse(x, u, 1, nil, nil, c); err != nil || !reflect.DeepEqual(p, free) {
		t.Errorf("MaxPoints = %d (exactly enough): plan %+v, err %v", need, p, err)
	}
	c.MaxPoints = need - 1
	_, err = Analyse(x, u, 1, nil, nil, c)
	if !errors.Is(err, ErrTooManyPoints) {
		t.Fatalf("MaxPoints = %d: err = %v, want ErrTooManyPoints", need-1, err)
	}
	t.Logf("message: %v", err)
	for _, s := range []string{fmt.Sprintf("needs %d points", need), "31 now", fmt.Sprintf("max_points = %d", need-1), "raise [grid] max_points", "max_change", "max_gradient_change"} {
		if !strings.Contains(err.Error(), s) {
			t.Errorf("message %q lacks %q", err, s)
		}
	}
	nx, nu, changed, err := Refine(x, u, 1, nil, nil, c)
	if !errors.Is(err, ErrTooManyPoints) || changed || &nx[0] != &x[0] || &nu[0] != &u[0] {
		t.Errorf("Refine on error: changed %v, err %v, input slices returned %v", changed, err, &nx[0] == &x[0])
	}
	// A ratio cascade beyond the limit fails the same way: h = 1e6 next to
	// h = 1 needs about log(1e6)/log(2.5) = 15 levels of splitting.
	c.MaxPoints = 10
	if _, err := Analyse([]float64{0, 1, 1e6}, make([]float64, 3), 1, nil, nil, c); !errors.Is(err, ErrTooManyPoints) {
		t.Errorf("ratio cascade: err = %v, want ErrTooManyPoints", err)
	}
}

// overResolvedFront is the front sampled on 801 uniform points: the flat
// states on either side hold far more points than the criteria need.
func overResolvedFront() []float64 { return Uniform(0, 1, 801) }

// TestPruneCoarsensFlatKeepsFront prunes the over-resolved front to a fixed
// point and checks that points left the flat states, the front stays
// resolved (slope test met, core error within the bound), and the ratio
// bound holds.
func TestPruneCoarsensFlatKeepsFront(t *testing.T) {
	c := DefaultCriteria()
	c.RemovalMargin = 0.3
	x := refineUntilFixed(t, front, overResolvedFront(), c, 60)
	u := sample(front, x)
	inFlat := 0
	for _, v := range x {
		if math.Abs(v-frontX0) > 5*frontWidth {
			inFlat++
		}
	}
	core := 0.0
	for j := 0; j+1 < len(x); j++ {
		if math.Abs(u[j+1]-u[j]) > c.MaxChange*2 {
			t.Errorf("interval %d: |Δu| = %.3g exceeds the slope limit", j, math.Abs(u[j+1]-u[j]))
		}
		if math.Abs(x[j]-frontX0) <= frontWidth && math.Abs(x[j+1]-frontX0) <= frontWidth {
			core = math.Max(core, interpolationError(front, x, j))
		}
	}
	t.Logf("801 -> %d points, %d in the flat states (761 before), core error %.3g (bound %.3g)",
		len(x), inFlat, core, frontErrorBound(c))
	if inFlat > 100 {
		t.Errorf("%d points left in the flat states, want pruning to remove most of 761", inFlat)
	}
	if core > frontErrorBound(c) {
		t.Errorf("core error %.3g exceeds the bound %.3g after pruning", core, frontErrorBound(c))
	}
	// Pruning alone must not touch the resolved core: every point of the
	// input within |t| < 1 that the refined-from-coarse grid needs is a
	// matter of criteria, so compare the core point count with an
	// unpruned refinement from a coarse start.
	coarse := refineUntilFixed(t, front, Uniform(0, 1, 11), DefaultCriteria(), 60)
	if nc, np := countWithin(coarse, frontWidth), countWithin(x, frontWidth); np < nc/2 {
		t.Errorf("pruned core holds %d points, refined-from-coarse core %d", np, nc)
	}
}

func countWithin(x []float64, d float64) int {
	n := 0
	for _, v := range x {
		if math.Abs(v-frontX0) <= d {
			n++
		}
	}
	return n
}

// TestPruneNeverRemovesKeptOrEndPoints prunes a flat solution on a fine
// grid, where every interior point is removable but for the kept ones.
func TestPruneNeverRemovesKeptOrEndPoints(t *testing.T) {
	c := DefaultCriteria()
	c.RemovalMargin = 0.5
	x := Uniform(0, 1, 101)
	keep := []float64{x[37], x[38], 0.5 + 1e-14, x[99]}
	u := make([]float64, len(x))
	for it := 0; it < 20; it++ {
		p, err := Analyse(x, u, 1, nil, keep, c)
		if err != nil {
			t.Fatal(err)
		}
		for _, j := range p.Remove {
			if j == 0 || j == len(x)-1 {
				t.Fatalf("plan removes end point %d", j)
			}
		}
		if p.Empty() {
			break
		}
		x, u = p.Apply(x, u, 1)
	}
	for _, k := range append(keep, 0, 1) {
		if !slices.ContainsFunc(x, func(v float64) bool { return math.Abs(v-k) <= 1e-12 }) {
			t.Errorf("kept position %g was removed", k)
		}
	}
	if len(x) > 30 {
		t.Errorf("%d points left of 101 on a flat solution, want most pruned", len(x))
	}
	if r := maxNeighbourRatio(x); r > c.MaxSpacingRatio {
		t.Errorf("pruning broke the ratio bound: %g", r)
	}
	t.Logf("flat solution pruned to %d points: %v", len(x), x)
}

// TestPruneNeverUndoesRefinement checks that no point bounding an interval
// split in the same call is removed.
func TestPruneNeverUndoesRefinement(t *testing.T) {
	c := DefaultCriteria()
	c.RemovalMargin = 0.9
	x := Uniform(0, 1, 201)
	p, err := Analyse(x, sample(front, x), 1, nil, nil, c)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Insert) == 0 || len(p.Remove) == 0 {
		t.Fatalf("want both insertions and removals on this grid, got %+v", p)
	}
	for _, j := range p.Remove {
		if slices.Contains(p.Insert, j) || slices.Contains(p.Insert, j-1) {
			t.Errorf("point %d removed next to a split interval", j)
		}
	}
}

// TestComponentsSelection uses three components: a front, a flat state,
// and a trace front whose range (1e-12) is below MinRange. The flat and the
// trace components must not change the grid the front alone produces, and
// a component list naming only them must leave the grid alone.
func TestComponentsSelection(t *testing.T) {
	const block = 3
	c := DefaultCriteria()
	trace := func(x float64) float64 { return 1e-12 * math.Tanh((x-0.2)/0.001) }
	fill := func(x []float64) []float64 {
		u := make([]float64, len(x)*block)
		for j, v := range x {
			u[j*block], u[j*block+1], u[j*block+2] = front(v), 300, trace(v)
		}
		return u
	}
	alone := refineUntilFixed(t, front, Uniform(0, 1, 11), c, 60)
	x := Uniform(0, 1, 11)
	for it := 0; ; it++ {
		nx, _, changed, err := Refine(x, fill(x), block, nil, nil, c)
		if err != nil {
			t.Fatal(err)
		}
		if !changed {
			break
		}
		if it > 60 {
			t.Fatal("not converging")
		}
		x = nx
	}
	if !slices.Equal(x, alone) {
		t.Errorf("flat and trace components changed the grid: %d points, front alone %d", len(x), len(alone))
	}
	coarse := Uniform(0, 1, 11)
	if p, err := Analyse(coarse, fill(coarse), block, []int{1, 2}, nil, c); err != nil || !p.Empty() {
		t.Errorf("flat + trace components only: plan %+v, err %v; want empty", p, err)
	}
	// With MinRange 0 the trace front is tested and refines near x = 0.2.
	c.MinRange = 0
	p, err := Analyse(coarse, fill(coarse), block, []int{2}, nil, c)
	if err != nil || !slices.Contains(p.Insert, 2) {
		t.Errorf("trace component with MinRange 0: plan %+v, err %v; want interval 2 split", p, err)
	}
}

// TestLinearProfileNotRefined: a straight line has zero curvature, but on a
// non-uniform grid its computed slopes differ by rounding; the roundoff
// floor must keep the curvature test from chasing that noise.
func TestLinearProfileNotRefined(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	x := make([]float64, 60)
	for j := 1; j < len(x); j++ {
		x[j] = x[j-1] + 1 + rng.Float64() // ratios < 2, |Δu|/R < 2/60 < MaxChange
	}
	u := sample(func(v float64) float64 { return 1e5 + 3.7*v }, x)
	p, err := Analyse(x, u, 1, nil, nil, DefaultCriteria())
	if err != nil || !p.Empty() {
		t.Errorf("linear profile: plan %+v, err %v; want empty", p, err)
	}
}

// TestAnalyseDeterministic checks that equal inputs give equal plans, that
// the order and repetition of the component list do not matter, and that
// the inputs are left untouched.
func TestAnalyseDeterministic(t *testing.T) {
	c := DefaultCriteria()
	c.RemovalMargin = 0.3
	x := Uniform(0, 1, 301)
	u := make([]float64, 2*len(x))
	for j, v := range x {
		u[2*j], u[2*j+1] = front(v), math.Sin(3*v)
	}
	x0, u0 := slices.Clone(x), slices.Clone(u)
	p1, err1 := Analyse(x, u, 2, []int{0, 1}, []float64{0.25}, c)
	p2, err2 := Analyse(x, u, 2, []int{1, 0, 1}, []float64{0.25}, c)
	if err1 != nil || err2 != nil || !reflect.DeepEqual(p1, p2) {
		t.Errorf("plans differ: %v / %v", err1, err2)
	}
	if !slices.Equal(x, x0) || !slices.Equal(u, u0) {
		t.Error("Analyse modified its inputs")
	}
}

// TestAnalyseRejectsBadInput checks that bad grids, solutions and criteria
// give errors, never a panic or a plan.
func TestAnalyseRejectsBadInput(t *testing.T) {
	nan := math.NaN()
	good := DefaultCriteria()
	with := func(f func(*Criteria)) Criteria { c := good; f(&c); return c }
	tests := []struct {
		name       string
		x, u       []float64
		block      int
		components []int
		c          Criteria
		want       string
	}{
		{"NaN in x", []float64{0, nan, 1}, []float64{0, 0, 0}, 1, nil, good, "not finite"},
		{"Inf in x", []float64{0, 0.5, math.Inf(1)}, []float64{0, 0, 0}, 1, nil, good, "not finite"},
		{"repeated x", []float64{0, 0.5, 0.5, 1}, []float64{0, 0, 0, 0}, 1, nil, good, "strictly increasing"},
		{"decreasing x", []float64{1, 0.5, 0}, []float64{0, 0, 0}, 1, nil, good, "strictly increasing"},
		{"NaN in u", []float64{0, 0.5, 1}, []float64{0, 0, 1, nan, 0, 0}, 2, nil, good, "point 1, component 1"},
		{"one point", []float64{0}, []float64{0}, 1, nil, good, "at least 2"},
		{"short u", []float64{0, 1}, []float64{0, 0, 0}, 2, nil, good, "len(u)"},
		{"zero block", []float64{0, 1}, nil, 0, nil, good, "block"},
		{"component out of range", []float64{0, 1}, []float64{0, 0}, 1, []int{1}, good, "component 1"},
		{"negative component", []float64{0, 1}, []float64{0, 0}, 1, []int{-1}, good, "component -1"},
		{"MaxSpacingRatio 1", []float64{0, 1}, []float64{0, 0}, 1, nil, with(func(c *Criteria) { c.MaxSpacingRatio = 1 }), "max_spacing_ratio"},
		{"MaxChange 0", []float64{0, 1}, []float64{0, 0}, 1, nil, with(func(c *Criteria) { c.MaxChange = 0 }), "max_change"},
		{"MaxGradientChange NaN", []float64{0, 1}, []float64{0, 0}, 1, nil, with(func(c *Criteria) { c.MaxGradientChange = nan }), "max_gradient_change"},
		{"RemovalMargin 1", []float64{0, 1}, []float64{0, 0}, 1, nil, with(func(c *Criteria) { c.RemovalMargin = 1 }), "removal_margin"},
		{"MaxPoints < 0", []float64{0, 1}, []float64{0, 0}, 1, nil, with(func(c *Criteria) { c.MaxPoints = -1 }), "max_points"},
		{"MinRange < 0", []float64{0, 1}, []float64{0, 0}, 1, nil, with(func(c *Criteria) { c.MinRange = -1 }), "smallest tested range"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := Analyse(tt.x, tt.u, tt.block, tt.components, nil, tt.c)
			if err == nil || !strings.Contains(err.Error(), tt.want) {
				t.Fatalf("err = %v, want one mentioning %q", err, tt.want)
			}
			if !p.Empty() {
				t.Errorf("plan %+v returned with an error", p)
			}
			if _, _, changed, err := Refine(tt.x, tt.u, tt.block, tt.components, nil, tt.c); err == nil || changed {
				t.Errorf("Refine: changed %v, err %v", changed, err)
			}
		})
	}
}

// TestAnalyseLimits: an interval too small to split in float64 gives an
// error rather than duplicate points, and with MaxPoints = 0 (no limit) a
// hopeless ratio cascade still ends in ErrTooManyPoints instead of running
// away.
func TestAnalyseLimits(t *testing.T) {
	eps := math.Nextafter(1, 2) - 1
	x := []float64{0, 1, 1 + eps, 2}
	_, err := Analyse(x, []float64{0, 0, 1, 1}, 1, nil, nil, DefaultCriteria())
	if err == nil || !strings.Contains(err.Error(), "coincide") {
		t.Errorf("sub-resolution interval: err = %v, want a float64 resolution error", err)
	}
	c := DefaultCriteria()
	c.MaxPoints, c.MaxSpacingRatio = 0, 1.01
	_, err = Analyse([]float64{0, 1e-9, 1}, make([]float64, 3), 1, nil, nil, c)
	if !errors.Is(err, ErrTooManyPoints) {
		t.Errorf("MaxSpacingRatio 1.01 across a 1e9 jump without MaxPoints: err = %v, want ErrTooManyPoints", err)
	}
}

// TestApplyLinearInterpolation checks Apply on a hand-made plan: one
// interval split into three, one at its midpoint, one point removed; values
// of a linear profile stay exact.
func TestApplyLinearInterpolation(t *testing.T) {
	x := []float64{0, 1, 2, 4, 5}
	u := make([]float64, 2*len(x))
	for j, v := range x {
		u[2*j], u[2*j+1] = 2*v+1, -v
	}
	p := Plan{Insert: []int{0, 2, 2}, Remove: []int{4 - 3}}
	nx, nu := p.Apply(x, u, 2)
	wantX := []float64{0, 0.5, 2, 2 + 2.0/3, 2 + 4.0/3, 4, 5}
	if len(nx) != len(wantX) {
		t.Fatalf("x = %v, want %v", nx, wantX)
	}
	for j := range wantX {
		if math.Abs(nx[j]-wantX[j]) > 1e-15 || math.Abs(nu[2*j]-(2*nx[j]+1)) > 1e-14 || math.Abs(nu[2*j+1]+nx[j]) > 1e-15 {
			t.Errorf("point %d: x %g u %g %g, want x %g", j, nx[j], nu[2*j], nu[2*j+1], wantX[j])
		}
	}
}

func BenchmarkAnalyse(b *testing.B) {
	const block = 50
	x := Clustered(0, 0.02, 0.006, 0.002, 400)
	u := make([]float64, len(x)*block)
	for j, v := range x {
		for c := 0; c < block; c++ {
			u[j*block+c] = math.Tanh((v - 0.006 - 1e-5*float64(c)) / 2e-4)
		}
	}
	c := DefaultCriteria()
	c.RemovalMargin = 0.2
	b.ResetTimer()
	for b.Loop() {
		if _, err := Analyse(x, u, block, nil, []float64{0.006}, c); err != nil {
			b.Fatal(err)
		}
	}
}
