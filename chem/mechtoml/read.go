package mechtoml

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
	"time"

	"flame1d/chem"
	"flame1d/chem/internal/equation"
	"flame1d/internal/infile"
	"flame1d/internal/tomlpos"
)

// FormatVersion is the version of the mechanism file format this package
// reads and writes (the top-level key "format").
const FormatVersion = 1

// ReadFile reads a mechanism file; see Read.
func ReadFile(path string) (*chem.Mechanism, []chem.Problem, error) {
	f, err := infile.Open(path, infile.Mechanism)
	if err != nil {
		return nil, nil, err
	}
	defer f.Close()
	return Read(f, path)
}

// Read reads a mechanism in flame1d's TOML format (docs/mechanism-format.md)
// and converts every number to SI. file names the source in messages and in
// each species' and reaction's Origin.
//
// Every defect found is returned as a chem.Problem with file:line; when any
// is an error the mechanism is nil and err is a *chem.ValidationError
// carrying them all. A file that reads cleanly is then checked with
// chem.Mechanism.Validate, whose problems (warnings included) are returned
// the same way. err is also set, without problems, when r fails.
func Read(r io.Reader, file string) (*chem.Mechanism, []chem.Problem, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, nil, fmt.Errorf("reading %s: %w", file, err)
	}
	rd := &reader{file: file}
	m := rd.read(string(data))
	if rd.failed() {
		return nil, rd.problems, &chem.ValidationError{Problems: rd.problems}
	}
	problems, err := m.Validate()
	problems = append(rd.problems, problems...)
	if err != nil {
		return nil, problems, &chem.ValidationError{Problems: problems}
	}
	return m, problems, nil
}

// Keys used by both the reader and the writer.
const (
	efficienciesKey       = "collision_efficiencies"
	unlistedEfficiencyKey = "unlisted_collision_efficiency"
)

// arrheniusKeys are the keys of k = A T^b exp(-E/(R T)): A, b, E.
var arrheniusKeys = [3]string{"pre_exponential", "temperature_exponent", "activation_energy"}

// reader holds the state of one Read.
type reader struct {
	file     string
	problems []chem.Problem
	paths    [][]string // key path of each problem, for its line
	units    units
	declared struct{ energy, pressure, concentration bool }
	mech     *chem.Mechanism
	species  map[string]int // species name -> index
}

func (rd *reader) failed() bool {
	for _, p := range rd.problems {
		if !p.Warning {
			return true
		}
	}
	return false
}

// lineOf returns the line of path in lines, or of its nearest parent that
// has one.
func lineOf(lines map[string]int, path []string) int {
	for j := len(path); j > 0; j-- {
		if l, ok := lines[joinPath(path[:j])]; ok {
			return l
		}
	}
	return 0
}

// errorf records an error at path; label ("reaction 3 (A => B)") prefixes
// the message when not empty. Lines are filled in once reading is done.
func (rd *reader) errorf(path []string, label, format string, a ...any) {
	msg := fmt.Sprintf(format, a...)
	if label != "" {
		msg = label + ": " + msg
	}
	rd.problems = append(rd.problems, chem.Problem{Pos: chem.Position{File: rd.file}, Message: msg})
	rd.paths = append(rd.paths, path)
}

// placeProblems gives each problem its line and sorts them into file order.
func (rd *reader) placeProblems(lines map[string]int) {
	for i := range rd.problems {
		rd.problems[i].Pos.Line = lineOf(lines, rd.paths[i])
	}
	sort.SliceStable(rd.problems, func(i, j int) bool { return rd.problems[i].Pos.Line < rd.problems[j].Pos.Line })
}

// placeOrigins sets the Origin of every species and reaction: the line of
// its [[species]] / [[reaction]] table.
func (rd *reader) placeOrigins(lines map[string]int, reactionIndex []int) {
	m := rd.mech
	for i := range m.Species {
		m.Species[i].Origin = chem.Position{File: rd.file, Line: lineOf(lines, []string{"species", strconv.Itoa(i)})}
	}
	for j, i := range reactionIndex {
		m.Reactions[j].Origin = chem.Position{File: rd.file, Line: lineOf(lines, []string{"reaction", strconv.Itoa(i)})}
	}
}

// sub returns path extended by key (a fresh slice: paths are kept in
// closures and messages).
func sub(path []string, key ...string) []string {
	p := make([]string, 0, len(path)+len(key))
	return append(append(p, path...), key...)
}

func (rd *reader) read(text string) *chem.Mechanism {
	var doc map[string]any
	if _, err := tomlpos.DecodeBare([]byte(text), &doc); err != nil {
		if line, msg, ok := tomlpos.SyntaxError([]byte(text), err); ok {
			rd.problems = append(rd.problems, chem.Problem{
				Pos:     chem.Position{File: rd.file, Line: line},
				Message: "not valid TOML: " + msg,
			})
		} else {
			rd.errorf(nil, "", "not valid TOML: %v", err)
		}
		return nil
	}
	rd.mech = &chem.Mechanism{}
	reactionIndex := rd.walk(doc)
	// Lines come from a second scan of the text: of every key when there
	// are problems to place, else only of the table headers.
	var lines map[string]int
	if len(rd.problems) > 0 {
		lines = locate(text, true)
		rd.placeProblems(lines)
	} else {
		lines = locate(text, false)
	}
	rd.placeOrigins(lines, reactionIndex)
	return rd.mech
}

// walk converts the decoded document. It returns, for each reaction kept,
// its index in the file.
func (rd *reader) walk(doc map[string]any) []int {
	m := rd.mech
	rd.checkKeys(doc, nil, "", "format_version", "name", "description", "elements", "default_units", "validity", "species", "reaction")

	if v, ok := doc["format_version"]; ok {
		if n, ok := v.(int64); !ok || n != FormatVersion {
			rd.errorf([]string{"format_version"}, "", "format_version = %s is not supported; this flame1d reads format_version = %d", tomlText(v), FormatVersion)
		}
	}
	if v, ok := doc["name"]; ok {
		m.Name, _ = rd.str(v, []string{"name"}, "", "name")
	}
	if v, ok := doc["description"]; ok {
		m.Description, _ = rd.str(v, []string{"description"}, "", "description")
	}
	rd.readUnits(doc)
	if v, ok := doc["elements"]; ok {
		rd.readElements(v)
	} else {
		rd.errorf(nil, "", "no elements list (elements = [\"O\", \"H\", ...])")
	}
	species := rd.tables(doc["species"], []string{"species"}, "species")
	if _, ok := doc["species"]; !ok {
		rd.errorf(nil, "", "no species ([[species]] tables)")
	}
	rd.species = make(map[string]int, len(species))
	m.Species = make([]chem.Species, len(species))
	for i, t := range species {
		rd.readSpecies(i, t)
	}
	if v, ok := doc["validity"]; ok {
		m.Validity = rd.readValidity(v)
	}
	reactions := rd.tables(doc["reaction"], []string{"reaction"}, "reaction")
	if len(reactions) > 0 {
		m.Reactions = make([]chem.Reaction, 0, len(reactions))
	}
	var kept []int
	for i, t := range reactions {
		if r, ok := rd.readReaction(i, t); ok {
			m.Reactions = append(m.Reactions, r)
			kept = append(kept, i)
		}
	}
	return kept
}

// checkKeys reports every key of t that is not in allowed.
func (rd *reader) checkKeys(t map[string]any, path []string, label string, allowed ...string) {
	var unknown []string
	for k := range t {
		ok := false
		for _, a := range allowed {
			if k == a {
				ok = true
				break
			}
		}
		if !ok {
			unknown = append(unknown, k)
		}
	}
	sort.Strings(unknown)
	where := "at the top level"
	if len(path) > 0 {
		where = "in " + displayPath(path)
	}
	for _, k := range unknown {
		rd.errorf(sub(path, k), label, "unknown key %q %s (allowed: %s)", k, where, strings.Join(allowed, ", "))
	}
}

// displayPath writes a key path the way the file spells it, with array
// elements numbered from 1: reaction[3].falloff.
func displayPath(path []string) string {
	var b strings.Builder
	for i, p := range path {
		if n, err := strconv.Atoi(p); err == nil && i > 0 {
			fmt.Fprintf(&b, "[%d]", n+1)
			continue
		}
		if i > 0 {
			b.WriteByte('.')
		}
		b.WriteString(p)
	}
	return b.String()
}

// keyName names the last key of path for messages: "A", "low[3]".
func keyName(path []string) string {
	if len(path) == 0 {
		return "value"
	}
	if _, err := strconv.Atoi(path[len(path)-1]); err == nil && len(path) >= 2 {
		return displayPath(path[len(path)-2:])
	}
	return path[len(path)-1]
}

// typeName names a decoded TOML value's type for messages.
func typeName(v any) string {
	switch v.(type) {
	case string:
		return "a string"
	case int64:
		return "an integer"
	case float64:
		return "a float"
	case bool:
		return "a boolean"
	case []any:
		return "an array"
	case map[string]any:
		return "a table"
	case []map[string]any:
		return "an array of tables"
	case time.Time:
		return "a date/time"
	}
	return fmt.Sprintf("a %T", v)
}

// tomlText shows a decoded value briefly in a message.
func tomlText(v any) string {
	if s, ok := v.(string); ok {
		return strconv.Quote(s)
	}
	return fmt.Sprint(v)
}

func (rd *reader) str(v any, path []string, label, what string) (string, bool) {
	s, ok := v.(string)
	if !ok {
		rd.errorf(path, label, "%s must be a string, not %s", what, typeName(v))
	}
	return s, ok
}

func (rd *reader) table(v any, path []string, label, what string) (map[string]any, bool) {
	t, ok := v.(map[string]any)
	if !ok {
		rd.errorf(path, label, "%s must be a table, not %s", what, typeName(v))
	}
	return t, ok
}

// tables returns the elements of an array of tables ([[x]] headers or an
// inline array of inline tables); nil when v is nil.
func (rd *reader) tables(v any, path []string, what string) []map[string]any {
	switch x := v.(type) {
	case nil:
		return nil
	case []map[string]any:
		return x
	case []any:
		out := make([]map[string]any, 0, len(x))
		for i, e := range x {
			t, ok := rd.table(e, sub(path, strconv.Itoa(i)), "", fmt.Sprintf("%s %d", what, i+1))
			if ok {
				out = append(out, t)
			}
		}
		return out
	}
	rd.errorf(path, "", "%s must be an array of tables ([[%s]]), not %s", what, what, typeName(v))
	return nil
}

// array returns the elements of an array value.
func (rd *reader) array(v any, path []string, label, what string) ([]any, bool) {
	a, ok := v.([]any)
	if !ok {
		rd.errorf(path, label, "%s must be an array, not %s", what, typeName(v))
	}
	return a, ok
}

// kind is the physical kind of a number, which decides the units it may be
// written in.
type kind int

const (
	dimensionless kind = iota
	temperature        // K
	energy             // activation energy, [default_units] activation_energy
	pressure           // [default_units] pressure
)

// number reads a number of the given kind and returns it in SI units. A
// TOML integer or float is in the file's unit for that kind; a string
// "value unit" carries its own unit.
func (rd *reader) number(v any, path []string, label string, k kind) (float64, bool) {
	var q float64
	unit, hasUnit := "", false
	switch x := v.(type) {
	case int64:
		q = float64(x)
	case float64:
		q = x
	case string:
		var err error
		q, unit, err = parseValueWithUnit(x)
		if err != nil {
			rd.errorf(path, label, "%s: %v", keyName(path), err)
			return 0, false
		}
		hasUnit = true
	default:
		rd.errorf(path, label, "%s must be a number, not %s", keyName(path), typeName(v))
		return 0, false
	}
	if math.IsNaN(q) || math.IsInf(q, 0) {
		rd.errorf(path, label, "%s must be finite, not %v", keyName(path), q)
		return 0, false
	}
	si, ok := q, true
	bad := func(format string, a ...any) {
		rd.errorf(path, label, "%s: "+format, append([]any{keyName(path)}, a...)...)
		ok = false
	}
	switch k {
	case dimensionless:
		if hasUnit {
			bad("write a plain number without a unit (%q); where the value has a unit, the key name says which", unit)
		}
	case temperature:
		if hasUnit && unit != "K" {
			bad("temperatures are in K, not %q", unit)
		}
	case energy, pressure:
		// A unit with the value, else the [default_units] table's.
		name, key, allowed, f, known := "energy", "activation_energy", energyUnits, rd.units.energyJ, rd.declared.energy
		if k == pressure {
			name, key, allowed, f, known = "pressure", "pressure", pressureUnits, rd.units.pressPa, rd.declared.pressure
		}
		if hasUnit {
			if f, known = allowed[unit]; !known {
				bad("unknown %s unit %q (use %s)", name, unit, unitList(allowed))
			}
		} else if !known {
			bad("no %s unit: declare %s in [default_units] or write the unit with the value, e.g. \"%s %s\"",
				name, key, formatFloat(q), map[kind]string{energy: "cal/mol", pressure: "atm"}[k])
		}
		si = scaleBy(q, f)
	}
	if ok && (math.IsInf(si, 0) || math.IsNaN(si)) {
		bad("%g is out of range after conversion to SI units", q)
	}
	return si, ok
}

// numbers reads an array of n numbers of one kind (any length if n < 0).
func (rd *reader) numbers(v any, path []string, label string, n int, k kind) ([]float64, bool) {
	a, ok := rd.array(v, path, label, keyName(path))
	if !ok {
		return nil, false
	}
	if n >= 0 && len(a) != n {
		rd.errorf(path, label, "%s must hold %d numbers, not %d", keyName(path), n, len(a))
		return nil, false
	}
	out := make([]float64, len(a))
	for i, e := range a {
		if out[i], ok = rd.number(e, sub(path, strconv.Itoa(i)), label, k); !ok {
			return nil, false
		}
	}
	return out, true
}

func (rd *reader) readUnits(doc map[string]any) {
	v, ok := doc["default_units"]
	if !ok {
		return
	}
	path := []string{"default_units"}
	t, ok := rd.table(v, path, "", "default_units")
	if !ok {
		return
	}
	rd.checkKeys(t, path, "", "activation_energy", "concentration", "pressure")
	pick := func(key string, allowed []string) (string, bool) {
		v, ok := t[key]
		if !ok {
			return "", false
		}
		s, ok := rd.str(v, sub(path, key), "", "default_units."+key)
		if !ok {
			return "", false
		}
		for _, a := range allowed {
			if s == a {
				return s, true
			}
		}
		rd.errorf(sub(path, key), "", "default_units.%s = %q is not one of %s", key, s, strings.Join(allowed, ", "))
		return "", false
	}
	if s, ok := pick("activation_energy", unitNames(energyUnits)); ok {
		rd.units.energy, rd.units.energyJ, rd.declared.energy = s, energyUnits[s], true
	}
	if s, ok := pick("pressure", unitNames(pressureUnits)); ok {
		rd.units.pressure, rd.units.pressPa, rd.declared.pressure = s, pressureUnits[s], true
	}
	if s, ok := pick("concentration", concentrationUnits[:]); ok {
		rd.units.lengthCM = strings.HasSuffix(s, "cm^3")
		rd.units.molecule = strings.HasPrefix(s, "molecule")
		rd.declared.concentration = true
	}
}

func (rd *reader) readElements(v any) {
	path := []string{"elements"}
	a, ok := rd.array(v, path, "", "elements")
	if !ok {
		return
	}
	rd.mech.Elements = make([]string, 0, len(a))
	for i, e := range a {
		s, ok := rd.str(e, sub(path, strconv.Itoa(i)), "", fmt.Sprintf("element %d", i+1))
		if ok {
			rd.mech.Elements = append(rd.mech.Elements, s)
		}
	}
}

// speciesLabel names species i in messages.
func speciesLabel(i int, name string) string {
	if name == "" {
		return fmt.Sprintf("species %d", i+1)
	}
	return fmt.Sprintf("species %d (%s)", i+1, name)
}

func (rd *reader) readSpecies(i int, t map[string]any) {
	path := []string{"species", strconv.Itoa(i)}
	s := &rd.mech.Species[i]
	if v, ok := t["name"]; !ok {
		rd.errorf(path, speciesLabel(i, ""), "no name")
	} else if name, ok := rd.str(v, sub(path, "name"), speciesLabel(i, ""), "name"); ok {
		if name == "" || strings.ContainsAny(name, " \t\n\r") {
			rd.errorf(sub(path, "name"), speciesLabel(i, ""), "species name %q must be non-empty and without blanks", name)
		}
		s.Name = name
		if _, dup := rd.species[name]; !dup {
			rd.species[name] = i
		}
	}
	label := speciesLabel(i, s.Name)
	rd.checkKeys(t, path, label, "name", "atoms", "phase", "nasa7", "kinetic_theory")

	if v, ok := t["atoms"]; !ok {
		rd.errorf(path, label, "no atoms table (e.g. atoms = {C = 1, H = 4})")
	} else if at, ok := rd.table(v, sub(path, "atoms"), label, "atoms"); ok {
		s.Composition = make(map[string]float64, len(at))
		for e, n := range at {
			if x, ok := rd.number(n, sub(path, "atoms", e), label, dimensionless); ok {
				s.Composition[e] = x
			}
		}
	}
	if v, ok := t["phase"]; ok {
		if ph, ok := rd.str(v, sub(path, "phase"), label, "phase"); ok {
			switch ph {
			case "gas":
			case "condensed":
				s.Condensed = true
			default:
				rd.errorf(sub(path, "phase"), label, "phase = %q is not \"gas\" or \"condensed\"", ph)
			}
		}
	}
	if v, ok := t["nasa7"]; !ok {
		rd.errorf(path, label, "no thermo data ([species.nasa7] table with T_range_K, low_T_coefficients, high_T_coefficients)")
	} else {
		rd.readNASA7(v, sub(path, "nasa7"), label, s)
	}
	if v, ok := t["kinetic_theory"]; ok {
		s.Transport = rd.readTransport(v, sub(path, "kinetic_theory"), label)
	}
}

func (rd *reader) readNASA7(v any, path []string, label string, s *chem.Species) {
	t, ok := rd.table(v, path, label, "nasa7")
	if !ok {
		return
	}
	rd.checkKeys(t, path, label, "T_range_K", "low_T_coefficients", "high_T_coefficients")
	for _, k := range []string{"T_range_K", "low_T_coefficients", "high_T_coefficients"} {
		if _, ok := t[k]; !ok {
			rd.errorf(path, label, "nasa7 has no %s", k)
			return
		}
	}
	tr, ok1 := rd.numbers(t["T_range_K"], sub(path, "T_range_K"), label, 3, temperature)
	lo, ok2 := rd.numbers(t["low_T_coefficients"], sub(path, "low_T_coefficients"), label, 7, dimensionless)
	hi, ok3 := rd.numbers(t["high_T_coefficients"], sub(path, "high_T_coefficients"), label, 7, dimensionless)
	if !(ok1 && ok2 && ok3) {
		return
	}
	if !(tr[0] > 0 && tr[0] < tr[1] && tr[1] < tr[2]) {
		rd.errorf(sub(path, "T_range_K"), label, "T_range_K must rise: 0 < low < switch < high, not %v", tr)
	}
	s.Thermo.TLow, s.Thermo.TMid, s.Thermo.THigh = tr[0], tr[1], tr[2]
	copy(s.Thermo.Low[:], lo)
	copy(s.Thermo.High[:], hi)
}

var structures = map[string]chem.Geometry{"monatomic": chem.Atom, "linear": chem.Linear, "nonlinear": chem.Nonlinear}

// readTransport reads a species' kinetic_theory table. Each length-like
// parameter has two keys, one in the unit of published transport tables
// and one in SI; at most one of them may be given.
func (rd *reader) readTransport(v any, path []string, label string) *chem.TransportParams {
	t, ok := rd.table(v, path, label, "kinetic_theory")
	if !ok {
		return nil
	}
	allowed := []string{"structure", "lj_well_depth_K", "rotational_collision_number_298K"}
	for _, q := range transportQuantities {
		allowed = append(allowed, q.tableKey, q.siKey)
	}
	rd.checkKeys(t, path, label, allowed...)
	tp := &chem.TransportParams{}
	for _, k := range []string{"structure", "lj_well_depth_K"} {
		if _, ok := t[k]; !ok {
			rd.errorf(path, label, "kinetic_theory has no %s", k)
		}
	}
	if v, ok := t["structure"]; ok {
		if st, ok := rd.str(v, sub(path, "structure"), label, "structure"); ok {
			g, known := structures[st]
			if !known {
				rd.errorf(sub(path, "structure"), label, "structure = %q is not \"monatomic\", \"linear\" or \"nonlinear\"", st)
			}
			tp.Geometry = g
		}
	}
	if v, ok := t["lj_well_depth_K"]; ok {
		tp.WellDepth, _ = rd.number(v, sub(path, "lj_well_depth_K"), label, temperature)
	}
	if v, ok := t["rotational_collision_number_298K"]; ok {
		tp.RotRelaxation, _ = rd.number(v, sub(path, "rotational_collision_number_298K"), label, dimensionless)
	}
	dst := [...]*float64{&tp.Diameter, &tp.Dipole, &tp.Polarizability}
	for i, q := range transportQuantities {
		vt, inTable := t[q.tableKey]
		vs, inSI := t[q.siKey]
		switch {
		case inTable && inSI:
			rd.errorf(sub(path, q.siKey), label, "give %s or %s, not both", q.tableKey, q.siKey)
		case inTable:
			if x, ok := rd.number(vt, sub(path, q.tableKey), label, dimensionless); ok {
				*dst[i] = q.toSI(x)
			}
		case inSI:
			*dst[i], _ = rd.number(vs, sub(path, q.siKey), label, dimensionless)
		case q.required:
			rd.errorf(path, label, "kinetic_theory has no %s (or %s)", q.tableKey, q.siKey)
		}
	}
	return tp
}

// reactionLabel names reaction i in messages.
func reactionLabel(i int, eq string) string {
	if eq == "" {
		return fmt.Sprintf("reaction %d", i+1)
	}
	return fmt.Sprintf("reaction %d (%s)", i+1, eq)
}

// rateTables are the keys that give a reaction's rate; exactly one is
// present and it decides the form.
var rateTables = []struct {
	key  string
	form chem.RateForm
}{
	{"arrhenius", chem.Elementary},
	{"falloff", chem.Falloff},
	{"chemically_activated", chem.ChemicallyActivated},
	{"pressure_table", chem.PressureTable},
	{"chebyshev", chem.Chebyshev},
}

func (rd *reader) readReaction(i int, t map[string]any) (chem.Reaction, bool) {
	path := []string{"reaction", strconv.Itoa(i)}
	var r chem.Reaction
	before := len(rd.problems)
	text := ""
	if v, ok := t["equation"]; !ok {
		rd.errorf(path, reactionLabel(i, ""), "no equation")
	} else {
		text, _ = rd.str(v, sub(path, "equation"), reactionLabel(i, ""), "equation")
	}
	label := reactionLabel(i, text)
	rd.checkKeys(t, path, label, "equation", "written_as", "duplicate", "rate_uncertainty_factor",
		"arrhenius", "falloff", "chemically_activated", "pressure_table", "chebyshev",
		"collision_efficiencies", "unlisted_collision_efficiency", "reverse_arrhenius",
		"concentration_exponents", "reverse_concentration_exponents")
	if text == "" {
		return r, false
	}
	eq, err := equation.Parse(text, rd.speciesIndex)
	if err != nil {
		rd.errorf(sub(path, "equation"), label, "%v", err)
		return r, false
	}
	r.Equation = text
	if v, ok := t["written_as"]; ok {
		r.Equation, _ = rd.str(v, sub(path, "written_as"), label, "written_as")
	}
	r.Reactants, r.Products, r.Reversible = eq.Reactants, eq.Products, eq.Reversible
	if v, ok := t["duplicate"]; ok {
		b, isBool := v.(bool)
		if !isBool {
			rd.errorf(sub(path, "duplicate"), label, "duplicate must be true or false, not %s", typeName(v))
		}
		r.Duplicate = b
	}
	if v, ok := t["concentration_exponents"]; ok {
		r.Orders = rd.orders(v, sub(path, "concentration_exponents"), label)
	}
	if v, ok := t["reverse_concentration_exponents"]; ok {
		r.ReverseOrders = rd.orders(v, sub(path, "reverse_concentration_exponents"), label)
	}
	if v, ok := t["rate_uncertainty_factor"]; ok {
		p := sub(path, "rate_uncertainty_factor")
		if f, ok := rd.number(v, p, label, dimensionless); ok {
			if !(f >= 1) {
				rd.errorf(p, label, "rate_uncertainty_factor = %s must be at least 1 (k lies within k/f ... k*f)", formatFloat(f))
			}
			r.UncertaintyFactor = f
		}
	}

	var present []string
	for _, rt := range rateTables {
		if _, ok := t[rt.key]; ok {
			present = append(present, rt.key)
			r.Form = rt.form
		}
	}
	switch len(present) {
	case 0:
		rd.errorf(path, label, "no rate: give one of arrhenius, falloff, chemically_activated, pressure_table, chebyshev")
		return r, false
	case 1:
	default:
		rd.errorf(path, label, "more than one rate (%s); give exactly one", strings.Join(present, ", "))
		return r, false
	}
	key := present[0]
	n := forwardOrder(&r)
	switch r.Form {
	case chem.Elementary:
		if eq.Collider == equation.FalloffM || eq.Collider == equation.FalloffSpecific {
			rd.errorf(sub(path, key), label, "the equation has a falloff collider (+M); give the rate as a falloff or chemically_activated table")
			return r, false
		}
		if eq.Collider == equation.PlusM {
			r.Form = chem.ThreeBody
			n++
		}
		r.Rate, _ = rd.arrhenius(t[key], sub(path, key), label, n)
	case chem.Falloff, chem.ChemicallyActivated:
		if eq.Collider != equation.FalloffM && eq.Collider != equation.FalloffSpecific {
			rd.errorf(sub(path, key), label, "a %s rate needs a falloff collider in the equation, e.g. \"A + B (+M) <=> AB (+M)\"", key)
			return r, false
		}
		r.FalloffRate = rd.falloff(t[key], sub(path, key), label, highOrder(r.Form, n))
	case chem.PressureTable, chem.Chebyshev:
		if eq.Collider != equation.NoCollider {
			rd.errorf(sub(path, "equation"), label, "a %s rate has no third body; write the equation without M", key)
			return r, false
		}
		if r.Form == chem.PressureTable {
			r.PressureRates = rd.pressureTable(t[key], sub(path, key), label, n)
		} else {
			r.ChebyshevRate = rd.chebyshev(t[key], sub(path, key), label, n)
		}
	}
	rd.readThirdBody(t, path, label, &r, &eq)
	if v, ok := t["reverse_arrhenius"]; ok {
		if !r.Reversible {
			rd.errorf(sub(path, "reverse_arrhenius"), label, "reverse_arrhenius given for an irreversible step (=>)")
		}
		nr := reverseOrder(&r)
		rev, ok := rd.arrhenius(v, sub(path, "reverse_arrhenius"), label, nr)
		if ok {
			r.ReverseRate = &rev
		}
	}
	if len(r.ReverseOrders) > 0 && !r.Reversible {
		rd.errorf(sub(path, "reverse_concentration_exponents"), label, "reverse_concentration_exponents given for an irreversible step (=>)")
	}
	return r, len(rd.problems) == before
}

func (rd *reader) speciesIndex(name string) int {
	if k, ok := rd.species[name]; ok {
		return k
	}
	return -1
}

// readThirdBody sets the collision efficiencies of a step with a third body.
func (rd *reader) readThirdBody(t map[string]any, path []string, label string, r *chem.Reaction, eq *equation.Equation) {
	_, hasEff := t[efficienciesKey]
	_, hasDef := t[unlistedEfficiencyKey]
	switch eq.Collider {
	case equation.NoCollider:
		for _, k := range []string{efficienciesKey, unlistedEfficiencyKey} {
			if _, ok := t[k]; ok {
				rd.errorf(sub(path, k), label, "%s given, but the equation has no third body M", k)
			}
		}
		return
	case equation.FalloffSpecific:
		for _, k := range []string{efficienciesKey, unlistedEfficiencyKey} {
			if _, ok := t[k]; ok {
				rd.errorf(sub(path, k), label, "%s given, but the equation names one collider (+%s); write (+M) to use collision efficiencies",
					k, rd.mech.Species[eq.Specific].Name)
			}
		}
		r.ThirdBody = &chem.ThirdBody{Efficiencies: map[int]float64{eq.Specific: 1}}
		return
	}
	tb := &chem.ThirdBody{Default: 1}
	if hasDef {
		tb.Default, _ = rd.number(t[unlistedEfficiencyKey], sub(path, unlistedEfficiencyKey), label, dimensionless)
	}
	if hasEff {
		p := sub(path, efficienciesKey)
		if et, ok := rd.table(t[efficienciesKey], p, label, efficienciesKey); ok && len(et) > 0 {
			tb.Efficiencies = make(map[int]float64, len(et))
			for name, v := range et {
				k := rd.speciesIndex(name)
				if k < 0 {
					rd.errorf(sub(p, name), label, "collision efficiency for unknown species %q", name)
					continue
				}
				tb.Efficiencies[k], _ = rd.number(v, sub(p, name), label, dimensionless)
			}
		}
	}
	r.ThirdBody = tb
}

// orders reads a species -> concentration exponent table.
func (rd *reader) orders(v any, path []string, label string) map[int]float64 {
	t, ok := rd.table(v, path, label, path[len(path)-1])
	if !ok || len(t) == 0 {
		return nil
	}
	out := make(map[int]float64, len(t))
	for name, x := range t {
		k := rd.speciesIndex(name)
		if k < 0 {
			rd.errorf(sub(path, name), label, "%s for unknown species %q", path[len(path)-1], name)
			continue
		}
		out[k], _ = rd.number(x, sub(path, name), label, dimensionless)
	}
	return out
}

// sideOrder is the overall order of the rate of progress of one side: the
// sum over species of their exponents (stoichiometric coefficient unless an
// order overrides it).
func sideOrder(side []chem.Participant, orders map[int]float64) float64 {
	n := 0.0
	for _, p := range side {
		if _, over := orders[p.Species]; !over {
			n += p.Coefficient
		}
	}
	for _, o := range orders {
		n += o
	}
	return n
}

// forwardOrder is the overall order of the forward rate constant without
// the third body (k0 of a falloff step and three-body steps add one).
func forwardOrder(r *chem.Reaction) float64 { return sideOrder(r.Reactants, r.Orders) }

// reverseOrder is the overall order of an explicit reverse rate constant:
// that of the products side, plus one for a three-body step (whose reverse
// rate is multiplied by [M] too).
func reverseOrder(r *chem.Reaction) float64 {
	n := sideOrder(r.Products, r.ReverseOrders)
	if r.Form == chem.ThreeBody {
		n++
	}
	return n
}

// arrhenius reads {pre_exponential, temperature_exponent,
// activation_energy} for a rate constant of overall order n.
func (rd *reader) arrhenius(v any, path []string, label string, n float64) (chem.Arrhenius, bool) {
	var a chem.Arrhenius
	t, ok := rd.table(v, path, label, keyName(path))
	if !ok {
		return a, false
	}
	rd.checkKeys(t, path, label, arrheniusKeys[:]...)
	return rd.arrheniusFields(t, path, label, n)
}

// arrheniusFields reads the three Arrhenius parameters from t (which may
// hold other keys).
func (rd *reader) arrheniusFields(t map[string]any, path []string, label string, n float64) (chem.Arrhenius, bool) {
	var a chem.Arrhenius
	ok := true
	for _, k := range arrheniusKeys {
		if _, has := t[k]; !has {
			rd.errorf(path, label, "%s has no %s (give %s)", keyName(path), k, strings.Join(arrheniusKeys[:], ", "))
			ok = false
		}
	}
	if !ok {
		return a, false
	}
	var okA, okB, okE bool
	a.A, okA = rd.preExponential(t[arrheniusKeys[0]], sub(path, arrheniusKeys[0]), label, n)
	a.B, okB = rd.number(t[arrheniusKeys[1]], sub(path, arrheniusKeys[1]), label, dimensionless)
	a.E, okE = rd.number(t[arrheniusKeys[2]], sub(path, arrheniusKeys[2]), label, energy)
	return a, okA && okB && okE
}

// preExponential reads A of a rate constant of overall order n (so in
// (length^3/quantity)^(n-1)/s) and returns it in m, mol, s.
func (rd *reader) preExponential(v any, path []string, label string, n float64) (float64, bool) {
	var q float64
	var u rateUnit
	switch x := v.(type) {
	case int64, float64:
		if !rd.declared.concentration {
			rd.errorf(path, label, "pre_exponential: no concentration unit: declare concentration in [default_units] or write the unit with the value, e.g. \"%s %s\"",
				tomlText(v), tableRateUnit(writeUnits, n))
			return 0, false
		}
		if f, ok := x.(float64); ok {
			q = f
		} else {
			q = float64(x.(int64))
		}
		if math.IsNaN(q) || math.IsInf(q, 0) {
			rd.errorf(path, label, "pre_exponential must be finite, not %v", q)
			return 0, false
		}
		u = tableRateUnit(rd.units, n)
	case string:
		var unit string
		var err error
		var wu writtenRateUnit
		q, unit, err = parseValueWithUnit(x)
		if err == nil {
			wu, err = parseRateUnit(unit)
		}
		if err != nil {
			rd.errorf(path, label, "pre_exponential: %v", err)
			return 0, false
		}
		var fits bool
		if u, fits = wu.forOrder(n); !fits {
			rd.errorf(path, label, "pre_exponential: unit %q does not fit a rate constant of overall order %s (expected %s)", unit, formatFloat(n), u)
			return 0, false
		}
	default:
		rd.errorf(path, label, "pre_exponential must be a number, not %s", typeName(v))
		return 0, false
	}
	si := u.toSI(q)
	if math.IsNaN(si) || math.IsInf(si, 0) {
		rd.errorf(path, label, "pre_exponential = %v is not a finite number in SI units", q)
		return 0, false
	}
	return si, true
}

// highOrder is the overall order of k_inf for a falloff step whose
// equation (without M) has order n. Unimolecular falloff: k_inf is of the
// step's order and k0 one higher (it multiplies [M]). Chemically activated:
// k0 is the bimolecular low-pressure rate, of the step's order, and
// k_inf = k0 [M] / Pr one lower, since Pr = k0 [M]/k_inf is dimensionless.
func highOrder(form chem.RateForm, n float64) float64 {
	if form == chem.ChemicallyActivated {
		return n - 1
	}
	return n
}

// falloff reads a falloff or chemically-activated table: low and high
// limits and an optional broadening function. n is the order of k_inf.
func (rd *reader) falloff(v any, path []string, label string, n float64) *chem.FalloffRate {
	t, ok := rd.table(v, path, label, path[len(path)-1])
	if !ok {
		return nil
	}
	rd.checkKeys(t, path, label, "low_pressure_limit", "high_pressure_limit", "troe_broadening", "sri_broadening")
	f := &chem.FalloffRate{}
	for _, k := range []string{"low_pressure_limit", "high_pressure_limit"} {
		if _, ok := t[k]; !ok {
			rd.errorf(path, label, "%s has no %s (%s = {%s})", path[len(path)-1], k, k, strings.Join(arrheniusKeys[:], ", "))
		}
	}
	if v, ok := t["low_pressure_limit"]; ok {
		f.Low, _ = rd.arrhenius(v, sub(path, "low_pressure_limit"), label, n+1)
	}
	if v, ok := t["high_pressure_limit"]; ok {
		f.High, _ = rd.arrhenius(v, sub(path, "high_pressure_limit"), label, n)
	}
	_, troe := t["troe_broadening"]
	_, sri := t["sri_broadening"]
	if troe && sri {
		rd.errorf(path, label, "give troe_broadening or sri_broadening, not both")
		return f
	}
	if troe {
		f.Troe = rd.troe(t["troe_broadening"], sub(path, "troe_broadening"), label)
	}
	if sri {
		f.SRI = rd.sri(t["sri_broadening"], sub(path, "sri_broadening"), label)
	}
	return f
}

// fields reads required and optional numbers of a small table.
func (rd *reader) fields(t map[string]any, path []string, label string, required, optional []string, kinds map[string]kind, dst map[string]*float64) {
	for _, k := range required {
		if _, ok := t[k]; !ok {
			rd.errorf(path, label, "%s has no %s", path[len(path)-1], k)
		}
	}
	for _, k := range append(append([]string(nil), required...), optional...) {
		if v, ok := t[k]; ok {
			*dst[k], _ = rd.number(v, sub(path, k), label, kinds[k])
		}
	}
}

func (rd *reader) troe(v any, path []string, label string) *chem.Troe {
	t, ok := rd.table(v, path, label, "troe_broadening")
	if !ok {
		return nil
	}
	rd.checkKeys(t, path, label, "alpha", "T_triple_star_K", "T_single_star_K", "T_double_star_K")
	tr := &chem.Troe{}
	_, tr.HasT2 = t["T_double_star_K"]
	rd.fields(t, path, label, []string{"alpha", "T_triple_star_K", "T_single_star_K"}, []string{"T_double_star_K"},
		map[string]kind{"alpha": dimensionless, "T_triple_star_K": temperature, "T_single_star_K": temperature, "T_double_star_K": temperature},
		map[string]*float64{"alpha": &tr.A, "T_triple_star_K": &tr.T3, "T_single_star_K": &tr.T1, "T_double_star_K": &tr.T2})
	return tr
}

func (rd *reader) sri(v any, path []string, label string) *chem.SRI {
	t, ok := rd.table(v, path, label, "sri_broadening")
	if !ok {
		return nil
	}
	rd.checkKeys(t, path, label, "a", "b_K", "c_K", "d", "e")
	s := &chem.SRI{D: 1}
	rd.fields(t, path, label, []string{"a", "b_K", "c_K"}, []string{"d", "e"},
		map[string]kind{"a": dimensionless, "b_K": temperature, "c_K": temperature, "d": dimensionless, "e": dimensionless},
		map[string]*float64{"a": &s.A, "b_K": &s.B, "c_K": &s.C, "d": &s.D, "e": &s.E})
	return s
}

// pressureTable reads [{pressure, pre_exponential, temperature_exponent,
// activation_energy}, ...], which must be sorted by pressure.
func (rd *reader) pressureTable(v any, path []string, label string, n float64) []chem.PressureRate {
	rows := rd.tables(v, path, "pressure_table")
	if len(rows) == 0 {
		rd.errorf(path, label, "pressure_table is empty")
		return nil
	}
	out := make([]chem.PressureRate, 0, len(rows))
	for i, row := range rows {
		p := sub(path, strconv.Itoa(i))
		rd.checkKeys(row, p, label, append([]string{"pressure"}, arrheniusKeys[:]...)...)
		var pr chem.PressureRate
		ok := true
		if v, has := row["pressure"]; has {
			pr.P, ok = rd.number(v, sub(p, "pressure"), label, pressure)
			if ok && !(pr.P > 0) {
				rd.errorf(sub(p, "pressure"), label, "pressure %g Pa must be positive", pr.P)
			}
		} else {
			rd.errorf(p, label, "pressure_table row %d has no pressure", i+1)
		}
		pr.Rate, _ = rd.arrheniusFields(row, p, label, n)
		if ok && len(out) > 0 && pr.P < out[len(out)-1].P {
			rd.errorf(sub(p, "pressure"), label, "pressure_table rows must be in order of rising pressure")
		}
		out = append(out, pr)
	}
	return out
}

// chebyshev reads the Chebyshev table: T_range_K, pressure_range,
// coefficients (rows: temperature terms, columns: pressure terms) of
// log10 k in the file's units (or rate_constant_unit) for a step of
// overall order n.
func (rd *reader) chebyshev(v any, path []string, label string, n float64) *chem.ChebyshevRate {
	t, ok := rd.table(v, path, label, "chebyshev")
	if !ok {
		return nil
	}
	rd.checkKeys(t, path, label, "T_range_K", "pressure_range", "coefficients", "rate_constant_unit")
	for _, k := range []string{"T_range_K", "pressure_range", "coefficients"} {
		if _, ok := t[k]; !ok {
			rd.errorf(path, label, "chebyshev has no %s", k)
			return nil
		}
	}
	c := &chem.ChebyshevRate{}
	tr, ok1 := rd.numbers(t["T_range_K"], sub(path, "T_range_K"), label, 2, temperature)
	pr, ok2 := rd.numbers(t["pressure_range"], sub(path, "pressure_range"), label, 2, pressure)
	if ok1 {
		c.TMin, c.TMax = tr[0], tr[1]
	}
	if ok2 {
		c.PMin, c.PMax = pr[0], pr[1]
	}
	var u rateUnit
	if v, ok := t["rate_constant_unit"]; ok {
		s, ok := rd.str(v, sub(path, "rate_constant_unit"), label, "rate_constant_unit")
		if !ok {
			return nil
		}
		wu, err := parseRateUnit(s)
		if err != nil {
			rd.errorf(sub(path, "rate_constant_unit"), label, "rate_constant_unit: %v", err)
			return nil
		}
		var fits bool
		if u, fits = wu.forOrder(n); !fits {
			rd.errorf(sub(path, "rate_constant_unit"), label, "rate_constant_unit %q does not fit a rate constant of overall order %s (expected %s)",
				s, formatFloat(n), u)
			return nil
		}
	} else if !rd.declared.concentration {
		rd.errorf(path, label, "chebyshev: no rate units: declare concentration in [default_units] or give rate_constant_unit")
		return nil
	} else {
		u = tableRateUnit(rd.units, n)
	}
	rows, ok := rd.array(t["coefficients"], sub(path, "coefficients"), label, "coefficients")
	if !ok {
		return nil
	}
	if len(rows) == 0 {
		rd.errorf(sub(path, "coefficients"), label, "chebyshev coefficients are empty")
		return nil
	}
	c.Coeffs = make([][]float64, len(rows))
	for i, row := range rows {
		p := sub(path, "coefficients", strconv.Itoa(i))
		vals, ok := rd.numbers(row, p, label, -1, dimensionless)
		if !ok {
			return nil
		}
		if len(vals) == 0 || len(vals) != len(c.Coeffs[0]) && i > 0 {
			rd.errorf(p, label, "chebyshev coefficient rows must all have the same, non-zero length")
			return nil
		}
		c.Coeffs[i] = vals
	}
	c.Coeffs[0][0] += u.log10Factor()
	return c
}
