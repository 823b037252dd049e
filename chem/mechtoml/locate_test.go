package mechtoml

import (
	"strings"
	"testing"

	"github.com/BurntSushi/toml"
)

// locateSample exercises the TOML spellings the locator must follow:
// multi-line strings that look like headers, quoted and dotted keys,
// inline arrays of tables, nested arrays of tables, comments.
const locateSample = `# comment [[species]]
description = """
[[species]]
name = "not a key" \"""
"""
notes = '''
[[reaction]]'''
"quoted.key" = 1
a.b.c = 2   # trailing [x]
species = [
  {name = "A", atoms = {X = 1}},   # line 12
  # a comment inside the array
  {name = "B",
   atoms = {X = 2}},
]

[[reaction]]
equation = "A => B"
[reaction.falloff]
low = {A = 1, b = 0, E = 0}

[[reaction]]
equation = 'B => A'
pressure_table = [
  {P = 1, A = 1, b = 0, E = 0},
  {P = 2, A = 1, b = 0, E = 0},
]
[[reaction.extra]]
k = 1
[[reaction.extra]]
k = 2
`

func TestLocate(t *testing.T) {
	// The sample is valid TOML (the locator only ever sees valid files).
	var doc map[string]any
	if _, err := toml.Decode(locateSample, &doc); err != nil {
		t.Fatalf("sample is not valid TOML: %v", err)
	}
	full := locate(locateSample, true)
	headers := locate(locateSample, false)
	cases := []struct {
		path    string
		line    int
		headers bool // also found by the headers-only scan
	}{
		{"description", 2, false},
		{"notes", 6, false},
		{"quoted.key", 8, false},
		{"a", 9, false},
		{"a.b.c", 9, false},
		{"species.0", 11, true},
		{"species.0.atoms.X", 11, false},
		{"species.1", 13, true},
		{"species.1.atoms", 14, false},
		{"species.1.atoms.X", 14, false},
		{"reaction.0", 17, true},
		{"reaction.0.equation", 18, false},
		{"reaction.0.falloff", 19, true},
		{"reaction.0.falloff.low.E", 20, false},
		{"reaction.1", 22, true},
		{"reaction.1.pressure_table.1", 26, false},
		{"reaction.1.pressure_table.1.E", 26, false},
		{"reaction.1.extra.0", 28, true},
		{"reaction.1.extra.1.k", 31, false},
	}
	for _, c := range cases {
		key := strings.ReplaceAll(c.path, ".", pathSep)
		if c.path == "quoted.key" {
			key = "quoted.key"
		}
		if got, ok := full[key]; !ok || got != c.line {
			t.Errorf("%s: line %d (found %v), want %d", c.path, got, ok, c.line)
		}
		if got, ok := headers[key]; ok != c.headers || ok && got != c.line {
			t.Errorf("headers-only %s: line %d (found %v), want found=%v", c.path, got, ok, c.headers)
		}
	}
	// Nothing was taken for a header inside the strings.
	if _, ok := full["species"+pathSep+"2"]; ok {
		t.Error("a header inside a string was counted")
	}
}
