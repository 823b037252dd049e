package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"flame1d/builtin"
	"flame1d/casefile"
	"flame1d/output"
	"flame1d/validation"
)

func newValidateCmd() *cobra.Command {
	var (
		mechanism string
		fuels     string
		dataFiles []string
		outDir    string
		jobs      int
		asJSON    bool
		quiet     bool
	)
	cmd := &cobra.Command{
		Use:   "validate",
		Short: "Score a mechanism against published laminar flame speeds",
		Long: `Solve the flame of every published laminar-flame-speed measurement bundled with
flame1d (fuels in air: H2, CH4, C2H4, C2H6, C3H6, C3H8, n-heptane; 298 K and
1 atm over phi 0.7-1.8, and elevated temperatures and pressures) that the
mechanism can represent, and compare. Each series (one fuel at one
temperature and pressure) is solved by continuation along the equivalence
ratio; series run in parallel (-j). Points whose fuel or air species the
mechanism lacks are listed as not represented; they do not count.

Prints, per point, the measured value and its scatter band, the prediction
and its deviation; per fuel and overall, the RMS and worst deviations.
Writes into the output folder (-o, default validate-<mechanism>):
  scorecard.csv           one row per measured point
  scorecard-summary.csv   one row per fuel and overall
  S_L-<fuel>.png/.svg     measured bands (error bars) and predictions (line)

The files are written as one set: the folder is replaced as a whole once
every file is complete, and an interrupted run (Ctrl-C, SIGTERM) leaves the
previous scorecard as it was. The folder must be new, empty, or one flame1d
wrote.

The measured values and their sources are in validation/data/ of the
repository (docs/validation.md); they were recalled from the cited
publications, and are marked so. Add measurements of your own with --data.

` + output.SafetyNote,
		Example: `  flame1d validate --mechanism ranzi2012-c1c3 -j 2
  flame1d validate --mechanism my-mech.toml --fuels CH4,C3H8 -o out/score
  flame1d validate --mechanism smith1999-natgas --json > score.json
  flame1d validate --mechanism my-mech.toml --data site-measurements.toml`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if jobs < 0 {
				return fmt.Errorf("-j %d: give a positive number of parallel solves (0 = all cores)", jobs)
			}
			mech, err := builtin.Load(mechanism)
			if err != nil {
				return fmt.Errorf("--mechanism: %w", err)
			}
			sets, err := validation.Bundled()
			if err != nil {
				return err
			}
			for _, f := range dataFiles {
				d, err := validation.ReadFile(f)
				if err != nil {
					return err
				}
				sets = append(sets, d)
			}
			if err := validation.CheckDistinct(sets); err != nil {
				return err
			}
			var names []string
			if fuels != "" {
				names = strings.Split(fuels, ",")
			}
			if sets, err = validation.SelectFuels(sets, names); err != nil {
				return fmt.Errorf("--fuels: %w", err)
			}
			if outDir == "" {
				outDir = "validate-" + strings.TrimSuffix(filepath.Base(mechanism), filepath.Ext(mechanism))
			}
			set, err := output.NewSet(outDir)
			if err != nil {
				return err
			}
			defer set.Abort()
			defer abandonOnSignal(set, cmd.ErrOrStderr())()
			opt := validation.Options{Jobs: jobs}
			if !quiet {
				opt.Progress = cmd.ErrOrStderr()
			}
			sc, err := validation.Run(mechanism, mech, sets, opt)
			if err != nil {
				return err
			}
			if err := sc.WriteFiles(set.Dir()); err != nil {
				return err
			}
			if err := set.Commit(); err != nil {
				return err
			}
			printWarnings(cmd.ErrOrStderr(), sc.Warnings())
			if asJSON {
				return sc.WriteJSON(cmd.OutOrStdout())
			}
			printScorecard(cmd.OutOrStdout(), sc)
			fmt.Fprintf(cmd.OutOrStdout(), "\nresults in %s\n%s\n", outDir, output.SafetyNote)
			return nil
		},
	}
	cmd.Flags().StringVar(&mechanism, "mechanism", casefile.FoundationalMechanism, "built-in mechanism name or path to a flame1d TOML mechanism")
	cmd.Flags().StringVar(&fuels, "fuels", "", "comma-separated fuels to score (default: all), e.g. CH4,C3H8")
	cmd.Flags().StringArrayVar(&dataFiles, "data", nil, "a measurement file of your own, in the bundled format (repeatable)")
	cmd.Flags().StringVarP(&outDir, "output", "o", "", "output folder (default validate-<mechanism>)")
	cmd.Flags().IntVarP(&jobs, "jobs", "j", 0, "flames solved at the same time (0 = all cores)")
	cmd.Flags().BoolVar(&asJSON, "json", false, "print the scorecard as JSON on stdout")
	cmd.Flags().BoolVarP(&quiet, "quiet", "q", false, "no progress messages on stderr")
	return cmd
}

func printScorecard(w io.Writer, sc *validation.Scorecard) {
	fmt.Fprintf(w, "Laminar flame speeds in air, measured and predicted on %s\n\n", sc.Mechanism)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintf(tw, "fuel\tphi\tT, P\tmeasured [cm/s]\tband [cm/s]\tpredicted [cm/s]\tdeviation\toutside band\t\n")
	missing := map[string]string{}
	for _, o := range sc.Outcomes {
		if o.Status == validation.NotRepresented {
			missing[o.Fuel] = o.Reason
			continue
		}
		head := fmt.Sprintf("%s\t%g\t%s\t%.1f\t%.1f-%.1f\t", o.Fuel, o.Phi, validation.Conditions(o.T, o.P), 100*o.Speed, 100*o.Low, 100*o.High)
		if o.Status != validation.Solved {
			fmt.Fprintf(tw, "%s-\t%s\t-\t\n", head, o.Status)
			continue
		}
		outside := "-"
		if o.OutsideBand != 0 {
			outside = fmt.Sprintf("%+.1f%%", 100*o.OutsideBand)
		}
		fmt.Fprintf(tw, "%s%.2f\t%+.1f%%\t%s\t\n", head, 100*o.Predicted, 100*o.Deviation, outside)
	}
	tw.Flush()
	fmt.Fprintln(w)
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "fuel\tsolved\twithin band\tRMS deviation\tworst deviation\tworst outside band\n")
	for _, s := range append(append([]validation.Score(nil), sc.Fuels...), sc.Overall) {
		counts := fmt.Sprintf("%d of %d", s.Solved, s.Points)
		if s.NotRepresented > 0 {
			counts += fmt.Sprintf(" (%d not represented)", s.NotRepresented)
		}
		if s.Failed > 0 {
			counts += fmt.Sprintf(" (%d failed)", s.Failed)
		}
		if s.Solved == 0 {
			fmt.Fprintf(tw, "%s\t%s\t-\t-\t-\t-\n", s.Fuel, counts)
			continue
		}
		outside := "none"
		if o := s.WorstOutside; o.OutsideBand != 0 {
			outside = fmt.Sprintf("%+.1f%% (phi %g, %s)", 100*o.OutsideBand, o.Phi, validation.Conditions(o.T, o.P))
		}
		fmt.Fprintf(tw, "%s\t%s\t%d\t%.1f%%\t%+.1f%% (phi %g, %s)\t%s\n", s.Fuel, counts, s.WithinBand, 100*s.RMS,
			100*s.Worst.Deviation, s.Worst.Phi, validation.Conditions(s.Worst.T, s.Worst.P), outside)
	}
	tw.Flush()
	for _, s := range sc.Fuels {
		if m, ok := missing[s.Fuel]; ok {
			fmt.Fprintf(w, "not represented: %s\n", m)
		}
	}
	for _, o := range sc.Outcomes {
		if o.Status == validation.Failed {
			fmt.Fprintf(w, "failed: %s phi %g, %s: %s\n", o.Fuel, o.Phi, validation.Conditions(o.T, o.P), o.Reason)
		}
	}
}
