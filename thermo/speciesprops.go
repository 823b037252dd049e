package thermo

// ReferenceTemperature is the thermochemical reference temperature, 298.15 K.
const ReferenceTemperature = 298.15

// CpMole returns the species' standard-state molar heat capacity
// cp = R (cp/R) in J/(mol K).
func (s *Species) CpMole(T float64) float64 { return GasConstant * s.Thermo.CpR(T) }

// EnthalpyMole returns the species' molar enthalpy h = R T (h/RT) in J/mol,
// on the usual scale where the elements in their reference states have
// h(298.15 K) = 0.
func (s *Species) EnthalpyMole(T float64) float64 { return GasConstant * T * s.Thermo.HRT(T) }

// EntropyMole returns the species' standard-state molar entropy
// s° = R (s/R) in J/(mol K), at StandardPressure.
func (s *Species) EntropyMole(T float64) float64 { return GasConstant * s.Thermo.SR(T) }

// GibbsMole returns the species' standard-state molar Gibbs energy
// g° = h - T s° in J/mol.
func (s *Species) GibbsMole(T float64) float64 { return GasConstant * T * s.Thermo.GRT(T) }

// FormationEnthalpy returns the standard enthalpy of formation at 298.15 K in
// J/mol. NASA polynomials are written on the scale where h(298.15 K) of the
// elements in their reference states is zero, so Δh_f°(298.15 K) is the
// species' own h(298.15 K) (McBride, Gordon & Reno 1993, NASA TM-4513, sec. 2).
func (s *Species) FormationEnthalpy() float64 { return s.EnthalpyMole(ReferenceTemperature) }

// SpeciesCpMole writes each species' standard-state molar heat capacity,
// J/(mol K), into cp.
func (s *SpeciesSet) SpeciesCpMole(T float64, cp []float64) {
	for k := range s.Species {
		cp[k] = GasConstant * s.Species[k].Thermo.CpR(T)
	}
}

// SpeciesEnthalpyMole writes each species' molar enthalpy, J/mol, into h.
func (s *SpeciesSet) SpeciesEnthalpyMole(T float64, h []float64) {
	rt := GasConstant * T
	for k := range s.Species {
		h[k] = rt * s.Species[k].Thermo.HRT(T)
	}
}

// SpeciesEntropyMole writes each species' standard-state molar entropy,
// J/(mol K) at StandardPressure, into sStd.
func (s *SpeciesSet) SpeciesEntropyMole(T float64, sStd []float64) {
	for k := range s.Species {
		sStd[k] = GasConstant * s.Species[k].Thermo.SR(T)
	}
}

// SpeciesGibbsMole writes each species' standard-state molar Gibbs energy,
// J/mol, into g.
func (s *SpeciesSet) SpeciesGibbsMole(T float64, g []float64) {
	rt := GasConstant * T
	for k := range s.Species {
		g[k] = rt * s.Species[k].Thermo.GRT(T)
	}
}

// SpeciesCpMass writes each species' specific heat capacity cp_k/W_k,
// J/(kg K), into cp.
func (s *SpeciesSet) SpeciesCpMass(T float64, cp []float64) {
	s.SpeciesCpMole(T, cp)
	s.perMass(cp)
}

// SpeciesEnthalpyMass writes each species' specific enthalpy h_k/W_k, J/kg,
// into h.
func (s *SpeciesSet) SpeciesEnthalpyMass(T float64, h []float64) {
	s.SpeciesEnthalpyMole(T, h)
	s.perMass(h)
}

// SpeciesEntropyMass writes each species' standard-state specific entropy
// s°_k/W_k, J/(kg K), into sStd.
func (s *SpeciesSet) SpeciesEntropyMass(T float64, sStd []float64) {
	s.SpeciesEntropyMole(T, sStd)
	s.perMass(sStd)
}

// SpeciesGibbsMass writes each species' standard-state specific Gibbs
// energy g°_k/W_k, J/kg, into g.
func (s *SpeciesSet) SpeciesGibbsMass(T float64, g []float64) {
	s.SpeciesGibbsMole(T, g)
	s.perMass(g)
}

// perMass divides per-mole species values by the molar masses in place.
func (s *SpeciesSet) perMass(v []float64) {
	for k, inv := range s.invMass {
		v[k] *= inv
	}
}
