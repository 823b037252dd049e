// Package builtin holds the reaction mechanisms that ship inside flame1d,
// so that their names work on a machine without any data files. Every
// built-in is named first author, year of publication and what it burns:
// smith1999-natgas (GRI-Mech 3.0), burke2012-hydrogen (Burke et al. 2012
// hydrogen/oxygen), lu2009-heptane (Lu et al. 2009 skeletal n-heptane) and
// ranzi2012-c1c3 (the CRECK C1-C3 high-temperature set, Ranzi et al.
// 2012), each with the fuels and conditions it was validated for in its
// [validity] table; Catalogue describes them.
// Each is a file in
// flame1d's TOML mechanism format (package flame1d/chem/mechtoml) under
// mechanisms/, converted from the published files by the keyword-block
// importer, with its citation in the description; see
// mechanisms/CITATIONS.md and, to regenerate them, builtin_test.go.
//
// The embedded files are immutable; every call parses afresh and returns a
// mechanism the caller owns.
package builtin

import (
	"bufio"
	"bytes"
	"embed"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path"
	"sort"
	"strings"

	"flame1d/chem"
	"flame1d/chem/mechtoml"
	"flame1d/internal/infile"
)

//go:embed mechanisms/*.toml
var files embed.FS

// fileOf is the embedded file of a built-in name.
func fileOf(name string) string { return path.Join("mechanisms", name+".toml") }

// Names returns the names of the built-in mechanisms, sorted.
func Names() []string {
	entries, err := fs.ReadDir(files, "mechanisms")
	if err != nil {
		return nil
	}
	var names []string
	for _, e := range entries {
		if n, ok := strings.CutSuffix(e.Name(), ".toml"); ok && !e.IsDir() {
			names = append(names, n)
		}
	}
	sort.Strings(names)
	return names
}

// IsName reports whether name is the name of a built-in mechanism.
func IsName(name string) bool {
	for _, n := range Names() {
		if n == name {
			return true
		}
	}
	return false
}

// Mechanism parses and returns the built-in mechanism of that name.
// Positions in messages and Origins read "builtin/mechanisms/NAME.toml".
func Mechanism(name string) (*chem.Mechanism, error) {
	m, _, err := Read(name)
	return m, err
}

// Read is Mechanism with the problems (warnings) the reader and the
// mechanism checks report, as "flame1d mech check" lists them.
func Read(name string) (*chem.Mechanism, []chem.Problem, error) {
	if !IsName(name) {
		return nil, nil, unknownName(name)
	}
	data, err := files.ReadFile(fileOf(name))
	if err != nil {
		return nil, nil, fmt.Errorf("built-in mechanism %s: %w", name, err)
	}
	m, problems, err := mechtoml.Read(bytes.NewReader(data), "builtin/"+fileOf(name))
	if err != nil {
		return nil, problems, fmt.Errorf("built-in mechanism %s: %w", name, err)
	}
	return m, problems, nil
}

func unknownName(name string) error {
	return fmt.Errorf("%q is neither a built-in mechanism (%s) nor an existing mechanism file",
		name, strings.Join(Names(), ", "))
}

// Load returns the mechanism named by nameOrPath: a built-in name (see
// Names), or the path of a mechanism file in flame1d's TOML format. A file
// in the classic keyword-block format is refused with a message saying to
// convert it with "flame1d mech import" first.
func Load(nameOrPath string) (*chem.Mechanism, error) {
	if IsName(nameOrPath) {
		return Mechanism(nameOrPath)
	}
	info, err := os.Stat(nameOrPath)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		if strings.ContainsAny(nameOrPath, `/\`) || path.Ext(nameOrPath) != "" {
			return nil, fmt.Errorf("mechanism file %s does not exist (built-in mechanisms: %s)",
				nameOrPath, strings.Join(Names(), ", "))
		}
		return nil, unknownName(nameOrPath)
	case err != nil:
		return nil, fmt.Errorf("mechanism %s: %w", nameOrPath, err)
	case info.IsDir():
		return nil, fmt.Errorf("mechanism %s is a directory; give a .toml mechanism file or a built-in name (%s)",
			nameOrPath, strings.Join(Names(), ", "))
	}
	data, err := infile.ReadFile(nameOrPath, infile.Mechanism)
	if err != nil {
		return nil, err
	}
	if kw := keywordBlockStart(data); kw != "" {
		return nil, fmt.Errorf("%s is a mechanism in the classic keyword-block format (it starts with %s); "+
			"convert it to flame1d's format first with \"flame1d mech import\" and give the .toml file it writes", nameOrPath, kw)
	}
	m, _, err := mechtoml.Read(bytes.NewReader(data), nameOrPath)
	if err != nil {
		return nil, fmt.Errorf("mechanism %s: %w", nameOrPath, err)
	}
	return m, nil
}

// keywordBlockStart returns the opening keyword when data looks like a
// classic keyword-block mechanism, thermo or transport-free file: its first
// line that is not blank or a "!" comment starts with ELEMENTS, SPECIES,
// THERMO or REACTIONS (or their four-letter forms) and has no "=", which a
// TOML key line always has.
func keywordBlockStart(data []byte) string {
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 0, 4096), 1<<20)
	for sc.Scan() {
		line := sc.Text()
		if i := strings.IndexByte(line, '!'); i >= 0 {
			line = line[:i]
		}
		f := strings.Fields(line)
		if len(f) == 0 {
			continue
		}
		if strings.Contains(line, "=") {
			return ""
		}
		switch w := strings.ToUpper(f[0]); w {
		case "ELEMENTS", "ELEM", "SPECIES", "SPEC", "THERMO", "REACTIONS", "REAC":
			return f[0]
		}
		return ""
	}
	return ""
}
