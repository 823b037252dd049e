package main

import (
	"fmt"
	"io"
)

// printWarnings writes each warning on its own line to w (stderr: warnings
// are shown even with -q, which silences progress only).
func printWarnings(w io.Writer, warnings []string) {
	for _, m := range warnings {
		fmt.Fprintf(w, "warning: %s\n", m)
	}
}
