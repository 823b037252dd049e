// Package sensitivity turns the adjoint flame-speed sensitivities of a
// solved flame (flame.Solver.Sensitivities) into what a designer reads: the
// coefficients ranked by magnitude, the 1σ band of the flame speed from the
// rate-constant uncertainty factors, and the side-by-side comparison of two
// fuels.
//
// The band is the first-order propagation of independent log-normal rate
// constants (Turányi 1990, J. Math. Chem. 5, 203, "Sensitivity analysis of
// complex kinetic systems"; Sheen & Wang 2011, Combust. Flame 158, 2358):
// with S_i = d ln S_L/d ln k_i and f_i the uncertainty factor of reaction i
// (k_i within k_i/f_i ... k_i f_i at 2σ, so σ(ln k_i) = ln(f_i)/2),
//
//	σ(ln S_L)^2 = Σ_i (S_i ln(f_i)/2)^2,   σ(S_L) = S_L σ(ln S_L).
//
// It includes the rate constants only: transport data, thermochemistry and,
// for cracked-pool fuels, the pool model are not in the band.
package sensitivity

import (
	"fmt"
	"math"
	"sort"

	"flame1d/chem"
	"flame1d/flame"
)

// Kind says what a coefficient's parameter is.
type Kind string

const (
	// RateConstant: the rate constant of one reaction, forward and reverse
	// scaled together (its pre-exponential factor).
	RateConstant Kind = "rate constant"
	// ActivationEnergy: the activation energy of one reaction.
	ActivationEnergy Kind = "activation energy"
	// Diffusion: the mixture-averaged diffusion coefficient of one species.
	Diffusion Kind = "diffusion coefficient"
	// PoolYield: one yield of a cracked pool, the element closure re-applied.
	PoolYield Kind = "pool yield"
)

// Coefficient is one normalised sensitivity d ln S_L/d ln p.
type Coefficient struct {
	Kind Kind
	// Parameter is the reaction equation, species name or yield name.
	Parameter string
	// Reaction is the 1-based reaction number for RateConstant and
	// ActivationEnergy, else 0.
	Reaction int
	Value    float64
	// UncertaintyFactor is f of a RateConstant coefficient (the band's
	// input), else 0.
	UncertaintyFactor float64
}

// Analysis is the ranked sensitivities of one flame with its band.
type Analysis struct {
	FlameSpeed float64 // m/s
	// Sigma is the 1σ of S_L from the rate constants, m/s.
	Sigma float64
	// Coefficients, largest magnitude first.
	Coefficients []Coefficient
	// DefaultFactor is the uncertainty factor given to reactions without
	// one.
	DefaultFactor float64
}

// DefaultUncertaintyFactor is f for reactions whose mechanism and side file
// state none when the case does not set a default: a factor of 2 at 2σ
// (common practice for rate constants of elementary steps evaluated from
// several studies, no single source; individual evaluations range from
// about 1.3 for H + O2 <=> O + OH to 3-10 for poorly studied steps, e.g.
// Baulch et al. 2005, J. Phys. Chem. Ref. Data 34, 757, from memory).
const DefaultUncertaintyFactor = 2.0

// Analyse ranks the sensitivities of a flame solved on mechanism m and
// computes the band. factors gives f per reaction (Factors builds it); the
// names of the extra parameters come from the sensitivity itself.
func Analyse(m *chem.Mechanism, s *flame.Sensitivity, factors []float64) (*Analysis, error) {
	if len(s.RateConstants) != len(m.Reactions) || len(factors) != len(m.Reactions) {
		return nil, fmt.Errorf("sensitivity analysis: %d coefficients and %d uncertainty factors for %d reactions",
			len(s.RateConstants), len(factors), len(m.Reactions))
	}
	a := &Analysis{FlameSpeed: s.FlameSpeed}
	for i, v := range s.RateConstants {
		a.Coefficients = append(a.Coefficients, Coefficient{Kind: RateConstant, Parameter: m.Reactions[i].Equation,
			Reaction: i + 1, Value: v, UncertaintyFactor: factors[i]})
	}
	for _, p := range s.ActivationEnergies {
		a.Coefficients = append(a.Coefficients, Coefficient{Kind: ActivationEnergy, Parameter: p.Name, Reaction: p.Index + 1, Value: p.Value})
	}
	for _, p := range s.Diffusion {
		a.Coefficients = append(a.Coefficients, Coefficient{Kind: Diffusion, Parameter: p.Name, Value: p.Value})
	}
	for _, p := range s.Perturbations {
		a.Coefficients = append(a.Coefficients, Coefficient{Kind: PoolYield, Parameter: p.Name, Value: p.Value})
	}
	for _, c := range a.Coefficients {
		if math.IsNaN(c.Value) || math.IsInf(c.Value, 0) {
			return nil, fmt.Errorf("sensitivity analysis: the coefficient of %s %s is not finite", c.Kind, c.Parameter)
		}
	}
	Rank(a.Coefficients)
	sigma, err := Band(s.FlameSpeed, s.RateConstants, factors)
	if err != nil {
		return nil, err
	}
	a.Sigma = sigma
	return a, nil
}

// Rank sorts coefficients by decreasing magnitude; ties keep kind order
// and reaction number, so the same input always gives the same order.
func Rank(cs []Coefficient) {
	sort.SliceStable(cs, func(i, j int) bool { return math.Abs(cs[i].Value) > math.Abs(cs[j].Value) })
}

// Band returns σ(S_L) in the units of speed from the rate-constant
// sensitivities and the uncertainty factors (package doc).
func Band(speed float64, rates, factors []float64) (float64, error) {
	if len(rates) != len(factors) {
		return 0, fmt.Errorf("uncertainty band: %d sensitivities, %d factors", len(rates), len(factors))
	}
	v := 0.0
	for i, s := range rates {
		f := factors[i]
		if !(f >= 1) || math.IsInf(f, 0) {
			return 0, fmt.Errorf("uncertainty band: factor %g of reaction %d must be at least 1 and finite", f, i+1)
		}
		x := s * math.Log(f) / 2
		v += x * x
	}
	return speed * math.Sqrt(v), nil
}

// Factors returns f per reaction: the side file's value (by 0-based index),
// else the mechanism's UncertaintyFactor, else def (DefaultUncertaintyFactor
// when def is 0).
func Factors(m *chem.Mechanism, side map[int]float64, def float64) []float64 {
	if def == 0 {
		def = DefaultUncertaintyFactor
	}
	f := make([]float64, len(m.Reactions))
	for i := range m.Reactions {
		switch {
		case side[i] != 0:
			f[i] = side[i]
		case m.Reactions[i].UncertaintyFactor != 0:
			f[i] = m.Reactions[i].UncertaintyFactor
		default:
			f[i] = def
		}
	}
	return f
}

// FormatBand writes S_L with its band: "S_L = 0.360 ± 0.021 m/s (1σ, rate
// constants)". Three decimals, four for flames slower than 0.1 m/s.
func FormatBand(speed, sigma float64) string {
	d := 3
	if speed < 0.1 {
		d = 4
	}
	return fmt.Sprintf("S_L = %.*f ± %.*f m/s (1σ, rate constants)", d, speed, d, sigma)
}

// Top returns the first n coefficients (all if fewer).
func (a *Analysis) Top(n int) []Coefficient {
	return a.Coefficients[:min(n, len(a.Coefficients))]
}
