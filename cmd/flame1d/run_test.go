package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/spf13/cobra"
)

func runRun(t *testing.T, args ...string) (string, string, error) {
	t.Helper()
	return execute(newRunCmd(), args...)
}

// execute runs a command with args and returns what it printed on stdout
// and stderr.
func execute(cmd *cobra.Command, args ...string) (string, string, error) {
	var out, errOut bytes.Buffer
	cmd.SetOut(&out)
	cmd.SetErr(&errOut)
	cmd.SetArgs(args)
	err := cmd.Execute()
	return out.String(), errOut.String(), err
}

func writeCase(t *testing.T, text string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "case.toml")
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// A solved case writes its profile, zones, restart and summaries; the JSON
// summary has the fields other tools read, and the profile CSV has units in
// every column name and one row per grid point.
func TestRunWritesResults(t *testing.T) {
	if testing.Short() {
		t.Skip("full flame solve")
	}
	c := writeCase(t, "mechanism = \"burke2012-hydrogen\"\n[mixture]\nfuel = { H2 = 1 }\nequivalence_ratio = 1.0\ntemperature = \"298 K\"\npressure = \"1 atm\"\n")
	dir := filepath.Join(t.TempDir(), "out")
	stdout, stderr, err := runRun(t, c, "-o", dir, "--json")
	if err != nil {
		t.Fatalf("run: %v\n%s", err, stderr)
	}
	if !strings.Contains(stderr, "full equations") {
		t.Errorf("no progress on stderr: %q", stderr)
	}
	var sum map[string]any
	if err := json.Unmarshal([]byte(stdout), &sum); err != nil {
		t.Fatalf("--json output is not JSON: %v\n%s", err, stdout)
	}
	for _, k := range []string{"flame_speed_m_s", "burned_temperature_K", "adiabatic_temperature_K", "thermal_thickness_m",
		"grid_points", "converged", "equivalence_ratio", "unburned_temperature_K", "pressure_Pa", "zones"} {
		if _, ok := sum[k]; !ok {
			t.Errorf("summary lacks %s", k)
		}
	}
	if sl, _ := sum["flame_speed_m_s"].(float64); sl < 1.9 || sl > 2.4 {
		t.Errorf("flame speed %v m/s outside the H2/air band of the flame tests", sum["flame_speed_m_s"])
	}
	for _, f := range []string{"profile.csv", "zones.csv", "restart.csv", "summary.txt", "summary.json"} {
		if _, err := os.Stat(filepath.Join(dir, f)); err != nil {
			t.Errorf("missing %s: %v", f, err)
		}
	}
	fh, err := os.Open(filepath.Join(dir, "profile.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	r := csv.NewReader(fh)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	for _, h := range rows[0] {
		if !strings.Contains(h, "[") {
			t.Errorf("column %q has no unit", h)
		}
	}
	if got, want := len(rows)-1, int(sum["grid_points"].(float64)); got != want {
		t.Errorf("profile has %d rows for %d grid points", got, want)
	}
	if !strings.Contains(stdout+readFile(t, filepath.Join(dir, "summary.txt")), "model predictions") {
		t.Error("summary lacks the model-prediction note")
	}
	checkFlamePlot(t, dir)
}

// A mixture that cannot burn exits with an error that says so and writes
// nothing; a case file with a typo names the key and line.
func TestRunFailuresWriteNothing(t *testing.T) {
	c := writeCase(t, "mechanism = \"burke2012-hydrogen\"\n[mixture]\nfuel = { H2 = 1 }\nequivalence_ratio = 0.02\n")
	dir := filepath.Join(t.TempDir(), "out")
	if _, _, err := runRun(t, c, "-o", dir, "-q"); err == nil || !strings.Contains(err.Error(), "not flammable") {
		t.Errorf("non-flammable mixture: error %v", err)
	}
	if _, err := os.Stat(dir); !os.IsNotExist(err) {
		t.Errorf("a failed run created %s", dir)
	}
	typo := writeCase(t, "mechanism = \"burke2012-hydrogen\"\n[mixture]\nfuel = { H2 = 1 }\nequivalence_ratio = 1\npresure = \"1 atm\"\n")
	if _, _, err := runRun(t, typo, "-q"); err == nil || !strings.Contains(err.Error(), "case.toml:5: mixture.presure: unknown key") {
		t.Errorf("typo: error %v", err)
	}
	if _, _, err := runRun(t); err == nil || !strings.Contains(err.Error(), "--demo") {
		t.Errorf("no arguments: error %v", err)
	}
}

func readFile(t *testing.T, p string) string {
	t.Helper()
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}
