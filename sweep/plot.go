package sweep

import (
	"fmt"
	"io"
	"path/filepath"
	"sort"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
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
// value: one line per combination of the other variables. Failed and
// pending points are left out and break the line, so no value is drawn
// across a gap. Variables without any solved point get no plot.
func writePlots(dir, title string, plan *Plan, points []int, recs map[int]*Record) error {
	values := [3][]float64{plan.Definition.EquivalenceRatios, plan.Definition.TemperaturesK, plan.Definition.PressuresPa}
	for v := EquivalenceRatio; v <= Pressure; v++ {
		if len(values[v]) < 2 {
			continue
		}
		p, drawn, err := speedPlot(v, title, values, plan, points, recs)
		if err != nil {
			return err
		}
		if !drawn {
			continue
		}
		for _, format := range plotFormats {
			wt, err := p.WriterTo(6*vg.Inch, 4*vg.Inch, format)
			if err != nil {
				return fmt.Errorf("plot of S_L against %s: %w", v.Key(), err)
			}
			path := filepath.Join(dir, PlotName(v)+"."+format)
			if err := output.WriteFileAtomic(path, func(w io.Writer) error {
				_, err := wt.WriteTo(w)
				return err
			}); err != nil {
				return err
			}
		}
	}
	return nil
}

func speedPlot(v Variable, title string, values [3][]float64, plan *Plan, points []int, recs map[int]*Record) (*plot.Plot, bool, error) {
	type series struct {
		label string
		pts   []int // point indices, ascending in v
	}
	groups := map[string]*series{}
	var order []string
	for _, i := range points {
		c := plan.Points[i].Condition
		label := groupLabel(v, c, values)
		g, ok := groups[label]
		if !ok {
			g = &series{label: label}
			groups[label] = g
			order = append(order, label)
		}
		g.pts = append(g.pts, i)
	}
	p := plot.New()
	p.Title.Text = "Laminar flame speed against " + strings.ReplaceAll(v.Key(), "_", " ")
	if title != "" {
		p.Title.Text = title + "\n" + p.Title.Text
	}
	p.X.Label.Text = v.Label()
	p.Y.Label.Text = "S_L [m/s]"
	p.Y.Min = 0
	p.Add(plotter.NewGrid())
	drawn := false
	for k, label := range order {
		g := groups[label]
		sort.Slice(g.pts, func(a, b int) bool {
			return v.of(plan.Points[g.pts[a]].Condition) < v.of(plan.Points[g.pts[b]].Condition)
		})
		var all plotter.XYs
		var segment plotter.XYs
		flush := func() error {
			if len(segment) > 1 {
				l, err := plotter.NewLine(segment)
				if err != nil {
					return err
				}
				l.Color = plotutil.Color(k)
				p.Add(l)
			}
			segment = nil
			return nil
		}
		for _, i := range g.pts {
			r := recs[i]
			if r == nil || r.Status != Solved {
				if err := flush(); err != nil {
					return nil, false, err
				}
				continue
			}
			xy := plotter.XY{X: v.of(plan.Points[i].Condition), Y: r.FlameSpeed}
			segment = append(segment, xy)
			all = append(all, xy)
		}
		if err := flush(); err != nil {
			return nil, false, err
		}
		if len(all) == 0 {
			continue
		}
		s, err := plotter.NewScatter(all)
		if err != nil {
			return nil, false, err
		}
		s.Color = plotutil.Color(k)
		s.Shape = plotutil.Shape(k)
		p.Add(s)
		if label != "" {
			p.Legend.Add(label, s)
		}
		drawn = true
	}
	p.Legend.Top = true
	return p, drawn, nil
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
