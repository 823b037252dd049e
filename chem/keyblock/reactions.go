package keyblock

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"flame1d/chem"
	"flame1d/chem/internal/equation"
	"flame1d/thermo"
)

// Physical constants for unit conversion.
const (
	// avogadro is N_A in 1/mol (CODATA 2018, exact).
	avogadro = 6.02214076e23
	// calorie is the thermochemical calorie in J (exact by definition).
	calorie = 4.184
	// electronVolt is 1 eV per molecule in J/mol: e N_A = F, the Faraday
	// constant 96485.33212 C/mol (CODATA 2018, exact).
	electronVolt = 96485.33212
	// cm3 is 1 cm^3 in m^3.
	cm3 = 1e-6
)

// Chebyshev ranges assumed when TCHEB or PCHEB is absent: 300-2500 K and
// 0.001-100 atm, the usual defaults of the format (from memory).
const (
	chebTMinDefault, chebTMaxDefault = 300.0, 2500.0
	chebPMinDefault, chebPMaxDefault = 0.001, 100.0 // atm
)

// rateUnits are the units declared on a REACTIONS line.
type rateUnits struct {
	energy    float64 // J/mol per unit of E
	molecules bool    // A in molecule (not mole) units
}

// parseUnitWords reads the unit words after the REACTIONS keyword.
func parseUnitWords(words []string, pos chem.Position, p *problemList) rateUnits {
	u := rateUnits{energy: calorie}
	for _, w := range words {
		switch strings.ToUpper(w) {
		case "CAL/MOLE", "CAL/MOL":
			u.energy = calorie
		case "KCAL/MOLE", "KCAL/MOL":
			u.energy = 1e3 * calorie
		case "JOULES/MOLE", "JOULE/MOLE", "JOULES/MOL", "J/MOL", "J/MOLE":
			u.energy = 1
		case "KJOULES/MOLE", "KJOULE/MOLE", "KJOULES/MOL", "KJ/MOL", "KJ/MOLE":
			u.energy = 1e3
		case "KELVINS", "KELVIN", "K":
			u.energy = thermo.GasConstant
		case "EVOLTS", "EVOLT", "EV":
			u.energy = electronVolt
		case "MOLES", "MOLE":
			u.molecules = false
		case "MOLECULES", "MOLECULE":
			u.molecules = true
		default:
			p.errorf(pos, "unknown unit word %q on the REACTIONS line (known: CAL/MOLE, KCAL/MOLE, JOULES/MOLE, KJOULES/MOLE, KELVINS, EVOLTS, MOLES, MOLECULES)", w)
		}
	}
	return u
}

// toSI converts an Arrhenius triple written for a step of overall order n:
// A [(cm^3/mol)^(n-1)/s or (cm^3/molecule)^(n-1)/s] -> (m^3/mol)^(n-1)/s,
// E in the declared unit -> J/mol.
func (u rateUnits) toSI(a rawArrhenius, order float64) chem.Arrhenius {
	f := cm3
	if u.molecules {
		f *= avogadro
	}
	return chem.Arrhenius{A: a.A * math.Pow(f, order-1), B: a.B, E: a.E * u.energy}
}

type rawArrhenius struct{ A, B, E float64 }

type rawPlog struct {
	P    float64 // atm
	rate rawArrhenius
}

// pending is a reaction being read: the equation line plus its auxiliary
// lines, kept in file units until the reaction is complete.
type pending struct {
	r         chem.Reaction
	equation  string
	line      rawArrhenius
	collider  string // "" none, "M" generic, else the specific collider's species name
	colliderK int    // species index of a specific collider
	falloff   bool   // collider written "(+X)"
	low       *rawArrhenius
	high      *rawArrhenius
	rev       *rawArrhenius
	troe      []float64
	sri       []float64
	plog      []rawPlog
	tcheb     []float64
	pcheb     []float64
	cheb      []float64
	effs      map[int]float64
	effPos    chem.Position
	seen      map[string]bool
	bad       bool // an error was reported; the reaction is dropped
}

// speciesIndex looks species up by name, case-insensitively.
type speciesIndex struct {
	byName map[string]int // upper-case name -> index
	maxLen int            // longest name, bytes
}

func newSpeciesIndex() *speciesIndex { return &speciesIndex{byName: map[string]int{}} }

func (s *speciesIndex) find(name string) (int, bool) {
	if len(name) > s.maxLen {
		return 0, false
	}
	i, ok := s.byName[strings.ToUpper(name)]
	return i, ok
}

func (s *speciesIndex) add(name string, k int) {
	s.byName[strings.ToUpper(name)] = k
	s.maxLen = max(s.maxLen, len(name))
}

// parseEquationLine reads "equation A b E".
func parseEquationLine(text string, pos chem.Position, sp *speciesIndex, p *problemList) *pending {
	f := strings.Fields(text)
	pr := &pending{seen: map[string]bool{}}
	pr.r.Origin = pos
	if len(f) < 4 {
		pr.equation = strings.Join(f, " ")
		p.errorf(pos, "reaction line %q needs an equation followed by three Arrhenius parameters (A, b, E)", text)
		pr.bad = true
		return pr
	}
	var v [3]float64
	for j := 0; j < 3; j++ {
		x, err := parseNumber(f[len(f)-3+j])
		if err != nil {
			pr.equation = strings.Join(f[:len(f)-3], " ")
			p.errorf(pos, "reaction %q: bad Arrhenius parameter %q (expected A, b, E after the equation)", pr.equation, f[len(f)-3+j])
			pr.bad = true
			return pr
		}
		v[j] = x
	}
	pr.line = rawArrhenius{v[0], v[1], v[2]}
	pr.equation = strings.Join(f[:len(f)-3], " ")
	pr.r.Equation = pr.equation
	if err := pr.parseEquation(pr.equation, sp); err != "" {
		p.errorf(pos, "%s in reaction '%s'", err, pr.equation)
		pr.bad = true
	}
	return pr
}

// parseEquation reads the equation (its words joined by single blanks)
// with the parser shared with flame1d's TOML reader: arrow, colliders and
// participants. Species are looked up case-insensitively; blanks around
// '+' are optional, and resolve a split that would otherwise be
// ambiguous. It returns an error message or "".
func (pr *pending) parseEquation(eq string, sp *speciesIndex) string {
	e, err := equation.Parse(eq, func(name string) int {
		if k, ok := sp.find(name); ok {
			return k
		}
		return -1
	})
	if err != nil {
		return err.Error()
	}
	pr.r.Reactants, pr.r.Products, pr.r.Reversible = e.Reactants, e.Products, e.Reversible
	switch e.Collider {
	case equation.PlusM:
		pr.collider = "M"
	case equation.FalloffM:
		pr.collider, pr.colliderK, pr.falloff = "M", -1, true
	case equation.FalloffSpecific:
		pr.collider, pr.colliderK, pr.falloff = pr.speciesName(e.Specific, eq), e.Specific, true
	}
	return ""
}

// speciesName is the collider as its equation spells it: the text inside
// the trailing "(+...)".
func (pr *pending) speciesName(k int, eq string) string {
	if i := strings.LastIndex(eq, "(+"); i >= 0 && strings.HasSuffix(eq, ")") {
		return strings.TrimSpace(eq[i+2 : len(eq)-1])
	}
	return fmt.Sprintf("species %d", k+1)
}

func isSpecies(sp *speciesIndex, name string) bool {
	_, ok := sp.find(name)
	return ok
}

// auxItem is one "KEYWORD" or "KEYWORD / values /" item of an auxiliary line.
type auxItem struct {
	key    string
	values []string
	slash  bool
}

// splitAux tokenises an auxiliary line into items.
func splitAux(s string) ([]auxItem, string) {
	var items []auxItem
	i := 0
	for {
		for i < len(s) && (s[i] == ' ' || s[i] == '\t') {
			i++
		}
		if i >= len(s) {
			return items, ""
		}
		if s[i] == '/' {
			return items, fmt.Sprintf("'/' without a keyword or species name before it at %q", s[i:])
		}
		j := i
		for j < len(s) && s[j] != '/' && s[j] != ' ' && s[j] != '\t' {
			j++
		}
		it := auxItem{key: s[i:j]}
		k := j
		for k < len(s) && (s[k] == ' ' || s[k] == '\t') {
			k++
		}
		if k < len(s) && s[k] == '/' {
			end := strings.IndexByte(s[k+1:], '/')
			if end < 0 {
				return items, fmt.Sprintf("unclosed '/' after %s", it.key)
			}
			it.values = strings.Fields(s[k+1 : k+1+end])
			it.slash = true
			i = k + 1 + end + 1
		} else {
			i = j
		}
		items = append(items, it)
	}
}

// numbers parses an item's values, which must be count in [min, max].
func (it auxItem) numbers(min, max int) ([]float64, string) {
	if len(it.values) < min || len(it.values) > max {
		want := fmt.Sprint(min)
		if max > min {
			want = fmt.Sprintf("%d to %d", min, max)
		}
		return nil, fmt.Sprintf("%s needs %s numbers between slashes, got %d", it.key, want, len(it.values))
	}
	out := make([]float64, len(it.values))
	for i, v := range it.values {
		x, err := parseNumber(v)
		if err != nil {
			return nil, fmt.Sprintf("%s: bad number %q", it.key, v)
		}
		out[i] = x
	}
	return out, ""
}

// unsupportedAux are auxiliary keywords of the format whose models flame1d
// does not have; reading on would silently change the chemistry.
var unsupportedAux = map[string]string{
	"LT": "Landau-Teller rate", "RLT": "Landau-Teller reverse rate", "JAN": "fitted rate form",
	"FIT1": "fitted rate form", "HV": "photon reaction", "TDEP": "species-temperature dependence",
	"EXCI": "excitation energy loss", "MOME": "momentum-transfer collision", "XSMI": "collision cross-section",
	"USRPROG": "user rate routine", "UNITS": "per-reaction units", "PLAS": "plasma reaction",
}

// applyAux applies one auxiliary line to the current reaction.
func (pr *pending) applyAux(text string, pos chem.Position, sp *speciesIndex, p *problemList) {
	items, msg := splitAux(text)
	if msg != "" {
		p.errorf(pos, "reaction '%s': %s", pr.equation, msg)
		pr.bad = true
		return
	}
	fail := func(format string, a ...any) {
		p.errorf(pos, "reaction '%s': %s", pr.equation, fmt.Sprintf(format, a...))
		pr.bad = true
	}
	for _, it := range items {
		key := strings.ToUpper(it.key)
		once := func() bool {
			if pr.seen[key] {
				fail("%s given twice", key)
				return false
			}
			pr.seen[key] = true
			return true
		}
		arrh := func() *rawArrhenius {
			v, m := it.numbers(3, 3)
			if m != "" {
				fail("%s", m)
				return nil
			}
			return &rawArrhenius{v[0], v[1], v[2]}
		}
		if what, ok := unsupportedAux[key]; ok && !isSpecies(sp, it.key) {
			fail("auxiliary keyword %s (%s) is not supported by flame1d", key, what)
			continue
		}
		switch key {
		case "DUP", "DUPLICATE":
			pr.r.Duplicate = true
		case "LOW":
			if once() {
				pr.low = arrh()
			}
		case "HIGH":
			if once() {
				pr.high = arrh()
			}
		case "REV":
			if once() {
				pr.rev = arrh()
			}
		case "TROE":
			if once() {
				v, m := it.numbers(3, 4)
				if m != "" {
					fail("%s", m)
					continue
				}
				pr.troe = v
			}
		case "SRI":
			if once() {
				v, m := it.numbers(3, 5)
				if m == "" && len(v) == 4 {
					m = "SRI needs 3 or 5 numbers between slashes, got 4"
				}
				if m != "" {
					fail("%s", m)
					continue
				}
				pr.sri = v
			}
		case "PLOG":
			v, m := it.numbers(4, 4)
			if m != "" {
				fail("%s", m)
				continue
			}
			if !(v[0] > 0) {
				fail("PLOG pressure %g atm must be positive", v[0])
				continue
			}
			pr.plog = append(pr.plog, rawPlog{v[0], rawArrhenius{v[1], v[2], v[3]}})
		case "TCHEB", "PCHEB":
			if once() {
				v, m := it.numbers(2, 2)
				if m != "" {
					fail("%s", m)
					continue
				}
				if key == "TCHEB" {
					pr.tcheb = v
				} else {
					pr.pcheb = v
				}
			}
		case "CHEB":
			v, m := it.numbers(1, math.MaxInt)
			if m != "" {
				fail("%s", m)
				continue
			}
			pr.cheb = append(pr.cheb, v...)
		case "FORD", "RORD":
			if len(it.values) == 0 || len(it.values)%2 != 0 {
				fail("%s needs pairs of species name and order between slashes", key)
				continue
			}
			for j := 0; j < len(it.values); j += 2 {
				k, ok := sp.find(it.values[j])
				if !ok {
					fail("unknown species '%s' in %s", it.values[j], key)
					continue
				}
				o, err := parseNumber(it.values[j+1])
				if err != nil || o < 0 {
					fail("%s: bad order %q for %s", key, it.values[j+1], it.values[j])
					continue
				}
				if key == "FORD" {
					if pr.r.Orders == nil {
						pr.r.Orders = map[int]float64{}
					}
					pr.r.Orders[k] = o
				} else {
					if pr.r.ReverseOrders == nil {
						pr.r.ReverseOrders = map[int]float64{}
					}
					pr.r.ReverseOrders[k] = o
				}
			}
		default:
			if !it.slash {
				fail("unexpected text %q (not an auxiliary keyword, and no /value/ follows)", it.key)
				continue
			}
			// A collision efficiency "SPECIES / value /".
			v, m := it.numbers(1, 1)
			if m != "" {
				fail("efficiency of %s: %s", it.key, strings.TrimPrefix(m, it.key+" "))
				continue
			}
			if v[0] < 0 {
				fail("efficiency of %s is negative (%g)", it.key, v[0])
				continue
			}
			k, ok := sp.find(it.key)
			if !ok {
				p.warnf(pos, "reaction '%s': efficiency for '%s', which is not a species of the mechanism, ignored", pr.equation, it.key)
				continue
			}
			if pr.effs == nil {
				pr.effs = map[int]float64{}
				pr.effPos = pos
			}
			pr.effs[k] = v[0]
		}
	}
}

// finish checks the combination of auxiliary data, converts units and
// returns the complete reaction.
func (pr *pending) finish(u rateUnits, p *problemList) (chem.Reaction, bool) {
	if pr.bad {
		return chem.Reaction{}, false
	}
	r := pr.r
	pos := r.Origin
	fail := func(format string, a ...any) (chem.Reaction, bool) {
		p.errorf(pos, "reaction '%s': %s", pr.equation, fmt.Sprintf(format, a...))
		return chem.Reaction{}, false
	}
	order := func(side []chem.Participant, over map[int]float64) float64 {
		n := 0.0
		counted := map[int]bool{}
		for _, q := range side {
			if o, ok := over[q.Species]; ok {
				n += o
			} else {
				n += q.Coefficient
			}
			counted[q.Species] = true
		}
		for k, o := range over {
			if !counted[k] {
				n += o
			}
		}
		return n
	}
	n := order(r.Reactants, r.Orders)
	nRev := order(r.Products, r.ReverseOrders)
	if pr.collider == "M" && !pr.falloff {
		n++
		nRev++
	}
	nForms := 0
	for _, has := range []bool{len(pr.plog) > 0, len(pr.cheb) > 0, pr.low != nil || pr.high != nil} {
		if has {
			nForms++
		}
	}
	if nForms > 1 {
		return fail("combines more than one of PLOG, CHEB and LOW/HIGH")
	}
	if (pr.troe != nil || pr.sri != nil) && pr.low == nil && pr.high == nil {
		return fail("TROE or SRI given without LOW or HIGH")
	}
	if pr.troe != nil && pr.sri != nil {
		return fail("both TROE and SRI given")
	}
	if (pr.tcheb != nil || pr.pcheb != nil) && pr.cheb == nil {
		return fail("TCHEB/PCHEB given without CHEB coefficients")
	}
	if len(r.ReverseOrders) > 0 && !r.Reversible {
		return fail("RORD on an irreversible reaction")
	}
	if pr.rev != nil {
		if !r.Reversible {
			return fail("REV on an irreversible reaction")
		}
		if pr.falloff || len(pr.plog) > 0 || pr.cheb != nil {
			return fail("REV is only supported for elementary and three-body reactions")
		}
		rv := u.toSI(*pr.rev, nRev)
		r.ReverseRate = &rv
	}
	if pr.effs != nil && pr.cheb != nil {
		return fail("collision efficiencies given for a Chebyshev reaction, whose fit already includes the bath gas")
	}
	if pr.effs != nil && pr.collider != "M" {
		if pr.collider == "" {
			return fail("collision efficiencies given but the equation has no '+M' or '(+M)'")
		}
		p.warnf(pr.effPos, "reaction '%s': efficiencies ignored, the collider is the single species %s", pr.equation, pr.collider)
	}
	switch {
	case len(pr.plog) > 0:
		if pr.collider != "" {
			return fail("PLOG reaction with a collider; pressure tables already include the pressure dependence")
		}
		r.Form = chem.PressureTable
		sort.SliceStable(pr.plog, func(i, j int) bool { return pr.plog[i].P < pr.plog[j].P })
		for _, e := range pr.plog {
			r.PressureRates = append(r.PressureRates, chem.PressureRate{P: e.P * thermo.OneAtmosphere, Rate: u.toSI(e.rate, n)})
		}
	case pr.cheb != nil:
		c, msg := pr.chebyshev(u, n)
		if msg != "" {
			return fail("%s", msg)
		}
		r.Form = chem.Chebyshev
		r.ChebyshevRate = c
	case pr.falloff:
		if pr.low == nil && pr.high == nil {
			return fail("'(+%s)' falloff reaction needs a LOW or HIGH line", pr.collider)
		}
		if pr.low != nil && pr.high != nil {
			return fail("both LOW and HIGH given")
		}
		fr := &chem.FalloffRate{}
		// The equation line always carries the step's own order n; the
		// low-pressure limit k0 multiplies [M], so it is one order higher
		// than k_inf. Falloff: line = k_inf (n), LOW = k0 (n+1).
		// Chemically activated: line = k0 (n), HIGH = k_inf (n-1).
		if pr.low != nil {
			r.Form = chem.Falloff
			fr.High = u.toSI(pr.line, n)
			fr.Low = u.toSI(*pr.low, n+1)
		} else {
			r.Form = chem.ChemicallyActivated
			fr.Low = u.toSI(pr.line, n)
			fr.High = u.toSI(*pr.high, n-1)
		}
		if t := pr.troe; t != nil {
			fr.Troe = &chem.Troe{A: t[0], T3: t[1], T1: t[2]}
			if len(t) == 4 {
				fr.Troe.T2, fr.Troe.HasT2 = t[3], true
			}
		}
		if s := pr.sri; s != nil {
			fr.SRI = &chem.SRI{A: s[0], B: s[1], C: s[2], D: 1}
			if len(s) == 5 {
				fr.SRI.D, fr.SRI.E = s[3], s[4]
			}
		}
		r.FalloffRate = fr
		r.ThirdBody = pr.thirdBody()
	case pr.low != nil || pr.high != nil:
		return fail("LOW/HIGH given but the equation has no '(+M)' collider")
	case pr.collider == "M":
		r.Form = chem.ThreeBody
		r.Rate = u.toSI(pr.line, n)
		r.ThirdBody = pr.thirdBody()
	default:
		r.Form = chem.Elementary
		r.Rate = u.toSI(pr.line, n)
	}
	if !finiteRates(&r) {
		return fail("a rate parameter is not finite after conversion to SI units (order %g)", n)
	}
	return r, true
}

// finiteRates reports whether every rate parameter of r is a finite number.
func finiteRates(r *chem.Reaction) bool {
	ok := func(a chem.Arrhenius) bool {
		return !math.IsInf(a.A, 0) && !math.IsNaN(a.A) && !math.IsInf(a.B, 0) && !math.IsInf(a.E, 0)
	}
	good := ok(r.Rate)
	if r.ReverseRate != nil {
		good = good && ok(*r.ReverseRate)
	}
	if f := r.FalloffRate; f != nil {
		good = good && ok(f.Low) && ok(f.High)
	}
	for _, pr := range r.PressureRates {
		good = good && ok(pr.Rate) && !math.IsInf(pr.P, 0)
	}
	if c := r.ChebyshevRate; c != nil {
		good = good && !math.IsInf(c.Coeffs[0][0], 0) && !math.IsNaN(c.Coeffs[0][0]) && !math.IsInf(c.PMax, 0)
	}
	return good
}

func (pr *pending) thirdBody() *chem.ThirdBody {
	if pr.collider != "M" {
		return &chem.ThirdBody{Default: 0, Efficiencies: map[int]float64{pr.colliderK: 1}}
	}
	tb := &chem.ThirdBody{Default: 1, Efficiencies: map[int]float64{}}
	for k, e := range pr.effs {
		tb.Efficiencies[k] = e
	}
	return tb
}

// chebyshev assembles the Chebyshev data: CHEB / nT nP c11 c12 ... / with
// the pressure index varying fastest; TCHEB / Tmin Tmax / in K; PCHEB /
// Pmin Pmax / in atm. log10 k converts to SI by adding (n-1) log10 of the
// A factor to the constant coefficient (phi_0 = 1).
func (pr *pending) chebyshev(u rateUnits, n float64) (*chem.ChebyshevRate, string) {
	c := pr.cheb
	if len(c) < 2 {
		return nil, "CHEB needs the two table sizes followed by the coefficients"
	}
	nT, nP := c[0], c[1]
	if nT != math.Trunc(nT) || nP != math.Trunc(nP) || nT < 1 || nP < 1 || nT*nP > 1e4 {
		return nil, fmt.Sprintf("CHEB table sizes %g x %g must be positive integers", nT, nP)
	}
	nt, np := int(nT), int(nP)
	if len(c)-2 != nt*np {
		return nil, fmt.Sprintf("CHEB declares %d x %d coefficients but gives %d", nt, np, len(c)-2)
	}
	out := &chem.ChebyshevRate{TMin: chebTMinDefault, TMax: chebTMaxDefault,
		PMin: chebPMinDefault * thermo.OneAtmosphere, PMax: chebPMaxDefault * thermo.OneAtmosphere}
	if pr.tcheb != nil {
		out.TMin, out.TMax = pr.tcheb[0], pr.tcheb[1]
	}
	if pr.pcheb != nil {
		out.PMin, out.PMax = pr.pcheb[0]*thermo.OneAtmosphere, pr.pcheb[1]*thermo.OneAtmosphere
	}
	out.Coeffs = make([][]float64, nt)
	for i := range out.Coeffs {
		out.Coeffs[i] = append([]float64(nil), c[2+i*np:2+(i+1)*np]...)
	}
	f := u.toSI(rawArrhenius{A: 1}, n).A
	out.Coeffs[0][0] += math.Log10(f)
	return out, ""
}
