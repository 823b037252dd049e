package thermo

import (
	"errors"
	"fmt"
	"math"

	"flame1d/internal/dense"
)

// EquilibriumOptions control EquilibrateTP, EquilibrateHP and AdiabaticFlame.
// The zero value is ready to use.
type EquilibriumOptions struct {
	// Exclude marks species held at zero amount (nil, or one entry per
	// species of the set). Their atoms in the initial mixture are
	// redistributed over the other species. See SpeciesSet.ExcludeMask.
	Exclude []bool
	// Tolerance is the convergence tolerance on every scaled residual:
	// relative element balance, gas-moles balance, condensed-phase
	// optimality and (HP) enthalpy balance per mole. Default 1e-12. In
	// nearly degenerate mixtures (one species holding two elements in the
	// very ratio of the mixture) round-off can keep a residual up to 1000
	// times Tolerance; such a state is accepted and its element residual
	// reported in EquilibriumResult.ElementResidual.
	Tolerance float64
	// MaxIterations bounds the Newton iterations of all stages. Default 1000.
	MaxIterations int
	// TGuess is the starting temperature of EquilibrateHP in K. Default
	// 2000 K.
	TGuess float64
}

// EquilibriumResult is an equilibrium state.
type EquilibriumResult struct {
	T float64 // temperature, K
	P float64 // pressure, Pa
	// Moles holds the amount of each species of the set, mol, on the scale
	// of the initial amounts passed in (the elements are the same). Gas
	// amounts below about 1e-308 times the total underflow to zero; their
	// logarithms are in LnMoleFractions.
	Moles []float64
	// MoleFractions are gas-phase mole fractions; zero for condensed
	// species.
	MoleFractions []float64
	// LnMoleFractions holds ln X_k for gas species, computed without
	// underflow; -Inf for excluded species, species containing an element
	// absent from the mixture, and condensed species.
	LnMoleFractions []float64
	// GasMoles is the total amount of gas, mol.
	GasMoles float64
	// ElementPotentials are the dimensionless element potentials λ_e/(RT),
	// one per element of the set: at equilibrium every gas species present
	// satisfies g°_k/RT + ln(X_k P/P°) = sum_e a_ek λ_e/(RT). -Inf for an
	// element absent from the mixture; 0 for an element whose balance
	// follows from the others' (its potential is then not unique).
	ElementPotentials []float64
	// Iterations is the number of Newton iterations taken.
	Iterations int
	// ElementResidual is max_e |sum_k a_ek n_k - b_e| / b_e over the
	// elements present.
	ElementResidual float64
}

// ErrNotConverged is wrapped by the error returned when an equilibrium
// calculation exhausts its iterations.
var ErrNotConverged = errors.New("equilibrium not converged")

// Limits of the temperature search in EquilibrateHP, K.
const (
	minEquilibriumTemperature = 100.0
	maxEquilibriumTemperature = 10000.0
)

// EquilibrateTP returns the chemical equilibrium of the initial amounts
// moles (mol per species of the set) at fixed temperature T (K) and
// pressure P (Pa): the state of least Gibbs energy
//
//	G/RT = sum_gas n_k [g°_k/RT + ln(n_k/n_gas) + ln(P/P°)] + sum_cond n_c g°_c/RT
//
// with the elements of the initial mixture conserved. The gas is ideal;
// condensed species are pure phases of unit activity that enter when their
// driving force g°_c/RT - sum_e a_ec λ_e/RT turns negative and leave when
// their amount would turn negative.
//
// The minimisation follows the Newton iteration of Gordon & McBride (1994,
// NASA RP-1311, secs. 2.2-2.5 and 3.1-3.6) in log moles, element potentials
// and log total gas moles, with its step control and phase inclusion test.
// Once that iteration has converged loosely, every gas amount is set
// exactly from the element potentials (the element-potential form of the
// optimality conditions, Reynolds 1986, "The element potential method for
// chemical equilibrium analysis: implementation in the interactive program
// STANJAN", Stanford Univ.) and the same Newton system is iterated in those
// unknowns alone to the requested tolerance, so the optimality conditions
// hold to round-off for every gas species, however small its amount.
func (s *SpeciesSet) EquilibrateTP(T, P float64, moles []float64, opt EquilibriumOptions) (*EquilibriumResult, error) {
	if !(T > 0) || math.IsInf(T, 0) {
		return nil, fmt.Errorf("equilibrium: temperature %g K must be positive and finite", T)
	}
	q, err := s.newEquilibrium(P, moles, opt)
	if err != nil {
		return nil, err
	}
	q.T = T
	if err := q.run(); err != nil {
		return nil, fmt.Errorf("equilibrium at %g K, %g Pa: %w", T, P, err)
	}
	return q.result(), nil
}

// EquilibrateHP returns the chemical equilibrium of the initial amounts
// moles at fixed specific enthalpy h (J per kg of mixture) and pressure P
// (Pa); the temperature is found with the composition, as in Gordon &
// McBride (1994, NASA RP-1311, sec. 2.5). See EquilibrateTP for the method.
func (s *SpeciesSet) EquilibrateHP(h, P float64, moles []float64, opt EquilibriumOptions) (*EquilibriumResult, error) {
	if math.IsNaN(h) || math.IsInf(h, 0) {
		return nil, fmt.Errorf("equilibrium: enthalpy %g J/kg is not finite", h)
	}
	q, err := s.newEquilibrium(P, moles, opt)
	if err != nil {
		return nil, err
	}
	q.hp = true
	q.T = 2000
	if opt.TGuess != 0 {
		if !(opt.TGuess >= minEquilibriumTemperature && opt.TGuess <= maxEquilibriumTemperature) {
			return nil, fmt.Errorf("equilibrium: starting temperature %g K outside [%g, %g] K",
				opt.TGuess, minEquilibriumTemperature, maxEquilibriumTemperature)
		}
		q.T = opt.TGuess
	}
	mass := 0.0
	for k, n := range moles {
		mass += n * s.MolarMass[k]
	}
	q.H0R = h * mass * q.scale / GasConstant
	if err := q.run(); err != nil {
		return nil, fmt.Errorf("equilibrium at %g J/kg, %g Pa: %w", h, P, err)
	}
	return q.result(), nil
}

// AdiabaticFlame returns the equilibrium reached at constant pressure P (Pa)
// and enthalpy by the initial amounts moles (mol per species) starting at
// temperature T0 (K): the adiabatic flame temperature and composition.
func (s *SpeciesSet) AdiabaticFlame(T0, P float64, moles []float64, opt EquilibriumOptions) (*EquilibriumResult, error) {
	if !(T0 > 0) || math.IsInf(T0, 0) {
		return nil, fmt.Errorf("adiabatic flame: initial temperature %g K must be positive and finite", T0)
	}
	if err := s.checkLen("initial moles", moles); err != nil {
		return nil, fmt.Errorf("adiabatic flame: %w", err)
	}
	H, mass := 0.0, 0.0
	for k, n := range moles {
		if n != 0 {
			H += n * s.Species[k].EnthalpyMole(T0)
			mass += n * s.MolarMass[k]
		}
	}
	if !(mass > 0) {
		return nil, fmt.Errorf("adiabatic flame: the initial mixture is empty")
	}
	return s.EquilibrateHP(H/mass, P, moles, opt)
}

// equilibrium is the working state of one equilibrium calculation. Gas
// species, condensed species and elements are the active subsets: species
// not excluded whose elements are all present, and a linearly independent
// set of the elements present.
type equilibrium struct {
	set     *SpeciesSet
	hp      bool
	tol     float64
	maxIter int
	P, lnP  float64
	T       float64
	H0R     float64 // target total enthalpy / R, K mol (scaled amounts)
	scale   float64 // internal amounts = given amounts * scale
	bAll    []float64
	elem    []int     // independent present elements (indices into set.Elements)
	b       []float64 // their element amounts
	gas     []int     // active gas species
	ag      []float64 // atoms, ag[j*nE+i] for gas j, element elem[i]
	cond    []int     // candidate condensed species
	ac      []float64 // atoms, ac[c*nE+i]
	present []bool    // condensed species in the current phase set
	lnn, n  []float64 // gas log amounts and amounts
	// liftFloor[j] is ln(1e-8 min_e b_e/a_ej) over the elements of gas j:
	// an amount small against every element it holds.
	liftFloor []float64
	nc        []float64 // condensed amounts
	lnN       float64   // log of the total-gas-moles variable
	pi        []float64 // element potentials λ/RT of elem
	g, h, cp  []float64 // gas g°/RT, h/RT, cp/R at T
	gc, hc    []float64 // condensed g°/RT, h/RT
	cpc       []float64 // condensed cp/R
	mu        []float64 // gas μ/RT
	dlnn      []float64
	// Newton solution: new element potentials, condensed changes, Δln n_gas, Δln T.
	piNew, dnc []float64
	dlnN, dlnT float64
	mat, rhs   []float64
	mat0, rhs0 []float64 // copies for the truncated retry
	lin        dense.Solver
	// truncated selects the truncated symmetric solve for every Newton
	// system (see dense.Solver.SolveSymmetricTruncated).
	truncated bool
	// potentialStage is set during the element-potential stage, where a
	// singular matrix falls back to the truncated solve.
	potentialStage bool
	iter           int
	phaseChange    int
}

func (s *SpeciesSet) newEquilibrium(P float64, moles []float64, opt EquilibriumOptions) (*equilibrium, error) {
	if !(P > 0) || math.IsInf(P, 0) {
		return nil, fmt.Errorf("equilibrium: pressure %g Pa must be positive and finite", P)
	}
	if err := s.checkLen("equilibrium: initial moles", moles); err != nil {
		return nil, err
	}
	if opt.Exclude != nil && len(opt.Exclude) != len(s.Species) {
		return nil, fmt.Errorf("equilibrium: exclusion mask has %d entries, the species set has %d species", len(opt.Exclude), len(s.Species))
	}
	total := 0.0
	for k, n := range moles {
		if n < 0 || math.IsNaN(n) || math.IsInf(n, 0) {
			return nil, fmt.Errorf("equilibrium: initial amount of %s is %g mol", s.Species[k].Name, n)
		}
		total += n
	}
	if !(total > 0) {
		return nil, fmt.Errorf("equilibrium: the initial mixture is empty")
	}
	q := &equilibrium{set: s, P: P, lnP: math.Log(P / StandardPressure), scale: 1 / total,
		tol: opt.Tolerance, maxIter: opt.MaxIterations}
	if q.tol <= 0 {
		q.tol = 1e-12
	}
	if q.maxIter <= 0 {
		q.maxIter = 1000
	}
	nAll := len(s.Elements)
	q.bAll = make([]float64, nAll)
	for k, n := range moles {
		for e := 0; e < nAll; e++ {
			q.bAll[e] += s.atoms[k*nAll+e] * n * q.scale
		}
	}
	// Active species: not excluded, every element present.
	var active []int
	for k := range s.Species {
		if opt.Exclude != nil && opt.Exclude[k] {
			continue
		}
		ok := true
		for e := 0; e < nAll; e++ {
			if s.atoms[k*nAll+e] > 0 && !(q.bAll[e] > 0) {
				ok = false
				break
			}
		}
		if ok {
			active = append(active, k)
		}
	}
	for e := 0; e < nAll; e++ {
		if !(q.bAll[e] > 0) {
			continue
		}
		carried := false
		for _, k := range active {
			if s.atoms[k*nAll+e] > 0 {
				carried = true
				break
			}
		}
		if !carried {
			return nil, fmt.Errorf("equilibrium: element %s is in the mixture but every species containing it is excluded", s.Elements[e])
		}
	}
	q.elem = independentElements(s, active, q.bAll)
	nE := len(q.elem)
	q.b = make([]float64, nE)
	for i, e := range q.elem {
		q.b[i] = q.bAll[e]
	}
	for _, k := range active {
		if s.gas[k] {
			q.gas = append(q.gas, k)
		} else {
			q.cond = append(q.cond, k)
		}
	}
	if len(q.gas) == 0 {
		return nil, fmt.Errorf("equilibrium: no gas species can take part")
	}
	q.ag = make([]float64, len(q.gas)*nE)
	for j, k := range q.gas {
		for i, e := range q.elem {
			q.ag[j*nE+i] = s.atoms[k*nAll+e]
		}
	}
	q.liftFloor = make([]float64, len(q.gas))
	for j := range q.gas {
		f := math.Inf(1)
		for i := 0; i < nE; i++ {
			if a := q.ag[j*nE+i]; a > 0 {
				f = math.Min(f, q.b[i]/a)
			}
		}
		q.liftFloor[j] = math.Log(1e-8 * f)
	}
	q.ac = make([]float64, len(q.cond)*nE)
	for c, k := range q.cond {
		for i, e := range q.elem {
			q.ac[c*nE+i] = s.atoms[k*nAll+e]
		}
	}
	nG, nC := len(q.gas), len(q.cond)
	q.lnn, q.n, q.g, q.h, q.cp, q.mu, q.dlnn = make([]float64, nG), make([]float64, nG),
		make([]float64, nG), make([]float64, nG), make([]float64, nG), make([]float64, nG), make([]float64, nG)
	q.nc, q.gc, q.hc, q.cpc, q.dnc, q.present = make([]float64, nC), make([]float64, nC),
		make([]float64, nC), make([]float64, nC), make([]float64, nC), make([]bool, nC)
	q.pi, q.piNew = make([]float64, nE), make([]float64, nE)
	m := nE + nC + 2
	q.mat, q.rhs = make([]float64, m*m), make([]float64, m)
	q.mat0, q.rhs0 = make([]float64, m*m), make([]float64, m)
	// Starting point of Gordon & McBride (1994, sec. 3.1): equal amounts of
	// every gas species, total gas moles 0.1 per unit of initial moles
	// (their 0.1 per kg is of the same order).
	q.lnN = math.Log(0.1)
	for j := range q.lnn {
		q.lnn[j] = q.lnN - math.Log(float64(nG))
	}
	return q, nil
}

// independentElements returns the present elements whose rows of the
// element matrix (over the active species) are linearly independent, by
// Gram-Schmidt in declaration order.
func independentElements(s *SpeciesSet, active []int, b []float64) []int {
	nAll := len(s.Elements)
	var rows [][]float64
	var present []int
	for e := 0; e < nAll; e++ {
		if !(b[e] > 0) {
			continue
		}
		v := make([]float64, len(active))
		for j, k := range active {
			v[j] = s.atoms[k*nAll+e]
		}
		rows = append(rows, v)
		present = append(present, e)
	}
	_, kept := dense.Orthonormalize(rows, 1e-10)
	keep := make([]int, len(kept))
	for i, r := range kept {
		keep[i] = present[r]
	}
	return keep
}

func (q *equilibrium) updateThermo() {
	T := q.T
	for j, k := range q.gas {
		p := &q.set.Species[k].Thermo
		q.h[j] = p.HRT(T)
		q.g[j] = q.h[j] - p.SR(T)
		q.cp[j] = p.CpR(T)
	}
	for c, k := range q.cond {
		p := &q.set.Species[k].Thermo
		q.hc[c] = p.HRT(T)
		q.gc[c] = q.hc[c] - p.SR(T)
		q.cpc[c] = p.CpR(T)
	}
}

// newtonSystem assembles and solves the Newton system of Gordon & McBride
// (1994, eqs. 2.24-2.27 with the Δln T terms of eqs. 2.44-2.47) for the
// current amounts q.n, q.nc and chemical potentials q.mu. The unknowns are
// the new element potentials, the changes of the present condensed amounts,
// Δln n_gas and (HP) Δln T.
func (q *equilibrium) newtonSystem() error {
	nE := len(q.elem)
	var cols []int // present condensed
	for c := range q.cond {
		if q.present[c] {
			cols = append(cols, c)
		}
	}
	nP := len(cols)
	iN := nE + nP
	m := iN + 1
	iT := -1
	if q.hp {
		iT = m
		m++
	}
	M, r := q.mat[:m*m], q.rhs[:m]
	for i := range M {
		M[i] = 0
	}
	for i := range r {
		r[i] = 0
	}
	N := math.Exp(q.lnN)
	sumN, sumNH, sumNMu, sumNHMu, sumNHH, sumNCp := 0.0, 0.0, 0.0, 0.0, 0.0, 0.0
	for j := range q.gas {
		nj := q.n[j]
		if nj == 0 {
			continue
		}
		a := q.ag[j*nE : (j+1)*nE]
		hj, muj := q.h[j], q.mu[j]
		for i, ai := range a {
			if ai == 0 {
				continue
			}
			w := ai * nj
			row := M[i*m : i*m+nE]
			for k, ak := range a {
				row[k] += w * ak
			}
			M[i*m+iN] += w
			r[i] += w*muj - w
			if q.hp {
				M[i*m+iT] += w * hj
			}
		}
		sumN += nj
		sumNMu += nj * muj
		if q.hp {
			sumNH += nj * hj
			sumNHMu += nj * hj * muj
			sumNHH += nj * hj * hj
			sumNCp += nj * q.cp[j]
		}
	}
	for i := 0; i < nE; i++ {
		r[i] += q.b[i]
		for c := range q.cond {
			r[i] -= q.ac[c*nE+i] * q.nc[c]
		}
		for p, c := range cols {
			M[i*m+nE+p] = q.ac[c*nE+i]
		}
	}
	for p, c := range cols {
		row := M[(nE+p)*m : (nE+p+1)*m]
		copy(row[:nE], q.ac[c*nE:(c+1)*nE])
		r[nE+p] = q.gc[c]
		if q.hp {
			row[iT] = q.hc[c]
		}
	}
	// Gas-moles row: symmetric with the Δln n column of the element rows.
	for k := 0; k < nE; k++ {
		M[iN*m+k] = M[k*m+iN]
	}
	M[iN*m+iN] = sumN - N
	r[iN] = N - sumN + sumNMu
	if q.hp {
		M[iN*m+iT] = sumNH
		for k := 0; k < nE; k++ {
			M[iT*m+k] = M[k*m+iT]
		}
		H := sumNH
		cpTot := sumNCp
		for c := range q.cond {
			H += q.nc[c] * q.hc[c]
			cpTot += q.nc[c] * q.cpc[c]
		}
		for p, c := range cols {
			M[iT*m+nE+p] = q.hc[c]
		}
		M[iT*m+iN] = sumNH
		M[iT*m+iT] = cpTot + sumNHH
		r[iT] = q.H0R/q.T - H + sumNHMu
	}
	if q.truncated {
		if err := q.lin.SolveSymmetricTruncated(M, r, m, truncationRcond); err != nil {
			return err
		}
	} else {
		M0, r0 := q.mat0[:m*m], q.rhs0[:m]
		copy(M0, M)
		copy(r0, r)
		if err := q.lin.Solve(M, r, m, maxCondition); err != nil {
			if !q.potentialStage {
				return err
			}
			copy(M, M0)
			copy(r, r0)
			if err := q.lin.SolveSymmetricTruncated(M, r, m, truncationRcond); err != nil {
				return err
			}
		}
	}
	copy(q.piNew, r[:nE])
	for c := range q.dnc {
		q.dnc[c] = 0
	}
	for p, c := range cols {
		q.dnc[c] = r[nE+p]
	}
	q.dlnN = r[iN]
	q.dlnT = 0
	if q.hp {
		q.dlnT = r[iT]
	}
	for _, v := range r[:m] {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return dense.ErrSingular
		}
	}
	return nil
}

// maxCondition is the estimated condition number (of the row-equilibrated
// matrix) at which an equilibrium Newton matrix counts as singular in
// floating point: about 1/ε of float64. Columns of the matrix differ by
// up to ten decades (element potentials against ln n and ln T), which the
// estimate includes; a smaller limit refuses regular systems.
const maxCondition = 1e16

// truncationRcond is the relative eigenvalue below which a direction of the
// scaled Newton matrix is treated as null: 1e-12 keeps every direction that
// double precision resolves after the scaling (common practice, no source).
const truncationRcond = 1e-12

// Gordon & McBride (1994, sec. 3.3): species with ln(n_j/n) below -size are
// "trace" for step control; a trace species may not be raised above a mole
// fraction of 1e-4 (ln = -9.2103404) in one step.
const (
	traceSize      = 18.420681
	traceCeilingLn = 9.2103404
	lnFloor        = 690.8 // -ln 1e-300
	// maxLogDecrease caps how far one free-amount step may lower a species'
	// log amount. An uncapped step can push a species that belongs in the
	// equilibrium (the excess O2 of a lean mixture) to 1e-300, where it
	// drops out of the Newton matrix and its element's row becomes
	// dependent. e^-20 = 2e-9 per step still lets trace species fall fast.
	maxLogDecrease = 20.0
	// maxLifts is the number of trace-species lifts after which the
	// free-amount stage switches to the truncated solve.
	maxLifts = 10
)

func (q *equilibrium) computeMu() {
	for j := range q.gas {
		q.n[j] = math.Exp(q.lnn[j])
		q.mu[j] = q.g[j] + q.lnn[j] - q.lnN + q.lnP
	}
}

// gordonMcBride runs the free-amount Newton iteration until its own
// convergence test passes with tolerance tol (Gordon & McBride 1994,
// sec. 3.6: n_j |Δln n_j| / sum n <= tol and the like).
func (q *equilibrium) gordonMcBride(tol float64) error {
	nE := len(q.elem)
	q.truncated = false
	atLimit := 0 // iterations spent at a temperature limit
	lifts := 0
	for ; q.iter < q.maxIter; q.iter++ {
		if q.T == maxEquilibriumTemperature || q.T == minEquilibriumTemperature {
			if atLimit++; atLimit >= 10 {
				return fmt.Errorf("equilibrium temperature reached the search limit %g K: enthalpy out of range", q.T)
			}
		}
		q.updateThermo()
		q.computeMu()
		if err := q.newtonSystem(); err != nil {
			// Species that belong in the equilibrium were driven so low on
			// the way that their elements' rows became dependent (a lean
			// mixture whose excess O2 was consumed while the iterate was
			// rich and hot). Raise every trace species to 1e-8 of the
			// scarcest of its elements and go on; the iteration lowers the
			// others again. The iteration limit bounds the lifts.
			if lifts++; lifts == maxLifts && !q.truncated {
				// What remains is a direction fixed only by trace amounts
				// far below round-off of the majors: leave it alone.
				q.truncated = true
				continue
			}
			for j := range q.lnn {
				q.lnn[j] = math.Max(q.lnn[j], q.liftFloor[j])
			}
			continue
		}
		copy(q.pi, q.piNew)
		sumN := 0.0
		for j := range q.gas {
			sumN += q.n[j]
		}
		big := math.Max(5*math.Abs(q.dlnT), 5*math.Abs(q.dlnN))
		lambda2 := 1.0
		converged := math.Abs(q.dlnN)*math.Exp(q.lnN) <= tol*sumN && math.Abs(q.dlnT) <= tol
		for j := range q.gas {
			d := -q.mu[j] + q.dlnN + q.dlnT*q.h[j]
			for i, a := range q.ag[j*nE : (j+1)*nE] {
				d += a * q.pi[i]
			}
			q.dlnn[j] = d
			rel := q.lnn[j] - q.lnN
			if rel > -traceSize {
				if d > 0 {
					big = math.Max(big, d)
				}
			} else if d >= 0 && d-q.dlnN > 0 {
				lambda2 = math.Min(lambda2, math.Abs((-rel-traceCeilingLn)/(d-q.dlnN)))
			}
			if q.n[j]*math.Abs(d) > tol*sumN {
				converged = false
			}
		}
		for c := range q.cond {
			if q.present[c] && math.Abs(q.dnc[c]) > tol*sumN {
				converged = false
			}
		}
		if converged && q.elementBalanceOK(1e3*tol) {
			return nil
		}
		lambda := 1.0
		if big > 2 {
			lambda = 2 / big
		}
		lambda = math.Min(lambda, lambda2)
		if removed := q.applyCondensedStep(lambda); removed {
			continue
		}
		q.lnN += lambda * q.dlnN
		for j := range q.gas {
			// Keep n_j/n above 1e-300 so that no amount underflows to zero
			// and drops its elements from the Newton matrix; the
			// element-potential stage sets the true value.
			q.lnn[j] = math.Max(q.lnn[j]+math.Max(lambda*q.dlnn[j], -maxLogDecrease), q.lnN-lnFloor)
		}
		q.setT(q.T * math.Exp(lambda*q.dlnT))
	}
	return fmt.Errorf("%w after %d iterations (free-amount stage)", ErrNotConverged, q.iter)
}

// setT moves the temperature, held inside the search limits.
func (q *equilibrium) setT(T float64) {
	q.T = math.Min(math.Max(T, minEquilibriumTemperature), maxEquilibriumTemperature)
}

// applyCondensedStep advances the present condensed amounts by lambda times
// their Newton change. A condensed species whose amount would become
// negative leaves the phase set instead (Gordon & McBride 1994, sec. 3.5);
// it reports whether that happened, in which case nothing was changed.
func (q *equilibrium) applyCondensedStep(lambda float64) bool {
	for c := range q.cond {
		if q.present[c] && q.nc[c]+lambda*q.dnc[c] < 0 {
			q.present[c] = false
			q.nc[c] = 0
			q.phaseChange++
			return true
		}
	}
	for c := range q.cond {
		if q.present[c] {
			q.nc[c] += lambda * q.dnc[c]
		}
	}
	return false
}

// elementBalanceOK reports whether every independent element balance holds
// to the relative tolerance tol.
func (q *equilibrium) elementBalanceOK(tol float64) bool {
	for i := range q.elem {
		if !(math.Abs(q.elementExcess(i)) <= tol*q.b[i]) {
			return false
		}
	}
	return true
}

// elementExcess returns sum_j a_ij n_j + sum_c a_ic n_c - b_i for the
// independent element i.
func (q *equilibrium) elementExcess(i int) float64 {
	nE := len(q.elem)
	s := -q.b[i]
	for j := range q.gas {
		s += q.ag[j*nE+i] * q.n[j]
	}
	for c := range q.cond {
		s += q.ac[c*nE+i] * q.nc[c]
	}
	return s
}

// fromPotentials sets every gas amount from the element potentials, the
// gas-moles variable and T: ln n_j = ln n + sum_i a_ij π_i - g°_j/RT - ln(P/P°).
func (q *equilibrium) fromPotentials() {
	nE := len(q.elem)
	q.updateThermo()
	for j := range q.gas {
		v := q.lnN - q.g[j] - q.lnP
		for i, a := range q.ag[j*nE : (j+1)*nE] {
			v += a * q.pi[i]
		}
		q.lnn[j] = v
		q.n[j] = math.Exp(v)
		q.mu[j] = q.g[j] + v - q.lnN + q.lnP
	}
}

// residual returns the largest scaled residual of the element-potential
// form and its sum of squares.
func (q *equilibrium) residual() (worst, sq float64) {
	nE := len(q.elem)
	add := func(v float64) {
		if math.IsNaN(v) {
			v = math.Inf(1)
		}
		worst = math.Max(worst, math.Abs(v))
		sq += v * v
	}
	sumN, H, nTot := 0.0, 0.0, 0.0
	for j := range q.gas {
		sumN += q.n[j]
		H += q.n[j] * q.h[j]
	}
	nTot = sumN
	for i := 0; i < nE; i++ {
		add(q.elementExcess(i) / q.b[i])
	}
	N := math.Exp(q.lnN)
	add((sumN - N) / N)
	for c := range q.cond {
		nTot += q.nc[c]
		H += q.nc[c] * q.hc[c]
		if q.present[c] {
			d := q.gc[c]
			for i, a := range q.ac[c*nE : (c+1)*nE] {
				d -= a * q.pi[i]
			}
			add(d)
		}
	}
	if q.hp {
		add((H - q.H0R/q.T) / nTot)
	}
	return worst, sq
}

// roundOffFactor: a state whose residuals stay between Tolerance and
// roundOffFactor*Tolerance although no Newton step (full or truncated) can
// reduce them is limited by round-off and is accepted.
const roundOffFactor = 1000

// errStalled reports that the element-potential Newton iteration could not
// reduce its residual.
var errStalled = errors.New("element-potential iteration stalled")

// elementPotential iterates Newton's method on the element potentials, the
// gas-moles variable, the condensed amounts and (HP) T, with every gas
// amount given by fromPotentials, until every scaled residual is below
// q.tol. Steps are halved until the residual norm decreases.
func (q *equilibrium) elementPotential() error {
	nE := len(q.elem)
	pi0 := make([]float64, nE)
	nc0 := make([]float64, len(q.cond))
	dpi := make([]float64, nE)
	dnc := make([]float64, len(q.cond))
	q.potentialStage = true
	defer func() { q.potentialStage = false }()
	q.fromPotentials()
	worst, sq := q.residual()
	for ; q.iter < q.maxIter; q.iter++ {
		if worst <= q.tol {
			return nil
		}
		if err := q.newtonSystem(); err != nil {
			return errStalled
		}
		copy(pi0, q.pi)
		copy(nc0, q.nc)
		lnN0, T0 := q.lnN, q.T
		for i := range dpi {
			dpi[i] = q.piNew[i] - q.pi[i]
		}
		copy(dnc, q.dnc)
		dlnN, dlnT := q.dlnN, q.dlnT
		// The temperature step is bounded as in the free-amount stage.
		alpha := 1.0
		if 5*math.Abs(dlnT) > 2 {
			alpha = 2 / (5 * math.Abs(dlnT))
		}
		accepted := false
		for try := 0; try < 40; try++ {
			for i := range q.pi {
				q.pi[i] = pi0[i] + alpha*dpi[i]
			}
			q.lnN = lnN0 + alpha*dlnN
			q.T = T0 * math.Exp(alpha*dlnT)
			negative := -1
			for c := range q.cond {
				q.nc[c] = nc0[c]
				if q.present[c] {
					q.nc[c] += alpha * dnc[c]
					if q.nc[c] < 0 {
						negative = c
					}
				}
			}
			if negative >= 0 && try == 0 {
				// A condensed phase wants to vanish: drop it and let the
				// free-amount stage re-converge the rest.
				q.present[negative] = false
				q.nc[negative] = 0
				q.phaseChange++
				q.fromPotentials()
				return errStalled
			}
			if negative >= 0 || q.T < minEquilibriumTemperature || q.T > maxEquilibriumTemperature {
				alpha *= 0.5
				continue
			}
			q.fromPotentials()
			w, s2 := q.residual()
			if s2 < (1-1e-4*alpha)*sq || w <= q.tol {
				worst, sq = w, s2
				accepted = true
				break
			}
			alpha *= 0.5
		}
		if !accepted {
			copy(q.pi, pi0)
			copy(q.nc, nc0)
			q.lnN, q.T = lnN0, T0
			q.fromPotentials()
			if !q.truncated {
				// Retry the iteration with null directions of the Newton
				// matrix dropped.
				q.truncated = true
				q.iter--
				continue
			}
			if worst <= roundOffFactor*q.tol {
				// Round-off in the majors' amounts, not the iteration, is
				// what is left.
				return nil
			}
			return errStalled
		}
	}
	return fmt.Errorf("%w after %d iterations (largest scaled residual %.3g)", ErrNotConverged, q.iter, worst)
}

// inclusionCandidate returns the absent condensed species with the most
// negative driving force g°_c/RT - sum_i a_ic π_i below -tol, or -1
// (Gordon & McBride 1994, sec. 3.5).
func (q *equilibrium) inclusionCandidate(tol float64) int {
	nE := len(q.elem)
	best, arg := -tol, -1
	for c := range q.cond {
		if q.present[c] {
			continue
		}
		d := q.gc[c]
		for i, a := range q.ac[c*nE : (c+1)*nE] {
			d -= a * q.pi[i]
		}
		if d < best {
			best, arg = d, c
		}
	}
	return arg
}

// maxPhaseChanges bounds how often condensed species may enter or leave
// before the calculation is declared cycling.
const maxPhaseChanges = 50

func (q *equilibrium) run() error {
	stageTol := 1e-5 // Gordon & McBride (1994, sec. 3.6) use 0.5e-5
	for stalls := 0; ; {
		if err := q.gordonMcBride(stageTol); err != nil {
			return err
		}
		err := q.elementPotential()
		if errors.Is(err, errStalled) {
			stalls++
			if stalls > 20 {
				return fmt.Errorf("%w: the element-potential iteration stalled %d times", ErrNotConverged, stalls)
			}
			if q.phaseChange > maxPhaseChanges {
				return fmt.Errorf("%w: condensed phases keep entering and leaving", ErrNotConverged)
			}
			stageTol = math.Max(stageTol*0.01, 1e-11)
			continue
		}
		if err != nil {
			return err
		}
		if q.hp && (q.T <= minEquilibriumTemperature || q.T >= maxEquilibriumTemperature) {
			return fmt.Errorf("equilibrium temperature reached the search limit %g K: enthalpy out of range", q.T)
		}
		c := q.inclusionCandidate(1e-9)
		if c < 0 {
			return nil
		}
		q.present[c] = true
		q.phaseChange++
		if q.phaseChange > maxPhaseChanges {
			return fmt.Errorf("%w: condensed phases keep entering and leaving", ErrNotConverged)
		}
		stageTol = 1e-5
	}
}

func (q *equilibrium) result() *EquilibriumResult {
	s := q.set
	nS, nAll := len(s.Species), len(s.Elements)
	res := &EquilibriumResult{
		T: q.T, P: q.P, Iterations: q.iter,
		Moles: make([]float64, nS), MoleFractions: make([]float64, nS), LnMoleFractions: make([]float64, nS),
		ElementPotentials: make([]float64, nAll),
	}
	for k := range res.LnMoleFractions {
		res.LnMoleFractions[k] = math.Inf(-1)
	}
	sumN := 0.0
	for j := range q.gas {
		sumN += q.n[j]
	}
	lnSum := math.Log(sumN)
	for j, k := range q.gas {
		res.Moles[k] = q.n[j] / q.scale
		res.MoleFractions[k] = q.n[j] / sumN
		res.LnMoleFractions[k] = q.lnn[j] - lnSum
	}
	for c, k := range q.cond {
		res.Moles[k] = q.nc[c] / q.scale
	}
	res.GasMoles = sumN / q.scale
	for e := range res.ElementPotentials {
		if !(q.bAll[e] > 0) {
			res.ElementPotentials[e] = math.Inf(-1)
		}
	}
	for i, e := range q.elem {
		res.ElementPotentials[e] = q.pi[i]
	}
	// Element balance over every element present, including dependent ones.
	for e := 0; e < nAll; e++ {
		if !(q.bAll[e] > 0) {
			continue
		}
		sum := 0.0
		for k, n := range res.Moles {
			sum += s.atoms[k*nAll+e] * n * q.scale
		}
		res.ElementResidual = math.Max(res.ElementResidual, math.Abs(sum-q.bAll[e])/q.bAll[e])
	}
	return res
}
