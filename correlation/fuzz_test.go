package correlation

import (
	"bytes"
	"math"
	"strings"
	"testing"
)

// FuzzReadTOML: a correlation file never makes the reader panic; every
// error names the file; an accepted correlation never evaluates to NaN or
// a negative speed, and survives WriteTOML -> ReadTOML unchanged (issue 11,
// item 10).
//
//	go test ./correlation -run XXX -fuzz FuzzReadTOML -fuzztime 120s
func FuzzReadTOML(f *testing.F) {
	c := &Correlation{T0: 298, P0: 101325, Phi: Range{0.7, 1.4}, T: Range{298, 500}, P: Range{101325, 506625}, Source: "results.csv",
		Notes: []string{"a note"}, Points: 12, DOF: 5}
	c.Coef = [NumCoef]float64{0.37, -1.2, 1.05, 1.8, -0.2, -0.4, 0.1}
	for i := range c.Free {
		c.Free[i] = i != Beta1
	}
	var b bytes.Buffer
	if err := c.WriteTOML(&b, "note"); err != nil {
		f.Fatal(err)
	}
	f.Add(b.String())
	f.Add(strings.Replace(b.String(), "0.37", "1e308", 1))
	f.Add("format = 1\n")
	f.Fuzz(func(t *testing.T, src string) {
		c, err := ReadTOML([]byte(src), "fuzz.toml")
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz.toml") {
				t.Fatalf("error without the file name: %v", err)
			}
			return
		}
		for _, phi := range []float64{c.Phi.Min, c.Phi.Max, 1} {
			for _, T := range []float64{c.T.Min, c.T.Max} {
				for _, P := range []float64{c.P.Min, c.P.Max} {
					if s, _ := c.Evaluate(phi, T, P); math.IsNaN(s) || s < 0 || math.IsInf(s, 0) {
						t.Fatalf("Evaluate(%v, %v, %v) = %v", phi, T, P, s)
					}
				}
			}
		}
		var out bytes.Buffer
		if err := c.WriteTOML(&out, ""); err != nil {
			return
		}
		back, err := ReadTOML(out.Bytes(), "back.toml")
		if err != nil {
			t.Fatalf("written correlation does not read back: %v\n%s", err, out.String())
		}
		if back.Coef != c.Coef || back.Free != c.Free || back.T0 != c.T0 || back.P0 != c.P0 || back.Phi != c.Phi || back.T != c.T || back.P != c.P {
			t.Fatalf("round trip changed the correlation:\n%+v\n%+v", c, back)
		}
	})
}
