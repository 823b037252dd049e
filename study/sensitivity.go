package study

import (
	"fmt"
	"io"
	"maps"
	"path/filepath"
	"slices"
	"strings"

	"flame1d/casefile"
	"flame1d/flame"
	"flame1d/fuel"
	"flame1d/output"
	"flame1d/sensitivity"
)

// sensitivityTop is how many coefficients the summaries list and
// sensitivityChartBars how many the bar chart draws.
const (
	sensitivityTop       = 10
	sensitivityChartBars = 20
)

// Sensitivity computes the flame-speed sensitivities of a solved flame
// (every rate constant; the diffusion coefficients of the fuel species, the
// pool species, H, H2 and O2; for a finite-rate pool the activation energy
// of the global cracking step; every pool yield, the element closure
// re-applied at the same heating value) and the rate-constant band, and
// records them
// in the result and its summary.
func (s *Study) Sensitivity(r *Result) error {
	factors, err := s.uncertaintyFactors()
	if err != nil {
		return err
	}
	req := flame.SensitivityRequest{DiffusionSpecies: s.diffusionSpecies()}
	if s.Fuel.Kind == fuel.CrackedPool && s.Fuel.Mode == fuel.ModeFiniteRate {
		// fuel.Resolve appends the global cracking step last.
		req.ActivationEnergies = []int{len(s.Mechanism.Reactions) - 1}
	}
	if req.Perturbations, err = s.poolYieldPerturbations(r.Condition); err != nil {
		return fmt.Errorf("%s (%v): pool-yield sensitivities: %w", s.Case.File, r.Condition, err)
	}
	sens, err := s.Solver.Sensitivities(r.Solution, s.Settings, req)
	if err != nil {
		return fmt.Errorf("%s (%v): %w", s.Case.File, r.Condition, err)
	}
	a, err := sensitivity.Analyse(s.Mechanism, sens, factors)
	if err != nil {
		return fmt.Errorf("%s (%v): %w", s.Case.File, r.Condition, err)
	}
	r.Sensitivity = a
	r.Summary.FlameSpeedSigma = a.Sigma
	r.Summary.FlameSpeedBand = sensitivity.FormatBand(a.FlameSpeed, a.Sigma)
	r.Summary.Sensitivities = output.SensitivityEntries(a, sensitivityTop)
	return nil
}

// uncertaintyFactors returns f per reaction of the study's mechanism: the
// case's factors file, the mechanism's own factors, the case's default.
func (s *Study) uncertaintyFactors() ([]float64, error) {
	if s.factors != nil {
		return s.factors, nil
	}
	cs := s.Case.Sensitivity
	var side map[int]float64
	if cs.FactorsFile != "" {
		entries, err := casefile.ReadUncertaintyFactors(cs.FactorsFile)
		if err == nil {
			side, err = sensitivity.MatchFactors(entries, cs.FactorsFile, s.Mechanism)
		}
		if err != nil {
			return nil, fmt.Errorf("%s: [sensitivity] uncertainty_factors: %w", s.Case.File, err)
		}
	}
	s.factors = sensitivity.Factors(s.Mechanism, side, cs.DefaultUncertaintyFactor)
	return s.factors, nil
}

// diffusionSpecies lists the species whose diffusion coefficient gets a
// sensitivity: the fuel's, the pool's, H, H2 and O2, each once, in that
// order, those the mechanism has.
func (s *Study) diffusionSpecies() []int {
	names := s.FuelSpecies()
	if s.Fuel.Pool != nil {
		names = append(names, s.Fuel.Pool.Species...)
	}
	names = append(names, "H", "H2", "O2")
	var out []int
	seen := map[int]bool{}
	for _, n := range names {
		k := s.Mechanism.SpeciesIndex(n)
		if k >= 0 && !seen[k] {
			seen[k] = true
			out = append(out, k)
		}
	}
	return out
}

// writeSensitivity writes sensitivity.csv and, with plot, the bar chart of
// the largest coefficients (sensitivity.svg, sensitivity.png) into dir.
func writeSensitivity(dir string, r *Result, comments []string, plot bool) error {
	a := r.Sensitivity
	err := output.WriteFileAtomic(filepath.Join(dir, "sensitivity.csv"), func(w io.Writer) error {
		return output.WriteSensitivityCSV(w, a, comments)
	})
	if err != nil || !plot {
		return err
	}
	name := r.Summary.Fuel
	if name == casefile.InlineFuelName {
		name = strings.Join(slices.Sorted(maps.Keys(r.Summary.FuelComposition)), "/")
	}
	chart := output.Chart{
		Title: fmt.Sprintf("Flame-speed sensitivities: %s, phi = %g, %.0f K, %.4g atm", name, r.Condition.Phi, r.Condition.T, r.Condition.P/101325),
		Note:  sensitivity.FormatBand(a.FlameSpeed, a.Sigma),
	}
	for _, ext := range []string{".svg", ".png"} {
		if err := output.SensitivityBars(filepath.Join(dir, "sensitivity"+ext), chart, a, sensitivityChartBars); err != nil {
			return err
		}
	}
	return nil
}
