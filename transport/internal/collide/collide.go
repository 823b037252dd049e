// Package collide computes reduced transport collision integrals of the
// Lennard-Jones (12-6) and Stockmayer potentials by classical scattering:
// deflection angle -> transport cross sections -> thermal averages
// (Hirschfelder, Curtiss & Bird, Molecular Theory of Gases and Liquids,
// Wiley 1954, sec. 8.2), and, for polar molecules, the average over relative
// dipole orientations held fixed during a collision (Monchick & Mason,
// J. Chem. Phys. 35 (1961) 1676).
//
// Everything is in reduced units: distances in sigma, energies in epsilon,
// T* = k_B T/epsilon. The potential of one orientation is
//
//	V*(x) = 4 (x^-12 - x^-6) - a x^-3,   a = 2 delta* zeta,
//
// with delta* = mu^2/(2 epsilon sigma^3) and zeta = 2 cos t1 cos t2 -
// sin t1 sin t2 cos phi in [-2, 2] the orientation factor of the
// dipole-dipole energy.
//
// The package is slow (seconds per potential) and used offline to tabulate
// the integrals and in tests that check the table.
package collide

import (
	"math"
	"sort"
)

// potential is V*(x) for one orientation strength a.
type potential struct{ a float64 }

// v returns V*(x) with y = x^-3.
func (p potential) vy(y float64) float64 {
	y2 := y * y
	return 4*y2*y2 - 4*y2 - p.a*y
}

// gy returns V + x V'/2 at y = x^-3; B(x) = x sqrt(1 - V/E) increases with
// x where g < E and decreases where g > E.
func (p potential) gy(y float64) float64 {
	y2 := y * y
	return -20*y2*y2 + 8*y2 + 0.5*p.a*y
}

// scan brackets the sign changes of f(y) - E on a logarithmic grid of y and
// refines them by bisection, returned in increasing y (decreasing x).
func scanRoots(f func(y float64) float64, E float64) []float64 {
	const (
		lo, hi = -9.0, 2.5 // log10 y
		n      = 4000
	)
	var roots []float64
	prevY := math.Pow(10, lo)
	prev := f(prevY) - E
	for i := 1; i <= n; i++ {
		y := math.Pow(10, lo+(hi-lo)*float64(i)/n)
		cur := f(y) - E
		if (prev < 0) != (cur < 0) {
			a, b := prevY, y
			fa := prev
			for it := 0; it < 200 && b-a > 1e-16*b; it++ {
				m := (a + b) / 2
				fm := f(m) - E
				if (fm < 0) == (fa < 0) {
					a, fa = m, fm
				} else {
					b = m
				}
			}
			roots = append(roots, (a+b)/2)
		}
		prevY, prev = y, cur
	}
	return roots
}

// branch is a range of impact parameters (bLo, bHi) whose distances of
// closest approach form a range (xLo, xHi) on which B(x) increases. A
// singular end is an orbiting impact parameter, where the deflection
// angle diverges logarithmically.
type branch struct {
	bLo, bHi       float64
	xLo, xHi       float64 // xHi = +Inf for the outermost branch
	singLo, singHi bool
	orbitX         float64 // orbiting radius that bounds this branch from outside (0 if none)
}

// scatter holds the scattering geometry of one potential at one energy.
type scatter struct {
	p        potential
	E        float64
	x0       float64 // distance of closest approach at b = 0
	xScale   float64 // outermost radius with |V| >= E
	branches []branch
}

func (s *scatter) bOf(x float64) float64 {
	y := 1 / (x * x * x)
	return x * math.Sqrt(math.Max(0, 1-s.p.vy(y)/s.E))
}

// newScatter finds x0, the orbiting radii and the branches of b(r_m).
func newScatter(p potential, E float64) *scatter {
	s := &scatter{p: p, E: E}
	vr := scanRoots(p.vy, E)
	// The outermost turning point of a head-on collision: the smallest y
	// where V = E.
	y0 := vr[0]
	s.x0 = math.Cbrt(1 / y0)
	att := scanRoots(func(y float64) float64 { return math.Abs(p.vy(y)) }, E)
	s.xScale = s.x0
	if len(att) > 0 {
		s.xScale = math.Max(s.x0, math.Cbrt(1/att[0]))
	}
	var gx []float64 // roots of g = E outside x0, decreasing x
	for _, y := range scanRoots(p.gy, E) {
		if y < y0 {
			gx = append(gx, math.Cbrt(1/y))
		}
	}
	// Walk inwards from x = infinity, alternating segments where B
	// increases (valid while below the running minimum) and decreases
	// (never valid).
	m := math.Inf(1)
	xTop := math.Inf(1)
	singTop := false
	orbit := 0.0
	i := 0
	for {
		xBot, singBot := s.x0, false
		if i < len(gx) {
			xBot, singBot = gx[i], true
		}
		bBot := 0.0
		if singBot {
			bBot = s.bOf(xBot)
		}
		// Valid part of this increasing segment: B < m.
		hi := xTop
		if !math.IsInf(m, 1) {
			hi = s.solveX(xBot, xTop, m)
		}
		if bBot < m {
			s.branches = append(s.branches, branch{bLo: bBot, bHi: m, xLo: xBot, xHi: hi, singLo: singBot, singHi: singTop, orbitX: orbit})
			m = bBot
		}
		if !singBot {
			break
		}
		// Skip the decreasing segment below xBot.
		orbit = xBot
		i++
		if i < len(gx) {
			xTop = gx[i]
			i++
		} else {
			xTop = xBot // degenerate; cannot happen for E > 0 (g < E at x0)
		}
		singTop = true
	}
	sort.Slice(s.branches, func(a, b int) bool { return s.branches[a].bLo < s.branches[b].bLo })
	return s
}

// solveX returns x in [lo, hi] with B(x) = b on an increasing stretch of B.
func (s *scatter) solveX(lo, hi, b float64) float64 {
	if math.IsInf(hi, 1) {
		hi = math.Max(2*lo, 2*b+1)
		for s.bOf(hi) < b {
			hi *= 2
		}
	}
	for it := 0; it < 200 && hi-lo > 4e-16*hi; it++ {
		m := (lo + hi) / 2
		if s.bOf(m) < b {
			lo = m
		} else {
			hi = m
		}
	}
	return (lo + hi) / 2
}

// chi returns the classical deflection angle for closest approach xm on
// branch br:
//
//	chi = pi - 2 (b/x_m) int_0^1 dy / sqrt(G(y)),  y = x_m/r,
//	G(y) = 1 - (b/x_m)^2 y^2 - V(x_m/y)/E,
//
// written as int_0^1 2 dt/sqrt(H(1 - t^2)) with H = G/(1 - y), which has
// no cancellation near y = 1 and no singularity there. When an orbiting
// radius lies outside x_m, H nearly vanishes at y = x_m/orbitX, where the
// integral is split.
func (s *scatter) chi(xm float64, br *branch) float64 {
	E := s.E
	a := s.p.a
	vm := s.p.vy(1 / (xm * xm * xm))
	k := 1 - vm/E // (b/x_m)^2
	x3 := 1 / (xm * xm * xm)
	x6 := x3 * x3
	x12 := x6 * x6
	h := func(t float64) float64 {
		y := 1 - t*t
		// S_n(y) = (1 - y^n)/(1 - y) = 1 + y + ... + y^(n-1)
		y3 := y * y * y
		s3 := 1 + y + y*y
		s6 := s3 * (1 + y3)
		s12 := s6 * (1 + y3*y3)
		return (4*x12*s12-4*x6*s6-a*x3*s3)/E + k*(1+y)
	}
	f := func(t float64) float64 {
		v := h(t)
		if v <= 0 {
			return 0
		}
		return 2 / math.Sqrt(v)
	}
	const tol = 1e-10
	var integral float64
	if br.orbitX > 0 {
		tb := math.Sqrt(1 - xm/br.orbitX)
		integral = adaptive1(f, 0, tb, tol, 60) + adaptive1(f, tb, 1, tol, 60)
	} else {
		integral = adaptive1(f, 0, 1, tol, 60)
	}
	return math.Pi - 2*math.Sqrt(k)*integral
}

// CrossSections returns the reduced transport cross sections at reduced
// relative energy E of the potential with orientation strength a:
//
//	Q1* = Q(1)/(pi sigma^2)       = 2 int (1 - cos chi) b db
//	Q2* = Q(2)/((2/3) pi sigma^2) = 3 int sin^2 chi b db
//
// (normalised to rigid spheres of diameter sigma).
func CrossSections(a, E float64) (q1, q2 float64) {
	s := newScatter(potential{a}, E)
	integrand := func(br *branch) pairFunc {
		lo := br.xLo
		return func(b float64) (float64, float64) {
			if b <= 0 {
				return 0, 0
			}
			hi := br.xHi
			xm := s.solveX(lo, hi, b)
			c := s.chi(xm, br)
			h := math.Sin(c / 2)
			sn := math.Sin(c)
			return 2 * 2 * h * h * b, 3 * sn * sn * b
		}
	}
	const (
		tol    = 1e-8
		eta    = 1e-7 // relative gap left at an orbiting impact parameter
		grades = 24   // geometric refinement towards a singular end (2^-24 ~ eta)
	)
	for i := range s.branches {
		br := &s.branches[i]
		f := integrand(br)
		gapped := func(end float64) {
			// Inside the gap the deflection angle winds without bound:
			// 1 - cos chi averages 1 and sin^2 chi averages 1/2.
			q1 += 2 * 2 * end * eta * end
			q2 += 3 * 0.5 * end * eta * end
		}
		add := func(a, b float64) {
			if b > a {
				v1, v2 := adaptive(f, a, b, tol, 60)
				q1 += v1
				q2 += v2
			}
		}
		lo, hi := br.bLo, br.bHi
		if math.IsInf(hi, 1) {
			split := math.Max(1.5*s.xScale, 2*lo)
			tail := func(t float64) (float64, float64) {
				v1, v2 := f(split / t)
				j := split / (t * t)
				return v1 * j, v2 * j
			}
			v1, v2 := adaptive(tail, 0, 1, tol, 60)
			q1 += v1
			q2 += v2
			hi = split
		}
		switch {
		case br.singLo && br.singHi:
			mid := (lo + hi) / 2
			graded(add, lo, mid, eta*lo, grades)
			graded(add, hi, mid, eta*hi, grades)
			gapped(lo)
			gapped(hi)
		case br.singLo:
			graded(add, lo, hi, eta*lo, grades)
			gapped(lo)
		case br.singHi:
			graded(add, hi, lo, eta*hi, grades)
			gapped(hi)
		default:
			add(lo, hi)
		}
	}
	return q1, q2
}

// graded integrates from end (excluded by gap) to other in pieces whose
// widths halve towards end, so that the oscillations of a logarithmically
// divergent deflection angle are resolved.
func graded(add func(a, b float64), end, other, gap float64, n int) {
	w := other - end // may be negative
	ordered := func(a, b float64) {
		if a > b {
			a, b = b, a
		}
		add(a, b)
	}
	for g := 1; g <= n; g++ {
		ordered(end+w*math.Pow(2, -float64(g)), end+w*math.Pow(2, -float64(g-1)))
	}
	last := end + w*math.Pow(2, -float64(n))
	near := end + math.Copysign(gap, w)
	if math.Abs(last-end) > gap {
		ordered(near, last)
	}
}
