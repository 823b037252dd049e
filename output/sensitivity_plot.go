package output

import (
	"fmt"
	"image/color"
	"math"
	"slices"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"flame1d/sensitivity"
)

// SensitivityBars writes a horizontal bar chart of the n largest
// coefficients of an analysis to path (format by extension), largest at
// the top, positive bars (faster flame) in blue and negative bars in red,
// as the x-axis label says (no legend column: the labels need the width).
func SensitivityBars(path string, c Chart, a *sensitivity.Analysis, n int) error {
	top := a.Top(n)
	if len(top) == 0 {
		return fmt.Errorf("sensitivity chart %s: no coefficients", path)
	}
	m := len(top)
	pos, neg := make(plotter.Values, m), make(plotter.Values, m)
	labels := make([]string, m)
	for i, co := range top {
		if math.IsNaN(co.Value) || math.IsInf(co.Value, 0) {
			return fmt.Errorf("sensitivity chart %s: coefficient of %s is not finite", path, co.Parameter)
		}
		// Bars are drawn bottom-up; the largest goes on top.
		r := m - 1 - i
		if co.Value >= 0 {
			pos[r] = co.Value
		} else {
			neg[r] = co.Value
		}
		labels[r] = coefficientLabel(co)
	}
	p := plot.New()
	p.X.Tick.Marker = niceTicks{}
	width := vg.Points(math.Min(14, 220/float64(m)))
	for _, s := range []struct {
		v   plotter.Values
		col color.Color
	}{{pos, SeriesColor(0)}, {neg, SeriesColor(3)}} {
		bc, err := plotter.NewBarChart(s.v, width)
		if err != nil {
			return fmt.Errorf("sensitivity chart %s: %w", path, err)
		}
		bc.Horizontal = true
		bc.Color = s.col
		bc.LineStyle.Width = 0
		p.Add(bc)
	}
	if c.XLabel == "" {
		c.XLabel = "d ln S_L / d ln p   (blue: speeds the flame; red: slows it)"
	}
	p.X.Label.Text = c.XLabel
	p.NominalY(labels...)
	// A margin beyond the longest bar on either side.
	lo, hi := math.Min(0, slices.Min(neg)), math.Max(0, slices.Max(pos))
	span := hi - lo
	p.X.Min, p.X.Max = lo-0.05*span, hi+0.05*span
	p.Add(plotter.NewGrid())
	if c.Height == 0 {
		c.Height = vg.Length(m)*0.55*vg.Centimeter + 4*vg.Centimeter
	}
	if c.Width == 0 {
		c.Width = 20 * vg.Centimeter
	}
	return writeFigure(path, c, []figurePanel{newFigurePanel(p, 1)}, nil)
}

// coefficientLabel names a coefficient on the chart axis.
func coefficientLabel(c sensitivity.Coefficient) string {
	switch c.Kind {
	case sensitivity.RateConstant:
		return Shorten(fmt.Sprintf("R%d %s", c.Reaction, c.Parameter), maxLabelWidth)
	case sensitivity.ActivationEnergy:
		return Shorten(fmt.Sprintf("E of R%d %s", c.Reaction, c.Parameter), maxLabelWidth)
	default:
		return Shorten(fmt.Sprintf("%s %s", c.Kind, c.Parameter), maxLabelWidth)
	}
}

// maxLabelWidth is the longest axis label of the sensitivity chart, in
// characters (a global cracking step lists its whole pool).
const maxLabelWidth = 40

// Shorten cuts s to at most width characters, marking the cut with "...".
func Shorten(s string, width int) string {
	r := []rune(s)
	if len(r) <= width {
		return s
	}
	return string(r[:width-3]) + "..."
}
