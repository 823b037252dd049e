// Package study turns a case into solved flames: it loads the mechanism,
// builds the solver once, forms the premixed inlet at any condition and
// solves it, cold or by continuation from a neighbouring solution. The CLI's
// run, sweep and compare commands all go through it.
package study

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"time"

	"flame1d/builtin"
	"flame1d/casefile"
	"flame1d/chem"
	"flame1d/flame"
	"flame1d/fuel"
	"flame1d/grid"
	"flame1d/internal/infile"
	"flame1d/output"
	"flame1d/sensitivity"
	"flame1d/thermo"
)

// Study is a case prepared for solving one fuel: the fuel resolved on the
// mechanism (for a cracked pool in finite-rate mode, the mechanism with the
// pseudo-fuel and its global step), the thermo set and the solver. A Study
// may be used by one goroutine at a time; make one per goroutine for
// parallel work (New is cheap compared with a flame).
type Study struct {
	Case      *casefile.Case
	Fuel      *fuel.Resolved
	Mechanism *chem.Mechanism // what the flame burns (Fuel.Mechanism)
	// MechanismName is the mechanism as the case names it for this fuel
	// (Case.MechanismOf): a built-in name or a path.
	MechanismName string
	Set           *thermo.SpeciesSet
	Solver        *flame.Solver
	Settings      flame.Settings
	// factors caches the rate-constant uncertainty factors (Sensitivity).
	factors []float64
	// spec, base and baseSet are the fuel as written and the mechanism it
	// was resolved on, for the pool-yield sensitivities.
	spec    *fuel.Spec
	base    *chem.Mechanism
	baseSet *thermo.SpeciesSet
}

// Condition is one point of a study: equivalence ratio, unburned
// temperature (K) and pressure (Pa).
type Condition struct {
	Phi, T, P float64
}

func (c Condition) String() string {
	return fmt.Sprintf("phi=%g T=%g K P=%g Pa", c.Phi, c.T, c.P)
}

// Result is one solved flame with its derived quantities.
type Result struct {
	Condition Condition
	Solution  *flame.Solution
	Profile   *flame.Profile
	Summary   *output.FlameSummary
	// Sensitivity holds the flame-speed sensitivities and the band when
	// the case asks for them ([sensitivity] enabled), else nil.
	Sensitivity *sensitivity.Analysis
	// ColdStart is true when the flame was solved from the built-in start-up
	// profiles: no start was given, or continuation from it failed and the
	// solve fell back to a cold start.
	ColdStart bool
}

// LoadMechanism resolves a case's mechanism: a built-in name, or a path
// relative to the case file's folder.
func LoadMechanism(c *casefile.Case) (*chem.Mechanism, error) {
	return LoadMechanismFor(c.Mechanism, c.File)
}

// LoadMechanismFor loads the mechanism a file names: a built-in name, or a
// path to a flame1d TOML mechanism relative to the folder of file (or to
// the working directory, where it exists there); an empty name is
// casefile.DefaultMechanism. Errors name file.
func LoadMechanismFor(name, file string) (*chem.Mechanism, error) {
	if name == "" {
		name = casefile.DefaultMechanism
	}
	if strings.HasSuffix(name, ".toml") && !filepath.IsAbs(name) && file != "" {
		if _, err := os.Stat(name); err != nil {
			name = filepath.Join(filepath.Dir(file), name)
		}
	}
	m, err := builtin.Load(name)
	if err != nil {
		return nil, fmt.Errorf("%s: mechanism: %w", file, err)
	}
	return m, nil
}

// New prepares a case for its own fuel. progress, when non-nil, receives
// the solver's stage messages.
func New(c *casefile.Case, progress io.Writer) (*Study, error) {
	mech, err := LoadMechanism(c)
	if err != nil {
		return nil, err
	}
	return NewForFuel(c, mech, c.Fuel, progress)
}

// NewForFuel prepares a case for any fuel on an already loaded mechanism.
func NewForFuel(c *casefile.Case, mech *chem.Mechanism, spec fuel.Spec, progress io.Writer) (*Study, error) {
	base, err := fuel.SpeciesSet(mech)
	if err != nil {
		return nil, err
	}
	res, err := spec.Resolve(mech, base)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", c.File, err)
	}
	if err := needTransport(c, res.Mechanism); err != nil {
		return nil, err
	}
	solver, err := flame.NewSolver(res.Mechanism)
	if err != nil {
		return nil, err
	}
	return &Study{Case: c, Fuel: res, Mechanism: res.Mechanism, MechanismName: c.MechanismOf(spec), Set: res.Set, Solver: solver, Settings: Settings(c, progress),
		spec: &spec, base: mech, baseSet: base}, nil
}

// needTransport refuses, with what to do, a mechanism whose species lack
// the kinetic-theory data a flame needs: typically one imported without
// its transport file.
func needTransport(c *casefile.Case, m *chem.Mechanism) error {
	var missing []string
	for i := range m.Species {
		if m.Species[i].Transport == nil {
			missing = append(missing, m.Species[i].Name)
		}
	}
	if len(missing) == 0 {
		return nil
	}
	list := strings.Join(missing, ", ")
	if len(missing) > 8 {
		list = strings.Join(missing[:8], ", ") + fmt.Sprintf(", ... (%d more)", len(missing)-8)
	}
	what := fmt.Sprintf("%d of its %d species have no transport data", len(missing), len(m.Species))
	if len(missing) == len(m.Species) {
		what = "it has no transport data"
	}
	return fmt.Errorf("%s: mechanism %s: %s (%s), which a flame needs; "+
		"import the mechanism again with its transport file: flame1d mech import REACTIONS --thermo THERMO --transport TRANSPORT -o MECH.toml",
		c.File, c.Mechanism, what, list)
}

// Settings maps a case's [grid] and [solver] tables onto solver settings.
// Keys left out are zero, which the flame solver reads as its defaults
// (flame.DefaultSettings), so no default is repeated here.
func Settings(c *casefile.Case, progress io.Writer) flame.Settings {
	g := c.Grid
	s := flame.Settings{
		Grid: grid.Criteria{
			MaxChange:         g.MaxChange,
			MaxGradientChange: g.MaxGradientChange,
			MaxSpacingRatio:   g.MaxSpacingRatio,
			RemovalMargin:     g.RemovalMargin,
			MaxPoints:         g.MaxPoints,
		},
		InitialPoints:      g.InitialPoints,
		DomainLength:       g.DomainLength,
		NoThermalDiffusion: c.Solver.NoThermalDiffusion,
		CentralConvection:  c.Solver.CentralConvection,
		RelTol:             c.Solver.RelativeTol,
		AnchorRise:         c.Solver.AnchorRise,
	}
	if c.Solver.Multicomponent {
		s.Diffusion = flame.Multicomponent
	}
	s.Workers = c.Solver.Workers
	if progress != nil {
		start := time.Now()
		// Newton steps carry no message; their residual norm is shown
		// with the next stage line (the norm the previous stage ended at).
		residual := math.NaN()
		s.Progress = func(p flame.Progress) {
			if p.Message == "" {
				residual = p.ResidualNorm
				return
			}
			norm := "          -"
			if !math.IsNaN(residual) {
				norm = fmt.Sprintf("%11.3g", residual)
			}
			fmt.Fprintf(progress, "[%6.2fs] %-18s %4d points  residual %s  %s\n", time.Since(start).Seconds(), p.Stage, p.Points, norm, p.Message)
		}
	}
	return s
}

// BaseCondition is the case's own condition.
func (s *Study) BaseCondition() Condition {
	return Condition{Phi: s.Case.EquivalenceRatio, T: s.Case.Temperature, P: s.Case.Pressure}
}

// Inlet forms the premixed inlet at a condition. For a pre-cracked pool the
// inlet temperature is below the unburned temperature by the cracking
// enthalpy (fuel.Inlet.TemperatureShift).
func (s *Study) Inlet(c Condition) (flame.Inlet, *fuel.Inlet, error) {
	in, err := s.Fuel.Inlet(s.Case.Oxidizer, c.Phi, c.T)
	if err != nil {
		return flame.Inlet{}, nil, fmt.Errorf("%s: mixture: %w", s.Case.File, err)
	}
	return flame.Inlet{T: in.T, P: c.P, Y: in.Y}, in, nil
}

// FuelSpecies names the species whose consumption marks the pyrolysis zone:
// the neat fuel's or surrogate's burnable components (oxygen demand
// C + H/4 - O/2 > 0), the pseudo-fuel of a
// finite-rate pool, or the hydrocarbons of a pre-cracked pool.
func (s *Study) FuelSpecies() []string {
	var names []string
	switch {
	case s.Fuel.Kind == fuel.Neat:
		// Only species that burn: a diluent (N2, CO2, H2O) is never
		// consumed and marks no pyrolysis zone.
		for n := range s.Fuel.Composition {
			if k := s.Mechanism.SpeciesIndex(n); k < 0 || fuel.FormulaOf(s.Mechanism.Species[k].Composition).OxygenDemand() > 0 {
				names = append(names, n)
			}
		}
	case s.Fuel.Mode == fuel.ModeFiniteRate:
		names = append(names, s.Fuel.Pool.Pseudo.Name)
	default:
		for _, n := range s.Fuel.Pool.Species {
			k := s.Mechanism.SpeciesIndex(n)
			if k >= 0 && s.Mechanism.Species[k].Composition["C"] > 0 {
				names = append(names, n)
			}
		}
	}
	sort.Strings(names)
	return names
}

// FuelDescription is a short human description of the fuel; empty for a
// fuel given as inline mole fractions.
func (s *Study) FuelDescription() string {
	if s.Fuel.Name == casefile.InlineFuelName {
		return "" // inline mole fractions have no name of their own
	}
	if s.Fuel.Kind == fuel.Neat {
		return s.Fuel.Name
	}
	return fmt.Sprintf("%s (%s, %s pool)", s.Fuel.Name, s.Fuel.Pool.Formula, s.Fuel.Mode)
}

// Solve solves the flame at a condition; start, when non-nil, is a
// neighbouring solution to continue from (it falls back to a cold start if
// continuation fails).
func (s *Study) Solve(c Condition, start *flame.Solution) (*Result, error) {
	in, fin, err := s.Inlet(c)
	if err != nil {
		return nil, err
	}
	var sol *flame.Solution
	cold := start == nil
	if start != nil {
		sol, err = s.Solver.SolveFrom(start, in, s.Settings)
		if err != nil {
			sol, err = s.Solver.Solve(in, s.Settings)
			cold = true
		}
	} else {
		sol, err = s.Solver.Solve(in, s.Settings)
	}
	if err != nil {
		if errors.Is(err, flame.ErrNotConverged) {
			return nil, fmt.Errorf("%s (%v): %w\nwhat to try: a finer initial grid ([grid] initial_points = 60), a longer domain ([grid] domain_length), "+
				"or a condition closer to stoichiometric; very lean or rich mixtures may be outside the flammability limits of the model", s.Case.File, c, err)
		}
		return nil, fmt.Errorf("%s (%v): %w", s.Case.File, c, err)
	}
	prof, err := s.Solver.Profile(sol)
	if err != nil {
		return nil, fmt.Errorf("%s (%v): %w", s.Case.File, c, err)
	}
	zones, err := prof.Zones(s.FuelSpecies(), in.Y)
	if err != nil {
		return nil, fmt.Errorf("%s (%v): %w", s.Case.File, c, err)
	}
	cs := s.Case
	sum := &output.FlameSummary{
		Title: cs.Title, Mechanism: s.MechanismName, Fuel: s.FuelDescription(), FuelComposition: inletFuel(s, fin), Oxidizer: cs.Oxidizer,
		EquivalenceRatio: c.Phi, UnburnedTemperatureK: c.T, InletTemperatureK: in.T, PressurePa: c.P,
		Converged: true, FlameSpeed: prof.FlameSpeed, MassFlux: prof.MassFlux, BurnedTemperature: prof.BurnedT,
		AdiabaticTemperature: sol.AdiabaticT, ThermalThickness: prof.ThermalThick, PeakHeatReleaseX: prof.PeakHeatReleaseX,
		GridPoints: sol.Points(), DomainLength: sol.X[len(sol.X)-1] - sol.X[0],
		NewtonIterations: sol.Stats.NewtonIterations, TimeSteps: sol.Stats.TimeSteps,
		JacobianEvaluations: sol.Stats.JacobianEvaluations, Refinements: sol.Stats.Refinements,
		WallTimeS: sol.Stats.WallTime.Seconds(), Note: output.SafetyNote, Zones: zones,
	}
	res := &Result{Condition: c, Solution: sol, Profile: prof, Summary: sum, ColdStart: cold}
	if cs.Sensitivity.Enabled {
		if err := s.Sensitivity(res); err != nil {
			return nil, err
		}
	}
	return res, nil
}

// ReadRestart reads a restart file written by WriteFlame onto the study's
// mechanism, for Solve's start argument.
func (s *Study) ReadRestart(path string) (*flame.Solution, error) {
	f, err := infile.Open(path, infile.Restart)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return readRestart(f, path, s.Mechanism)
}

// readRestart reads a restart file and checks that the state it holds is
// physical: the reader accepts any number, "NaN" included, in the header.
func readRestart(r io.Reader, path string, m *chem.Mechanism) (*flame.Solution, error) {
	sol, err := flame.ReadRestart(r, path, m)
	if err != nil {
		return nil, err
	}
	if err := checkRestart(sol); err != nil {
		return nil, fmt.Errorf("%s: %w; it is not a restart file flame1d wrote, or it was edited", path, err)
	}
	return sol, nil
}

// checkRestart refuses a restart state that is not a flame: temperatures
// and pressure that are not finite positive numbers, mass fractions outside
// [0, 1] beyond round-off, a mass flux that is not positive, an anchor
// outside the domain.
func checkRestart(s *flame.Solution) error {
	positive := func(what string, v float64) error {
		if !(v > 0) || math.IsInf(v, 0) {
			return fmt.Errorf("%s %v is not a finite positive number", what, v)
		}
		return nil
	}
	for _, c := range []struct {
		what string
		v    float64
	}{{"inlet temperature", s.Inlet.T}, {"pressure", s.Inlet.P}, {"anchor temperature", s.AnchorT}, {"mass flux", s.MassFlux()}} {
		if err := positive(c.what, c.v); err != nil {
			return err
		}
	}
	const roundOff = 1e-6
	for _, y := range s.Inlet.Y {
		if !(y >= -roundOff && y <= 1+roundOff) {
			return fmt.Errorf("inlet mass fraction %v is outside [0, 1]", y)
		}
	}
	n := s.Points()
	if !(s.AnchorX >= s.X[0] && s.AnchorX <= s.X[n-1]) || !(s.InitialLength >= 0) || math.IsInf(s.InitialLength, 0) {
		return fmt.Errorf("anchor at %v m or initial length %v m does not fit the domain %v-%v m", s.AnchorX, s.InitialLength, s.X[0], s.X[n-1])
	}
	for j := 0; j < n; j++ {
		if err := positive(fmt.Sprintf("temperature at point %d", j+1), s.T(j)); err != nil {
			return err
		}
		for _, y := range s.Y(j) {
			if !(y >= -roundOff && y <= 1+roundOff) {
				return fmt.Errorf("mass fraction %v at point %d is outside [0, 1]", y, j+1)
			}
		}
	}
	return nil
}

// WriteFlame writes a flame's result set into dir: profile.csv, zones.csv,
// restart.csv (the state to continue from with `flame1d run --restart`),
// the flame plot (flame.svg, flame.png), summary.txt and summary.json. dir
// is normally the folder of an output.Set, which puts the files in place as
// one set.
func WriteFlame(dir string, r *Result) error { return writeFlame(dir, r, true) }

// WriteFlameTables writes the result set without the flame plot: for
// sweeps, whose many points are seen through their S_L charts (a flame plot
// costs about 0.35 s, BenchmarkFlamePlot in package output).
func WriteFlameTables(dir string, r *Result) error { return writeFlame(dir, r, false) }

func writeFlame(dir string, r *Result, plot bool) error {
	comments := []string{
		"flame1d profile: " + r.Summary.Title,
		fmt.Sprintf("mechanism %s; equivalence ratio %g; unburned %.2f K; %.6g Pa; flame speed %s m/s",
			r.Summary.Mechanism, r.Summary.EquivalenceRatio, r.Summary.UnburnedTemperatureK, r.Summary.PressurePa,
			output.FormatFloat(r.Summary.FlameSpeed)),
		output.SafetyNote,
	}
	if err := output.WriteFileAtomic(filepath.Join(dir, "profile.csv"), output.ProfileTable(r.Profile, comments).WriteCSV); err != nil {
		return err
	}
	if r.Summary.Zones != nil {
		err := output.WriteFileAtomic(filepath.Join(dir, "zones.csv"), func(w io.Writer) error {
			return output.WriteZonesCSV(w, r.Summary.Zones, comments)
		})
		if err != nil {
			return err
		}
	}
	if err := output.WriteFileAtomic(filepath.Join(dir, "restart.csv"), r.Solution.WriteRestart); err != nil {
		return err
	}
	if plot && r.Summary.Zones != nil {
		for _, ext := range []string{".svg", ".png"} {
			if err := output.FlamePlot(filepath.Join(dir, "flame"+ext), flameChart(r.Summary), r.Profile, r.Summary.Zones); err != nil {
				return err
			}
		}
	}
	if r.Sensitivity != nil {
		if err := writeSensitivity(dir, r, comments, plot); err != nil {
			return err
		}
	}
	if err := output.WriteFileAtomic(filepath.Join(dir, "summary.txt"), r.Summary.WriteText); err != nil {
		return err
	}
	return output.WriteFileAtomic(filepath.Join(dir, "summary.json"), r.Summary.WriteJSON)
}

// flameChart titles a flame plot with the case title and a line naming the
// fuel, the condition and the flame speed.
func flameChart(s *output.FlameSummary) output.Chart {
	title := s.Title
	if title == "" {
		title = "Flame structure"
	}
	return output.Chart{Title: title, Note: fmt.Sprintf("%s, φ = %.3g, %.0f K, %.4g atm: S_L = %.3g m/s",
		s.FuelName(), s.EquivalenceRatio, s.UnburnedTemperatureK, s.PressurePa/101325, s.FlameSpeed)}
}

// inletFuel lists the fuel-side species of the inlet by mole fraction
// relative to the fuel (the neat composition, the pseudo-fuel, or the pool).
func inletFuel(s *Study, in *fuel.Inlet) map[string]float64 {
	out := map[string]float64{}
	switch {
	case s.Fuel.Kind == fuel.Neat:
		for n, x := range s.Fuel.Composition {
			out[n] = x
		}
	case s.Fuel.Mode == fuel.ModeFiniteRate:
		out[s.Fuel.Pool.Pseudo.Name] = 1
	default:
		total := 0.0
		for _, m := range s.Fuel.Pool.Moles {
			total += m
		}
		for i, n := range s.Fuel.Pool.Species {
			out[n] = s.Fuel.Pool.Moles[i] / total
		}
	}
	return out
}
