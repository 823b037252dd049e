package main

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/correlation"
	"flame1d/sweep"
)

// fitCorrelationFile writes a small correlation (made-up coefficients in
// the range of methane/air; the numbers do not matter here).
func fitCorrelationFile(t *testing.T) string {
	t.Helper()
	c := &correlation.Correlation{T0: 298, P0: 101325,
		Phi: correlation.Range{Min: 0.7, Max: 1.4}, T: correlation.Range{Min: 298, Max: 500}, P: correlation.Range{Min: 101325, Max: 506625}}
	c.Coef[correlation.BM], c.Coef[correlation.B2], c.Coef[correlation.PhiM] = 0.37, -1.2, 1.0
	c.Coef[correlation.Alpha0], c.Coef[correlation.Beta0] = 1.8, -0.4
	for i := range c.Free {
		c.Free[i] = true
	}
	var b bytes.Buffer
	if err := c.WriteTOML(&b, ""); err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(t.TempDir(), "corr.toml")
	if err := os.WriteFile(p, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// fit --eval with an input that is not a number, or where the correlation
// has no flame speed, fails with the reason: it never prints "0 m/s" and
// exits 0 (issue 11, item 8).
func TestFitEvalRefusesNoFlameSpeed(t *testing.T) {
	corr := fitCorrelationFile(t)
	for _, tc := range []struct{ eval, want string }{
		{"NaN,300 K,1 atm", "equivalence ratio NaN is not a finite positive number"},
		{"1.0,NaN K,1 atm", "not a finite"},
		{"1.0,300 K,-1 atm", "pressure"},
		{"3.5,300 K,1 atm", "no flame speed"},
	} {
		cmd := newFitCmd()
		var out bytes.Buffer
		cmd.SetOut(&out)
		cmd.SetErr(&out)
		cmd.SetArgs([]string{"--correlation", corr, "--eval", tc.eval})
		err := cmd.Execute()
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("--eval %q: error %v, want %q", tc.eval, err, tc.want)
		}
		if strings.Contains(out.String(), " 0 m/s") {
			t.Errorf("--eval %q printed a zero flame speed: %s", tc.eval, out.String())
		}
	}
	cmd := newFitCmd()
	var out bytes.Buffer
	cmd.SetOut(&out)
	cmd.SetArgs([]string{"--correlation", corr, "--eval", "1.0,298 K,1 atm"})
	if err := cmd.Execute(); err != nil || !strings.Contains(out.String(), "= 0.37 m/s") {
		t.Errorf("good --eval: %v\n%s", err, out.String())
	}
}

// FuzzFitResults: fit reads any results table without panicking, and a
// correlation it fits has finite coefficients and prints no NaN (issue 11,
// item 10).
//
//	go test ./cmd/flame1d -run XXX -fuzz FuzzFitResults -fuzztime 120s
func FuzzFitResults(f *testing.F) {
	head := "# flame1d sweep results\n" + strings.Join(sweep.Columns, ",") + "\n"
	row := func(id string, phi, T, P, sl float64) string {
		return fmt.Sprintf("%s,%g,%g,%g,solved,%g,2000,2100,4e-4,0.002,200,cold,10,1.0,\n", id, phi, T, P, sl)
	}
	var good strings.Builder
	good.WriteString(head)
	for i, phi := range []float64{0.7, 0.8, 0.9, 1.0, 1.1, 1.2, 1.3} {
		for _, T := range []float64{298, 400, 500} {
			for _, P := range []float64{101325, 506625} {
				sl := (0.38 - 1.3*(phi-1.08)*(phi-1.08)) * math.Pow(T/298, 1.8) * math.Pow(P/101325, -0.35)
				good.WriteString(row(fmt.Sprintf("p%d-%g-%g", i, T, P), phi, T, P, sl))
			}
		}
	}
	f.Add(good.String())
	f.Add(head + row("a", 1, 298, 101325, 1e-300) + row("b", 1.1, 298, 101325, 1e300) + row("c", 1.2, 298, 101325, 0.3))
	path := filepath.Join(f.TempDir(), "results.csv")
	f.Fuzz(func(t *testing.T, text string) {
		if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		data, _, err := fitData(path)
		if err != nil {
			return
		}
		c, err := correlation.Fit(data, correlation.Options{Source: path})
		if err != nil {
			return
		}
		for i, v := range c.Coef {
			if math.IsNaN(v) || math.IsInf(v, 0) || math.IsNaN(c.StdErr[i]) {
				t.Fatalf("coefficient %s = %v ± %v", correlation.CoefNames[i], v, c.StdErr[i])
			}
		}
		var out bytes.Buffer
		printCorrelation(&out, c)
		if strings.Contains(out.String(), "NaN") {
			t.Fatalf("NaN printed:\n%s", out.String())
		}
	})
}
