package thermo

import (
	"fmt"
	"math"
	"strings"
)

// inertElements take no part in the oxygen balance of PremixedMoleFractions
// and the heating values: nitrogen leaves as N2, noble gases unchanged.
var inertElements = map[string]bool{"N": true, "AR": true, "HE": true, "NE": true, "KR": true, "XE": true}

// oxygenDemand returns the moles of O2 species k needs for complete
// combustion to CO2 and H2O, net of its own oxygen:
//
//	d_k = n_C + n_H/4 - n_O/2
//
// negative for oxygen carriers. It fails for an element whose combustion
// product is not defined here.
func (s *SpeciesSet) oxygenDemand(k int) (float64, error) {
	d := 0.0
	comp := s.Species[k].Composition
	for _, e := range sortedKeys(comp) { // fixed order: reproducible sums
		n := comp[e]
		switch u := strings.ToUpper(e); {
		case u == "C":
			d += n
		case u == "H":
			d += n / 4
		case u == "O":
			d -= n / 2
		case inertElements[u]:
		default:
			return 0, fmt.Errorf("species %q contains %s, for which no combustion product is defined (only C->CO2, H->H2O; N and noble gases inert)",
				s.Species[k].Name, e)
		}
	}
	return d, nil
}

// normalisedComposition checks that v is a valid composition over the set
// (right length, finite, non-negative, positive sum, no condensed species)
// and returns its sum.
func (s *SpeciesSet) normalisedComposition(what string, v []float64) (float64, error) {
	if err := s.checkLen(what, v); err != nil {
		return 0, err
	}
	sum := 0.0
	for k, x := range v {
		if x < 0 || math.IsNaN(x) || math.IsInf(x, 0) {
			return 0, fmt.Errorf("%s: mole fraction of %s is %g", what, s.Species[k].Name, x)
		}
		if x > 0 && !s.gas[k] {
			return 0, fmt.Errorf("%s: %s is a condensed species and cannot be part of a gas mixture", what, s.Species[k].Name)
		}
		sum += x
	}
	if !(sum > 0) {
		return 0, fmt.Errorf("%s: all mole fractions are zero", what)
	}
	return sum, nil
}

// StoichiometricOxygen returns the moles of O2 needed to burn one mole of
// the gas mixture fuel (mole fractions over the set, normalised here)
// completely to CO2 and H2O:
//
//	ν_O2 = sum_k X_k (n_C,k + n_H,k/4 - n_O,k/2)
//
// Oxygen held by the fuel is credited; N and noble gases are inert. The
// result is negative for a net oxygen carrier.
func (s *SpeciesSet) StoichiometricOxygen(fuel []float64) (float64, error) {
	nu, _, err := s.oxygenBalance("fuel", fuel)
	return nu, err
}

// oxygenBalance returns the O2 demand per mole of the mixture v (see
// StoichiometricOxygen) and the sum of v.
func (s *SpeciesSet) oxygenBalance(what string, v []float64) (nu, sum float64, err error) {
	sum, err = s.normalisedComposition(what, v)
	if err != nil {
		return 0, 0, err
	}
	for k, x := range v {
		if x == 0 {
			continue
		}
		d, err := s.oxygenDemand(k)
		if err != nil {
			return 0, 0, fmt.Errorf("%s: %w", what, err)
		}
		nu += x / sum * d
	}
	return nu, sum, nil
}

// PremixedMoleFractions returns the mole fractions of a fuel-oxidizer
// mixture at equivalence ratio phi. fuel and oxidizer are mole fractions
// over the set's species (normalised here). The equivalence ratio is taken
// on an O2-equivalent basis from elemental composition: the fuel needs
// ν_f = StoichiometricOxygen(fuel) moles of O2 per mole and one mole of
// oxidizer supplies ν_o = -StoichiometricOxygen(oxidizer), so
//
//	n_fuel / n_ox = phi ν_o / ν_f.
//
// Oxygen in the fuel and carbon or hydrogen in the oxidizer are counted;
// N, Ar, He and other noble gases are inert.
func (s *SpeciesSet) PremixedMoleFractions(fuel, oxidizer []float64, phi float64) ([]float64, error) {
	if !(phi > 0) || math.IsInf(phi, 0) {
		return nil, fmt.Errorf("premixed composition: equivalence ratio must be positive and finite, got %g", phi)
	}
	nuF, sf, err := s.oxygenBalance("fuel", fuel)
	if err != nil {
		return nil, fmt.Errorf("premixed composition: %w", err)
	}
	if !(nuF > 0) {
		return nil, fmt.Errorf("premixed composition: the fuel needs no oxygen (net O2 demand %g mol per mol): it has no oxidisable C or H beyond its own oxygen", nuF)
	}
	nuO, so, err := s.oxygenBalance("oxidizer", oxidizer)
	if err != nil {
		return nil, fmt.Errorf("premixed composition: %w", err)
	}
	nuO = -nuO
	if !(nuO > 0) {
		return nil, fmt.Errorf("premixed composition: the oxidizer supplies no oxygen (net O2 supply %g mol per mol)", nuO)
	}
	// Moles per (phi ν_o + ν_f) of mixture: phi ν_o of fuel, ν_f of oxidizer.
	a, b := phi*nuO, nuF
	X := make([]float64, len(s.Species))
	for k := range X {
		X[k] = (a*fuel[k]/sf + b*oxidizer[k]/so) / (a + b)
	}
	return X, nil
}
