package study

import (
	"fmt"
	"maps"
	"math"
	"slices"

	"flame1d/flame"
	"flame1d/fuel"
)

// poolYieldStep is the relative change of a yield on each side of the
// central difference of the residual (1%: the residual is smooth in the
// yields, and the closure and the thermo fit are exact to far below it).
const poolYieldStep = 0.01

// poolYieldPerturbations returns, for a cracked-pool fuel, one perturbation
// per pool yield at condition c: the yield multiplied and divided by
// 1 + poolYieldStep, the element closure re-applied by the fuel's own rules
// (fuel.CloseYields: common scale and balance species) and the fuel
// resolved again at the same heating value, so the pseudo-fuel's thermo,
// the global step's products and the inlet all follow. An equilibrium pool
// is perturbed as the measured-yields pool of its own amounts (scale and
// balance species at their defaults). Yields whose perturbation the closure
// undoes (the balance species) have no coefficient.
func (s *Study) poolYieldPerturbations(c Condition) ([]flame.Perturbation, error) {
	if s.Fuel.Kind != fuel.CrackedPool || s.spec == nil {
		return nil, nil
	}
	base := s.spec.Cracking
	yields := base.Yields
	asYields := fuel.CrackingSpec{Method: fuel.MethodYields, Balance: base.Balance, ScaleToCarbon: base.ScaleToCarbon}
	if len(yields) == 0 {
		yields = map[string]float64{}
		for i, n := range s.Fuel.Pool.Species {
			if s.Fuel.Pool.Moles[i] > 0 {
				yields[n] = s.Fuel.Pool.Moles[i]
			}
		}
		asYields.Balance, asYields.ScaleToCarbon = nil, nil
	}
	side := func(name string, f float64) (flame.PerturbedProblem, []float64, error) {
		spec := *s.spec
		spec.Cracking = asYields
		spec.Cracking.Yields = maps.Clone(yields)
		spec.Cracking.Yields[name] *= f
		res, err := spec.Resolve(s.base, s.baseSet)
		if err != nil {
			return flame.PerturbedProblem{}, nil, err
		}
		in, err := res.Inlet(s.Case.Oxidizer, c.Phi, c.T)
		if err != nil {
			return flame.PerturbedProblem{}, nil, err
		}
		return flame.PerturbedProblem{Mechanism: res.Mechanism, Inlet: flame.Inlet{T: in.T, P: c.P, Y: in.Y}}, res.Pool.Moles, nil
	}
	var out []flame.Perturbation
	for _, name := range slices.Sorted(maps.Keys(yields)) {
		if !(yields[name] > 0) {
			continue
		}
		plus, moles, err := side(name, 1+poolYieldStep)
		if err != nil {
			return nil, fmt.Errorf("pool yield of %s raised by %g%%: %w", name, 100*poolYieldStep, err)
		}
		if sameAmounts(moles, s.Fuel.Pool.Moles) {
			continue
		}
		minus, _, err := side(name, 1/(1+poolYieldStep))
		if err != nil {
			return nil, fmt.Errorf("pool yield of %s lowered by %g%%: %w", name, 100*poolYieldStep, err)
		}
		out = append(out, flame.Perturbation{Name: name, Step: math.Log1p(poolYieldStep), Plus: plus, Minus: minus})
	}
	return out, nil
}

// sameAmounts reports whether two pools' amounts agree to 1e-8 relative: a
// perturbation moves them by about poolYieldStep, the closure's round-off
// by 1e-13.
func sameAmounts(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Abs(a[i]-b[i]) > 1e-8*math.Max(math.Abs(a[i]), math.Abs(b[i])) {
			return false
		}
	}
	return true
}
