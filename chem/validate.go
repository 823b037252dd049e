package chem

import (
	"fmt"
	"math"
	"sort"
	"strings"
	"unicode"

	"flame1d/thermo"
)

// Problem is one defect found in a mechanism. Error problems make the
// mechanism unusable; warnings (e.g. a thermo polynomial jump at its midpoint)
// are reported and the mechanism is still used.
type Problem struct {
	Pos     Position
	Warning bool
	Message string
}

func (p Problem) String() string {
	kind := "error"
	if p.Warning {
		kind = "warning"
	}
	loc := p.Pos.File
	if p.Pos.Line > 0 {
		loc = fmt.Sprintf("%s:%d", p.Pos.File, p.Pos.Line)
	}
	if loc == "" {
		return kind + ": " + p.Message
	}
	return loc + ": " + kind + ": " + p.Message
}

// ValidationError carries every error-level problem of a mechanism.
type ValidationError struct{ Problems []Problem }

func (e *ValidationError) Error() string {
	var b strings.Builder
	n := 0
	for _, p := range e.Problems {
		if p.Warning {
			continue
		}
		if n > 0 {
			b.WriteString("\n")
		}
		b.WriteString(p.String())
		n++
	}
	return fmt.Sprintf("mechanism has %d error(s):\n%s", n, b.String())
}

// balanceTolerance is the largest element imbalance (atoms) accepted in a
// reaction; lumped steps with fractional coefficients written to 4-6
// significant digits balance to about this.
const balanceTolerance = 1e-3

// Validate checks the mechanism's internal consistency: species names unique
// and declared with known elements, every species with a molar mass,
// reactions element-balanced, repeated equations marked duplicate, rate data
// present for each form. It returns all problems found (errors and warnings)
// and, if any is an error, a *ValidationError as err.
func (m *Mechanism) Validate() (problems []Problem, err error) {
	add := func(pos Position, warn bool, format string, a ...any) {
		problems = append(problems, Problem{Pos: pos, Warning: warn, Message: fmt.Sprintf(format, a...)})
	}
	if strings.IndexFunc(m.Name, unicode.IsControl) >= 0 {
		add(Position{}, false, "mechanism name %q has a control character (line break, tab, ...)", m.Name)
	}
	declared := map[string]bool{}
	for _, e := range m.Elements {
		if _, ok := thermo.AtomicWeight(e); !ok {
			add(Position{}, false, "element %q has no standard atomic weight", e)
		}
		declared[strings.ToUpper(e)] = true
	}
	seen := map[string]int{}
	for i := range m.Species {
		s := &m.Species[i]
		if j, dup := seen[s.Name]; dup {
			add(s.Origin, false, "species %q declared twice (also species %d)", s.Name, j+1)
		}
		seen[s.Name] = i
		// Names go into file headers and column names: one word, no
		// control characters.
		if s.Name == "" || strings.IndexFunc(s.Name, func(r rune) bool { return unicode.IsSpace(r) || unicode.IsControl(r) }) >= 0 {
			add(s.Origin, false, "species name %q must be one word without spaces or control characters", s.Name)
		}
		if len(s.Composition) == 0 {
			add(s.Origin, false, "species %q has no elemental composition (missing thermo record?)", s.Name)
		}
		for e := range s.Composition {
			if !declared[strings.ToUpper(e)] {
				add(s.Origin, false, "species %q contains element %q, which is not declared", s.Name, e)
			}
		}
		if s.Thermo.TMid <= 0 || s.Thermo.TLow >= s.Thermo.THigh {
			add(s.Origin, false, "species %q has no valid thermo polynomials (T ranges %g/%g/%g K)",
				s.Name, s.Thermo.TLow, s.Thermo.TMid, s.Thermo.THigh)
		} else if j := s.Thermo.MidpointJump(); j > thermo.MidpointJumpTolerance {
			add(s.Origin, true, "species %q thermo polynomials jump by %.2g (relative) at %g K", s.Name, j, s.Thermo.TMid)
		}
	}
	equations := map[string][]int{}
	for i := range m.Reactions {
		r := &m.Reactions[i]
		label := fmt.Sprintf("reaction %d (%s)", i+1, r.Equation)
		if bad := m.checkParticipants(r); bad != "" {
			add(r.Origin, false, "%s: %s", label, bad)
			continue
		}
		if imb := m.imbalance(r); imb != "" {
			add(r.Origin, false, "%s is not element-balanced: %s", label, imb)
		}
		if msg := checkRateData(r); msg != "" {
			add(r.Origin, false, "%s: %s", label, msg)
		}
		key := m.canonicalKey(r)
		equations[key] = append(equations[key], i)
	}
	for _, idx := range equations {
		if len(idx) < 2 {
			continue
		}
		for _, i := range idx {
			if !m.Reactions[i].Duplicate {
				r := &m.Reactions[i]
				add(r.Origin, false, "reaction %d (%s) repeats another reaction's equation but is not marked duplicate",
					i+1, r.Equation)
			}
		}
	}
	for _, p := range problems {
		if !p.Warning {
			return problems, &ValidationError{Problems: problems}
		}
	}
	return problems, nil
}

func (m *Mechanism) checkParticipants(r *Reaction) string {
	if len(r.Reactants) == 0 || len(r.Products) == 0 {
		return "needs at least one reactant and one product"
	}
	for _, side := range [][]Participant{r.Reactants, r.Products} {
		for _, p := range side {
			if p.Species < 0 || p.Species >= len(m.Species) {
				return fmt.Sprintf("species index %d out of range", p.Species)
			}
			if !(p.Coefficient > 0) || math.IsInf(p.Coefficient, 0) {
				return fmt.Sprintf("coefficient %g of %s must be positive", p.Coefficient, m.Species[p.Species].Name)
			}
		}
	}
	return ""
}

func (m *Mechanism) imbalance(r *Reaction) string {
	net := map[string]float64{}
	for _, p := range r.Reactants {
		for e, n := range m.Species[p.Species].Composition {
			net[strings.ToUpper(e)] += p.Coefficient * n
		}
	}
	for _, p := range r.Products {
		for e, n := range m.Species[p.Species].Composition {
			net[strings.ToUpper(e)] -= p.Coefficient * n
		}
	}
	var parts []string
	for e, d := range net {
		if math.Abs(d) > balanceTolerance {
			parts = append(parts, fmt.Sprintf("%s %+g (reactants minus products)", e, d))
		}
	}
	sort.Strings(parts)
	return strings.Join(parts, ", ")
}

func checkRateData(r *Reaction) string {
	switch r.Form {
	case ThreeBody:
		if r.ThirdBody == nil {
			return "three-body form without collision efficiencies"
		}
	case Falloff, ChemicallyActivated:
		if r.ThirdBody == nil || r.FalloffRate == nil {
			return "falloff form needs both limits and a collider"
		}
	case PressureTable:
		if len(r.PressureRates) == 0 {
			return "pressure-table form with no pressures"
		}
		for i := 1; i < len(r.PressureRates); i++ {
			if r.PressureRates[i].P < r.PressureRates[i-1].P {
				return "pressure table not sorted by pressure"
			}
		}
	case Chebyshev:
		c := r.ChebyshevRate
		if c == nil || len(c.Coeffs) == 0 || len(c.Coeffs[0]) == 0 {
			return "Chebyshev form with no coefficients"
		}
		if !(c.TMin > 0 && c.TMax > c.TMin && c.PMin > 0 && c.PMax > c.PMin) {
			return "Chebyshev form needs 0 < TMin < TMax and 0 < PMin < PMax"
		}
	}
	if r.ReverseRate != nil && !r.Reversible {
		return "explicit reverse rate on an irreversible reaction"
	}
	if len(r.ReverseOrders) > 0 && !r.Reversible {
		return "reverse orders on an irreversible reaction"
	}
	return ""
}

// canonicalKey identifies a reaction's chemistry (both sides, order-free,
// direction-free for reversible steps, collider kind) so repeated equations
// can be found.
func (m *Mechanism) canonicalKey(r *Reaction) string {
	side := func(ps []Participant) string {
		parts := make([]string, len(ps))
		for i, p := range ps {
			parts[i] = fmt.Sprintf("%g %s", p.Coefficient, m.Species[p.Species].Name)
		}
		sort.Strings(parts)
		return strings.Join(parts, "+")
	}
	a, b := side(r.Reactants), side(r.Products)
	if r.Reversible && b < a {
		a, b = b, a
	}
	collider := ""
	if r.ThirdBody != nil {
		collider = "M"
		if r.ThirdBody.Default == 0 && len(r.ThirdBody.Efficiencies) == 1 {
			for k := range r.ThirdBody.Efficiencies {
				collider = m.Species[k].Name
			}
		}
		if r.Form == Falloff || r.Form == ChemicallyActivated {
			collider = "(+" + collider + ")"
		}
	}
	dir := "=>"
	if r.Reversible {
		dir = "<=>"
	}
	return a + dir + b + collider
}

// SpeciesIndex returns the index of the named species, or -1.
func (m *Mechanism) SpeciesIndex(name string) int {
	for i := range m.Species {
		if m.Species[i].Name == name {
			return i
		}
	}
	return -1
}

// SpeciesIndexFold returns the index of the named species, matched exactly
// or else ignoring case (mechanisms write "OH" or "oh"), or -1.
func (m *Mechanism) SpeciesIndexFold(name string) int {
	if i := m.SpeciesIndex(name); i >= 0 {
		return i
	}
	for i := range m.Species {
		if strings.EqualFold(m.Species[i].Name, name) {
			return i
		}
	}
	return -1
}

// MolarMasses returns each species' molar mass in kg/mol, computed from its
// composition and standard atomic weights.
func (m *Mechanism) MolarMasses() ([]float64, error) {
	w := make([]float64, len(m.Species))
	for i := range m.Species {
		mw, err := m.Species[i].MolarMass()
		if err != nil {
			return nil, err
		}
		w[i] = mw
	}
	return w, nil
}
