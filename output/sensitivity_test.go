package output

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/plot/plotter"

	"flame1d/sensitivity"
)

func testAnalysis() *sensitivity.Analysis {
	return &sensitivity.Analysis{FlameSpeed: 0.36, Sigma: 0.021, Coefficients: []sensitivity.Coefficient{
		{Kind: sensitivity.RateConstant, Parameter: "H+O2<=>O+OH", Reaction: 38, Value: 0.57, UncertaintyFactor: 1.5},
		{Kind: sensitivity.Diffusion, Parameter: "H", Value: 0.15},
		{Kind: sensitivity.RateConstant, Parameter: "H+CH3(+M)<=>CH4(+M)", Reaction: 52, Value: -0.17, UncertaintyFactor: 2},
	}}
}

// The bar chart names every coefficient (largest on top) and the CSV holds
// the band line, empty factor cells for non-reaction parameters and the
// reaction's share S_L |S| ln(f)/2 = 0.36 × 0.57 × ln(1.5)/2 = 0.041602...
func TestSensitivityOutputs(t *testing.T) {
	dir := t.TempDir()
	a := testAnalysis()
	svg := filepath.Join(dir, "s.svg")
	if err := SensitivityBars(svg, Chart{Title: "test"}, a, 20); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(svg)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"R38 H+O2&lt;=&gt;O+OH", "diffusion coefficient H", "R52"} {
		if !bytes.Contains(b, []byte(want)) {
			t.Errorf("SVG lacks %q", want)
		}
	}
	var buf bytes.Buffer
	if err := WriteSensitivityCSV(&buf, a, []string{"c"}); err != nil {
		t.Fatal(err)
	}
	text := buf.String()
	for _, want := range []string{"# S_L = 0.360 ± 0.021 m/s (1σ, rate constants)", "2,diffusion coefficient,,H,0.15,,\n", "1,rate constant,38,H+O2<=>O+OH,0.57,1.5,0.0416"} {
		if !strings.Contains(text, want) {
			t.Errorf("CSV lacks %q:\n%s", want, text)
		}
	}
	a.Coefficients[1].Value = math.NaN()
	if err := WriteSensitivityCSV(&buf, a, nil); err == nil {
		t.Error("NaN coefficient written")
	}
}

func TestErrorBarsRefuseBadValues(t *testing.T) {
	xy := plotter.XYs{{X: 1, Y: 1}, {X: 2, Y: 2}}
	for _, e := range [][]float64{{0.1}, {0.1, -1}, {math.NaN(), 0}} {
		if _, err := errorBars(xy, e, SeriesColor(0)); err == nil {
			t.Errorf("error bars %v accepted", e)
		}
	}
	if eb, err := errorBars(xy, []float64{0, 0}, SeriesColor(0)); eb != nil || err != nil {
		t.Errorf("all-zero bars: %v, %v; want none", eb, err)
	}
}
