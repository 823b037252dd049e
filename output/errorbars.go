package output

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

// addErrorBars draws ±s.YErr at the points xy of a line series.
func addErrorBars(p *plot.Plot, xy plotter.XYs, s Series, col color.Color) error {
	if s.YErr == nil {
		return nil
	}
	if len(s.YErr) != len(xy) {
		return fmt.Errorf("series %q has %d error bars for %d points", s.Name, len(s.YErr), len(xy))
	}
	var pts plotter.XYs
	var errs plotter.YErrors
	for j, e := range s.YErr {
		if math.IsNaN(e) || math.IsInf(e, 0) || e < 0 {
			return fmt.Errorf("series %q, point %d: error bar %g is not a finite non-negative number", s.Name, j+1, e)
		}
		if e > 0 {
			pts = append(pts, xy[j])
			errs = append(errs, struct{ Low, High float64 }{e, e})
		}
	}
	if len(pts) == 0 {
		return nil
	}
	eb, err := plotter.NewYErrorBars(struct {
		plotter.XYs
		plotter.YErrors
	}{pts, errs})
	if err != nil {
		return err
	}
	eb.Color = col
	eb.Width = vg.Points(1)
	p.Add(eb)
	return nil
}
