package casefile

import (
	"math"
	"path/filepath"
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
