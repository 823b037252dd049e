package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strings"
	"syscall"
	"testing"
	"time"

	"flame1d/output"
)

func runCompare(t *testing.T, args ...string) (string, string, error) {
	t.Helper()
	return execute(newCompareCmd(), args...)
}

// tree lists every path below root, relative and sorted.
func tree(t *testing.T, root string) []string {
	t.Helper()
	var out []string
	filepath.WalkDir(root, func(p string, d os.DirEntry, err error) error {
		if err != nil {
			t.Fatal(err)
		}
		if rel, _ := filepath.Rel(root, p); rel != "." {
			out = append(out, rel)
		}
		return nil
	})
	sort.Strings(out)
	return out
}

// Fuel names that look like paths stay names: compare writes only inside
// its output folder, under safe folder names, with the real name inside the
// files; and without a [compare] table every [fuels.*] table is compared
// (issue 11, items 1 and 7).
func TestCompareStaysInsideItsFolder(t *testing.T) {
	if testing.Short() {
		t.Skip("solves two hydrogen flames")
	}
	work := t.TempDir()
	deep := filepath.Join(work, "a", "b", "c")
	os.MkdirAll(deep, 0o755)
	casePath := filepath.Join(deep, "case.toml")
	os.WriteFile(casePath, []byte(`mechanism = "burke2012-hydrogen"
[mixture]
fuel = "../../../X"
equivalence_ratio = 1.0
[fuels."../../../X"]
composition = { H2 = 1.0 }
[fuels."/tmp/abs"]
composition = { H2 = 0.9, N2 = 0.1 }
`), 0o644)
	out := filepath.Join(deep, "out")
	stdout, stderr, err := runCompare(t, casePath, "-o", out, "-q")
	if err != nil {
		t.Fatalf("compare: %v\n%s", err, stderr)
	}
	inside := filepath.Join("a", "b", "c")
	for _, p := range tree(t, work) {
		if !strings.HasPrefix(p, inside) && !strings.HasPrefix(inside, p) {
			t.Errorf("compare wrote %s, outside its folder", p)
		}
	}
	for _, name := range []string{"../../../X", "/tmp/abs"} {
		sum := filepath.Join(out, output.SafeName(name), "summary.txt")
		b, err := os.ReadFile(sum)
		if err != nil {
			t.Errorf("fuel %q: %v", name, err)
			continue
		}
		if !strings.Contains(string(b), name) {
			t.Errorf("%s does not name the fuel %q", sum, name)
		}
	}
	if !strings.Contains(stdout, "../../../X") || !strings.Contains(stdout, "/tmp/abs") {
		t.Errorf("the table does not list both fuels:\n%s", stdout)
	}
	if _, err := os.Stat("/tmp/abs/summary.txt"); err == nil {
		t.Error("/tmp/abs/summary.txt exists")
	}
}

const h2Case = "mechanism = \"burke2012-hydrogen\"\n[mixture]\nfuel = { H2 = 1 }\nequivalence_ratio = 1.0\n"

// run refuses, before solving, an output folder of the user's own files
// and leaves them alone; a folder it wrote before is replaced whole, with
// no file of the old set left over (issue 11, item 3).
func TestRunOutputFolderIsASet(t *testing.T) {
	c := writeCase(t, h2Case)
	own := filepath.Join(t.TempDir(), "own")
	os.MkdirAll(own, 0o755)
	os.WriteFile(filepath.Join(own, "notes.txt"), []byte("mine"), 0o644)
	began := time.Now()
	_, _, err := runRun(t, c, "-o", own, "-q")
	if err == nil || !strings.Contains(err.Error(), "notes.txt") || !strings.Contains(err.Error(), "new or empty folder") {
		t.Fatalf("folder of own files: %v", err)
	}
	if time.Since(began) > 5*time.Second {
		t.Errorf("the refusal came after %v: the folder must be checked before the solve", time.Since(began))
	}
	if got := tree(t, own); strings.Join(got, " ") != "notes.txt" {
		t.Errorf("own folder now holds %v", got)
	}
	if testing.Short() {
		return
	}
	dir := filepath.Join(t.TempDir(), "out")
	if _, stderr, err := runRun(t, c, "-o", dir, "-q"); err != nil {
		t.Fatalf("run: %v\n%s", err, stderr)
	}
	if _, _, err := runRun(t, c, "-o", dir, "-q"); err != nil {
		t.Fatalf("second run into a set: %v", err)
	}
	// A folder flame1d wrote, with a file added by hand, is refused.
	os.WriteFile(filepath.Join(dir, "my-plot.py"), nil, 0o644)
	if _, _, err := runRun(t, c, "-o", dir, "-q"); err == nil || !strings.Contains(err.Error(), "my-plot.py") {
		t.Errorf("set with an added file: %v", err)
	}
}

// Ctrl-C or SIGTERM during run leaves the previous results whole and no
// temporary files; the exit status says which signal (issue 11, item 3).
func TestRunInterruptKeepsPreviousSet(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the command and solves a methane flame")
	}
	exe := buildFlame1d(t)
	work := t.TempDir()
	h2 := filepath.Join(work, "h2.toml")
	os.WriteFile(h2, []byte(h2Case), 0o644)
	out := filepath.Join(work, "out")
	if b, err := exec.Command(exe, "run", h2, "-o", out, "-q").CombinedOutput(); err != nil {
		t.Fatalf("first run: %v\n%s", err, b)
	}
	ch4 := filepath.Join(work, "ch4.toml")
	os.WriteFile(ch4, []byte("mechanism = \"smith1999-natgas\"\n[mixture]\nfuel = { CH4 = 1 }\nequivalence_ratio = 1.0\n"), 0o644)
	interruptKeepsSet(t, work, filepath.Join(out, "summary.json"), exe, "run", ch4, "-o", out, "-q")
}

// interruptKeepsSet starts the command exe args (still solving 1.5 s
// later) twice, stopping it with SIGINT and with SIGTERM, and checks that
// each exits with 128 plus the signal number, says nothing was written,
// and leaves every path below work, and the file keep, as they were.
func interruptKeepsSet(t *testing.T, work, keep, exe string, args ...string) {
	t.Helper()
	kept, err := os.ReadFile(keep)
	if err != nil {
		t.Fatal(err)
	}
	before := tree(t, work)
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		cmd := exec.Command(exe, args...)
		var stderr bytes.Buffer
		cmd.Stderr = &stderr
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(1500 * time.Millisecond)
		cmd.Process.Signal(sig)
		err := cmd.Wait()
		code := cmd.ProcessState.ExitCode()
		if want := 128 + int(sig); err == nil || code != want {
			t.Errorf("%v: exit %d (%v), want %d\n%s", sig, code, err, want, stderr.String())
		}
		if !strings.Contains(stderr.String(), "nothing was written") {
			t.Errorf("%v: stderr %q", sig, stderr.String())
		}
		if got := tree(t, work); strings.Join(got, " ") != strings.Join(before, " ") {
			t.Errorf("%v: folder now %v, was %v", sig, got, before)
		}
		if b, _ := os.ReadFile(keep); !bytes.Equal(b, kept) {
			t.Errorf("%v: the previous %s changed", sig, filepath.Base(keep))
		}
	}
}
