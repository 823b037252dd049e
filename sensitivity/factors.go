package sensitivity

import (
	"fmt"
	"math"
	"os"
	"sort"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"flame1d/chem"
	"flame1d/internal/tomlpos"
)

// ReadFactors reads an uncertainty-factor side file for mechanism m and
// returns f by 0-based reaction index. The file is TOML with one table:
//
//	[uncertainty_factors]
//	"H+O2<=>O+OH" = 1.5      # by equation as the mechanism writes it (spaces ignored)
//	"38" = 3.0               # by 1-based reaction number
//
// An equation shared by several steps (duplicates) sets all of them. A key
// that matches no reaction, a factor below 1 or a non-finite one is an
// error naming the file and line.
func ReadFactors(path string, m *chem.Mechanism) (map[int]float64, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("uncertainty factors: %w", err)
	}
	return ParseFactors(src, path, m)
}

// ParseFactors is ReadFactors on the file's contents; name is used in
// messages.
func ParseFactors(src []byte, name string, m *chem.Mechanism) (map[int]float64, error) {
	var doc struct {
		Factors map[string]float64 `toml:"uncertainty_factors"`
	}
	md, err := toml.Decode(string(src), &doc)
	if err != nil {
		return nil, fmt.Errorf("uncertainty factors %s: %w", name, err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		return nil, fmt.Errorf("uncertainty factors %s:%d: unknown key %q (the file holds one table, [uncertainty_factors], of equation or reaction number = factor)",
			name, tomlpos.Line(src, und[0]), und[0].String())
	}
	if doc.Factors == nil {
		return nil, fmt.Errorf("uncertainty factors %s: no [uncertainty_factors] table", name)
	}
	byEq := map[string][]int{}
	for i := range m.Reactions {
		k := equationKey(m.Reactions[i].Equation)
		byEq[k] = append(byEq[k], i)
	}
	keys := make([]string, 0, len(doc.Factors))
	for k := range doc.Factors {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	out := map[int]float64{}
	for _, key := range keys {
		f := doc.Factors[key]
		line := keyLine(src, key)
		if !(f >= 1) || math.IsInf(f, 0) {
			return nil, fmt.Errorf("uncertainty factors %s:%d: %q = %g: a factor is at least 1 (k within k/f ... k f at 2σ)", name, line, key, f)
		}
		var idx []int
		if n, err := strconv.Atoi(strings.TrimSpace(key)); err == nil {
			if n < 1 || n > len(m.Reactions) {
				return nil, fmt.Errorf("uncertainty factors %s:%d: reaction number %d outside 1-%d of mechanism %s", name, line, n, len(m.Reactions), m.Name)
			}
			idx = []int{n - 1}
		} else if idx = byEq[equationKey(key)]; idx == nil {
			return nil, fmt.Errorf("uncertainty factors %s:%d: mechanism %s has no reaction %q; write the equation as the mechanism does, or the reaction number", name, line, m.Name, key)
		}
		for _, i := range idx {
			if _, dup := out[i]; dup {
				return nil, fmt.Errorf("uncertainty factors %s:%d: reaction %d (%s) is given twice", name, line, i+1, m.Reactions[i].Equation)
			}
			out[i] = f
		}
	}
	return out, nil
}

// keyLine returns the 1-based line on which a key of the factor table is
// written (quoted or bare), 0 if not found. tomlpos.Line splits a line at
// its first '=', which a quoted equation contains.
func keyLine(src []byte, key string) int {
	for i, l := range strings.Split(string(src), "\n") {
		l = strings.TrimSpace(l)
		for _, form := range []string{`"` + key + `"`, `'` + key + `'`, key} {
			if rest, ok := strings.CutPrefix(l, form); ok && strings.HasPrefix(strings.TrimSpace(rest), "=") {
				return i + 1
			}
		}
	}
	return 0
}

// equationKey is an equation with the spaces removed, for matching.
func equationKey(eq string) string { return strings.ReplaceAll(eq, " ", "") }
