package thermo

import (
	"fmt"
	"math"
)

// Mixture functions treat the set as one ideal-gas phase. Mole fractions X
// and mass fractions Y are over all species of the set and are expected to
// sum to 1; condensed species, if any, should carry zero fraction. None of
// these functions allocates.

// MeanMolarMassX returns the mean molar mass sum_k X_k W_k in kg/mol.
func (s *SpeciesSet) MeanMolarMassX(X []float64) float64 {
	w := 0.0
	for k, x := range X[:len(s.MolarMass)] {
		w += x * s.MolarMass[k]
	}
	return w
}

// MeanMolarMassY returns the mean molar mass 1 / sum_k (Y_k/W_k) in kg/mol.
func (s *SpeciesSet) MeanMolarMassY(Y []float64) float64 {
	inv := 0.0
	for k, y := range Y[:len(s.invMass)] {
		inv += y * s.invMass[k]
	}
	return 1 / inv
}

// MoleToMass converts mole fractions X to mass fractions Y = X_k W_k / W̄.
func (s *SpeciesSet) MoleToMass(X, Y []float64) {
	inv := 1 / s.MeanMolarMassX(X)
	for k, x := range X[:len(s.MolarMass)] {
		Y[k] = x * s.MolarMass[k] * inv
	}
}

// MassToMole converts mass fractions Y to mole fractions X = Y_k W̄ / W_k.
func (s *SpeciesSet) MassToMole(Y, X []float64) {
	w := s.MeanMolarMassY(Y)
	for k, y := range Y[:len(s.invMass)] {
		X[k] = y * s.invMass[k] * w
	}
}

// Density returns the ideal-gas density ρ = P W̄ / (R T) in kg/m^3 for
// pressure P (Pa), temperature T (K) and mass fractions Y.
func (s *SpeciesSet) Density(P, T float64, Y []float64) float64 {
	return P * s.MeanMolarMassY(Y) / (GasConstant * T)
}

// ConcentrationsFromMass writes the molar concentrations C_k = ρ Y_k / W_k
// (mol/m^3) into C, for pressure P (Pa), temperature T (K) and mass
// fractions Y.
func (s *SpeciesSet) ConcentrationsFromMass(P, T float64, Y, C []float64) {
	rho := s.Density(P, T, Y)
	for k, y := range Y[:len(s.invMass)] {
		C[k] = rho * y * s.invMass[k]
	}
}

// CpMole returns the mixture molar heat capacity sum_k X_k cp_k in
// J/(mol K).
func (s *SpeciesSet) CpMole(T float64, X []float64) float64 {
	c := 0.0
	for k, x := range X[:len(s.Species)] {
		if x != 0 {
			c += x * s.Species[k].Thermo.CpR(T)
		}
	}
	return GasConstant * c
}

// CpMass returns the mixture specific heat capacity sum_k Y_k cp_k / W_k in
// J/(kg K).
func (s *SpeciesSet) CpMass(T float64, Y []float64) float64 {
	c := 0.0
	for k, y := range Y[:len(s.Species)] {
		if y != 0 {
			c += y * s.Species[k].Thermo.CpR(T) * s.invMass[k]
		}
	}
	return GasConstant * c
}

// EnthalpyMole returns the mixture molar enthalpy sum_k X_k h_k in J/mol.
func (s *SpeciesSet) EnthalpyMole(T float64, X []float64) float64 {
	h := 0.0
	for k, x := range X[:len(s.Species)] {
		if x != 0 {
			h += x * s.Species[k].Thermo.HRT(T)
		}
	}
	return GasConstant * T * h
}

// EnthalpyMass returns the mixture specific enthalpy sum_k Y_k h_k / W_k in
// J/kg.
func (s *SpeciesSet) EnthalpyMass(T float64, Y []float64) float64 {
	h, _ := s.enthalpyCpMass(T, Y)
	return h
}

// enthalpyCpMass returns the mixture specific enthalpy (J/kg) and heat
// capacity (J/(kg K)) in one pass.
func (s *SpeciesSet) enthalpyCpMass(T float64, Y []float64) (h, cp float64) {
	for k, y := range Y[:len(s.Species)] {
		if y == 0 {
			continue
		}
		p := &s.Species[k].Thermo
		w := y * s.invMass[k]
		h += w * p.HRT(T)
		cp += w * p.CpR(T)
	}
	return GasConstant * T * h, GasConstant * cp
}

// EntropyMole returns the molar entropy of the ideal-gas mixture at T (K)
// and P (Pa), including the entropy of mixing:
//
//	s = sum_k X_k [ s°_k(T) - R ln(X_k P / P°) ]    J/(mol K)
//
// with P° = StandardPressure; terms with X_k = 0 vanish (x ln x -> 0).
// Condensed species contribute s°_k without a mixing term.
func (s *SpeciesSet) EntropyMole(T, P float64, X []float64) float64 {
	lp := math.Log(P / StandardPressure)
	sum := 0.0
	for k, x := range X[:len(s.Species)] {
		if x <= 0 {
			continue
		}
		sk := s.Species[k].Thermo.SR(T)
		if s.gas[k] {
			sk -= math.Log(x) + lp
		}
		sum += x * sk
	}
	return GasConstant * sum
}

// EntropyMass returns the specific entropy of the ideal-gas mixture in
// J/(kg K): EntropyMole with X_k = Y_k W̄ / W_k, divided by W̄.
func (s *SpeciesSet) EntropyMass(T, P float64, Y []float64) float64 {
	w := s.MeanMolarMassY(Y)
	lp := math.Log(P / StandardPressure)
	sum := 0.0
	for k, y := range Y[:len(s.Species)] {
		if y <= 0 {
			continue
		}
		sk := s.Species[k].Thermo.SR(T)
		if s.gas[k] {
			sk -= math.Log(y*s.invMass[k]*w) + lp
		}
		sum += y * s.invMass[k] * sk
	}
	return GasConstant * sum
}

// Temperature search limits of TemperatureFromEnthalpy, K. They lie beyond
// the fitted range of every published NASA-7 set (200-6000 K) so that a
// mildly extrapolated state is still found.
const (
	minSearchTemperature = 50.0
	maxSearchTemperature = 10000.0
)

// TemperatureFromEnthalpy returns the temperature (K) at which a mixture of
// mass fractions Y has specific enthalpy hMass (J/kg), at fixed composition.
// It uses Newton's method on h(T) - hMass = 0 with slope cp(T), falling back
// to bisection inside the bracket found so far whenever a Newton step leaves
// it or cp is not positive. Tguess <= 0 starts at 1000 K.
func (s *SpeciesSet) TemperatureFromEnthalpy(hMass float64, Y []float64, Tguess float64) (float64, error) {
	if math.IsNaN(hMass) || math.IsInf(hMass, 0) {
		return 0, fmt.Errorf("temperature from enthalpy: enthalpy %g J/kg is not finite", hMass)
	}
	T := Tguess
	if !(T >= minSearchTemperature && T <= maxSearchTemperature) {
		T = 1000
	}
	lo, hi := minSearchTemperature, maxSearchTemperature
	loOK, hiOK := false, false // whether f(lo) < 0 and f(hi) > 0 have been seen
	for iter := 0; iter < 200; iter++ {
		h, cp := s.enthalpyCpMass(T, Y)
		f := h - hMass
		if math.IsNaN(f) {
			return 0, fmt.Errorf("temperature from enthalpy: enthalpy is NaN at %g K (check the mass fractions)", T)
		}
		scale := math.Abs(hMass) + math.Abs(cp)*T + 1
		if math.Abs(f) <= 1e-13*scale {
			return T, nil
		}
		if f < 0 {
			lo, loOK = T, true
		} else {
			hi, hiOK = T, true
		}
		next := T - f/cp
		inside := cp > 0 && next > lo && next < hi
		switch {
		case inside:
		case loOK && hiOK:
			next = 0.5 * (lo + hi)
		case f < 0:
			if T >= maxSearchTemperature {
				return 0, fmt.Errorf("temperature from enthalpy: %g J/kg is above the mixture's enthalpy at %g K", hMass, maxSearchTemperature)
			}
			next = math.Min(2*T, maxSearchTemperature)
		default:
			if T <= minSearchTemperature {
				return 0, fmt.Errorf("temperature from enthalpy: %g J/kg is below the mixture's enthalpy at %g K", hMass, minSearchTemperature)
			}
			next = math.Max(0.5*T, minSearchTemperature)
		}
		if math.Abs(next-T) <= 1e-12*T {
			return next, nil
		}
		T = next
	}
	return 0, fmt.Errorf("temperature from enthalpy: no convergence for %g J/kg after 200 iterations (last T %g K)", hMass, T)
}
