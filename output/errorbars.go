package output

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

// errorBars returns symmetric vertical error bars of ±yerr[j] at the
// points xy (the 1σ band of S_L on flame-speed charts), nil when every
// yerr is zero. It refuses lengths that differ and values that are
// negative or not finite.
func errorBars(xy plotter.XYs, yerr []float64, col color.Color) (*plotter.YErrorBars, error) {
	if len(yerr) != len(xy) {
		return nil, fmt.Errorf("%d error bars for %d points", len(yerr), len(xy))
	}
	var pts plotter.XYs
	var errs plotter.YErrors
	for j, e := range yerr {
		if math.IsNaN(e) || math.IsInf(e, 0) || e < 0 {
			return nil, fmt.Errorf("point %d: error bar %g is not a finite non-negative number", j+1, e)
		}
		if e > 0 {
			pts = append(pts, xy[j])
			errs = append(errs, struct{ Low, High float64 }{e, e})
		}
	}
	if len(pts) == 0 {
		return nil, nil
	}
	eb, err := plotter.NewYErrorBars(struct {
		plotter.XYs
		plotter.YErrors
	}{pts, errs})
	if err != nil {
		return nil, err
	}
	eb.Color = col
	eb.Width = vg.Points(1)
	return eb, nil
}

// bandBars returns vertical bars from low[j] to high[j] at the points xy
// (measured scatter bands). It refuses lengths that differ and bands that
// are not finite or do not hold their point.
func bandBars(xy plotter.XYs, low, high []float64, col color.Color) (*plotter.YErrorBars, error) {
	if len(low) != len(xy) || len(high) != len(xy) {
		return nil, fmt.Errorf("%d low and %d high band ends for %d points", len(low), len(high), len(xy))
	}
	errs := make(plotter.YErrors, len(xy))
	for j := range xy {
		if !finite(low[j]) || !finite(high[j]) || low[j] > xy[j].Y || xy[j].Y > high[j] {
			return nil, fmt.Errorf("point %d: band %g-%g does not hold %g", j+1, low[j], high[j], xy[j].Y)
		}
		errs[j].Low, errs[j].High = xy[j].Y-low[j], high[j]-xy[j].Y
	}
	eb, err := plotter.NewYErrorBars(struct {
		plotter.XYs
		plotter.YErrors
	}{xy, errs})
	if err != nil {
		return nil, err
	}
	eb.Color = col
	eb.Width = vg.Points(1)
	eb.CapWidth = vg.Points(5)
	return eb, nil
}

// addErrorBars draws s.YErr, or the band s.YLow-s.YHigh, when given, at
// the points xy of a line series.
func addErrorBars(p *plot.Plot, xy plotter.XYs, s Series, col color.Color) error {
	if s.YLow != nil || s.YHigh != nil {
		eb, err := bandBars(xy, s.YLow, s.YHigh, col)
		if err != nil {
			return fmt.Errorf("series %q: %w", s.Name, err)
		}
		p.Add(eb)
		return nil
	}
	if s.YErr == nil {
		return nil
	}
	eb, err := errorBars(xy, s.YErr, col)
	if err != nil {
		return fmt.Errorf("series %q: %w", s.Name, err)
	}
	if eb != nil {
		p.Add(eb)
	}
	return nil
}
