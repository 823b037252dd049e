package collide

import (
	"math"
	"runtime"
	"sync"
)

// Integrals are reduced collision integrals at one reduced temperature,
// each normalised to rigid spheres of diameter sigma
// (Hirschfelder, Curtiss & Bird 1954, eqs. 7.4-35 and 8.2-9):
//
//	Omega(l,s)* = 1/((s+1)! T*^(s+2)) int_0^inf exp(-E/T*) E^(s+1) Q(l)*(E) dE
type Integrals struct {
	O11, O12, O13, O22 float64
}

// energyGrid is the reduced-energy grid of the thermal averages: uniform
// in ln E with step h from eMin to eMax.
type energyGrid struct {
	eMin, eMax, h float64
}

// gridFor returns an energy grid that covers reduced temperatures tMin..tMax:
// the integrand E^(s+2) exp(-E/T*) per unit ln E (s >= 1) is below 1e-9
// of its peak under eMin and past eMax.
func gridFor(tMin, tMax, h float64) energyGrid {
	return energyGrid{eMin: 1e-3 * tMin, eMax: 50 * tMax, h: h}
}

// Average returns the collision integrals of the potential with orientation
// strength a at each reduced temperature in ts. The cross sections are
// computed on a grid uniform in ln E with step h and the thermal averages
// taken by the trapezoidal rule in ln E, which converges fast for these
// smooth, doubly decaying integrands.
func Average(a float64, ts []float64, h float64) []Integrals {
	tMin, tMax := ts[0], ts[0]
	for _, t := range ts {
		tMin, tMax = math.Min(tMin, t), math.Max(tMax, t)
	}
	g := gridFor(tMin, tMax, h)
	n := int(math.Ceil(math.Log(g.eMax/g.eMin)/h)) + 1
	es := make([]float64, n)
	q1s := make([]float64, n)
	q2s := make([]float64, n)
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < runtime.NumCPU(); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				q1s[i], q2s[i] = CrossSections(a, es[i])
			}
		}()
	}
	for i := range es {
		es[i] = g.eMin * math.Exp(float64(i)*h)
		next <- i
	}
	close(next)
	wg.Wait()
	return thermalAverages(es, q1s, q2s, h, ts)
}

func thermalAverages(es, q1s, q2s []float64, h float64, ts []float64) []Integrals {
	out := make([]Integrals, len(ts))
	for j, T := range ts {
		var s11, s12, s13, s22 float64
		for i, E := range es {
			x := E / T
			w := math.Exp(-x) * x * x * h // times x^(s) below: E^(s+2)/T*^(s+2) e^(-E/T*) d ln E
			if i == 0 || i == len(es)-1 {
				w /= 2
			}
			s11 += w * x * q1s[i]
			s12 += w * x * x * q1s[i]
			s13 += w * x * x * x * q1s[i]
			s22 += w * x * x * q2s[i]
		}
		out[j] = Integrals{O11: s11 / 2, O12: s12 / 6, O13: s13 / 24, O22: s22 / 6}
	}
	return out
}
