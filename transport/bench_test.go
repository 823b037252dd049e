package transport_test

import (
	"testing"

	"flame1d/chem"
	"flame1d/transport"
)

// airMethane returns stoichiometric CH4-air mole fractions with traces of
// every other species (1e-6), so every term of every sum is exercised.
func airMethane(m *chem.Mechanism) []float64 {
	X := make([]float64, len(m.Species))
	for k := range X {
		X[k] = 1e-6
	}
	X[m.SpeciesIndex("CH4")] = 0.095
	X[m.SpeciesIndex("O2")] = 0.19
	X[m.SpeciesIndex("N2")] = 0.715
	return X
}

// BenchmarkMixture measures one full Mixture evaluation for GRI-Mech 3.0 at
// a new temperature each call (so the per-T species and pair fits are
// re-evaluated). Target: <= 20 us.
func BenchmarkMixture(b *testing.B) {
	m, tr := natgas(b)
	X := airMethane(m)
	K := len(X)
	out := transport.MixtureProperties{Diffusion: make([]float64, K), ThermalDiffusionRatios: make([]float64, K)}
	T := [2]float64{1200, 1201}
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		tr.Mixture(T[i&1], 101325, X, nil, &out)
	}
}

// BenchmarkMixtureSameT measures Mixture at a fixed temperature (a Jacobian
// column of the flame solver), where only the mixing rules run.
func BenchmarkMixtureSameT(b *testing.B) {
	m, tr := natgas(b)
	X := airMethane(m)
	K := len(X)
	out := transport.MixtureProperties{Diffusion: make([]float64, K), ThermalDiffusionRatios: make([]float64, K)}
	b.ReportAllocs()
	for b.Loop() {
		tr.Mixture(1200, 101325, X, nil, &out)
	}
}

// BenchmarkNew measures building the Model (all fits) for GRI-Mech 3.0.
func BenchmarkNew(b *testing.B) {
	m, _ := natgas(b)
	for b.Loop() {
		if _, err := transport.New(m, transport.Options{}); err != nil {
			b.Fatal(err)
		}
	}
}
