package casefile

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// ParseComposition reads a composition written on a command line the way
// a case file writes it: NAME=value pairs separated by commas, e.g.
// "O2=0.21, N2=0.79", optionally inside braces as in the TOML inline table
// { O2 = 0.21, N2 = 0.79 }; a lone species name ("CH4") means that
// species alone. Amounts are mole fractions or moles, normalised later.
// what names the source in errors (a flag such as "--oxidizer", or a key).
func ParseComposition(what, s string) (map[string]float64, error) {
	fail := func(format string, a ...any) error {
		return fmt.Errorf("%s %q: %s", what, s, fmt.Sprintf(format, a...))
	}
	body := strings.TrimSpace(s)
	if strings.HasPrefix(body, "{") {
		if !strings.HasSuffix(body, "}") {
			return nil, fail("an opening brace needs a closing one")
		}
		body = strings.TrimSpace(body[1 : len(body)-1])
	}
	if body == "" {
		return nil, fail("empty composition (write e.g. CH4=0.9,C2H6=0.1)")
	}
	parts := strings.Split(body, ",")
	out := map[string]float64{}
	for _, part := range parts {
		part = strings.TrimSpace(part)
		if part == "" {
			continue
		}
		name, val, hasVal := strings.Cut(part, "=")
		name = strings.Trim(strings.TrimSpace(name), `"'`)
		if !hasVal && strings.Contains(part, ":") {
			return nil, fail("%q: write each species as NAME=value, e.g. %s", part, strings.Replace(part, ":", "=", 1))
		}
		if name == "" || strings.ContainsAny(name, " \t") {
			return nil, fail("%q: missing or blank-containing species name (write e.g. CH4=0.9,C2H6=0.1)", part)
		}
		x := 1.0
		if hasVal {
			v, err := strconv.ParseFloat(strings.TrimSpace(val), 64)
			if err != nil || !(v >= 0) || math.IsInf(v, 0) {
				return nil, fail("%q: the amount must be a non-negative number (write e.g. CH4=0.9,C2H6=0.1)", part)
			}
			x = v
		} else if len(parts) > 1 {
			return nil, fail("%q: give every species of a blend an amount (write e.g. CH4=0.9,C2H6=0.1)", part)
		}
		if _, dup := out[name]; dup {
			return nil, fail("species %s given twice", name)
		}
		out[name] = x
	}
	if len(out) == 0 {
		return nil, fail("empty composition (write e.g. CH4=0.9,C2H6=0.1)")
	}
	return out, nil
}
