package flame

import (
	"fmt"
	"math"
	"time"

	"flame1d/grid"
	"flame1d/thermo"
)

// SolveFrom computes the flame for the inlet starting from a previous
// solution (continuation): the old profiles are mapped onto the new inlet
// state and solved with the full equations.
func (s *Solver) SolveFrom(prev *Solution, in Inlet, set Settings) (*Solution, error) {
	start := time.Now()
	set, err := s.prepare(in, set)
	if err != nil {
		return nil, err
	}
	if err := s.compatible(prev); err != nil {
		return nil, err
	}
	eq, err := adiabaticEquilibrium(s.ph, in)
	if err != nil {
		return nil, fmt.Errorf("adiabatic equilibrium of the inlet mixture: %w", err)
	}
	eqPrev, err := adiabaticEquilibrium(s.ph, prev.Inlet)
	if err != nil {
		return nil, fmt.Errorf("adiabatic equilibrium of the previous inlet mixture: %w", err)
	}
	guess := s.adaptGuess(prev, in, set, eqPrev, eq)
	guess.AdiabaticT = eq.T
	var stats Stats
	// A continuation that fails is better retried from a nearer condition
	// (the caller's choice).
	sol, err := s.refineLoop(guess, &stage{set: set, stats: &stats})
	if sol != nil {
		stats.WallTime = time.Since(start)
		sol.Stats = stats
	}
	return sol, err
}

// compatible checks that a previous solution has this solver's species, in
// order (ReadRestart maps files from other mechanisms onto this one).
func (s *Solver) compatible(prev *Solution) error {
	m := s.ph.mech
	if prev.Mechanism == m {
		return nil
	}
	if len(prev.Mechanism.Species) != len(m.Species) {
		return fmt.Errorf("restart solution has %d species, mechanism %s has %d; read it with ReadRestart onto this mechanism",
			len(prev.Mechanism.Species), m.Name, len(m.Species))
	}
	for k := range m.Species {
		if prev.Mechanism.Species[k].Name != m.Species[k].Name {
			return fmt.Errorf("restart solution species %d is %s, mechanism %s has %s there",
				k+1, prev.Mechanism.Species[k].Name, m.Name, m.Species[k].Name)
		}
	}
	return nil
}

// adaptGuess maps a previous solution onto a new inlet state: the profiles
// are shifted so the previous flame's shape is kept, inlet values replaced,
// and the anchor kept at the same position.
func (s *Solver) adaptGuess(prev *Solution, in Inlet, set Settings, eqPrev, eqNew equilibriumState) *Solution {
	K := s.ph.nSpecies
	b := blockSize(K)
	x, u := s.prunedCopy(prev, set)
	n := len(x)
	// Shift the old profiles by the change of the unburned state, weighted
	// by 1 - c, and by the change of the adiabatic equilibrium products,
	// weighted by c, c being the old flame's progress variable (reduced
	// temperature): the new guess then starts and ends at the right states.
	Tu0, Tb0 := prev.T(0), prev.T(n-1)
	// The equilibrium shift applies only to species that the old flame
	// brought close to equilibrium at its outlet; slow ones (nitric oxide
	// far below its equilibrium level, say) would otherwise be pushed into
	// the reaction zone and upset the start.
	// Mass flux m = rho_u S_L. S_L follows the adiabatic temperature as
	// exp(-E/(2 R T_ad)) (Zeldovich & Frank-Kamenetskii; Law 2006,
	// "Combustion Physics", ch. 7) with an overall activation energy of
	// hydrocarbon and hydrogen flames, and falls roughly as P^-1/2 (common
	// practice, no source).
	rhoRatio := (in.P / prev.Inlet.P) * (prev.Inlet.T / in.T) * meanMolarMassY(s.ph, in.Y) / meanMolarMassY(s.ph, prev.Inlet.Y)
	speedRatio := math.Exp(-overallActivation/(2*thermo.GasConstant)*(1/eqNew.T-1/eqPrev.T)) * math.Sqrt(prev.Inlet.P/in.P)
	fluxRatio := rhoRatio * speedRatio
	eqShift := make([]float64, K)
	yOut := prev.Y(n - 1)
	for k := 0; k < K; k++ {
		if math.Abs(yOut[k]-eqPrev.Y[k]) <= 0.5*eqPrev.Y[k] && eqPrev.Y[k] > 1e-3 {
			eqShift[k] = eqNew.Y[k] - eqPrev.Y[k]
		}
	}
	for j := 0; j < n; j++ {
		base := j * b
		c := (u[base+compT] - Tu0) / math.Max(Tb0-Tu0, 1)
		c = math.Min(math.Max(c, 0), 1)
		sum := 0.0
		for k := 0; k < K; k++ {
			// A shift may ask a species for more than it has where the
			// old profile is below its equilibrium level (radicals past the
			// flame); clipping those at zero would strip the reaction zone,
			// so a species keeps at least a quarter of its old amount.
			yOld := u[base+1+k]
			y := yOld + (1-c)*(in.Y[k]-prev.Inlet.Y[k]) + c*eqShift[k]
			y = math.Max(y, 0.25*c*math.Max(yOld, 0))
			u[base+1+k] = y
			sum += y
		}
		for k := 0; k < K; k++ {
			u[base+1+k] /= sum
		}
		u[base+compT] += (1-c)*(in.T-prev.Inlet.T) + c*(eqNew.T-eqPrev.T)
		u[base+compM(K)] *= fluxRatio
	}
	anchorT := in.T + anchorRise(set, in.T, eqNew.T)
	ja := nearestTemperature(u, b, n, anchorT)
	u[ja*b+compT] = anchorT
	return &Solution{Mechanism: prev.Mechanism, Inlet: in, X: x, U: u, AnchorX: x[ja], AnchorT: anchorT,
		InitialLength: prev.InitialLength}
}

// prunedCopy returns the previous solution's grid and state with the points
// removed that its own refinement criteria no longer need (with a margin of
// continuationPrune): a chain of continued flames otherwise inherits every
// point any earlier member needed, and each solve grows dearer. The
// refinement loop adds back what the new condition needs.
func (s *Solver) prunedCopy(prev *Solution, set Settings) ([]float64, []float64) {
	b := blockSize(s.ph.nSpecies)
	c := set.Grid
	c.RemovalMargin = continuationPrune
	plan, err := grid.Analyse(prev.X, prev.U, b, nil, []float64{prev.AnchorX}, c)
	if err != nil || len(plan.Remove) == 0 {
		return append([]float64(nil), prev.X...), append([]float64(nil), prev.U...)
	}
	plan.Insert, plan.At = nil, nil
	return plan.Apply(prev.X, prev.U, b)
}

// overallActivation is the overall activation energy (J/mol) used to guess
// how the flame speed follows the adiabatic temperature between neighbouring
// conditions: 160 kJ/mol, within the 120-200 kJ/mol usually quoted for
// methane and light hydrocarbons (common practice, no source). Only the
// starting guess depends on it.
const overallActivation = 160e3

// continuationPrune is the grid-pruning margin applied to a solution before
// it starts a neighbouring condition: points go where every criterion would
// still hold at half its limit.
const continuationPrune = 0.5
