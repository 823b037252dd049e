package collide

import "math"

// Gauss-Kronrod 7-15 nodes and weights on [-1, 1] (Kronrod 1965; as
// tabulated in Piessens et al., QUADPACK, Springer 1983, routine QK15).
var (
	gkNodes = [8]float64{
		0.991455371120812639206854697526329,
		0.949107912342758524526189684047851,
		0.864864423359769072789712788640926,
		0.741531185599394439863864773280788,
		0.586087235467691130294144845693013,
		0.405845151377397166906606412076961,
		0.207784955007898467600689403773245,
		0.000000000000000000000000000000000,
	}
	kronrodWeights = [8]float64{
		0.022935322010529224963732008058970,
		0.063092092629978553290700663189204,
		0.104790010322250183839876322541518,
		0.140653259715525918745189590510238,
		0.169004726639267902826583426598550,
		0.190350578064785409913256402421014,
		0.204432940075298892414161999234649,
		0.209482141084727828012999174891714,
	}
	// gaussWeights belong to the odd-indexed Kronrod nodes (the 7-point
	// Gauss-Legendre rule).
	gaussWeights = [4]float64{
		0.129484966168869693270611432679082,
		0.279705391489276667901467771423780,
		0.381830050505118944950369775488975,
		0.417959183673469387755102040816327,
	}
)

// pairFunc is an integrand with two components, integrated together so
// that they share the expensive evaluation.
type pairFunc func(x float64) (float64, float64)

// gk15 applies the 15-point Kronrod rule and returns both integrals and an
// error estimate (the larger Kronrod-Gauss difference).
func gk15(f pairFunc, a, b float64) (i1, i2, errEst float64) {
	c, h := (a+b)/2, (b-a)/2
	var g1, g2 float64
	f1, f2 := f(c)
	i1, i2 = kronrodWeights[7]*f1, kronrodWeights[7]*f2
	g1, g2 = gaussWeights[3]*f1, gaussWeights[3]*f2
	for j := 0; j < 7; j++ {
		x := h * gkNodes[j]
		p1, p2 := f(c - x)
		q1, q2 := f(c + x)
		i1 += kronrodWeights[j] * (p1 + q1)
		i2 += kronrodWeights[j] * (p2 + q2)
		if j%2 == 1 {
			g1 += gaussWeights[j/2] * (p1 + q1)
			g2 += gaussWeights[j/2] * (p2 + q2)
		}
	}
	i1, i2, g1, g2 = i1*h, i2*h, g1*h, g2*h
	return i1, i2, math.Max(math.Abs(i1-g1), math.Abs(i2-g2))
}

// adaptive integrates f over [a, b] by globally adaptive bisection of the
// 15-point Kronrod rule (the strategy of QUADPACK's QAG): the piece with
// the largest error estimate is halved until the summed estimate is below
// tol or maxPieces pieces are in use, which bounds the work for integrands
// with singularities the rule cannot resolve.
func adaptive(f pairFunc, a, b, tol float64, maxPieces int) (float64, float64) {
	type piece struct{ a, b, i1, i2, e float64 }
	var ps []piece
	i1, i2, e := gk15(f, a, b)
	ps = append(ps, piece{a, b, i1, i2, e})
	total := e
	for total > tol && len(ps) < maxPieces {
		w := 0
		for j := range ps {
			if ps[j].e > ps[w].e {
				w = j
			}
		}
		p := ps[w]
		m := (p.a + p.b) / 2
		l1, l2, le := gk15(f, p.a, m)
		r1, r2, re := gk15(f, m, p.b)
		ps[w] = piece{p.a, m, l1, l2, le}
		ps = append(ps, piece{m, p.b, r1, r2, re})
		total = 0
		for j := range ps {
			total += ps[j].e
		}
		if math.IsNaN(total) {
			break
		}
	}
	var s1, s2 float64
	for _, p := range ps {
		s1 += p.i1
		s2 += p.i2
	}
	return s1, s2
}

// adaptive1 is adaptive for a single-component integrand.
func adaptive1(f func(float64) float64, a, b, tol float64, maxPieces int) float64 {
	v, _ := adaptive(func(x float64) (float64, float64) { return f(x), 0 }, a, b, tol, maxPieces)
	return v
}
