package output

import (
	"bytes"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestStackedBars(t *testing.T) {
	dir := t.TempDir()
	cats := []string{"all", "no graphite", "no aromatics"}
	series := []Series{
		{Name: "graphite", Y: []float64{0.94, 0, 0}},
		{Name: "pyrene", Y: []float64{0, 0.70, 0}},
		{Name: "methane", Y: []float64{0.06, 0.30, 1}},
	}
	c := Chart{Title: "carbon share", YLabel: "share of fuel carbon [-]", Width: 400, Height: 300}
	svg := filepath.Join(dir, "bars.svg")
	pngPath := filepath.Join(dir, "bars.png")
	for _, p := range []string{svg, pngPath} {
		if err := StackedBars(p, c, cats, series); err != nil {
			t.Fatal(err)
		}
	}
	b, err := os.ReadFile(svg)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"<svg", "graphite", "pyrene", "methane", "no aromatics", "carbon share"} {
		if !bytes.Contains(b, []byte(want)) {
			t.Errorf("SVG lacks %q", want)
		}
	}
	f, err := os.Open(pngPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("PNG does not decode: %v", err)
	}
	// 400 × 300 points at 150 dpi: 833 × 625 pixels.
	if r := img.Bounds(); r.Dx() != 833 || r.Dy() != 625 {
		t.Errorf("PNG is %d × %d pixels, want 833 × 625", r.Dx(), r.Dy())
	}
	// No temporary files are left behind.
	entries, _ := os.ReadDir(dir)
	if len(entries) != 2 {
		t.Errorf("folder holds %d files, want the 2 charts", len(entries))
	}
}

func TestChartsRefuseBadData(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		name string
		run  func(path string) error
		want string
	}{
		{"short series", func(p string) error {
			return StackedBars(p, Chart{}, []string{"a", "b"}, []Series{{Name: "x", Y: []float64{1}}})
		}, "has 1 values for 2 categories"},
		{"NaN bar", func(p string) error {
			return StackedBars(p, Chart{}, []string{"a"}, []Series{{Name: "x", Y: []float64{nan()}}})
		}, "not a finite non-negative number"},
		{"NaN line", func(p string) error {
			return Lines(p, Chart{}, []Series{{Name: "x", X: []float64{0, 1}, Y: []float64{0, nan()}}})
		}, "not finite"},
		{"NaN bar end", func(p string) error {
			return StackedPanels(p, Chart{}, []Panel{{Rows: []BarRow{{Label: "fuel", From: 0, To: nan()}}}})
		}, "not finite"},
		{"empty panel", func(p string) error {
			return StackedPanels(p, Chart{}, []Panel{{YLabel: "T [K]"}})
		}, "neither curves nor bars"},
		{"unknown format", func(p string) error {
			return Lines(p+".xyz", Chart{}, []Series{{Name: "x", X: []float64{0, 1}, Y: []float64{0, 1}}})
		}, "chart"},
	} {
		path := filepath.Join(dir, "c.svg")
		err := c.run(path)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want %q", c.name, err, c.want)
		}
		if _, statErr := os.Stat(path); statErr == nil {
			t.Errorf("%s: a refused chart left a file", c.name)
		}
	}
}

func TestLines(t *testing.T) {
	path := filepath.Join(t.TempDir(), "l.svg")
	err := Lines(path, Chart{Title: "T", XLabel: "x [m]", YLabel: "T [K]"}, []Series{
		{Name: "flame A", X: []float64{0, 1, 2}, Y: []float64{300, 1500, 2100}},
		{Name: "flame B", X: []float64{0, 1, 2}, Y: []float64{300, 1200, 1900}},
	})
	if err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(path)
	if !bytes.Contains(b, []byte("flame B")) || !bytes.Contains(b, []byte("x [m]")) {
		t.Error("SVG lacks the legend or the axis label")
	}
}

func nan() float64 { var z float64; return z / z }

// A failed point breaks the line once, however many failures follow; a
// failure before the first solved point breaks nothing.
func TestSeriesBreak(t *testing.T) {
	var s Series
	s.Break()
	for _, p := range []struct {
		x      float64
		solved bool
	}{{0.6, true}, {0.7, true}, {0.8, false}, {0.9, false}, {1.0, true}, {1.1, false}, {1.2, true}} {
		if !p.solved {
			s.Break()
			continue
		}
		s.X, s.Y = append(s.X, p.x), append(s.Y, 1)
	}
	if want := []int{2, 3}; len(s.Breaks) != 2 || s.Breaks[0] != want[0] || s.Breaks[1] != want[1] {
		t.Errorf("breaks %v, want %v", s.Breaks, want)
	}
	path := filepath.Join(plotDir(t), "lines-gap.png")
	s.Name = "T_u = 298 K"
	c := Chart{Title: "Laminar flame speed against equivalence ratio", XLabel: "equivalence ratio [-]", YLabel: "S_L [m/s]", YFromZero: true}
	if err := Lines(path, c, []Series{s, {Name: "T_u = 400 K", X: []float64{0.6, 0.8, 1.0, 1.2}, Y: []float64{0.3, 0.6, 0.7, 0.6}}}); err != nil {
		t.Fatal(err)
	}
	decodePNG(t, path)
}

// A comparison at one equivalence ratio has one point per fuel: the axis
// spans ±10% around it instead of collapsing (gonum would draw 0 to 1 with
// the points on the frame).
func TestOnePointChart(t *testing.T) {
	path := filepath.Join(plotDir(t), "one-point.svg")
	c := Chart{Title: "Laminar flame speed", XLabel: "equivalence ratio φ [-]", YLabel: "S_L [m/s]", YFromZero: true}
	if err := Lines(path, c, []Series{{Name: "A", X: []float64{1}, Y: []float64{0.36}}, {Name: "B", X: []float64{1}, Y: []float64{0.37}}}); err != nil {
		t.Fatal(err)
	}
	if lo, hi := widen(1, 1, 0.03); lo != 0.9 || hi != 1.1 {
		t.Errorf("one-value range widened to %g..%g, want 0.9..1.1", lo, hi)
	}
	if err := Lines(strings.TrimSuffix(path, ".svg")+".png", c, []Series{{Name: "A", X: []float64{1}, Y: []float64{0.36}}}); err != nil {
		t.Fatal(err)
	}
}

// Axis ticks: three to seven labelled steps of 1, 2 or 5 × 10^n, minor ticks
// between them, no "-0" and no round-off in the labels.
func TestNiceTicks(t *testing.T) {
	for _, c := range []struct {
		lo, hi float64
		want   []string
	}{
		{0, 2.9, []string{"0", "0.5", "1.0", "1.5", "2.0", "2.5"}},
		{298, 2230, []string{"500", "1000", "1500", "2000"}},
		{-0.6, 0.1, []string{"-0.6", "-0.4", "-0.2", "0"}},
		{0, 9.5e-5, []string{"0", "2e-05", "4e-05", "6e-05", "8e-05"}},
		{5.2, 6.85, []string{"5.5", "6.0", "6.5"}},
		{400, 2100, []string{"500", "1000", "1500", "2000"}},
	} {
		var got []string
		for _, tk := range (niceTicks{}).Ticks(c.lo, c.hi) {
			if tk.Label != "" {
				got = append(got, tk.Label)
			}
		}
		if strings.Join(got, " ") != strings.Join(c.want, " ") {
			t.Errorf("ticks over %g..%g: %q, want %q", c.lo, c.hi, got, c.want)
		}
	}
}
