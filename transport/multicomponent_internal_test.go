package transport

import (
	"math"
	"testing"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/thermo"
)

// rigidSpheres returns a Model state for a mixture of rigid spheres of one
// diameter and the given molar masses (kg/mol) and mole fractions, at
// T = 300 K, P = 1 atm: A* = B* = C* = 1 for every pair, D_ij proportional
// to 1/sqrt(mu_ij) (Chapman-Enskog first approximation, Hirschfelder,
// Curtiss & Bird 1954, eq. 8.2-44), eta_i from the like bracket
// 4 n Omega(2,2)_ii = 8 A* g_ii. Only what thermalSystem reads is set.
func rigidSpheres(W, X []float64) (*Model, float64) {
	const T, P = 300.0, 101325.0
	K := len(W)
	f := &fitted{species: make([]molecule, K)}
	for k := range W {
		f.species[k].W = W[k]
	}
	t := newModel(f)
	t.cachedT = T
	t.tPow = T * math.Sqrt(T)
	copy(t.x, X)
	t.mc = &mcWork{cachedT: T, a: make([]float64, K*K), b: make([]float64, K*K), c: make([]float64, K*K),
		qSelf: make([]float64, K), sym: make([]float64, K*K), z: make([]float64, K), sx: make([]float64, K)}
	// D_ij P/T^(3/2) = d0/sqrt(mu_ij/(1 kg/mol)); d0 sets the size.
	const d0 = 1e-5 * 101325 / (300 * 17.32)
	q := func(i, j int) float64 { return math.Sqrt(W[i]*W[j]/(W[i]+W[j])) / d0 }
	for i := 0; i < K; i++ {
		for j := 0; j < K; j++ {
			t.mc.a[i*K+j], t.mc.b[i*K+j], t.mc.c[i*K+j] = 1, 1, 1 // 6C* - 5 = 1
			if i != j {
				t.q[i*K+j] = q(i, j)
			}
		}
		t.mc.qSelf[i] = q(i, i)
		gii := 3 * thermo.GasConstant * T * P * q(i, i) / (16 * t.tPow * (W[i] / 2))
		t.mu[i] = 5 * P / (16 * gii)
		t.lambda[i] = 3.75 * thermo.GasConstant * t.mu[i] / W[i] // atoms
	}
	return t, P
}

// Two limits in which the first approximation of the thermal diffusion
// ratio is known in closed form check the bracket integrals, their mixing
// and the normalisation against the Stefan-Maxwell relations.
func TestThermalDiffusionLimits(t *testing.T) {
	// Isotopic rigid spheres: k_T = (105/118) X1 X2 (W1 - W2)/(W1 + W2) to
	// first order in the mass difference, at any composition (Chapman &
	// Cowling 1970, sec. 10.3 (from memory): (15/2)(2A* + 5)(6C* - 5)/
	// (A*(16A* - 12B* + 55)) at A* = B* = C* = 1).
	for _, x1 := range []float64{0.1, 0.5, 0.9} {
		W := []float64{0.0401, 0.0400}
		m, P := rigidSpheres(W, []float64{x1, 1 - x1})
		out := MulticomponentProperties{ThermalDiffusionRatios: make([]float64, 2)}
		if err := m.thermalSystem(P, &out); err != nil {
			t.Fatal(err)
		}
		got := out.ThermalDiffusionRatios[0] / (x1 * (1 - x1) * (W[0] - W[1]) / (W[0] + W[1]))
		// The mass difference of 0.25% leaves a relative error of that order.
		if math.Abs(got-105.0/118) > 0.005 {
			t.Errorf("isotopic rigid spheres, X1 = %g: k_T/(X1 X2 dW/sumW) = %.5f, want 105/118 = %.5f", x1, got, 105.0/118)
		}
		if s := out.ThermalDiffusionRatios[0] + out.ThermalDiffusionRatios[1]; math.Abs(s) > 1e-15 {
			t.Errorf("isotopic rigid spheres: chi sums to %g", s)
		}
	}
	// Lorentzian gas (trace light spheres in heavy ones): the two-term
	// Sonine solution of the Lorentz collision operator, done by hand with
	// the Maxwellian moments <C^n> = Gamma((n+3)/2)/Gamma(3/2), gives
	// k_T/X1 = -5 (6C* - 5)/(25 - 12 B*) = -5/13 (the exact Lorentz value is
	// -1/2; Chapman & Cowling 1970, sec. 10.5, from memory).
	m, P := rigidSpheres([]float64{1e-6, 1}, []float64{1e-7, 1 - 1e-7})
	out := MulticomponentProperties{ThermalDiffusionRatios: make([]float64, 2)}
	if err := m.thermalSystem(P, &out); err != nil {
		t.Fatal(err)
	}
	if got := out.ThermalDiffusionRatios[0] / 1e-7; math.Abs(got+5.0/13) > 1e-3 {
		t.Errorf("Lorentzian rigid spheres: k_T/X1 = %.5f, want -5/13 = %.5f", got, -5.0/13)
	}
	// Pure gas: the conductivity is (15/4) R eta/W (Chapman-Enskog first
	// approximation, Hirschfelder, Curtiss & Bird 1954, eq. 8.2-31), also
	// when the gas is entered as two labels of the same species.
	m, P = rigidSpheres([]float64{0.04, 0.04}, []float64{0.3, 0.7})
	if err := m.thermalSystem(P, &out); err != nil {
		t.Fatal(err)
	}
	want := 3.75 * thermo.GasConstant * m.mu[0] / 0.04
	if e := math.Abs(out.Conductivity-want) / want; e > 1e-13 {
		t.Errorf("one gas under two labels: lambda = %.15g, want %.15g (rel. error %.2g)", out.Conductivity, want, e)
	}
}

// setState evaluates the fitted species and pair data at T and the floored
// composition of X, as Multicomponent does.
func setState(m *Model, T float64, X []float64) {
	m.setTemperature(T)
	m.setComposition(X)
}

// binaryD returns the fitted binary diffusion coefficient D_ij at the
// cached temperature, m^2/s.
func binaryD(m *Model, i, j int, P float64) float64 {
	return m.tPow / (P * m.q[i*len(m.x)+j])
}

func TestMulticomponentDiffusionBinaryAndTernary(t *testing.T) {
	mech, err := builtinHydrogen()
	if err != nil {
		t.Fatal(err)
	}
	m, err := New(mech, Options{})
	if err != nil {
		t.Fatal(err)
	}
	K := len(mech.Species)
	h2, o2, n2 := mech.SpeciesIndex("H2"), mech.SpeciesIndex("O2"), mech.SpeciesIndex("N2")
	const P = 101325.0
	D := make([]float64, K*K)
	// Binary: D_12 = D_21 = the binary coefficient (the other species sit
	// at the 1e-13 mole-fraction floor, which perturbs D by ~1e-13).
	for _, T := range []float64{300, 1500} {
		for _, x := range []float64{0.01, 0.5, 0.99} {
			X := make([]float64, K)
			X[h2], X[n2] = x, 1-x
			if err := m.MulticomponentDiffusion(T, P, X, D); err != nil {
				t.Fatal(err)
			}
			want := binaryD(m, h2, n2, P)
			for _, got := range []float64{D[h2*K+n2], D[n2*K+h2]} {
				if e := math.Abs(got-want) / want; e > 1e-10 {
					t.Errorf("H2-N2 X_H2 = %g, %g K: multicomponent D = %.12g, binary %.12g (rel. %.2g)", x, T, got, want, e)
				}
			}
		}
	}
	// Ternary H2/O2/N2: fluxes for a driving force d against the
	// Stefan-Maxwell relations solved by hand. With V3 = -(Y1 V1 + Y2 V2)/Y3
	// the relations of species 1 and 2 are
	//
	//	a11 V1 + a12 V2 = d1,  a21 V1 + a22 V2 = d2,
	//	a11 = -X1 X2/D12 - X1 X3/D13 (1 + Y1/Y3),  a12 = X1 X2/D12 - X1 X3 Y2/(D13 Y3),
	//	a21 = X1 X2/D12 - X2 X3 Y1/(D23 Y3),      a22 = -X1 X2/D12 - X2 X3/D23 (1 + Y2/Y3),
	//
	// and Cramer's rule gives V1, V2.
	const T = 1200.0
	X := make([]float64, K)
	X[h2], X[o2], X[n2] = 0.3, 0.15, 0.55
	setState(m, T, X)
	x1, x2, x3 := m.x[h2], m.x[o2], m.x[n2]
	W1, W2, W3 := m.fit.species[h2].W, m.fit.species[o2].W, m.fit.species[n2].W
	wm := x1*W1 + x2*W2 + x3*W3
	y1, y2, y3 := x1*W1/wm, x2*W2/wm, x3*W3/wm
	d12, d13, d23 := binaryD(m, h2, o2, P), binaryD(m, h2, n2, P), binaryD(m, o2, n2, P)
	a11 := -x1*x2/d12 - x1*x3/d13*(1+y1/y3)
	a12 := x1*x2/d12 - x1*x3*y2/(d13*y3)
	a21 := x1*x2/d12 - x2*x3*y1/(d23*y3)
	a22 := -x1*x2/d12 - x2*x3/d23*(1+y2/y3)
	dv := []float64{120, -200, 80} // 1/m, sums to zero
	det := a11*a22 - a12*a21
	v1 := (dv[0]*a22 - a12*dv[1]) / det
	v2 := (a11*dv[1] - a21*dv[0]) / det
	v3 := -(y1*v1 + y2*v2) / y3
	sm := NewStefanMaxwell(K)
	if err := m.Multicomponent(T, P, X, sm, nil); err != nil {
		t.Fatal(err)
	}
	d := make([]float64, K)
	d[h2], d[o2], d[n2] = dv[0], dv[1], dv[2]
	N := make([]float64, K)
	sm.MolarFluxes(d, N)
	for i, c := range []struct {
		k    int
		x, v float64
	}{{h2, x1, v1}, {o2, x2, v2}, {n2, x3, v3}} {
		if got := N[c.k] / c.x; math.Abs(got-c.v) > 1e-9*math.Abs(c.v) {
			t.Errorf("ternary: V_%d = %.12g m/s, hand calculation %.12g", i+1, got, c.v)
		}
	}
}

// builtinHydrogen returns the built-in Burke et al. (2012) H2/O2 mechanism,
// whose species include He, Ar, N2, CO and CO2.
func builtinHydrogen() (*chem.Mechanism, error) { return builtin.Mechanism("burke2012-hydrogen") }
