package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
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
	// A folder of the user's own files is refused before any flame is
	// solved, and left alone.
	own := filepath.Join(t.TempDir(), "own")
	os.MkdirAll(own, 0o755)
	os.WriteFile(filepath.Join(own, "notes.txt"), []byte("mine"), 0o644)
	began := time.Now()
	_, _, err := runValidate(t, "--mechanism", "burke2012-hydrogen", "--fuels", "H2", "-o", own, "-q")
	if err == nil || !strings.Contains(err.Error(), "notes.txt") {
		t.Errorf("folder of own files: error %v", err)
	}
	if time.Since(began) > 5*time.Second {
		t.Errorf("the refusal came after %v: the folder must be checked before the solves", time.Since(began))
	}
	if got := tree(t, own); strings.Join(got, " ") != "notes.txt" {
		t.Errorf("own folder now holds %v", got)
	}
}

// siteHydrogen is a measurement file of a user's own: one invented
// hydrogen/air point at a fictitious test site, scored on the hydrogen
// set in a second or two.
const siteHydrogen = `fuel = "H2-site"
name = "Mossbank test-rig hydrogen"
species = ["H2"]
formula = "H2"
[sources.rig]
citation = "Mossbank rig log (2026), invented for this test"
where = "run 7"
[[series]]
temperature = "298 K"
pressure = "1 atm"
sources = ["rig"]
points = [ { phi = 1.0, speed_cm_s = 210, band_cm_s = [195, 235] } ]
`

// Ctrl-C or SIGTERM while the scorecard is solved leaves the previous
// scorecard whole and no temporary files; the exit status says which
// signal, as for run and compare.
func TestValidateInterruptKeepsPreviousSet(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the command and solves flames")
	}
	exe := buildFlame1d(t)
	work := t.TempDir()
	data := filepath.Join(work, "site.toml")
	os.WriteFile(data, []byte(siteHydrogen), 0o644)
	out := filepath.Join(work, "score")
	if b, err := exec.Command(exe, "validate", "--mechanism", "burke2012-hydrogen", "--data", data, "--fuels", "H2-site", "-o", out, "-q", "-j", "1").CombinedOutput(); err != nil {
		t.Fatalf("first validate: %v\n%s", err, b)
	}
	if points := readFile(t, filepath.Join(out, "scorecard.csv")); !strings.Contains(points, "H2-site") {
		t.Fatalf("first scorecard lacks the site point:\n%s", points)
	}
	// Fifteen methane flames on GRI-Mech 3.0: far from done after 1.5 s.
	interruptKeepsSet(t, work, filepath.Join(out, "scorecard.csv"), exe,
		"validate", "--mechanism", "smith1999-natgas", "--fuels", "CH4", "-o", out, "-q", "-j", "1")
}
