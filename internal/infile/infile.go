// Package infile opens the files a user names as input (case files,
// mechanisms, restart files, results tables, correlation files) with two
// guards: only regular files are read, so a device such as /dev/zero or a
// pipe never streams into memory, and every kind of file has a size limit,
// reported in a message that names the file and the limit instead of
// ending in an out-of-memory crash.
package infile

import (
	"errors"
	"fmt"
	"io"
	"os"
)

// Kind is a kind of input file with its size limit.
type Kind struct {
	// Name says what the file is, in messages ("case file").
	Name string
	// Limit is the largest size read, bytes.
	Limit int64
}

// Size limits. Each is far above the largest real file of its kind and far
// below what would exhaust memory once parsed.
var (
	// A case file is a page of TOML; 4 MiB leaves room for long fuel lists.
	CaseFile = Kind{"case file", 4 << 20}
	// FuelFile covers fuel tables and cracking-study files.
	FuelFile = Kind{"fuel file", 4 << 20}
	// Mechanism covers flame1d TOML mechanisms and the keyword-block
	// reactions, thermo and transport files: the largest published detailed
	// mechanisms (thousands of species) are a few tens of MB.
	Mechanism = Kind{"mechanism file", 256 << 20}
	// Restart holds a full flame state: points x species numbers.
	Restart = Kind{"restart file", 256 << 20}
	// Results is a sweep's results table (at most 100 000 rows).
	Results = Kind{"results table", 256 << 20}
	// Record is one sweep point's point.json or a sweep.json manifest.
	Record = Kind{"sweep record", 16 << 20}
	// Correlation is a fitted flame-speed correlation.
	Correlation = Kind{"correlation file", 1 << 20}
	// Uncertainty is a side file of rate-constant uncertainty factors.
	Uncertainty = Kind{"uncertainty-factor file", 16 << 20}
	// Text is a free-text file such as a mechanism description.
	Text = Kind{"text file", 1 << 20}
)

// ErrTooLarge marks a file over its kind's limit.
var ErrTooLarge = errors.New("file too large")

// Open opens path for reading as a file of kind k. It refuses anything but
// a regular file (symbolic links are followed) and a file over the limit;
// the returned reader also stops with ErrTooLarge if the file grows past
// the limit while it is read.
func Open(path string, k Kind) (io.ReadCloser, error) {
	// Look before opening: opening a named pipe waits for a writer.
	if info, err := os.Stat(path); err == nil {
		if err := check(path, info, k); err != nil {
			return nil, err
		}
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", k.Name, err)
	}
	info, err := f.Stat()
	if err != nil {
		f.Close()
		return nil, fmt.Errorf("%s: %w", k.Name, err)
	}
	if err := check(path, info, k); err != nil {
		f.Close()
		return nil, err
	}
	return &limited{f: f, left: k.Limit, path: path, k: k}, nil
}

// ReadFile reads the whole file path as a file of kind k (see Open).
func ReadFile(path string, k Kind) ([]byte, error) {
	r, err := Open(path, k)
	if err != nil {
		return nil, err
	}
	defer r.Close()
	b, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	return b, nil
}

func check(path string, info os.FileInfo, k Kind) error {
	switch m := info.Mode(); {
	case m.IsDir():
		return fmt.Errorf("%s %s is a folder; give a file", k.Name, path)
	case !m.IsRegular():
		return fmt.Errorf("%s %s is not a regular file (a device, pipe or socket); give an ordinary file", k.Name, path)
	}
	if info.Size() > k.Limit {
		return tooLarge(path, k)
	}
	return nil
}

func tooLarge(path string, k Kind) error {
	return fmt.Errorf("%s %s is larger than %s, the limit for a %s; is it the right file? (%w)",
		k.Name, path, size(k.Limit), k.Name, ErrTooLarge)
}

func size(n int64) string {
	switch {
	case n >= 1<<20:
		return fmt.Sprintf("%d MiB", n>>20)
	case n >= 1<<10:
		return fmt.Sprintf("%d KiB", n>>10)
	}
	return fmt.Sprintf("%d bytes", n)
}

// limited reads at most left more bytes and fails beyond them.
type limited struct {
	f    *os.File
	left int64
	path string
	k    Kind
}

func (l *limited) Read(p []byte) (int, error) {
	if l.left <= 0 {
		// One more byte tells a file of exactly the limit from a longer one.
		var one [1]byte
		if n, _ := l.f.Read(one[:]); n > 0 {
			return 0, tooLarge(l.path, l.k)
		}
		return 0, io.EOF
	}
	if int64(len(p)) > l.left {
		p = p[:l.left]
	}
	n, err := l.f.Read(p)
	l.left -= int64(n)
	return n, err
}

func (l *limited) Close() error { return l.f.Close() }
