package output

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Series is one named set of values: one stack layer of a stacked bar
// chart (one value per category) or one curve of a line chart (Y against
// X).
type Series struct {
	Name string
	X    []float64 // line charts only
	Y    []float64
}

// Chart holds the labels and size common to every chart.
type Chart struct {
	Title  string
	XLabel string
	YLabel string
	// Width and Height of the drawing; zero means 16 cm × 10 cm.
	Width, Height vg.Length
	// Note is a line of small text under the title (e.g. the model-
	// prediction note).
	Note string
}

// palette is a qualitative colour set of twelve distinguishable hues;
// series beyond twelve repeat it.
var palette = []color.RGBA{
	{31, 119, 180, 255}, {255, 127, 14, 255}, {44, 160, 44, 255}, {214, 39, 40, 255},
	{148, 103, 189, 255}, {140, 86, 75, 255}, {227, 119, 194, 255}, {188, 189, 34, 255},
	{23, 190, 207, 255}, {174, 199, 232, 255}, {255, 187, 120, 255}, {152, 223, 138, 255},
}

// SeriesColor returns the colour of series i.
func SeriesColor(i int) color.Color { return palette[i%len(palette)] }

// StackedBars writes a stacked bar chart to path, one bar per category,
// the series stacked in order from the bottom, in the format named by the
// extension (.svg, .png, .pdf, .eps, .jpg, .tif). It refuses non-finite or
// negative values and series of the wrong length. The file is written
// atomically.
func StackedBars(path string, c Chart, categories []string, series []Series) error {
	if len(categories) == 0 || len(series) == 0 {
		return fmt.Errorf("stacked bars %s: no categories or no series", path)
	}
	for _, s := range series {
		if len(s.Y) != len(categories) {
			return fmt.Errorf("stacked bars %s: series %q has %d values for %d categories", path, s.Name, len(s.Y), len(categories))
		}
		for i, v := range s.Y {
			if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
				return fmt.Errorf("stacked bars %s: series %q, category %q: value %g is not a finite non-negative number", path, s.Name, categories[i], v)
			}
		}
	}
	p := newPlot(c)
	width := vg.Points(math.Min(40, 300/float64(len(categories))))
	var below *plotter.BarChart
	bars := make([]*plotter.BarChart, len(series))
	for i, s := range series {
		bc, err := plotter.NewBarChart(plotter.Values(s.Y), width)
		if err != nil {
			return fmt.Errorf("stacked bars %s: %w", path, err)
		}
		bc.Color = SeriesColor(i)
		bc.LineStyle.Width = vg.Points(0.3)
		if below != nil {
			bc.StackOn(below)
		}
		below = bc
		bars[i] = bc
		p.Add(bc)
	}
	// The legend lists the layers top-down, as they are stacked.
	leg := plot.NewLegend()
	for i := len(series) - 1; i >= 0; i-- {
		leg.Add(series[i].Name, bars[i])
	}
	p.NominalX(categories...)
	p.X.Tick.Label.Rotation = math.Pi / 6
	p.X.Tick.Label.XAlign = draw.XRight
	p.X.Tick.Label.YAlign = draw.YCenter
	p.Y.Min = 0
	return save(p, &leg, seriesNames(series), c, path)
}

// Lines writes a line chart of the series (Y against X) to path, in the
// format named by the extension, atomically. It refuses non-finite values
// and X/Y of different lengths.
func Lines(path string, c Chart, series []Series) error {
	if len(series) == 0 {
		return fmt.Errorf("line chart %s: no series", path)
	}
	p := newPlot(c)
	leg := plot.NewLegend()
	for i, s := range series {
		if len(s.X) != len(s.Y) || len(s.X) == 0 {
			return fmt.Errorf("line chart %s: series %q has %d x and %d y values", path, s.Name, len(s.X), len(s.Y))
		}
		xy := make(plotter.XYs, len(s.X))
		for j := range s.X {
			if math.IsNaN(s.X[j]) || math.IsInf(s.X[j], 0) || math.IsNaN(s.Y[j]) || math.IsInf(s.Y[j], 0) {
				return fmt.Errorf("line chart %s: series %q, point %d is not finite", path, s.Name, j+1)
			}
			xy[j].X, xy[j].Y = s.X[j], s.Y[j]
		}
		l, err := plotter.NewLine(xy)
		if err != nil {
			return fmt.Errorf("line chart %s: %w", path, err)
		}
		l.Color = SeriesColor(i)
		l.Width = vg.Points(1.2)
		p.Add(l)
		leg.Add(s.Name, l)
	}
	p.Add(plotter.NewGrid())
	return save(p, &leg, seriesNames(series), c, path)
}

func newPlot(c Chart) *plot.Plot {
	p := plot.New()
	p.Title.Text = c.Title
	if c.Note != "" {
		p.Title.Text += "\n" + c.Note
	}
	p.X.Label.Text = c.XLabel
	p.Y.Label.Text = c.YLabel
	return p
}

// save draws the plot with its legend in a column to the right of the
// axes, so that the legend never hides data, and writes the drawing
// atomically in the format named by the extension of path.
func save(p *plot.Plot, leg *plot.Legend, names []string, c Chart, path string) error {
	w, h := c.Width, c.Height
	if w == 0 {
		w = 16 * vg.Centimeter
	}
	if h == 0 {
		h = 10 * vg.Centimeter
	}
	format := strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), ".")
	cw, err := draw.NewFormattedCanvas(w, h, format)
	if err != nil {
		return fmt.Errorf("chart %s: %w", path, err)
	}
	dc := draw.New(cw)
	pad := vg.Points(6)
	legW := vg.Length(0)
	for _, name := range names {
		legW = max(legW, leg.ThumbnailWidth+leg.TextStyle.Rectangle(" "+name).Max.X)
	}
	if legW > w/2 {
		legW = w / 2
	}
	leg.Left, leg.Top = true, true
	p.Draw(draw.Crop(dc, 0, -(legW + 2*pad), 0, 0))
	leg.Draw(draw.Crop(dc, w-legW-pad, -pad, 0, -pad))
	return WriteFileAtomic(path, func(out io.Writer) error {
		_, err := cw.WriteTo(out)
		return err
	})
}

func seriesNames(series []Series) []string {
	names := make([]string, len(series))
	for i, s := range series {
		names[i] = s.Name
	}
	return names
}
