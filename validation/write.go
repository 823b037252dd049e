package validation

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"path/filepath"
	"sort"
	"strings"

	"gonum.org/v1/plot/vg"

	"flame1d/output"
)

// Output files written into the scorecard's folder.
const (
	PointsName  = "scorecard.csv"         // one row per measured point
	SummaryName = "scorecard-summary.csv" // one row per fuel and overall
)

// PlotName is the chart of one fuel ("S_L-<fuel>.png" and .svg).
func PlotName(fuel, ext string) string { return "S_L-" + safeName(fuel) + ext }

// safeName keeps letters, digits, '-', '_' and '.' (not leading) of a
// fuel key, so that it can only name a file in the output folder.
func safeName(s string) string {
	b := []byte(s)
	for i, c := range b {
		ok := c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '-' || c == '_' || c == '.' && i > 0
		if !ok {
			b[i] = '_'
		}
	}
	if len(b) == 0 {
		return "_"
	}
	return string(b)
}

// comments head every CSV file.
func (sc *Scorecard) comments() []string {
	return []string{
		"flame1d validation scorecard: laminar flame speeds in air, mechanism " + sc.Mechanism,
		"deviation = (predicted - measured)/measured; outside_band = distance beyond the measured band relative to the band edge (0 inside)",
		"measured values are recalled from the cited publications (from memory): see validation/data/README.md",
		output.SafetyNote,
	}
}

// WriteFiles writes the point table, the summary table and one chart per
// fuel (PNG and SVG; measurements only where no point was solved) into dir, each file atomically.
func (sc *Scorecard) WriteFiles(dir string) error {
	if err := writeRows(filepath.Join(dir, PointsName), sc.comments(), sc.PointRows()); err != nil {
		return err
	}
	if err := writeRows(filepath.Join(dir, SummaryName), sc.comments(), sc.SummaryRows()); err != nil {
		return err
	}
	return sc.writePlots(dir)
}

func writeRows(path string, comments []string, rows [][]string) error {
	return output.WriteFileAtomic(path, func(w io.Writer) error {
		for _, c := range comments {
			if _, err := fmt.Fprintf(w, "# %s\n", c); err != nil {
				return err
			}
		}
		cw := csv.NewWriter(w)
		if err := cw.WriteAll(rows); err != nil {
			return err
		}
		return cw.Error()
	})
}

// PointRows lays out every measured point with its prediction; points not
// solved have empty numeric prediction fields and the reason.
func (sc *Scorecard) PointRows() [][]string {
	f := output.FormatFloat
	rows := [][]string{{"fuel", "equivalence_ratio [-]", "T_unburned [K]", "pressure [Pa]", "S_L_measured [m/s]", "band_low [m/s]", "band_high [m/s]",
		"S_L_predicted [m/s]", "deviation [-]", "outside_band [-]", "status", "newton_iterations", "wall_time [s]", "sources", "reason"}}
	for _, o := range sc.Outcomes {
		pred, dev, out, iters, wall := "", "", "", "", ""
		if o.Status == Solved {
			pred, dev, out = f(o.Predicted), f(o.Deviation), f(o.OutsideBand)
			iters, wall = fmt.Sprint(o.NewtonIterations), f(o.WallTime)
		}
		rows = append(rows, []string{o.Fuel, f(o.Phi), f(o.T), f(o.P), f(o.Speed), f(o.Low), f(o.High), pred, dev, out,
			string(o.Status), iters, wall, strings.Join(o.Sources, " "), o.Reason})
	}
	return rows
}

// SummaryRows lays out the score of each fuel and the overall one.
func (sc *Scorecard) SummaryRows() [][]string {
	f := output.FormatFloat
	rows := [][]string{{"fuel", "points", "solved", "failed", "not_represented", "within_band", "rms_deviation [-]",
		"worst_deviation [-]", "worst_at", "worst_outside_band [-]", "worst_outside_at"}}
	for _, s := range append(append([]Score(nil), sc.Fuels...), sc.Overall) {
		row := []string{s.Fuel, fmt.Sprint(s.Points), fmt.Sprint(s.Solved), fmt.Sprint(s.Failed), fmt.Sprint(s.NotRepresented), fmt.Sprint(s.WithinBand), "", "", "", "", ""}
		if s.Solved > 0 {
			row[6], row[7], row[8] = f(s.RMS), f(s.Worst.Deviation), s.Worst.where()
			row[9], row[10] = f(s.WorstOutside.OutsideBand), s.WorstOutside.where()
		}
		rows = append(rows, row)
	}
	return rows
}

func (o *Outcome) where() string {
	return fmt.Sprintf("%s phi %g, %s", o.Fuel, o.Phi, Conditions(o.T, o.P))
}

// writePlots draws one chart per fuel: S_L against phi, each series
// (temperature and pressure) in its own colour, the measurements as
// markers with their scatter band as a bar, the predictions as a line with
// a marker on each computed point.
func (sc *Scorecard) writePlots(dir string) error {
	for _, score := range sc.Fuels {
		type key struct{ T, P float64 }
		var order []key
		meas := map[key]*output.Series{}
		pred := map[key]*output.Series{}
		for i := range sc.Outcomes {
			o := &sc.Outcomes[i]
			if o.Fuel != score.Fuel {
				continue
			}
			k := key{o.T, o.P}
			if meas[k] == nil {
				clr := output.SeriesColor(len(order))
				order = append(order, k)
				label := Conditions(o.T, o.P)
				meas[k] = &output.Series{Name: "measured, " + label, Color: clr, NoLine: true}
				pred[k] = &output.Series{Name: "predicted, " + label, Color: clr}
			}
			m := meas[k]
			m.X, m.Y = append(m.X, o.Phi), append(m.Y, 100*o.Speed)
			m.YLow, m.YHigh = append(m.YLow, 100*o.Low), append(m.YHigh, 100*o.High)
			if o.Status == Solved {
				pred[k].X, pred[k].Y = append(pred[k].X, o.Phi), append(pred[k].Y, 100*o.Predicted)
			}
		}
		var series []output.Series
		for _, k := range order {
			series = append(series, *meas[k])
		}
		for _, k := range order {
			if p := *pred[k]; len(p.X) > 0 {
				sortXY(p.X, p.Y)
				series = append(series, p)
			}
		}
		chart := output.Chart{Title: fmt.Sprintf("%s/air laminar flame speed", score.Fuel),
			Note:   fmt.Sprintf("predicted on %s; bars: measured scatter band", sc.Mechanism),
			XLabel: "equivalence ratio [-]", YLabel: "S_L [cm/s]",
			Width: 24 * vg.Centimeter, Height: 12 * vg.Centimeter}
		if score.Solved == 0 {
			chart.Note = fmt.Sprintf("no point solved on %s; bars: measured scatter band", sc.Mechanism)
		}
		for _, ext := range []string{".png", ".svg"} {
			if err := output.Lines(filepath.Join(dir, PlotName(score.Fuel, ext)), chart, series); err != nil {
				return err
			}
		}
	}
	return nil
}

func sortXY(x, y []float64) {
	idx := make([]int, len(x))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return x[idx[a]] < x[idx[b]] })
	xs, ys := append([]float64(nil), x...), append([]float64(nil), y...)
	for i, j := range idx {
		x[i], y[i] = xs[j], ys[j]
	}
}

// jsonOutcome and jsonScore are the JSON layout (units in the names).
type jsonOutcome struct {
	Fuel        string    `json:"fuel"`
	Phi         float64   `json:"equivalence_ratio"`
	T           float64   `json:"unburned_temperature_K"`
	P           float64   `json:"pressure_Pa"`
	Measured    float64   `json:"measured_m_s"`
	Band        []float64 `json:"band_m_s"`
	Sources     []string  `json:"sources"`
	Status      Status    `json:"status"`
	Reason      string    `json:"reason,omitempty"`
	Predicted   *float64  `json:"predicted_m_s,omitempty"`
	Deviation   *float64  `json:"deviation,omitempty"`
	OutsideBand *float64  `json:"outside_band,omitempty"`
	Warnings    []string  `json:"validity_warnings,omitempty"`
}

type jsonScore struct {
	Fuel           string   `json:"fuel"`
	Points         int      `json:"points"`
	Solved         int      `json:"solved"`
	Failed         int      `json:"failed"`
	NotRepresented int      `json:"not_represented"`
	WithinBand     int      `json:"within_band"`
	RMS            *float64 `json:"rms_deviation,omitempty"`
	Worst          *float64 `json:"worst_deviation,omitempty"`
	WorstAt        string   `json:"worst_at,omitempty"`
	WorstOutside   *float64 `json:"worst_outside_band,omitempty"`
	WorstOutsideAt string   `json:"worst_outside_at,omitempty"`
}

// WriteJSON writes the scorecard as one JSON document.
func (sc *Scorecard) WriteJSON(w io.Writer) error {
	doc := struct {
		Mechanism string        `json:"mechanism"`
		Note      string        `json:"note"`
		Overall   jsonScore     `json:"overall"`
		Fuels     []jsonScore   `json:"fuels"`
		Points    []jsonOutcome `json:"points"`
	}{Mechanism: sc.Mechanism, Note: output.SafetyNote, Overall: sc.Overall.json()}
	for _, s := range sc.Fuels {
		doc.Fuels = append(doc.Fuels, s.json())
	}
	for _, o := range sc.Outcomes {
		j := jsonOutcome{Fuel: o.Fuel, Phi: o.Phi, T: o.T, P: o.P, Measured: o.Speed, Band: []float64{o.Low, o.High},
			Sources: o.Sources, Status: o.Status, Reason: o.Reason, Warnings: o.Warnings}
		if o.Status == Solved {
			j.Predicted, j.Deviation, j.OutsideBand = ptr(o.Predicted), ptr(o.Deviation), ptr(o.OutsideBand)
		}
		doc.Points = append(doc.Points, j)
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}

func (s Score) json() jsonScore {
	j := jsonScore{Fuel: s.Fuel, Points: s.Points, Solved: s.Solved, Failed: s.Failed, NotRepresented: s.NotRepresented, WithinBand: s.WithinBand}
	if s.Solved > 0 {
		j.RMS, j.Worst, j.WorstAt = ptr(s.RMS), ptr(s.Worst.Deviation), s.Worst.where()
		j.WorstOutside, j.WorstOutsideAt = ptr(s.WorstOutside.OutsideBand), s.WorstOutside.where()
	}
	return j
}

func ptr(v float64) *float64 { return &v }
