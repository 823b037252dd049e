package mechtoml

import (
	"math"
	"math/rand"
	"strings"
	"testing"
)

func TestParseRateUnit(t *testing.T) {
	good := []struct {
		in      string
		L, Q, T float64
		cm, mc  bool
	}{
		{"cm^3/mol/s", 3, -1, -1, true, false},
		{"cm3/(mol s)", 3, -1, -1, true, false},
		{"m^6/mol^2/s", 6, -2, -1, false, false},
		{"cm^3/molecule/s", 3, -1, -1, true, true},
		{"1/s", 0, 0, -1, false, false},
		{"mol/m^3/s", -3, 1, -1, false, false},
		{"cm^4.5/mol^1.5/s", 4.5, -1.5, -1, true, false},
		{"cm^3 * mol^-1 * s^-1", 3, -1, -1, true, false},
	}
	for _, c := range good {
		u, err := parseRateUnit(c.in)
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if u.L != c.L || u.Q != c.Q || u.T != c.T || u.cm != c.cm || u.molecule != c.mc {
			t.Errorf("%q read as %+v", c.in, u)
		}
	}
	bad := []struct{ in, want string }{
		{"cm^3/mol/h", `unknown unit "h"`},
		{"cm^3/m/s", "mixes cm and m"},
		{"cm^3/mol/molecule/s", "mixes mol and molecules"},
		{"cm^3/(mol s", "unclosed"},
		{"cm^/s", "without an exponent"},
		{"cm^3/((mol)) s", "nested"},
		{"%", "unexpected"},
	}
	for _, c := range bad {
		if _, err := parseRateUnit(c.in); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: error %v, want %q", c.in, err, c.want)
		}
	}
	// The dimensions must fit the order: cm^3/mol/s is bimolecular only.
	u, _ := parseRateUnit("cm^3/mol/s")
	if _, ok := u.forOrder(2); !ok {
		t.Error("cm^3/mol/s does not fit order 2")
	}
	if _, ok := u.forOrder(3); ok {
		t.Error("cm^3/mol/s fits order 3")
	}
	if s := tableRateUnit(writeUnits, 3).String(); s != "cm^6/mol^2/s" {
		t.Errorf("order-3 unit written %q", s)
	}
}

// TestInvert: whatever invert returns converts back exactly, and for any
// value that is the image of some number it finds one, preferring the
// short decimal a source would have printed.
func TestInvert(t *testing.T) {
	toCal := func(q float64) float64 { return q * calorie }
	if q, ok := invert(6260*calorie, 6260*calorie/calorie, toCal); !ok || q != 6260 {
		t.Errorf("invert(6260 cal/mol in J) = %v, %v; want 6260", q, ok)
	}
	rng := rand.New(rand.NewSource(7))
	found := 0
	for i := 0; i < 20000; i++ {
		x := math.Float64frombits(rng.Uint64()>>2 | 0x3000000000000000) // positive, moderate exponent
		v := toCal(x)
		q, ok := invert(v, v/calorie, toCal)
		if !ok {
			t.Fatalf("no inverse found for the image of %v", x)
		}
		if toCal(q) != v {
			t.Fatalf("invert(%v) = %v does not convert back", v, q)
		}
		// A float next to an image may have no preimage; then ok is false,
		// never a wrong q.
		w := math.Nextafter(v, math.Inf(1))
		if q, ok := invert(w, w/calorie, toCal); ok {
			found++
			if toCal(q) != w {
				t.Fatalf("invert(%v) = %v does not convert back", w, q)
			}
		}
	}
	if found == 20000 {
		t.Error("every neighbour had a preimage: the test of the no-solution case saw none")
	}
}
