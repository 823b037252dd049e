package mechtoml

import (
	"fmt"
	"reflect"

	"flame1d/chem"
)

// Diff compares two mechanisms field by field, ignoring Origin positions
// and the difference between nil and empty maps or slices, and describes
// the first difference found ("" when they are the same). It is the
// equality of the round trip Write -> Read.
func Diff(a, b *chem.Mechanism) string {
	if a.Name != b.Name {
		return fmt.Sprintf("name %q vs %q", a.Name, b.Name)
	}
	if a.Description != b.Description {
		return fmt.Sprintf("description %q vs %q", a.Description, b.Description)
	}
	if !reflect.DeepEqual(emptyNil(a.Elements), emptyNil(b.Elements)) {
		return fmt.Sprintf("elements %v vs %v", a.Elements, b.Elements)
	}
	if len(a.Species) != len(b.Species) {
		return fmt.Sprintf("%d vs %d species", len(a.Species), len(b.Species))
	}
	if len(a.Reactions) != len(b.Reactions) {
		return fmt.Sprintf("%d vs %d reactions", len(a.Reactions), len(b.Reactions))
	}
	for i := range a.Species {
		sa, sb := normalSpecies(a.Species[i]), normalSpecies(b.Species[i])
		if !reflect.DeepEqual(sa, sb) {
			return fmt.Sprintf("species %d (%s): %+v (transport %+v) vs %+v (transport %+v)",
				i+1, sa.Name, sa.Species, sa.Transport, sb.Species, sb.Transport)
		}
	}
	for i := range a.Reactions {
		ra, rb := normalReaction(a.Reactions[i]), normalReaction(b.Reactions[i])
		if !reflect.DeepEqual(ra, rb) {
			return fmt.Sprintf("reaction %d (%s): %s vs %s", i+1, ra.Equation, describe(&ra), describe(&rb))
		}
	}
	return ""
}

func emptyNil[T any](s []T) []T {
	if len(s) == 0 {
		return nil
	}
	return s
}

func emptyNilMap[K comparable, V any](m map[K]V) map[K]V {
	if len(m) == 0 {
		return nil
	}
	return m
}

func normalSpecies(s chem.Species) chem.Species {
	s.Origin = chem.Position{}
	s.Composition = emptyNilMap(s.Composition)
	return s
}

func normalReaction(r chem.Reaction) chem.Reaction {
	r.Origin = chem.Position{}
	r.Reactants, r.Products = emptyNil(r.Reactants), emptyNil(r.Products)
	r.Orders, r.ReverseOrders = emptyNilMap(r.Orders), emptyNilMap(r.ReverseOrders)
	r.PressureRates = emptyNil(r.PressureRates)
	if r.ThirdBody != nil {
		tb := *r.ThirdBody
		tb.Efficiencies = emptyNilMap(tb.Efficiencies)
		r.ThirdBody = &tb
	}
	return r
}

// describe writes a reaction with the contents of its pointers.
func describe(r *chem.Reaction) string {
	s := fmt.Sprintf("%+v", *r)
	if r.ThirdBody != nil {
		s += fmt.Sprintf(" third body %+v", *r.ThirdBody)
	}
	if f := r.FalloffRate; f != nil {
		s += fmt.Sprintf(" falloff %+v", *f)
		if f.Troe != nil {
			s += fmt.Sprintf(" troe %+v", *f.Troe)
		}
		if f.SRI != nil {
			s += fmt.Sprintf(" sri %+v", *f.SRI)
		}
	}
	if r.ChebyshevRate != nil {
		s += fmt.Sprintf(" chebyshev %+v", *r.ChebyshevRate)
	}
	if r.ReverseRate != nil {
		s += fmt.Sprintf(" reverse %+v", *r.ReverseRate)
	}
	return s
}
