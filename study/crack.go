package study

import (
	"fmt"
	"strings"

	"flame1d/casefile"
	"flame1d/fuel"
	"flame1d/thermo"
)

// Cracking is a computed thermodynamic cracking study (casefile.Study):
// the constrained equilibrium of its fuel per step, with the species set
// it ran over.
type Cracking struct {
	Title string
	// Source says where the species came from: the mechanism's name and
	// the extra species files.
	Source string
	Result *fuel.StudyResult
	Set    *thermo.SpeciesSet
	// Notes report species definitions skipped as repeats.
	Notes []string
}

// RunCracking reads the study file at path, assembles its species (the
// mechanism's, then the extra files') and computes every step.
func RunCracking(path string) (*Cracking, error) {
	st, err := casefile.ReadStudy(path)
	if err != nil {
		return nil, err
	}
	var base []thermo.Species
	var source []string
	if st.Mechanism != "" {
		m, err := LoadMechanismFor(st.Mechanism, path)
		if err != nil {
			return nil, err
		}
		for i := range m.Species {
			base = append(base, m.Species[i].Species)
		}
		source = append(source, m.Name)
	}
	source = append(source, st.ExtraSpecies...)
	species, notes, err := st.Species(base)
	if err != nil {
		return nil, err
	}
	set, err := thermo.NewSpeciesSet(species)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	res, err := fuel.RunStudy(set, st.Formula, st.Temperature, st.Pressure, st.Candidates, st.Steps)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	title := st.Title
	if title == "" {
		title = "cracking study of " + st.Formula.String()
	}
	return &Cracking{Title: title, Source: strings.Join(source, " + "), Result: res, Set: set, Notes: notes}, nil
}
