package infile

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

func TestOpenRefusesWhatIsNotARegularFile(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip("no FIFO support:", err)
	}
	for _, tc := range []struct{ path, want string }{
		{"/dev/zero", "not a regular file"},
		{fifo, "not a regular file"},
		{dir, "is a folder"},
		{filepath.Join(dir, "missing.toml"), "no such file"},
	} {
		// A named pipe without a writer is refused at once, not waited on.
		_, err := ReadFile(tc.path, CaseFile)
		if err == nil || !strings.Contains(err.Error(), tc.want) || !strings.Contains(err.Error(), "case file") {
			t.Errorf("%s: got %v, want an error naming the case file and %q", tc.path, err, tc.want)
		}
	}
}

func TestReadFileLimit(t *testing.T) {
	dir := t.TempDir()
	k := Kind{"test file", 10}
	exact := filepath.Join(dir, "exact")
	over := filepath.Join(dir, "over")
	if err := os.WriteFile(exact, []byte("0123456789"), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(over, []byte("0123456789A"), 0o600); err != nil {
		t.Fatal(err)
	}
	b, err := ReadFile(exact, k)
	if err != nil || string(b) != "0123456789" {
		t.Fatalf("file at the limit: %q, %v", b, err)
	}
	_, err = ReadFile(over, k)
	if !errors.Is(err, ErrTooLarge) || !strings.Contains(err.Error(), over) || !strings.Contains(err.Error(), "10 bytes") {
		t.Fatalf("file over the limit: %v", err)
	}
}

// A file that grows past the limit after it was opened is cut off with the
// same error, not read on.
func TestReaderStopsAtLimitWhenFileGrows(t *testing.T) {
	path := filepath.Join(t.TempDir(), "growing")
	if err := os.WriteFile(path, []byte("01234"), 0o600); err != nil {
		t.Fatal(err)
	}
	r, err := Open(path, Kind{"test file", 8})
	if err != nil {
		t.Fatal(err)
	}
	defer r.Close()
	if err := os.WriteFile(path, []byte("0123456789"), 0o600); err != nil {
		t.Fatal(err)
	}
	buf := make([]byte, 64)
	total := 0
	for {
		n, err := r.Read(buf)
		total += n
		if err != nil {
			if !errors.Is(err, ErrTooLarge) {
				t.Fatalf("got %v after %d bytes, want ErrTooLarge", err, total)
			}
			break
		}
	}
	if total > 8 {
		t.Fatalf("read %d bytes past the 8-byte limit", total)
	}
}
