package output

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
)

// Table is a rectangular set of named columns for CSV output. Column names
// carry their units, e.g. "T [K]".
type Table struct {
	// Comments are written first as lines starting with "# " (most CSV readers
	// can skip them; they carry the provenance and the safety note).
	Comments []string
	Header   []string
	Rows     [][]float64
}

// FormatFloat renders a value at full precision (shortest round-trip form).
func FormatFloat(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// WriteComments writes header lines "# text", one per comment, each made
// one bounded line by OneLine: a title with a line break cannot start a row
// of its own.
func WriteComments(w io.Writer, comments []string) error {
	for _, c := range comments {
		if _, err := fmt.Fprintf(w, "# %s\n", OneLine(c)); err != nil {
			return err
		}
	}
	return nil
}

// WriteCSV writes the table. It refuses NaN or Inf values: a result that is
// not a number must never appear as one.
func (t *Table) WriteCSV(w io.Writer) error {
	if err := WriteComments(w, t.Comments); err != nil {
		return err
	}
	cw := csv.NewWriter(w)
	if err := cw.Write(t.Header); err != nil {
		return err
	}
	rec := make([]string, len(t.Header))
	for i, row := range t.Rows {
		if len(row) != len(t.Header) {
			return fmt.Errorf("row %d has %d values for %d columns", i+1, len(row), len(t.Header))
		}
		for c, v := range row {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return fmt.Errorf("row %d, column %q is not a finite number", i+1, t.Header[c])
			}
			rec[c] = FormatFloat(v)
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
