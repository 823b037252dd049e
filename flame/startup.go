package flame

import (
	"flame1d/thermo"
)

// equilibriumState is the adiabatic equilibrium of an inlet mixture.
type equilibriumState struct {
	T float64   // K
	Y []float64 // mass fractions
}

// adiabaticEquilibrium returns the complete-equilibrium products of the inlet
// at constant enthalpy and pressure over all mechanism species.
func adiabaticEquilibrium(ph *physics, in Inlet) (equilibriumState, error) {
	K := ph.nSpecies
	moles := make([]float64, K)
	for k := 0; k < K; k++ {
		moles[k] = in.Y[k] * ph.invW[k]
	}
	res, err := ph.set.AdiabaticFlame(in.T, in.P, moles, thermo.EquilibriumOptions{})
	if err != nil {
		return equilibriumState{}, err
	}
	Y := make([]float64, K)
	sum := 0.0
	for k := 0; k < K; k++ {
		Y[k] = res.Moles[k] * ph.molarMass[k]
		sum += Y[k]
	}
	for k := range Y {
		Y[k] /= sum
	}
	return equilibriumState{T: res.T, Y: Y}, nil
}
