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

// collisionIntegrals returns the reduced collision integrals at (T*, delta*)
// by cubic Lagrange interpolation in ln T* and delta* of collisionTable.
//
// The table is computed by this project (package internal/collide) from the
// classical scattering of the Lennard-Jones (12-6) potential (delta* = 0)
// and of the Stockmayer potential, averaged over dipole orientations held
// fixed during each collision as in Monchick & Mason, J. Chem. Phys. 35
// (1961) 1676. Against the Neufeld, Janzen & Aziz (1972) correlation of
// the Lennard-Jones integrals (itself a fit to published numerical tables,
// stated good to about 0.1%) it agrees within 0.16% for 0.3 <= T* <= 100
// (collision_test.go). The table covers 0.1 <= T* <= 580 and
// 0 <= delta* <= 2.5; New rejects species and pairs outside it, and the
// unfitted theory extrapolates the end cubics.
func collisionIntegrals(ts, delta float64) collision {
	p := tablePerDecade * math.Log10(ts/tableTMin)
	i0 := int(math.Floor(p)) - 1
	i0 = min(max(i0, 0), tableNT-4)
	wt := lagrange4(p - float64(i0))
	dStep := tableDeltaMax / (tableNDelta - 1)
	q := math.Abs(delta) / dStep
	j0 := int(math.Floor(q)) - 1
	j0 = min(j0, tableNDelta-4)
	wd := lagrange4(q - float64(j0))
	var v [4]float64
	for b := 0; b < 4; b++ {
		j := j0 + b
		if j < 0 {
			j = -j // the integrals are even in delta*
		}
		row := &collisionTable[j]
		for a := 0; a < 4; a++ {
			w := wd[b] * wt[a]
			e := &row[i0+a]
			v[0] += w * e[0]
			v[1] += w * e[1]
			v[2] += w * e[2]
			v[3] += w * e[3]
		}
	}
	return collision{O11: v[0], O22: v[1], A: v[1] / v[0], B: v[2], C: v[3]}
}

// tableCovers reports whether (T*, delta*) lies inside collisionTable.
func tableCovers(ts, delta float64) bool {
	tsMax := tableTMin * math.Pow(10, float64(tableNT-1)/tablePerDecade)
	return ts >= tableTMin && ts <= tsMax && delta >= 0 && delta <= tableDeltaMax
}

// lagrange4 returns the cubic Lagrange weights of nodes 0, 1, 2, 3 at f.
func lagrange4(f float64) [4]float64 {
	return [4]float64{
		-(f - 1) * (f - 2) * (f - 3) / 6,
		f * (f - 2) * (f - 3) / 2,
		-f * (f - 1) * (f - 3) / 2,
		f * (f - 1) * (f - 2) / 6,
	}
}
