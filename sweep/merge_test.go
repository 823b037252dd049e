package sweep

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// runShards runs every shard of a sweep into root/shard-I, each with its
// own worker count, as separate cluster tasks would.
func runShards(t *testing.T, sweepTable, root string, n int) []string {
	t.Helper()
	var dirs []string
	for i := 0; i < n; i++ {
		dir := filepath.Join(root, fmt.Sprintf("shard-%d", i))
		opt, _ := fakeOptions(1+i%2, nil)
		opt.Shard = Shard{Index: i, Count: n}
		runSweep(t, sweepCase(t, sweepTable), dir, opt)
		dirs = append(dirs, dir)
	}
	return dirs
}

func TestShardsMergeToTheSingleRun(t *testing.T) {
	single := filepath.Join(t.TempDir(), "single")
	opt, _ := fakeOptions(2, nil)
	runSweep(t, sweepCase(t, fakeSweep), single, opt)
	want := reproducible(t, single)

	for _, n := range []int{2, 3, 4} {
		root := t.TempDir()
		dirs := runShards(t, fakeSweep, root, n)
		out := filepath.Join(root, "merged")
		// The order of the folders on the command line does not matter.
		rev := append([]string(nil), dirs...)
		for i, j := 0, len(rev)-1; i < j; i, j = i+1, j-1 {
			rev[i], rev[j] = rev[j], rev[i]
		}
		sum, err := Merge(rev, out)
		if err != nil {
			t.Fatalf("%d shards: %v", n, err)
		}
		if sum.Points != 36 || sum.Solved != 36 || sum.Shards != n {
			t.Errorf("%d shards: summary %+v", n, sum)
		}
		sameTables(t, fmt.Sprintf("merge of %d shards vs single run", n), reproducible(t, out), want)
		// The comment header is the single run's too.
		a, _ := ReadResults(filepath.Join(out, ResultsName))
		b, _ := ReadResults(filepath.Join(single, ResultsName))
		if strings.Join(a.Comments, "\n") != strings.Join(b.Comments, "\n") {
			t.Errorf("merged header %q differs from %q", a.Comments, b.Comments)
		}
		if _, err := os.Stat(filepath.Join(out, PlotName(EquivalenceRatio)+".svg")); err != nil {
			t.Errorf("merged plot: %v", err)
		}
	}
}

func TestMergeRefusesIncompleteOrMixedShards(t *testing.T) {
	root := t.TempDir()
	dirs := runShards(t, fakeSweep, root, 4)
	other := runShards(t, strings.Replace(fakeSweep, `"400 K"`, `"450 K"`, 1), t.TempDir(), 4)

	// A shard interrupted after its first point.
	partial := filepath.Join(root, "partial-1")
	opt, _ := fakeOptions(1, nil)
	opt.Shard = Shard{Index: 1, Count: 4}
	c := sweepCase(t, fakeSweep)
	runSweep(t, c, partial, opt)
	tab, err := ReadResults(filepath.Join(partial, ResultsName))
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range tab.Rows[1:] {
		for k := Column(ColStatus); k < len(r); k++ {
			r[k] = ""
		}
		r[Column(ColStatus)] = string(Pending)
	}
	f, err := os.Create(filepath.Join(partial, ResultsName))
	if err != nil {
		t.Fatal(err)
	}
	if err := tab.WriteCSV(f); err != nil {
		t.Fatal(err)
	}
	f.Close()

	for _, tc := range []struct {
		name string
		dirs []string
		want []string
	}{
		{"missing shard", []string{dirs[0], dirs[1], dirs[3]},
			[]string{"missing shard 2/4 (9 points, expected in " + filepath.Join(root, "shard-2") + ")"}},
		{"two missing shards", []string{dirs[0], dirs[3]}, []string{"shard 1/4", "shard 2/4"}},
		{"shard given twice", []string{dirs[0], dirs[1], dirs[1], dirs[2], dirs[3]}, []string{"shard 1/4 is given twice"}},
		{"shards of different sweeps", []string{dirs[0], dirs[1], other[2], dirs[3]},
			[]string{"hold different sweeps", "sweep.temperature [K]: [298, 400], now [298, 450]"}},
		{"pending points", []string{dirs[0], partial, dirs[2], dirs[3]},
			[]string{"8 point(s) missing", "not solved yet", "partial-1"}},
		{"not a sweep folder", []string{dirs[0], t.TempDir()}, []string{"no sweep.json"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out := filepath.Join(t.TempDir(), "merged")
			_, err := Merge(tc.dirs, out)
			if err == nil {
				t.Fatal("no error")
			}
			for _, w := range tc.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not say %q", err, w)
				}
			}
			if _, err := os.Stat(filepath.Join(out, ResultsName)); err == nil {
				t.Error("a refused merge wrote results")
			}
		})
	}
}

func TestMergeRefusesDuplicatedOrForeignRows(t *testing.T) {
	for _, tc := range []struct {
		name string
		row  func(a, b *Table) []string // the row added to shard 1's table
		want string
	}{
		{"duplicated row", func(a, b *Table) []string { return b.Rows[0] }, "appears twice"},
		{"row of another shard", func(a, b *Table) []string { return a.Rows[0] }, "belongs to shard 0/2, not 1/2"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			root := t.TempDir()
			dirs := runShards(t, fakeSweep, root, 2)
			a, _ := ReadResults(filepath.Join(dirs[0], ResultsName))
			b, _ := ReadResults(filepath.Join(dirs[1], ResultsName))
			extra := tc.row(a, b)
			b.Rows = append(b.Rows, extra)
			f, err := os.Create(filepath.Join(dirs[1], ResultsName))
			if err != nil {
				t.Fatal(err)
			}
			if err := b.WriteCSV(f); err != nil {
				t.Fatal(err)
			}
			f.Close()
			_, err = Merge(dirs, filepath.Join(root, "merged"))
			if err == nil || !strings.Contains(err.Error(), extra[0]) || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want one naming %s and saying %q", err, extra[0], tc.want)
			}
		})
	}
}

// merge -o refuses an input shard folder and a folder of the user's own
// files, leaving both as they were; an earlier merge is replaced whole
// (issue 11, item 4).
func TestMergeOutputGuard(t *testing.T) {
	root := t.TempDir()
	dirs := runShards(t, fakeSweep, root, 2)
	shardTable, _ := os.ReadFile(filepath.Join(dirs[0], ResultsName))

	if _, err := Merge(dirs, dirs[0]); err == nil || !strings.Contains(err.Error(), "is the shard folder") {
		t.Errorf("-o onto an input shard: %v", err)
	}
	if b, _ := os.ReadFile(filepath.Join(dirs[0], ResultsName)); string(b) != string(shardTable) {
		t.Error("the shard's table changed")
	}
	if m, err := ReadManifest(dirs[0]); err != nil || len(m.MergedFrom) > 0 {
		t.Errorf("the shard's manifest changed: %+v, %v", m, err)
	}

	own := filepath.Join(root, "mine")
	os.MkdirAll(own, 0o755)
	os.WriteFile(filepath.Join(own, ResultsName), []byte("my own results\n"), 0o644)
	if _, err := Merge(dirs, own); err == nil || !strings.Contains(err.Error(), "holds no earlier merge") {
		t.Errorf("-o onto a folder of own files: %v", err)
	}
	if b, _ := os.ReadFile(filepath.Join(own, ResultsName)); string(b) != "my own results\n" {
		t.Errorf("own results.csv overwritten: %q", b)
	}

	// Another sweep's folder that was not given as input is refused too.
	other := filepath.Join(root, "other")
	opt, _ := fakeOptions(1, nil)
	runSweep(t, sweepCase(t, "equivalence_ratio = [0.8, 1.0]"), other, opt)
	if _, err := Merge(dirs, other); err == nil || !strings.Contains(err.Error(), "holds a sweep run") {
		t.Errorf("-o onto another sweep: %v", err)
	}

	merged := filepath.Join(root, "merged")
	for i := 0; i < 2; i++ {
		if _, err := Merge(dirs, merged); err != nil {
			t.Fatalf("merge %d into %s: %v", i+1, merged, err)
		}
	}
	left, _ := filepath.Glob(filepath.Join(root, ".*"))
	if len(left) > 0 {
		t.Errorf("temporary folders left: %v", left)
	}
}
