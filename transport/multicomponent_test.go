package transport_test

import (
	"math"
	"testing"

	"flame1d/transport"
)

// The mass fluxes rho (W_k/W) N_k of the Stefan-Maxwell solution sum to
// zero to round-off for a 53-species mixture with traces of everything.
func TestMulticomponentFluxesSumToZero(t *testing.T) {
	m, tr := natgas(t)
	K := len(m.Species)
	X := airMethane(m)
	W, _ := m.MolarMasses()
	sm := transport.NewStefanMaxwell(K)
	out := transport.MulticomponentProperties{ThermalDiffusionRatios: make([]float64, K)}
	for _, T := range []float64{300, 1200, 2400} {
		if err := tr.Multicomponent(T, 101325, X, sm, &out); err != nil {
			t.Fatal(err)
		}
		d := make([]float64, K)
		for k := range d {
			d[k] = math.Sin(float64(7*k+1)) * 100 // not summing to zero on purpose
			d[k] += out.ThermalDiffusionRatios[k] * 500
		}
		N := make([]float64, K)
		sm.MolarFluxes(d, N)
		sum, scale := 0.0, 0.0
		for k := range N {
			sum += W[k] * N[k]
			scale += math.Abs(W[k] * N[k])
		}
		if math.Abs(sum) > 1e-14*scale {
			t.Errorf("%g K: sum W_k N_k = %.3g, sum |W_k N_k| = %.3g", T, sum, scale)
		}
		chiSum, chiScale := 0.0, 0.0
		for _, c := range out.ThermalDiffusionRatios {
			chiSum += c
			chiScale += math.Abs(c)
		}
		if math.Abs(chiSum) > 1e-13*chiScale {
			t.Errorf("%g K: thermal diffusion ratios sum to %.3g (sum |chi| %.3g)", T, chiSum, chiScale)
		}
	}
}

// Thermal diffusion factors alpha_T = -chi_light/(X1 X2) of equimolar
// binaries against measurements. The first Chapman-Enskog approximation
// [k_T]_1 is known to fall a few per cent below the converged kinetic
// theory for these pairs (Mason, J. Chem. Phys. 27 (1957) 75, from memory);
// the bands are the scatter of the measurements collected by Grew & Ibbs,
// Thermal Diffusion in Gases (Cambridge 1952), near room temperature
// (values from memory). The mixture-averaged ratios are checked as well.
func TestThermalDiffusionFactorsAgainstMeasurements(t *testing.T) {
	m, tr := hydrogen(t)
	K := len(m.Species)
	for _, c := range []struct {
		light, heavy string
		T, lo, hi    float64
	}{
		{"H2", "N2", 300, 0.31, 0.37},  // Grew & Ibbs 1952: about 0.34 (from memory)
		{"HE", "AR", 330, 0.35, 0.41},  // Grew & Ibbs 1952: about 0.38 (from memory)
		{"H2", "CO2", 300, 0.26, 0.32}, // Grew & Ibbs 1952: about 0.29 (from memory)
	} {
		a, b := index(t, m, c.light), index(t, m, c.heavy)
		X := make([]float64, K)
		X[a], X[b] = 0.5, 0.5
		out := transport.MulticomponentProperties{ThermalDiffusionRatios: make([]float64, K)}
		if err := tr.Multicomponent(c.T, 101325, X, nil, &out); err != nil {
			t.Fatal(err)
		}
		alpha := -out.ThermalDiffusionRatios[a] / 0.25
		theta := make([]float64, K)
		tr.ThermalDiffusionRatios(c.T, X, theta)
		t.Logf("%s-%s %g K: alpha_T multicomponent %.3f, mixture-averaged %.3f, measured %.2f-%.2f",
			c.light, c.heavy, c.T, alpha, -theta[a]/0.25, c.lo, c.hi)
		for _, v := range []float64{alpha, -theta[a] / 0.25} {
			if v < c.lo || v > c.hi {
				t.Errorf("%s-%s %g K: alpha_T = %.3f, measured %.2f-%.2f", c.light, c.heavy, c.T, v, c.lo, c.hi)
			}
		}
	}
}

// A pure species (others at the 1e-13 floor) has its own conductivity:
// translational part from the Sonine system plus its internal part.
func TestMulticomponentConductivityPureSpecies(t *testing.T) {
	m, tr := natgas(t)
	K := len(m.Species)
	out := transport.MulticomponentProperties{}
	for _, T := range []float64{300, 1000, 2500} {
		for k := 0; k < K; k++ {
			X := make([]float64, K)
			X[k] = 1
			if err := tr.Multicomponent(T, 101325, X, nil, &out); err != nil {
				t.Fatal(err)
			}
			want := tr.Conductivity(T, X) // the fitted species value (MTS of a pure gas)
			if e := math.Abs(out.Conductivity-want) / want; e > 1e-9 {
				t.Errorf("%s %g K: multicomponent lambda %.6g, species %.6g", m.Species[k].Name, T, out.Conductivity, want)
			}
		}
	}
}

// The multicomponent fits reproduce the collision-integral table to the
// same design limit as the mixture-averaged ones (< 0.5%; the ratios A*, B*,
// 6C* - 5 are of order 1 and measured absolutely).
func TestMulticomponentFitError(t *testing.T) {
	_, tr := natgas(t)
	e, what, err := tr.MulticomponentFitError()
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("multicomponent fits: largest error %.3g (%s)", e, what)
	if !(e > 0 && e < 0.005) {
		t.Errorf("multicomponent fit error %.3g (%s), want 0 < e < 0.005", e, what)
	}
}

// BenchmarkMulticomponent measures the multicomponent properties of
// GRI-Mech 3.0 at one state (a new temperature each call): the factorised
// Stefan-Maxwell system, the conductivity and every thermal diffusion
// ratio. Target: <= 150 us.
func BenchmarkMulticomponent(b *testing.B) {
	m, tr := natgas(b)
	X := airMethane(m)
	K := len(X)
	sm := transport.NewStefanMaxwell(K)
	out := transport.MulticomponentProperties{ThermalDiffusionRatios: make([]float64, K)}
	T := [2]float64{1200, 1201}
	if _, _, err := tr.MulticomponentFitError(); err != nil { // the fits, made once
		b.Fatal(err)
	}
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		if err := tr.Multicomponent(T[i&1], 101325, X, sm, &out); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStefanMaxwellSolve measures one solve of a factorised GRI-Mech
// 3.0 Stefan-Maxwell system for new driving forces: the cost of a flux in
// a frozen-property Jacobian column of the flame solver.
func BenchmarkStefanMaxwellSolve(b *testing.B) {
	m, tr := natgas(b)
	X := airMethane(m)
	K := len(X)
	sm := transport.NewStefanMaxwell(K)
	if err := tr.Multicomponent(1200, 101325, X, sm, nil); err != nil {
		b.Fatal(err)
	}
	d := make([]float64, K)
	for k := range d {
		d[k] = math.Sin(float64(k))
	}
	N := make([]float64, K)
	b.ReportAllocs()
	for b.Loop() {
		sm.MolarFluxes(d, N)
	}
}
