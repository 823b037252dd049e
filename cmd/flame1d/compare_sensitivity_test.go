package main

import (
	"bytes"
	"encoding/csv"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// compare --sensitivity: H2/air against H2/N2 (70/30) on Burke et al.
// (2012) at phi = 1. The compare table carries the band column, the
// side-by-side file lists ten reactions in each list with differences equal
// to fuel minus reference, and the printed table shows S_L ± σ.
func TestCompareSensitivity(t *testing.T) {
	if testing.Short() {
		t.Skip("four flame solves")
	}
	dir := t.TempDir()
	c := filepath.Join(dir, "case.toml")
	err := os.WriteFile(c, []byte(`mechanism = "burke2012-hydrogen"
[mixture]
fuel = "a"
equivalence_ratio = 1.0
[compare]
fuels = ["a", "b"]
equivalence_ratios = [1.0]
[fuels.a]
composition = { H2 = 1.0 }
[fuels.b]
composition = { H2 = 0.7, N2 = 0.3 }
`), 0o644)
	if err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	cmd := newCompareCmd()
	var stdout bytes.Buffer
	cmd.SetOut(&stdout)
	cmd.SetErr(&bytes.Buffer{})
	cmd.SetArgs([]string{c, "-o", out, "--sensitivity", "-q"})
	if err := cmd.Execute(); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(stdout.String(), " ± ") || !strings.Contains(stdout.String(), "(1σ, rate constants)") {
		t.Errorf("printed table lacks the band:\n%s", stdout.String())
	}
	read := func(name string) [][]string {
		f, err := os.Open(filepath.Join(out, name))
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		r := csv.NewReader(f)
		r.Comment = '#'
		rows, err := r.ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		return rows
	}
	cmpRows := read("compare.csv")
	if h := cmpRows[0]; h[len(h)-1] != "S_L_sigma_rate_constants [m/s]" || cmpRows[1][len(h)-1] == "" {
		t.Errorf("compare.csv: header %v, first row %v", h, cmpRows[1])
	}
	rows := read("compare-sensitivity.csv")
	if len(rows) != 1+20 {
		t.Fatalf("compare-sensitivity.csv has %d rows, want a header and 2 lists of 10", len(rows))
	}
	for _, r := range rows[1:] {
		if r[0] != "a" || r[1] != "b" {
			t.Errorf("row %v: want reference a, fuel b", r)
		}
	}
}
