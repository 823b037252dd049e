package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// run --sensitivity on H2/air (Burke et al. 2012, 27 steps) with a factors
// side file: sensitivity.csv lists every step and the diffusion
// coefficients of H2 (the fuel), H and O2, sorted by
// magnitude; the band in summary.json is the root sum of squares of the
// CSV's per-step shares (package sensitivity's formula, checked on the
// written numbers); the side file's factor reaches its step; the charts
// exist.
func TestRunSensitivity(t *testing.T) {
	if testing.Short() {
		t.Skip("full flame solve")
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "rates.toml"), []byte("[uncertainty_factors]\n\"1\" = 1.25\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	c := filepath.Join(dir, "case.toml")
	err := os.WriteFile(c, []byte("mechanism = \"burke2012-hydrogen\"\n[mixture]\nfuel = { H2 = 1 }\nequivalence_ratio = 1.0\n"+
		"[sensitivity]\ndefault_uncertainty_factor = 1.5\nuncertainty_factors = \"rates.toml\"\n"), 0o644)
	if err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out")
	stdout, stderr, err := runRun(t, c, "-o", out, "--sensitivity", "--json", "-q")
	if err != nil {
		t.Fatalf("run: %v\n%s", err, stderr)
	}
	var sum struct {
		Speed float64 `json:"flame_speed_m_s"`
		Sigma float64 `json:"flame_speed_sigma_m_s"`
		Band  string  `json:"flame_speed_band"`
		Top   []struct {
			Value float64 `json:"d_ln_flame_speed_d_ln_parameter"`
		} `json:"sensitivities_top10"`
	}
	if err := json.Unmarshal([]byte(stdout), &sum); err != nil {
		t.Fatal(err)
	}
	if len(sum.Top) != 10 || !strings.HasPrefix(sum.Band, "S_L = ") || !strings.HasSuffix(sum.Band, " m/s (1σ, rate constants)") {
		t.Errorf("summary: band %q, %d top coefficients", sum.Band, len(sum.Top))
	}
	f, err := os.Open(filepath.Join(out, "sensitivity.csv"))
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
	rows = rows[1:]
	if len(rows) != 27+3 {
		t.Errorf("sensitivity.csv has %d rows, want 27 steps + 3 diffusion coefficients", len(rows))
	}
	var sq float64
	prev := math.Inf(1)
	for _, row := range rows {
		v, _ := strconv.ParseFloat(row[4], 64)
		if math.Abs(v) > prev {
			t.Errorf("row %s (%s) is out of order", row[0], row[3])
		}
		prev = math.Abs(v)
		if row[1] == "rate constant" {
			share, _ := strconv.ParseFloat(row[6], 64)
			sq += share * share
			if want := map[bool]string{true: "1.25", false: "1.5"}[row[2] == "1"]; row[5] != want {
				t.Errorf("step %s: factor %s, want %s", row[2], row[5], want)
			}
		}
	}
	if math.Abs(math.Sqrt(sq)-sum.Sigma) > 1e-12*sum.Sigma || !(sum.Sigma > 0) {
		t.Errorf("σ = %g m/s in summary.json, root sum of squares of the CSV shares %g", sum.Sigma, math.Sqrt(sq))
	}
	for _, name := range []string{"sensitivity.svg", "sensitivity.png"} {
		if st, err := os.Stat(filepath.Join(out, name)); err != nil || st.Size() < 1000 {
			t.Errorf("%s: %v", name, err)
		}
	}
}
