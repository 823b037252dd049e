package keyblock

import (
	"flame1d/internal/shareddata"
	"os"
	"path/filepath"
	"testing"
)

// mechanismsDir is shareddata.MechanismsDir.
func mechanismsDir(t testing.TB) string { t.Helper(); return shareddata.MechanismsDir(t) }

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
