package sweep

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime/debug"
	"strings"

	"flame1d/casefile"
	"flame1d/chem"
	"flame1d/chem/mechtoml"
	"flame1d/internal/infile"
	"flame1d/output"
)

// Definition is everything that decides a sweep's results: the mechanism
// (by name and by the SHA-256 of its canonical TOML form, so an edited
// mechanism file is noticed), the mixture, the numerical settings, the
// swept values and how chains are laid out. Fuel, oxidizer, grid and solver
// are kept as their JSON encoding so that any change to them is seen. The
// case title and the solver's thread count do not change results and are
// left out.
type Definition struct {
	Mechanism         string          `json:"mechanism"`
	MechanismSHA256   string          `json:"mechanism_sha256"`
	Fuel              json.RawMessage `json:"fuel"`
	Oxidizer          json.RawMessage `json:"oxidizer"`
	Grid              json.RawMessage `json:"grid"`
	Solver            json.RawMessage `json:"solver"`
	EquivalenceRatios []float64       `json:"equivalence_ratios"`
	TemperaturesK     []float64       `json:"temperatures_K"`
	PressuresPa       []float64       `json:"pressures_Pa"`
	ContinueAlong     string          `json:"continue_along,omitempty"`
	// ColdStarts solves every point from a cold start (no continuation).
	ColdStarts bool `json:"cold_starts,omitempty"`
}

// DefinitionOf builds the sweep definition of a case on its loaded
// mechanism.
func DefinitionOf(c *casefile.Case, mech *chem.Mechanism, coldStarts bool) (Definition, error) {
	if c.Sweep == nil {
		return Definition{}, fmt.Errorf("%s: the case has no [sweep] table; add one (docs/sweeps.md), or use flame1d run for a single flame", c.File)
	}
	solver := c.Solver
	solver.Workers = 0
	d := Definition{
		Mechanism:         c.Mechanism,
		MechanismSHA256:   mechanismFingerprint(mech),
		EquivalenceRatios: c.Sweep.EquivalenceRatio,
		TemperaturesK:     c.Sweep.Temperature,
		PressuresPa:       c.Sweep.Pressure,
		ContinueAlong:     c.Sweep.ContinueAlong,
		ColdStarts:        coldStarts,
	}
	for _, f := range []struct {
		dst *json.RawMessage
		v   any
	}{{&d.Fuel, c.Fuel}, {&d.Oxidizer, c.Oxidizer}, {&d.Grid, c.Grid}, {&d.Solver, solver}} {
		b, err := json.Marshal(f.v)
		if err != nil {
			return Definition{}, fmt.Errorf("%s: sweep definition: %w", c.File, err)
		}
		*f.dst = b
	}
	return d, nil
}

// mechanismFingerprint is the SHA-256 of the mechanism written in flame1d's
// TOML format: equal for the same content whatever file it came from.
func mechanismFingerprint(m *chem.Mechanism) string {
	h := sha256.New()
	if err := mechtoml.Write(h, m); err != nil {
		return "not available: " + err.Error()
	}
	return hex.EncodeToString(h.Sum(nil))
}

// Differences lists, in words, how definition b differs from a; empty when
// they agree.
func (a Definition) Differences(b Definition) []string {
	var out []string
	str := func(name, x, y string) {
		if x != y {
			out = append(out, fmt.Sprintf("%s: %s, now %s", name, x, y))
		}
	}
	str("mechanism", a.Mechanism, b.Mechanism)
	if a.Mechanism == b.Mechanism && a.MechanismSHA256 != b.MechanismSHA256 {
		out = append(out, fmt.Sprintf("mechanism content: the mechanism %s has changed since the folder was started", a.Mechanism))
	}
	str("fuel", compact(a.Fuel), compact(b.Fuel))
	str("oxidizer", compact(a.Oxidizer), compact(b.Oxidizer))
	str("[grid] settings", compact(a.Grid), compact(b.Grid))
	str("[solver] settings", compact(a.Solver), compact(b.Solver))
	for _, v := range []struct {
		name string
		x, y []float64
	}{
		{"sweep.equivalence_ratio", a.EquivalenceRatios, b.EquivalenceRatios},
		{"sweep.temperature [K]", a.TemperaturesK, b.TemperaturesK},
		{"sweep.pressure [Pa]", a.PressuresPa, b.PressuresPa},
	} {
		str(v.name, describeValues(v.x), describeValues(v.y))
	}
	str("sweep.continue_along", quoted(a.ContinueAlong), quoted(b.ContinueAlong))
	if a.ColdStarts != b.ColdStarts {
		out = append(out, fmt.Sprintf("cold starts (--cold): %v, now %v", a.ColdStarts, b.ColdStarts))
	}
	return out
}

// compact renders JSON without layout, so that a definition read back from
// an indented manifest compares equal to a fresh one.
func compact(m json.RawMessage) string {
	var b bytes.Buffer
	if err := json.Compact(&b, m); err != nil {
		return string(m)
	}
	return b.String()
}

func quoted(s string) string {
	if s == "" {
		return "(chosen by the sweep)"
	}
	return fmt.Sprintf("%q", s)
}

// describeValues renders a value list short enough for a message but
// precise enough to tell two lists apart.
func describeValues(v []float64) string {
	parts := make([]string, len(v))
	for i, x := range v {
		parts[i] = output.FormatFloat(x)
	}
	if len(v) <= 8 {
		return "[" + strings.Join(parts, ", ") + "]"
	}
	return fmt.Sprintf("[%s, %s, %s, ..., %s, %s] (%d values)", parts[0], parts[1], parts[2], parts[len(v)-2], parts[len(v)-1], len(v))
}

// Manifest is sweep.json: what a sweep folder holds.
type Manifest struct {
	Format     string     `json:"format"`
	Title      string     `json:"title,omitempty"`
	Definition Definition `json:"definition"`
	Shard      Shard      `json:"shard"`
	// MergedFrom lists the shard folders a merged folder was joined from.
	MergedFrom []string `json:"merged_from,omitempty"`
	// Program identifies the flame1d build that started the folder.
	Program string `json:"program,omitempty"`
	Note    string `json:"note"`
}

const (
	manifestFormat = "flame1d sweep folder, version 1"
	manifestName   = "sweep.json"
)

func (m *Manifest) write(dir string) error {
	return output.WriteFileAtomic(filepath.Join(dir, manifestName), func(w io.Writer) error {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(m)
	})
}

// errNoManifest marks a folder without sweep.json.
var errNoManifest = errors.New("no sweep.json")

// ReadManifest reads dir/sweep.json.
func ReadManifest(dir string) (*Manifest, error) {
	path := filepath.Join(dir, manifestName)
	b, err := infile.ReadFile(path, infile.Record)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, fmt.Errorf("%s: %w: not a sweep output folder, or its sweep never started", dir, errNoManifest)
	}
	if err != nil {
		return nil, fmt.Errorf("sweep manifest: %w", err)
	}
	var m Manifest
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&m); err != nil {
		return nil, fmt.Errorf("%s: not a readable sweep manifest: %w", path, err)
	}
	if m.Format != manifestFormat {
		return nil, fmt.Errorf("%s: format %q, this flame1d reads %q", path, m.Format, manifestFormat)
	}
	m.Shard = m.Shard.normal()
	return &m, nil
}

// ProgramIdentity names this build of flame1d: module version, source
// revision (marked when the work tree had changes) and the start of the
// executable's SHA-256. Points solved by different builds may differ in the
// last digits.
func ProgramIdentity() string {
	parts := []string{"flame1d"}
	if bi, ok := debug.ReadBuildInfo(); ok {
		parts = append(parts, bi.Main.Version)
		rev, modified := "", false
		for _, s := range bi.Settings {
			switch s.Key {
			case "vcs.revision":
				rev = s.Value
			case "vcs.modified":
				modified = s.Value == "true"
			}
		}
		if rev != "" {
			if modified {
				rev += "+changes"
			}
			parts = append(parts, "revision "+rev)
		}
	}
	if exe, err := os.Executable(); err == nil {
		if f, err := os.Open(exe); err == nil {
			h := sha256.New()
			if _, err := io.Copy(h, f); err == nil {
				parts = append(parts, "executable sha256 "+hex.EncodeToString(h.Sum(nil))[:16])
			}
			f.Close()
		}
	}
	return strings.Join(parts, " ")
}

// claimFolder writes the manifest into a new or empty folder, or checks it
// against the manifest already there: a folder holds one sweep (one shard of
// it) only. It returns a warning when the folder was started by another
// build of flame1d.
func claimFolder(dir string, m *Manifest) (warning string, err error) {
	old, err := ReadManifest(dir)
	if errors.Is(err, errNoManifest) {
		if entries, _ := os.ReadDir(dir); len(entries) > 0 {
			return "", fmt.Errorf("%s is not empty and holds no sweep.json: give a new or empty folder for the sweep", dir)
		}
		return "", m.write(dir)
	}
	if err != nil {
		return "", err
	}
	diffs := old.Definition.Differences(m.Definition)
	if old.Shard != m.Shard {
		diffs = append(diffs, fmt.Sprintf("shard: %v, now %v", old.Shard, m.Shard))
	}
	if len(old.MergedFrom) > 0 {
		diffs = append(diffs, "the folder holds merged results, not a sweep run")
	}
	if len(diffs) > 0 {
		return "", fmt.Errorf("%s holds a different sweep than this one (%s); use a new output folder, or restore the case as it was to continue that sweep",
			dir, strings.Join(diffs, "; "))
	}
	if old.Program != m.Program {
		warning = fmt.Sprintf("%s was started by another build of flame1d (%s; this is %s): the points solved now may differ from an uninterrupted run in the last digits",
			dir, old.Program, m.Program)
	}
	if old.Title != m.Title {
		// Keep the first build's identity: the warning holds for every later run.
		m.Program = old.Program
		return warning, m.write(dir)
	}
	return warning, nil
}
