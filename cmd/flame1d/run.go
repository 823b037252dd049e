package main

import (
	_ "embed"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"flame1d/casefile"
	"flame1d/flame"
	"flame1d/output"
	"flame1d/study"
)

//go:embed cases/demo-methane-air.toml
var demoCase []byte

func newRunCmd() *cobra.Command {
	var (
		outDir  string
		asJSON  bool
		quiet   bool
		demo    bool
		restart string
		sens    bool
	)
	cmd := &cobra.Command{
		Use:   "run [CASE.toml]",
		Short: "Solve one freely propagating premixed flame",
		Long: `Solve the steady 1-D freely propagating premixed flame described by a case
file and write its profiles and summary.

Writes into the output folder (-o, or [output] directory in the case, or a
folder named after the case file):
  profile.csv    x, T, u, rho, heat-release rate and all mole fractions
  zones.csv      pyrolysis and oxidation zones, pool-species and radical peaks
  restart.csv    the full state, to start another run from (--restart)
  flame.svg/.png where the fuel cracks and burns: zones, T, heat release,
                 fuel and largest pool species against position
  summary.json   flame speed, burned and adiabatic temperature, thickness, ...
  summary.txt    the same, for people
  sensitivity.csv, sensitivity.svg, sensitivity.png
                 with --sensitivity: d ln S_L / d ln p of every rate constant
                 and of the diffusion coefficients, ranked, the 20 largest
                 as a bar chart, and the 1σ band of S_L from the
                 rate-constant uncertainty factors (docs/sensitivity.md)

The files are written as one set: the folder is replaced as a whole once
every file is complete, and a failed or interrupted run (Ctrl-C, SIGTERM)
leaves the previous results as they were. The folder must be new, empty, or
one flame1d wrote.

Progress goes to stderr (silence it with -q). A failed solve exits non-zero
and writes nothing.

` + output.SafetyNote,
		Example: `  flame1d run --demo
  flame1d run examples/methane-air.toml -o out/ch4
  flame1d run case.toml --json -q > summary.json
  flame1d run --demo --sensitivity -o out/ch4-sens
  flame1d run lean.toml --restart flame1d-demo/restart.csv`,
		Args: cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			var c *casefile.Case
			var err error
			switch {
			case demo && len(args) == 0:
				c, err = casefile.Parse(demoCase, "built-in demo case")
			case len(args) == 1:
				c, err = casefile.ReadFile(args[0])
			default:
				return errors.New("give a case file, or --demo for the built-in methane/air case")
			}
			if err != nil {
				return err
			}
			if sens {
				c.Sensitivity.Enabled = true
			}
			if outDir == "" {
				outDir = c.Output.Directory
			}
			if outDir == "" && len(args) == 1 {
				outDir = strings.TrimSuffix(filepath.Base(args[0]), filepath.Ext(args[0])) + "-out"
			}
			if outDir == "" {
				outDir = "flame1d-out"
			}
			var progress io.Writer = cmd.ErrOrStderr()
			if quiet {
				progress = nil
			}
			set, err := output.NewSet(outDir)
			if err != nil {
				return err
			}
			defer set.Abort()
			defer abandonOnSignal(set, cmd.ErrOrStderr())()
			st, err := study.New(c, progress)
			if err != nil {
				return err
			}
			printWarnings(cmd.ErrOrStderr(), st.ValidityWarnings(st.BaseCondition()))
			var start *flame.Solution
			if restart != "" {
				if start, err = st.ReadRestart(restart); err != nil {
					return err
				}
			}
			res, err := st.Solve(st.BaseCondition(), start)
			if err != nil {
				return err
			}
			if err := study.WriteFlame(set.Dir(), res); err != nil {
				return err
			}
			if err := set.Commit(); err != nil {
				return err
			}
			if asJSON {
				return res.Summary.WriteJSON(cmd.OutOrStdout())
			}
			if err := res.Summary.WriteText(cmd.OutOrStdout()); err != nil {
				return err
			}
			fmt.Fprintf(cmd.OutOrStdout(), "  results in              %s\n", outDir)
			return nil
		},
	}
	cmd.Flags().StringVarP(&outDir, "output", "o", "", "output folder")
	cmd.Flags().BoolVar(&asJSON, "json", false, "print the summary as JSON on stdout")
	cmd.Flags().BoolVarP(&quiet, "quiet", "q", false, "no progress messages on stderr")
	cmd.Flags().BoolVar(&demo, "demo", false, "solve the built-in stoichiometric methane/air case")
	cmd.Flags().BoolVar(&sens, "sensitivity", false, "also compute the flame-speed sensitivities and the rate-constant uncertainty band (as [sensitivity] enabled = true)")
	cmd.Flags().StringVar(&restart, "restart", "", "start from a solved flame's restart.csv (continuation to this case's conditions)")
	return cmd
}
