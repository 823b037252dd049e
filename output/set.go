package output

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"sync"

	"flame1d/internal/infile"
)

// SetMarker is the file every result set carries: it tells flame1d (and
// people) that the folder was written as one set, and lists the set's
// files, after a header of lines starting with "#". The next set written
// into the folder replaces it as a whole, unless someone added a file of
// their own.
const SetMarker = ".flame1d-set"

const setMarkerHeader = "# This folder was written by flame1d as one result set: the files listed below.\n" +
	"# The next flame1d run into it replaces the whole folder at once; it refuses\n" +
	"# to if files not listed here were added.\n"

// Set writes a folder of results as one: the files go into a hidden
// temporary folder beside the output folder, and Commit swaps that folder
// into place in one step. Until then the previous results stay as they
// were; an interrupted or failed run leaves them untouched and, once Abort
// has run, no temporary files behind.
//
// The output folder must be absent, empty, or a set written earlier (it
// holds SetMarker): a folder of someone's own files is never replaced.
// A Set is safe for use by one writer plus one Abort from a signal handler.
type Set struct {
	dir   string // the output folder, absolute
	tmp   string // where the files are written
	check bool   // refuse a folder that is not a set
	mu    sync.Mutex
	done  bool
}

// NewSet starts a result set for folder dir. It creates the temporary
// folder at once, so a folder that cannot be written is reported before any
// work is done, and it refuses a dir that holds files which are not an
// earlier result set.
func NewSet(dir string) (*Set, error) { return newSet(dir, true) }

// NewOwnedSet is NewSet for a folder inside one the caller has claimed and
// checked itself (a sweep's point folder, a merge folder): whatever is there
// is replaced.
func NewOwnedSet(dir string) (*Set, error) { return newSet(dir, false) }

func newSet(dir string, check bool) (*Set, error) {
	abs, err := filepath.Abs(dir)
	if err != nil {
		return nil, fmt.Errorf("output folder %s: %w", dir, err)
	}
	s := &Set{dir: abs, check: check}
	if err := s.replaceable(); err != nil {
		return nil, err
	}
	parent := filepath.Dir(abs)
	if err := os.MkdirAll(parent, 0o755); err != nil {
		return nil, fmt.Errorf("output folder %s: %w", dir, err)
	}
	if check {
		RemoveLeftovers(parent, filepath.Base(abs))
	}
	if s.tmp, err = os.MkdirTemp(parent, "."+filepath.Base(abs)+".tmp-*"); err != nil {
		return nil, fmt.Errorf("output folder %s cannot be written: %w", dir, err)
	}
	if err := os.Chmod(s.tmp, 0o755); err != nil {
		os.RemoveAll(s.tmp)
		return nil, fmt.Errorf("output folder %s: %w", dir, err)
	}
	return s, nil
}

// replaceable checks that the output folder may be replaced.
func (s *Set) replaceable() error {
	info, err := os.Stat(s.dir)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return fmt.Errorf("output folder %s: %w", s.dir, err)
	}
	if !info.IsDir() {
		return fmt.Errorf("output folder %s is a file; give a folder", s.dir)
	}
	if !s.check {
		return nil
	}
	entries, err := os.ReadDir(s.dir)
	if err != nil {
		return fmt.Errorf("output folder %s: %w", s.dir, err)
	}
	if len(entries) == 0 {
		return nil
	}
	listed, err := readMarker(s.dir)
	if err != nil {
		return fmt.Errorf("output folder %s holds files flame1d did not write as a result set (%s, ...); give a new or empty folder, or move those files away",
			s.dir, entries[0].Name())
	}
	present, err := treeOf(s.dir)
	if err != nil {
		return fmt.Errorf("output folder %s: %w", s.dir, err)
	}
	for _, p := range present {
		if !listed[p] {
			return fmt.Errorf("output folder %s holds %s, which is not part of the results flame1d wrote there; move it away or give another folder",
				s.dir, p)
		}
	}
	return nil
}

// readMarker reads the listing of a set folder's marker file.
func readMarker(dir string) (map[string]bool, error) {
	b, err := infile.ReadFile(filepath.Join(dir, SetMarker), infile.Text)
	if err != nil {
		return nil, err
	}
	listed := map[string]bool{SetMarker: true}
	for _, line := range strings.Split(string(b), "\n") {
		if line != "" && !strings.HasPrefix(line, "#") {
			listed[line] = true
		}
	}
	return listed, nil
}

// treeOf lists the files and folders below root, as slash-separated
// relative paths in walk order.
func treeOf(root string) ([]string, error) {
	var out []string
	err := filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if rel, _ := filepath.Rel(root, path); rel != "." {
			out = append(out, filepath.ToSlash(rel))
		}
		return nil
	})
	return out, err
}

// RemoveLeftovers deletes the temporary folders that sets for parent/name
// left behind when their program was killed (SIGKILL, a power cut) before
// it could clean up; name "" means every set's in parent.
func RemoveLeftovers(parent, name string) {
	entries, err := os.ReadDir(parent)
	if err != nil {
		return
	}
	for _, e := range entries {
		n := e.Name()
		if !e.IsDir() || !strings.HasPrefix(n, ".") {
			continue
		}
		i := strings.LastIndex(n, ".tmp-")
		if i < 1 || (name != "" && n[1:i] != name) {
			continue
		}
		os.RemoveAll(filepath.Join(parent, n))
	}
}

// Dir is the folder to write the set's files into (the temporary one).
func (s *Set) Dir() string { return s.tmp }

// Folder is the output folder the set will replace.
func (s *Set) Folder() string { return s.dir }

// WriteFile writes one file of the set; name is relative to the set's
// folder and may not leave it.
func (s *Set) WriteFile(name string, fill func(w io.Writer) error) error {
	if !filepath.IsLocal(name) {
		return fmt.Errorf("output %s: the name leaves the output folder", name)
	}
	return WriteFileAtomic(filepath.Join(s.tmp, name), fill)
}

// Commit makes the set durable (every file and folder synced) and swaps it
// into place; the previous folder, if any, is then deleted.
func (s *Set) Commit() error {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.done {
		return fmt.Errorf("output folder %s: the result set was already committed or abandoned", s.dir)
	}
	fail := func(err error) error {
		os.RemoveAll(s.tmp)
		s.done = true
		return err
	}
	files, err := treeOf(s.tmp)
	if err == nil {
		err = os.WriteFile(filepath.Join(s.tmp, SetMarker), []byte(setMarkerHeader+strings.Join(files, "\n")+"\n"), 0o644)
	}
	if err == nil {
		err = syncTree(s.tmp)
	}
	if err != nil {
		return fail(fmt.Errorf("output folder %s: %w", s.dir, err))
	}
	if err := s.replaceable(); err != nil {
		return fail(err)
	}
	if err := swapInto(s.tmp, s.dir); err != nil {
		return fail(fmt.Errorf("output folder %s: %w", s.dir, err))
	}
	s.done = true
	// swapInto left the previous set (if any) under the temporary name.
	os.RemoveAll(s.tmp)
	if err := syncDir(filepath.Dir(s.dir)); err != nil {
		return fmt.Errorf("output folder %s: %w", s.dir, err)
	}
	return nil
}

// Abort abandons the set: the temporary folder is deleted and the output
// folder stays as it was. It does nothing after Commit (and then reports
// false), and may be called from another goroutine (a signal handler)
// while files are written.
func (s *Set) Abort() (abandoned bool) {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.done {
		return false
	}
	s.done = true
	os.RemoveAll(s.tmp)
	return true
}

// swapInto moves folder tmp to dir. When dir exists, the two are exchanged
// in one step where the system can (the previous set then sits at tmp);
// elsewhere dir is first moved aside to tmp's name plus ".old".
func swapInto(tmp, dir string) error {
	if _, err := os.Lstat(dir); errors.Is(err, fs.ErrNotExist) {
		return os.Rename(tmp, dir)
	}
	if ok, err := exchange(tmp, dir); ok || err != nil {
		return err
	}
	old := tmp + ".old"
	if err := os.Rename(dir, old); err != nil {
		return err
	}
	if err := os.Rename(tmp, dir); err != nil {
		os.Rename(old, dir)
		return err
	}
	return os.Rename(old, tmp)
}

// syncTree flushes every file and folder below root to disk.
func syncTree(root string) error {
	return filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() {
			return syncDir(path)
		}
		f, err := os.Open(path)
		if err != nil {
			return err
		}
		defer f.Close()
		return f.Sync()
	})
}

func syncDir(path string) error {
	f, err := os.Open(path)
	if err != nil {
		return err
	}
	defer f.Close()
	if err := f.Sync(); err != nil && !errors.Is(err, errors.ErrUnsupported) {
		return err
	}
	return nil
}
