package tomlpos

import (
	"errors"
	"strings"
	"testing"
)

func TestDecodeSyntaxLine(t *testing.T) {
	for _, c := range []struct {
		name, src, want string
	}{
		// An unclosed table header: the decoder stumbles on the line break
		// and counts it as line 2; the header is on line 1.
		{"unclosed header", "[mixture\nfuel = 1\n", "f.toml:1: TOML syntax"},
		{"bad value", "a = 1\nb = = 2\n", "f.toml:2: TOML syntax"},
		{"duplicate key", "a = 1\na = 2\n", "f.toml:2: TOML syntax"},
	} {
		var v map[string]any
		_, err := Decode([]byte(c.src), "f.toml", &v)
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("%s: error %v, want prefix %q", c.name, err, c.want)
		}
	}
	var v struct{ A int }
	if _, err := Decode([]byte(`A = "text"`), "f.toml", &v); err == nil || !strings.HasPrefix(err.Error(), "f.toml:1: A: expected a whole number, got text in quotes") {
		t.Errorf("type mismatch: error %v, want one naming the file, line, key and kinds", err)
	}
	md, err := Decode([]byte("A = 3\nB = 4\n"), "f.toml", &v)
	if err != nil || v.A != 3 || len(md.Undecoded()) != 1 {
		t.Errorf("valid document: %v, A = %d, undecoded %v", err, v.A, md.Undecoded())
	}
}

type quantity struct{}

func (quantity) UnmarshalTOML(v any) error {
	if _, ok := v.(string); !ok {
		return errors.New("expected a string with units, got " + TypeName(v))
	}
	return nil
}

// Errors name the file, the line, the key and the expected kind of value
// in words, never a Go type.
func TestDecodeErrors(t *testing.T) {
	type doc struct {
		Title string `toml:"title"`
		Grid  struct {
			Points int      `toml:"initial_points"`
			Tol    float64  `toml:"tolerance"`
			Length quantity `toml:"domain_length"`
		} `toml:"grid"`
		List []string `toml:"list"`
	}
	for _, tc := range []struct{ src, want string }{
		{"title = 1\n", `f.toml:1: title: expected text in quotes, got a whole number`},
		{"[grid]\n\ninitial_points = \"many\"\n", `f.toml:3: grid.initial_points: expected a whole number, got text in quotes`},
		{"[grid]\ntolerance = true\n", `f.toml:2: grid.tolerance: expected a number, got true or false`},
		{"[grid]\ndomain_length = 3\n", `f.toml:2: grid.domain_length: expected a string with units, got a whole number`},
		{"list = \"a\"\n", `f.toml:1: list: expected a list [ ... ], got text in quotes`},
		{"title = \"a\nb\"\n", `f.toml:1: TOML syntax:`},
	} {
		var d doc
		_, err := Decode([]byte(tc.src), "f.toml", &d)
		if err == nil || !strings.HasPrefix(err.Error(), tc.want) {
			t.Errorf("%q: got %v, want %s", tc.src, err, tc.want)
		}
		if err != nil && (strings.Contains(err.Error(), "int64") || strings.Contains(err.Error(), "float64") || strings.Contains(err.Error(), "destination")) {
			t.Errorf("%q: Go type names in %v", tc.src, err)
		}
	}
}
