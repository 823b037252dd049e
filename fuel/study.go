package fuel

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"flame1d/thermo"
)

// StudyStep adds walls to those of the steps before it.
type StudyStep struct {
	Label string
	// Exclude names species to wall off.
	Exclude []string
	// ExcludeGroups walls off classes of species by formula: "condensed",
	// "aromatics" (Aromatic), "polyaromatics" (Polyaromatic), "radicals"
	// (not ClosedShell).
	ExcludeGroups []string
	// MaxCarbon > 0 walls off every species with more carbon atoms.
	MaxCarbon int
}

// Wall groups of StudyStep.ExcludeGroups.
var wallGroups = map[string]func(sp *thermo.Species) bool{
	"condensed":     func(sp *thermo.Species) bool { return sp.Condensed },
	"aromatics":     func(sp *thermo.Species) bool { return Aromatic(sp.Composition) },
	"polyaromatics": func(sp *thermo.Species) bool { return Polyaromatic(sp.Composition) },
	"radicals":      func(sp *thermo.Species) bool { return !sp.Condensed && !ClosedShell(sp.Composition) },
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
