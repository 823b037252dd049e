package transport

import "math"

// collision holds the reduced collision integrals of one interacting pair
// at one reduced temperature T* = k_B T/epsilon and reduced dipole delta*:
// Omega(1,1)*, Omega(2,2)* and the ratios (Hirschfelder, Curtiss & Bird 1954,
// eqs. 7.4-30/31)
//
//	A* = Omega(2,2)*/Omega(1,1)*
//	B* = (5 Omega(1,2)* - 4 Omega(1,3)*)/Omega(1,1)*
//	C* = Omega(1,2)*/Omega(1,1)*
type collision struct {
	O11, O22 float64
	A, B, C  float64
}

// neufeld11 returns the Lennard-Jones (12-6) Omega(1,1)* and its first two
// derivatives in T* from the correlation of Neufeld, Janzen & Aziz,
// J. Chem. Phys. 57 (1972) 1100, eq. (a) with their Table I constants,
// stated valid for 0.3 <= T* <= 100.
func neufeld11(ts float64) (v, d1, d2 float64) {
	const (
		a, b = 1.06036, 0.15610
		c, d = 0.19300, 0.47635
		e, f = 1.03587, 1.52996
		g, h = 1.76474, 3.89411
	)
	p := a * math.Pow(ts, -b)
	ed, ef, eh := c*math.Exp(-d*ts), e*math.Exp(-f*ts), g*math.Exp(-h*ts)
	v = p + ed + ef + eh
	d1 = -b*p/ts - d*ed - f*ef - h*eh
	d2 = b*(b+1)*p/(ts*ts) + d*d*ed + f*f*ef + h*h*eh
	return
}

// neufeld22 returns the Lennard-Jones (12-6) Omega(2,2)* from Neufeld,
// Janzen & Aziz (1972), with the small sine term of their eq. (b).
func neufeld22(ts float64) float64 {
	const (
		a, b = 1.16145, 0.14874
		c, d = 0.52487, 0.77320
		e, f = 2.16178, 2.43787
		r, s = -6.435e-4, 18.0323
		w, p = -0.76830, 7.27371
	)
	return a*math.Pow(ts, -b) + c*math.Exp(-d*ts) + e*math.Exp(-f*ts) +
		r*math.Pow(ts, b)*math.Sin(s*math.Pow(ts, w)-p)
}

// collisionIntegrals returns the reduced collision integrals at (T*, delta*).
func collisionIntegrals(ts, delta float64) collision {
	o11, d1, d2 := neufeld11(ts)
	o22 := neufeld22(ts)
	if delta != 0 {
		// Brokaw, Ind. Eng. Chem. Process Des. Dev. 8 (1969) 240: additive
		// polar corrections 0.19 delta^2/T* and 0.2 delta^2/T*.
		q := 0.19 * delta * delta
		o11 += q / ts
		d1 -= q / (ts * ts)
		d2 += 2 * q / (ts * ts * ts)
		o22 += 0.2 * delta * delta / ts
	}
	// Omega(l,s+1)* = Omega(l,s)* + T*/(s+2) dOmega(l,s)*/dT*
	// (Hirschfelder, Curtiss & Bird 1954, eq. 7.4-32 rearranged).
	o12 := o11 + ts/3*d1
	o12d := 4.0/3*d1 + ts/3*d2
	o13 := o12 + ts/4*o12d
	return collision{
		O11: o11, O22: o22,
		A: o22 / o11,
		B: (5*o12 - 4*o13) / o11,
		C: o12 / o11,
	}
}
