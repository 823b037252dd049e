package casefile

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const base = "[mixture]\nfuel = { CH4 = 1.0 }\nequivalence_ratio = 1.0\n"

// Hostile or mistaken case files get a message with file:line, the key,
// and what is wrong in words (issue 11, items 2, 5 and 8).
func TestHostileCaseFiles(t *testing.T) {
	for _, tc := range []struct {
		name, src string
		want      []string
	}{
		{"title with a line break", "title = \"x\\nid,equivalence_ratio [-]\"\n" + base, []string{"case.toml:1: title: control character U+000A"}},
		{"title of 1 kB", "title = \"" + strings.Repeat("x", 1000) + "\"\n" + base, []string{"case.toml:1: title: 1000 bytes; at most 200"}},
		{"fuel name with a line break", base + "[fuels.\"a\\nb\"]\ncomposition = { CH4 = 1 }\n", []string{"fuel name: control character"}},
		{"fuel name of 100 bytes", base + "[fuels." + strings.Repeat("f", 100) + "]\ncomposition = { CH4 = 1 }\n", []string{"fuel name: 100 bytes; at most 64"}},
		{"phi 100", "[mixture]\nfuel = { CH4 = 1.0 }\nequivalence_ratio = 100\n", []string{"case.toml:3: mixture.equivalence_ratio: 100: the equivalence ratio must lie between 0 and 100"}},
		{"phi as text", "[mixture]\nfuel = { CH4 = 1.0 }\nequivalence_ratio = \"1.0\"\n", []string{"case.toml:3: mixture.equivalence_ratio: expected a number, got text in quotes"}},
		{"points as text", base + "[grid]\ninitial_points = \"many\"\n", []string{"case.toml:5: grid.initial_points: expected a whole number, got text in quotes"}},
		{"temperature true", "[mixture]\nfuel = { CH4 = 1.0 }\nequivalence_ratio = 1.0\ntemperature = true\n", []string{"case.toml:4: mixture.temperature: expected a number or a string with units, got true or false"}},
		{"temperature as a table", base + "[mixture.temperature]\nvalue = 300\n", []string{"case.toml:4: mixture.temperature: expected a number or a string with units, got a table"}},
		{"fuel name with a line break, in the message", base + "[fuels.\"a\\nb\"]\ncomposition = { CH4 = 1 }\n", []string{`fuels."a\nb": fuel name`}},
		{"relative_tolerance 0", base + "[solver]\nrelative_tolerance = 0\n", []string{"case.toml:5: solver.relative_tolerance: 0: must lie in (0, 1e-2]"}},
		{"domain_length 0", base + "[grid]\ndomain_length = 0\n", []string{"case.toml:5: grid.domain_length: 0 m is outside 10 um - 10 m"}},
		{"domain_length 1 km", base + "[grid]\ndomain_length = \"1000 m\"\n", []string{"grid.domain_length: 1000 m is outside"}},
		{"domain_length 1 nm", base + "[grid]\ndomain_length = 1e-9\n", []string{"grid.domain_length: 1e-09 m is outside"}},
		{"initial_points 1e8", base + "[grid]\ninitial_points = 100000000\n", []string{"case.toml:5: grid.initial_points: 100000000 points; at most 1000"}},
		{"max_points 1e9", base + "[grid]\nmax_points = 1000000000\n", []string{"grid.max_points: 1000000000 points; at most 10000"}},
		{"initial above max", base + "[grid]\ninitial_points = 500\nmax_points = 100\n", []string{"grid.initial_points: must not exceed grid.max_points"}},
	} {
		_, err := Parse([]byte(tc.src), "case.toml")
		if err == nil {
			t.Errorf("%s: accepted", tc.name)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s: %q does not say %q", tc.name, err, w)
			}
		}
		if strings.Contains(err.Error(), "int64") || strings.Contains(err.Error(), "float64") {
			t.Errorf("%s: Go type name in %q", tc.name, err)
		}
	}
}

// A case file read from a device or too large a file stops at once with a
// message, never reads on until memory runs out (issue 11, item 2).
func TestReadFileRefusesDevicesAndHugeFiles(t *testing.T) {
	if _, err := ReadFile("/dev/zero"); err == nil || !strings.Contains(err.Error(), "not a regular file") {
		t.Errorf("/dev/zero: %v", err)
	}
	big := filepath.Join(t.TempDir(), "big.toml")
	f, err := os.Create(big)
	if err != nil {
		t.Fatal(err)
	}
	// A sparse 50 MB file: the size is refused before anything is read.
	if err := f.Truncate(50 << 20); err != nil {
		t.Fatal(err)
	}
	f.Close()
	if _, err := ReadFile(big); err == nil || !strings.Contains(err.Error(), "larger than 4 MiB") {
		t.Errorf("50 MB case file: %v", err)
	}
}

// A range with a tiny step or a huge count says how many values it would
// make in a few digits, not three hundred (issue 11, item 8).
func TestHugeSweepCountsAreShort(t *testing.T) {
	for _, tc := range []struct{ sweep, want string }{
		{"equivalence_ratio = { from = 0.6, to = 1.4, step = 1e-300 }", "gives about 8e+299 values; at most 1000"},
		{"equivalence_ratio = { from = 0.6, to = 1.4, step = 1e-5 }", "gives 80001 values; at most 1000"},
		{"equivalence_ratio = { from = 0.6, to = 1.4, count = 9223372036854775807 }", "count 9223372036854775807; at most 1000"},
	} {
		_, err := Parse([]byte(base+"[sweep]\n"+tc.sweep+"\n"), "case.toml")
		if err == nil || !strings.Contains(err.Error(), tc.want) || len(err.Error()) > 300 {
			t.Errorf("%s: got %v, want %q", tc.sweep, err, tc.want)
		}
	}
}
