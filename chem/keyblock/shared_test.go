package keyblock

import (
	"os"
	"path/filepath"
	"testing"
)

// mechanismsDir returns the published mechanism sets kept beside the
// repository (../shared/data/mechanisms from the repository root), or skips
// the test when that folder is absent.
func mechanismsDir(t testing.TB) string {
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
	shared := filepath.Join(dir, "..", "shared", "data", "mechanisms")
	if _, err := os.Stat(shared); err != nil {
		t.Skipf("shared mechanism data not found at %s: %v", shared, err)
	}
	return shared
}

func openShared(t testing.TB, set, file string) (*os.File, string) {
	t.Helper()
	path := filepath.Join(mechanismsDir(t), set, file)
	f, err := os.Open(path)
	if err != nil {
		t.Skipf("%s not available: %v", path, err)
	}
	t.Cleanup(func() { f.Close() })
	return f, path
}
