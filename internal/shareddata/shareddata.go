// Package shareddata locates the published mechanism sets kept beside the
// repository (../shared/data/mechanisms from the repository root) for tests
// that read them. Those sets may not be redistributed, so tests that need
// them skip cleanly, with a message, where the folder is absent.
package shareddata

import (
	"os"
	"path/filepath"
	"testing"
)

// MechanismsDir returns the folder of published mechanism sets, or skips the
// test when it is not there.
func MechanismsDir(t testing.TB) string {
	t.Helper()
	dir, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	for {
		if _, err := os.Stat(filepath.Join(dir, "go.mod")); err == nil {
			break
		}
		parent := filepath.Dir(dir)
		if parent == dir {
			t.Skip("repository root (go.mod) not found; shared mechanism data unavailable")
		}
		dir = parent
	}
	shared := filepath.Join(filepath.Dir(dir), "shared", "data", "mechanisms")
	if _, err := os.Stat(shared); err != nil {
		t.Skipf("shared mechanism data not found at %s (tests that need it are skipped): %v", shared, err)
	}
	return shared
}
