package mechtoml

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"flame1d/chem"
	"flame1d/chem/internal/equation"
)

// formatFloat writes v exactly and briefly (shortest representation that
// parses back to the same float64), as a valid TOML number.
func formatFloat(v float64) string {
	if v == 0 && math.Signbit(v) {
		return "-0.0"
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// WriteFile writes m to path atomically: to a temporary file in the same
// directory, then renamed over path, so a failed write never leaves a
// partial file under the final name.
func WriteFile(path string, m *chem.Mechanism) error {
	var buf bytes.Buffer
	if err := Write(&buf, m); err != nil {
		return err
	}
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	tmp, err := os.CreateTemp(dir, "."+base+".tmp*")
	if err != nil {
		return fmt.Errorf("writing mechanism %s: %w", path, err)
	}
	fail := func(err error) error {
		tmp.Close()
		os.Remove(tmp.Name())
		return fmt.Errorf("writing mechanism %s: %w", path, err)
	}
	if _, err := tmp.Write(buf.Bytes()); err != nil {
		return fail(err)
	}
	if err := tmp.Chmod(0o644); err != nil {
		return fail(err)
	}
	if err := tmp.Sync(); err != nil {
		return fail(err)
	}
	if err := tmp.Close(); err != nil {
		os.Remove(tmp.Name())
		return fmt.Errorf("writing mechanism %s: %w", path, err)
	}
	if err := os.Rename(tmp.Name(), path); err != nil {
		os.Remove(tmp.Name())
		return fmt.Errorf("writing mechanism %s: %w", path, err)
	}
	return nil
}

// Write writes m in flame1d's TOML mechanism format. Reading the result
// with Read gives back m exactly (every float64 bit for bit, Origin
// positions aside, empty maps and slices as nil), with one addition: a
// reaction without equation text gets its canonical equation.
//
// Rate data are written in cal/mol, cm, mol and atm when the conversion of
// a value back to SI gives the same float64 exactly (checked value by
// value); otherwise that value is written in SI with its unit. Transport
// data are written in K, Å, debye and Å^3 the same way.
//
// Write refuses (with an error naming the reaction or species) data that
// the format cannot carry: non-finite numbers, text that is not UTF-8, and
// rate data that do not belong to the reaction's form.
func Write(w io.Writer, m *chem.Mechanism) error {
	wr := &writer{m: m, index: make(map[string]int, len(m.Species))}
	for i := range m.Species {
		if _, dup := wr.index[m.Species[i].Name]; !dup {
			wr.index[m.Species[i].Name] = i
		}
	}
	if err := wr.mechanism(); err != nil {
		return err
	}
	if _, err := w.Write(wr.b.Bytes()); err != nil {
		return fmt.Errorf("writing mechanism: %w", err)
	}
	return nil
}

type writer struct {
	m     *chem.Mechanism
	b     bytes.Buffer
	index map[string]int
	err   error // first unrepresentable number
}

// num writes a dimensionless number.
func (w *writer) num(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		if w.err == nil {
			w.err = fmt.Errorf("non-finite number %v", v)
		}
		return "0"
	}
	return formatFloat(v)
}

// converted writes an SI value v in a file unit when toSI brings the
// written number back to v exactly and it needs no more digits than v
// itself; else in SI with the SI unit attached.
func (w *writer) converted(v, guess float64, toSI func(float64) float64, siUnit string) string {
	s := w.num(v)
	if q, ok := inFileUnit(v, guess, toSI); ok {
		return formatFloat(q)
	}
	return quote(s + " " + siUnit)
}

// inFileUnit returns the number q that toSI brings back to the SI value v
// exactly, when there is one that needs no more digits than v itself.
func inFileUnit(v, guess float64, toSI func(float64) float64) (float64, bool) {
	q, ok := invert(v, guess, toSI)
	return q, ok && significantDigits(q) <= significantDigits(v)
}

func (w *writer) energy(v float64) string {
	return w.converted(v, v/writeUnits.energyJ, func(q float64) float64 { return scaleBy(q, writeUnits.energyJ) }, "J/mol")
}

// pressure writes a pressure as a plain number in atm, the declared unit,
// when that is exact and brief; else, when one of them is, as a string in
// Torr, bar or kPa ("10 Torr"); else as the file-unit number or, failing
// an exact one, in Pa.
func (w *writer) pressure(v float64) string {
	const brief = 6 // significant digits
	atmToSI := func(q float64) float64 { return scaleBy(q, writeUnits.pressPa) }
	if q, ok := inFileUnit(v, v/writeUnits.pressPa, atmToSI); ok && significantDigits(q) <= brief {
		return formatFloat(q)
	}
	for _, unit := range [...]string{"Torr", "bar", "kPa"} {
		f := pressureUnits[unit]
		if q, ok := inFileUnit(v, v/f, func(q float64) float64 { return scaleBy(q, f) }); ok && significantDigits(q) <= brief {
			return quote(formatFloat(q) + " " + unit)
		}
	}
	return w.converted(v, v/writeUnits.pressPa, atmToSI, "Pa")
}

func (w *writer) preExponential(v, n float64) string {
	u := tableRateUnit(writeUnits, n)
	return w.converted(v, v/u.factor(), u.toSI, tableRateUnit(siUnits, n).String())
}

func (w *writer) arrhenius(a chem.Arrhenius, n float64) string {
	return fmt.Sprintf("{%s = %s, %s = %s, %s = %s}", arrheniusKeys[0], w.preExponential(a.A, n),
		arrheniusKeys[1], w.num(a.B), arrheniusKeys[2], w.energy(a.E))
}

// quote writes s as a TOML basic string.
func quote(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch r {
		case '"':
			b.WriteString(`\"`)
		case '\\':
			b.WriteString(`\\`)
		case '\n':
			b.WriteString(`\n`)
		case '\t':
			b.WriteString(`\t`)
		case '\r':
			b.WriteString(`\r`)
		default:
			if r < 0x20 || r == 0x7f {
				fmt.Fprintf(&b, `\u%04X`, r)
			} else {
				b.WriteRune(r)
			}
		}
	}
	b.WriteByte('"')
	return b.String()
}

// key writes a TOML key: bare when it can be, quoted otherwise.
func key(s string) string {
	if s == "" {
		return `""`
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		if !(c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z' || c >= '0' && c <= '9' || c == '_' || c == '-') {
			return quote(s)
		}
	}
	return s
}

// multiline writes a long text as a TOML multi-line literal string when its
// content allows (kept exactly as written), else as a basic string.
func multiline(s string) string {
	literal := !strings.Contains(s, "'''") && !strings.HasSuffix(s, "'")
	for _, r := range s {
		if r < 0x20 && r != '\t' && r != '\n' || r == 0x7f {
			literal = false
			break
		}
	}
	if literal {
		return "'''\n" + s + "'''"
	}
	return quote(s)
}

func (w *writer) text(what, s string) (string, error) {
	if !utf8.ValidString(s) {
		return "", fmt.Errorf("%s is not valid UTF-8 text", what)
	}
	return quote(s), nil
}

func (w *writer) mechanism() error {
	m := w.m
	b := &w.b
	b.WriteString("# flame1d reaction mechanism (file format described in docs/mechanism-format.md).\n")
	b.WriteString("# Plain numbers of rate data are in the units of [default_units]; other units are in the key names.\n")
	fmt.Fprintf(b, "format_version = %d\n", FormatVersion)
	if m.Name != "" {
		s, err := w.text("mechanism name", m.Name)
		if err != nil {
			return err
		}
		fmt.Fprintf(b, "name = %s\n", s)
	}
	if m.Description != "" {
		if !utf8.ValidString(m.Description) {
			return errors.New("mechanism description is not valid UTF-8 text")
		}
		fmt.Fprintf(b, "description = %s\n", multiline(m.Description))
	}
	els := make([]string, len(m.Elements))
	for i, e := range m.Elements {
		s, err := w.text(fmt.Sprintf("element %d", i+1), e)
		if err != nil {
			return err
		}
		els[i] = s
	}
	fmt.Fprintf(b, "elements = [%s]\n", strings.Join(els, ", "))
	u := writeUnits
	fmt.Fprintf(b, "\n[default_units]\nactivation_energy = %q\nconcentration = %q\npressure = %q\n", u.energy, "mol/cm^3", u.pressure)
	if m.Validity != nil {
		if err := w.validity(m.Validity); err != nil {
			return fmt.Errorf("validity: %w", err)
		}
	}
	for i := range m.Species {
		if err := w.species(i); err != nil {
			return fmt.Errorf("%s: %w", speciesLabel(i, m.Species[i].Name), err)
		}
	}
	for i := range m.Reactions {
		if err := w.reaction(i); err != nil {
			return fmt.Errorf("%s: %w", reactionLabel(i, m.Reactions[i].Equation), err)
		}
	}
	return nil
}

// numberList writes [v1, v2, ...].
func (w *writer) numberList(vs []float64) string {
	parts := make([]string, len(vs))
	for i, v := range vs {
		parts[i] = w.num(v)
	}
	return "[" + strings.Join(parts, ", ") + "]"
}

// atomsOrder lists a composition's elements in declaration order, then any
// others alphabetically.
func (w *writer) atomsOrder(c map[string]float64) []string {
	names := make([]string, 0, len(c))
	for e := range c {
		names = append(names, e)
	}
	rank := make(map[string]int, len(w.m.Elements))
	for i, e := range w.m.Elements {
		if _, ok := rank[e]; !ok {
			rank[e] = i
		}
	}
	sort.Slice(names, func(i, j int) bool {
		ri, oki := rank[names[i]]
		rj, okj := rank[names[j]]
		switch {
		case oki && okj:
			return ri < rj
		case oki != okj:
			return oki
		}
		return names[i] < names[j]
	})
	return names
}

var structureNames = map[chem.Geometry]string{chem.Atom: "monatomic", chem.Linear: "linear", chem.Nonlinear: "nonlinear"}

func (w *writer) species(i int) error {
	s := &w.m.Species[i]
	b := &w.b
	w.err = nil
	name, err := w.text("name", s.Name)
	if err != nil {
		return err
	}
	fmt.Fprintf(b, "\n[[species]]\nname = %s\n", name)
	var atoms []string
	for _, e := range w.atomsOrder(s.Composition) {
		if !utf8.ValidString(e) {
			return errors.New("element name is not valid UTF-8 text")
		}
		atoms = append(atoms, key(e)+" = "+w.num(s.Composition[e]))
	}
	fmt.Fprintf(b, "atoms = {%s}\n", strings.Join(atoms, ", "))
	if s.Condensed {
		b.WriteString("phase = \"condensed\"\n")
	}
	if tp := s.Transport; tp != nil {
		structure, ok := structureNames[tp.Geometry]
		if !ok {
			return fmt.Errorf("transport geometry %d is not atom (0), linear (1) or nonlinear (2)", tp.Geometry)
		}
		fmt.Fprintf(b, "kinetic_theory = {structure = %q, lj_well_depth_K = %s", structure, w.num(tp.WellDepth))
		for i, v := range [...]float64{tp.Diameter, tp.Dipole, tp.Polarizability} {
			q := transportQuantities[i]
			if !q.required && v == 0 && !math.Signbit(v) {
				continue
			}
			if x, ok := inFileUnit(v, v/q.toSI(1), q.toSI); ok {
				fmt.Fprintf(b, ", %s = %s", q.tableKey, formatFloat(x))
			} else {
				fmt.Fprintf(b, ", %s = %s", q.siKey, w.num(v))
			}
		}
		if tp.RotRelaxation != 0 || math.Signbit(tp.RotRelaxation) {
			fmt.Fprintf(b, ", rotational_collision_number_298K = %s", w.num(tp.RotRelaxation))
		}
		b.WriteString("}\n")
	}
	th := &s.Thermo
	fmt.Fprintf(b, "[species.nasa7]\nT_range_K = %s\nlow_T_coefficients = %s\nhigh_T_coefficients = %s\n",
		w.numberList([]float64{th.TLow, th.TMid, th.THigh}), w.numberList(th.Low[:]), w.numberList(th.High[:]))
	return w.err
}

// colliderOf is the third body that reaction r's equation must name.
func colliderOf(r *chem.Reaction) (equation.Collider, int, error) {
	tb := r.ThirdBody
	switch r.Form {
	case chem.Elementary, chem.PressureTable, chem.Chebyshev:
		if tb != nil {
			return 0, 0, errors.New("collision efficiencies on a step without a third body (form has no [M])")
		}
		return equation.NoCollider, 0, nil
	case chem.ThreeBody, chem.Falloff, chem.ChemicallyActivated:
		if tb == nil {
			return 0, 0, errors.New("third-body or falloff form without collision efficiencies")
		}
		if r.Form == chem.ThreeBody {
			return equation.PlusM, 0, nil
		}
		if tb.Default == 0 && !math.Signbit(tb.Default) && len(tb.Efficiencies) == 1 {
			for k, e := range tb.Efficiencies {
				if e == 1 {
					return equation.FalloffSpecific, k, nil
				}
			}
		}
		return equation.FalloffM, 0, nil
	}
	return 0, 0, fmt.Errorf("unknown rate form %d", r.Form)
}

// checkForm refuses rate data that do not belong to r's form (they could
// not be written, and would be lost).
func checkForm(r *chem.Reaction) error {
	var extra []string
	if r.Rate != (chem.Arrhenius{}) && r.Form != chem.Elementary && r.Form != chem.ThreeBody {
		extra = append(extra, "Rate")
	}
	falloff := r.Form == chem.Falloff || r.Form == chem.ChemicallyActivated
	if r.FalloffRate != nil && !falloff {
		extra = append(extra, "FalloffRate")
	}
	if len(r.PressureRates) > 0 && r.Form != chem.PressureTable {
		extra = append(extra, "PressureRates")
	}
	if r.ChebyshevRate != nil && r.Form != chem.Chebyshev {
		extra = append(extra, "ChebyshevRate")
	}
	if len(extra) > 0 {
		return fmt.Errorf("rate data %s do not belong to its form", strings.Join(extra, ", "))
	}
	switch {
	case falloff && r.FalloffRate == nil:
		return errors.New("falloff form without falloff data")
	case r.Form == chem.PressureTable && len(r.PressureRates) == 0:
		return errors.New("pressure-table form without pressures")
	case r.Form == chem.Chebyshev && r.ChebyshevRate == nil:
		return errors.New("Chebyshev form without coefficients")
	}
	if f := r.FalloffRate; f != nil {
		if f.Troe != nil && f.SRI != nil {
			return errors.New("both Troe and SRI broadening")
		}
		if f.Troe != nil && !f.Troe.HasT2 && (f.Troe.T2 != 0 || math.Signbit(f.Troe.T2)) {
			return errors.New("Troe T2 set but HasT2 false")
		}
	}
	if c := r.ChebyshevRate; c != nil {
		if len(c.Coeffs) == 0 || len(c.Coeffs[0]) == 0 {
			return errors.New("Chebyshev form without coefficients")
		}
		for _, row := range c.Coeffs {
			if len(row) != len(c.Coeffs[0]) {
				return errors.New("Chebyshev coefficient rows of unequal length")
			}
		}
	}
	return nil
}

// equationText returns the text to write as equation, and the author's text
// to keep in written_as when that text does not itself read back as the
// same step.
func (w *writer) equationText(r *chem.Reaction) (eqText, writtenAs string, err error) {
	col, specific, err := colliderOf(r)
	if err != nil {
		return "", "", err
	}
	want := equation.Equation{Reactants: r.Reactants, Products: r.Products, Reversible: r.Reversible, Collider: col, Specific: specific}
	for _, side := range [][]chem.Participant{r.Reactants, r.Products} {
		for i, p := range side {
			if p.Species < 0 || p.Species >= len(w.m.Species) {
				return "", "", fmt.Errorf("species index %d out of range", p.Species)
			}
			for _, q := range side[:i] {
				if q.Species == p.Species {
					return "", "", fmt.Errorf("species %s appears twice on one side; merge it into one participant (an equation cannot keep them apart)",
						w.m.Species[p.Species].Name)
				}
			}
		}
	}
	if specific < 0 || specific >= len(w.m.Species) {
		return "", "", fmt.Errorf("collider species index %d out of range", specific)
	}
	index := func(name string) int {
		if k, ok := w.index[name]; ok {
			return k
		}
		return -1
	}
	if r.Equation != "" && utf8.ValidString(r.Equation) {
		if got, err := equation.Parse(r.Equation, index); err == nil && got.SameAs(&want) {
			return r.Equation, "", nil
		}
	}
	names := make([]string, len(w.m.Species))
	for i := range w.m.Species {
		names[i] = w.m.Species[i].Name
	}
	canon := equation.Format(&want, names)
	if got, err := equation.Parse(canon, index); err != nil || !got.SameAs(&want) {
		return "", "", fmt.Errorf("its equation cannot be written so that it reads back the same (species names %s)", canon)
	}
	if !utf8.ValidString(r.Equation) {
		return "", "", errors.New("equation text is not valid UTF-8")
	}
	return canon, r.Equation, nil
}

// speciesTable writes {name = value, ...} over species indices, in index
// order.
func (w *writer) speciesTable(m map[int]float64) (string, error) {
	ks := make([]int, 0, len(m))
	for k := range m {
		if k < 0 || k >= len(w.m.Species) {
			return "", fmt.Errorf("species index %d out of range", k)
		}
		ks = append(ks, k)
	}
	sort.Ints(ks)
	parts := make([]string, len(ks))
	for i, k := range ks {
		parts[i] = key(w.m.Species[k].Name) + " = " + w.num(m[k])
	}
	return "{" + strings.Join(parts, ", ") + "}", nil
}

func (w *writer) reaction(i int) error {
	r := &w.m.Reactions[i]
	b := &w.b
	w.err = nil
	if err := checkForm(r); err != nil {
		return err
	}
	eqText, writtenAs, err := w.equationText(r)
	if err != nil {
		return err
	}
	col, _, _ := colliderOf(r)
	fmt.Fprintf(b, "\n[[reaction]]\nequation = %s\n", quote(eqText))
	if writtenAs != "" {
		fmt.Fprintf(b, "written_as = %s\n", quote(writtenAs))
	}
	if r.Duplicate {
		b.WriteString("duplicate = true\n")
	}
	if f := r.UncertaintyFactor; f != 0 {
		if !(f >= 1) || math.IsInf(f, 0) {
			return fmt.Errorf("rate uncertainty factor %v is not a finite number >= 1", f)
		}
		fmt.Fprintf(b, "rate_uncertainty_factor = %s\n", formatFloat(f))
	}
	n := forwardOrder(r)
	switch r.Form {
	case chem.Elementary:
		fmt.Fprintf(b, "arrhenius = %s\n", w.arrhenius(r.Rate, n))
	case chem.ThreeBody:
		fmt.Fprintf(b, "arrhenius = %s\n", w.arrhenius(r.Rate, n+1))
	}
	if col == equation.PlusM || col == equation.FalloffM {
		if len(r.ThirdBody.Efficiencies) > 0 {
			s, err := w.speciesTable(r.ThirdBody.Efficiencies)
			if err != nil {
				return fmt.Errorf("collision efficiencies: %w", err)
			}
			fmt.Fprintf(b, "%s = %s\n", efficienciesKey, s)
		}
		if d := r.ThirdBody.Default; d != 1 {
			fmt.Fprintf(b, "%s = %s\n", unlistedEfficiencyKey, w.num(d))
		}
	}
	if r.ReverseRate != nil {
		fmt.Fprintf(b, "reverse_arrhenius = %s\n", w.arrhenius(*r.ReverseRate, reverseOrder(r)))
	}
	for _, o := range []struct {
		key string
		m   map[int]float64
	}{{"concentration_exponents", r.Orders}, {"reverse_concentration_exponents", r.ReverseOrders}} {
		if len(o.m) == 0 {
			continue
		}
		s, err := w.speciesTable(o.m)
		if err != nil {
			return fmt.Errorf("%s: %w", o.key, err)
		}
		fmt.Fprintf(b, "%s = %s\n", o.key, s)
	}
	switch r.Form {
	case chem.Falloff, chem.ChemicallyActivated:
		name := "falloff"
		if r.Form == chem.ChemicallyActivated {
			name = "chemically_activated"
		}
		f := r.FalloffRate
		nh := highOrder(r.Form, n)
		fmt.Fprintf(b, "[reaction.%s]\nlow_pressure_limit = %s\nhigh_pressure_limit = %s\n", name, w.arrhenius(f.Low, nh+1), w.arrhenius(f.High, nh))
		if t := f.Troe; t != nil {
			fmt.Fprintf(b, "troe_broadening = {alpha = %s, T_triple_star_K = %s, T_single_star_K = %s", w.num(t.A), w.num(t.T3), w.num(t.T1))
			if t.HasT2 {
				fmt.Fprintf(b, ", T_double_star_K = %s", w.num(t.T2))
			}
			b.WriteString("}\n")
		}
		if s := f.SRI; s != nil {
			fmt.Fprintf(b, "sri_broadening = {a = %s, b_K = %s, c_K = %s", w.num(s.A), w.num(s.B), w.num(s.C))
			if s.D != 1 || s.E != 0 || math.Signbit(s.E) {
				fmt.Fprintf(b, ", d = %s, e = %s", w.num(s.D), w.num(s.E))
			}
			b.WriteString("}\n")
		}
	case chem.PressureTable:
		b.WriteString("pressure_table = [\n")
		for _, pr := range r.PressureRates {
			a := w.arrhenius(pr.Rate, n)
			fmt.Fprintf(b, "  {pressure = %s, %s},\n", w.pressure(pr.P), a[1:len(a)-1])
		}
		b.WriteString("]\n")
	case chem.Chebyshev:
		w.chebyshev(r.ChebyshevRate, n)
	}
	return w.err
}

// chebyshev writes the Chebyshev table. The unit change of k is folded into
// the first coefficient; when it cannot be undone exactly the coefficients
// are written as held (log10 of k in SI) with rate_constant_unit saying so.
func (w *writer) chebyshev(c *chem.ChebyshevRate, n float64) {
	b := &w.b
	u := tableRateUnit(writeUnits, n)
	lf := u.log10Factor()
	c00, ok := invert(c.Coeffs[0][0], c.Coeffs[0][0]-lf, func(q float64) float64 { return q + lf })
	if !ok {
		c00 = c.Coeffs[0][0]
	}
	fmt.Fprintf(b, "[reaction.chebyshev]\nT_range_K = %s\npressure_range = [%s, %s]\n",
		w.numberList([]float64{c.TMin, c.TMax}), w.pressure(c.PMin), w.pressure(c.PMax))
	if !ok {
		fmt.Fprintf(b, "rate_constant_unit = %q\n", tableRateUnit(siUnits, n).String())
	}
	b.WriteString("coefficients = [\n")
	for i, row := range c.Coeffs {
		if i == 0 {
			row = append([]float64{c00}, row[1:]...)
		}
		fmt.Fprintf(b, "  %s,\n", w.numberList(row))
	}
	b.WriteString("]\n")
}
