package collide

import "math"

// GaussLegendre returns the n-point Gauss-Legendre nodes and weights on
// [-1, 1], by Newton iteration on the Legendre recurrence (Golub & Welsch
// 1969 give the same rule as an eigenproblem).
func GaussLegendre(n int) (x, w []float64) {
	x = make([]float64, n)
	w = make([]float64, n)
	for i := 0; i < (n+1)/2; i++ {
		z := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
		var dp float64
		for it := 0; it < 100; it++ {
			p0, p1 := 1.0, z
			for k := 2; k <= n; k++ {
				p0, p1 = p1, ((2*float64(k)-1)*z*p1-(float64(k)-1)*p0)/float64(k)
			}
			if n == 1 {
				p0, p1 = 1, z
			}
			dp = float64(n) * (z*p1 - p0) / (z*z - 1)
			dz := p1 / dp
			z -= dz
			if math.Abs(dz) < 1e-16 {
				break
			}
		}
		x[i], x[n-1-i] = -z, z
		w[i] = 2 / ((1 - z*z) * dp * dp)
		w[n-1-i] = w[i]
	}
	return x, w
}

// ChebyshevNodes returns the n Chebyshev points of the first kind on
// [-h, h], increasing.
func ChebyshevNodes(n int, h float64) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = -h * math.Cos(math.Pi*(float64(i)+0.5)/float64(n))
	}
	return x
}

// LagrangeBasis returns the Lagrange basis polynomials of nodes at x.
func LagrangeBasis(nodes []float64, x float64) []float64 {
	l := make([]float64, len(nodes))
	for i, xi := range nodes {
		v := 1.0
		for j, xj := range nodes {
			if j != i {
				v *= (x - xj) / (xi - xj)
			}
		}
		l[i] = v
	}
	return l
}

// OrientationWeights returns weights W_i with
//
//	<F(2 delta zeta)> = sum_i W_i F(aNodes[i])
//
// for a function F known through its interpolant on aNodes, the average
// taken over independently and uniformly distributed dipole directions of
// the two molecules (zeta = 2 cos t1 cos t2 - sin t1 sin t2 cos phi; Monchick
// & Mason 1961). The average is a tensor Gauss-Legendre rule in
// (t1, t2, phi), on which the integrand is smooth.
func OrientationWeights(aNodes []float64, delta float64, n int) []float64 {
	W := make([]float64, len(aNodes))
	gx, gw := GaussLegendre(n)
	for i1 := range gx {
		t1 := math.Pi / 2 * (gx[i1] + 1)
		w1 := gw[i1] * math.Pi / 2 * math.Sin(t1) / 2
		for i2 := range gx {
			t2 := math.Pi / 2 * (gx[i2] + 1)
			w2 := gw[i2] * math.Pi / 2 * math.Sin(t2) / 2
			for i3 := range gx {
				phi := math.Pi / 2 * (gx[i3] + 1)
				w3 := gw[i3] / 2 // (1/pi) dphi over [0, pi]
				zeta := 2*math.Cos(t1)*math.Cos(t2) - math.Sin(t1)*math.Sin(t2)*math.Cos(phi)
				l := LagrangeBasis(aNodes, 2*delta*zeta)
				for k := range W {
					W[k] += w1 * w2 * w3 * l[k]
				}
			}
		}
	}
	return W
}
