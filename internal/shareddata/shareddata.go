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
// test when it is not there. FLAME1D_SHARED_MECHANISMS, when set, names the
// folder (for a working copy that does not sit beside shared/).
func MechanismsDir(t testing.TB) string {
	t.Helper()
	if d := os.Getenv("FLAME1D_SHARED_MECHANISMS"); d != "" {
		if _, err := os.Stat(d); err != nil {
			t.Skipf("FLAME1D_SHARED_MECHANISMS=%s: %v", d, err)
		}
		return d
	}
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
	// The sibling of the repository, or of a folder above it (a git
	// worktree kept one level further down).
	first := ""
	for d := filepath.Dir(dir); ; d = filepath.Dir(d) {
		shared := filepath.Join(d, "shared", "data", "mechanisms")
		if first == "" {
			first = shared
		}
		if _, err := os.Stat(shared); err == nil {
			return shared
		}
		if filepath.Dir(d) == d {
			break
		}
	}
	t.Skipf("shared mechanism data not found at %s or beside a folder above it (tests that need it are skipped)", first)
	return ""
}
