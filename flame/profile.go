package flame

import (
	"fmt"
	"math"

	"flame1d/thermo"
)

// Profile is a solved flame as columns, in SI units, ready for output.
type Profile struct {
	Species          []string
	X                []float64   // m
	T                []float64   // K
	Velocity         []float64   // m/s
	Density          []float64   // kg/m^3
	HeatRelease      []float64   // W/m^3
	MoleFractions    [][]float64 // [point][species]
	MassFractions    [][]float64 // [point][species]
	MassFlux         float64     // kg/(m^2 s)
	Pressure         float64     // Pa
	InletT           float64     // K
	InletDensity     float64     // kg/m^3
	FlameSpeed       float64     // m/s, m / rho_unburned
	BurnedT          float64     // K, last grid point
	MaxGradientT     float64     // K/m
	ThermalThick     float64     // m, (T_b - T_u) / max dT/dx
	PeakHeatReleaseX float64     // m
}

// Profile evaluates the derived columns of a solution.
func (s *Solver) Profile(sol *Solution) (*Profile, error) {
	ph := s.ph
	K := ph.nSpecies
	n := sol.Points()
	p := &Profile{
		X: append([]float64(nil), sol.X...), T: make([]float64, n), Velocity: make([]float64, n),
		Density: make([]float64, n), HeatRelease: make([]float64, n),
		MoleFractions: make([][]float64, n), MassFractions: make([][]float64, n),
		MassFlux: sol.MassFlux(), Pressure: sol.Inlet.P, InletT: sol.Inlet.T,
	}
	for k := range ph.mech.Species {
		p.Species = append(p.Species, ph.mech.Species[k].Name)
	}
	kin := ph.kinetics.Clone()
	C := make([]float64, K)
	for j := 0; j < n; j++ {
		T := sol.T(j)
		Y := sol.Y(j)
		wm := meanMolarMassY(ph, Y)
		rho := sol.Inlet.P * wm / (thermo.GasConstant * T)
		X := make([]float64, K)
		for k := 0; k < K; k++ {
			X[k] = Y[k] * wm * ph.invW[k]
			C[k] = rho * Y[k] * ph.invW[k]
		}
		p.T[j], p.Density[j] = T, rho
		p.Velocity[j] = p.MassFlux / rho
		p.HeatRelease[j] = kin.HeatReleaseRate(T, C)
		p.MoleFractions[j] = X
		p.MassFractions[j] = append([]float64(nil), Y...)
	}
	wmU := meanMolarMassY(ph, sol.Inlet.Y)
	p.InletDensity = sol.Inlet.P * wmU / (thermo.GasConstant * sol.Inlet.T)
	p.FlameSpeed = p.MassFlux / p.InletDensity
	p.BurnedT = p.T[n-1]
	peak := 0.0
	for j := 0; j+1 < n; j++ {
		g := (p.T[j+1] - p.T[j]) / (p.X[j+1] - p.X[j])
		p.MaxGradientT = math.Max(p.MaxGradientT, g)
		if p.HeatRelease[j] > peak {
			peak, p.PeakHeatReleaseX = p.HeatRelease[j], p.X[j]
		}
	}
	if p.MaxGradientT > 0 {
		p.ThermalThick = (p.BurnedT - p.InletT) / p.MaxGradientT
	}
	for _, v := range []float64{p.FlameSpeed, p.BurnedT, p.ThermalThick} {
		if math.IsNaN(v) || math.IsInf(v, 0) || v <= 0 {
			return nil, fmt.Errorf("flame profile has a non-physical summary value (%g); the solution is not usable", v)
		}
	}
	return p, nil
}

// ElementFluxes returns, at each cell midpoint, the total (convective plus
// diffusive) mass flux of every element in kg/(m^2 s): a conserved quantity
// of the steady equations, constant through the flame. set must be the
// settings the flame was solved with (thermal diffusion, convection).
func (s *Solver) ElementFluxes(sol *Solution, set Settings) (elements []string, flux [][]float64, err error) {
	ph := s.ph
	K := ph.nSpecies
	pr := newProblem(ph, sol.X, sol.Inlet.T, sol.Inlet.P, sol.Inlet.Y, !set.NoThermalDiffusion, 1)
	pr.central = set.CentralConvection
	pr.setDiffusion(set.Diffusion)
	if err := pr.pointProperties(sol.U, full); err != nil {
		return nil, nil, err
	}
	pr.midpointFluxes(sol.U, full)
	elements = ph.mech.Elements
	m := sol.MassFlux()
	for j := 0; j+1 < sol.Points(); j++ {
		row := make([]float64, len(elements))
		Ya, Yb := sol.Y(j), sol.Y(j+1)
		for e, el := range elements {
			aw, _ := thermo.AtomicWeight(el)
			for k := 0; k < K; k++ {
				n := ph.mech.Species[k].Composition[el]
				if n == 0 {
					continue
				}
				row[e] += n * aw * ph.invW[k] * (m*pr.face(Ya[k], Yb[k]) + pr.flux[j*K+k])
			}
		}
		flux = append(flux, row)
	}
	return elements, flux, nil
}

// PyrolysisYields derives "measured-style" cracking yields from a solved
// flame: at position x (typically the end of the fuel's pyrolysis zone), the
// change of each pool species' total molar flux (convective plus
// diffusive) since the inlet, per mole of fuel consumed there,
//
//	yield_k = (N_k(x) - N_k,u) / (N_fuel,u - N_fuel(x)),  N_k = (m Y_k + j_k)/W_k,
//
// the in-flame analogue of a flow-reactor pyrolysis measurement. Species
// that are consumed rather than formed get negative yields; callers usually
// keep the positive ones and let the element closure adjust the rest.
func (s *Solver) PyrolysisYields(sol *Solution, fuelName string, pool []string, x float64, set Settings) (map[string]float64, error) {
	ph := s.ph
	K := ph.nSpecies
	kf := ph.mech.SpeciesIndex(fuelName)
	if kf < 0 {
		return nil, fmt.Errorf("pyrolysis yields: fuel species %q not in the mechanism", fuelName)
	}
	pr := newProblem(ph, sol.X, sol.Inlet.T, sol.Inlet.P, sol.Inlet.Y, !set.NoThermalDiffusion, 1)
	pr.central = set.CentralConvection
	pr.setDiffusion(set.Diffusion)
	if err := pr.pointProperties(sol.U, full); err != nil {
		return nil, err
	}
	pr.midpointFluxes(sol.U, full)
	j := 0
	for j+2 < sol.Points() && 0.5*(sol.X[j+1]+sol.X[j+2]) <= x {
		j++
	}
	m := sol.MassFlux()
	molarFlux := func(k int) float64 { return (m*pr.face(sol.Y(j)[k], sol.Y(j + 1)[k]) + pr.flux[j*K+k]) * ph.invW[k] }
	inlet := func(k int) float64 { return m * sol.Inlet.Y[k] * ph.invW[k] }
	consumed := inlet(kf) - molarFlux(kf)
	if !(consumed > 0) {
		return nil, fmt.Errorf("pyrolysis yields: no %s consumed before x = %g m", fuelName, x)
	}
	out := map[string]float64{}
	for _, name := range pool {
		k := ph.mech.SpeciesIndex(name)
		if k < 0 {
			return nil, fmt.Errorf("pyrolysis yields: pool species %q not in the mechanism", name)
		}
		out[name] = (molarFlux(k) - inlet(k)) / consumed
	}
	return out, nil
}
