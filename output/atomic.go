// Package output writes flame1d results: CSV tables with units in the column
// names, JSON and text summaries, and plots. Every file is written
// atomically (temporary file in the same folder, then rename), so a failed
// run never leaves a half-written result that looks complete.
package output

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// SafetyNote is printed in every summary and file header.
const SafetyNote = "Results are model predictions; confirm them against local codes and licensed practice before using them for safety decisions (flammability, flashback margins)."

// WriteFileAtomic writes the output of fill to path via a temporary file in
// the same directory and a rename. On any error the temporary file is removed
// and path is left as it was.
func WriteFileAtomic(path string, fill func(w io.Writer) error) (err error) {
	dir := filepath.Dir(path)
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("output folder: %w", err)
	}
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("output %s: %w", path, err)
	}
	tmp := f.Name()
	defer func() {
		if err != nil {
			f.Close()
			os.Remove(tmp)
		}
	}()
	if err = fill(f); err != nil {
		return fmt.Errorf("output %s: %w", path, err)
	}
	// CreateTemp makes the file private (0600); results are ordinary files.
	if err = f.Chmod(0o644); err != nil {
		return fmt.Errorf("output %s: %w", path, err)
	}
	if err = f.Sync(); err != nil {
		return fmt.Errorf("output %s: %w", path, err)
	}
	if err = f.Close(); err != nil {
		return fmt.Errorf("output %s: %w", path, err)
	}
	if err = os.Rename(tmp, path); err != nil {
		return fmt.Errorf("output %s: %w", path, err)
	}
	return nil
}
