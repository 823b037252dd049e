// Package correlation fits and evaluates laminar flame-speed correlations of
// the power-law form of Metghalchi & Keck (1982, Combust. Flame 48, 191-210):
//
//	S_L = S_L0(phi) (T_u/T_0)^alpha(phi) (P/P_0)^beta(phi)
//	S_L0(phi) = B_m + B_2 (phi - phi_m)^2
//	alpha(phi) = alpha_0 + alpha_1 (phi - 1)
//	beta(phi)  = beta_0  + beta_1  (phi - 1)
//
// with S_L, B_m and B_2 in m/s, T_u the unburned temperature in K and P the
// pressure in Pa, referred to T_0 = 298 K and P_0 = 1 atm = 101325 Pa.
// Metghalchi & Keck wrote alpha and beta as linear in (phi - 1); the
// coefficients are the fit's own, not theirs.
//
// The fit minimises the sum of squared log residuals, ln S_L - ln S_L,fit,
// that is, relative errors, so slow lean and rich flames weigh as much as
// fast stoichiometric ones.
package correlation

import (
	"fmt"
	"math"
)

// Coefficient indices into Correlation.Coef, StdErr and Free.
const (
	BM     = iota // B_m, m/s: S_L0 at phi_m
	B2            // B_2, m/s: curvature of S_L0 in phi
	PhiM          // phi_m: equivalence ratio of the S_L0 maximum (for B_2 < 0)
	Alpha0        // alpha_0: temperature exponent at phi = 1
	Alpha1        // alpha_1: its slope in phi
	Beta0         // beta_0: pressure exponent at phi = 1
	Beta1         // beta_1: its slope in phi
	NumCoef
)

// CoefNames are the coefficients' names, as written in TOML files.
var CoefNames = [NumCoef]string{"B_m", "B_2", "phi_m", "alpha_0", "alpha_1", "beta_0", "beta_1"}

// coefUnits are the coefficients' units, for printing.
var coefUnits = [NumCoef]string{"m/s", "m/s", "-", "-", "-", "-", "-"}

// Form is the correlation's formula in words, for headers.
const Form = "S_L = (B_m + B_2 (phi - phi_m)^2) (T_u/T_0)^(alpha_0 + alpha_1 (phi - 1)) (P/P_0)^(beta_0 + beta_1 (phi - 1))"

// Default reference state.
const (
	DefaultT0 = 298.0    // K
	DefaultP0 = 101325.0 // Pa, 1 atm
)

// Range is the span of one variable in the fitted data.
type Range struct{ Min, Max float64 }

func (r Range) contains(v float64) bool {
	tol := 1e-9 * math.Max(math.Abs(r.Min), math.Abs(r.Max))
	return v >= r.Min-tol && v <= r.Max+tol
}

// Correlation is a fitted flame-speed correlation.
type Correlation struct {
	Coef [NumCoef]float64
	// StdErr are the standard errors of the coefficients from the fit's
	// covariance s^2 (J^T J)^-1, s^2 the residual variance; 0 for a
	// coefficient that was not fitted.
	StdErr [NumCoef]float64
	// Free tells which coefficients were fitted; the others are held at 0
	// because the data cannot determine them (see Notes).
	Free [NumCoef]bool
	// T0 and P0 are the reference state, K and Pa. When all data are at
	// one temperature (pressure), the reference is that temperature
	// (pressure) and the correlation holds there only.
	T0, P0 float64
	// Validity is the span of the fitted data.
	Phi, T, P Range
	// Fit quality over the data: number of points, degrees of freedom,
	// and relative errors (S_L,fit - S_L)/S_L.
	Points, DOF              int
	RMSRelative, MaxRelative float64
	// WorstPoint is the index (in the fitted data) of the largest relative
	// error.
	WorstPoint int
	// Notes explain reduced forms and other choices of the fit.
	Notes []string
	// Source names the data, e.g. the results file.
	Source string
}

// FlameSpeed0 returns S_L0(phi) = B_m + B_2 (phi - phi_m)^2, m/s.
func (c *Correlation) FlameSpeed0(phi float64) float64 {
	d := phi - c.Coef[PhiM]
	return c.Coef[BM] + c.Coef[B2]*d*d
}

// Alpha returns the temperature exponent alpha(phi).
func (c *Correlation) Alpha(phi float64) float64 { return c.Coef[Alpha0] + c.Coef[Alpha1]*(phi-1) }

// Beta returns the pressure exponent beta(phi).
func (c *Correlation) Beta(phi float64) float64 { return c.Coef[Beta0] + c.Coef[Beta1]*(phi-1) }

// Evaluate returns S_L in m/s at an equivalence ratio, unburned temperature
// (K) and pressure (Pa), with warnings when the condition lies outside the
// fitted data or a dependence was not fitted. Where the correlation has no
// positive flame speed (S_L0 <= 0, far from the data) or an input is not a
// finite positive number it returns 0 and says why; it never returns NaN.
func (c *Correlation) Evaluate(phi, T, P float64) (float64, []string) {
	var warn []string
	for _, in := range []struct {
		name string
		v    float64
	}{{"equivalence ratio", phi}, {"temperature", T}, {"pressure", P}} {
		if !(in.v > 0) || math.IsInf(in.v, 0) {
			return 0, []string{fmt.Sprintf("%s %v is not a finite positive number: no flame speed", in.name, in.v)}
		}
	}
	if !c.Phi.contains(phi) {
		warn = append(warn, fmt.Sprintf("equivalence ratio %g is outside the fitted range %g - %g: extrapolation", phi, c.Phi.Min, c.Phi.Max))
	}
	warn = append(warn, c.rangeWarning("temperature", "K", T, c.T, c.T0, Alpha0)...)
	warn = append(warn, c.rangeWarning("pressure", "Pa", P, c.P, c.P0, Beta0)...)
	s0 := c.FlameSpeed0(phi)
	if !(s0 > 0) {
		return 0, append(warn, fmt.Sprintf("the correlation gives S_L0(%g) = %.4g m/s <= 0: no flame speed predicted", phi, s0))
	}
	v := s0 * math.Pow(T/c.T0, c.Alpha(phi)) * math.Pow(P/c.P0, c.Beta(phi))
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, append(warn, fmt.Sprintf("the correlation overflows at phi %g, %g K, %g Pa: no flame speed", phi, T, P))
	}
	return v, warn
}

// rangeWarning explains a temperature or pressure outside the data, or one
// whose dependence the fit could not determine.
func (c *Correlation) rangeWarning(name, unit string, v float64, r Range, ref float64, exponent int) []string {
	if r.contains(v) {
		return nil
	}
	if !c.Free[exponent] {
		if r.Min == r.Max {
			return []string{fmt.Sprintf("%s %g %s: the data are at %g %s only and no %s dependence was fitted; the value is that at %g %s",
				name, v, unit, r.Min, unit, name, ref, unit)}
		}
		return []string{fmt.Sprintf("%s %g %s: no %s dependence could be fitted from the data (see the fit notes); the value ignores it",
			name, v, unit, name)}
	}
	return []string{fmt.Sprintf("%s %g %s is outside the fitted range %g - %g %s: extrapolation", name, v, unit, r.Min, r.Max, unit)}
}
