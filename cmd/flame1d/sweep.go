package main

import (
	"context"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strings"
	"syscall"
	"text/tabwriter"
	"time"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"

	"flame1d/casefile"
	"flame1d/output"
	"flame1d/sweep"
)

func newSweepCmd() *cobra.Command {
	var (
		outDir      string
		jobs        int
		shardText   string
		quiet       bool
		cold        bool
		retryFailed bool
	)
	cmd := &cobra.Command{
		Use:   "sweep CASE.toml",
		Short: "Solve the flames of a case's [sweep] table by continuation",
		Long: `Solve every condition of the case file's [sweep] table (equivalence ratio,
unburned temperature and pressure, as lists or ranges; docs/sweeps.md). Each
flame starts from the converged flame of its neighbour along a continuation
chain, which is much faster than solving each from scratch. Independent chains
(and the lean and rich branches of each chain) run in parallel (-j).

Writes into the output folder (-o, or [output] directory, or <case>-sweep):
  results.csv             one row per condition: S_L, burned and adiabatic T,
                          thermal thickness, peak heat-release position,
                          status, iterations, wall time; failed rows give the
                          reason and no numbers
  points/<id>/            profile.csv, summary.txt, summary.json of each flame
  S_L-vs-<variable>.svg   flame speed against each swept variable (and .png)
  sweep.json              the sweep definition

Points are committed one by one (each point's folder as a whole);
results.csv is built when the run starts and when it ends. An interrupted sweep (Ctrl-C, a killed job)
run again into the same folder keeps the points already solved and gives the
same table. --shard I/N solves the I-th of N slices (for cluster job arrays);
join the shard folders with "flame1d merge".

A progress bar goes to stderr when it is a terminal (silence it with -q).

` + output.SafetyNote,
		Example: `  flame1d sweep examples/sweeps/hydrogen-lean-rich.toml -o out/h2
  flame1d sweep case.toml -o out/shard-3 --shard 3/8 -q
  flame1d sweep case.toml -o out/check --cold`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			c, err := casefile.ReadFile(args[0])
			if err != nil {
				return err
			}
			var shard sweep.Shard
			if shardText != "" {
				if shard, err = sweep.ParseShard(shardText); err != nil {
					return fmt.Errorf("--shard: %w", err)
				}
			}
			if outDir == "" {
				outDir = c.Output.Directory
			}
			if outDir == "" {
				outDir = strings.TrimSuffix(filepath.Base(args[0]), filepath.Ext(args[0])) + "-sweep"
			}
			if jobs < 0 {
				return fmt.Errorf("-j %d: give a positive number of parallel solves (0 = all cores)", jobs)
			}
			warnings, err := sweep.ValidityWarnings(c)
			if err != nil {
				return err
			}
			printWarnings(cmd.ErrOrStderr(), warnings)
			ctx, cancel := context.WithCancel(cmd.Context())
			defer cancel()
			stopOnSignal(ctx, cancel, cmd.ErrOrStderr())
			stderr := cmd.ErrOrStderr()
			opt := sweep.Options{Jobs: jobs, Shard: shard, ColdStarts: cold, RetryFailed: retryFailed}
			if !quiet && isTerminal(stderr) {
				opt.Progress = progressBar(stderr)
			}
			sum, err := sweep.Run(ctx, c, outDir, opt)
			if opt.Progress != nil && (sum == nil || sum.Pending > 0) {
				fmt.Fprintln(stderr) // leave the unfinished bar's line
			}
			if sum != nil {
				printSweepSummary(cmd.OutOrStdout(), sum, shard)
			}
			return err
		},
	}
	cmd.Flags().StringVarP(&outDir, "output", "o", "", "output folder (default [output] directory, or <case>-sweep)")
	cmd.Flags().IntVarP(&jobs, "jobs", "j", 0, "flames solved at the same time (0 = all cores)")
	cmd.Flags().StringVar(&shardText, "shard", "", "solve only slice I of N of the sweep, written I/N with 0 <= I < N")
	cmd.Flags().BoolVarP(&quiet, "quiet", "q", false, "no progress bar")
	cmd.Flags().BoolVar(&cold, "cold", false, "solve every flame from a cold start, without continuation (slow; for checking)")
	cmd.Flags().BoolVar(&retryFailed, "retry-failed", false, "solve again the points an earlier run recorded as failed")
	return cmd
}

// stopOnSignal cancels ctx on the first Ctrl-C or SIGTERM (what Slurm and
// Kubernetes send before killing a job): the flames in progress finish and
// are committed. The default handling is then restored, so a second Ctrl-C
// ends the program at once.
func stopOnSignal(ctx context.Context, cancel context.CancelFunc, stderr io.Writer) {
	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM)
	go func() {
		defer signal.Stop(sigs)
		select {
		case <-sigs:
			fmt.Fprintln(stderr, "\nflame1d: interrupted; finishing the flames in progress (Ctrl-C again abandons them; a rerun solves them)")
			cancel()
		case <-ctx.Done():
		}
	}()
}

// isTerminal reports whether w is a terminal (the progress bar is drawn only
// there, never into log files).
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	return ok && term.IsTerminal(int(f.Fd()))
}

// progressBar draws one bar for the points of this run, with the time
// left estimated from the rate so far.
func progressBar(w io.Writer) func(sweep.Progress) {
	var bar *progressbar.ProgressBar
	return func(p sweep.Progress) {
		if bar == nil {
			bar = progressbar.NewOptions(p.Total,
				progressbar.OptionSetWriter(w),
				progressbar.OptionSetDescription("flames"),
				progressbar.OptionShowCount(),
				progressbar.OptionSetPredictTime(true),
				progressbar.OptionShowElapsedTimeOnFinish(),
				progressbar.OptionSetWidth(30),
				progressbar.OptionThrottle(200*time.Millisecond),
				progressbar.OptionOnCompletion(func() { fmt.Fprintln(w) }),
			)
		}
		if p.Record != nil {
			bar.Describe(fmt.Sprintf("%-28s %s", p.Record.ID, p.Record.Status))
			_ = bar.Set(p.Done)
		}
	}
}

func printSweepSummary(w io.Writer, s *sweep.Summary, shard sweep.Shard) {
	part := ""
	if shard.Count > 1 {
		part = fmt.Sprintf(" (shard %v)", shard)
	}
	fmt.Fprintf(w, "sweep%s: %d points, %d solved, %d failed, %d pending", part, s.Points, s.Solved, s.Failed, s.Pending)
	if s.Reused > 0 {
		fmt.Fprintf(w, "; %d kept from an earlier run", s.Reused)
	}
	fmt.Fprintf(w, "; %d solved or tried now in %.1f s", s.Attempted, s.WallTime.Seconds())
	if s.Repaired > 0 {
		fmt.Fprintf(w, "; %d failed point(s) solved on a second try from a neighbour", s.Repaired)
	}
	fmt.Fprintln(w)
	if len(s.Failures) > 0 {
		fmt.Fprintln(w, "failed points (no numbers are reported for them):")
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		for _, r := range s.Failures {
			reason := r.Reason
			if len(reason) > 160 {
				reason = reason[:157] + "..."
			}
			fmt.Fprintf(tw, "  %s\t%s\n", r.ID, reason)
		}
		tw.Flush()
		fmt.Fprintf(w, "  (full reasons in %s and points/<id>/point.json)\n", sweep.ResultsName)
	}
	for _, m := range s.Warnings {
		fmt.Fprintf(w, "warning: %s\n", m)
	}
	fmt.Fprintf(w, "results in %s\n", filepath.Join(s.Dir, sweep.ResultsName))
	fmt.Fprintln(w, output.SafetyNote)
}
