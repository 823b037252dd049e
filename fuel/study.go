package fuel

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"flame1d/chem/keyblock"
	"flame1d/chem/mechtoml"
	"flame1d/internal/tomlpos"
	"flame1d/thermo"
	"flame1d/units"
)

// StudySpec is a thermodynamic cracking study: the constrained equilibrium
// of one fuel at fixed temperature and pressure, repeated over a sequence
// of cumulative walls (species held at zero). It is the [study] table of a
// study file; docs/fuels.md documents every key.
type StudySpec struct {
	Title string `toml:"title"`
	// Mechanism supplies species and thermo (built-in name or path); the
	// caller loads it. Optional when ExtraSpecies gives every species.
	Mechanism string `toml:"mechanism"`
	// ExtraSpecies are further species: classic thermo files (any name
	// not ending in .toml) or flame1d TOML mechanisms, relative to the
	// study file. A name already present keeps its first definition.
	ExtraSpecies []string `toml:"extra_species"`
	// Condensed names species to treat as pure condensed phases (e.g.
	// graphite carried as "CSOLID").
	Condensed []string `toml:"condensed"`
	// Fuel names a fuel of the file's [fuels] table; or give the formula
	// (or h_to_c with molar_mass) here.
	Fuel      string   `toml:"fuel"`
	Formula   string   `toml:"formula"`
	HToC      float64  `toml:"h_to_c"`
	OToC      float64  `toml:"o_to_c"`
	MolarMass Quantity `toml:"molar_mass"`

	Temperature Quantity `toml:"temperature"`
	Pressure    Quantity `toml:"pressure"`
	// Candidates, when given, restricts the study to these species.
	Candidates []string    `toml:"candidates"`
	Steps      []StudyStep `toml:"steps"`
}

// StudyStep adds walls to those of the steps before it.
type StudyStep struct {
	Label string `toml:"label"`
	// Exclude names species to wall off.
	Exclude []string `toml:"exclude"`
	// ExcludeGroups walls off classes of species by formula: "condensed",
	// "aromatics" (Aromatic), "polyaromatics" (Polyaromatic), "radicals"
	// (not ClosedShell).
	ExcludeGroups []string `toml:"exclude_groups"`
	// MaxCarbon > 0 walls off every species with more carbon atoms.
	MaxCarbon int `toml:"max_carbon"`
}

// Wall groups of StudyStep.ExcludeGroups.
var wallGroups = map[string]func(sp *thermo.Species) bool{
	"condensed":     func(sp *thermo.Species) bool { return sp.Condensed },
	"aromatics":     func(sp *thermo.Species) bool { return Aromatic(sp.Composition) },
	"polyaromatics": func(sp *thermo.Species) bool { return Polyaromatic(sp.Composition) },
	"radicals":      func(sp *thermo.Species) bool { return !sp.Condensed && !ClosedShell(sp.Composition) },
}

// StudyFile is the layout of a study file.
type StudyFile struct {
	Study StudySpec       `toml:"study"`
	Fuels map[string]Spec `toml:"fuels"`
}

// ParseStudy reads a study file; file names the source in errors. Unknown
// keys are errors with their line.
func ParseStudy(src []byte, file string) (*StudySpec, map[string]Spec, error) {
	var sf StudyFile
	md, err := toml.Decode(string(src), &sf)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return nil, nil, fmt.Errorf("%s:%d: TOML syntax: %s", file, pe.Position.Line, pe.Message)
		}
		return nil, nil, fmt.Errorf("%s: %w", file, err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		k := und[0]
		return nil, nil, fmt.Errorf("%s:%d: %s: unknown key (check the spelling; docs/fuels.md lists every key)", file, tomlpos.Line(src, k), k.String())
	}
	if !md.IsDefined("study") {
		return nil, nil, fmt.Errorf("%s: no [study] table (see docs/fuels.md)", file)
	}
	for n, s := range sf.Fuels {
		s.Name = n
		sf.Fuels[n] = s
	}
	return &sf.Study, sf.Fuels, nil
}

// ReadStudy reads a study file from disk.
func ReadStudy(path string) (*StudySpec, map[string]Spec, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, nil, fmt.Errorf("study file: %w", err)
	}
	return ParseStudy(src, path)
}

// StudyFormula returns the study fuel's mean formula, from the named fuel
// of fuels or from the study's own formula keys.
func (st *StudySpec) StudyFormula(fuels map[string]Spec) (Formula, error) {
	own := Spec{Formula: st.Formula, HToC: st.HToC, OToC: st.OToC, MolarMass: st.MolarMass}
	hasOwn := own.Formula != "" || own.HToC != 0 || own.MolarMass.Given()
	if st.Fuel != "" {
		if hasOwn {
			return Formula{}, fmt.Errorf("study: give fuel (a name in [fuels]) or formula, not both")
		}
		s, ok := fuels[st.Fuel]
		if !ok {
			return Formula{}, fmt.Errorf("study.fuel: no [fuels.%s] table in the file", st.Fuel)
		}
		if len(s.Composition) > 0 {
			return Formula{}, fmt.Errorf("study.fuel: %s is a neat fuel or surrogate; a cracking study needs a mean formula", st.Fuel)
		}
		f, err := s.formula()
		if err != nil {
			return Formula{}, fmt.Errorf("fuels.%s: %w", st.Fuel, err)
		}
		return f, nil
	}
	if !hasOwn {
		return Formula{}, fmt.Errorf("study: name the fuel (fuel = \"NAME\" of a [fuels.NAME] table) or give formula = \"C11H22\"")
	}
	f, err := own.formula()
	if err != nil {
		return Formula{}, fmt.Errorf("study: %w", err)
	}
	return f, nil
}

// Conditions returns the study's temperature (K) and pressure (Pa).
func (st *StudySpec) Conditions() (T, P float64, err error) {
	if !st.Temperature.Given() || !st.Pressure.Given() {
		return 0, 0, fmt.Errorf("study: give temperature and pressure, e.g. temperature = \"1300 K\", pressure = \"10 bar\"")
	}
	if T, err = st.Temperature.In(units.Temperature); err != nil {
		return 0, 0, fmt.Errorf("study.temperature: %w", err)
	}
	if !(T >= 300 && T <= 4000) {
		return 0, 0, fmt.Errorf("study.temperature %g K is outside 300-4000 K", T)
	}
	if P, err = st.Pressure.In(units.Pressure); err != nil {
		return 0, 0, fmt.Errorf("study.pressure: %w", err)
	}
	if !(P >= 1 && P <= 1e9) {
		return 0, 0, fmt.Errorf("study.pressure %g Pa is outside 1 Pa - 1 GPa", P)
	}
	return T, P, nil
}

// StudySpecies assembles the species of a study: base (typically a
// mechanism's) followed by those of the extra files (paths relative to
// dir), with the Condensed names marked condensed. A species repeated
// under the same name keeps its first definition; the notes say which
// were skipped.
func StudySpecies(base []thermo.Species, dir string, extra, condensed []string) ([]thermo.Species, []string, error) {
	out := append([]thermo.Species(nil), base...)
	have := map[string]bool{}
	for _, s := range out {
		have[strings.ToUpper(s.Name)] = true
	}
	var notes []string
	for _, p := range extra {
		path := p
		if !filepath.IsAbs(path) && dir != "" {
			path = filepath.Join(dir, p)
		}
		var sp []thermo.Species
		if strings.HasSuffix(strings.ToLower(path), ".toml") {
			m, _, err := mechtoml.ReadFile(path)
			if err != nil {
				return nil, nil, fmt.Errorf("study.extra_species %s: %w", p, err)
			}
			for i := range m.Species {
				sp = append(sp, m.Species[i].Species)
			}
		} else {
			f, err := os.Open(path)
			if err != nil {
				return nil, nil, fmt.Errorf("study.extra_species: %w", err)
			}
			recs, _, err := keyblock.ReadThermo(f, path)
			f.Close()
			if err != nil {
				return nil, nil, fmt.Errorf("study.extra_species %s: %w", p, err)
			}
			for i := range recs {
				sp = append(sp, recs[i].Species)
			}
		}
		var skipped []string
		for _, s := range sp {
			if have[strings.ToUpper(s.Name)] {
				skipped = append(skipped, s.Name)
				continue
			}
			have[strings.ToUpper(s.Name)] = true
			out = append(out, s)
		}
		if len(skipped) > 0 {
			notes = append(notes, fmt.Sprintf("%s: kept the earlier definition of %s", p, strings.Join(skipped, " ")))
		}
	}
	for _, n := range condensed {
		found := false
		for i := range out {
			if strings.EqualFold(out[i].Name, strings.TrimSpace(n)) {
				out[i].Condensed, found = true, true
			}
		}
		if !found {
			return nil, nil, fmt.Errorf("study.condensed: no species %q among the study's species", n)
		}
	}
	return out, notes, nil
}

// StudyResult is the product distribution of each step of a study.
type StudyResult struct {
	Formula Formula
	T, P    float64 // K, Pa
	// Species lists the species of the study set.
	Species []string
	Steps   []StepResult
}

// StepResult is one step's constrained equilibrium.
type StepResult struct {
	Label string
	// Walled lists every species walled off up to this step that could
	// hold the fuel's atoms (species with other elements never take part).
	Walled []string
	// Moles per mole of fuel, gas mole fractions, and the share of the
	// fuel's carbon and hydrogen held by each species (over Species).
	Moles, MoleFractions, CarbonShare, HydrogenShare []float64
	// Forced lists allowed species held at zero by the element constraints
	// (see Cracking.Forced).
	Forced      []string
	Equilibrium *thermo.EquilibriumResult
}

// RunStudy computes the constrained equilibrium of one mole of fuel f at T
// and P over set, once per step with the walls of that step and all before
// it. candidates, when non-nil, restricts the study to those species.
func RunStudy(set *thermo.SpeciesSet, f Formula, T, P float64, candidates []string, steps []StudyStep) (*StudyResult, error) {
	if len(steps) == 0 {
		return nil, fmt.Errorf("study: no steps: add [[study.steps]] tables (the first may wall off nothing)")
	}
	n := set.Len()
	walls := make([]bool, n)
	if len(candidates) > 0 {
		for k := range walls {
			walls[k] = true
		}
		for _, c := range candidates {
			k := set.Index(strings.TrimSpace(c))
			if k < 0 {
				return nil, fmt.Errorf("study.candidates: no species %q%s", c, setSuggestion(set, c))
			}
			walls[k] = false
		}
	}
	res := &StudyResult{Formula: f, T: T, P: P}
	for k := range set.Species {
		res.Species = append(res.Species, set.Species[k].Name)
	}
	for i, st := range steps {
		label := st.Label
		if label == "" {
			label = fmt.Sprintf("step %d", i+1)
		}
		for _, name := range st.Exclude {
			k := set.Index(strings.TrimSpace(name))
			if k < 0 {
				return nil, fmt.Errorf("study step %d (%s): exclude: no species %q%s", i+1, label, name, setSuggestion(set, name))
			}
			walls[k] = true
		}
		for _, g := range st.ExcludeGroups {
			in, ok := wallGroups[strings.ToLower(strings.TrimSpace(g))]
			if !ok {
				return nil, fmt.Errorf("study step %d (%s): exclude_groups: unknown group %q (use %s)", i+1, label, g, strings.Join(groupNames(), ", "))
			}
			for k := range set.Species {
				if in(&set.Species[k]) {
					walls[k] = true
				}
			}
		}
		if st.MaxCarbon < 0 {
			return nil, fmt.Errorf("study step %d (%s): max_carbon must be positive", i+1, label)
		}
		if st.MaxCarbon > 0 {
			for k := range set.Species {
				if atomCount(set.Species[k].Composition, "C") > float64(st.MaxCarbon) {
					walls[k] = true
				}
			}
		}
		cr, err := CrackingEquilibrium(set, f, T, P, walls)
		if err != nil {
			return nil, fmt.Errorf("study step %d (%s): %w", i+1, label, err)
		}
		sr := StepResult{Label: label, Forced: cr.Forced, Equilibrium: cr.Equilibrium,
			Moles: cr.Equilibrium.Moles, MoleFractions: cr.Equilibrium.MoleFractions,
			CarbonShare: make([]float64, n), HydrogenShare: make([]float64, n)}
		for k := range set.Species {
			if c, h, o, other := speciesAtoms(set.Species[k].Composition); walls[k] && !other && (o == 0 || f.O > 0) && c+h > 0 {
				sr.Walled = append(sr.Walled, set.Species[k].Name)
			}
			sr.CarbonShare[k] = sr.Moles[k] * atomCount(set.Species[k].Composition, "C") / f.C
			sr.HydrogenShare[k] = sr.Moles[k] * atomCount(set.Species[k].Composition, "H") / f.H
			if math.IsNaN(sr.Moles[k]) {
				return nil, fmt.Errorf("study step %d (%s): the equilibrium amount of %s is not a number", i+1, label, set.Species[k].Name)
			}
		}
		res.Steps = append(res.Steps, sr)
	}
	return res, nil
}

func groupNames() []string {
	var g []string
	for n := range wallGroups {
		g = append(g, n)
	}
	sort.Strings(g)
	return g
}

// Significant returns the indices of the species that hold at least share
// of the fuel's carbon or of its hydrogen in some step, ordered by the
// largest such share.
func (r *StudyResult) Significant(share float64) []int {
	best := make([]float64, len(r.Species))
	for _, st := range r.Steps {
		for k, c := range st.CarbonShare {
			best[k] = math.Max(best[k], math.Max(c, st.HydrogenShare[k]))
		}
	}
	var idx []int
	for k, b := range best {
		if b >= share {
			idx = append(idx, k)
		}
	}
	sort.SliceStable(idx, func(a, b int) bool { return best[idx[a]] > best[idx[b]] })
	return idx
}
