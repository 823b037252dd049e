package flame

import (
	"errors"
	"fmt"
	"math"

	"flame1d/chem"
	"flame1d/transport"
)

// Inlet is the unburned mixture entering the domain.
type Inlet struct {
	T float64   // K
	P float64   // Pa
	Y []float64 // mass fractions over the mechanism's species
}

// Solution is a converged (or last attempted) flame.
type Solution struct {
	Mechanism *chem.Mechanism
	Inlet     Inlet
	X         []float64 // grid, m
	U         []float64 // point-major unknowns (see layout.go)
	AnchorX   float64   // position of the pinned temperature, m
	AnchorT   float64   // K
	// AdiabaticT is the adiabatic equilibrium temperature of the inlet
	// mixture (complete equilibrium at constant enthalpy and pressure), K.
	AdiabaticT float64
	// InitialLength is the domain length the solve started from, m; the
	// outlet flatness test is scaled by it.
	InitialLength float64
	Stats         Stats

	startFlux float64 // mass flux of a cold start's initial guess, kg/(m^2 s)
}

// NumSpecies returns the species count of the solution's mechanism.
func (s *Solution) NumSpecies() int { return len(s.Mechanism.Species) }

// Points returns the number of grid points.
func (s *Solution) Points() int { return len(s.X) }

// T returns the temperature at point j.
func (s *Solution) T(j int) float64 { return s.U[j*blockSize(s.NumSpecies())+compT] }

// Y returns the mass fractions at point j (a view).
func (s *Solution) Y(j int) []float64 {
	K := s.NumSpecies()
	b := j * blockSize(K)
	return s.U[b+1 : b+1+K]
}

// MassFlux returns the eigenvalue m = rho u, kg/(m^2 s).
func (s *Solution) MassFlux() float64 { return s.U[compM(s.NumSpecies())] }

// Solver solves free flames for one mechanism; building it fits transport
// properties once, so reuse it across conditions.
type Solver struct {
	ph *physics
}

// NewSolver prepares kinetics and transport for a mechanism. The transport
// fits cover 250-3500 K.
func NewSolver(m *chem.Mechanism) (*Solver, error) {
	tr, err := transport.New(m, transport.Options{TMin: 250, TMax: 3500})
	if err != nil {
		return nil, fmt.Errorf("transport: %w", err)
	}
	ph, err := newPhysics(m, tr)
	if err != nil {
		return nil, err
	}
	return &Solver{ph: ph}, nil
}

// ErrNotConverged is wrapped by every failure to find a steady flame.
var ErrNotConverged = errors.New("flame did not converge")

// Mechanism returns the mechanism the solver burns.
func (s *Solver) Mechanism() *chem.Mechanism { return s.ph.mech }

func (s *Solver) checkInlet(in Inlet) error {
	K := s.ph.nSpecies
	if len(in.Y) != K {
		return fmt.Errorf("inlet has %d mass fractions, mechanism has %d species", len(in.Y), K)
	}
	if !(in.T > 150 && in.T < 2000) {
		return fmt.Errorf("inlet temperature %g K is outside 150-2000 K", in.T)
	}
	if !(in.P > 100 && in.P < 1e8) {
		return fmt.Errorf("pressure %g Pa is outside 100 Pa - 100 MPa", in.P)
	}
	sum := 0.0
	for _, y := range in.Y {
		if y < 0 || math.IsNaN(y) {
			return fmt.Errorf("inlet mass fractions must be non-negative")
		}
		sum += y
	}
	if math.Abs(sum-1) > 1e-8 {
		return fmt.Errorf("inlet mass fractions sum to %g, not 1", sum)
	}
	return nil
}

func (s *Solver) report(set Settings, stage string, points int, msg string) {
	if set.Progress != nil {
		set.Progress(Progress{Stage: stage, Points: points, Message: msg})
	}
}

func temperatures(sol *Solution) []float64 {
	T := make([]float64, sol.Points())
	for j := range T {
		T[j] = sol.T(j)
	}
	return T
}

func (s *Solver) problemFor(sol *Solution, set Settings) *problem {
	pr := newProblem(s.ph, sol.X, sol.Inlet.T, sol.Inlet.P, sol.Inlet.Y, !set.NoThermalDiffusion, set.Workers)
	pr.setDiffusion(set.Diffusion)
	pr.anchor = indexOf(sol.X, sol.AnchorX)
	pr.anchorT = sol.AnchorT
	pr.diffusionScale = set.DiffusionScale
	pr.mode = equationMode{energy: true, freeFlux: true}
	return pr
}

func indexOf(x []float64, v float64) int {
	best, bi := math.Inf(1), 0
	for i, xi := range x {
		if d := math.Abs(xi - v); d < best {
			best, bi = d, i
		}
	}
	return bi
}

func meanMolarMassY(ph *physics, Y []float64) float64 {
	s := 0.0
	for k, y := range Y {
		s += y * ph.invW[k]
	}
	return 1 / s
}
