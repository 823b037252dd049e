package transport

import (
	"fmt"
	"math"

	"flame1d/thermo"
)

// PrandtlNumber is Pr = mu cp / lambda for viscosity mu (Pa s), specific
// heat cp (J/(kg K)) and thermal conductivity lambda (W/(m K)).
func PrandtlNumber(viscosity, cp, conductivity float64) float64 {
	return viscosity * cp / conductivity
}

// LewisNumber is Le_k = lambda / (rho cp D_km) for thermal conductivity
// lambda (W/(m K)), density rho (kg/m^3), specific heat cp (J/(kg K)) and
// the species' mixture-averaged diffusion coefficient D_km (m^2/s).
func LewisNumber(conductivity, density, cp, diffusion float64) float64 {
	return conductivity / (density * cp * diffusion)
}

// GasProperties are the mixture-averaged transport properties of a gas at
// one state with the thermal properties they combine with, and the
// dimensionless groups they make. Per-species slices follow the model's
// species order.
type GasProperties struct {
	Temperature  float64 // K
	Pressure     float64 // Pa
	Viscosity    float64 // Pa s
	Conductivity float64 // W/(m K)
	Cp           float64 // J/(kg K)
	Density      float64 // kg/m^3
	Prandtl      float64
	// MoleFractions are those evaluated; Diffusion the mixture-averaged
	// D_km (m^2/s), Lewis the Lewis numbers Le_k and ThermalDiffusionRatios
	// Theta_k (zero but for the light species).
	MoleFractions          []float64
	Diffusion              []float64
	Lewis                  []float64
	ThermalDiffusionRatios []float64
	// The multicomponent model's conductivity (W/(m K)) and thermal
	// diffusion ratios chi_k (every species), for comparison.
	MulticomponentConductivity           float64
	MulticomponentThermalDiffusionRatios []float64
}

// Properties evaluates the gas of mole fractions X at T (K) and P (Pa):
// Wilke viscosity, Mathur-Tondon-Saxena conductivity, mixture diffusion
// coefficients and thermal diffusion ratios from the model (and the
// multicomponent conductivity and thermal diffusion ratios), cp and density
// (ideal gas) from set, which must hold the model's species in its order.
// It refuses a temperature outside the model's fit range and any state
// whose properties are not finite. It allocates; it is for reports, not
// for the flame's inner loop.
func (t *Model) Properties(set *thermo.SpeciesSet, T, P float64, X []float64) (*GasProperties, error) {
	K := len(t.fit.species)
	if set.Len() != K || len(X) != K {
		return nil, fmt.Errorf("transport properties: %d species in the model, %d in the thermo set, %d mole fractions", K, set.Len(), len(X))
	}
	if tMin, tMax := t.Range(); !(T >= tMin && T <= tMax) {
		return nil, fmt.Errorf("temperature %g K is outside the transport fit range %g-%g K", T, tMin, tMax)
	}
	if !(P > 0) || math.IsInf(P, 0) {
		return nil, fmt.Errorf("pressure %g Pa must be positive", P)
	}
	Y := make([]float64, K)
	set.MoleToMass(X, Y)
	out := MixtureProperties{Diffusion: make([]float64, K), ThermalDiffusionRatios: make([]float64, K)}
	t.Mixture(T, P, X, Y, &out)
	mc := MulticomponentProperties{ThermalDiffusionRatios: make([]float64, K)}
	if err := t.Multicomponent(T, P, X, nil, &mc); err != nil {
		return nil, err
	}
	g := &GasProperties{
		Temperature: T, Pressure: P,
		Viscosity: out.Viscosity, Conductivity: out.Conductivity,
		Cp: set.CpMass(T, Y), Density: set.Density(P, T, Y),
		MoleFractions: append([]float64(nil), X...), Diffusion: out.Diffusion,
		Lewis: make([]float64, K), ThermalDiffusionRatios: out.ThermalDiffusionRatios,
		MulticomponentConductivity: mc.Conductivity, MulticomponentThermalDiffusionRatios: mc.ThermalDiffusionRatios,
	}
	g.Prandtl = PrandtlNumber(g.Viscosity, g.Cp, g.Conductivity)
	for k := range g.Lewis {
		g.Lewis[k] = LewisNumber(g.Conductivity, g.Density, g.Cp, g.Diffusion[k])
	}
	for _, v := range []float64{g.Viscosity, g.Conductivity, g.MulticomponentConductivity, g.Cp, g.Density, g.Prandtl} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("transport properties at %g K, %g Pa are not finite", T, P)
		}
	}
	return g, nil
}
