package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/correlation"
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
