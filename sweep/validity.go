package sweep

import (
	"flame1d/casefile"
	"flame1d/study"
)

// ValidityWarnings says how the sweep's conditions and fuel lie outside the
// validity range of the case's mechanism (study.ValidityWarnings over all
// its points); none when the mechanism states no range.
func ValidityWarnings(c *casefile.Case) ([]string, error) {
	st, err := study.New(c, nil)
	if err != nil {
		return nil, err
	}
	def, err := DefinitionOf(c, st.Mechanism, false)
	if err != nil {
		return nil, err
	}
	plan, err := NewPlan(def)
	if err != nil {
		return nil, err
	}
	conds := make([]study.Condition, len(plan.Points))
	for i, p := range plan.Points {
		conds[i] = p.Condition
	}
	return st.ValidityWarnings(conds...), nil
}
