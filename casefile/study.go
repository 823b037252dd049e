package casefile

import (
	"fmt"
	"path/filepath"
	"strings"

	"flame1d/chem/keyblock"
	"flame1d/chem/mechtoml"
	"flame1d/fuel"
	"flame1d/internal/infile"
	"flame1d/thermo"
	"flame1d/units"
)

// Study is a thermodynamic cracking study file, read and converted to SI:
// the constrained equilibrium of one fuel at fixed temperature and
// pressure, repeated over a sequence of cumulative walls (species held at
// zero). docs/fuels.md documents every key of its [study] table.
type Study struct {
	File  string
	Title string
	// Mechanism supplies species and thermo (built-in name or path
	// relative to File); the caller loads it. Empty when ExtraSpecies
	// gives every species.
	Mechanism string
	// ExtraSpecies are further species files: classic thermo files (any
	// name not ending in .toml) or flame1d TOML mechanisms, relative to
	// File. A name already present keeps its first definition.
	ExtraSpecies []string
	// Condensed names species to treat as pure condensed phases (e.g.
	// graphite carried as "CSOLID").
	Condensed []string
	// Formula is the fuel's mean formula: of the [fuels.NAME] table the
	// study names, or from the study's own formula keys.
	Formula     fuel.Formula
	Temperature float64 // K
	Pressure    float64 // Pa
	// Candidates, when given, restricts the study to these species.
	Candidates []string
	Steps      []fuel.StudyStep
}

// studyFile is the TOML layout of a study file.
type studyFile struct {
	Study struct {
		Title        string   `toml:"title"`
		Mechanism    string   `toml:"mechanism"`
		ExtraSpecies []string `toml:"extra_species"`
		Condensed    []string `toml:"condensed"`
		Fuel         string   `toml:"fuel"`
		Formula      string   `toml:"formula"`
		HToC         float64  `toml:"h_to_c"`
		OToC         float64  `toml:"o_to_c"`
		MolarMass    any      `toml:"molar_mass"`
		Temperature  any      `toml:"temperature"`
		Pressure     any      `toml:"pressure"`
		Candidates   []string `toml:"candidates"`
		Steps        []struct {
			Label         string   `toml:"label"`
			Exclude       []string `toml:"exclude"`
			ExcludeGroups []string `toml:"exclude_groups"`
			MaxCarbon     int      `toml:"max_carbon"`
		} `toml:"steps"`
	} `toml:"study"`
	Fuels map[string]fuelTable `toml:"fuels"`
}

// ParseStudy reads a study file; file names the source in errors. Unknown
// keys are errors with their line.
func ParseStudy(src []byte, file string) (*Study, error) {
	var sf studyFile
	md, err := decodeStrict(src, file, &sf, "docs/fuels.md")
	if err != nil {
		return nil, err
	}
	if !md.IsDefined("study") {
		return nil, fmt.Errorf("%s: no [study] table (see docs/fuels.md)", file)
	}
	fe := keyErrors(src, file)
	t := &sf.Study
	st := &Study{File: file, Title: t.Title, Mechanism: t.Mechanism, ExtraSpecies: t.ExtraSpecies,
		Condensed: t.Condensed, Candidates: t.Candidates}
	for _, s := range t.Steps {
		st.Steps = append(st.Steps, fuel.StudyStep{Label: s.Label, Exclude: s.Exclude, ExcludeGroups: s.ExcludeGroups, MaxCarbon: s.MaxCarbon})
	}

	own := fuel.Spec{Formula: t.Formula, HToC: t.HToC, OToC: t.OToC}
	if own.MolarMass, err = quantity(t.MolarMass, units.MolarMass, 0); err != nil {
		return nil, fe("study.molar_mass", "%v", err)
	}
	hasOwn := own.Formula != "" || own.HToC != 0 || own.MolarMass != 0
	switch {
	case t.Fuel != "" && hasOwn:
		return nil, fe("study.fuel", "give fuel (a name in [fuels]) or formula, not both")
	case t.Fuel != "":
		ft, ok := sf.Fuels[t.Fuel]
		if !ok {
			return nil, fe("study.fuel", "no [fuels.%s] table in the file", t.Fuel)
		}
		s, err := ft.spec(t.Fuel, fe)
		if err != nil {
			return nil, err
		}
		if len(s.Composition) > 0 {
			return nil, fe("study.fuel", "%s is a neat fuel or surrogate; a cracking study needs a mean formula", t.Fuel)
		}
		if st.Formula, err = s.MeanFormula(); err != nil {
			return nil, fe("fuels."+t.Fuel, "%v", err)
		}
	case hasOwn:
		if st.Formula, err = own.MeanFormula(); err != nil {
			return nil, fe("study", "%v", err)
		}
	default:
		return nil, fe("study", "name the fuel (fuel = \"NAME\" of a [fuels.NAME] table) or give formula = \"C11H22\"")
	}

	if t.Temperature == nil || t.Pressure == nil {
		return nil, fe("study", "give temperature and pressure, e.g. temperature = \"1300 K\", pressure = \"10 bar\"")
	}
	if st.Temperature, err = quantity(t.Temperature, units.Temperature, 0); err != nil {
		return nil, fe("study.temperature", "%v", err)
	}
	if !(st.Temperature >= 300 && st.Temperature <= 4000) {
		return nil, fe("study.temperature", "%g K is outside 300-4000 K", st.Temperature)
	}
	if st.Pressure, err = quantity(t.Pressure, units.Pressure, 0); err != nil {
		return nil, fe("study.pressure", "%v", err)
	}
	if !(st.Pressure >= 1 && st.Pressure <= 1e9) {
		return nil, fe("study.pressure", "%g Pa is outside 1 Pa - 1 GPa", st.Pressure)
	}
	if st.Mechanism == "" && len(st.ExtraSpecies) == 0 {
		return nil, fe("study", "give mechanism or extra_species: the study needs species")
	}
	return st, nil
}

// ReadStudy reads a study file from disk.
func ReadStudy(path string) (*Study, error) {
	src, err := infile.ReadFile(path, infile.FuelFile)
	if err != nil {
		return nil, err
	}
	return ParseStudy(src, path)
}

// Species assembles the species of the study: base (typically its
// mechanism's) followed by those of the extra species files, with the
// Condensed names marked condensed. A species repeated under the same name
// keeps its first definition; the notes say which were skipped.
func (st *Study) Species(base []thermo.Species) ([]thermo.Species, []string, error) {
	out := append([]thermo.Species(nil), base...)
	have := map[string]bool{}
	for _, s := range out {
		have[strings.ToUpper(s.Name)] = true
	}
	dir := filepath.Dir(st.File)
	var notes []string
	for _, p := range st.ExtraSpecies {
		path := p
		if !filepath.IsAbs(path) && st.File != "" {
			path = filepath.Join(dir, p)
		}
		sp, err := readSpecies(path)
		if err != nil {
			return nil, nil, fmt.Errorf("%s: study.extra_species %s: %w", st.File, p, err)
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
	for _, n := range st.Condensed {
		found := false
		for i := range out {
			if strings.EqualFold(out[i].Name, strings.TrimSpace(n)) {
				out[i].Condensed, found = true, true
			}
		}
		if !found {
			return nil, nil, fmt.Errorf("%s: study.condensed: no species %q among the study's species", st.File, n)
		}
	}
	return out, notes, nil
}

// readSpecies reads the species of a flame1d TOML mechanism (name ending
// in .toml) or of a classic thermo file.
func readSpecies(path string) ([]thermo.Species, error) {
	var sp []thermo.Species
	if strings.HasSuffix(strings.ToLower(path), ".toml") {
		m, _, err := mechtoml.ReadFile(path)
		if err != nil {
			return nil, err
		}
		for i := range m.Species {
			sp = append(sp, m.Species[i].Species)
		}
		return sp, nil
	}
	f, err := infile.Open(path, infile.Mechanism)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	recs, _, err := keyblock.ReadThermo(f, path)
	if err != nil {
		return nil, err
	}
	for i := range recs {
		sp = append(sp, recs[i].Species)
	}
	return sp, nil
}
