package output

import (
	"bytes"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/flame"
)

// syntheticFlame is a flame-shaped profile in closed form (no solve): a
// methane-like fuel consumed over a logistic front at xf with width d, a
// Gaussian heat-release peak just downstream, H2 formed and consumed inside
// the front, on a grid that is fine where the flame is. shift moves the
// whole flame, for comparing two of them.
func syntheticFlame(t testing.TB, xf, d, shift float64) (*flame.Profile, *flame.Zones) {
	t.Helper()
	xf += shift
	p := &flame.Profile{Species: []string{"CH4", "O2", "H2", "OH"}}
	for j := 0; j <= 160; j++ {
		s := float64(j) / 160
		// Points crowd near the front: x = xf + 6 d sinh(4(s - 1/2)) / sinh 2.
		x := xf + 6*d*math.Sinh(4*(s-0.5))/math.Sinh(2)
		f := 1 / (1 + math.Exp((x-xf)/d)) // fuel fraction left
		p.X = append(p.X, x)
		p.T = append(p.T, 300+1900*(1-f))
		p.Velocity = append(p.Velocity, 0.38*(300+1900*(1-f))/300)
		p.HeatRelease = append(p.HeatRelease, 4.2e9*math.Exp(-math.Pow((x-xf-1.5*d)/d, 2)))
		p.MassFractions = append(p.MassFractions, []float64{0.055 * f, 0.2 * f, 0.004 * f * (1 - f), 0})
		p.MoleFractions = append(p.MoleFractions, []float64{0.095 * f, 0.19 * f, 0.02 * f * (1 - f), 0.005 * (1 - f)})
	}
	p.ThermalThick = 4 * d
	z, err := p.Zones([]string{"CH4"}, []float64{0.055, 0.2, 0, 0})
	if err != nil {
		t.Fatal(err)
	}
	return p, z
}

// plotDir is where the tests draw; FLAME1D_PLOT_DIR keeps the pictures for
// looking at them.
func plotDir(t *testing.T) string {
	if d := os.Getenv("FLAME1D_PLOT_DIR"); d != "" {
		return d
	}
	return t.TempDir()
}

func TestFlamePlot(t *testing.T) {
	dir := plotDir(t)
	p, z := syntheticFlame(t, 0.01, 1e-4, 0)
	c := Chart{Title: "Test flame", Note: "CH4/air, φ = 1, 298 K, 1 atm"}
	svg, pngPath := filepath.Join(dir, "flame.svg"), filepath.Join(dir, "flame.png")
	for _, path := range []string{svg, pngPath} {
		if err := FlamePlot(path, c, p, z); err != nil {
			t.Fatal(err)
		}
	}
	b := readFile(t, svg)
	// The zone bars carry the temperature windows the diagnostics computed.
	pz := z.Pyrolysis[0]
	for _, want := range []string{"<svg", "Test flame", "T [K]", "heat release [GW/m³]", "mole fraction [-]", "position [mm]",
		"CH4", "H2", PlotNote, temperatureWindow(pz.StartT, pz.EndT), temperatureWindow(z.Oxidation.StartT, z.Oxidation.EndT)} {
		if !bytes.Contains(b, []byte(want)) {
			t.Errorf("flame plot SVG lacks %q", want)
		}
	}
	decodePNG(t, pngPath)
	// Same input, same bytes, in both formats.
	for _, path := range []string{svg, pngPath} {
		again := filepath.Join(t.TempDir(), "again"+filepath.Ext(path))
		if err := FlamePlot(again, c, p, z); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(readFile(t, path), readFile(t, again)) {
			t.Errorf("the flame plot %s differs between two writes of the same flame", filepath.Ext(path))
		}
	}
	if err := FlamePlot(filepath.Join(t.TempDir(), "x.svg"), c, p, nil); err == nil {
		t.Error("a flame without zone diagnostics was drawn")
	}
}

func TestZoneMap(t *testing.T) {
	dir := plotDir(t)
	pa, za := syntheticFlame(t, 0.01, 1e-4, 0)
	_, zb := syntheticFlame(t, 0.01, 1.6e-4, 0.002) // a thicker flame, elsewhere in its domain
	_ = pa
	panels := []ZonePanel{
		{Title: "φ = 1", Flames: []ZoneSet{{Label: "fuel A", Zones: za}, {Label: "fuel B", Zones: zb}}},
		{Title: "across φ", Flames: []ZoneSet{{Label: "fuel A, φ 0.8", Zones: za}, {Label: "fuel A, φ 1", Zones: za},
			{Label: "fuel B, φ 0.8", Zones: zb}, {Label: "fuel B, φ 1", Zones: zb}}},
	}
	c := Chart{Title: "Where each fuel cracks and burns"}
	svg, pngPath := filepath.Join(dir, "zone-map.svg"), filepath.Join(dir, "zone-map.png")
	for _, path := range []string{svg, pngPath} {
		if err := ZoneMap(path, c, panels); err != nil {
			t.Fatal(err)
		}
	}
	b := readFile(t, svg)
	for _, want := range []string{"fuel A", "fuel B, φ 0.8", "distance from the heat-release peak [mm]", PlotNote,
		"CH4 " + temperatureWindow(zb.Pyrolysis[0].StartT, zb.Pyrolysis[0].EndT)} {
		if !bytes.Contains(b, []byte(want)) {
			t.Errorf("zone map SVG lacks %q", want)
		}
	}
	decodePNG(t, pngPath)
	again := filepath.Join(t.TempDir(), "again.svg")
	if err := ZoneMap(again, c, panels); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(b, readFile(t, again)) {
		t.Error("the zone map SVG differs between two writes of the same zones")
	}
}

// The bars of a zone map sit at the zone positions relative to each
// flame's heat-release peak, whatever the flame's place in its domain.
func TestZoneRowsAlignAtPeak(t *testing.T) {
	_, za := syntheticFlame(t, 0.01, 1e-4, 0)
	_, zb := syntheticFlame(t, 0.01, 1e-4, 0.0037)
	ra := ZoneRows("a", za, za.Oxidation.PeakX)
	rb := ZoneRows("b", zb, zb.Oxidation.PeakX)
	if len(ra) != 2 || len(rb) != 2 {
		t.Fatalf("rows %d and %d, want pyrolysis and oxidation", len(ra), len(rb))
	}
	for i := range ra {
		// Shifting a flame by 3.7 mm moves its zones with it: relative
		// positions agree to the interpolation error on the shifted grid.
		if math.Abs(ra[i].From-rb[i].From) > 1e-6 || math.Abs(ra[i].To-rb[i].To) > 1e-6 {
			t.Errorf("row %d: %g..%g mm against %g..%g mm for the shifted flame", i, ra[i].From, ra[i].To, rb[i].From, rb[i].To)
		}
	}
	if ox := ra[1]; !(ox.From < 0 && ox.To > 0) {
		t.Errorf("oxidation bar %g..%g mm does not straddle the peak at 0", ox.From, ox.To)
	}
	if ra[0].Label != "a" || ra[1].Label != "" {
		t.Errorf("labels %q, %q: want the group label on the first row only", ra[0].Label, ra[1].Label)
	}
}

func readFile(t *testing.T, path string) []byte {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if len(b) == 0 {
		t.Fatalf("%s is empty", path)
	}
	return b
}

func decodePNG(t *testing.T, path string) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if _, err := png.Decode(f); err != nil {
		t.Errorf("%s does not decode as PNG: %v", path, err)
	}
	if !strings.HasSuffix(path, ".png") {
		t.Errorf("%s: not a .png name", path)
	}
}

// BenchmarkFlamePlot draws the flame plot of a 161-point flame in both
// formats (what every `flame1d run` adds to the solve).
func BenchmarkFlamePlot(b *testing.B) {
	p, z := syntheticFlame(b, 0.01, 1e-4, 0)
	dir := b.TempDir()
	c := Chart{Title: "bench"}
	for b.Loop() {
		for _, ext := range []string{".svg", ".png"} {
			if err := FlamePlot(filepath.Join(dir, "flame"+ext), c, p, z); err != nil {
				b.Fatal(err)
			}
		}
	}
}
