package thermo

import (
	"fmt"
	"strings"
)

// WaterVaporisationEnthalpy is the enthalpy of vaporisation of water at
// 298.15 K in J/mol: Δh_f°(H2O, g) - Δh_f°(H2O, l) = -241.826 + 285.830
// kJ/mol, the CODATA key values (Cox, Wagman & Medvedev 1989) as listed in
// the NIST Chemistry WebBook (44.0 kJ/mol).
const WaterVaporisationEnthalpy = 44.004e3

// LowerHeatingValue returns the lower heating value of the gas mixture fuel
// (mole fractions over the set, normalised here) in J per kg of fuel: the
// enthalpy released at 298.15 K by complete combustion with O2 to CO2,
// H2O (gas) and N2, noble gases unchanged,
//
//	LHV = -[sum_p ν_p h_p - sum_k X_k h_k - ν_O2 h_O2](298.15 K) / sum_k X_k W_k
//
// from the set's own thermo data. The set must contain the products needed
// (CO2, H2O, N2, O2, found by composition).
func (s *SpeciesSet) LowerHeatingValue(fuel []float64) (float64, error) {
	lhv, _, err := s.heatingValues(fuel)
	return lhv, err
}

// HigherHeatingValue returns the higher heating value of fuel in J per kg
// of fuel: the lower heating value plus the condensation enthalpy of the
// product water, WaterVaporisationEnthalpy per mole.
func (s *SpeciesSet) HigherHeatingValue(fuel []float64) (float64, error) {
	lhv, water, err := s.heatingValues(fuel)
	if err != nil {
		return 0, err
	}
	return lhv + water*WaterVaporisationEnthalpy, nil
}

// heatingValues returns the LHV (J/kg) and the moles of product water per
// kg of fuel.
func (s *SpeciesSet) heatingValues(fuel []float64) (lhv, waterPerKg float64, err error) {
	nuO2, sum, err := s.oxygenBalance("heating value: fuel", fuel)
	if err != nil {
		return 0, 0, err
	}
	var nC, nH, nN, hFuel, mass float64
	for k, x := range fuel {
		if x == 0 {
			continue
		}
		x /= sum
		for e, n := range s.Species[k].Composition {
			switch strings.ToUpper(e) {
			case "C":
				nC += x * n
			case "H":
				nH += x * n
			case "N":
				nN += x * n
			}
		}
		hFuel += x * s.Species[k].FormationEnthalpy()
		mass += x * s.MolarMass[k]
	}
	dH := -hFuel
	for _, p := range []struct {
		nu   float64
		comp map[string]float64
	}{
		{nC, map[string]float64{"C": 1, "O": 2}},
		{nH / 2, map[string]float64{"H": 2, "O": 1}},
		{nN / 2, map[string]float64{"N": 2}},
		{-nuO2, map[string]float64{"O": 2}},
	} {
		if p.nu == 0 {
			continue
		}
		k := s.byComposition(p.comp)
		if k < 0 {
			return 0, 0, fmt.Errorf("heating value: the species set has no gas species of composition %v, needed for complete combustion", p.comp)
		}
		dH += p.nu * s.Species[k].FormationEnthalpy()
	}
	return -dH / mass, nH / 2 / mass, nil
}

// byComposition returns the gas species whose elemental composition is
// exactly comp (upper-case symbols), or -1.
func (s *SpeciesSet) byComposition(comp map[string]float64) int {
	nE := len(s.Elements)
	for k := range s.Species {
		if !s.gas[k] {
			continue
		}
		match := true
		for e := 0; e < nE && match; e++ {
			match = s.atoms[k*nE+e] == comp[s.Elements[e]]
		}
		for e := range comp {
			if s.ElementIndex(e) < 0 {
				match = false
			}
		}
		if match {
			return k
		}
	}
	return -1
}
