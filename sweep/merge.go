package sweep

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"flame1d/output"
)

// MergeSummary is the outcome of a merge.
type MergeSummary struct {
	Out            string
	Shards, Points int
	Solved, Failed int
	Definition     Definition
	ShardFolders   []string // by shard index
	FailedIDs      []string
	// Warnings are worth a look but did not stop the merge.
	Warnings []string
}

// Merge joins the results of the shards of one sweep, each in its own
// folder, into out: results.csv in table order (identical to the table a
// single unsharded run writes, apart from wall_time), sweep.json and the
// plots. It refuses shards of different sweeps, shards given twice, missing
// shards (named by index, with the folder name they would likely have),
// points missing from a shard's table or still pending, and points that
// appear twice. The point folders stay where they are.
func Merge(dirs []string, out string) (*MergeSummary, error) {
	if len(dirs) == 0 {
		return nil, fmt.Errorf("merge: give the shard folders to join")
	}
	var first *Manifest
	byShard := map[int]string{}
	manifests := map[int]*Manifest{}
	for _, d := range dirs {
		m, err := ReadManifest(d)
		if err != nil {
			return nil, fmt.Errorf("merge: %w", err)
		}
		if len(m.MergedFrom) > 0 {
			return nil, fmt.Errorf("merge: %s holds merged results; give the shard folders themselves", d)
		}
		if first == nil {
			first = m
		} else {
			if diffs := first.Definition.Differences(m.Definition); len(diffs) > 0 {
				return nil, fmt.Errorf("merge: %s and %s hold different sweeps (%s)", dirs[0], d, strings.Join(diffs, "; "))
			}
			if m.Shard.Count != first.Shard.Count {
				return nil, fmt.Errorf("merge: %s is shard %v but %s is shard %v: the shards come from splits into different numbers",
					dirs[0], first.Shard, d, m.Shard)
			}
		}
		if prev, dup := byShard[m.Shard.Index]; dup {
			return nil, fmt.Errorf("merge: shard %v is given twice: %s and %s", m.Shard, prev, d)
		}
		byShard[m.Shard.Index] = d
		manifests[m.Shard.Index] = m
	}
	if err := checkMergeFolder(out, dirs); err != nil {
		return nil, err
	}
	plan, err := NewPlan(first.Definition)
	if err != nil {
		return nil, fmt.Errorf("merge: %w", err)
	}
	n := first.Shard.Count
	var missingShards []string
	for i := 0; i < n; i++ {
		if _, ok := byShard[i]; !ok {
			pts, _ := plan.ShardPoints(Shard{Index: i, Count: n})
			missingShards = append(missingShards, fmt.Sprintf("shard %d/%d (%d points%s)", i, n, len(pts), likelyFolder(byShard, i)))
		}
	}
	if len(missingShards) > 0 {
		return nil, fmt.Errorf("merge: missing %s; run it, or give its folder", strings.Join(missingShards, ", "))
	}
	rows := make([][]string, len(plan.Points))
	from := make([]string, len(plan.Points))
	var problems []string
	for idx := 0; idx < n; idx++ {
		dir := byShard[idx]
		t, err := ReadResults(filepath.Join(dir, ResultsName))
		if err != nil {
			return nil, fmt.Errorf("merge: shard %d/%d: %w", idx, n, err)
		}
		for k, r := range t.Rows {
			i, ok := plan.Index(r[0])
			if !ok {
				return nil, fmt.Errorf("merge: %s:%d: point %s is not part of the sweep", t.file, t.lines[k], r[0])
			}
			if s := ShardOfChain(plan.Points[i].Chain, n); s != idx {
				return nil, fmt.Errorf("merge: %s:%d: point %s belongs to shard %d/%d, not %d/%d", t.file, t.lines[k], r[0], s, n, idx, n)
			}
			if rows[i] != nil {
				return nil, fmt.Errorf("merge: point %s appears twice (%s and %s)", r[0], from[i], t.file)
			}
			rows[i], from[i] = r, t.file
		}
	}
	sum := &MergeSummary{Out: out, Shards: n, Points: len(plan.Points), Definition: first.Definition}
	programs := map[string][]string{}
	for i := 0; i < n; i++ {
		sum.ShardFolders = append(sum.ShardFolders, byShard[i])
		p := manifests[i].Program
		programs[p] = append(programs[p], fmt.Sprint(i))
	}
	if len(programs) > 1 {
		var parts []string
		for _, p := range sortedKeys(programs) {
			parts = append(parts, fmt.Sprintf("shard(s) %s by %s", strings.Join(programs[p], ", "), p))
		}
		sum.Warnings = append(sum.Warnings, "the shards were solved by different builds of flame1d ("+strings.Join(parts, "; ")+
			"): the merged table may differ from a single run in the last digits")
	}
	recs := make(map[int]*Record)
	var missing []string
	for i, r := range rows {
		id := plan.Points[i].ID
		shard := ShardOfChain(plan.Points[i].Chain, n)
		switch {
		case r == nil:
			missing = append(missing, fmt.Sprintf("%s (shard %d, %s: not in its table)", id, shard, byShard[shard]))
		case Status(r[Column(ColStatus)]) == Pending:
			missing = append(missing, fmt.Sprintf("%s (shard %d, %s: not solved yet; run that shard again to finish it)", id, shard, byShard[shard]))
		case Status(r[Column(ColStatus)]) == Failed:
			sum.Failed++
			sum.FailedIDs = append(sum.FailedIDs, id)
			recs[i] = &Record{ID: id, Status: Failed}
		default:
			sum.Solved++
			v, err := strconv.ParseFloat(r[Column(ColFlameSpeed)], 64)
			if err != nil {
				problems = append(problems, fmt.Sprintf("%s: S_L %q is not a number", id, r[Column(ColFlameSpeed)]))
			}
			recs[i] = &Record{ID: id, Status: Solved, FlameSpeed: v}
		}
	}
	if len(missing) > 0 {
		problems = append(problems, fmt.Sprintf("%d point(s) missing: %s", len(missing), limitList(missing, 10)))
	}
	if len(problems) > 0 {
		return nil, fmt.Errorf("merge: %s", strings.Join(problems, "; "))
	}
	abs := make([]string, n)
	for i := range abs {
		abs[i] = byShard[i]
	}
	m := &Manifest{Format: manifestFormat, Title: first.Title, Definition: first.Definition, Shard: Shard{0, 1},
		MergedFrom: abs, Note: output.SafetyNote}
	set, err := output.NewOwnedSet(out)
	if err != nil {
		return nil, fmt.Errorf("merge: %w", err)
	}
	defer set.Abort()
	if err := m.write(set.Dir()); err != nil {
		return nil, err
	}
	t := &Table{Comments: resultsComments(first.Title, first.Definition), Rows: rows}
	if err := set.WriteFile(ResultsName, t.WriteCSV); err != nil {
		return nil, err
	}
	all := make([]int, len(plan.Points))
	for i := range all {
		all[i] = i
	}
	if err := writePlots(set.Dir(), first.Title, plan, all, recs); err != nil {
		return nil, err
	}
	if err := set.Commit(); err != nil {
		return nil, fmt.Errorf("merge: %w", err)
	}
	return sum, nil
}

// checkMergeFolder refuses a merge output folder that is one of the input
// shards (the shard would turn into merged results and stop being
// resumable), or that holds anything but an earlier merge: a sweep or
// shard folder, or files of the user's own such as a results.csv. A new or
// empty folder, or an earlier merge, is replaced as a whole.
func checkMergeFolder(out string, dirs []string) error {
	info, err := os.Stat(out)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return fmt.Errorf("merge: -o %s: %w", out, err)
	}
	if !info.IsDir() {
		return fmt.Errorf("merge: -o %s is a file; give a folder for the merged results", out)
	}
	for _, d := range dirs {
		if di, err := os.Stat(d); err == nil && os.SameFile(info, di) {
			return fmt.Errorf("merge: -o %s is the shard folder %s; give a new folder for the merged results (the shard must stay resumable)", out, d)
		}
	}
	entries, err := os.ReadDir(out)
	if err != nil {
		return fmt.Errorf("merge: -o %s: %w", out, err)
	}
	if len(entries) == 0 {
		return nil
	}
	m, err := ReadManifest(out)
	switch {
	case errors.Is(err, errNoManifest):
		return fmt.Errorf("merge: -o %s is not empty (%s, ...) and holds no earlier merge; give a new or empty folder", out, entries[0].Name())
	case err != nil:
		return fmt.Errorf("merge: -o %s: %w", out, err)
	case len(m.MergedFrom) == 0:
		return fmt.Errorf("merge: -o %s holds a sweep run (shard %v), not an earlier merge; give a new folder for the merged results", out, m.Shard)
	}
	return nil
}

// likelyFolder guesses the folder of a missing shard from the names of the
// others: when each present folder's name ends in its own index
// (out/shard-0, out/shard-1, ...), the missing one is the same name with
// its index.
func likelyFolder(byShard map[int]string, missing int) string {
	re := regexp.MustCompile(`^(.*?)(\d+)$`)
	guess := ""
	indices := make([]int, 0, len(byShard))
	for i := range byShard {
		indices = append(indices, i)
	}
	sort.Ints(indices)
	for _, i := range indices {
		d := filepath.Clean(byShard[i])
		mm := re.FindStringSubmatch(d)
		if mm == nil || mm[2] != strconv.Itoa(i) {
			return ""
		}
		g := mm[1] + strconv.Itoa(missing)
		if guess != "" && g != guess {
			return ""
		}
		guess = g
	}
	if guess == "" {
		return ""
	}
	return ", expected in " + guess
}

func limitList(items []string, n int) string {
	if len(items) <= n {
		return strings.Join(items, ", ")
	}
	return strings.Join(items[:n], ", ") + fmt.Sprintf(", and %d more", len(items)-n)
}
