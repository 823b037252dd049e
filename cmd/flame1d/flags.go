package main

import (
	"fmt"
	"maps"
	"math"
	"slices"
	"strings"

	"flame1d/casefile"
	"flame1d/units"
)

// quantityFlag converts the value of flag --name, written with or without
// units ("300 K", "5 bar"; a bare number is SI), to SI; errors name the
// flag.
func quantityFlag(name, value string, d units.Dimension) (float64, error) {
	v, err := units.Parse(value, d)
	if err != nil {
		return 0, fmt.Errorf("--%s: %w", name, err)
	}
	if d == units.Pressure && !(v > 0) {
		return 0, fmt.Errorf("--%s: pressure must be positive (got %g Pa)", name, v)
	}
	if d == units.Temperature && !(v > 0) {
		return 0, fmt.Errorf("--%s: temperature must be above 0 K", name)
	}
	return v, nil
}

// compositionFlag reads the value of flag --name as a composition,
// NAME=value pairs as in the case file (casefile.ParseComposition).
func compositionFlag(name, value string) (map[string]float64, error) {
	return casefile.ParseComposition("--"+name, value)
}

// fractionFlag checks that the value of flag --name is in [0, 1).
func fractionFlag(name string, v float64) error {
	if !(v >= 0 && v < 1) || math.IsNaN(v) {
		return fmt.Errorf("--%s: %g is not in [0, 1)", name, v)
	}
	return nil
}

func compositionText(c map[string]float64) string {
	parts := make([]string, 0, len(c))
	for _, k := range slices.Sorted(maps.Keys(c)) {
		parts = append(parts, fmt.Sprintf("%s %.4g", k, c[k]))
	}
	return strings.Join(parts, ", ")
}
