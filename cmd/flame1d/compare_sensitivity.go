package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"path/filepath"
	"text/tabwriter"

	"flame1d/output"
	"flame1d/sensitivity"
	"flame1d/study"
)

// speedWithBand formats S_L for the compare table, with its 1σ
// rate-constant band when sensitivities were computed.
func speedWithBand(s *output.FlameSummary) string {
	if s.FlameSpeedBand == "" {
		return fmt.Sprintf("%.4f", s.FlameSpeed)
	}
	return fmt.Sprintf("%.4f ± %.4f", s.FlameSpeed, s.FlameSpeedSigma)
}

// writeCompareSensitivity writes compare-sensitivity.csv and prints the
// side-by-side sensitivities, when the flames carry them.
func writeCompareSensitivity(w io.Writer, dir string, cmp *study.Comparison, phi float64, comments []string) error {
	cs, err := cmp.SensitivityComparisons(phi)
	if err != nil || len(cs) == 0 {
		return err
	}
	rows := study.SensitivityTable(cs)
	err = output.WriteFileAtomic(filepath.Join(dir, "compare-sensitivity.csv"), func(f io.Writer) error {
		for _, cm := range comments {
			fmt.Fprintf(f, "# %s\n", cm)
		}
		fmt.Fprintf(f, "# %s\n", output.BandNote)
		cw := csv.NewWriter(f)
		if err := cw.WriteAll(rows); err != nil {
			return err
		}
		return cw.Error()
	})
	if err != nil {
		return err
	}
	for _, c := range cs {
		fmt.Fprintf(w, "\nflame-speed sensitivities d ln S_L/d ln k at phi = %g\n  %-10s %s\n  %-10s %s\n", c.Phi, c.Reference, c.ReferenceBand, c.Other, c.OtherBand)
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		for _, l := range []struct {
			title string
			pairs []sensitivity.Pair
		}{{"matter most", c.MostImportant}, {"differ most", c.MostDifferent}} {
			fmt.Fprintf(tw, "  reactions that %s\t%s\t%s\tdifference\n", l.title, c.Reference, c.Other)
			for _, p := range l.pairs {
				fmt.Fprintf(tw, "    %s\t%+.4f\t%+.4f\t%+.4f\n", output.Shorten(p.Equation, maxEquationWidth), p.A, p.B, p.Difference())
			}
		}
		tw.Flush()
	}
	fmt.Fprintf(w, "  (%s)\n", output.BandNote)
	return nil
}

// maxEquationWidth is the widest equation the printed table shows; longer
// ones (a global cracking step with its whole pool) are cut, the CSV keeps
// them whole.
const maxEquationWidth = 44
