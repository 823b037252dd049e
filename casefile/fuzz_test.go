package casefile

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"unicode"
)

// FuzzParse: Parse never panics; every error names the file; whatever it
// accepts is within the documented bounds (titles on one line, physical
// values in range, grid and sweep sizes bounded) — issue 11, item 10.
//
//	go test ./casefile -run XXX -fuzz FuzzParse -fuzztime 120s
func FuzzParse(f *testing.F) {
	for _, pattern := range []string{"../examples/*.toml", "../examples/sweeps/*.toml", "../cmd/flame1d/cases/*.toml"} {
		files, _ := filepath.Glob(pattern)
		for _, p := range files {
			if b, err := os.ReadFile(p); err == nil {
				f.Add(string(b))
			}
		}
	}
	f.Add(minimal)
	f.Add(base + "[fuels.\"../x\"]\ncomposition = { CH4 = 1 }\n[compare]\nequivalence_ratios = [0.8, 1e300]\n")
	f.Add(base + "[sweep]\nequivalence_ratio = { from = 0.6, to = 1.4, count = 3, spacing = \"log\" }\ntemperature = [\"300 K\", \"400 K\"]\n")
	f.Add(base + "[grid]\ndomain_length = \"2 cm\"\ninitial_points = 40\nmax_points = 200\n[solver]\nrelative_tolerance = 1e-6\nconvection = \"central\"\n")
	f.Add("title = \"\\u2028\"\n" + base)
	f.Fuzz(func(t *testing.T, src string) {
		c, err := Parse([]byte(src), "fuzz.toml")
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz.toml") {
				t.Fatalf("error without the file name: %v", err)
			}
			return
		}
		if len(c.Title) > maxTitleBytes || strings.IndexFunc(c.Title, unicode.IsControl) >= 0 {
			t.Fatalf("title %q accepted", c.Title)
		}
		for _, fu := range c.Fuels {
			if len(fu.Name) > maxNameBytes || strings.IndexFunc(fu.Name, unicode.IsControl) >= 0 {
				t.Fatalf("fuel name %q accepted", fu.Name)
			}
		}
		finite := func(what string, v float64) {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("%s = %v accepted", what, v)
			}
		}
		if !(c.EquivalenceRatio > 0 && c.EquivalenceRatio < 100) || !(c.Temperature > 150 && c.Temperature < 2000) || !(c.Pressure >= 100 && c.Pressure <= 1e8) {
			t.Fatalf("condition phi %v, T %v, P %v accepted", c.EquivalenceRatio, c.Temperature, c.Pressure)
		}
		for n, x := range c.Fuel.Composition {
			finite("fuel "+n, x)
		}
		for n, x := range c.Oxidizer {
			finite("oxidizer "+n, x)
		}
		g := c.Grid
		if g.InitialPoints > maxInitialPoints || g.MaxPoints > maxGridPoints || g.InitialPoints < 0 || g.MaxPoints < 0 {
			t.Fatalf("grid %+v accepted", g)
		}
		if g.DomainLength != 0 && !(g.DomainLength >= minDomain && g.DomainLength <= maxDomain) {
			t.Fatalf("domain length %v accepted", g.DomainLength)
		}
		if s := c.Sweep; s != nil {
			n := len(s.EquivalenceRatio) * len(s.Temperature) * len(s.Pressure)
			if n > maxSweepPoints || n == 0 {
				t.Fatalf("sweep of %d points accepted", n)
			}
			for _, v := range append(append(append([]float64{}, s.EquivalenceRatio...), s.Temperature...), s.Pressure...) {
				finite("sweep value", v)
			}
		}
	})
}
