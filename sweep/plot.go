package sweep

import (
	"fmt"
	"path/filepath"
	"sort"
	"strings"

	"gonum.org/v1/plot/vg"

	"flame1d/output"
	"flame1d/study"
)

// PlotName returns the base name (without extension) of the plot of S_L
// against a variable.
func PlotName(v Variable) string { return "S_L-vs-" + v.Key() }

// plotFormats are the image formats written for each plot.
var plotFormats = []string{"svg", "png"}

// writePlots draws S_L against every variable that takes more than one
// value: one line per combination of the other variables, a marker on
// every solved point. Failed and pending points are left out and break the
// line, so no value is drawn across a gap. Variables without any solved
// point get no plot.
func writePlots(dir, title string, plan *Plan, points []int, recs map[int]*Record) error {
	values := [3][]float64{plan.Definition.EquivalenceRatios, plan.Definition.TemperaturesK, plan.Definition.PressuresPa}
	for v := EquivalenceRatio; v <= Pressure; v++ {
		if len(values[v]) < 2 {
			continue
		}
		series := speedSeries(v, values, plan, points, recs)
		if len(series) == 0 {
			continue
		}
		chart := output.Chart{Title: "Laminar flame speed against " + strings.ReplaceAll(v.Key(), "_", " "), Note: title,
			XLabel: plotLabel(v), YLabel: "S_L [m/s]", YFromZero: true, Width: 6 * vg.Inch, Height: 4 * vg.Inch}
		for _, format := range plotFormats {
			if err := output.Lines(filepath.Join(dir, PlotName(v)+"."+format), chart, series); err != nil {
				return fmt.Errorf("plot of S_L against %s: %w", v.Key(), err)
			}
		}
	}
	return nil
}

// plotValue is a variable's value on the plot axis: pressure in atm (the
// unit of the group labels), the others as they are.
func plotValue(v Variable, c study.Condition) float64 {
	if v == Pressure {
		return c.P / 101325
	}
	return v.of(c)
}

func plotLabel(v Variable) string {
	if v == Pressure {
		return "pressure [atm]"
	}
	return v.Label()
}

// speedSeries gives one series per combination of the other variables,
// ascending in v, broken where a point is not solved.
func speedSeries(v Variable, values [3][]float64, plan *Plan, points []int, recs map[int]*Record) []output.Series {
	groups := map[string][]int{}
	var order []string
	for _, i := range points {
		label := groupLabel(v, plan.Points[i].Condition, values)
		if _, ok := groups[label]; !ok {
			order = append(order, label)
		}
		groups[label] = append(groups[label], i)
	}
	var series []output.Series
	for _, label := range order {
		pts := groups[label]
		sort.Slice(pts, func(a, b int) bool {
			return v.of(plan.Points[pts[a]].Condition) < v.of(plan.Points[pts[b]].Condition)
		})
		s := output.Series{Name: label}
		for _, i := range pts {
			r := recs[i]
			if r == nil || r.Status != Solved {
				s.Break()
				continue
			}
			s.X = append(s.X, plotValue(v, plan.Points[i].Condition))
			s.Y = append(s.Y, r.FlameSpeed)
			// The 1σ rate-constant band, when the sweep computed it.
			s.YErr = append(s.YErr, r.FlameSpeedSigma)
		}
		if len(s.X) > 0 {
			series = append(series, s)
		}
	}
	return series
}

// groupLabel names the values of the other swept variables, e.g.
// "T_u = 298 K, P = 5 atm"; variables that take one value are left out.
func groupLabel(v Variable, c study.Condition, values [3][]float64) string {
	var parts []string
	if v != EquivalenceRatio && len(values[EquivalenceRatio]) > 1 {
		parts = append(parts, fmt.Sprintf("phi = %.4g", c.Phi))
	}
	if v != Temperature && len(values[Temperature]) > 1 {
		parts = append(parts, fmt.Sprintf("T_u = %.4g K", c.T))
	}
	if v != Pressure && len(values[Pressure]) > 1 {
		parts = append(parts, fmt.Sprintf("P = %.4g atm", c.P/101325))
	}
	return strings.Join(parts, ", ")
}
