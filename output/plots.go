package output

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

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
			if !finite(v) || v < 0 {
				return fmt.Errorf("stacked bars %s: series %q, category %q: value %g is not a finite non-negative number", path, s.Name, categories[i], v)
			}
		}
	}
	p := plot.New()
	p.Y.Label.Text = c.YLabel
	p.X.Label.Text = c.XLabel
	fp := newFigurePanel(p, 1)
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
	for i := len(series) - 1; i >= 0; i-- {
		fp.legend.Add(series[i].Name, bars[i])
		fp.names = append(fp.names, series[i].Name)
	}
	p.NominalX(categories...)
	p.X.Tick.Label.Rotation = math.Pi / 6
	p.X.Tick.Label.XAlign = draw.XRight
	p.X.Tick.Label.YAlign = draw.YCenter
	p.Y.Min = 0
	p.Y.Tick.Marker = niceTicks{}
	return writeFigure(path, c, []figurePanel{fp}, nil)
}
