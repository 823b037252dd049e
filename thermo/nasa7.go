// Package thermo holds ideal-gas (and pure condensed) species thermodynamics
// from NASA 7-coefficient polynomials, mixture properties, and chemical
// equilibrium by Gibbs minimisation.
//
// Units are SI throughout: K, Pa, J, mol, kg. Per-mole properties are in
// J/mol (or J/(mol K)); dimensionless forms (cp/R, h/(RT), s/R) are named so.
package thermo

import "math"

// GasConstant is the molar gas constant R in J/(mol K) (CODATA 2018, exact).
const GasConstant = 8.314462618

// OneAtmosphere is the standard atmosphere in Pa (exact by definition).
const OneAtmosphere = 101325.0

// StandardPressure is the reference pressure of the standard-state entropy
// in Pa. Published NASA-7 records in mechanism sets are referenced to 1 atm
// or 1 bar depending on their source; the difference in s is
// R ln(1.01325) = 0.11 J/(mol K), below the fit accuracy. flame1d takes
// 1 atm for every set.
const StandardPressure = OneAtmosphere

// NASA7 is a species' standard-state thermodynamics as two 7-coefficient
// polynomials:
//
//	cp/R    = a1 + a2 T + a3 T^2 + a4 T^3 + a5 T^4
//	h/(RT)  = a1 + a2 T/2 + a3 T^2/3 + a4 T^3/4 + a5 T^4/5 + a6/T
//	s/R     = a1 ln T + a2 T + a3 T^2/2 + a4 T^3/3 + a5 T^4/4 + a7
//
// Low applies on [TLow, TMid], High on [TMid, THigh]. Outside [TLow, THigh]
// the nearer polynomial is extrapolated (callers that care check Range).
type NASA7 struct {
	TLow, TMid, THigh float64    // K
	Low, High         [7]float64 // a1..a7 for the two ranges
}

func (p *NASA7) coeffs(T float64) *[7]float64 {
	if T < p.TMid {
		return &p.Low
	}
	return &p.High
}

// CpR returns cp/R at temperature T.
func (p *NASA7) CpR(T float64) float64 {
	a := p.coeffs(T)
	return a[0] + T*(a[1]+T*(a[2]+T*(a[3]+T*a[4])))
}

// HRT returns h/(RT) at temperature T, with h the absolute (formation-based)
// enthalpy.
func (p *NASA7) HRT(T float64) float64 {
	a := p.coeffs(T)
	return a[0] + T*(a[1]/2+T*(a[2]/3+T*(a[3]/4+T*a[4]/5))) + a[5]/T
}

// SR returns s°/R at temperature T and the standard pressure.
func (p *NASA7) SR(T float64) float64 {
	a := p.coeffs(T)
	return a[0]*math.Log(T) + T*(a[1]+T*(a[2]/2+T*(a[3]/3+T*a[4]/4))) + a[6]
}

// GRT returns g°/(RT) = h/(RT) - s°/R at temperature T.
func (p *NASA7) GRT(T float64) float64 { return p.HRT(T) - p.SR(T) }

// InRange reports whether T lies inside the fitted range [TLow, THigh].
func (p *NASA7) InRange(T float64) bool { return T >= p.TLow && T <= p.THigh }

// MidpointJump returns the relative mismatch between the two polynomials at
// TMid in cp/R, h/(RT) and s/R (each |low-high| / max(|high|, 1)), the
// largest of the three. Published sets are continuous to ~1e-4 or better.
func (p *NASA7) MidpointJump() float64 {
	lo := NASA7{TMid: math.Inf(1), Low: p.Low}
	hi := NASA7{TMid: math.Inf(-1), High: p.High}
	T := p.TMid
	worst := 0.0
	for _, pair := range [][2]float64{
		{lo.CpR(T), hi.CpR(T)}, {lo.HRT(T), hi.HRT(T)}, {lo.SR(T), hi.SR(T)},
	} {
		d := math.Abs(pair[0]-pair[1]) / math.Max(math.Abs(pair[1]), 1)
		worst = math.Max(worst, d)
	}
	return worst
}

// MidpointJumpTolerance is the relative mismatch at TMid above which readers
// warn (they never fail on it). 1e-3 in cp, h or s is well above the
// round-off of published polynomial records and below anything that matters
// to a flame; common practice, no source.
const MidpointJumpTolerance = 1e-3
