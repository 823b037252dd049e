// Command flame1d computes 1-D freely propagating laminar premixed flames.
package main

import (
	"fmt"
	"os"

	"github.com/spf13/cobra"
)

func main() {
	if err := newRootCmd().Execute(); err != nil {
		fmt.Fprintln(os.Stderr, "flame1d:", err)
		os.Exit(1)
	}
}

func newRootCmd() *cobra.Command {
	root := &cobra.Command{
		Use:   "flame1d",
		Short: "Laminar premixed flame speeds and structures from detailed kinetics",
		Long: `flame1d computes 1-D freely propagating laminar premixed flames with detailed
kinetics and mixture-averaged transport: flame speed, flame structure, and where
fuel cracking (pyrolysis) and oxidation take place.

Results are model predictions. Where they feed safety decisions (flammability,
flashback margins) confirm them against local codes and licensed practice.`,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	// Each subcommand lives in its own file as newXxxCmd().
	root.AddCommand(newMechCmd(), newRunCmd(), newCompareCmd(), newEquilibriumCmd(), newPoolCmd(), newCrackCmd(), newTransportCmd(), newSweepCmd(), newMergeCmd(), newFitCmd(), newValidateCmd())
	return root
}
