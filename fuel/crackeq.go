package fuel

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/optimize/convex/lp"

	"flame1d/internal/dense"
	"flame1d/thermo"
)

// Cracking holds the constrained equilibrium of one mole of fuel over a
// species set.
type Cracking struct {
	// Equilibrium is the state over the set's species (Moles in mol per mole
	// of fuel), straight from thermo.SpeciesSet.EquilibrateTP.
	Equilibrium *thermo.EquilibriumResult
	// Forced lists the allowed species held at zero because no combination
	// of allowed species holding the fuel's atoms contains them (the
	// fuel's composition lies on a face of the allowed species' cone:
	// e.g. an H/C = 2 fuel with ethylene the only species not richer in
	// hydrogen).
	Forced []string
}

// supportTolerance is the share of the fuel's atoms below which a species
// counts as unable to take part (linear-programming round-off).
const supportTolerance = 1e-10

// CrackingEquilibrium returns the state of least Gibbs energy of one mole
// of fuel f at temperature T (K) and pressure P (Pa) over the species of
// set that are not excluded (exclude: nil or one entry per species;
// condensed species such as graphite take part as pure phases). Species
// holding an element the fuel lacks take no part.
//
// Before the minimisation every allowed species k is tested by the linear
// program max n_k subject to sum_k a_ek n_k = b_e, n >= 0 (gonum's simplex
// method); a species whose maximum is zero cannot be present and is held
// at zero, since the ideal-gas Gibbs minimum would otherwise lie at
// infinity in log amounts. The minimisation itself is
// thermo.SpeciesSet.EquilibrateTP with the fuel's atoms supplied by an
// excluded carrier species.
func CrackingEquilibrium(set *thermo.SpeciesSet, f Formula, T, P float64, exclude []bool) (*Cracking, error) {
	if exclude != nil && len(exclude) != set.Len() {
		return nil, fmt.Errorf("cracking equilibrium: exclusion mask has %d entries for %d species", len(exclude), set.Len())
	}
	fuelElems := []string{"C", "H"}
	if f.O > 0 {
		fuelElems = append(fuelElems, "O")
	}
	for _, e := range fuelElems {
		if set.ElementIndex(e) < 0 {
			return nil, fmt.Errorf("cracking equilibrium: no species holds %s, which the fuel contains", e)
		}
	}
	n := set.Len()
	allowed := make([]bool, n)
	var cand []int
	for k := range set.Species {
		if exclude != nil && exclude[k] {
			continue
		}
		c, h, o, other := speciesAtoms(set.Species[k].Composition)
		if other || (o > 0 && f.O == 0) || c+h+o == 0 {
			continue
		}
		allowed[k] = true
		cand = append(cand, k)
	}
	if len(cand) == 0 {
		return nil, fmt.Errorf("cracking equilibrium: every species that could hold the fuel's atoms is walled off")
	}
	forcedIdx, err := zeroSupport(set, f, fuelElems, cand)
	if err != nil {
		return nil, err
	}
	out := &Cracking{}
	for _, k := range forcedIdx {
		allowed[k] = false
		out.Forced = append(out.Forced, set.Species[k].Name)
	}

	// Carrier of the fuel's atoms, excluded from the minimisation.
	species := append(append([]thermo.Species(nil), set.Species...), thermo.Species{
		Name:        carrierName(set),
		Composition: f.Composition(),
		Thermo:      set.Species[cand[0]].Thermo,
	})
	big, err := thermo.NewSpeciesSet(species)
	if err != nil {
		return nil, fmt.Errorf("cracking equilibrium: %w", err)
	}
	mask := make([]bool, n+1)
	for k := 0; k < n; k++ {
		mask[k] = !allowed[k]
	}
	mask[n] = true
	moles := make([]float64, n+1)
	moles[n] = 1
	res, err := big.EquilibrateTP(T, P, moles, thermo.EquilibriumOptions{Exclude: mask, Tolerance: 1e-13})
	if err != nil {
		return nil, fmt.Errorf("cracking equilibrium of %s at %g K, %g Pa: %w", f, T, P, err)
	}
	res.Moles = res.Moles[:n]
	res.MoleFractions = res.MoleFractions[:n]
	res.LnMoleFractions = res.LnMoleFractions[:n]
	if len(big.Elements) != len(set.Elements) {
		return nil, fmt.Errorf("cracking equilibrium: internal error: element list changed")
	}
	out.Equilibrium = res
	return out, nil
}

func carrierName(set *thermo.SpeciesSet) string {
	name := "fuel atoms"
	for set.Index(name) >= 0 {
		name += "'"
	}
	return name
}

// zeroSupport returns the candidate species that no non-negative
// combination of candidates holding exactly the fuel's atoms contains.
func zeroSupport(set *thermo.SpeciesSet, f Formula, elems []string, cand []int) ([]int, error) {
	nC := len(cand)
	// Independent element rows over the candidates (Gram-Schmidt).
	all := make([][]float64, len(elems))
	for i, e := range elems {
		v := make([]float64, nC)
		zero := true
		for j, k := range cand {
			v[j] = atomCount(set.Species[k].Composition, e)
			zero = zero && v[j] == 0
		}
		if zero {
			return nil, fmt.Errorf("cracking equilibrium: no allowed species holds %s, which the fuel contains; lift a wall", e)
		}
		all[i] = v
	}
	_, kept := dense.Orthonormalize(all, 1e-10)
	rows := make([][]float64, 0, len(kept))
	var b []float64
	var used []string
	for _, i := range kept {
		rows = append(rows, all[i])
		b = append(b, f.element(elems[i]))
		used = append(used, elems[i])
	}
	A := mat.NewDense(len(rows), nC, nil)
	for i, r := range rows {
		A.SetRow(i, r)
	}
	total := f.C + f.H + f.O
	feasible := func(x []float64) bool {
		for _, e := range elems {
			s := 0.0
			for j, k := range cand {
				s += atomCount(set.Species[k].Composition, e) * x[j]
			}
			if math.Abs(s-f.element(e)) > 1e-8*total {
				return false
			}
		}
		return true
	}
	var forced []int
	c := make([]float64, nC)
	for j, k := range cand {
		for i := range c {
			c[i] = 0
		}
		c[j] = -1
		_, x, err := lp.Simplex(c, A, b, 1e-12, nil)
		if errors.Is(err, lp.ErrInfeasible) || (err == nil && !feasible(x)) {
			return nil, infeasibleFuel(set, f, cand)
		}
		if err != nil {
			return nil, fmt.Errorf("cracking equilibrium: testing which species can take part (%s balances): %v", strings.Join(used, ", "), err)
		}
		atoms := 0.0
		for _, e := range elems {
			atoms += atomCount(set.Species[k].Composition, e)
		}
		if x[j]*atoms <= supportTolerance*total {
			forced = append(forced, k)
		}
	}
	return forced, nil
}

// infeasibleFuel explains why the allowed species cannot hold the fuel.
func infeasibleFuel(set *thermo.SpeciesSet, f Formula, cand []int) error {
	lo, hi := math.Inf(1), math.Inf(-1)
	var loName, hiName string
	for _, k := range cand {
		c, h, _, _ := speciesAtoms(set.Species[k].Composition)
		r := math.Inf(1)
		if c > 0 {
			r = h / c
		}
		if r < lo {
			lo, loName = r, set.Species[k].Name
		}
		if r > hi {
			hi, hiName = r, set.Species[k].Name
		}
	}
	return fmt.Errorf("cracking equilibrium: the allowed species cannot hold the fuel's atoms in its proportions: the fuel has H/C = %.4g but the allowed species range from H/C = %.4g (%s) to %.4g (%s); lift a wall so that a species on the other side of the fuel's H/C can take part",
		f.HToC(), lo, loName, hi, hiName)
}
