package casefile

import "testing"

// A fuel table may name its own mechanism; a cracked pool that names none
// burns on the foundational set, a neat fuel on the default one, and a
// top-level mechanism key applies to every fuel that names none. The case's
// Mechanism (what run and sweep burn) is its own fuel's.
func TestFuelMechanisms(t *testing.T) {
	const fuels = `
[fuels.surrogate]
composition = { nc7h16 = 1.0 }
mechanism = "lu2009-heptane"
[fuels.methane]
composition = { CH4 = 1.0 }
[fuels.kero]
formula = "C11H22"
lower_heating_value = "43.5 MJ/kg"
[fuels.kero.cracking]
yields = { C2H4 = 4, CH4 = 1 }
`
	for _, tc := range []struct {
		top, caseFuel, caseMech string
		want                    map[string]string
	}{
		{"", "kero", FoundationalMechanism, map[string]string{"surrogate": "lu2009-heptane", "methane": DefaultMechanism, "kero": FoundationalMechanism}},
		{"", "methane", DefaultMechanism, map[string]string{"surrogate": "lu2009-heptane", "methane": DefaultMechanism, "kero": FoundationalMechanism}},
		{`mechanism = "mine.toml"`, "kero", "mine.toml", map[string]string{"surrogate": "lu2009-heptane", "methane": "mine.toml", "kero": "mine.toml"}},
		{`mechanism = "mine.toml"`, "surrogate", "lu2009-heptane", map[string]string{"surrogate": "lu2009-heptane", "methane": "mine.toml", "kero": "mine.toml"}},
	} {
		src := tc.top + "\n[mixture]\nfuel = \"" + tc.caseFuel + "\"\nequivalence_ratio = 1.0\n" + fuels
		c, err := Parse([]byte(src), "mech.toml")
		if err != nil {
			t.Fatal(err)
		}
		if c.Mechanism != tc.caseMech {
			t.Errorf("%q, fuel %s: case mechanism %q, want %q", tc.top, tc.caseFuel, c.Mechanism, tc.caseMech)
		}
		for _, f := range c.Fuels {
			if got := c.MechanismOf(f); got != tc.want[f.Name] {
				t.Errorf("%q: fuel %s on %q, want %q", tc.top, f.Name, got, tc.want[f.Name])
			}
		}
	}
}

// The fuel-qualification demo burns its surrogate on the n-heptane set and
// its real fuels' pools on the foundational set.
func TestKeroseneDemoMechanisms(t *testing.T) {
	c, err := ReadFile("../examples/kerosene-compare.toml")
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]string{"surrogate": "lu2009-heptane", "ref-kerosene": FoundationalMechanism, "syn-kerosene": FoundationalMechanism}
	for _, f := range c.Fuels {
		if got := c.MechanismOf(f); got != want[f.Name] {
			t.Errorf("%s burns on %q, want %q", f.Name, got, want[f.Name])
		}
	}
}
