package keyblock

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"flame1d/chem"
	"flame1d/thermo"
)

// ThermoRecord is one species' NASA-7 record as read from a thermo block.
type ThermoRecord struct {
	thermo.Species
	Origin chem.Position // line 1 of the four-line record
}

// ReadThermo reads a thermo file: an optional THERMO (or "THERMO ALL")
// header, an optional line of three default temperatures (low, mid, high in
// K, used where a record leaves its own fields blank), four-line NASA-7
// records, and END.
//
// Record layout (columns 1-based): line 1 holds the name (first token of
// columns 1-18), element symbols and counts in four 5-column fields at
// 25-44, the phase letter at 45, T low / T high / T mid at 46-55, 56-65,
// 66-73 and an optional fifth element at 74-78; lines 2-4 hold the 14
// coefficients in 15-column fields (high-range a1..a7, then low-range
// a1..a7). Column 80 may carry the line number 1-4. Anything past column 60
// on line 4 is ignored. Records repeated under the same name keep the first
// one, with a warning.
//
// file names the input in problem positions.
func ReadThermo(r io.Reader, file string) ([]ThermoRecord, []chem.Problem, error) {
	lines, err := readLines(r, file)
	if err != nil {
		return nil, nil, err
	}
	var p problemList
	recs := readThermoFile(lines, file, nil, &p)
	// Inside a mechanism, Validate reports jumps of the species it uses.
	for _, r := range recs {
		if j := r.Thermo.MidpointJump(); j > thermo.MidpointJumpTolerance {
			p.warnf(r.Origin, "thermo record %q: polynomials jump by %.2g (relative) at T mid = %g K", r.Name, j, r.Thermo.TMid)
		}
	}
	probs, verr := p.result()
	return recs, probs, verr
}

func readThermoFile(lines []srcLine, file string, wanted func(string) bool, p *problemList) []ThermoRecord {
	i := 0
	for i < len(lines) && stripComment(lines[i].text) == "" {
		i++
	}
	if i == len(lines) {
		p.errorf(chem.Position{File: file}, "no thermo records found")
		return nil
	}
	if isThermoKeyword(firstWord(stripComment(lines[i].text))) {
		i++
	} else {
		p.warnf(chem.Position{File: file, Line: lines[i].num}, "no THERMO header line; reading records from here")
	}
	recs, next, ended := parseThermoBlock(lines, i, file, wanted, p)
	if !ended {
		p.warnf(chem.Position{File: file, Line: lastLine(lines)}, "thermo block has no END line (read to end of file)")
	}
	for ; next < len(lines); next++ {
		if stripComment(lines[next].text) != "" {
			p.warnf(chem.Position{File: file, Line: lines[next].num}, "text after the thermo block's END is ignored")
			break
		}
	}
	if len(recs) == 0 && !p.hasErrors() {
		p.errorf(chem.Position{File: file}, "no thermo records found")
	}
	return recs
}

func lastLine(lines []srcLine) int {
	if len(lines) == 0 {
		return 0
	}
	return lines[len(lines)-1].num
}

func isThermoKeyword(w string) bool { return w == "THERMO" || w == "THER" }

// isBlockKeyword reports whether w opens a block of the keyword format.
func isBlockKeyword(w string) bool {
	switch w {
	case "ELEMENTS", "ELEM", "SPECIES", "SPEC", "THERMO", "THER", "REACTIONS", "REAC":
		return true
	}
	return false
}

// parseThermoBlock reads records from lines[i:] (the line after the THERMO
// keyword) up to END. It returns the records, the index after END (or
// after the last line read) and whether END was seen. When wanted is
// non-nil, defects of records for species it rejects are only warnings:
// thermo databases carry many species a mechanism does not use.
func parseThermoBlock(lines []srcLine, i int, file string, wanted func(string) bool, p *problemList) (recs []ThermoRecord, next int, ended bool) {
	whole := p
	var local problemList
	p = &local
	flush := func(name string) {
		for _, q := range local.list {
			if wanted != nil && !wanted(name) {
				q.Warning = true
			}
			whole.list = append(whole.list, q)
		}
		local.list = local.list[:0]
	}
	defer flush("")
	var defaults [3]float64 // low, mid, high; zero when not given
	tabWarned := false
	seen := map[string]int{} // upper-case name -> line
	text := func(k int) string {
		t := lines[k].text
		if strings.Contains(t, "\t") && !tabWarned {
			p.warnf(chem.Position{File: file, Line: lines[k].num}, "TAB characters in a fixed-column thermo record; expanded to 8-column stops")
			tabWarned = true
		}
		return expandTabs(t)
	}
	skip := func(k int) int {
		for k < len(lines) && stripComment(lines[k].text) == "" {
			k++
		}
		return k
	}
	i = skip(i)
	if i < len(lines) {
		if d, ok := defaultTemperatures(stripComment(lines[i].text)); ok {
			defaults = d
			i = skip(i + 1)
		}
	}
	for i < len(lines) {
		first := stripComment(lines[i].text)
		w := firstWord(first)
		if w == "END" {
			return recs, i + 1, true
		}
		if isBlockKeyword(w) {
			p.warnf(chem.Position{File: file, Line: lines[i].num}, "thermo block not closed by END before %s", w)
			return recs, i, true
		}
		pos := chem.Position{File: file, Line: lines[i].num}
		var rec [4]string
		var nums [4]int
		rec[0], nums[0] = text(i), lines[i].num
		k := i + 1
		truncated := false
		for j := 1; j < 4; j++ {
			k = skip(k)
			if k >= len(lines) || recordBoundary(lines[k].text, j+1) {
				truncated = true
				break
			}
			rec[j], nums[j] = text(k), lines[k].num
			k++
		}
		name := recordName(rec[0])
		if truncated {
			p.errorf(pos, "truncated thermo record %q: expected 4 lines, the record ends early", name)
			flush(name)
			i = skip(k)
			continue
		}
		i = skip(k)
		tr, ok := parseRecord(rec, nums, defaults, pos, p)
		flush(name)
		if !ok {
			continue
		}
		key := strings.ToUpper(tr.Name)
		if at, dup := seen[key]; dup {
			if wanted == nil || wanted(tr.Name) {
				p.warnf(pos, "species %q has a second thermo record; the first (line %d) is used", tr.Name, at)
				flush(tr.Name)
			}
			continue
		}
		seen[key] = pos.Line
		recs = append(recs, tr)
	}
	return recs, i, false
}

// recordBoundary reports whether line s, expected to be line `want` (2-4) of
// a record, instead starts something else: END, a block keyword, or a line
// marked as another record line in column 80.
func recordBoundary(s string, want int) bool {
	w := firstWord(stripComment(s))
	if w == "END" || isBlockKeyword(w) {
		return true
	}
	s = expandTabs(s)
	if len(s) >= 80 {
		if m := s[79]; m >= '1' && m <= '4' && int(m-'0') != want {
			return true
		}
	}
	return false
}

// defaultTemperatures recognises the optional line of three temperatures
// after the THERMO keyword.
func defaultTemperatures(s string) ([3]float64, bool) {
	f := strings.Fields(s)
	var d [3]float64
	if len(f) != 3 {
		return d, false
	}
	for j, x := range f {
		v, err := parseNumber(x)
		if err != nil || v <= 0 {
			return d, false
		}
		d[j] = v
	}
	if !(d[0] < d[1] && d[1] < d[2]) {
		return d, false
	}
	return d, true
}

func recordName(line1 string) string {
	name, _ := splitName(line1)
	return name
}

// splitName returns the species name of a record's first line: the first
// token starting in column 1, which must end before the element fields.
func splitName(line1 string) (string, bool) {
	s := strings.TrimRight(line1, " ")
	end := strings.IndexByte(s, ' ')
	if end < 0 {
		end = len(s)
	}
	if end == 0 {
		return "", false
	}
	if end > 24 {
		return s[:min(end, 24)], false
	}
	return s[:end], true
}

// column returns columns from..to (1-based, inclusive) of s, blank-padded.
func column(s string, from, to int) string {
	if from > len(s) {
		return ""
	}
	return s[from-1 : min(to, len(s))]
}

// parseNumber parses a decimal number as written in mechanism files:
// Fortran-style "D" exponents are accepted; hexadecimal, NaN and infinities
// are not.
func parseNumber(s string) (float64, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return 0, fmt.Errorf("empty field")
	}
	fortran := false
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c >= '0' && c <= '9', c == '.', c == '+', c == '-', c == 'e', c == 'E':
		case c == 'd' || c == 'D':
			fortran = true
		default:
			return 0, fmt.Errorf("%q is not a number", s)
		}
	}
	if fortran {
		s = strings.Map(func(r rune) rune {
			if r == 'd' || r == 'D' {
				return 'e'
			}
			return r
		}, s)
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, fmt.Errorf("%q is not a finite number", s)
	}
	return v, nil
}

// parseRecord decodes the four lines of a NASA-7 record.
func parseRecord(rec [4]string, nums [4]int, defaults [3]float64, pos chem.Position, p *problemList) (ThermoRecord, bool) {
	line1 := rec[0]
	name, ok := splitName(line1)
	if !ok {
		p.errorf(pos, "thermo record name %q does not end before column 25 (the element fields)", name)
		return ThermoRecord{}, false
	}
	tr := ThermoRecord{Origin: pos}
	tr.Name = name
	tr.Composition = map[string]float64{}
	good := true
	addElement := func(field string, col int) {
		sym := strings.ToUpper(strings.TrimSpace(field[:min(2, len(field))]))
		cnt := ""
		if len(field) > 2 {
			cnt = strings.TrimSpace(field[2:])
		}
		// Files shift explicit zero counts about ("C   1     0    0   0"):
		// a field of blanks and zeros is an empty field.
		if strings.Trim(field, " 0.") == "" {
			return
		}
		if sym == "" {
			if strings.Trim(cnt, "0.") != "" {
				p.errorf(pos, "thermo record %q: element count %q in columns %d-%d has no element symbol", name, cnt, col, col+4)
				good = false
			}
			return
		}
		if !isElementSymbol(sym) {
			p.errorf(pos, "thermo record %q: %q in columns %d-%d is not an element symbol", name, strings.TrimSpace(field), col, col+4)
			good = false
			return
		}
		n, err := parseNumber(cnt)
		if err != nil || n < 0 {
			p.errorf(pos, "thermo record %q: bad element count %q for %s in columns %d-%d", name, cnt, sym, col+2, col+4)
			good = false
			return
		}
		if n == 0 {
			return
		}
		tr.Composition[sym] += n
	}
	for k := 0; k < 4; k++ {
		c := 25 + 5*k
		addElement(column(line1, c, c+4), c)
	}
	t := [3]string{column(line1, 46, 55), column(line1, 56, 65), column(line1, 66, 73)}
	fifth := column(line1, 74, 78)
	// Many files let T mid run on into columns 74-75 ("1000.000"); a fifth
	// element field starts with a letter.
	if f := strings.TrimLeft(fifth, " "); f != "" && !isLetter(f[0]) {
		if strings.TrimSpace(t[2]) != "" && !strings.HasSuffix(t[2], " ") && fifth[0] != ' ' {
			run := strings.IndexByte(fifth, ' ')
			if run < 0 {
				run = len(fifth)
			}
			t[2] += fifth[:run]
			fifth = fifth[run:]
		}
		if strings.TrimSpace(fifth) != "" && strings.Trim(strings.TrimSpace(fifth), "0") != "" {
			p.warnf(pos, "thermo record %q: ignored %q in columns 74-78", name, strings.TrimSpace(fifth))
		}
	} else if f != "" {
		addElement(strings.TrimLeft(fifth, " ")+"   ", 74)
	}
	phase := strings.ToUpper(column(line1, 45, 45))
	switch phase {
	case "S", "L":
		tr.Condensed = true
	case "G", "", " ":
	default:
		p.warnf(pos, "thermo record %q: phase letter %q in column 45 is not G, L or S; taken as gas", name, phase)
	}
	var temps [3]float64 // low, high, mid as in the file
	dflt := [3]float64{defaults[0], defaults[2], defaults[1]}
	what := [3]string{"low", "high", "mid"}
	for j := range t {
		if strings.TrimSpace(t[j]) == "" {
			if dflt[j] == 0 {
				p.errorf(pos, "thermo record %q: %s temperature field is blank and the block gives no default", name, what[j])
				good = false
			}
			temps[j] = dflt[j]
			continue
		}
		v, err := parseNumber(t[j])
		if err != nil {
			p.errorf(pos, "thermo record %q: bad %s temperature %q", name, what[j], strings.TrimSpace(t[j]))
			good = false
			continue
		}
		temps[j] = v
	}
	tr.Thermo.TLow, tr.Thermo.THigh, tr.Thermo.TMid = temps[0], temps[1], temps[2]
	if good && !(tr.Thermo.TLow <= tr.Thermo.TMid && tr.Thermo.TMid <= tr.Thermo.THigh && tr.Thermo.TLow < tr.Thermo.THigh && tr.Thermo.TLow > 0) {
		p.errorf(pos, "thermo record %q: temperatures low %g, mid %g, high %g K are not ordered low <= mid <= high",
			name, tr.Thermo.TLow, tr.Thermo.TMid, tr.Thermo.THigh)
		good = false
	}
	if len(tr.Composition) == 0 && good {
		p.errorf(pos, "thermo record %q lists no elements in columns 25-44", name)
		good = false
	}
	var a [14]float64
	for j := 0; j < 14; j++ {
		ln := 1 + j/5
		c := 1 + 15*(j%5)
		field := column(rec[ln], c, c+14)
		v, err := parseNumber(field)
		if err != nil {
			p.errorf(chem.Position{File: pos.File, Line: nums[ln]}, "thermo record %q: bad coefficient %d %q on record line %d, columns %d-%d",
				name, j+1, strings.TrimSpace(field), ln+1, c, c+14)
			good = false
			continue
		}
		a[j] = v
	}
	copy(tr.Thermo.High[:], a[:7])
	copy(tr.Thermo.Low[:], a[7:])
	if !good {
		return ThermoRecord{}, false
	}
	return tr, true
}

func isLetter(c byte) bool { return c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z' }

func isElementSymbol(s string) bool {
	if len(s) == 0 || len(s) > 2 {
		return false
	}
	for i := 0; i < len(s); i++ {
		if !isLetter(s[i]) {
			return false
		}
	}
	return true
}
