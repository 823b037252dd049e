package output

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
)

func writeSet(t *testing.T, dir string, files map[string]string) *Set {
	t.Helper()
	s, err := NewSet(dir)
	if err != nil {
		t.Fatal(err)
	}
	for name, text := range files {
		if err := s.WriteFile(name, func(w io.Writer) error { _, err := io.WriteString(w, text); return err }); err != nil {
			t.Fatal(err)
		}
	}
	return s
}

// listing returns every path below dir (relative), sorted.
func listing(t *testing.T, dir string) []string {
	t.Helper()
	var out []string
	filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if err != nil {
			t.Fatal(err)
		}
		if rel, _ := filepath.Rel(dir, p); rel != "." {
			out = append(out, rel)
		}
		return nil
	})
	sort.Strings(out)
	return out
}

// A second set replaces the first as a whole, and only at Commit: before
// it, the first set is complete and untouched; after it, no file of the
// first remains and no temporary folder is left beside the output folder.
func TestSetReplacesPreviousAtCommit(t *testing.T) {
	parent := t.TempDir()
	dir := filepath.Join(parent, "out")
	if err := writeSet(t, dir, map[string]string{"profile.csv": "old", "zones.csv": "old", "fuel/summary.txt": "old"}).Commit(); err != nil {
		t.Fatal(err)
	}
	s := writeSet(t, dir, map[string]string{"profile.csv": "new", "summary.json": "new"})
	if got := listing(t, dir); strings.Join(got, " ") != ".flame1d-set fuel fuel/summary.txt profile.csv zones.csv" {
		t.Fatalf("before Commit the output folder holds %v", got)
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "profile.csv")); string(b) != "old" {
		t.Fatalf("before Commit profile.csv is %q", b)
	}
	if err := s.Commit(); err != nil {
		t.Fatal(err)
	}
	if got := listing(t, dir); strings.Join(got, " ") != ".flame1d-set profile.csv summary.json" {
		t.Fatalf("after Commit the output folder holds %v", got)
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "profile.csv")); string(b) != "new" {
		t.Fatalf("after Commit profile.csv is %q", b)
	}
	if got := listing(t, parent); len(got) != len(listing(t, dir))+1 {
		t.Fatalf("temporary files left beside the output folder: %v", got)
	}
}

// A set that fails while it is written (a full disk, an interrupt) is
// abandoned: the previous results are intact and nothing temporary remains.
func TestSetAbortKeepsPrevious(t *testing.T) {
	parent := t.TempDir()
	dir := filepath.Join(parent, "out")
	if err := writeSet(t, dir, map[string]string{"profile.csv": "old", "zones.csv": "old"}).Commit(); err != nil {
		t.Fatal(err)
	}
	s := writeSet(t, dir, map[string]string{"profile.csv": "new"})
	full := errors.New("no space left on device")
	if err := s.WriteFile("zones.csv", func(w io.Writer) error { io.WriteString(w, "half"); return full }); !errors.Is(err, full) {
		t.Fatalf("got %v", err)
	}
	s.Abort()
	s.Abort() // a signal handler and a deferred call may both abort
	if err := s.Commit(); err == nil {
		t.Fatal("an abandoned set committed")
	}
	if got := listing(t, parent); strings.Join(got, " ") != "out out/.flame1d-set out/profile.csv out/zones.csv" {
		t.Fatalf("after Abort: %v", got)
	}
	for _, f := range []string{"profile.csv", "zones.csv"} {
		if b, _ := os.ReadFile(filepath.Join(dir, f)); string(b) != "old" {
			t.Fatalf("%s is %q after Abort", f, b)
		}
	}
}

// A folder of the user's own files is refused before any work; an empty
// one is taken; a file in the way is refused; a folder that cannot be
// written is reported at NewSet, not after the solve.
func TestNewSetRefuses(t *testing.T) {
	parent := t.TempDir()
	own := filepath.Join(parent, "own")
	os.MkdirAll(own, 0o755)
	os.WriteFile(filepath.Join(own, "results.csv"), []byte("mine"), 0o644)
	if _, err := NewSet(own); err == nil || !strings.Contains(err.Error(), "results.csv") || !strings.Contains(err.Error(), "new or empty folder") {
		t.Errorf("folder of own files: %v", err)
	}
	if b, _ := os.ReadFile(filepath.Join(own, "results.csv")); string(b) != "mine" {
		t.Errorf("own file changed: %q", b)
	}
	empty := filepath.Join(parent, "empty")
	os.MkdirAll(empty, 0o755)
	s, err := NewSet(empty)
	if err != nil {
		t.Errorf("empty folder: %v", err)
	} else {
		s.Abort()
	}
	file := filepath.Join(parent, "file")
	os.WriteFile(file, nil, 0o644)
	if _, err := NewSet(file); err == nil || !strings.Contains(err.Error(), "is a file") {
		t.Errorf("a file as output folder: %v", err)
	}
	if os.Geteuid() != 0 {
		ro := filepath.Join(parent, "ro")
		os.MkdirAll(ro, 0o555)
		if _, err := NewSet(filepath.Join(ro, "out")); err == nil || !strings.Contains(err.Error(), "cannot be written") {
			t.Errorf("read-only parent: %v", err)
		}
	}
}

func TestSetWriteFileStaysInside(t *testing.T) {
	s := writeSet(t, filepath.Join(t.TempDir(), "out"), nil)
	defer s.Abort()
	for _, name := range []string{"../x", "/etc/x", "a/../../x"} {
		if err := s.WriteFile(name, func(io.Writer) error { return nil }); err == nil {
			t.Errorf("WriteFile(%q) accepted", name)
		}
	}
}

// A file added by hand to a result set stops the next set from replacing
// the folder: nothing the user put there is deleted.
func TestSetRefusesAddedFiles(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	if err := writeSet(t, dir, map[string]string{"profile.csv": "old", "fuel/summary.txt": "old"}).Commit(); err != nil {
		t.Fatal(err)
	}
	os.WriteFile(filepath.Join(dir, "fuel", "my-notes.txt"), []byte("mine"), 0o644)
	if _, err := NewSet(dir); err == nil || !strings.Contains(err.Error(), "fuel/my-notes.txt") {
		t.Fatalf("added file: %v", err)
	}
	os.Remove(filepath.Join(dir, "fuel", "my-notes.txt"))
	s, err := NewSet(dir)
	if err != nil {
		t.Fatalf("after removing the added file: %v", err)
	}
	s.Abort()
}

// Temporary folders a killed run left beside the output folder are
// cleared by the next set for that folder, and only those.
func TestNewSetClearsLeftovers(t *testing.T) {
	parent := t.TempDir()
	for _, n := range []string{".out.tmp-123", ".out.tmp-9.old", ".other.tmp-5", ".outer.tmp-1"} {
		os.MkdirAll(filepath.Join(parent, n, "x"), 0o755)
	}
	s, err := NewSet(filepath.Join(parent, "out"))
	if err != nil {
		t.Fatal(err)
	}
	s.Abort()
	if got := strings.Join(listing(t, parent), " "); got != ".other.tmp-5 .other.tmp-5/x .outer.tmp-1 .outer.tmp-1/x" {
		t.Errorf("after NewSet: %s", got)
	}
}
