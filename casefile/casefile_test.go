package casefile

import (
	"strings"
	"testing"
)

const minimal = `
title = "t"
mechanism = "smith1999-natgas"
[mixture]
fuel = { CH4 = 2, C2H6 = 2 }
equivalence_ratio = 0.9
temperature = "25 C"
pressure = "5 bar"
[grid]
domain_length = "3 cm"
`

func TestParseConvertsUnitsAndNormalises(t *testing.T) {
	c, err := Parse([]byte(minimal), "case.toml")
	if err != nil {
		t.Fatal(err)
	}
	// 25 °C = 298.15 K and 1 bar = 1e5 Pa exactly (ISO 80000-5, SI brochure).
	if c.Temperature != 298.15 || c.Pressure != 5e5 || c.Grid.DomainLength != 0.03 {
		t.Errorf("T=%g P=%g L=%g, want 298.15 K, 5e5 Pa, 0.03 m", c.Temperature, c.Pressure, c.Grid.DomainLength)
	}
	if c.Fuel.Composition["CH4"] != 0.5 || c.Fuel.Composition["C2H6"] != 0.5 {
		t.Errorf("fuel not normalised: %v", c.Fuel.Composition)
	}
	if c.Oxidizer["O2"] != 0.21 || c.Oxidizer["N2"] != 0.79 {
		t.Errorf("default oxidizer %v, want air", c.Oxidizer)
	}
	if c.Solver.Multicomponent {
		t.Errorf("diffusion defaults to multicomponent, want mixture-averaged")
	}
	c, err = Parse([]byte(minimal+"[solver]\ndiffusion = \"multicomponent\"\n"), "case.toml")
	if err != nil || !c.Solver.Multicomponent {
		t.Errorf("diffusion = \"multicomponent\": %v, Multicomponent = %v", err, c != nil && c.Solver.Multicomponent)
	}
}

func TestNamedFuelsAndCompare(t *testing.T) {
	src := `
[mixture]
fuel = "blend"
equivalence_ratio = 1.0
[fuels.blend]
composition = { CH4 = 0.9, H2 = 0.1 }
[fuels.neat]
composition = { CH4 = 1 }
[compare]
equivalence_ratios = [0.8, 1.0]
`
	c, err := Parse([]byte(src), "c.toml")
	if err != nil {
		t.Fatal(err)
	}
	if c.Fuel.Name != "blend" || len(c.Fuels) != 2 || c.Fuels[1].Name != "neat" {
		t.Errorf("fuels %+v", c.Fuels)
	}
	if c.Compare == nil || len(c.Compare.Fuels) != 2 || c.Compare.ProfilePhi != 1 {
		t.Errorf("compare %+v", c.Compare)
	}
}

// Each broken case gives an error naming the file, the line and the key.
func TestErrorsNameKeyAndLine(t *testing.T) {
	for _, tc := range []struct{ name, src, want string }{
		{"typo", "[mixture]\nfuel = { CH4 = 1 }\nequivalence_ratio = 1\ntemprature = \"300 K\"\n", "c.toml:4: mixture.temprature: unknown key"},
		{"bad unit", "[mixture]\nfuel = { CH4 = 1 }\nequivalence_ratio = 1\npressure = \"3 furlongs\"\n", "c.toml:4: mixture.pressure"},
		{"missing fuel", "[mixture]\nequivalence_ratio = 1\n", "mixture.fuel: missing"},
		{"unknown fuel name", "[mixture]\nfuel = \"jet\"\nequivalence_ratio = 1\n", "no [fuels.jet] table"},
		{"negative phi", "[mixture]\nfuel = { CH4 = 1 }\nequivalence_ratio = -1\n", "c.toml:3: mixture.equivalence_ratio"},
		{"cold", "[mixture]\nfuel = { CH4 = 1 }\nequivalence_ratio = 1\ntemperature = \"20 K\"\n", "outside 150-2000 K"},
		{"syntax", "[mixture\nfuel = 1\n", "c.toml:1: TOML syntax"},
		{"diffusion model", "[mixture]\nfuel = { CH4 = 1 }\nequivalence_ratio = 1\n[solver]\ndiffusion = \"full\"\n", "c.toml:5: solver.diffusion: \"full\": use \"mixture-averaged\""},
		{"one fuel compare", "[mixture]\nfuel = { CH4 = 1 }\nequivalence_ratio = 1\n[compare]\nequivalence_ratios = [1.0]\n", "at least two fuels"},
	} {
		_, err := Parse([]byte(tc.src), "c.toml")
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want it to contain %q", tc.name, err, tc.want)
		}
	}
}
