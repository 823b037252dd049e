package casefile

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/fuel"
)

var fuzzMechanism = sync.OnceValues(func() (*chem.Mechanism, error) { return builtin.Load("lu2009-heptane") })

// FuzzParseFuels: a fuel table never makes the reader or the pool
// construction panic; every error names the file; an accepted pool has
// finite, non-negative amounts (issue 11, item 10).
//
//	go test ./casefile -run XXX -fuzz FuzzParseFuels -fuzztime 120s
func FuzzParseFuels(f *testing.F) {
	files, _ := filepath.Glob("../examples/fuels/*.toml")
	for _, p := range files {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(string(b))
		}
	}
	f.Add("[fuels.a]\ncomposition = { nc7h16 = 1 }\n")
	f.Add("[fuels.b]\nformula = \"C10H20\"\nlower_heating_value = \"43 MJ/kg\"\nmode = \"pre-cracked\"\n[fuels.b.cracking]\nyields = { c2h4 = 3, ch4 = 1 }\nbalance = [\"h2\"]\n")
	f.Add("[fuels.c]\nh_to_c = 1.9\nmolar_mass = \"150 g/mol\"\nhigher_heating_value = 46e6\n[fuels.c.cracking]\nmethod = \"equilibrium\"\ntemperature = \"1100 K\"\n")
	m, err := fuzzMechanism()
	if err != nil {
		f.Fatal(err)
	}
	set, err := fuel.SpeciesSet(m)
	if err != nil {
		f.Fatal(err)
	}
	f.Fuzz(func(t *testing.T, src string) {
		ff, err := ParseFuels([]byte(src), "fuzz.toml")
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz.toml") {
				t.Fatalf("error without the file name: %v", err)
			}
			return
		}
		for _, s := range ff.Fuels {
			if checkText(s.Name, maxNameBytes) != nil || checkText(s.Description, maxTitleBytes) != nil {
				t.Fatalf("fuel name %q or description %q accepted", s.Name, s.Description)
			}
			res, err := s.Resolve(m, set)
			if err != nil || res.Pool == nil {
				continue
			}
			for i, n := range res.Pool.Moles {
				if !(n >= 0) || math.IsInf(n, 0) {
					t.Fatalf("fuel %s: pool amount of %s is %v", s.Name, res.Pool.Species[i], n)
				}
			}
			if h := res.Pool.FormationEnthalpy; math.IsNaN(h) || math.IsInf(h, 0) {
				t.Fatalf("fuel %s: formation enthalpy %v", s.Name, h)
			}
		}
	})
}
