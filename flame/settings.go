package flame

import (
	"time"

	"flame1d/grid"
	"flame1d/newton"
)

// Settings control the numerical solution. The zero value is the
// documented default: every zero field takes its value from
// DefaultSettings, and the flags are named so that false is the default
// (thermal diffusion on, upwind convection). DefaultSettings is the one
// place the default values live.
type Settings struct {
	// Grid bounds the adaptive grid; zero fields take the defaults (grid
	// RemovalMargin 0 means no pruning, which is also the default).
	Grid grid.Criteria
	// Refiner, when non-nil, replaces Grid as the rule that decides where
	// points go; nil refines by Grid.
	Refiner Refiner
	// InitialPoints is the number of points of the start-up grid.
	InitialPoints int
	// DomainLength is the initial domain length in m; 0 chooses one from the
	// pressure. The domain is extended automatically when either end is not
	// flat.
	DomainLength float64
	// AnchorRise is the temperature rise above the inlet, in K, at which the
	// flame is pinned.
	AnchorRise float64
	// NoThermalDiffusion leaves out the thermal-diffusion (Soret) flux,
	// which is included by default: of the light species with
	// mixture-averaged diffusion, of every species with multicomponent
	// diffusion.
	NoThermalDiffusion bool
	// Diffusion selects the diffusive-flux model; the zero value is
	// MixtureAveraged.
	Diffusion DiffusionModel
	// CentralConvection takes convective face values as the mean of the two
	// neighbours (second order) instead of the upwind value (first
	// order, the default, more robust on coarse grids).
	CentralConvection bool
	// RelTol and AbsTolY/AbsTolT control Newton convergence on the scaled step.
	RelTol, AbsTolY, AbsTolT float64
	// MaxRefinements bounds the solve/refine cycles.
	MaxRefinements int
	// DiffusionScale, when non-nil, holds one multiplier per species of the
	// mixture-averaged diffusion coefficient D_km (its thermal-diffusion flux
	// included) before the correction velocity is applied: the parameter of
	// the diffusion (Lewis-number) sensitivities. nil means 1 for every
	// species.
	DiffusionScale []float64
	// Workers is the number of goroutines for residual evaluation (0 = all
	// cores). The result does not depend on it, to the last bit.
	Workers int
	// Progress receives stage messages; nil silences them.
	Progress func(Progress)
}

// Refiner decides where the grid of a solution needs points: given the grid
// x (m), the point-major unknowns u with block components per point, the
// components to resolve and positions to keep, it returns the new grid and
// the solution interpolated onto it, and whether anything changed.
// grid.Criteria implements it.
type Refiner interface {
	Refine(x, u []float64, block int, components []int, keep []float64) (newX, newU []float64, changed bool, err error)
}

// Progress reports what the solver is doing.
type Progress struct {
	Stage        string
	Points       int
	ResidualNorm float64
	Message      string
}

// DefaultSettings returns the settings a zero Settings stands for, with
// every default written out: grid criteria (max_change 0.05,
// max_gradient_change 0.07, max_spacing_ratio 2.5, at most 1500 points,
// components spanning less than 1e-6 untested), 40 initial points, the
// anchor 400 K above the inlet, thermal diffusion on, upwind convection,
// relative tolerance 1e-6 with absolute 1e-11 on mass fractions and 1e-6 K
// on temperature, at most 40 refinements.
func DefaultSettings() Settings {
	c := grid.DefaultCriteria()
	c.MaxChange, c.MaxGradientChange, c.MaxSpacingRatio = 0.05, 0.07, 2.5
	c.MaxPoints = 1500
	c.MinRange = 1e-6
	return Settings{
		Grid: c, InitialPoints: 40, AnchorRise: 400,
		RelTol: 1e-6, AbsTolY: 1e-11, AbsTolT: 1e-6, MaxRefinements: 40,
	}
}

func withDefaults(s Settings) Settings {
	d := DefaultSettings()
	if s.Grid.MaxChange == 0 {
		s.Grid.MaxChange = d.Grid.MaxChange
	}
	if s.Grid.MaxGradientChange == 0 {
		s.Grid.MaxGradientChange = d.Grid.MaxGradientChange
	}
	if s.Grid.MaxSpacingRatio == 0 {
		s.Grid.MaxSpacingRatio = d.Grid.MaxSpacingRatio
	}
	if s.Grid.MaxPoints == 0 {
		s.Grid.MaxPoints = d.Grid.MaxPoints
	}
	if s.Grid.MinRange == 0 {
		s.Grid.MinRange = d.Grid.MinRange
	}
	if s.InitialPoints == 0 {
		s.InitialPoints = d.InitialPoints
	}
	if s.AnchorRise == 0 {
		s.AnchorRise = d.AnchorRise
	}
	if s.RelTol == 0 {
		s.RelTol = d.RelTol
	}
	if s.AbsTolY == 0 {
		s.AbsTolY = d.AbsTolY
	}
	if s.AbsTolT == 0 {
		s.AbsTolT = d.AbsTolT
	}
	if s.MaxRefinements == 0 {
		s.MaxRefinements = d.MaxRefinements
	}
	return s
}

// Stats counts the work a solve did.
type Stats struct {
	NewtonIterations, TimeSteps, JacobianEvaluations, Factorizations, ResidualEvaluations int
	Refinements, DomainExtensions                                                         int
	ResidualTime, JacobianTime, FactorTime, SolveTime, WallTime                           time.Duration
}

// add counts a Newton solve; residuals is the number of residual
// evaluations the problem made, those of its finite-difference Jacobian
// included.
func (s *Stats) add(r newton.Result, residuals int) {
	s.NewtonIterations += r.NewtonIterations
	s.TimeSteps += r.TimeSteps
	s.JacobianEvaluations += r.JacobianEvaluations
	s.Factorizations += r.Factorizations
	s.ResidualEvaluations += residuals
	s.ResidualTime += r.ResidualTime
	s.JacobianTime += r.JacobianTime
	s.FactorTime += r.FactorTime
	s.SolveTime += r.SolveTime
}

// prepare fills the defaults of set and checks the inlet and the settings'
// per-species diffusion scales, as every solve does first.
func (s *Solver) prepare(in Inlet, set Settings) (Settings, error) {
	set = withDefaults(set)
	if err := s.checkInlet(in); err != nil {
		return set, err
	}
	return set, s.checkDiffusionScale(set)
}
