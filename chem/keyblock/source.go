// Package keyblock imports published reaction mechanisms written in the
// classic keyword-block text format into a *chem.Mechanism.
//
// That format is a plain-text file made of blocks, each opened by a keyword
// line and closed by END: an element list, a species list, optionally a
// block of NASA 7-coefficient thermodynamic records (fixed columns, four
// lines per species), and a reaction list (one equation with three Arrhenius
// numbers per line, followed by optional auxiliary lines that carry falloff,
// pressure-table, collider-efficiency and other data between slashes).
// Thermodynamic records and transport lines (one whitespace-separated line
// per species: name, geometry, Lennard-Jones well depth and diameter, dipole
// moment, polarizability, rotational relaxation number) often come in
// separate files. "!" starts a comment anywhere.
//
// Every number is converted to SI at this edge (see chem.Mechanism): A from
// cm-mol-s (or the declared units) to m-mol-s according to each rate's
// overall order, activation energies to J/mol, pressures atm -> Pa,
// diameters Å -> m, dipoles debye -> C m, polarizabilities Å^3 -> m^3.
//
// Readers never panic on malformed input. Each defect is a chem.Problem with
// file:line; a non-nil error is returned when any problem is an error (a
// *chem.ValidationError carrying them) or when reading itself fails.
package keyblock

import (
	"bufio"
	"fmt"
	"io"
	"strings"

	"flame1d/chem"
)

// srcLine is one physical line of an input file.
type srcLine struct {
	num  int    // 1-based line number
	text string // without the line terminator, tabs expanded only where the reader asks
}

// readLines reads all lines of r. Lines may be of any length; CR before LF
// is dropped.
func readLines(r io.Reader, file string) ([]srcLine, error) {
	br := bufio.NewReader(r)
	var out []srcLine
	for n := 1; ; n++ {
		s, err := br.ReadString('\n')
		if len(s) > 0 || err == nil {
			s = strings.TrimSuffix(s, "\n")
			s = strings.TrimSuffix(s, "\r")
			if n == 1 {
				s = strings.TrimPrefix(s, "\ufeff") // UTF-8 byte-order mark
			}
			out = append(out, srcLine{num: n, text: s})
		}
		if err == io.EOF {
			return out, nil
		}
		if err != nil {
			return out, fmt.Errorf("reading %s: %w", file, err)
		}
	}
}

// stripComment removes a "!" comment and surrounding blanks.
func stripComment(s string) string {
	if i := strings.IndexByte(s, '!'); i >= 0 {
		s = s[:i]
	}
	return strings.TrimSpace(s)
}

// expandTabs replaces TABs by blanks up to the next multiple of 8 columns,
// the way a terminal shows them; fixed-column records written with TABs are
// read as they look.
func expandTabs(s string) string {
	if !strings.Contains(s, "\t") {
		return s
	}
	var b strings.Builder
	col := 0
	for _, c := range s {
		if c == '\t' {
			n := 8 - col%8
			b.WriteString(strings.Repeat(" ", n))
			col += n
			continue
		}
		b.WriteRune(c)
		col++
	}
	return b.String()
}

// firstWord returns the upper-cased first whitespace token of s.
func firstWord(s string) string {
	s = strings.TrimLeft(s, " \t")
	if i := strings.IndexAny(s, " \t"); i >= 0 {
		s = s[:i]
	}
	return strings.ToUpper(s)
}

// problemList collects the problems of one read.
type problemList struct {
	list []chem.Problem
}

func (p *problemList) errorf(pos chem.Position, format string, a ...any) {
	p.list = append(p.list, chem.Problem{Pos: pos, Message: fmt.Sprintf(format, a...)})
}

func (p *problemList) warnf(pos chem.Position, format string, a ...any) {
	p.list = append(p.list, chem.Problem{Pos: pos, Warning: true, Message: fmt.Sprintf(format, a...)})
}

func (p *problemList) hasErrors() bool {
	for _, q := range p.list {
		if !q.Warning {
			return true
		}
	}
	return false
}

// result returns the problems and, if any is an error, a *chem.ValidationError.
func (p *problemList) result() ([]chem.Problem, error) {
	if p.hasErrors() {
		return p.list, &chem.ValidationError{Problems: p.list}
	}
	return p.list, nil
}
