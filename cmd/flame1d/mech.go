package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/chem/keyblock"
	"flame1d/chem/mechtoml"
	"flame1d/internal/infile"
)

func newMechCmd() *cobra.Command {
	cmd := &cobra.Command{
		Use:   "mech",
		Short: "List, import and check reaction mechanisms",
		Long: `Work with reaction mechanisms: list the built-in mechanisms with what they were
validated for, convert a published mechanism from the classic keyword-block
text format (ELEMENTS / SPECIES / THERMO / REACTIONS blocks, NASA 7-coefficient
thermo records, one transport line per species) into flame1d's own TOML
mechanism file, and check mechanisms for defects.`,
		Example: `  flame1d mech list
  flame1d mech import --reactions natgas-kinetics.txt --thermo natgas-thermo.txt --transport natgas-transport.txt -o natgas.toml
  flame1d mech check natgas.toml
  flame1d mech check ranzi2012-c1c3`,
	}
	cmd.AddCommand(newMechListCmd(), newMechImportCmd(), newMechCheckCmd())
	return cmd
}

// mechImportOptions are the flags of `flame1d mech import`.
type mechImportOptions struct {
	reactions, thermo, transport string
	output                       string
	name                         string
	descriptionFile              string
	force                        bool
}

func newMechImportCmd() *cobra.Command {
	var o mechImportOptions
	cmd := &cobra.Command{
		Use:   "import [REACTIONS-FILE]",
		Short: "Convert a classic keyword-block mechanism into a flame1d TOML mechanism file",
		Long: `Read a mechanism in the classic keyword-block text format and write it as a
flame1d TOML mechanism file. Every number is converted to SI units on the way
in (rate constants by each reaction's order, energies to J/mol, pressures to
Pa, transport data to m, C m and m^3); the TOML file states its units.

The reactions file may embed its THERMO block; otherwise give --thermo. Give
--transport for flame calculations (mixture-averaged transport needs it).
Every problem is listed with file:line. Nothing is written when there is any
error; warnings are listed and the file is written.

The mechanism's description (kept in the TOML header) is the comment block at
the top of the reactions file, or the text of --description-file. Put the
citation of the mechanism there: published mechanisms ask to be cited.`,
		Example: `  flame1d mech import --reactions natgas-kinetics.txt --thermo natgas-thermo.txt --transport natgas-transport.txt -o natgas.toml
  flame1d mech import site-b-syngas.txt --transport site-b-transport.txt --name site-b-syngas \
      --description-file CITATION.txt -o site-b-syngas.toml`,
		Args: cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			if len(args) == 1 {
				if o.reactions != "" && o.reactions != args[0] {
					return fmt.Errorf("reactions file given twice (%s and --reactions %s)", args[0], o.reactions)
				}
				o.reactions = args[0]
			}
			return runMechImport(cmd.OutOrStdout(), cmd.ErrOrStderr(), o)
		},
	}
	f := cmd.Flags()
	f.StringVarP(&o.reactions, "reactions", "r", "", "reactions file (ELEMENTS/SPECIES/REACTIONS blocks)")
	f.StringVar(&o.thermo, "thermo", "", "thermo file of NASA 7-coefficient records (if not embedded in the reactions file)")
	f.StringVar(&o.transport, "transport", "", "transport file, one line per species")
	f.StringVarP(&o.output, "output", "o", "", "flame1d TOML mechanism file to write (required)")
	f.StringVar(&o.name, "name", "", "mechanism name (default: from the file or folder name)")
	f.StringVar(&o.descriptionFile, "description-file", "", "text file whose content becomes the description (citation, origin, edits)")
	f.BoolVar(&o.force, "force", false, "overwrite the output file if it exists")
	return cmd
}

func runMechImport(stdout, stderr io.Writer, o mechImportOptions) error {
	if o.reactions == "" {
		return errors.New("no reactions file: give it as argument or with --reactions")
	}
	if o.output == "" {
		return errors.New("no output file: give -o FILE.toml")
	}
	if !o.force {
		if _, err := os.Stat(o.output); err == nil {
			return fmt.Errorf("%s exists; use --force to overwrite it", o.output)
		}
	}
	var description string
	if o.descriptionFile != "" {
		b, err := infile.ReadFile(o.descriptionFile, infile.Text)
		if err != nil {
			return fmt.Errorf("--description-file: %w", err)
		}
		description = strings.TrimSpace(string(b))
	}
	m, probs, err := keyblock.ReadFiles(o.reactions, o.thermo, o.transport)
	writeProblems(stderr, probs, 0)
	if err != nil {
		return fmt.Errorf("import of %s failed: %w", o.reactions, errorSummary(err))
	}
	if o.name != "" {
		m.Name = o.name
	}
	if description != "" {
		m.Description = description
	}
	m.Description = strings.TrimSpace(m.Description + "\n\n" + importNote(o))
	if err := mechtoml.WriteFile(o.output, m); err != nil {
		return err
	}
	// Read the file back: what was written must be what was imported.
	back, _, err := mechtoml.ReadFile(o.output)
	if err != nil {
		return fmt.Errorf("%s was written but does not read back: %w", o.output, err)
	}
	if len(back.Species) != len(m.Species) || len(back.Reactions) != len(m.Reactions) || len(back.Elements) != len(m.Elements) {
		return fmt.Errorf("%s read back with %d species and %d reactions, imported %d and %d",
			o.output, len(back.Species), len(back.Reactions), len(m.Species), len(m.Reactions))
	}
	fmt.Fprintf(stdout, "wrote %s: mechanism %q, %d elements, %d species, %d reactions (%d warnings)\n",
		o.output, m.Name, len(m.Elements), len(m.Species), len(m.Reactions), len(probs))
	return nil
}

// importNote records where an imported mechanism came from.
func importNote(o mechImportOptions) string {
	files := []string{filepath.Base(o.reactions)}
	for _, f := range []string{o.thermo, o.transport} {
		if f != "" {
			files = append(files, filepath.Base(f))
		}
	}
	return "Imported by flame1d from " + strings.Join(files, ", ") +
		" (classic keyword-block format); numbers converted to SI."
}

// errorSummary shortens a *chem.ValidationError (whose problems are listed
// separately) to a count.
func errorSummary(err error) error {
	var verr *chem.ValidationError
	if errors.As(err, &verr) {
		return fmt.Errorf("%d error(s), listed above", countErrors(verr.Problems))
	}
	return err
}

func countErrors(ps []chem.Problem) int {
	n := 0
	for _, p := range ps {
		if !p.Warning {
			n++
		}
	}
	return n
}

// writeProblems lists problems, errors first, each kind in file and line
// order, at most max of them (0: all).
func writeProblems(w io.Writer, ps []chem.Problem, max int) {
	ps = append([]chem.Problem(nil), ps...)
	sort.SliceStable(ps, func(i, j int) bool {
		if ps[i].Pos.File != ps[j].Pos.File {
			return ps[i].Pos.File < ps[j].Pos.File
		}
		return ps[i].Pos.Line < ps[j].Pos.Line
	})
	shown := 0
	for _, warn := range []bool{false, true} {
		for _, p := range ps {
			if p.Warning != warn {
				continue
			}
			if max > 0 && shown == max {
				fmt.Fprintf(w, "  ... %d more (use --max-problems 0 to list all)\n", len(ps)-shown)
				return
			}
			fmt.Fprintln(w, "  "+p.String())
			shown++
		}
	}
}

// mechCheckOptions are the flags of `flame1d mech check`.
type mechCheckOptions struct {
	thermo, transport string
	maxProblems       int
}

func newMechCheckCmd() *cobra.Command {
	var o mechCheckOptions
	cmd := &cobra.Command{
		Use:   "check MECHANISM...",
		Short: "Summarise mechanisms and list their problems",
		Long: `Read each MECHANISM and print a summary: elements, species, reactions by rate
form (elementary, three-body, falloff, chemically activated, pressure table,
Chebyshev) and by option (duplicates, irreversible, explicit reverse rate,
explicit orders), what it was validated for when the file says, then every
problem found, with file:line.

A MECHANISM is a built-in name (see "flame1d mech list"), a flame1d TOML
mechanism file (ending in .toml), or a classic keyword-block reactions file,
read with --thermo and --transport (which then apply to every such file). The
exit status is non-zero when any MECHANISM has an error; warnings alone do not
fail the check.`,
		Example: `  flame1d mech check smith1999-natgas
  flame1d mech check natgas.toml
  flame1d mech check natgas-kinetics.txt --thermo natgas-thermo.txt --transport natgas-transport.txt
  flame1d mech check a.toml b.toml --max-problems 0`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runMechCheck(cmd.OutOrStdout(), args, o)
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.thermo, "thermo", "", "thermo file for classic reactions files")
	f.StringVar(&o.transport, "transport", "", "transport file for classic reactions files")
	f.IntVar(&o.maxProblems, "max-problems", 50, "list at most this many problems per file (0: all)")
	return cmd
}

func runMechCheck(w io.Writer, files []string, o mechCheckOptions) error {
	failed := 0
	for i, file := range files {
		if i > 0 {
			fmt.Fprintln(w)
		}
		var m *chem.Mechanism
		var probs []chem.Problem
		var err error
		var source string
		switch {
		case builtin.IsName(file):
			source = "built-in mechanism"
			m, probs, err = builtin.Read(file)
		case strings.EqualFold(filepath.Ext(file), ".toml"):
			source = "flame1d TOML mechanism file"
			m, probs, err = mechtoml.ReadFile(file)
		default:
			source = "classic keyword-block format"
			if o.thermo != "" {
				source += "; thermo " + o.thermo
			}
			if o.transport != "" {
				source += "; transport " + o.transport
			}
			m, probs, err = keyblock.ReadFiles(file, o.thermo, o.transport)
		}
		fmt.Fprintf(w, "%s (%s)\n", file, source)
		var verr *chem.ValidationError
		if err != nil && !errors.As(err, &verr) {
			fmt.Fprintf(w, "  cannot read: %v\n", err)
			failed++
			continue
		}
		if m != nil {
			writeSummary(w, m)
		}
		nErr := countErrors(probs)
		fmt.Fprintf(w, "  problems: %d error(s), %d warning(s)\n", nErr, len(probs)-nErr)
		writeProblems(w, probs, o.maxProblems)
		if err != nil {
			failed++
		}
	}
	if failed > 0 {
		return fmt.Errorf("%d of %d file(s) have errors", failed, len(files))
	}
	return nil
}

// mechSummary counts what a mechanism is made of.
type mechSummary struct {
	transport, condensed                                 int
	byForm                                               [6]int
	duplicates, irreversible, explicitReverse, withOrder int
}

func summarize(m *chem.Mechanism) mechSummary {
	var s mechSummary
	for i := range m.Species {
		if m.Species[i].Transport != nil {
			s.transport++
		}
		if m.Species[i].Condensed {
			s.condensed++
		}
	}
	for i := range m.Reactions {
		r := &m.Reactions[i]
		if f := int(r.Form); f >= 0 && f < len(s.byForm) {
			s.byForm[f]++
		}
		if r.Duplicate {
			s.duplicates++
		}
		if !r.Reversible {
			s.irreversible++
		}
		if r.ReverseRate != nil {
			s.explicitReverse++
		}
		if len(r.Orders) > 0 || len(r.ReverseOrders) > 0 {
			s.withOrder++
		}
	}
	return s
}

func writeSummary(w io.Writer, m *chem.Mechanism) {
	s := summarize(m)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	if m.Name != "" {
		fmt.Fprintf(tw, "  name\t%s\n", m.Name)
	}
	fmt.Fprintf(tw, "  elements\t%d\t%s\n", len(m.Elements), strings.Join(m.Elements, " "))
	fmt.Fprintf(tw, "  species\t%d\t%d with transport data, %d condensed\n", len(m.Species), s.transport, s.condensed)
	fmt.Fprintf(tw, "  reactions\t%d\t\n", len(m.Reactions))
	forms := []struct {
		form  chem.RateForm
		label string
	}{
		{chem.Elementary, "elementary"}, {chem.ThreeBody, "three-body"}, {chem.Falloff, "falloff"},
		{chem.ChemicallyActivated, "chemically activated"}, {chem.PressureTable, "pressure table"}, {chem.Chebyshev, "Chebyshev"},
	}
	for _, f := range forms {
		fmt.Fprintf(tw, "    %s\t%d\t\n", f.label, s.byForm[f.form])
	}
	fmt.Fprintf(tw, "    duplicates\t%d\t\n", s.duplicates)
	fmt.Fprintf(tw, "    irreversible\t%d\t\n", s.irreversible)
	fmt.Fprintf(tw, "    explicit reverse rate\t%d\t\n", s.explicitReverse)
	fmt.Fprintf(tw, "    explicit orders\t%d\t\n", s.withOrder)
	tw.Flush()
	if m.Validity != nil {
		fmt.Fprintf(w, "  validated for: %s\n", m.Validity.Summary())
	}
}

// mechListOptions are the flags of `flame1d mech list`.
type mechListOptions struct{ json bool }

func newMechListCmd() *cobra.Command {
	var o mechListOptions
	cmd := &cobra.Command{
		Use:   "list",
		Short: "List the built-in mechanisms: size, citation, what they were validated for",
		Long: `List the mechanisms built into flame1d, usable by name wherever a mechanism is
asked for: each with its species and reaction counts, what it is, the
publication to cite, and the fuels and conditions its authors built and
validated it for (from the publication; the source of that statement is
printed with it). A flame outside that range is a model prediction on
chemistry not tested there.`,
		Example: `  flame1d mech list
  flame1d mech list --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runMechList(cmd.OutOrStdout(), o)
		},
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "write the list as JSON")
	return cmd
}

func runMechList(w io.Writer, o mechListOptions) error {
	entries, err := builtin.Catalogue()
	if err != nil {
		return err
	}
	if o.json {
		return writeJSON(w, entries)
	}
	for i, e := range entries {
		if i > 0 {
			fmt.Fprintln(w)
		}
		fmt.Fprintf(w, "%s: %d species, %d reactions\n", e.Name, e.Species, e.Reactions)
		fmt.Fprintf(w, "  %s\n", e.Title)
		fmt.Fprintf(w, "  cite: %s\n", e.Citation)
		fmt.Fprintf(w, "  validated for: %s\n", e.ValidFor)
		if e.ValiditySource != "" {
			fmt.Fprintf(w, "  (%s)\n", e.ValiditySource)
		}
	}
	return nil
}
