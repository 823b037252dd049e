package builtin

import (
	"flag"
	"flame1d/internal/shareddata"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/chem/keyblock"
	"flame1d/chem/mechtoml"
)

// The built-in files are generated, not written by hand:
//
//	go test ./builtin -run TestBuiltinMatchesImport -update
//
// imports each set below from ../shared/data/mechanisms (the sibling of
// the repository) with the keyword-block importer, puts its citation in
// front of the original file's header comment, and writes
// mechanisms/NAME.toml and mechanisms/CITATIONS.md. Without -update the
// same test checks that the embedded files equal a fresh import.
var update = flag.Bool("update", false, "regenerate builtin/mechanisms from ../shared/data/mechanisms")

// source is one published mechanism set shipped as a built-in.
type source struct {
	name                    string // built-in name
	dir                     string // folder under shared/data/mechanisms
	mech, thermo, transport string // file names in dir
	title                   string
	citation                []string // paragraphs: reference, licence, origin, edits
}

// sources are the sets the data README clears for shipping. The text is
// taken from each folder's PROVENANCE.md.
var sources = []source{
	{
		name: "smith1999-natgas", dir: "gri30", mech: "mech.inp", thermo: "thermo.dat", transport: "transport.dat",
		title: "GRI-Mech 3.0: natural-gas combustion with NOx chemistry (53 species, 325 reactions)",
		citation: []string{
			`G. P. Smith, D. M. Golden, M. Frenklach, N. W. Moriarty, B. Eiteneer, M. Goldenberg, C. T. Bowman, R. K. Hanson, S. Song, W. C. Gardiner Jr., V. V. Lissianski, Z. Qin, "GRI-Mech 3.0", released 30 July 1999, http://combustion.berkeley.edu/gri-mech/ (no journal article; the web release is the reference the authors ask for).`,
			`Licence: the authors distribute the files freely for public use with the attribution above.`,
			`Source files: the release files grimech30.dat, thermo30.dat and transport.dat, as kept in repository jiweiqi/CollectionOfMechanisms, commit 8298282d72fed932542f4e5acaea69d2d4c17bdd, folder CH4_Methane/GRI30.`,
			`Edits before conversion: line endings CRLF -> LF; line 1 of the mechanism file and line 4 of the thermo file, comments that named a commercial software format, reworded to a neutral description. No data line changed.`,
		},
	},
	{
		name: "burke2012-hydrogen", dir: "h2o2", mech: "mech.inp", thermo: "thermo.dat", transport: "transport.dat",
		title: "Burke et al. (2012) hydrogen/oxygen mechanism (13 species, 27 reactions)",
		citation: []string{
			`M. P. Burke, M. Chaos, Y. Ju, F. L. Dryer, S. J. Klippenstein, "Comprehensive H2/O2 kinetic model for high-pressure combustion", International Journal of Chemical Kinetics 44 (2012) 444-474, doi:10.1002/kin.20603. An update of J. Li, Z. Zhao, A. Kazakov, F. L. Dryer, Int. J. Chem. Kinet. 36 (2004) 566-575.`,
			`Licence: posted publicly by the authors' group for research use; no separate licence text is attached to the files.`,
			`Source files: chem.inp and tran.dat of the final posted version (with the authors' July 2011 corrections), as kept in repository jiweiqi/CollectionOfMechanisms, commit 8298282d72fed932542f4e5acaea69d2d4c17bdd, folder Hydrogen_H2/Burke_et_al_2012.`,
			`Edits before conversion: line endings CRLF -> LF and a final newline added; a comment that named a commercial software format reworded; a Windows-1252 dash in a comment replaced by an ASCII hyphen; the transport file reduced to the 13 mechanism species (first occurrence, lines unchanged). No number changed.`,
			`Bath gas: H + O2 (+M) <=> HO2 (+M) is the authors' N2-bath version, right for flames in air; their Ar/He-bath alternative (commented out in the source) is not used.`,
		},
	},
	{
		name: "lu2009-heptane", dir: "nheptane-sk68", mech: "mech.inp", thermo: "thermo.dat", transport: "transport.dat",
		title: "Skeletal n-heptane mechanism of Lu et al. (2009) (68 species, 283 reactions)",
		citation: []string{
			`T. Lu, C. K. Law, C. S. Yoo, J. H. Chen, "Dynamic stiffness removal for direct numerical simulations", Combustion and Flame 156 (2009) 1542-1551. Reduced from the Lawrence Livermore detailed n-heptane mechanism, whose thermo and transport data it uses: H. J. Curran, W. J. Pitz, C. K. Westbrook (2002), UCRL-WEB-204236.`,
			`Licence: no licence text accompanies the distributed files; cite the paper above.`,
			`Source files: chem.inp, therm.dat and tran.dat, as kept in repository jiweiqi/CollectionOfMechanisms, commit 8298282d72fed932542f4e5acaea69d2d4c17bdd, folder n-Heptane_C7H16/Lu_sk68.`,
			`Edits before conversion: line endings CRLF -> LF; one non-ASCII dash in a comment transliterated to ASCII; the transport file reduced to the 68 mechanism species (first occurrence of each); two trailing transport comments that named a software product removed. No number changed.`,
		},
	},
}

const convertedBy = "Converted by flame1d mech import (package flame1d/chem/keyblock) into flame1d's TOML mechanism format."

// header is the citation text that opens the built-in's description.
func (s source) header() string {
	var b strings.Builder
	b.WriteString(s.title + "\n\n")
	for _, p := range s.citation {
		b.WriteString(p + "\n\n")
	}
	b.WriteString(convertedBy + "\n")
	return b.String()
}

// description is the built-in's description: citation, then the header
// comment of the original mechanism file, verbatim.
func (s source) description(original string) string {
	d := s.header()
	if strings.TrimSpace(original) != "" {
		d += "\nHeader comment of the original mechanism file:\n\n" + original
		if !strings.HasSuffix(original, "\n") {
			d += "\n"
		}
	}
	return d
}

// sharedMechanisms is shareddata.MechanismsDir.
func sharedMechanisms(t *testing.T) string { t.Helper(); return shareddata.MechanismsDir(t) }

// imported converts a source afresh, as the generator does.
func imported(t *testing.T, shared string, s source) *chem.Mechanism {
	t.Helper()
	d := filepath.Join(shared, s.dir)
	m, problems, err := keyblock.ReadFiles(filepath.Join(d, s.mech), filepath.Join(d, s.thermo), filepath.Join(d, s.transport))
	if err != nil {
		t.Fatalf("importing %s: %v", s.name, err)
	}
	for _, p := range problems {
		t.Logf("%s: %s", s.name, p)
	}
	m.Name = s.name
	m.Description = s.description(m.Description)
	return m
}

// citationsMarkdown is mechanisms/CITATIONS.md.
func citationsMarkdown() string {
	var b strings.Builder
	b.WriteString("# Built-in mechanisms: citations and provenance\n\n")
	b.WriteString("Generated by `go test ./builtin -run TestBuiltinMatchesImport -update` from the published\n")
	b.WriteString("files in `../shared/data/mechanisms/` (see the `PROVENANCE.md` of each folder there).\n")
	b.WriteString("The same text opens the description of each `.toml` file. Cite the original authors\n")
	b.WriteString("when you use a built-in mechanism.\n")
	for _, s := range sources {
		fmt.Fprintf(&b, "\n## `%s`: %s\n\n", s.name, s.title)
		for _, p := range s.citation {
			b.WriteString(p + "\n\n")
		}
		b.WriteString(convertedBy + "\n")
	}
	return b.String()
}

// TestBuiltinMatchesImport: each embedded mechanism equals a fresh import
// of the published files (every number, bit for bit, through the TOML
// format). With -update it writes the files instead.
func TestBuiltinMatchesImport(t *testing.T) {
	shared := sharedMechanisms(t)
	for _, s := range sources {
		t.Run(s.name, func(t *testing.T) {
			fresh := imported(t, shared, s)
			file := filepath.Join("mechanisms", s.name+".toml")
			var got *chem.Mechanism
			if *update {
				if err := mechtoml.WriteFile(file, fresh); err != nil {
					t.Fatal(err)
				}
				var err error
				if got, _, err = mechtoml.ReadFile(file); err != nil {
					t.Fatal(err)
				}
			} else {
				var err error
				if got, err = Mechanism(s.name); err != nil {
					t.Fatal(err)
				}
			}
			if d := mechtoml.Diff(fresh, got); d != "" {
				t.Errorf("built-in %s differs from a fresh import (regenerate with -update): %s", s.name, d)
			}
		})
	}
	if *update {
		if err := os.WriteFile(filepath.Join("mechanisms", "CITATIONS.md"), []byte(citationsMarkdown()), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}
