package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"flame1d/casefile"
	"flame1d/output"
	"flame1d/study"
)

func newCompareCmd() *cobra.Command {
	var (
		outDir string
		fuels  string
		phis   string
		quiet  bool
		sens   bool
	)
	cmd := &cobra.Command{
		Use:   "compare CASE.toml",
		Short: "Compare the flames of two or more fuels at the same conditions",
		Long: `Solve every fuel of a case file's [compare] table (or --fuels; with neither,
every [fuels.NAME] table) over a list of equivalence ratios, at the case's unburned temperature and pressure, and write:
  compare.csv                  S_L of each fuel (and the mechanism it burns
                               on), its ratio to the first fuel,
                               adiabatic and burned T, thickness, zone positions
  flame-speed.svg/.png         S_L against equivalence ratio for all fuels
  profiles-thermal.svg/.png    T and heat release at the profile condition,
                               aligned at each flame's heat-release peak
  profiles-species.svg/.png    fuel and main pool species, aligned likewise
  zone-map.svg/.png            where each fuel cracks and burns: pyrolysis and
                               oxidation zones as bars aligned at the
                               heat-release peak, with temperature windows
  <fuel>/                      profile.csv, zones.csv, flame plot, summary of
                               each fuel at the profile condition (a fuel name
                               that is not a plain file name gets a safe one;
                               the real name is inside the files)
  compare-sensitivity.csv      with --sensitivity: at the profile condition,
                               the reactions that matter most for each fuel
                               and those whose coefficients differ most from
                               the reference; S_L carries its 1σ rate-constant
                               band in the tables and error bars in the chart

The folder is written as one set and replaced as a whole when complete; an
interrupted run leaves the previous results as they were.

Each fuel burns on the mechanism its [fuels.NAME] table names, else on the
case's top-level mechanism, else a cracked pool on ranzi2012-c1c3 and a neat
fuel on smith1999-natgas; every table, summary and chart names it.
The first fuel is the reference (typically the surrogate used in CFD).
Failed points are reported in the table with their reason, never as numbers.

` + output.SafetyNote,
		Example: `  flame1d compare examples/kerosene-compare.toml -o out/compare
  flame1d compare case.toml --fuels surrogate,candidate --phi 0.8,1.0,1.2`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			c, err := casefile.ReadFile(args[0])
			if err != nil {
				return err
			}
			var names []string
			var phiList []float64
			profilePhi := c.EquivalenceRatio
			if c.Compare != nil {
				names, phiList, profilePhi = c.Compare.Fuels, c.Compare.EquivalenceRatios, c.Compare.ProfilePhi
			}
			if fuels != "" {
				names = strings.Split(fuels, ",")
			}
			if phis != "" {
				phiList = nil
				for _, f := range strings.Split(phis, ",") {
					v, err := strconv.ParseFloat(strings.TrimSpace(f), 64)
					if err != nil || !(v > 0) {
						return fmt.Errorf("--phi: %q is not a positive number", f)
					}
					phiList = append(phiList, v)
				}
			}
			if len(phiList) == 0 {
				phiList = []float64{c.EquivalenceRatio}
			}
			if outDir == "" {
				outDir = strings.TrimSuffix(filepath.Base(args[0]), filepath.Ext(args[0])) + "-compare"
			}
			var progress io.Writer = cmd.ErrOrStderr()
			if quiet {
				progress = nil
			}
			if sens {
				c.Sensitivity.Enabled = true
			}
			set, err := output.NewSet(outDir)
			if err != nil {
				return err
			}
			defer set.Abort()
			defer abandonOnSignal(set, cmd.ErrOrStderr())()
			cmp, err := study.Compare(c, names, phiList, progress)
			if err != nil {
				return err
			}
			printWarnings(cmd.ErrOrStderr(), cmp.ValidityWarnings())
			rows := cmp.Table()
			comments := []string{"flame1d fuel comparison: " + c.Title, cmp.MechanismNote(), output.SafetyNote}
			err = set.WriteFile("compare.csv", func(w io.Writer) error {
				if err := output.WriteComments(w, comments); err != nil {
					return err
				}
				cw := csv.NewWriter(w)
				if err := cw.WriteAll(rows); err != nil {
					return err
				}
				return cw.Error()
			})
			if err != nil {
				return err
			}
			if err := cmp.WritePlots(set.Dir(), profilePhi); err != nil {
				return err
			}
			ip := 0
			for i, phi := range cmp.Phis {
				if abs(phi-profilePhi) < abs(cmp.Phis[ip]-profilePhi) {
					ip = i
				}
			}
			for _, name := range cmp.Fuels {
				if r := cmp.Results[name][ip]; r != nil {
					if err := study.WriteFlame(filepath.Join(set.Dir(), output.SafeName(name)), r); err != nil {
						return err
					}
				}
			}
			printCompare(cmd.OutOrStdout(), cmp)
			if err := writeCompareSensitivity(cmd.OutOrStdout(), set.Dir(), cmp, profilePhi, comments); err != nil {
				return err
			}
			if err := set.Commit(); err != nil {
				return err
			}
			fmt.Fprintf(cmd.OutOrStdout(), "\nresults in %s\n%s\n", outDir, output.SafetyNote)
			return nil
		},
	}
	cmd.Flags().StringVarP(&outDir, "output", "o", "", "output folder (default <case>-compare)")
	cmd.Flags().StringVar(&fuels, "fuels", "", "comma-separated fuel names (default: the [compare] table, or every [fuels.NAME] table)")
	cmd.Flags().StringVar(&phis, "phi", "", "comma-separated equivalence ratios (default: the [compare] table)")
	cmd.Flags().BoolVarP(&quiet, "quiet", "q", false, "no progress messages on stderr")
	cmd.Flags().BoolVar(&sens, "sensitivity", false, "also compute flame-speed sensitivities and rate-constant bands (as [sensitivity] enabled = true)")
	return cmd
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

func printCompare(w io.Writer, cmp *study.Comparison) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "fuel\tmechanism\tphi\tS_L [m/s]\tratio\tT_ad [K]\tpyrolysis end [mm]\tHRR peak [mm]\tstatus\n")
	for _, name := range cmp.Fuels {
		for i, phi := range cmp.Phis {
			r := cmp.Results[name][i]
			if r == nil {
				fmt.Fprintf(tw, "%s\t%s\t%g\t-\t-\t-\t-\t-\tfailed\n", name, cmp.MechanismOf(name), phi)
				continue
			}
			s := r.Summary
			ratio := "-"
			if ref := cmp.Results[cmp.Fuels[0]][i]; ref != nil {
				ratio = fmt.Sprintf("%.3f", s.FlameSpeed/ref.Summary.FlameSpeed)
			}
			py := "-"
			if len(s.Zones.Pyrolysis) > 0 {
				end := s.Zones.Pyrolysis[0].EndX
				for _, p := range s.Zones.Pyrolysis {
					end = max(end, p.EndX)
				}
				py = fmt.Sprintf("%.3f", 1e3*end)
			}
			fmt.Fprintf(tw, "%s\t%s\t%g\t%s\t%s\t%.0f\t%s\t%.3f\tconverged\n", name, cmp.MechanismOf(name), phi, speedWithBand(s), ratio,
				s.AdiabaticTemperature, py, 1e3*s.Zones.Oxidation.PeakX)
		}
	}
	tw.Flush()
}
