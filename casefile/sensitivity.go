package casefile

import (
	"fmt"
	"maps"
	"math"
	"path/filepath"
	"slices"
	"strings"

	"github.com/BurntSushi/toml"

	"flame1d/internal/infile"
	"flame1d/internal/tomlpos"
)

// SensitivitySettings mirror the [sensitivity] table.
type SensitivitySettings struct {
	// Enabled computes the flame-speed sensitivities and the rate-constant
	// band with every flame (flame1d run --sensitivity does the same).
	Enabled bool
	// DefaultUncertaintyFactor is f for reactions that neither the
	// mechanism nor the factors file give one; 0 means the documented
	// default (sensitivity.DefaultUncertaintyFactor, 2).
	DefaultUncertaintyFactor float64
	// FactorsFile is the side file of uncertainty factors per reaction
	// (resolved against the case file's folder); empty when none.
	FactorsFile string
}

// rawSensitivity is the TOML layout of [sensitivity].
type rawSensitivity struct {
	Enabled                  bool    `toml:"enabled"`
	DefaultUncertaintyFactor float64 `toml:"default_uncertainty_factor"`
	UncertaintyFactors       string  `toml:"uncertainty_factors"`
}

// parseSensitivity checks the [sensitivity] table; fe builds the error
// for a key.
func parseSensitivity(r *rawSensitivity, file string, fe func(key, format string, a ...any) error) (SensitivitySettings, error) {
	if r == nil {
		return SensitivitySettings{}, nil
	}
	s := SensitivitySettings{Enabled: r.Enabled, DefaultUncertaintyFactor: r.DefaultUncertaintyFactor}
	if f := r.DefaultUncertaintyFactor; f != 0 && (!(f >= 1) || math.IsInf(f, 0)) {
		return s, fe("sensitivity.default_uncertainty_factor", "must be at least 1 (k within k/f ... k f at 2σ; 2 is the default), got %g", f)
	}
	if p := r.UncertaintyFactors; p != "" {
		if !filepath.IsAbs(p) && file != "" {
			p = filepath.Join(filepath.Dir(file), p)
		}
		s.FactorsFile = p
	}
	return s, nil
}

// UncertaintyFactor is one entry of an uncertainty-factor side file: a
// reaction, by its equation as the mechanism writes it or by its 1-based
// number, and its factor f (k within k/f ... k f at 2σ).
type UncertaintyFactor struct {
	Reaction string
	Factor   float64
	Line     int // line of the entry in its file
}

// ReadUncertaintyFactors reads an uncertainty-factor side file (named by
// [sensitivity] uncertainty_factors). The file is TOML with one table:
//
//	[uncertainty_factors]
//	"H+O2<=>O+OH" = 1.5      # by equation as the mechanism writes it (spaces ignored)
//	"38" = 3.0               # by 1-based reaction number
//
// Entries come back sorted by key. Unknown keys and factors below 1 or not
// finite are errors naming the file and line; which reaction a key means
// is decided against the mechanism (sensitivity.MatchFactors).
func ReadUncertaintyFactors(path string) ([]UncertaintyFactor, error) {
	src, err := infile.ReadFile(path, infile.Uncertainty)
	if err != nil {
		return nil, err
	}
	return ParseUncertaintyFactors(src, path)
}

// ParseUncertaintyFactors is ReadUncertaintyFactors on the file's
// contents; name is used in messages.
func ParseUncertaintyFactors(src []byte, name string) ([]UncertaintyFactor, error) {
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
	var out []UncertaintyFactor
	for _, key := range slices.Sorted(maps.Keys(doc.Factors)) {
		f := doc.Factors[key]
		line := factorLine(src, key)
		if !(f >= 1) || math.IsInf(f, 0) {
			return nil, fmt.Errorf("uncertainty factors %s:%d: %q = %g: a factor is at least 1 (k within k/f ... k f at 2σ)", name, line, key, f)
		}
		out = append(out, UncertaintyFactor{Reaction: key, Factor: f, Line: line})
	}
	return out, nil
}

// factorLine returns the 1-based line on which a key of the factor table
// is written (quoted or bare), 0 if not found. tomlpos.Line splits a line
// at its first '=', which a quoted equation contains.
func factorLine(src []byte, key string) int {
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
