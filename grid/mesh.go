package grid

import "math"

// Uniform returns n equally spaced points from x0 to x1 (m), both included:
// x_i = x0 + (x1 - x0)*i/(n-1). It returns nil unless n >= 2, x0 and x1 are
// finite and x1 > x0, or if the points cannot be told apart in float64.
func Uniform(x0, x1 float64, n int) []float64 {
	if n < 2 || !finite(x0) || !finite(x1) || !(x1 > x0) {
		return nil
	}
	x := make([]float64, n)
	for i := range x {
		x[i] = x0 + (x1-x0)*float64(i)/float64(n-1)
	}
	x[n-1] = x1
	return strictOrNil(x)
}

// Growth of the spacing per unit distance outside the clustered zone of
// Clustered, and the cap of its spacing as a multiple of the uniform spacing.
// A spacing h(d) = hf + clusterGrowth*d makes neighbouring intervals differ by
// a factor of about 1 + clusterGrowth = 1.2, well inside the usual MaxSpacingRatio
// bounds; the cap keeps at least a quarter of the uniform point density in
// the far field (design choices, no source).
const (
	clusterGrowth = 0.2
	clusterCap    = 4.0
)

// Clustered returns n points from x0 to x1 (m), both included and strictly
// increasing, denser in the zone [xc - width/2, xc + width/2] (m), for
// starting a solution whose front lies near xc. The points equidistribute
// the local spacing
//
//	h(x) = min(hf + 0.2*d(x), hc),   d(x) = max(0, |x - xc| - width/2),
//
// that is, x_i solves ∫_{x0}^{x_i} dx/h(x) = i*(∫_{x0}^{x1} dx/h)/(n-1),
// which has a closed form. The spacing is hf inside the zone and grows
// linearly (geometrically from point to point, by about 20%) away from it up
// to hc = 4*(x1-x0)/(n-1); hf is found by bisection so that exactly n points
// fit. A zone covering the whole domain gives the uniform grid; width = 0
// clusters at the single position xc. A zone wholly outside the domain is
// first moved inside it, against the nearer end.
//
// Clustered returns nil unless n >= 2, x0 < x1, width >= 0 and all arguments
// are finite, or if the points cannot be told apart in float64.
func Clustered(x0, x1, xc, width float64, n int) []float64 {
	if n < 2 || !finite(x0) || !finite(x1) || !finite(xc) || !finite(width) || !(x1 > x0) || !(width >= 0) {
		return nil
	}
	// A zone wholly outside the domain is moved inside, to the nearer end:
	// otherwise the domain, where h >= 0.2 d > 0, might not hold n points.
	if xc+width/2 < x0 {
		xc = x0 + width/2
	} else if xc-width/2 > x1 {
		xc = x1 - width/2
	}
	L := x1 - x0
	z := cluster{half: width / 2, hc: clusterCap * L / float64(n-1)}
	target := float64(n - 1)
	count := func(hf float64) float64 {
		z.hf = hf
		return z.primitive(x1-xc) - z.primitive(x0-xc)
	}
	// count decreases with hf; count(hc) = L/hc < n-1, and count -> inf as
	// hf -> 0, so a bracket [lo, hc] exists.
	lo, hi := z.hc/2, z.hc
	for count(lo) <= target {
		hi = lo
		lo /= 2
		if lo < math.SmallestNonzeroFloat64*1e10 {
			return nil
		}
	}
	for i := 0; i < 200 && hi-lo > 1e-15*hi; i++ {
		mid := math.Sqrt(lo * hi)
		if mid <= lo || mid >= hi {
			mid = lo + (hi-lo)/2
		}
		if count(mid) > target {
			lo = mid
		} else {
			hi = mid
		}
	}
	total := count(hi)
	start := z.primitive(x0 - xc)
	x := make([]float64, n)
	x[0] = x0
	for i := 1; i < n-1; i++ {
		x[i] = xc + z.inverse(start+total*float64(i)/float64(n-1))
	}
	x[n-1] = x1
	return strictOrNil(x)
}

// cluster is the spacing law of Clustered, in the offset t = x - xc.
type cluster struct {
	half   float64 // half width of the zone, m
	hf, hc float64 // fine and capped spacing, m
}

// far is F(s) = ∫_0^s dd/h(d) for the distance s >= 0 outside the zone.
func (z cluster) far(s float64) float64 {
	dcap := (z.hc - z.hf) / clusterGrowth
	if s <= dcap {
		return math.Log1p(clusterGrowth*s/z.hf) / clusterGrowth
	}
	return math.Log(z.hc/z.hf)/clusterGrowth + (s-dcap)/z.hc
}

// farInverse is the inverse of far.
func (z cluster) farInverse(q float64) float64 {
	dcap := (z.hc - z.hf) / clusterGrowth
	qcap := math.Log(z.hc/z.hf) / clusterGrowth
	if q <= qcap {
		return z.hf * math.Expm1(clusterGrowth*q) / clusterGrowth
	}
	return dcap + (q-qcap)*z.hc
}

// primitive is P(t) = ∫_0^t dt'/h, odd in t.
func (z cluster) primitive(t float64) float64 {
	a := math.Abs(t)
	p := math.Min(a, z.half)/z.hf + z.far(math.Max(0, a-z.half))
	return math.Copysign(p, t)
}

// inverse is the inverse of primitive.
func (z cluster) inverse(p float64) float64 {
	a := math.Abs(p)
	var t float64
	if zone := z.half / z.hf; a <= zone {
		t = a * z.hf
	} else {
		t = z.half + z.farInverse(a-zone)
	}
	return math.Copysign(t, p)
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// strictOrNil returns x if it is strictly increasing, else nil.
func strictOrNil(x []float64) []float64 {
	for i := 1; i < len(x); i++ {
		if !(x[i] > x[i-1]) {
			return nil
		}
	}
	return x
}
