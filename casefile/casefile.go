// Package casefile reads flame1d case files: TOML documents that say which
// mechanism, which mixture, at which conditions, with which numerical
// settings, and where results go. Values with units may be written as
// strings ("298 K", "1 atm", "2 cm"); bare numbers are SI. Every key is
// documented in docs/case-file.md. Unknown keys are errors that name the key
// and its line, so typos never pass silently.
//
// It also reads the other files people write, into SI values for the
// physics packages: fuel definitions ([fuels.NAME] tables, ReadFuels) and
// thermodynamic cracking studies (ReadStudy), documented in docs/fuels.md,
// and compositions written on a command line (ParseComposition).
package casefile

import (
	"fmt"
	"sort"
	"strings"
	"unicode"

	"flame1d/fuel"
	"flame1d/internal/infile"
	"flame1d/internal/tomlpos"
	"flame1d/units"
)

// Case is a parsed, unit-converted case file. Compositions are still by
// species name; they are resolved against the mechanism later.
type Case struct {
	File  string
	Title string
	// Mechanism is what the case's own fuel burns on (run, sweep): a
	// built-in name or path (relative paths resolved against the case
	// file's folder); see MechanismOf.
	Mechanism string
	// TopLevelMechanism is the file's top-level mechanism key, "" when
	// absent: every fuel that names no mechanism of its own burns on it.
	TopLevelMechanism string

	// Fuel is the fuel the case burns: [mixture] fuel as inline mole
	// fractions (a neat fuel or surrogate named InlineFuelName), or the name of one
	// of the [fuels.NAME] tables.
	Fuel fuel.Spec
	// Fuels are all [fuels.NAME] tables in file order (compare uses them).
	Fuels            []fuel.Spec
	Oxidizer         map[string]float64 // mole fractions (normalised); default air
	EquivalenceRatio float64
	Temperature      float64 // unburned, K
	Pressure         float64 // Pa

	Grid   GridSettings
	Solver SolverSettings
	Output OutputSettings
	Sweep  *SweepSettings // nil when the case has no [sweep] table
	// Compare is the [compare] table (nil when absent).
	Compare *CompareSettings
	// Sensitivity is the [sensitivity] table (zero when absent: off).
	Sensitivity SensitivitySettings
}

// CompareSettings mirror the [compare] table: which fuels, over which
// equivalence ratios, and where to overlay profiles.
type CompareSettings struct {
	Fuels             []string
	EquivalenceRatios []float64
	ProfilePhi        float64 // equivalence ratio of the profile overlay
}

// DefaultMechanism is the mechanism of a neat fuel or surrogate in a case
// that names none; FoundationalMechanism that of a cracked-pool fuel: the
// C0-C4 set validated for the pool species (Ranzi et al. 2012).
const (
	DefaultMechanism      = "smith1999-natgas"
	FoundationalMechanism = "ranzi2012-c1c3"
)

// MechanismOf names the mechanism a fuel burns on: its table's own
// mechanism key; else the case's top-level mechanism when the file gives
// one; else FoundationalMechanism for a cracked pool and DefaultMechanism
// for a neat fuel.
func (c *Case) MechanismOf(f fuel.Spec) string {
	if f.Mechanism != "" {
		return f.Mechanism
	}
	if c.TopLevelMechanism != "" {
		return c.TopLevelMechanism
	}
	if f.IsPool() {
		return FoundationalMechanism
	}
	return DefaultMechanism
}

// FuelByName returns the named [fuels.NAME] entry.
func (c *Case) FuelByName(name string) (fuel.Spec, bool) {
	for _, f := range c.Fuels {
		if f.Name == name {
			return f, true
		}
	}
	return fuel.Spec{}, false
}

// GridSettings mirror the [grid] table; zero means "solver default".
type GridSettings struct {
	InitialPoints                int
	MaxChange, MaxGradientChange float64
	MaxSpacingRatio              float64
	RemovalMargin                float64
	MaxPoints                    int
	DomainLength                 float64 // m
}

// SolverSettings mirror the [solver] table; zero means "solver default"
// (flame.DefaultSettings holds the values).
type SolverSettings struct {
	// NoThermalDiffusion is set by thermal_diffusion = false.
	NoThermalDiffusion bool
	// CentralConvection selects central convective face values ("central",
	// second order) instead of the default upwind ones ("upwind").
	CentralConvection bool
	// Multicomponent selects multicomponent diffusion ("multicomponent")
	// instead of the default mixture-averaged ("mixture-averaged").
	Multicomponent bool
	RelativeTol    float64
	AnchorRise     float64 // K above the unburned temperature
	Workers        int
}

// OutputSettings mirror the [output] table.
type OutputSettings struct {
	Directory string
}

// InlineFuelName names a fuel given as inline mole fractions in [mixture]
// (it has no table name of its own); messages then point at the key.
const InlineFuelName = "mixture.fuel"

// DefaultOxidizer is dry air as 21% O2 / 79% N2 by volume.
func DefaultOxidizer() map[string]float64 { return map[string]float64{"O2": 0.21, "N2": 0.79} }

// raw is the TOML layout. Quantities are `any` so that both "298 K" and
// 298.0 are accepted.
type raw struct {
	Title     string `toml:"title"`
	Mechanism string `toml:"mechanism"`
	Mixture   struct {
		Fuel             fuelField          `toml:"fuel"`
		Oxidizer         map[string]float64 `toml:"oxidizer"`
		EquivalenceRatio *float64           `toml:"equivalence_ratio"`
		Temperature      any                `toml:"temperature"`
		Pressure         any                `toml:"pressure"`
	} `toml:"mixture"`
	Grid struct {
		InitialPoints     int     `toml:"initial_points"`
		MaxChange         float64 `toml:"max_change"`
		MaxGradientChange float64 `toml:"max_gradient_change"`
		MaxSpacingRatio   float64 `toml:"max_spacing_ratio"`
		RemovalMargin     float64 `toml:"removal_margin"`
		MaxPoints         int     `toml:"max_points"`
		DomainLength      any     `toml:"domain_length"`
	} `toml:"grid"`
	Solver struct {
		ThermalDiffusion *bool    `toml:"thermal_diffusion"`
		Convection       string   `toml:"convection"`
		Diffusion        string   `toml:"diffusion"`
		RelativeTol      *float64 `toml:"relative_tolerance"`
		AnchorRise       float64  `toml:"anchor_rise"`
		Workers          int      `toml:"workers"`
	} `toml:"solver"`
	Output struct {
		Directory string `toml:"directory"`
	} `toml:"output"`
	Sweep   *rawSweep            `toml:"sweep"`
	Fuels   map[string]fuelTable `toml:"fuels"`
	Compare *struct {
		Fuels             []string  `toml:"fuels"`
		EquivalenceRatios []float64 `toml:"equivalence_ratios"`
		ProfilePhi        *float64  `toml:"profile_equivalence_ratio"`
	} `toml:"compare"`
	Sensitivity *rawSensitivity `toml:"sensitivity"`
}

// FieldError is a problem with one key of a case file.
type FieldError struct {
	File string
	Line int // 0 when unknown
	Key  string
	Msg  string
}

func (e *FieldError) Error() string {
	loc := e.File
	if e.Line > 0 {
		loc = fmt.Sprintf("%s:%d", e.File, e.Line)
	}
	return fmt.Sprintf("%s: %s: %s", loc, e.Key, e.Msg)
}

// ReadFile parses and checks a case file.
func ReadFile(path string) (*Case, error) {
	src, err := infile.ReadFile(path, infile.CaseFile)
	if err != nil {
		return nil, err
	}
	return Parse(src, path)
}

// Parse parses and checks case-file text; file names the source in errors.
func Parse(src []byte, file string) (*Case, error) {
	var r raw
	md, err := decodeStrict(src, file, &r, "docs/case-file.md")
	if err != nil {
		return nil, err
	}
	fe := keyErrors(src, file)
	c := &Case{File: file, Title: r.Title, TopLevelMechanism: r.Mechanism}
	if err := checkText(r.Title, maxTitleBytes); err != nil {
		return nil, fe("title", "%v", err)
	}
	for _, k := range md.Keys() {
		if len(k) == 2 && k[0] == "fuels" {
			t := r.Fuels[k[1]]
			spec, err := t.spec(k[1], fe)
			if err != nil {
				return nil, err
			}
			c.Fuels = append(c.Fuels, spec)
		}
	}
	switch f := r.Mixture.Fuel; {
	case f.err != nil:
		return nil, fe("mixture.fuel", "%v", f.err)
	case f.name != "":
		spec, ok := c.FuelByName(f.name)
		if !ok {
			return nil, fe("mixture.fuel", "no [fuels.%s] table in this file (defined: %s)", f.name, fuelNames(c.Fuels))
		}
		c.Fuel = spec
	case f.composition != nil:
		norm, err := normalised(f.composition)
		if err != nil {
			return nil, fe("mixture.fuel", "%v", err)
		}
		c.Fuel = fuel.Spec{Name: InlineFuelName, Composition: norm}
	default:
		return nil, fe("mixture.fuel", "missing: give the fuel as mole fractions, e.g. fuel = { CH4 = 1.0 }, or the name of a [fuels.NAME] table")
	}
	c.Mechanism = c.MechanismOf(c.Fuel)
	if r.Compare != nil {
		cmp := &CompareSettings{Fuels: r.Compare.Fuels, EquivalenceRatios: r.Compare.EquivalenceRatios, ProfilePhi: valueOr(r.Mixture.EquivalenceRatio, 1)}
		if r.Compare.ProfilePhi != nil {
			cmp.ProfilePhi = *r.Compare.ProfilePhi
		}
		if len(cmp.Fuels) == 0 {
			for _, f := range c.Fuels {
				cmp.Fuels = append(cmp.Fuels, f.Name)
			}
		}
		if len(cmp.Fuels) < 2 {
			return nil, fe("compare.fuels", "needs at least two fuels to compare (define [fuels.NAME] tables)")
		}
		for _, name := range cmp.Fuels {
			if _, ok := c.FuelByName(name); !ok {
				return nil, fe("compare.fuels", "no [fuels.%s] table in this file (defined: %s)", name, fuelNames(c.Fuels))
			}
		}
		for _, phi := range cmp.EquivalenceRatios {
			if !(phi > 0 && phi < 100) {
				return nil, fe("compare.equivalence_ratios", "equivalence ratio %g: %s", phi, phiRange)
			}
		}
		if !(cmp.ProfilePhi > 0) {
			return nil, fe("compare.profile_equivalence_ratio", "must be positive")
		}
		c.Compare = cmp
	}
	c.Oxidizer = DefaultOxidizer()
	if len(r.Mixture.Oxidizer) > 0 {
		if c.Oxidizer, err = normalised(r.Mixture.Oxidizer); err != nil {
			return nil, fe("mixture.oxidizer", "%v", err)
		}
	}
	if r.Mixture.EquivalenceRatio == nil {
		return nil, fe("mixture.equivalence_ratio", "missing: e.g. equivalence_ratio = 1.0")
	}
	c.EquivalenceRatio = *r.Mixture.EquivalenceRatio
	if !(c.EquivalenceRatio > 0 && c.EquivalenceRatio < 100) {
		return nil, fe("mixture.equivalence_ratio", "%g: %s", c.EquivalenceRatio, phiRange)
	}
	if c.Temperature, err = quantity(r.Mixture.Temperature, units.Temperature, 298.15); err != nil {
		return nil, fe("mixture.temperature", "%v", err)
	}
	if !(c.Temperature > 150 && c.Temperature < 2000) {
		return nil, fe("mixture.temperature", "unburned temperature %g K is outside 150-2000 K", c.Temperature)
	}
	if c.Pressure, err = quantity(r.Mixture.Pressure, units.Pressure, 101325); err != nil {
		return nil, fe("mixture.pressure", "%v", err)
	}
	if !(c.Pressure >= 100 && c.Pressure <= 1e8) {
		return nil, fe("mixture.pressure", "pressure %g Pa is outside 100 Pa - 100 MPa", c.Pressure)
	}

	g := r.Grid
	c.Grid = GridSettings{InitialPoints: g.InitialPoints, MaxChange: g.MaxChange, MaxGradientChange: g.MaxGradientChange, MaxSpacingRatio: g.MaxSpacingRatio, RemovalMargin: g.RemovalMargin, MaxPoints: g.MaxPoints}
	if c.Grid.DomainLength, err = quantity(g.DomainLength, units.Length, 0); err != nil {
		return nil, fe("grid.domain_length", "%v", err)
	}
	for _, chk := range []struct {
		key string
		bad bool
		msg string
	}{
		{"grid.initial_points", g.InitialPoints != 0 && g.InitialPoints < 8, "needs at least 8 points"},
		{"grid.initial_points", g.InitialPoints > maxInitialPoints, fmt.Sprintf("%d points; at most %d (the grid refines itself; 40-100 is usual)", g.InitialPoints, maxInitialPoints)},
		{"grid.max_points", g.MaxPoints > maxGridPoints, fmt.Sprintf("%d points; at most %d (a converged flame needs a few hundred to a few thousand)", g.MaxPoints, maxGridPoints)},
		{"grid.initial_points", g.InitialPoints != 0 && g.MaxPoints != 0 && g.InitialPoints > g.MaxPoints, "must not exceed grid.max_points"},
		{"grid.max_change", g.MaxChange < 0 || g.MaxChange >= 1, "must lie in (0, 1)"},
		{"grid.max_gradient_change", g.MaxGradientChange < 0 || g.MaxGradientChange >= 1, "must lie in (0, 1)"},
		{"grid.max_spacing_ratio", g.MaxSpacingRatio != 0 && g.MaxSpacingRatio < 1.2, "must be at least 1.2"},
		{"grid.removal_margin", g.RemovalMargin < 0 || g.RemovalMargin >= 1, "must lie in [0, 1)"},
		{"grid.max_points", g.MaxPoints != 0 && g.MaxPoints < 20, "must be at least 20"},
		{"grid.domain_length", g.DomainLength != nil && !(c.Grid.DomainLength >= minDomain && c.Grid.DomainLength <= maxDomain),
			fmt.Sprintf("%g m is outside 10 um - 10 m; leave the key out to let the solver choose the length", c.Grid.DomainLength)},
	} {
		if chk.bad {
			return nil, fe(chk.key, "%s", chk.msg)
		}
	}

	s := r.Solver
	c.Solver = SolverSettings{RelativeTol: valueOr(s.RelativeTol, 0), Workers: s.Workers}
	if s.ThermalDiffusion != nil {
		c.Solver.NoThermalDiffusion = !*s.ThermalDiffusion
	}
	switch s.Convection {
	case "", "upwind":
	case "central":
		c.Solver.CentralConvection = true
	default:
		return nil, fe("solver.convection", "%q: use \"upwind\" (default, first order, robust) or \"central\" (second order)", s.Convection)
	}
	switch s.Diffusion {
	case "", "mixture-averaged":
	case "multicomponent":
		c.Solver.Multicomponent = true
	default:
		return nil, fe("solver.diffusion", "%q: use \"mixture-averaged\" (default) or \"multicomponent\" (Stefan-Maxwell, 2-4 times the cost)", s.Diffusion)
	}
	c.Solver.AnchorRise = s.AnchorRise
	if s.AnchorRise != 0 && !(s.AnchorRise >= 20 && s.AnchorRise <= 1500) {
		return nil, fe("solver.anchor_rise", "temperature rise at the anchor point must lie in 20-1500 K (got %g)", s.AnchorRise)
	}
	if s.RelativeTol != nil && !(*s.RelativeTol > 0 && *s.RelativeTol <= 1e-2) {
		return nil, fe("solver.relative_tolerance", "%g: must lie in (0, 1e-2]; leave the key out for the default", *s.RelativeTol)
	}
	if s.Workers < 0 {
		return nil, fe("solver.workers", "must be 0 (all cores) or positive")
	}
	c.Output.Directory = r.Output.Directory
	if c.Sensitivity, err = parseSensitivity(r.Sensitivity, file, fe); err != nil {
		return nil, err
	}
	if c.Sweep, err = parseSweep(r.Sweep, c, src, file); err != nil {
		return nil, err
	}
	return c, nil
}

// Bounds on case-file values that size the work or are copied into every
// output file.
const (
	// maxTitleBytes bounds the title and fuel descriptions, copied into
	// file headers.
	maxTitleBytes = 200
	// maxNameBytes bounds a fuel name, which also names a folder.
	maxNameBytes = 64
	// maxInitialPoints and maxGridPoints bound the grid: memory grows with
	// points x species squared (about 80 kB a point for GRI-Mech 3.0).
	maxInitialPoints = 1000
	maxGridPoints    = 10000
	// minDomain and maxDomain (m) bound [grid] domain_length: a flame
	// zone is about 1 um thick at 100 MPa and about 1 m at 100 Pa.
	minDomain = 1e-5
	maxDomain = 10
)

const phiRange = "the equivalence ratio must lie between 0 and 100 (both excluded)"

// checkText refuses text that would break the files it is copied into:
// control characters (line breaks, tabs, escapes) and text longer than
// max bytes.
func checkText(s string, max int) error {
	if len(s) > max {
		return fmt.Errorf("%d bytes; at most %d", len(s), max)
	}
	for i, r := range s {
		if unicode.IsControl(r) || r == '\u2028' || r == '\u2029' {
			return fmt.Errorf("control character %U at byte %d: write it on one line, without tabs or escapes", r, i)
		}
	}
	return nil
}

// quantityNames are the keys read by quantity, in case and fuel files.
var quantityNames = map[string]bool{
	"temperature": true, "pressure": true, "domain_length": true, "molar_mass": true,
	"lower_heating_value": true, "higher_heating_value": true, "vaporization_enthalpy": true,
	"standard_entropy": true, "cracking_time": true, "at_temperature": true, "activation_energy": true, "lj_diameter": true,
}

// quantity converts a TOML value (number in SI, or a string with units) to
// SI; nil gives the default.
func quantity(v any, d units.Dimension, def float64) (float64, error) {
	switch x := v.(type) {
	case nil:
		return def, nil
	case int64:
		return float64(x), nil
	case float64:
		return x, nil
	case string:
		return units.Parse(x, d)
	default:
		return 0, fmt.Errorf("expected a number or a string with units, got %s", tomlpos.TypeName(v))
	}
}

// normalised checks a composition and scales it to sum to one.
func normalised(comp map[string]float64) (map[string]float64, error) {
	sum := 0.0
	names := make([]string, 0, len(comp))
	for n, v := range comp {
		if !(v >= 0) {
			return nil, fmt.Errorf("amount of %s must be non-negative (got %g)", n, v)
		}
		sum += v
		names = append(names, n)
	}
	if !(sum > 0) {
		return nil, fmt.Errorf("amounts sum to zero")
	}
	sort.Strings(names)
	out := make(map[string]float64, len(comp))
	for _, n := range names {
		out[n] = comp[n] / sum
	}
	return out, nil
}

func fuelNames(fs []fuel.Spec) string {
	if len(fs) == 0 {
		return "none"
	}
	names := make([]string, len(fs))
	for i, f := range fs {
		names[i] = f.Name
	}
	return strings.Join(names, ", ")
}

func valueOr(v *float64, def float64) float64 {
	if v == nil {
		return def
	}
	return *v
}

// fuelField is [mixture] fuel: inline mole fractions or a fuel name.
type fuelField struct {
	name        string
	composition map[string]float64
	err         error
}

func (f *fuelField) UnmarshalTOML(v any) error {
	switch x := v.(type) {
	case string:
		f.name = x
	case map[string]any:
		f.composition = map[string]float64{}
		for n, a := range x {
			switch y := a.(type) {
			case int64:
				f.composition[n] = float64(y)
			case float64:
				f.composition[n] = y
			default:
				f.err = fmt.Errorf("amount of %s must be a number", n)
			}
		}
	default:
		f.err = fmt.Errorf("expected mole fractions { CH4 = 1.0 } or a fuel name, got %s", tomlpos.TypeName(v))
	}
	return nil
}
