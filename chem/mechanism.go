// Package chem is the reacting-gas model: a mechanism (elements, species with
// thermo and transport parameters, reactions), its validation, readers and
// writers, and the evaluation of reaction rates.
//
// Units are SI inside the package: concentrations in mol/m^3, rate constants
// in (m^3/mol)^(n-1)/s for a step of overall order n, activation energies in
// J/mol, pressures in Pa. Readers convert at the edge.
package chem

import "flame1d/thermo"

// Mechanism is a complete gas-phase reaction model.
type Mechanism struct {
	Name string
	// Description is free text kept with the mechanism: citation, origin,
	// edits. Readers and writers carry it through unchanged.
	Description string
	Elements    []string // element symbols, upper case, in declaration order
	Species     []Species
	Reactions   []Reaction
	// Validity says which fuels and conditions the mechanism was built and
	// validated for, as its publication states; nil when unknown.
	Validity *Validity
}

// Validity is the range a mechanism's authors built and validated it for
// (fuels, unburned temperature, pressure, equivalence ratio), with the
// source of that statement. Users are warned when a flame lies outside it.
// A zero range bound means "not stated".
type Validity struct {
	Fuels            []string   // mechanism species names of the fuels it was validated for
	Temperature      [2]float64 // unburned temperature range, K
	Pressure         [2]float64 // pressure range, Pa
	EquivalenceRatio [2]float64 // equivalence-ratio range
	Source           string     // where the statement comes from (publication, section)
}

// Species is a mechanism species: thermodynamics plus optional transport data.
type Species struct {
	thermo.Species
	Transport *TransportParams // nil when the mechanism has none for it
	Origin    Position         // where the thermo record was read
}

// TransportParams are the kinetic-theory parameters of a species for a
// Lennard-Jones (12-6) or Stockmayer potential. SI units.
type TransportParams struct {
	Geometry       Geometry
	WellDepth      float64 // epsilon/k_B, K
	Diameter       float64 // Lennard-Jones collision diameter sigma, m
	Dipole         float64 // permanent dipole moment, C m (1 debye = 3.33564e-30 C m)
	Polarizability float64 // polarizability volume, m^3 (1 Å^3 = 1e-30 m^3)
	RotRelaxation  float64 // rotational relaxation collision number Z_rot at 298 K
}

// Geometry is the shape class of a molecule for its internal degrees of freedom.
type Geometry int

const (
	Atom      Geometry = 0
	Linear    Geometry = 1
	Nonlinear Geometry = 2
)

// Position is a place in a source file, for error messages.
type Position struct {
	File string
	Line int
}

// Participant is one species in a reaction with its stoichiometric coefficient
// (positive; non-integer allowed).
type Participant struct {
	Species     int // index into Mechanism.Species
	Coefficient float64
}

// Arrhenius is k = A T^B exp(-E/(R T)).
type Arrhenius struct {
	A float64 // SI: (m^3/mol)^(n-1)/s
	B float64 // temperature exponent
	E float64 // activation energy, J/mol
}

// RateForm says how a reaction's forward rate constant depends on T and P.
type RateForm int

const (
	// Elementary: k = Arrhenius(T).
	Elementary RateForm = iota
	// ThreeBody: k = Arrhenius(T) * [M], [M] the efficiency-weighted
	// total concentration (ThirdBody).
	ThreeBody
	// Falloff: unimolecular/recombination falloff between Falloff.Low (k0,
	// multiplied by [M]) and Falloff.High (k_inf); k = k_inf Pr/(1+Pr) F.
	Falloff
	// ChemicallyActivated: bimolecular falloff, k = k0 /(1+Pr) F.
	ChemicallyActivated
	// PressureTable: logarithmic interpolation in P between Arrhenius sets
	// given at several pressures (PressureRates).
	PressureTable
	// Chebyshev: log10 k as a Chebyshev series in reduced 1/T and log P.
	Chebyshev
)

// Reaction is one reaction step.
type Reaction struct {
	Equation  string // as written by the author, for messages and output
	Reactants []Participant
	Products  []Participant
	// Reversible steps get their reverse rate from the equilibrium constant
	// unless ReverseRate is set.
	Reversible bool
	// Duplicate marks a step that deliberately repeats another's equation;
	// their rates add.
	Duplicate bool

	Form RateForm
	Rate Arrhenius // Elementary and ThreeBody forms

	ThirdBody     *ThirdBody     // ThreeBody, Falloff, ChemicallyActivated
	FalloffRate   *FalloffRate   // Falloff, ChemicallyActivated
	PressureRates []PressureRate // PressureTable, sorted by pressure
	ChebyshevRate *ChebyshevRate // Chebyshev

	// ReverseRate, when non-nil, gives the reverse rate constant explicitly
	// (Reversible must be true).
	ReverseRate *Arrhenius
	// Orders and ReverseOrders override the concentration exponents of the
	// forward and reverse rates of progress (species index -> order). Species
	// not listed keep their stoichiometric coefficient as order.
	Orders        map[int]float64
	ReverseOrders map[int]float64

	// UncertaintyFactor f says the rate constant lies within k/f ... k*f at
	// two standard deviations (ln k has standard deviation ln(f)/2); 0 when
	// the mechanism does not state one.
	UncertaintyFactor float64

	Origin Position
}

// NetStoichiometry returns the reaction's net change per species (products
// minus reactants), in order of first appearance, species whose net
// coefficient is zero (a collider written on both sides) left out.
func (r *Reaction) NetStoichiometry() []Participant {
	var order []int
	nu := map[int]float64{}
	add := func(ps []Participant, sign float64) {
		for _, p := range ps {
			if _, seen := nu[p.Species]; !seen {
				order = append(order, p.Species)
			}
			nu[p.Species] += sign * p.Coefficient
		}
	}
	add(r.Reactants, -1)
	add(r.Products, 1)
	var out []Participant
	for _, k := range order {
		if v := nu[k]; v != 0 {
			out = append(out, Participant{Species: k, Coefficient: v})
		}
	}
	return out
}

// ThirdBody gives the collision efficiencies of [M]:
// [M] = sum_k eff_k C_k with eff_k = Efficiencies[k] if present, else Default.
// A reaction with one specific collider (e.g. "(+AR)") has Default 0 and one
// entry of efficiency 1.
type ThirdBody struct {
	Default      float64
	Efficiencies map[int]float64 // species index -> efficiency
}

// FalloffRate holds the two limits and the broadening function.
type FalloffRate struct {
	Low  Arrhenius // k0; its A includes the [M] unit: order one higher than High
	High Arrhenius // k_inf
	// Broadening is Lindemann (F = 1) unless Troe or SRI is set.
	Troe *Troe
	SRI  *SRI
}

// Troe is the Troe (1983) broadening: Fcent = (1-a) exp(-T/T3) + a exp(-T/T1)
// + exp(-T2/T), the last term only when HasT2.
type Troe struct {
	A, T3, T1, T2 float64 // T3, T1, T2 in K
	HasT2         bool
}

// SRI is the Stanford Research Institute form (Stewart, Larson & Golden
// 1989): F = d [a exp(-b/T) + exp(-T/c)]^X T^e; d = 1, e = 0 in the
// 3-parameter form.
type SRI struct {
	A, B, C, D, E float64
}

// PressureRate is an Arrhenius set valid at one pressure. Several sets at the
// same pressure are summed.
type PressureRate struct {
	P    float64 // Pa
	Rate Arrhenius
}

// ChebyshevRate is log10 k(T,P) = sum_ij Coeffs[i][j] phi_i(Tr) phi_j(Pr),
// with Tr = (2/T - 1/TMin - 1/TMax)/(1/TMax - 1/TMin) and
// Pr = (2 log P - log PMin - log PMax)/(log PMax - log PMin).
// k is in SI units (the unit change is folded into Coeffs[0][0]).
type ChebyshevRate struct {
	TMin, TMax float64 // K
	PMin, PMax float64 // Pa
	Coeffs     [][]float64
}
