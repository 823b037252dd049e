package main

import (
	"encoding/csv"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

func TestCrackCommand(t *testing.T) {
	dir := t.TempDir()
	out, err := runCmd(t, "crack", filepath.Join("..", "..", "examples", "fuels", "crack-study.toml"), "-o", dir)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"share of the fuel's carbon", "step 4: C2 closed shell", "results in"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q", want)
		}
	}
	f, err := os.Open(filepath.Join(dir, "crack.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) != 5 || recs[0][0] != "step [-]" {
		t.Fatalf("CSV has %d records, header %v; want a header and 4 steps", len(recs), recs[0])
	}
	// Carbon shares of the listed species add up to the whole but for the
	// species below the listing threshold (1e-4 each, a handful of them).
	for i, row := range recs[1:] {
		sum := 0.0
		for c, h := range recs[0] {
			if strings.HasPrefix(h, "C_share_") {
				v, err := strconv.ParseFloat(row[c], 64)
				if err != nil {
					t.Fatal(err)
				}
				sum += v
			}
		}
		if !(sum <= 1+1e-12 && sum > 1-1e-3) {
			t.Errorf("step %d: listed carbon shares sum to %.15g", i+1, sum)
		}
	}
	for _, name := range []string{"crack.svg", "crack.png"} {
		b, err := os.ReadFile(filepath.Join(dir, name))
		if err != nil || len(b) < 1000 {
			t.Errorf("%s: %d bytes, %v", name, len(b), err)
		}
	}
	pf, _ := os.Open(filepath.Join(dir, "crack.png"))
	defer pf.Close()
	if _, err := png.Decode(pf); err != nil {
		t.Errorf("crack.png does not decode: %v", err)
	}
}

// TestCrackCommandAromatics runs the example that reads graphite and
// aromatics from the shared thermo file beside the repository.
func TestCrackCommandAromatics(t *testing.T) {
	study := filepath.Join("..", "..", "examples", "fuels", "crack-study-aromatics.toml")
	if _, err := os.Stat(filepath.Join("..", "..", "..", "shared", "data", "mechanisms", "thermo-extra", "thermo.dat")); err != nil {
		t.Skipf("shared thermo-extra data not available: %v", err)
	}
	dir := t.TempDir()
	if _, err := runCmd(t, "crack", study, "-o", dir); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(filepath.Join(dir, "crack.csv"))
	if err != nil {
		t.Fatal(err)
	}
	r := csv.NewReader(strings.NewReader(string(b)))
	r.Comment = '#'
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := map[string]int{}
	for c, h := range recs[0] {
		col[h] = c
	}
	get := func(step int, h string) float64 {
		c, ok := col[h]
		if !ok {
			t.Fatalf("no column %q", h)
		}
		v, _ := strconv.ParseFloat(recs[step][c], 64)
		return v
	}
	// Graphite first, pyrene once graphite is walled off, ethylene alone at
	// the end (common practice, no source; see fuel.TestCrackingStudy).
	if v := get(1, "C_share_CSOLID [-]"); v < 0.8 {
		t.Errorf("step 1 graphite carbon share %g", v)
	}
	if v := get(2, "C_share_C16H10 [-]"); v < 0.5 {
		t.Errorf("step 2 pyrene carbon share %g", v)
	}
	if v := get(6, "C_share_C2H4 [-]"); math.Abs(v-1) > 1e-12 {
		t.Errorf("last step ethylene carbon share %.15g, want 1", v)
	}
}
