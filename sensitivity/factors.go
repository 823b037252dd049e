package sensitivity

import (
	"fmt"
	"strconv"
	"strings"

	"flame1d/casefile"
	"flame1d/chem"
)

// MatchFactors assigns the entries of an uncertainty-factor side file
// (casefile.ReadUncertaintyFactors) to the reactions of m and returns f by
// 0-based reaction index. A key is a 1-based reaction number or an
// equation as m writes it (spaces ignored); an equation shared by several
// steps (duplicates) sets all of them. A key that matches no reaction, or
// a reaction given twice, is an error naming the file and line.
func MatchFactors(entries []casefile.UncertaintyFactor, file string, m *chem.Mechanism) (map[int]float64, error) {
	byEq := map[string][]int{}
	for i := range m.Reactions {
		k := equationKey(m.Reactions[i].Equation)
		byEq[k] = append(byEq[k], i)
	}
	out := map[int]float64{}
	for _, e := range entries {
		var idx []int
		if n, err := strconv.Atoi(strings.TrimSpace(e.Reaction)); err == nil {
			if n < 1 || n > len(m.Reactions) {
				return nil, fmt.Errorf("uncertainty factors %s:%d: reaction number %d outside 1-%d of mechanism %s", file, e.Line, n, len(m.Reactions), m.Name)
			}
			idx = []int{n - 1}
		} else if idx = byEq[equationKey(e.Reaction)]; idx == nil {
			return nil, fmt.Errorf("uncertainty factors %s:%d: mechanism %s has no reaction %q; write the equation as the mechanism does, or the reaction number", file, e.Line, m.Name, e.Reaction)
		}
		for _, i := range idx {
			if _, dup := out[i]; dup {
				return nil, fmt.Errorf("uncertainty factors %s:%d: reaction %d (%s) is given twice", file, e.Line, i+1, m.Reactions[i].Equation)
			}
			out[i] = e.Factor
		}
	}
	return out, nil
}

// equationKey is an equation with the spaces removed, for matching.
func equationKey(eq string) string { return strings.ReplaceAll(eq, " ", "") }
