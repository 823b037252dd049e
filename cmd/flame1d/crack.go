package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"flame1d/output"
	"flame1d/study"
)

// Species listed in the crack outputs: those holding at least this share
// of the fuel's carbon or hydrogen in some step (table and CSV), and at
// least chartShare of its carbon (chart; the rest is lumped as "other").
const (
	tableShare = 1e-4
	chartShare = 0.01
)

func newCrackCmd() *cobra.Command {
	var outDir string
	cmd := &cobra.Command{
		Use:   "crack STUDY.toml",
		Short: "Thermodynamic cracking study: equilibrium products of a fuel as species are walled off",
		Long: `Compute the constrained chemical equilibrium of one mole of a fuel at fixed
temperature and pressure, repeated over a sequence of cumulative walls
(species held at zero): e.g. everything allowed, then graphite walled off,
then also large aromatics, then benzene, then acetylene. It shows which
species thermodynamics would crack the fuel into, and how the picture
changes as kinetically slow products are ruled out.

The study file has a [study] table with [[study.steps]] and may hold the
fuel under [fuels.NAME]; docs/fuels.md describes every key. Species come
from the mechanism and from extra thermo files (classic thermo files or
flame1d TOML mechanisms); graphite is a condensed phase when named in
condensed.

Prints the carbon share of each species per step and writes into -o
(default <study>-out):
  crack.csv   moles per mole of fuel, gas mole fractions and carbon shares
  crack.svg   stacked bars of the carbon share per step
  crack.png   the same as an image

` + output.SafetyNote,
		Example: `  flame1d crack examples/fuels/crack-study.toml
  flame1d crack examples/fuels/crack-study.toml -o out/crack`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			dir := outDir
			if dir == "" {
				dir = strings.TrimSuffix(filepath.Base(args[0]), filepath.Ext(args[0])) + "-out"
			}
			return runCrack(cmd.OutOrStdout(), args[0], dir)
		},
	}
	cmd.Flags().StringVarP(&outDir, "output", "o", "", "output folder")
	return cmd
}

// crackStudy prints and writes a computed cracking study.
type crackStudy struct{ *study.Cracking }

func runCrack(w io.Writer, path, dir string) error {
	set, err := output.NewSet(dir)
	if err != nil {
		return err
	}
	defer set.Abort()
	c, err := study.RunCracking(path)
	if err != nil {
		return err
	}
	cs := crackStudy{c}
	if err := cs.writeText(w); err != nil {
		return err
	}
	if err := set.WriteFile("crack.csv", cs.table().WriteCSV); err != nil {
		return err
	}
	cats, series := cs.chartSeries()
	chart := output.Chart{Title: cs.chartTitle(), XLabel: "step of the study", YLabel: "share of the fuel's carbon [-]"}
	for _, ext := range []string{".svg", ".png"} {
		if err := output.StackedBars(filepath.Join(set.Dir(), "crack"+ext), chart, cats, series); err != nil {
			return err
		}
	}
	if err := set.Commit(); err != nil {
		return err
	}
	fmt.Fprintf(w, "\n  results in %s (crack.csv, crack.svg, crack.png)\n", dir)
	return nil
}

func (cs crackStudy) chartTitle() string {
	r := cs.Result
	return fmt.Sprintf("%s: %s at %g K, %.4g bar", cs.Title, r.Formula, r.T, r.P/1e5)
}

func (cs crackStudy) comments() []string {
	r := cs.Result
	c := []string{
		"flame1d cracking study: " + cs.Title,
		fmt.Sprintf("fuel %s (H/C %.4g); %g K; %.6g Pa; species from %s", r.Formula, r.Formula.HToC(), r.T, r.P, cs.Source),
	}
	for i, st := range r.Steps {
		line := fmt.Sprintf("step %d: %s; walled off: %s", i+1, st.Label, strings.Join(st.Walled, " "))
		if len(st.Walled) == 0 {
			line = fmt.Sprintf("step %d: %s; nothing walled off", i+1, st.Label)
		}
		if len(st.Forced) > 0 {
			line += "; held at zero by the element balance: " + strings.Join(st.Forced, " ")
		}
		c = append(c, line)
	}
	c = append(c, cs.Notes...)
	return append(c, output.SafetyNote)
}

// table lays the study out as one row per step.
func (cs crackStudy) table() *output.Table {
	r := cs.Result
	idx := r.Significant(tableShare)
	t := &output.Table{Comments: cs.comments(), Header: []string{"step [-]"}}
	for _, k := range idx {
		t.Header = append(t.Header, "n_"+r.Species[k]+" [mol/mol fuel]")
	}
	for _, k := range idx {
		if !cs.Set.Species[k].Condensed {
			t.Header = append(t.Header, "X_"+r.Species[k]+" [-]")
		}
	}
	for _, k := range idx {
		t.Header = append(t.Header, "C_share_"+r.Species[k]+" [-]")
	}
	for i, st := range r.Steps {
		row := []float64{float64(i + 1)}
		for _, k := range idx {
			row = append(row, st.Moles[k])
		}
		for _, k := range idx {
			if !cs.Set.Species[k].Condensed {
				row = append(row, st.MoleFractions[k])
			}
		}
		for _, k := range idx {
			row = append(row, st.CarbonShare[k])
		}
		t.Rows = append(t.Rows, row)
	}
	return t
}

// chartSeries gives one stacked layer per species holding at least
// chartShare of the carbon in some step, the rest lumped as "other".
func (cs crackStudy) chartSeries() ([]string, []output.Series) {
	r := cs.Result
	cats := make([]string, len(r.Steps))
	for i, st := range r.Steps {
		cats[i] = fmt.Sprintf("%d %s", i+1, st.Label)
	}
	var series []output.Series
	shown := map[int]bool{}
	for _, k := range r.Significant(0) {
		big := false
		for _, st := range r.Steps {
			big = big || st.CarbonShare[k] >= chartShare
		}
		if !big {
			continue
		}
		shown[k] = true
		s := output.Series{Name: r.Species[k], Y: make([]float64, len(r.Steps))}
		for i, st := range r.Steps {
			s.Y[i] = st.CarbonShare[k]
		}
		series = append(series, s)
	}
	other := output.Series{Name: "other", Y: make([]float64, len(r.Steps))}
	some := false
	for i, st := range r.Steps {
		for k, c := range st.CarbonShare {
			if !shown[k] && c > 0 {
				other.Y[i] += c
				some = true
			}
		}
	}
	if some {
		series = append(series, other)
	}
	return cats, series
}

func (cs crackStudy) writeText(w io.Writer) error {
	r := cs.Result
	var b strings.Builder
	for _, c := range cs.comments() {
		fmt.Fprintf(&b, "%s\n", c)
	}
	idx := r.Significant(tableShare)
	fmt.Fprintf(&b, "\nshare of the fuel's carbon (species holding at least %g of its carbon or hydrogen in some step)\n", tableShare)
	fmt.Fprintf(&b, "  %-12s", "species")
	for i := range r.Steps {
		fmt.Fprintf(&b, " %9s", fmt.Sprintf("step %d", i+1))
	}
	b.WriteString("\n")
	for _, k := range idx {
		fmt.Fprintf(&b, "  %-12s", r.Species[k])
		for _, st := range r.Steps {
			fmt.Fprintf(&b, " %9.4f", st.CarbonShare[k])
		}
		b.WriteString("\n")
	}
	fmt.Fprintf(&b, "\ngas mole fractions\n")
	for _, k := range idx {
		if cs.Set.Species[k].Condensed {
			continue
		}
		fmt.Fprintf(&b, "  %-12s", r.Species[k])
		for _, st := range r.Steps {
			fmt.Fprintf(&b, " %9.3g", st.MoleFractions[k])
		}
		b.WriteString("\n")
	}
	_, err := io.WriteString(w, b.String())
	return err
}
