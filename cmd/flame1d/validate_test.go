package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func runValidate(t *testing.T, args ...string) (string, string, error) {
	t.Helper()
	return execute(newValidateCmd(), args...)
}

// Bad flags are refused before any flame is solved, naming what to give.
func TestValidateFlagErrors(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"--mechanism", "burke2012-hydrogen", "--fuels", "kerosene"}, `--fuels: no measurements of fuel "kerosene" (known: C2H4, C2H6, C3H6, C3H8, CH4, H2, NC7H16)`},
		{[]string{"--mechanism", "no-such-mech"}, "--mechanism:"},
		{[]string{"--mechanism", "burke2012-hydrogen", "-j", "-1"}, "-j -1"},
		{[]string{"--mechanism", "burke2012-hydrogen", "--data", "missing.toml"}, "missing.toml"},
	} {
		_, _, err := runValidate(t, tc.args...)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%v: error %v, want one containing %q", tc.args, err, tc.want)
		}
	}
}

// The hydrogen scorecard on the Burke et al. (2012) set: the printed table
// has every point with its band and deviation, the summary per fuel, and
// the files are written; the other fuels are listed as not represented.
func TestValidateHydrogen(t *testing.T) {
	if testing.Short() {
		t.Skip("six hydrogen flames")
	}
	dir := filepath.Join(t.TempDir(), "score")
	stdout, stderr, err := runValidate(t, "--mechanism", "burke2012-hydrogen", "--fuels", "H2,CH4", "-o", dir, "-j", "2")
	if err != nil {
		t.Fatalf("validate: %v\n%s", err, stderr)
	}
	for _, want := range []string{"predicted on burke2012-hydrogen", "195.0-235.0", "6 of 6", "0 of 15 (15 not represented)", "6 of 21 (15 not represented)",
		"not represented: mechanism burke2012-hydrogen has no methane species", "Results are model predictions"} {
		if !strings.Contains(stdout, want) {
			t.Errorf("stdout lacks %q:\n%s", want, stdout)
		}
	}
	if !strings.Contains(stderr, "validate: [6/6] H2") {
		t.Errorf("no progress on stderr:\n%s", stderr)
	}
	for _, f := range []string{"scorecard.csv", "scorecard-summary.csv", "S_L-H2.png", "S_L-CH4.svg"} {
		if _, err := os.Stat(filepath.Join(dir, f)); err != nil {
			t.Errorf("%s not written: %v", f, err)
		}
	}
}
