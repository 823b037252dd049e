package main

import (
	"bytes"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/casefile"
	"flame1d/output"
)

// checkFlamePlot asserts that a solved flame's folder holds the flame plot
// as SVG (with the panels' units and the model-prediction note) and as a
// PNG that decodes.
func checkFlamePlot(t *testing.T, dir string) {
	t.Helper()
	checkChart(t, dir, "flame", "T [K]", "heat release [", "mole fraction [-]", "oxidation ")
}

// checkChart asserts that dir holds base.svg, containing every one of
// want and the model-prediction note, and base.png, which decodes.
func checkChart(t *testing.T, dir, base string, want ...string) {
	t.Helper()
	svg, err := os.ReadFile(filepath.Join(dir, base+".svg"))
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range append(want, "<svg", output.PlotNote) {
		if !bytes.Contains(svg, []byte(w)) {
			t.Errorf("%s.svg lacks %q", base, w)
		}
	}
	f, err := os.Open(filepath.Join(dir, base+".png"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if _, err := png.Decode(f); err != nil {
		t.Errorf("%s.png does not decode: %v", base, err)
	}
}

// Two hydrogen fuels (neat, and diluted with 30% N2) compared at one
// equivalence ratio: the comparison writes the flame-speed chart, the
// overlays and the zone map, and a flame plot per fuel. The diluent is no
// fuel species: it has no pyrolysis bar and no "not consumed" note.
func TestCompareWritesZoneMap(t *testing.T) {
	if testing.Short() {
		t.Skip("two flame solves")
	}
	c := writeCase(t, `title = "Hydrogen supply check"
mechanism = "burke2012-hydrogen"
[mixture]
fuel = "neat"
equivalence_ratio = 0.8
[fuels.neat]
composition = { H2 = 1.0 }
[fuels.diluted]
composition = { H2 = 0.7, N2 = 0.3 }
`)
	dir := filepath.Join(t.TempDir(), "out")
	cmd := newCompareCmd()
	var out, errOut bytes.Buffer
	cmd.SetOut(&out)
	cmd.SetErr(&errOut)
	cmd.SetArgs([]string{c, "-o", dir, "-q", "--fuels", "neat,diluted"})
	if err := cmd.Execute(); err != nil {
		t.Fatalf("compare: %v\n%s", err, errOut.String())
	}
	checkChart(t, dir, "zone-map", "neat", "diluted", "distance from the heat-release peak [mm]", "H2 ", "oxidation ")
	checkChart(t, dir, "flame-speed", "S_L [m/s]", "equivalence ratio")
	checkChart(t, dir, "profiles-thermal", "T [K]", "heat release [")
	checkChart(t, dir, "profiles-species", "mole fraction [-]")
	for _, fuel := range []string{"neat", "diluted"} {
		checkFlamePlot(t, filepath.Join(dir, fuel))
	}
	zm, _ := os.ReadFile(filepath.Join(dir, "zone-map.svg"))
	if strings.Contains(string(zm), "N2") {
		t.Error("the zone map shows the N2 diluent as a fuel species")
	}
}

// The example whose zone map the README shows reads, and names the two
// gases it compares over lean to rich mixtures.
func TestPipelineGasExampleReads(t *testing.T) {
	c, err := casefile.ReadFile(filepath.Join("..", "..", "examples", "pipeline-gas-compare.toml"))
	if err != nil {
		t.Fatal(err)
	}
	if c.Compare == nil || len(c.Compare.Fuels) != 2 || len(c.Compare.EquivalenceRatios) != 3 {
		t.Fatalf("compare table %+v, want two fuels over three equivalence ratios", c.Compare)
	}
	for _, name := range c.Compare.Fuels {
		if _, ok := c.FuelByName(name); !ok {
			t.Errorf("compared fuel %q has no [fuels.%s] table", name, name)
		}
	}
}
