package main

import (
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"

	"flame1d/output"
)

// abandonOnSignal ends the program on Ctrl-C or SIGTERM while a result set
// is being solved or written: a flame solve cannot stop half way, so the
// unfinished set is deleted and the output folder keeps its previous
// results, with no temporary files left. The exit status is 128 plus the
// signal number, as a shell reports it. The returned function stops
// listening.
func abandonOnSignal(set *output.Set, stderr io.Writer) (stop func()) {
	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM)
	done := make(chan struct{})
	go func() {
		select {
		case s := <-sigs:
			if set.Abort() {
				fmt.Fprintf(stderr, "\nflame1d: interrupted; nothing was written and %s is as it was\n", set.Folder())
			} else {
				fmt.Fprintf(stderr, "\nflame1d: interrupted after the results in %s were complete\n", set.Folder())
			}
			code := 130
			if s == syscall.SIGTERM {
				code = 143
			}
			os.Exit(code)
		case <-done:
		}
	}()
	return func() {
		signal.Stop(sigs)
		close(done)
	}
}
