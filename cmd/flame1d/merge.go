package main

import (
	"fmt"
	"path/filepath"

	"github.com/spf13/cobra"

	"flame1d/output"
	"flame1d/sweep"
)

func newMergeCmd() *cobra.Command {
	var outDir string
	cmd := &cobra.Command{
		Use:   "merge SHARD_DIR...",
		Short: "Join the shard folders of a sweep into one results table",
		Long: `Join the folders written by "flame1d sweep --shard I/N" into one folder with
results.csv (in the same order and with the same text as an unsharded run
writes, wall times apart), sweep.json and the S_L plots.

The merge refuses shards of different sweeps, a shard given twice, a missing
shard (named by its index, and by the folder it would likely be in), and
points that are missing, still pending, or listed twice. The flame profiles
stay in the shard folders (points/<id>/).

` + output.SafetyNote,
		Example: `  flame1d merge out/shard-* -o out/merged`,
		Args:    cobra.MinimumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			sum, err := sweep.Merge(args, outDir)
			if err != nil {
				return err
			}
			w := cmd.OutOrStdout()
			fmt.Fprintf(w, "merged %d shards: %d points, %d solved, %d failed\n", sum.Shards, sum.Points, sum.Solved, sum.Failed)
			for i, d := range sum.ShardFolders {
				fmt.Fprintf(w, "  shard %d/%d  %s\n", i, sum.Shards, d)
			}
			for _, m := range sum.Warnings {
				fmt.Fprintf(w, "warning: %s\n", m)
			}
			fmt.Fprintf(w, "results in %s\n", filepath.Join(outDir, sweep.ResultsName))
			fmt.Fprintln(w, output.SafetyNote)
			return nil
		},
	}
	cmd.Flags().StringVarP(&outDir, "output", "o", "sweep-merged", "folder for the merged results")
	return cmd
}
