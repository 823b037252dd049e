package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A comparison whose fuels burn on two mechanisms (each fuel table names
// its own) names both in every output: the printed table, compare.csv,
// each fuel's summary and the legends of every chart.
func TestCompareNamesEachFuelsMechanism(t *testing.T) {
	if testing.Short() {
		t.Skip("two flame solves")
	}
	c := writeCase(t, `title = "two mechanisms"
[mixture]
fuel = "hydrogen"
equivalence_ratio = 1.0
[compare]
fuels = ["hydrogen", "methane"]
equivalence_ratios = [1.0]
[fuels.hydrogen]
composition = { H2 = 1 }
mechanism = "burke2012-hydrogen"
[fuels.methane]
composition = { CH4 = 1 }
mechanism = "smith1999-natgas"
`)
	dir := filepath.Join(t.TempDir(), "out")
	cmd := newCompareCmd()
	var out, errOut bytes.Buffer
	cmd.SetOut(&out)
	cmd.SetErr(&errOut)
	cmd.SetArgs([]string{c, "-o", dir, "-q"})
	if err := cmd.Execute(); err != nil {
		t.Fatalf("compare: %v\n%s", err, errOut.String())
	}
	read := func(name string) string {
		b, err := os.ReadFile(filepath.Join(dir, name))
		if err != nil {
			t.Fatal(err)
		}
		return string(b)
	}
	outputs := map[string]string{
		"stdout":          out.String(),
		"compare.csv":     read("compare.csv"),
		"flame-speed.svg": read("flame-speed.svg"),
	}
	for _, f := range []string{"profiles-thermal.svg", "profiles-species.svg"} {
		outputs[f] = read(f)
	}
	for name, text := range outputs {
		for _, m := range []string{"burke2012-hydrogen", "smith1999-natgas"} {
			if !strings.Contains(text, m) {
				t.Errorf("%s does not name mechanism %s", name, m)
			}
		}
	}
	for fuel, m := range map[string]string{"hydrogen": "burke2012-hydrogen", "methane": "smith1999-natgas"} {
		for _, f := range []string{"summary.txt", "summary.json"} {
			if s := read(filepath.Join(fuel, f)); !strings.Contains(s, m) {
				t.Errorf("%s/%s does not name its mechanism %s", fuel, f, m)
			}
		}
	}
	// Each flame is the one of its own mechanism: hydrogen/air is several
	// times faster than methane/air (about 2.1 against 0.36 m/s; Kwon &
	// Faeth 2001, Bosschaart & de Goey 2004; from memory).
	csv := outputs["compare.csv"]
	if !strings.Contains(csv, "hydrogen,burke2012-hydrogen,1,2.") || !strings.Contains(csv, "methane,smith1999-natgas,1,0.3") {
		t.Errorf("compare.csv rows do not show each fuel's flame on its mechanism:\n%s", csv)
	}
}
