package study

import (
	"fmt"

	"flame1d/output"
	"flame1d/sensitivity"
)

// bandColumn is the compare table's column of the rate-constant band.
const bandColumn = "S_L_sigma_rate_constants [m/s]"

// hasBand reports whether any flame of the comparison carries
// sensitivities.
func (c *Comparison) hasBand() bool {
	for _, rs := range c.Results {
		for _, r := range rs {
			if r != nil && r.Sensitivity != nil {
				return true
			}
		}
	}
	return false
}

// bandCell is σ(S_L) of a result, empty without sensitivities.
func bandCell(r *Result) string {
	if r.Sensitivity == nil {
		return ""
	}
	return output.FormatFloat(r.Sensitivity.Sigma)
}

// SensitivityComparison is, at one equivalence ratio, the reference fuel's
// rate-constant sensitivities beside another fuel's.
type SensitivityComparison struct {
	Reference, Other string
	Phi              float64
	// ReferenceBand and OtherBand are the two flame speeds with their bands.
	ReferenceBand, OtherBand string
	*sensitivity.Comparison
}

// compareSensitivityRows is how many reactions each list shows.
const compareSensitivityRows = 10

// SensitivityComparisons sets every fuel beside the first (the reference)
// at the equivalence ratio nearest phi: the reactions that matter most for
// either and those whose coefficients differ most. Fuels without
// sensitivities at that condition are left out; nil when none has them.
func (c *Comparison) SensitivityComparisons(phi float64) ([]SensitivityComparison, error) {
	ip := 0
	for i, p := range c.Phis {
		if abs(p-phi) < abs(c.Phis[ip]-phi) {
			ip = i
		}
	}
	ref := c.Results[c.Fuels[0]][ip]
	if ref == nil || ref.Sensitivity == nil {
		return nil, nil
	}
	var out []SensitivityComparison
	for _, name := range c.Fuels[1:] {
		r := c.Results[name][ip]
		if r == nil || r.Sensitivity == nil {
			continue
		}
		cmp, err := sensitivity.Compare(ref.Sensitivity, r.Sensitivity, compareSensitivityRows)
		if err != nil {
			return nil, fmt.Errorf("compare %s with %s: %w", c.Fuels[0], name, err)
		}
		out = append(out, SensitivityComparison{Reference: c.Fuels[0], Other: name, Phi: c.Phis[ip],
			ReferenceBand: ref.Summary.FlameSpeedBand, OtherBand: r.Summary.FlameSpeedBand, Comparison: cmp})
	}
	return out, nil
}

// SensitivityTable lays the comparisons out as CSV rows: one row per listed
// reaction, which list it is in, the two coefficients and their
// difference.
func SensitivityTable(cs []SensitivityComparison) [][]string {
	rows := [][]string{{"reference", "fuel", "equivalence_ratio [-]", "list", "reaction", "d ln S_L/d ln k reference [-]", "d ln S_L/d ln k fuel [-]", "difference [-]"}}
	f := output.FormatFloat
	for _, c := range cs {
		for _, l := range []struct {
			name  string
			pairs []sensitivity.Pair
		}{{"most important", c.MostImportant}, {"most different", c.MostDifferent}} {
			for _, p := range l.pairs {
				rows = append(rows, []string{c.Reference, c.Other, f(c.Phi), l.name, p.Equation, f(p.A), f(p.B), f(p.Difference())})
			}
		}
	}
	return rows
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
