package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"flame1d/builtin"
	"flame1d/chem/keyblock"
	"flame1d/chem/mechtoml"
	"flame1d/internal/shareddata"
)

// sharedMechanisms is shareddata.MechanismsDir.
func sharedMechanisms(t *testing.T) string { t.Helper(); return shareddata.MechanismsDir(t) }

const brokenMech = `! broken on purpose
ELEMENTS H O END
SPECIES H O OH END
THERMO ALL
   300.000  1000.000  5000.000
H                 test  H   1               G   300.000  5000.000  1000.000    1
 2.50000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00    2
END
REACTIONS
H+O<=>OH2     1e13 0 0
END
`

// countLine matches a summary line such as "    falloff   29".
func countLine(label, n string) *regexp.Regexp {
	return regexp.MustCompile(`(?m)^\s+` + regexp.QuoteMeta(label) + `\s+` + n + `\s*$`)
}

func TestMechCheckClassic(t *testing.T) {
	d := filepath.Join(sharedMechanisms(t), "gri30")
	var out bytes.Buffer
	err := runMechCheck(&out, []string{filepath.Join(d, "mech.inp")},
		mechCheckOptions{thermo: filepath.Join(d, "thermo.dat"), transport: filepath.Join(d, "transport.dat"), maxProblems: 50})
	if err != nil {
		t.Fatalf("%v\n%s", err, out.String())
	}
	// gri30/PROVENANCE.md: 53 species, 325 reactions, 29 falloff, 6 DUPLICATE, 16 '=>'.
	for _, re := range []*regexp.Regexp{
		countLine("species", "53   53 with transport data, 0 condensed"), countLine("reactions", "325"),
		countLine("falloff", "29"), countLine("duplicates", "6"), countLine("irreversible", "16"),
		countLine("problems: 0 error(s), 0 warning(s)", ""),
	} {
		if !re.MatchString(out.String()) {
			t.Errorf("summary lacks %v:\n%s", re, out.String())
		}
	}
}

func TestMechCheckBroken(t *testing.T) {
	path := filepath.Join(t.TempDir(), "broken.inp")
	if err := os.WriteFile(path, []byte(brokenMech), 0o644); err != nil {
		t.Fatal(err)
	}
	var out bytes.Buffer
	err := runMechCheck(&out, []string{path}, mechCheckOptions{maxProblems: 50})
	if err == nil || !strings.Contains(err.Error(), "1 of 1 file(s) have errors") {
		t.Fatalf("err = %v", err)
	}
	for _, want := range []string{
		path + ":6: error: truncated thermo record \"H\"",
		path + ":10: error: products: unknown species \"OH2\" in reaction 'H+O<=>OH2'",
		path + ":3: error: species 'O' has no thermo record (searched the THERMO block of " + path + ")",
	} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("output lacks %q:\n%s", want, out.String())
		}
	}
}

func TestMechImport(t *testing.T) {
	d := filepath.Join(sharedMechanisms(t), "h2o2")
	dir := t.TempDir()
	cite := filepath.Join(dir, "cite.txt")
	if err := os.WriteFile(cite, []byte("Burke et al., Int. J. Chem. Kinet. 44 (2012) 444\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "hydrogen.toml")
	o := mechImportOptions{reactions: filepath.Join(d, "mech.inp"), transport: filepath.Join(d, "transport.dat"),
		output: out, name: "burke2012-hydrogen-copy", descriptionFile: cite}
	var stdout, stderr bytes.Buffer
	if err := runMechImport(&stdout, &stderr, o); err != nil {
		t.Fatalf("%v\n%s", err, stderr.String())
	}
	back, _, err := mechtoml.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	direct, _, err := keyblock.ReadFiles(o.reactions, "", o.transport)
	if err != nil {
		t.Fatal(err)
	}
	if back.Name != "burke2012-hydrogen-copy" || !strings.HasPrefix(back.Description, "Burke et al.") ||
		!strings.Contains(back.Description, "Imported by flame1d from mech.inp, transport.dat") {
		t.Errorf("name %q description %q", back.Name, back.Description)
	}
	if len(back.Species) != 13 || len(back.Reactions) != 27 {
		t.Fatalf("%d species, %d reactions", len(back.Species), len(back.Reactions))
	}
	// The TOML file carries the imported numbers exactly.
	for i := range direct.Reactions {
		a, b := direct.Reactions[i], back.Reactions[i]
		if a.Rate != b.Rate || a.Form != b.Form || (a.FalloffRate != nil && a.FalloffRate.Low != b.FalloffRate.Low) {
			t.Errorf("reaction %d (%s) changed through the TOML file: %+v vs %+v", i+1, a.Equation, a.Rate, b.Rate)
		}
	}
	if err := runMechImport(&stdout, &stderr, o); err == nil || !strings.Contains(err.Error(), "--force") {
		t.Errorf("existing output overwritten without --force: %v", err)
	}
	o.force = true
	if err := runMechImport(&stdout, &stderr, o); err != nil {
		t.Errorf("--force: %v", err)
	}
}

func TestMechImportRefusesErrors(t *testing.T) {
	dir := t.TempDir()
	in, out := filepath.Join(dir, "broken.inp"), filepath.Join(dir, "broken.toml")
	if err := os.WriteFile(in, []byte(brokenMech), 0o644); err != nil {
		t.Fatal(err)
	}
	var stdout, stderr bytes.Buffer
	err := runMechImport(&stdout, &stderr, mechImportOptions{reactions: in, output: out})
	if err == nil || !strings.Contains(stderr.String(), in+":10: error: products: unknown species \"OH2\"") {
		t.Fatalf("err %v stderr %s", err, stderr.String())
	}
	if _, err := os.Stat(out); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("output written despite errors: %v", err)
	}
}

// TestMechBinary builds the flame1d binary and runs it as a user would.
func TestMechBinary(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the binary; skipped with -short")
	}
	goTool, err := exec.LookPath("go")
	if err != nil {
		t.Skip("go tool not on PATH")
	}
	d := sharedMechanisms(t)
	dir := t.TempDir()
	bin := filepath.Join(dir, "flame1d")
	if b, err := exec.Command(goTool, "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, b)
	}
	broken := filepath.Join(dir, "broken.inp")
	if err := os.WriteFile(broken, []byte(brokenMech), 0o644); err != nil {
		t.Fatal(err)
	}
	toml := filepath.Join(dir, "natgas.toml")
	tests := []struct {
		name     string
		args     []string
		exitCode int
		want     string
	}{
		{"import GRI-Mech 3.0", []string{"mech", "import", "-r", filepath.Join(d, "gri30", "mech.inp"), "--thermo", filepath.Join(d, "gri30", "thermo.dat"),
			"--transport", filepath.Join(d, "gri30", "transport.dat"), "-o", toml}, 0, "53 species, 325 reactions"},
		{"check the TOML file", []string{"mech", "check", toml}, 0, "problems: 0 error(s), 0 warning(s)"},
		{"check a broken file", []string{"mech", "check", broken}, 1, `unknown species "OH2"`},
		{"import a broken file", []string{"mech", "import", broken, "-o", filepath.Join(dir, "x.toml")}, 1, "import of " + broken + " failed"},
		{"help has examples", []string{"mech", "check", "--help"}, 0, "Examples:"},
		{"check a built-in by name", []string{"mech", "check", "smith1999-natgas"}, 0, "problems: 0 error(s), 0 warning(s)"},
		{"list the built-ins", []string{"mech", "list"}, 0, "ranzi2012-c1c3: 114 species, 1999 reactions"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			cmd := exec.Command(bin, tc.args...)
			var buf bytes.Buffer
			cmd.Stdout, cmd.Stderr = &buf, &buf
			err := cmd.Run()
			code := 0
			var exit *exec.ExitError
			if errors.As(err, &exit) {
				code = exit.ExitCode()
			} else if err != nil {
				t.Fatal(err)
			}
			if code != tc.exitCode || !strings.Contains(buf.String(), tc.want) {
				t.Errorf("exit %d (want %d), output lacks %q:\n%s", code, tc.exitCode, tc.want, buf.String())
			}
		})
	}
}

// TestMechListAndCheckBuiltin: "mech list" shows every built-in with its
// size and validity, as text and JSON; "mech check NAME" reads a built-in
// by name (it once failed with "open ...: no such file").
func TestMechListAndCheckBuiltin(t *testing.T) {
	var out bytes.Buffer
	if err := runMechList(&out, mechListOptions{}); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{
		"smith1999-natgas: 53 species, 325 reactions", "ranzi2012-c1c3: 114 species, 1999 reactions",
		"validated for: fuels CH4, C2H6;", "cite: E. Ranzi", "quoted from memory",
	} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("mech list lacks %q:\n%s", want, out.String())
		}
	}
	out.Reset()
	if err := runMechList(&out, mechListOptions{json: true}); err != nil {
		t.Fatal(err)
	}
	var entries []map[string]any
	if err := json.Unmarshal(out.Bytes(), &entries); err != nil {
		t.Fatalf("mech list --json: %v\n%s", err, out.String())
	}
	if len(entries) != len(builtin.Names()) || entries[0]["name"] != "burke2012-hydrogen" || entries[0]["species"] != 13.0 {
		t.Errorf("mech list --json = %v", entries)
	}
	out.Reset()
	if err := runMechCheck(&out, []string{"burke2012-hydrogen"}, mechCheckOptions{maxProblems: 50}); err != nil {
		t.Fatalf("%v\n%s", err, out.String())
	}
	for _, re := range []*regexp.Regexp{
		regexp.MustCompile(`(?m)^burke2012-hydrogen \(built-in mechanism\)$`), countLine("reactions", "27"),
		regexp.MustCompile(`validated for: fuels H2; pressure 0.3-87 atm`),
	} {
		if !re.MatchString(out.String()) {
			t.Errorf("mech check output lacks %v:\n%s", re, out.String())
		}
	}
}
