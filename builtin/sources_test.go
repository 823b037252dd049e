package builtin

import (
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/chem/keyblock"
	"flame1d/chem/mechtoml"
	"flame1d/internal/shareddata"
	"flame1d/thermo"
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
	// validity is the range the authors built and validated the set for,
	// written into the built-in's [validity] table.
	validity chem.Validity
}

// atm is one standard atmosphere and torr 1/760 of it, in Pa, computed as
// the mechanism reader converts "10 Torr".
const (
	atm  = thermo.OneAtmosphere
	torr = atm / 760
)

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
		validity: chem.Validity{
			Fuels:            []string{"CH4", "C2H6"},
			Pressure:         [2]float64{10 * torr, 10 * atm},
			EquivalenceRatio: [2]float64{0.1, 5},
			Source: "GRI-Mech 3.0 release notes (Smith et al. 1999), quoted from memory: optimized for natural-gas combustion " +
				"(methane, with ethane as its minor component) including NO formation and reburn, for roughly 1000-2500 K, " +
				"10 Torr to 10 atm and equivalence ratios 0.1 to 5 in premixed systems. The 1000-2500 K range is of the " +
				"reacting gas, not of the unburned mixture, so no unburned-temperature range is given here. Propane and the " +
				"C2H4/C3 species are present but were not optimization targets.",
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
		validity: chem.Validity{
			Fuels:            []string{"H2"},
			Pressure:         [2]float64{0.3 * atm, 87 * atm},
			EquivalenceRatio: [2]float64{0.25, 5},
			Source: "Burke et al. (2012), abstract, quoted from memory: validated against ignition delays, flame speeds " +
				"(including high-pressure H2/O2/diluent flames), flow-reactor and burner-stabilized-flame data over " +
				"298-3000 K, 0.3-87 atm and equivalence ratios 0.25-5. The temperature range spans reacting gas, not " +
				"only unburned mixtures, so no unburned-temperature range is given here.",
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
		validity: chem.Validity{
			Fuels:            []string{"nc7h16"},
			Pressure:         [2]float64{1 * atm, 50 * atm},
			EquivalenceRatio: [2]float64{0.5, 1.5},
			Source: "Lu et al. (2009), quoted from memory and uncertain: skeletal reduction of the LLNL detailed n-heptane " +
				"mechanism (Curran et al.) for auto-ignition (low- and high-temperature chemistry) and extinction of " +
				"n-heptane/air, at about 1-50 atm and equivalence ratios 0.5-1.5. Laminar flame speeds were not a " +
				"reduction target; no unburned-temperature range is stated. Only n-heptane is a validated fuel: its " +
				"cracking products are in the set as intermediates.",
		},
	},
	{
		name: "ranzi2012-c1c3", dir: "c0c4", mech: "mech.inp", thermo: "thermo.dat", transport: "transport.dat",
		title: "CRECK C1-C3 high-temperature mechanism (Politecnico di Milano), with C4 species and first aromatics (114 species, 1999 reactions)",
		citation: []string{
			`E. Ranzi, A. Frassoldati, R. Grana, A. Cuoci, T. Faravelli, A. P. Kelley, C. K. Law, "Hierarchical and comparative kinetic modeling of laminar flame speeds of hydrocarbon and oxygenated fuels", Progress in Energy and Combustion Science 38 (2012) 468-501, doi:10.1016/j.pecs.2012.03.004.`,
			`Also to be cited, as the CRECK group asks: E. Ranzi, A. Frassoldati, A. Stagni, M. Pelucchi, A. Cuoci, T. Faravelli, "Reduced kinetic schemes of complex reaction systems: fossil and biomass-derived transportation fuels", Int. J. Chem. Kinet. 46 (2014) 512-542, doi:10.1002/kin.20867; W. K. Metcalfe, S. M. Burke, S. S. Ahmed, H. J. Curran, "A hierarchical and comparative kinetic modeling study of C1-C2 hydrocarbon and oxygenated fuels", Int. J. Chem. Kinet. 45 (2013) 638-675, doi:10.1002/kin.20802 (the C1-C2 core); A. Keromnes et al., "An experimental and detailed chemical kinetic modeling study of hydrogen and syngas mixture oxidation at elevated pressures", Combust. Flame 160 (2013) 995-1011, doi:10.1016/j.combustflame.2013.01.001; G. Bagheri et al., "Comprehensive kinetic study of combustion technologies for low environmental impact: MILD and OXY-fuel combustion of methane", Combust. Flame 212 (2020) 142-155, doi:10.1016/j.combustflame.2019.10.014.`,
			`Licence: the source repository carries the GNU General Public License version 3; flame1d, licensed GPL-3.0-or-later, ships this set under the same terms. Keep these citations with any copy.`,
			`Source files: the kinetics and thermo files of folder Gas-Phase/CoreMechanism_C0-C4/C1_C3_HT_114_1999 of repository CRECKMODELING/Kinetic-Mechanisms, commit f9aa355374a65a4b63fd5555b9eae17a56b900ae (November 2025), byte-identical; transport data from the group's database TOT2003.TRAN of the same repository.`,
			`Edits before conversion: none to the kinetics and thermo files; the transport file is the first line of TOT2003.TRAN for each of the 114 species, trailing blanks removed, with three comment lines on top. No number changed.`,
		},
		validity: chem.Validity{
			Fuels: []string{"H2", "CO", "CH4", "C2H6", "C2H4", "C2H2", "C3H8", "C3H6", "CH3OH", "C2H5OH"},
			Source: "Ranzi et al. (2012), quoted from memory: the CRECK mechanism was validated hierarchically against " +
				"laminar flame speeds of hydrogen, syngas, C1-C3 hydrocarbons and light alcohols in air, mostly at " +
				"room temperature and 1 atm with some preheated and elevated-pressure data; this 114-species " +
				"high-temperature core keeps that C1-C3 chemistry. No pressure, temperature or equivalence-ratio " +
				"range is quoted here. C4 species, benzene and naphthalene are present as products of the pool " +
				"chemistry, not as validated fuels.",
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
	v := s.validity
	m.Validity = &v
	return m
}

// citationsMarkdown is mechanisms/CITATIONS.md.
func citationsMarkdown() string {
	var b strings.Builder
	b.WriteString("# Built-in mechanisms: citations and provenance\n\n")
	b.WriteString("Generated by `go test ./builtin -run TestBuiltinMatchesImport -update` from the published\n")
	b.WriteString("files in `../shared/data/mechanisms/` (see the `PROVENANCE.md` of each folder there).\n")
	b.WriteString("The same text opens the description of each `.toml` file. Cite the original authors\n")
	b.WriteString("when you use a built-in mechanism.\n\n")
	b.WriteString("Each set keeps its authors' terms, stated in its Licence paragraph below. flame1d itself is\n")
	b.WriteString("licensed GPL-3.0-or-later (see LICENSE); the CRECK set, from a GPL v3 repository, ships under\n")
	b.WriteString("those terms. Each section ends with the fuels and conditions the set was validated for, as in\n")
	b.WriteString("the [validity] table of its file.\n")
	for _, s := range sources {
		fmt.Fprintf(&b, "\n## `%s`: %s\n\n", s.name, s.title)
		for _, p := range s.citation {
			b.WriteString(p + "\n\n")
		}
		b.WriteString(convertedBy + "\n\n")
		v := s.validity
		fmt.Fprintf(&b, "Validated for: %s. %s\n", v.Summary(), v.Source)
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
