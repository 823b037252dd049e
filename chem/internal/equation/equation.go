// Package equation reads and writes reaction equations ("H + O2 (+M) <=>
// HO2 (+M)", "2O+M=O2+M", "CH4 + 1.5 O2 => CO + 2 H2O"): the one parser
// behind both mechanism readers, flame1d's TOML format (chem/mechtoml) and
// the classic keyword-block format (chem/keyblock), so that one equation
// text gives one step in both.
package equation

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"flame1d/chem"
)

// Collider says which third body an equation names.
type Collider int

const (
	NoCollider      Collider = iota
	PlusM                    // "A + B + M": efficiency-weighted third body
	FalloffM                 // "A + B (+M)": falloff with the weighted bath
	FalloffSpecific          // "A + B (+AR)": falloff with one collision partner
)

// Equation is what a reaction equation says: both sides, direction and
// third body.
type Equation struct {
	Reactants, Products []chem.Participant
	Reversible          bool
	Collider            Collider
	Specific            int // species index of a specific falloff collider
}

// SameAs reports whether two equations describe the same step exactly
// (participants in the same order with identical coefficients).
func (e *Equation) SameAs(o *Equation) bool {
	same := func(a, b []chem.Participant) bool {
		if len(a) != len(b) {
			return false
		}
		for i := range a {
			if a[i] != b[i] {
				return false
			}
		}
		return true
	}
	return e.Reversible == o.Reversible && e.Collider == o.Collider &&
		(e.Collider != FalloffSpecific || e.Specific == o.Specific) &&
		same(e.Reactants, o.Reactants) && same(e.Products, o.Products)
}

// isThirdBodyName reports whether a term names the generic third body.
func isThirdBodyName(s string) bool { return s == "M" || s == "m" }

// Parse reads "H + O2 (+M) <=> HO2 (+M)", "2O+M<=>O2+M",
// "nc7h16 = h + c7h15", "CH4 + 0.5 O2 => CO + 2 H2" and the like. The arrow
// is "<=>" or "=" (reversible) or "=>" (irreversible). Species are found by
// name through index (-1 for unknown). Terms may be written without blanks
// around "+" as long as the split into known species names is unique;
// a coefficient precedes its species, with or without a blank. A species
// repeated on one side is merged into its first appearance ("H + H" is
// "2 H").
func Parse(text string, index func(string) int) (Equation, error) {
	var eq Equation
	var left, right string
	if i := strings.Index(text, "<=>"); i >= 0 {
		left, right, eq.Reversible = text[:i], text[i+3:], true
	} else if i := strings.Index(text, "=>"); i >= 0 {
		left, right = text[:i], text[i+2:]
	} else if i := strings.Index(text, "="); i >= 0 {
		left, right, eq.Reversible = text[:i], text[i+1:], true
	} else {
		return eq, errors.New("no arrow (write <=>, = or =>)")
	}
	if strings.ContainsAny(left, "<=>") || strings.ContainsAny(right, "<=>") {
		return eq, errors.New("more than one arrow")
	}
	lcol, lname, left, err := falloffSuffix(left)
	if err != nil {
		return eq, err
	}
	rcol, rname, right, err := falloffSuffix(right)
	if err != nil {
		return eq, err
	}
	if lcol && rcol && lname != rname {
		return eq, fmt.Errorf("falloff collider (+%s) on the left does not match (+%s) on the right", lname, rname)
	}
	if lcol != rcol {
		return eq, errors.New("a falloff collider such as (+M) must be written on both sides")
	}
	var lm, rm int
	eq.Reactants, lm, err = parseSide(left, index)
	if err != nil {
		return eq, fmt.Errorf("reactants: %w", err)
	}
	eq.Products, rm, err = parseSide(right, index)
	if err != nil {
		return eq, fmt.Errorf("products: %w", err)
	}
	if lm > 1 || rm > 1 {
		return eq, errors.New("the third body M may appear only once on each side")
	}
	if lm != rm {
		return eq, errors.New("the third body M must be written on both sides")
	}
	switch {
	case lcol && lm > 0:
		return eq, errors.New("both (+M) and + M in one equation")
	case lcol && isThirdBodyName(lname):
		eq.Collider = FalloffM
	case lcol:
		k := index(lname)
		if k < 0 {
			return eq, fmt.Errorf("unknown collider species %q in (+%s)", lname, lname)
		}
		eq.Collider, eq.Specific = FalloffSpecific, k
	case lm > 0:
		eq.Collider = PlusM
	}
	return eq, nil
}

// falloffSuffix strips a trailing "(+X)" from one side of an equation.
func falloffSuffix(side string) (found bool, name, rest string, err error) {
	t := strings.TrimSpace(side)
	if strings.HasSuffix(t, ")") {
		if open := strings.LastIndexByte(t, '('); open >= 0 {
			inner := strings.TrimSpace(t[open+1 : len(t)-1])
			if strings.HasPrefix(inner, "+") {
				name = strings.TrimSpace(inner[1:])
				if name == "" {
					return false, "", side, errors.New("empty falloff collider ( + )")
				}
				found, rest = true, t[:open]
			}
		}
	}
	if !found {
		rest = side
	}
	if strings.Contains(rest, "(+") {
		return false, "", side, errors.New("a falloff collider (+M) must end its side of the equation")
	}
	return found, name, rest, nil
}

// maxPlusInName is the most '+' signs one species name may contain (ion
// names such as "C3H3+" have one); it bounds the search for a split.
const maxPlusInName = 3

// parseSide splits one side into participants, a repeated species merged
// into one. It returns the number of generic third-body terms (M) found.
func parseSide(side string, index func(string) int) ([]chem.Participant, int, error) {
	if strings.TrimSpace(side) == "" {
		return nil, 0, errors.New("empty")
	}
	// Cut points are the '+' signs; a partition of them into terms that
	// each read as "[coefficient] species" or "M" is a parse. Count the
	// parses (up to two) by dynamic programming over cut points.
	cuts := []int{-1}
	for i := 0; i < len(side); i++ {
		if side[i] == '+' {
			cuts = append(cuts, i)
		}
	}
	cuts = append(cuts, len(side))
	n := len(cuts)
	ways := make([]int, n) // ways[j]: parses of side[:cuts[j]]
	from := make([]int, n) // previous cut of the first parse found
	ways[0] = 1
	for j := 1; j < n; j++ {
		for i := max(0, j-maxPlusInName-1); i < j; i++ {
			if ways[i] == 0 {
				continue
			}
			if _, ok := parseTerm(side[cuts[i]+1:cuts[j]], index); !ok {
				continue
			}
			if ways[j] == 0 {
				from[j] = i
			}
			ways[j] = min(2, ways[j]+ways[i])
		}
	}
	switch ways[n-1] {
	case 0:
		return nil, 0, sideError(side, index)
	case 2:
		return nil, 0, fmt.Errorf("%q splits into species in more than one way; put blanks around each '+' between species", strings.TrimSpace(side))
	}
	var terms []term
	for j := n - 1; j > 0; j = from[j] {
		t, _ := parseTerm(side[cuts[from[j]]+1:cuts[j]], index)
		terms = append(terms, t)
	}
	var out []chem.Participant
	nm := 0
	for i := len(terms) - 1; i >= 0; i-- {
		if terms[i].thirdBody {
			nm++
			continue
		}
		out = addParticipant(out, terms[i].species, terms[i].coefficient)
	}
	if len(out) == 0 {
		return nil, nm, errors.New("no species")
	}
	return out, nm, nil
}

// addParticipant adds c of species k to a side, merging a repeated species
// into its first appearance ("H + H" is "2 H").
func addParticipant(side []chem.Participant, k int, c float64) []chem.Participant {
	for i := range side {
		if side[i].Species == k {
			side[i].Coefficient += c
			return side
		}
	}
	return append(side, chem.Participant{Species: k, Coefficient: c})
}

// sideError explains why a side did not parse, naming the first term (split
// at '+' with blanks around it, else at every '+') that is not a species.
func sideError(side string, index func(string) int) error {
	parts := strings.Split(side, " + ")
	if len(parts) == 1 {
		parts = strings.Split(side, "+")
	}
	for _, p := range parts {
		if _, ok := parseTerm(p, index); !ok {
			p = strings.TrimSpace(p)
			if p == "" || strings.HasPrefix(p, "+") || strings.HasSuffix(p, "+") {
				return fmt.Errorf("%q has an empty term (a stray '+')", strings.TrimSpace(side))
			}
			return fmt.Errorf("unknown species %q", p)
		}
	}
	return fmt.Errorf("%q does not split into known species", strings.TrimSpace(side))
}

type term struct {
	species     int
	coefficient float64
	thirdBody   bool
}

// parseTerm reads "H2", "2H", "2 H", "0.5 O2", "1e-05 X" or "M".
func parseTerm(s string, index func(string) int) (term, bool) {
	s = strings.TrimSpace(s)
	if s == "" {
		return term{}, false
	}
	if k := index(s); k >= 0 {
		return term{species: k, coefficient: 1}, true
	}
	if isThirdBodyName(s) {
		return term{thirdBody: true}, true
	}
	var num, name string
	if cut := strings.IndexAny(s, " \t"); cut >= 0 {
		num, name = s[:cut], strings.TrimSpace(s[cut:])
	} else {
		j := 0
		for j < len(s) && (s[j] >= '0' && s[j] <= '9' || s[j] == '.') {
			j++
		}
		num, name = s[:j], s[j:]
	}
	if num == "" || name == "" {
		return term{}, false
	}
	c, err := strconv.ParseFloat(num, 64)
	if err != nil || !(c > 0) || math.IsInf(c, 0) {
		return term{}, false
	}
	k := index(name)
	if k < 0 {
		return term{}, false
	}
	return term{species: k, coefficient: c}, true
}

// Format writes an equation canonically: "2 H + O2 (+M) <=> ...", blanks
// around '+' and the arrow, coefficients other than 1 (in their shortest
// exact decimal form) before their species. names are the species names by
// index.
func Format(e *Equation, names []string) string {
	var b strings.Builder
	side := func(ps []chem.Participant) {
		for i, p := range ps {
			if i > 0 {
				b.WriteString(" + ")
			}
			if p.Coefficient != 1 {
				b.WriteString(strconv.FormatFloat(p.Coefficient, 'g', -1, 64))
				b.WriteByte(' ')
			}
			b.WriteString(names[p.Species])
		}
		switch e.Collider {
		case PlusM:
			b.WriteString(" + M")
		case FalloffM:
			b.WriteString(" (+M)")
		case FalloffSpecific:
			b.WriteString(" (+" + names[e.Specific] + ")")
		}
	}
	side(e.Reactants)
	if e.Reversible {
		b.WriteString(" <=> ")
	} else {
		b.WriteString(" => ")
	}
	side(e.Products)
	return b.String()
}
