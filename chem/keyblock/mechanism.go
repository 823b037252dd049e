package keyblock

import (
	"fmt"
	"io"
	"path/filepath"
	"sort"
	"strings"

	"flame1d/chem"
	"flame1d/internal/infile"
)

// ReadFiles imports a mechanism from its reactions file and, optionally, a
// separate thermo file and a transport file ("" when the reactions file
// embeds a THERMO block or when there is no transport data). Records in an
// embedded THERMO block take precedence over the thermo file.
//
// The returned problems include the reader's own (each with file:line) and
// those of (*chem.Mechanism).Validate. err is non-nil when a file cannot be
// read or when any problem is an error (then a *chem.ValidationError); the
// mechanism is still returned whenever the files could be read, so callers
// can summarise it, but it must not be used for computation when err != nil.
func ReadFiles(mechPath, thermoPath, transportPath string) (*chem.Mechanism, []chem.Problem, error) {
	var closers []io.Closer
	defer func() {
		for _, c := range closers {
			c.Close()
		}
	}()
	open := func(path string) (io.Reader, error) {
		if path == "" {
			return nil, nil
		}
		f, err := infile.Open(path, infile.Mechanism)
		if err != nil {
			return nil, err
		}
		closers = append(closers, f)
		return f, nil
	}
	mr, err := open(mechPath)
	if err != nil {
		return nil, nil, err
	}
	tr, err := open(thermoPath)
	if err != nil {
		return nil, nil, err
	}
	xr, err := open(transportPath)
	if err != nil {
		return nil, nil, err
	}
	m, probs, err := Read(mr, tr, xr, mechPath, thermoPath, transportPath)
	if m != nil {
		m.Name = nameFromPath(mechPath)
	}
	return m, probs, err
}

// nameFromPath names a mechanism after its file, or after the folder when
// the file has a generic name (mech.inp, chem.inp, ...).
func nameFromPath(path string) string {
	stem := strings.TrimSuffix(filepath.Base(path), filepath.Ext(path))
	switch strings.ToLower(stem) {
	case "mech", "chem", "mechanism", "kinetics", "reactions":
		if dir := filepath.Base(filepath.Dir(path)); dir != "." && dir != string(filepath.Separator) {
			return dir
		}
	}
	return stem
}

// Read imports a mechanism from readers. thermo and transport may be nil.
// names are the file names used in problem positions and messages, in the
// order mechanism, thermo, transport (defaults "mechanism", "thermo",
// "transport"). See ReadFiles for the meaning of the results.
func Read(mech, thermoR, transport io.Reader, names ...string) (*chem.Mechanism, []chem.Problem, error) {
	fileNames := [3]string{"mechanism", "thermo", "transport"}
	for i, n := range names {
		if i < 3 && n != "" {
			fileNames[i] = n
		}
	}
	if mech == nil {
		return nil, nil, fmt.Errorf("no mechanism input")
	}
	lines, err := readLines(mech, fileNames[0])
	if err != nil {
		return nil, nil, err
	}
	var thermoLines, transportLines []srcLine
	if thermoR != nil {
		if thermoLines, err = readLines(thermoR, fileNames[1]); err != nil {
			return nil, nil, err
		}
	}
	if transport != nil {
		if transportLines, err = readLines(transport, fileNames[2]); err != nil {
			return nil, nil, err
		}
	}
	var p problemList
	mf := scanMechanism(lines, fileNames[0], &p)
	m, noThermo := mf.build(thermoLines, thermoR != nil, transportLines, transport != nil, fileNames, &p)
	vprobs, _ := m.Validate()
	// A reaction with a species whose thermo record is missing or broken
	// cannot be judged for element balance: the species has no atoms.
	unjudged := map[chem.Position]bool{}
	for _, r := range m.Reactions {
		for _, part := range append(append([]chem.Participant(nil), r.Reactants...), r.Products...) {
			if noThermo[part.Species] {
				unjudged[r.Origin] = true
			}
		}
	}
	for _, q := range vprobs {
		// Species without a thermo record were reported above, naming the
		// files searched; Validate's consequences for them add nothing.
		if k := m.SpeciesIndex(speciesOfProblem(q)); k >= 0 && noThermo[k] && q.Pos == m.Species[k].Origin {
			continue
		}
		if unjudged[q.Pos] && strings.Contains(q.Message, "not element-balanced") {
			continue
		}
		p.list = append(p.list, q)
	}
	probs, verr := p.result()
	return m, probs, verr
}

type declared struct {
	name string
	pos  chem.Position
}

// mechFile is the content of a reactions file before thermo and transport
// are attached.
type mechFile struct {
	file        string
	description string
	elements    []string
	species     []declared
	index       *speciesIndex
	embedded    []ThermoRecord
	hasThermo   bool
	sawElements bool
	sawSpecies  bool
	reactions   []*pending
	units       []rateUnits // per reaction
}

type blockState int

const (
	outside blockState = iota
	inElements
	inSpecies
	inReactions
)

// scanMechanism reads the blocks of a reactions file.
func scanMechanism(lines []srcLine, file string, p *problemList) *mechFile {
	mf := &mechFile{file: file, index: newSpeciesIndex()}
	mf.description = leadingComment(lines)
	state := outside
	var units rateUnits
	var current *pending
	endBlock := func(i int, what string) {
		if state != outside {
			p.warnf(chem.Position{File: file, Line: lines[i].num}, "%s block not closed by END", what)
		}
	}
	blockNames := map[blockState]string{inElements: "ELEMENTS", inSpecies: "SPECIES", inReactions: "REACTIONS"}
	// handle processes the text s of line i; it returns text left over on
	// the same line after a block's END (e.g. "ELEMENTS H O END SPECIES ...").
	handle := func(i *int, s string) string {
		ln := lines[*i]
		pos := chem.Position{File: file, Line: ln.num}
		w := firstWord(s)
		if isBlockKeyword(w) {
			if state != outside {
				endBlock(*i, blockNames[state])
				state = outside
			}
			rest := strings.Fields(s)[1:]
			switch w {
			case "ELEMENTS", "ELEM":
				state, mf.sawElements = inElements, true
				var left string
				state, left = mf.addElements(rest, pos, p, state)
				return left
			case "SPECIES", "SPEC":
				state, mf.sawSpecies = inSpecies, true
				var left string
				state, left = mf.addSpecies(rest, pos, p, state)
				return left
			case "THERMO", "THER":
				mf.hasThermo = true
				var wanted func(string) bool
				if mf.sawSpecies {
					wanted = func(n string) bool { return isSpecies(mf.index, n) }
				}
				recs, next, ended := parseThermoBlock(lines, *i+1, file, wanted, p)
				if !ended {
					p.warnf(pos, "THERMO block has no END line (read to end of file)")
				}
				mf.embedded = append(mf.embedded, recs...)
				*i = next - 1
			case "REACTIONS", "REAC":
				state = inReactions
				units = parseUnitWords(rest, pos, p)
			}
			return ""
		}
		var left string
		switch state {
		case outside:
			if w == "END" {
				p.warnf(pos, "END outside any block ignored")
				return strings.Join(strings.Fields(s)[1:], " ")
			}
			p.errorf(pos, "unexpected text outside any block: %q (expected ELEMENTS, SPECIES, THERMO or REACTIONS)", s)
		case inElements:
			state, left = mf.addElements(strings.Fields(s), pos, p, state)
		case inSpecies:
			state, left = mf.addSpecies(strings.Fields(s), pos, p, state)
		case inReactions:
			switch {
			case w == "END":
				state = outside
				current = nil
				left = strings.Join(strings.Fields(s)[1:], " ")
			case strings.Contains(s, "="):
				current = parseEquationLine(s, pos, mf.index, p)
				mf.reactions = append(mf.reactions, current)
				mf.units = append(mf.units, units)
			case current == nil:
				p.errorf(pos, "auxiliary line %q before any reaction", s)
			default:
				current.applyAux(s, pos, mf.index, p)
			}
		}
		return left
	}
	for i := 0; i < len(lines); i++ {
		for s := stripComment(lines[i].text); s != ""; {
			s = handle(&i, s)
		}
	}
	if state != outside {
		p.warnf(chem.Position{File: file, Line: lastLine(lines)}, "%s block not closed by END (end of file)", blockNames[state])
	}
	return mf
}

// addElements reads element symbols; "END" closes the block. Atomic weights
// written "D/2.014/" are ignored: flame1d uses standard atomic weights.
func (mf *mechFile) addElements(tokens []string, pos chem.Position, p *problemList, state blockState) (blockState, string) {
	for j, t := range tokens {
		if strings.EqualFold(t, "END") {
			return outside, strings.Join(tokens[j+1:], " ")
		}
		sym, weight, hasWeight := strings.Cut(t, "/")
		if hasWeight {
			p.warnf(pos, "atomic weight %q given for element %s ignored; the standard atomic weight is used", strings.Trim(weight, "/"), sym)
		}
		if sym == "" {
			continue
		}
		sym = strings.ToUpper(sym)
		if !isElementSymbol(sym) {
			p.errorf(pos, "%q is not an element symbol", sym)
			continue
		}
		dup := false
		for _, e := range mf.elements {
			dup = dup || e == sym
		}
		if dup {
			p.warnf(pos, "element %s declared twice", sym)
			continue
		}
		mf.elements = append(mf.elements, sym)
	}
	return state, ""
}

// addSpecies reads species names; "END" closes the block.
func (mf *mechFile) addSpecies(tokens []string, pos chem.Position, p *problemList, state blockState) (blockState, string) {
	for j, t := range tokens {
		if strings.EqualFold(t, "END") {
			return outside, strings.Join(tokens[j+1:], " ")
		}
		if strings.ContainsAny(t, "/=") || strings.EqualFold(t, "M") || !printableASCII(t) {
			p.errorf(pos, "%q cannot be a species name (no '/', '=', the name M, or characters outside printable ASCII)", t)
			continue
		}
		if k, dup := mf.index.find(t); dup {
			p.warnf(pos, "species %q declared twice (first at line %d); the repeat is ignored", t, mf.species[k].pos.Line)
			continue
		}
		mf.index.add(t, len(mf.species))
		mf.species = append(mf.species, declared{t, pos})
	}
	return state, ""
}

func printableASCII(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] <= ' ' || s[i] > '~' {
			return false
		}
	}
	return true
}

// leadingComment returns the comment block that opens a file (typically the
// mechanism's title, authors and citation), without "!" and decoration.
func leadingComment(lines []srcLine) string {
	var out []string
	for _, ln := range lines {
		t := strings.TrimSpace(ln.text)
		if t == "" {
			continue
		}
		if !strings.HasPrefix(t, "!") {
			break
		}
		t = strings.TrimSpace(strings.TrimLeft(t, "!"))
		t = strings.TrimSpace(strings.TrimRight(t, "!"))
		if strings.IndexFunc(t, func(r rune) bool {
			return r >= 'A' && r <= 'Z' || r >= 'a' && r <= 'z' || r >= '0' && r <= '9'
		}) < 0 {
			continue
		}
		out = append(out, t)
	}
	return strings.Join(out, "\n")
}

// speciesOfProblem returns the quoted species name of a Validate message
// about a species ("species \"X\" ..."), or "".
func speciesOfProblem(q chem.Problem) string {
	rest, ok := strings.CutPrefix(q.Message, "species \"")
	if !ok {
		return ""
	}
	name, _, ok := strings.Cut(rest, "\"")
	if !ok {
		return ""
	}
	return name
}

// brokenRecord reports whether an error was already reported for the thermo
// record of species name (a record that exists but cannot be read), and
// where.
func brokenRecord(p *problemList, name string) (string, bool) {
	prefix := fmt.Sprintf("thermo record %q", name)
	for _, q := range p.list {
		if !q.Warning && strings.HasPrefix(strings.ToLower(q.Message), strings.ToLower(prefix)) {
			return fmt.Sprintf("%s:%d", q.Pos.File, q.Pos.Line), true
		}
	}
	return "", false
}

// build attaches thermo and transport data and completes the reactions. It
// also reports which species have no thermo record.
func (mf *mechFile) build(thermoLines []srcLine, haveThermo bool, transportLines []srcLine, haveTransport bool,
	files [3]string, p *problemList) (*chem.Mechanism, map[int]bool) {
	m := &chem.Mechanism{Name: strings.TrimSuffix(filepath.Base(files[0]), filepath.Ext(files[0])),
		Description: mf.description, Elements: mf.elements}
	noPos := chem.Position{File: mf.file}
	if !mf.sawElements {
		p.errorf(noPos, "no ELEMENTS block")
	}
	if !mf.sawSpecies || len(mf.species) == 0 {
		p.errorf(noPos, "no species declared (SPECIES block missing or empty)")
	}
	records := map[string]ThermoRecord{}
	for _, r := range mf.embedded {
		if _, dup := records[strings.ToUpper(r.Name)]; !dup {
			records[strings.ToUpper(r.Name)] = r
		}
	}
	var sources []string
	if mf.hasThermo {
		sources = append(sources, "the THERMO block of "+files[0])
	}
	if haveThermo {
		sources = append(sources, files[1])
		for _, r := range readThermoFile(thermoLines, files[1], func(n string) bool { return isSpecies(mf.index, n) }, p) {
			if _, dup := records[strings.ToUpper(r.Name)]; !dup {
				records[strings.ToUpper(r.Name)] = r
			}
		}
	}
	searched := strings.Join(sources, " and ")
	if searched == "" {
		searched = "no thermo file was given and " + files[0] + " has no THERMO block"
	}
	var wantTransport func(string) bool
	if haveTransport {
		wantTransport = func(n string) bool { return isSpecies(mf.index, n) }
	}
	var trans map[string]transportEntry
	if haveTransport {
		trans = map[string]transportEntry{}
		for n, t := range parseTransport(transportLines, files[2], wantTransport, p) {
			trans[strings.ToUpper(n)] = t
		}
	}
	noThermo := map[int]bool{}
	for k, d := range mf.species {
		sp := chem.Species{Origin: d.pos}
		sp.Name = d.name
		if rec, ok := records[strings.ToUpper(d.name)]; ok {
			sp.Species = rec.Species
			sp.Name = d.name
			sp.Composition = make(map[string]float64, len(rec.Composition))
			for e, n := range rec.Composition {
				sp.Composition[e] = n
			}
			sp.Origin = rec.Origin
		} else {
			if at, broken := brokenRecord(p, d.name); broken {
				p.errorf(d.pos, "species '%s': its thermo record (%s) cannot be read; see the error there", d.name, at)
			} else {
				p.errorf(d.pos, "species '%s' has no thermo record (searched %s)", d.name, searched)
			}
			noThermo[k] = true
		}
		if haveTransport {
			if t, ok := trans[strings.ToUpper(d.name)]; ok {
				sp.Transport = &t.params
				checkGeometry(&sp, chem.Position{File: files[2], Line: t.line}, p)
			} else {
				p.errorf(d.pos, "species '%s' has no transport line in %s", d.name, files[2])
			}
		}
		m.Species = append(m.Species, sp)
	}
	for i, pr := range mf.reactions {
		if r, ok := pr.finish(mf.units[i], p); ok {
			m.Reactions = append(m.Reactions, r)
		}
	}
	checkDuplicatePartners(m, p)
	return m, noThermo
}

// checkGeometry warns when the transport geometry contradicts the atom count.
func checkGeometry(sp *chem.Species, pos chem.Position, p *problemList) {
	atoms := 0.0
	for _, n := range sp.Composition {
		atoms += n
	}
	if atoms == 0 {
		return
	}
	g := sp.Transport.Geometry
	var msg string
	switch {
	case atoms == 1 && g != chem.Atom:
		msg = "a single atom but its transport geometry is not 0 (atom)"
	case atoms > 1 && g == chem.Atom:
		msg = "several atoms but its transport geometry is 0 (atom)"
	case atoms == 2 && g == chem.Nonlinear:
		msg = "two atoms but its transport geometry is 2 (nonlinear)"
	}
	if msg != "" {
		p.warnf(pos, "species '%s' has %s", sp.Name, msg)
	}
}

// checkDuplicatePartners warns about reactions marked DUPLICATE that no
// other marked reaction repeats. Partners are matched on species and
// coefficients in either direction (a reversible and an irreversible step
// of the same chemistry may form a pair) and on the collider.
func checkDuplicatePartners(m *chem.Mechanism, p *problemList) {
	side := func(ps []chem.Participant) string {
		parts := make([]string, len(ps))
		for i, q := range ps {
			parts[i] = fmt.Sprintf("%g %d", q.Coefficient, q.Species)
		}
		sort.Strings(parts)
		return strings.Join(parts, "+")
	}
	collider := func(r *chem.Reaction) string {
		if r.ThirdBody == nil {
			return ""
		}
		c := fmt.Sprintf("|%d", r.Form)
		if r.ThirdBody.Default == 0 && len(r.ThirdBody.Efficiencies) == 1 {
			for k := range r.ThirdBody.Efficiencies {
				c += fmt.Sprintf(":%d", k)
			}
		}
		return c
	}
	count := map[string]int{}
	keys := make([]string, len(m.Reactions))
	for i := range m.Reactions {
		r := &m.Reactions[i]
		if !r.Duplicate {
			continue
		}
		a, b := side(r.Reactants), side(r.Products)
		if a > b {
			a, b = b, a
		}
		keys[i] = a + ">" + b + collider(r)
		count[keys[i]]++
	}
	for i := range m.Reactions {
		r := &m.Reactions[i]
		if r.Duplicate && count[keys[i]] < 2 {
			p.warnf(r.Origin, "reaction '%s' is marked DUPLICATE but no other marked reaction has the same species", r.Equation)
		}
	}
}
