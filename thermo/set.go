package thermo

import (
	"fmt"
	"math"
	"strings"
)

// SpeciesSet is an ordered list of species with the quantities every mixture
// calculation needs precomputed: molar masses, the element list and the
// element matrix. A SpeciesSet is read-only after construction and safe for
// concurrent use; its methods write only into slices the caller passes.
type SpeciesSet struct {
	Species []Species
	// MolarMass[k] is the molar mass of species k in kg/mol.
	MolarMass []float64
	// Elements lists the element symbols (upper case) in order of first
	// appearance in Species.
	Elements []string
	// Warnings records non-fatal defects found at construction, e.g. a
	// polynomial pair that jumps at its mid temperature by more than
	// MidpointJumpTolerance.
	Warnings []string

	atoms   []float64 // element matrix, atoms[k*nElem+e]: atoms of element e in species k
	invMass []float64 // 1/MolarMass
	gas     []bool    // !Condensed
	byName  map[string]int
}

// NewSpeciesSet builds a species set. It fails when a species has no
// composition, an element without a standard atomic weight, a negative atom
// count, a name used twice, or no valid temperature ranges.
func NewSpeciesSet(species []Species) (*SpeciesSet, error) {
	if len(species) == 0 {
		return nil, fmt.Errorf("species set: no species")
	}
	s := &SpeciesSet{
		Species:   append([]Species(nil), species...),
		MolarMass: make([]float64, len(species)),
		invMass:   make([]float64, len(species)),
		gas:       make([]bool, len(species)),
		byName:    make(map[string]int, len(species)),
	}
	index := map[string]int{}
	for k := range s.Species {
		sp := &s.Species[k]
		if _, dup := s.byName[sp.Name]; dup {
			return nil, fmt.Errorf("species set: species %q appears twice", sp.Name)
		}
		s.byName[sp.Name] = k
		s.gas[k] = !sp.Condensed
		p := &sp.Thermo
		if !(p.TLow > 0 && p.TLow <= p.TMid && p.TMid <= p.THigh && p.TLow < p.THigh) {
			return nil, fmt.Errorf("species set: species %q has invalid thermo temperature ranges %g/%g/%g K",
				sp.Name, p.TLow, p.TMid, p.THigh)
		}
		if j := p.MidpointJump(); j > MidpointJumpTolerance {
			s.Warnings = append(s.Warnings, fmt.Sprintf(
				"species %q: thermo polynomials jump by %.2g (relative) at %g K", sp.Name, j, p.TMid))
		}
		for _, e := range sortedKeys(sp.Composition) {
			n := sp.Composition[e]
			if n < 0 || math.IsNaN(n) || math.IsInf(n, 0) {
				return nil, fmt.Errorf("species set: species %q has atom count %g for element %s", sp.Name, n, e)
			}
			u := strings.ToUpper(e)
			if _, ok := index[u]; !ok {
				index[u] = len(s.Elements)
				s.Elements = append(s.Elements, u)
			}
		}
	}
	for k := range s.Species {
		w, err := s.Species[k].MolarMass()
		if err != nil {
			return nil, fmt.Errorf("species set: %w", err)
		}
		if !(w > 0) {
			return nil, fmt.Errorf("species set: species %q has non-positive molar mass %g kg/mol", s.Species[k].Name, w)
		}
		s.MolarMass[k] = w
		s.invMass[k] = 1 / w
	}
	nE := len(s.Elements)
	s.atoms = make([]float64, len(species)*nE)
	for k := range s.Species {
		for e, n := range s.Species[k].Composition {
			s.atoms[k*nE+index[strings.ToUpper(e)]] += n
		}
	}
	return s, nil
}

// Len returns the number of species.
func (s *SpeciesSet) Len() int { return len(s.Species) }

// Index returns the index of the named species (exact match first, then
// case-insensitive), or -1.
func (s *SpeciesSet) Index(name string) int {
	if k, ok := s.byName[name]; ok {
		return k
	}
	for k := range s.Species {
		if strings.EqualFold(s.Species[k].Name, name) {
			return k
		}
	}
	return -1
}

// ElementIndex returns the index of an element symbol in Elements
// (case-insensitive), or -1.
func (s *SpeciesSet) ElementIndex(symbol string) int {
	for e, el := range s.Elements {
		if strings.EqualFold(el, symbol) {
			return e
		}
	}
	return -1
}

// Atoms returns the number of atoms of element e (index into Elements) in
// one molecule of species k.
func (s *SpeciesSet) Atoms(k, e int) float64 { return s.atoms[k*len(s.Elements)+e] }

// ElementMoles writes into b the moles of each element (index into Elements)
// held by the species amounts n (mol): b_e = sum_k a_ek n_k.
func (s *SpeciesSet) ElementMoles(n, b []float64) {
	nE := len(s.Elements)
	for e := range b[:nE] {
		b[e] = 0
	}
	for k, nk := range n[:len(s.Species)] {
		if nk == 0 {
			continue
		}
		row := s.atoms[k*nE : (k+1)*nE]
		for e, a := range row {
			b[e] += a * nk
		}
	}
}

// ExcludeMask turns a list of species names into a mask over the set
// (true = excluded), for EquilibriumOptions.Exclude.
func (s *SpeciesSet) ExcludeMask(names []string) ([]bool, error) {
	mask := make([]bool, len(s.Species))
	for _, name := range names {
		k := s.Index(strings.TrimSpace(name))
		if k < 0 {
			return nil, fmt.Errorf("exclude: no species %q in the set", name)
		}
		mask[k] = true
	}
	return mask, nil
}

func (s *SpeciesSet) checkLen(what string, v []float64) error {
	if len(v) != len(s.Species) {
		return fmt.Errorf("%s has %d entries, the species set has %d species", what, len(v), len(s.Species))
	}
	return nil
}
