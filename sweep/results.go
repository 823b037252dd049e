package sweep

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"flame1d/internal/infile"
	"flame1d/output"
	"flame1d/study"
)

// Columns of results.csv, in order. Conditions come first, then the
// outcome; failed and pending rows leave the number columns empty. Every
// column except ColWallTime is reproducible: a resumed, re-sharded or
// differently parallel run of the same sweep writes the same text.
const (
	ColID               = "id"
	ColPhi              = "equivalence_ratio [-]"
	ColT                = "T_u [K]"
	ColP                = "P [Pa]"
	ColStatus           = "status"
	ColFlameSpeed       = "S_L [m/s]"
	ColBurnedT          = "T_burned [K]"
	ColAdiabaticT       = "T_adiabatic [K]"
	ColThermalThickness = "thermal_thickness [m]"
	ColPeakHeatRelease  = "peak_heat_release_x [m]"
	ColGridPoints       = "grid_points [-]"
	ColContinuedFrom    = "continued_from"
	ColNewtonIterations = "newton_iterations [-]"
	ColWallTime         = "wall_time [s]"
	ColReason           = "reason"
	// ColFlameSpeedSigma is the 1σ band of S_L from the rate constants
	// (package sensitivity); empty unless the case enables [sensitivity].
	ColFlameSpeedSigma = "S_L_sigma_rate_constants [m/s]"
)

// Columns is the header of results.csv.
var Columns = []string{
	ColID, ColPhi, ColT, ColP, ColStatus,
	ColFlameSpeed, ColBurnedT, ColAdiabaticT, ColThermalThickness, ColPeakHeatRelease, ColGridPoints,
	ColContinuedFrom, ColNewtonIterations, ColWallTime, ColReason, ColFlameSpeedSigma,
}

// ResultsName is the results table's file name in a sweep folder.
const ResultsName = "results.csv"

// Table is a results table as text: comment lines and rows in Columns
// order.
type Table struct {
	Comments []string
	Rows     [][]string
	lines    []int // source line of each row, when read from a file
	file     string
}

// Column returns the index of a column name in Columns, or -1.
func Column(name string) int {
	for i, c := range Columns {
		if c == name {
			return i
		}
	}
	return -1
}

// rowOf renders a point's row; rec nil means pending.
func rowOf(pt Point, rec *Record) []string {
	f := output.FormatFloat
	row := make([]string, len(Columns))
	row[0], row[1], row[2], row[3] = pt.ID, f(pt.Condition.Phi), f(pt.Condition.T), f(pt.Condition.P)
	row[4] = string(Pending)
	if rec == nil {
		return row
	}
	row[4] = string(rec.Status)
	if rec.Status == Solved {
		row[5], row[6], row[7] = f(rec.FlameSpeed), f(rec.BurnedTemperature), f(rec.AdiabaticTemperature)
		row[8], row[9], row[10] = f(rec.ThermalThickness), f(rec.PeakHeatReleaseX), strconv.Itoa(rec.GridPoints)
		row[11], row[12] = rec.ContinuedFrom, strconv.Itoa(rec.NewtonIterations)
		if rec.FlameSpeedSigma > 0 {
			row[15] = f(rec.FlameSpeedSigma)
		}
	}
	row[13] = strconv.FormatFloat(rec.WallTimeS, 'f', 3, 64)
	row[14] = oneLine(rec.Reason)
	return row
}

// oneLine folds a multi-line message into one CSV-friendly line.
func oneLine(s string) string {
	parts := strings.Fields(strings.ReplaceAll(s, "\n", " ; "))
	return strings.Join(parts, " ")
}

func resultsComments(title string, d Definition) []string {
	head := "flame1d sweep results"
	if title != "" {
		head += ": " + title
	}
	return []string{
		head,
		fmt.Sprintf("mechanism %s; %d equivalence ratio(s), %d temperature(s), %d pressure(s); the full definition is in %s",
			d.Mechanism, len(d.EquivalenceRatios), len(d.TemperaturesK), len(d.PressuresPa), manifestName),
		"status: solved, failed (the reason is given and the number columns are empty) or pending (not solved yet)",
		"wall_time [s] is this run's time on this machine; every other column is reproducible",
		output.SafetyNote,
	}
}

// WriteCSV writes the table.
func (t *Table) WriteCSV(w io.Writer) error {
	if err := output.WriteComments(w, t.Comments); err != nil {
		return err
	}
	cw := csv.NewWriter(w)
	if err := cw.Write(Columns); err != nil {
		return err
	}
	for i, r := range t.Rows {
		if len(r) != len(Columns) {
			return fmt.Errorf("results row %d has %d fields for %d columns", i+1, len(r), len(Columns))
		}
		if err := cw.Write(r); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// ReadResults reads a results table written by a sweep or a merge. The
// header must be exactly Columns.
func ReadResults(path string) (*Table, error) {
	f, err := infile.Open(path, infile.Results)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	t, err := readTable(f, path)
	if err != nil {
		return nil, err
	}
	return t, nil
}

func readTable(r io.Reader, path string) (*Table, error) {
	t := &Table{file: path}
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	for _, line := range strings.Split(string(data), "\n") {
		if c, ok := strings.CutPrefix(line, "# "); ok {
			t.Comments = append(t.Comments, c)
		} else if !strings.HasPrefix(line, "#") {
			break
		}
	}
	cr := csv.NewReader(strings.NewReader(string(data)))
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if errors.Is(err, io.EOF) {
		return nil, fmt.Errorf("%s: empty file, no header row", path)
	}
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	for i, want := range Columns {
		if i >= len(header) || header[i] != want {
			got := "nothing"
			if i < len(header) {
				got = fmt.Sprintf("%q", header[i])
			}
			return nil, fmt.Errorf("%s: column %d is %s, expected %q: not a flame1d sweep results table (columns: %s)",
				path, i+1, got, want, strings.Join(Columns, ", "))
		}
	}
	if len(header) != len(Columns) {
		return nil, fmt.Errorf("%s: %d columns, expected %d", path, len(header), len(Columns))
	}
	for {
		rec, err := cr.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return nil, fmt.Errorf("%s: %w", path, err)
		}
		line, _ := cr.FieldPos(0)
		if len(rec) != len(Columns) {
			return nil, fmt.Errorf("%s:%d: %d fields, expected %d", path, line, len(rec), len(Columns))
		}
		t.Rows = append(t.Rows, rec)
		t.lines = append(t.lines, line)
	}
	return t, nil
}

// Row is one parsed row of a results table.
type Row struct {
	ID        string
	Condition study.Condition
	Status    Status
	// FlameSpeed is S_L in m/s for a solved row, 0 otherwise.
	FlameSpeed float64
	Reason     string
	Line       int // source line, 0 when unknown
}

// Parsed converts the rows' conditions, status and flame speed to numbers.
func (t *Table) Parsed() ([]Row, error) {
	out := make([]Row, len(t.Rows))
	for i, r := range t.Rows {
		line := 0
		if i < len(t.lines) {
			line = t.lines[i]
		}
		at := func(col string) string { return fmt.Sprintf("%s:%d: column %q", t.file, line, col) }
		num := func(col string) (float64, error) {
			s := r[Column(col)]
			v, err := strconv.ParseFloat(s, 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
				return 0, fmt.Errorf("%s: %q is not a finite number", at(col), s)
			}
			return v, nil
		}
		row := Row{ID: r[0], Status: Status(r[Column(ColStatus)]), Reason: r[Column(ColReason)], Line: line}
		var err error
		if row.Condition.Phi, err = num(ColPhi); err != nil {
			return nil, err
		}
		if row.Condition.T, err = num(ColT); err != nil {
			return nil, err
		}
		if row.Condition.P, err = num(ColP); err != nil {
			return nil, err
		}
		switch row.Status {
		case Solved:
			if row.FlameSpeed, err = num(ColFlameSpeed); err != nil {
				return nil, err
			}
		case Failed, Pending:
			if s := r[Column(ColFlameSpeed)]; s != "" {
				return nil, fmt.Errorf("%s: a %s row must leave S_L empty (got %q)", at(ColFlameSpeed), row.Status, s)
			}
		default:
			return nil, fmt.Errorf("%s: status %q is not solved, failed or pending", at(ColStatus), row.Status)
		}
		out[i] = row
	}
	return out, nil
}
