package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"flame1d/sweep"
)

// buildFlame1d compiles the command into a temporary folder.
func buildFlame1d(t *testing.T) string {
	t.Helper()
	exe := filepath.Join(t.TempDir(), "flame1d")
	out, err := exec.Command("go", "build", "-o", exe, ".").CombinedOutput()
	if err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	return exe
}

const killCase = `title = "kill test"
mechanism = "burke2012-hydrogen"
[mixture]
fuel = { H2 = 1.0 }
equivalence_ratio = 1.0
temperature = "298 K"
[sweep]
equivalence_ratio = { from = 0.6, to = 1.6, step = 0.1 }
`

// committed returns the point records in a sweep folder, by id.
func committed(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	paths, _ := filepath.Glob(filepath.Join(dir, "points", "*", "point.json"))
	out := map[string][]byte{}
	for _, p := range paths {
		if strings.HasPrefix(filepath.Base(filepath.Dir(p)), ".") {
			continue // a point's folder still being written (an output.Set)
		}
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		out[filepath.Base(filepath.Dir(p))] = b
	}
	return out
}

// tableWithoutWallTime returns results.csv with the wall-time column blanked.
func tableWithoutWallTime(t *testing.T, dir string) string {
	t.Helper()
	tab, err := sweep.ReadResults(filepath.Join(dir, sweep.ResultsName))
	if err != nil {
		t.Fatal(err)
	}
	var b strings.Builder
	for _, r := range tab.Rows {
		r[sweep.Column(sweep.ColWallTime)] = ""
		b.WriteString(strings.Join(r, ",") + "\n")
	}
	return b.String()
}

// A sweep killed with SIGKILL (no chance to clean up) and run again with the
// same output folder keeps the points committed before the kill, solves only
// the others, and writes the table an uninterrupted run writes.
func TestSweepSurvivesKill(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the command and solves hydrogen flames")
	}
	exe := buildFlame1d(t)
	work := t.TempDir()
	casePath := filepath.Join(work, "case.toml")
	if err := os.WriteFile(casePath, []byte(killCase), 0o644); err != nil {
		t.Fatal(err)
	}
	ref := filepath.Join(work, "ref")
	if out, err := exec.Command(exe, "sweep", casePath, "-o", ref, "-q", "-j", "2").CombinedOutput(); err != nil {
		t.Fatalf("reference sweep: %v\n%s", err, out)
	}

	dir := filepath.Join(work, "killed")
	cmd := exec.Command(exe, "sweep", casePath, "-o", dir, "-q", "-j", "2")
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	deadline := time.Now().Add(2 * time.Minute)
	for len(committed(t, dir)) < 3 && time.Now().Before(deadline) {
		time.Sleep(20 * time.Millisecond)
	}
	if err := cmd.Process.Kill(); err != nil {
		t.Fatal(err)
	}
	_ = cmd.Wait()
	before := committed(t, dir)
	if len(before) < 3 || len(before) == 11 {
		t.Fatalf("%d points committed at the kill; the test needs a sweep stopped part-way", len(before))
	}

	var stdout bytes.Buffer
	rerun := exec.Command(exe, "sweep", casePath, "-o", dir, "-q", "-j", "2")
	rerun.Stdout, rerun.Stderr = &stdout, &stdout
	if err := rerun.Run(); err != nil {
		t.Fatalf("rerun: %v\n%s", err, stdout.String())
	}
	// Records committed before the kill are untouched: not solved again.
	after := committed(t, dir)
	for id, b := range before {
		if !bytes.Equal(after[id], b) {
			t.Errorf("%s was solved again after the kill", id)
		}
	}
	if want := "kept from an earlier run"; !strings.Contains(stdout.String(), want) {
		t.Errorf("rerun output does not say %q:\n%s", want, stdout.String())
	}
	if got, want := tableWithoutWallTime(t, dir), tableWithoutWallTime(t, ref); got != want {
		t.Errorf("table after kill and rerun:\n%s\nuninterrupted:\n%s", got, want)
	}
	t.Logf("%d of 11 points were committed at the kill", len(before))
}

// shardableSweep builds the command, writes a case of three chains (three
// temperatures) into a new folder and solves it in one run into
// work/single.
func shardableSweep(t *testing.T) (exe, work, casePath, single string) {
	t.Helper()
	exe = buildFlame1d(t)
	work = t.TempDir()
	casePath = filepath.Join(work, "case.toml")
	src := strings.Replace(killCase, "{ from = 0.6, to = 1.6, step = 0.1 }", "[0.8, 1.0, 1.2]\ntemperature = [\"298 K\", \"350 K\", \"400 K\"]", 1)
	if err := os.WriteFile(casePath, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	single = filepath.Join(work, "single")
	if out, err := exec.Command(exe, "sweep", casePath, "-o", single, "-q").CombinedOutput(); err != nil {
		t.Fatalf("single sweep: %v\n%s", err, out)
	}
	return exe, work, casePath, single
}

// merge names a missing shard and joins complete ones into the table of a
// single run.
func TestMergeCommand(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the command and solves hydrogen flames")
	}
	exe, work, casePath, single := shardableSweep(t)
	var shards []string
	for i := 0; i < 3; i++ {
		dir := filepath.Join(work, "out", "shard-"+string(rune('0'+i)))
		shards = append(shards, dir)
		if out, err := exec.Command(exe, "sweep", casePath, "-o", dir, "-q", "-j", "1", "--shard", string(rune('0'+i))+"/3").CombinedOutput(); err != nil {
			t.Fatalf("shard %d: %v\n%s", i, err, out)
		}
	}
	out, err := exec.Command(exe, "merge", shards[0], shards[2], "-o", filepath.Join(work, "partial")).CombinedOutput()
	if err == nil || !strings.Contains(string(out), "missing shard 1/3") || !strings.Contains(string(out), filepath.Join(work, "out", "shard-1")) {
		t.Errorf("merge without shard 1: %v\n%s", err, out)
	}
	merged := filepath.Join(work, "merged")
	if out, err := exec.Command(exe, "merge", shards[0], shards[1], shards[2], "-o", merged).CombinedOutput(); err != nil {
		t.Fatalf("merge: %v\n%s", err, out)
	}
	if got, want := tableWithoutWallTime(t, merged), tableWithoutWallTime(t, single); got != want {
		t.Errorf("merged table:\n%s\nsingle run:\n%s", got, want)
	}
	out, err = exec.Command(exe, "fit", filepath.Join(merged, sweep.ResultsName), "--eval", "1.0,320 K,1 atm").CombinedOutput()
	if err != nil || !strings.Contains(string(out), "alpha_0") || !strings.Contains(string(out), "S_L(phi 1, 320 K, 101325 Pa)") {
		t.Errorf("fit of the merged table: %v\n%s", err, out)
	}
}

// The Slurm scripts of examples/cluster, run task by task without Slurm
// (SLURM_ARRAY_TASK_ID set in turn), merge into the single run's table.
func TestSlurmScripts(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the command and solves hydrogen flames")
	}
	if _, err := exec.LookPath("bash"); err != nil {
		t.Skip("no bash")
	}
	exe, work, casePath, single := shardableSweep(t)
	out := filepath.Join(work, "out")
	env := append(os.Environ(), "SHARDS=3", "CASE="+casePath, "OUT="+out, "FLAME1D="+exe, "SLURM_CPUS_PER_TASK=1")
	scripts := filepath.Join("..", "..", "examples", "cluster")
	for i := 0; i < 3; i++ {
		cmd := exec.Command("bash", filepath.Join(scripts, "slurm-sweep.sh"))
		cmd.Env = append(env, "SLURM_ARRAY_TASK_ID="+string(rune('0'+i)))
		if b, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("array task %d: %v\n%s", i, err, b)
		}
	}
	cmd := exec.Command("bash", filepath.Join(scripts, "slurm-merge.sh"))
	cmd.Env = env
	if b, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("merge job: %v\n%s", err, b)
	}
	if got, want := tableWithoutWallTime(t, filepath.Join(out, "merged")), tableWithoutWallTime(t, single); got != want {
		t.Errorf("merged table:\n%s\nsingle run:\n%s", got, want)
	}
	if _, err := os.Stat(filepath.Join(out, "merged", "correlation.toml")); err != nil {
		t.Errorf("merge job wrote no correlation: %v", err)
	}
}
