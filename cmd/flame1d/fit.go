package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"flame1d/correlation"
	"flame1d/output"
	"flame1d/sweep"
	"flame1d/units"
)

func newFitCmd() *cobra.Command {
	var (
		tomlOut  string
		evals    []string
		corrFile string
		t0, p0   string
	)
	cmd := &cobra.Command{
		Use:   "fit RESULTS.csv",
		Short: "Fit a flame-speed correlation to a sweep's results",
		Long: `Fit the power-law correlation of Metghalchi & Keck (1982, Combust. Flame 48)

  ` + correlation.Form + `

to the solved flames of a sweep's results.csv (failed and pending rows are
left out), by least squares on ln S_L, that is on relative errors. T_0 = 298 K
and P_0 = 1 atm unless --t0/--p0 say otherwise. Prints the coefficients with
their standard errors, the range of the data (the correlation's validity
range), and the RMS and largest relative error.

Coefficients the data cannot determine are held at zero and named: with one
temperature (pressure) only, no temperature (pressure) exponent is fitted
and the reference becomes that temperature (pressure).

--toml writes the correlation for other tools; --eval phi,T,P evaluates it
(units allowed, e.g. --eval "0.9,400 K,5 bar") and warns outside the fitted
range; --correlation evaluates a correlation file written earlier instead of
fitting.

` + output.SafetyNote,
		Example: `  flame1d fit out/h2/results.csv
  flame1d fit out/merged/results.csv --toml ch4-correlation.toml
  flame1d fit out/h2/results.csv --eval "0.8,350 K,2 atm"
  flame1d fit --correlation ch4-correlation.toml --eval "1.0,298 K,1 atm"`,
		Args: cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			w := cmd.OutOrStdout()
			var c *correlation.Correlation
			switch {
			case corrFile != "" && len(args) == 0:
				var err error
				if c, err = correlation.ReadTOMLFile(corrFile); err != nil {
					return err
				}
				if len(evals) == 0 {
					printCorrelation(w, c)
				}
			case corrFile == "" && len(args) == 1:
				opt := correlation.Options{Source: args[0]}
				for _, q := range []struct {
					flag, text string
					dim        units.Dimension
					dst        *float64
				}{{"--t0", t0, units.Temperature, &opt.T0}, {"--p0", p0, units.Pressure, &opt.P0}} {
					if q.text == "" {
						continue
					}
					v, err := units.Parse(q.text, q.dim)
					if err != nil || !(v > 0) {
						return fmt.Errorf("%s %q: give a positive %v, e.g. %s", q.flag, q.text, q.dim, map[string]string{"--t0": `"298 K"`, "--p0": `"1 atm"`}[q.flag])
					}
					*q.dst = v
				}
				data, skipped, err := fitData(args[0])
				if err != nil {
					return err
				}
				if c, err = correlation.Fit(data, opt); err != nil {
					if errors.Is(err, correlation.ErrDesign) {
						return fmt.Errorf("%s: %w; sweep more conditions (docs/sweeps.md) and fit again", args[0], err)
					}
					return fmt.Errorf("%s: %w", args[0], err)
				}
				fmt.Fprintf(w, "fit of %d solved flames from %s", len(data), args[0])
				if skipped > 0 {
					fmt.Fprintf(w, " (%d failed or pending rows left out)", skipped)
				}
				fmt.Fprintln(w)
				printCorrelation(w, c)
				worst := data[c.WorstPoint]
				fmt.Fprintf(w, "  largest error at phi %g, %g K, %g Pa (S_L %.4g m/s)\n", worst.Phi, worst.T, worst.P, worst.FlameSpeed)
				if tomlOut != "" {
					if err := output.WriteFileAtomic(tomlOut, func(f io.Writer) error { return c.WriteTOML(f, output.SafetyNote) }); err != nil {
						return err
					}
					fmt.Fprintf(w, "correlation written to %s\n", tomlOut)
				}
			default:
				return errors.New("give a results table to fit (flame1d fit RESULTS.csv), or --correlation FILE.toml with --eval")
			}
			for _, e := range evals {
				phi, T, P, err := parseEval(e)
				if err != nil {
					return err
				}
				s, warn := c.Evaluate(phi, T, P)
				if s == 0 {
					// Evaluate returns 0 only when there is no flame speed; the
					// last warning says why.
					return fmt.Errorf("--eval %q: no flame speed: %s", e, warn[len(warn)-1])
				}
				fmt.Fprintf(w, "S_L(phi %g, %g K, %g Pa) = %s m/s\n", phi, T, P, strconv.FormatFloat(s, 'g', 6, 64))
				for _, m := range warn {
					fmt.Fprintf(cmd.ErrOrStderr(), "warning: %s\n", m)
				}
			}
			fmt.Fprintln(w, output.SafetyNote)
			return nil
		},
	}
	cmd.Flags().StringVar(&tomlOut, "toml", "", "write the fitted correlation to this TOML file")
	cmd.Flags().StringArrayVar(&evals, "eval", nil, `evaluate the correlation at "phi,T,P" (repeatable; units allowed)`)
	cmd.Flags().StringVar(&corrFile, "correlation", "", "evaluate this correlation file instead of fitting")
	cmd.Flags().StringVar(&t0, "t0", "", `reference temperature T_0 (default "298 K")`)
	cmd.Flags().StringVar(&p0, "p0", "", `reference pressure P_0 (default "1 atm")`)
	return cmd
}

// fitData reads the solved rows of a results table.
func fitData(path string) ([]correlation.Point, int, error) {
	t, err := sweep.ReadResults(path)
	if err != nil {
		return nil, 0, err
	}
	rows, err := t.Parsed()
	if err != nil {
		return nil, 0, err
	}
	var data []correlation.Point
	skipped := 0
	for _, r := range rows {
		if r.Status != sweep.Solved {
			skipped++
			continue
		}
		data = append(data, correlation.Point{Phi: r.Condition.Phi, T: r.Condition.T, P: r.Condition.P, FlameSpeed: r.FlameSpeed})
	}
	if len(data) == 0 {
		return nil, skipped, fmt.Errorf("%s: no solved flames to fit (%d rows failed or pending)", path, skipped)
	}
	return data, skipped, nil
}

// parseEval reads "phi,T,P"; T and P may carry units.
func parseEval(s string) (phi, T, P float64, err error) {
	parts := strings.Split(s, ",")
	if len(parts) != 3 {
		return 0, 0, 0, fmt.Errorf("--eval %q: write phi,T,P, e.g. \"0.9,400 K,5 bar\"", s)
	}
	if phi, err = strconv.ParseFloat(strings.TrimSpace(parts[0]), 64); err != nil {
		return 0, 0, 0, fmt.Errorf("--eval %q: equivalence ratio %q is not a number", s, parts[0])
	}
	if T, err = units.Parse(parts[1], units.Temperature); err != nil {
		return 0, 0, 0, fmt.Errorf("--eval %q: %v", s, err)
	}
	if P, err = units.Parse(parts[2], units.Pressure); err != nil {
		return 0, 0, 0, fmt.Errorf("--eval %q: %v", s, err)
	}
	for _, v := range []struct {
		name string
		v    float64
	}{{"equivalence ratio", phi}, {"temperature", T}, {"pressure", P}} {
		if !(v.v > 0) || math.IsInf(v.v, 0) {
			return 0, 0, 0, fmt.Errorf("--eval %q: the %s %v is not a finite positive number", s, v.name, v.v)
		}
	}
	return phi, T, P, nil
}

func printCorrelation(w io.Writer, c *correlation.Correlation) {
	fmt.Fprintf(w, "  %s\n", correlation.Form)
	fmt.Fprintf(w, "  T_0 = %g K, P_0 = %g Pa\n", c.T0, c.P0)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "  coefficient\tvalue\tstd. error\n")
	units := map[int]string{correlation.BM: " [m/s]", correlation.B2: " [m/s]"}
	for i := 0; i < correlation.NumCoef; i++ {
		name := correlation.CoefNames[i] + units[i]
		if !c.Free[i] {
			fmt.Fprintf(tw, "  %s\t0\tnot fitted\n", name)
			continue
		}
		fmt.Fprintf(tw, "  %s\t%.6g\t%.2g\n", name, c.Coef[i], c.StdErr[i])
	}
	tw.Flush()
	fmt.Fprintf(w, "  valid for phi %g - %g, T_u %g - %g K, P %g - %g Pa (%.4g - %.4g atm)\n",
		c.Phi.Min, c.Phi.Max, c.T.Min, c.T.Max, c.P.Min, c.P.Max, c.P.Min/101325, c.P.Max/101325)
	if c.Points > 0 {
		fmt.Fprintf(w, "  fit: %d points, %d degrees of freedom; RMS relative error %.3g %%, largest %.3g %%\n",
			c.Points, c.DOF, 100*c.RMSRelative, 100*c.MaxRelative)
	}
	for _, n := range c.Notes {
		fmt.Fprintf(w, "  note: %s\n", n)
	}
}
