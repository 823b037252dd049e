package flame

import (
	"fmt"
	"math"
	"slices"
	"testing"

	"flame1d/builtin"
	"flame1d/newton"
	"flame1d/thermo"
)

// builtinSolver builds the solver of a built-in mechanism.
func builtinSolver(t *testing.T, name string) *Solver {
	t.Helper()
	m, err := builtin.Mechanism(name)
	if err != nil {
		t.Fatal(err)
	}
	s, err := NewSolver(m)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// hydrogenSolver builds the solver of the Burke et al. (2012) H2/O2
// mechanism and a stoichiometric H2/air inlet at 298 K and 1 atm.
func hydrogenSolver(t *testing.T) (*Solver, Inlet) {
	t.Helper()
	s := builtinSolver(t, "burke2012-hydrogen")
	return s, stoichiometricAir(t, s, "H2")
}

// The Newton Jacobian (finite differences with transport properties and
// production rates frozen, plus analytic chemistry) equals a plain
// finite-difference Jacobian of the residual with only the transport
// properties frozen: the analytic chemistry blocks and the assembly are
// exact. Checked on the start-up profiles of H2/air, where every term is
// active. Forward differences with a relative step 1e-7 are good to about
// 1e-6 of a row's scale (Dennis & Schnabel 1996, §5.4); the test allows
// 1e-4 of the largest entry of each row.
func TestJacobianAgainstFiniteDifferences(t *testing.T) {
	s, in := hydrogenSolver(t)
	eq, err := adiabaticEquilibrium(s.ph, in)
	if err != nil {
		t.Fatal(err)
	}
	set := withDefaults(Settings{InitialPoints: 16})
	g, err := s.initialGuess(in, eq, set, 1)
	if err != nil {
		t.Fatal(err)
	}
	pr := s.problemFor(g, set)
	n, b := pr.n, pr.b
	J := newton.NewBlockTridiagonal(n, b)
	f0 := make([]float64, n*b)
	if err := pr.Jacobian(g.U, f0, J); err != nil {
		t.Fatal(err)
	}
	// Reference: transport frozen at the same state, chemistry live.
	if err := pr.Residual(g.U, f0); err != nil {
		t.Fatal(err)
	}
	ref := newton.NewBlockTridiagonal(n, b)
	err = newton.FiniteDifferenceJacobian(pr.residualWith(evaluation{transportFrozen: true}), g.U, f0, ref, 1e-7, 1e-12)
	if err != nil {
		t.Fatal(err)
	}
	worst, at := 0.0, ""
	for j := 0; j < n; j++ {
		blocks := [][2][]float64{{J.DiagBlock(j), ref.DiagBlock(j)}}
		if j > 0 {
			blocks = append(blocks, [2][]float64{J.LowerBlock(j), ref.LowerBlock(j)})
		}
		if j < n-1 {
			blocks = append(blocks, [2][]float64{J.UpperBlock(j), ref.UpperBlock(j)})
		}
		for r := 0; r < b; r++ {
			scale := 0.0
			for _, bl := range blocks {
				for c := 0; c < b; c++ {
					scale = math.Max(scale, math.Abs(bl[1][r*b+c]))
				}
			}
			for bi, bl := range blocks {
				for c := 0; c < b; c++ {
					if d := math.Abs(bl[0][r*b+c]-bl[1][r*b+c]) / scale; d > worst {
						worst = d
						at = fmt.Sprintf("%s block of point %d, row %d, column %d", [...]string{"diagonal", "lower", "upper"}[bi], j, r, c)
					}
				}
			}
		}
	}
	t.Logf("largest difference %.3g of the row scale (%s)", worst, at)
	if worst > 1e-4 {
		t.Errorf("Jacobian differs from finite differences by %.3g of the row scale at %s (> 1e-4)", worst, at)
	}
}

// Discrete conservation of total enthalpy: at a converged flame the flux
//
//	E_{j+1/2} = sum_k [m face(Y_k h_k) + j_k (h_k,j + h_k,j+1)/2] / W_k - lambda (T_j+1 - T_j)/dx
//
// (face: upwind or central, as for the species) is the same at every
// midpoint, because the energy equation is the conservative enthalpy form
// minus the species equations (residual.go). Its spread must stay at the
// level the Newton tolerance leaves: below 1e-6 of m cp (T_b - T_u). Both
// convection schemes.
func TestDiscreteEnthalpyFluxConserved(t *testing.T) {
	if testing.Short() {
		t.Skip("full flame solves")
	}
	s, in := hydrogenSolver(t)
	for _, central := range []bool{false, true} {
		set := DefaultSettings()
		set.CentralConvection = central
		sol, err := s.Solve(in, set)
		if err != nil {
			t.Fatal(err)
		}
		pr := s.problemFor(sol, set)
		pr.central = central
		if err := pr.pointProperties(sol.U, full); err != nil {
			t.Fatal(err)
		}
		pr.midpointFluxes(sol.U, full)
		K, b, n := s.ph.nSpecies, pr.b, pr.n
		m := sol.MassFlux()
		E := make([]float64, n-1)
		for j := 0; j+1 < n; j++ {
			for k := 0; k < K; k++ {
				ha, hb := pr.hk[j*K+k], pr.hk[(j+1)*K+k]
				conv := m * pr.face(sol.U[j*b+1+k]*ha, sol.U[(j+1)*b+1+k]*hb)
				E[j] += (conv + pr.flux[j*K+k]*0.5*(ha+hb)) * s.ph.invW[k]
			}
			E[j] -= pr.lambda[j] * (sol.T(j+1) - sol.T(j)) / (sol.X[j+1] - sol.X[j])
		}
		scale := m * pr.cp[n-1] * (sol.T(n-1) - sol.T(0))
		spread := 0.0
		for j := range E {
			spread = math.Max(spread, math.Abs(E[j]-E[0])/scale)
		}
		t.Logf("central=%v: enthalpy flux constant to %.2g of m cp (T_b - T_u) over %d midpoints", central, spread, n-1)
		if spread > 1e-6 {
			t.Errorf("central=%v: total enthalpy flux varies by %.3g of m cp (T_b - T_u) (> 1e-6)", central, spread)
		}
	}
}

// extendDomain lengthens a domain whose inlet end is not flat by a quarter
// of its length upstream (four points copying the inlet state) and one whose
// outlet still rises by half its length downstream; a flat profile is left
// alone.
func TestExtendDomain(t *testing.T) {
	s, in := hydrogenSolver(t)
	K := s.ph.nSpecies
	b := blockSize(K)
	build := func(center, width float64) *Solution {
		n := 41
		sol := &Solution{Mechanism: s.ph.mech, Inlet: in, X: make([]float64, n), U: make([]float64, n*b), InitialLength: 0.01}
		for j := range sol.X {
			x := 0.01 * float64(j) / float64(n-1)
			sol.X[j] = x
			sol.U[j*b+compT] = 300 + 1700*0.5*(1+math.Tanh((x-center)/width))
			copy(sol.U[j*b+1:j*b+1+K], in.Y)
			sol.U[j*b+compM(K)] = 0.5
		}
		return sol
	}
	set := DefaultSettings()

	flat := build(0.005, 0.0003)
	if s.extendDomain(flat, set) {
		t.Errorf("a profile flat at both ends was extended to %d points", flat.Points())
	}

	early := build(0.0004, 0.0003) // front at the inlet
	u0 := append([]float64(nil), early.U[:b]...)
	if !s.extendDomain(early, set) {
		t.Fatal("a front at the inlet did not extend the domain")
	}
	if early.Points() != 45 || math.Abs(early.X[0]-(-0.0025)) > 1e-15 {
		t.Errorf("upstream extension: %d points from x = %g m, want 45 from -0.0025 m", early.Points(), early.X[0])
	}
	for j := 0; j < 4; j++ {
		if !slices.EqualFunc(early.U[j*b:(j+1)*b], u0, sameFloat) {
			t.Errorf("new inlet point %d does not copy the inlet state", j)
		}
	}

	late := build(0.0098, 0.0006) // still rising at the outlet
	if !s.extendDomain(late, set) {
		t.Fatal("a profile rising at the outlet did not extend the domain")
	}
	if late.Points() != 45 || math.Abs(late.X[late.Points()-1]-0.015) > 1e-15 {
		t.Errorf("downstream extension: %d points to x = %g m, want 45 to 0.015 m", late.Points(), late.X[late.Points()-1])
	}
}

// sameFloat reports whether two floats have the same bits.
func sameFloat(x, y float64) bool { return math.Float64bits(x) == math.Float64bits(y) }

// startSpeed: 0.4 m/s at the reference adiabatic temperature and 1 atm,
// slower for cooler flames, P^-1/2, clamped to 0.005-3 m/s.
func TestStartSpeed(t *testing.T) {
	atm := Inlet{T: 298, P: thermo.OneAtmosphere}
	if v := startSpeed(atm, 2226); math.Abs(v-0.4) > 1e-12 {
		t.Errorf("reference: %g m/s, want 0.4", v)
	}
	if a, b := startSpeed(atm, 1800), startSpeed(atm, 2000); !(a < b && b < 0.4) {
		t.Errorf("1800 K: %g, 2000 K: %g m/s; want increasing and below 0.4", a, b)
	}
	hp := Inlet{T: 298, P: 4 * thermo.OneAtmosphere}
	if v := startSpeed(hp, 2226); math.Abs(v-0.2) > 1e-12 {
		t.Errorf("4 atm: %g m/s, want 0.2", v)
	}
	if v := startSpeed(atm, 700); v != 0.005 {
		t.Errorf("700 K: %g m/s, want the floor 0.005", v)
	}
}

// The retries of a cold start follow the failed attempts' mass flux four
// times at a time, and step by two between guesses already tried.
func TestNextStartSpeed(t *testing.T) {
	near := func(a, b float64) bool { return math.Abs(a-b) < 1e-12*b }
	for _, c := range []struct {
		prev   float64
		slower bool
		tried  []float64
		want   float64
	}{
		{0.1, false, []float64{0.1}, 0.4},
		{0.4, false, []float64{0.1, 0.4}, 1.6},
		{0.4, true, []float64{0.1, 0.4}, 0.2},                  // 0.1 tried: halfway (factor 2)
		{0.4, true, []float64{0.1, 0.2, 0.4}, 1.6},             // both lower guesses tried: the other side
		{0.4, true, []float64{0.1, 0.2, 0.4, 0.8, 1.6}, 0.025}, // all four tried: sixteen times lower
	} {
		if v := nextStartSpeed(c.prev, c.slower, c.tried); !near(v, c.want) {
			t.Errorf("after %g m/s (slower %v, tried %v): %g m/s, want %g", c.prev, c.slower, c.tried, v, c.want)
		}
	}
}

// The anchor sits at most a quarter of the way up the temperature rise, so
// a weak flame is pinned inside its own rise; strong flames keep the
// setting.
func TestAnchorRise(t *testing.T) {
	set := DefaultSettings()
	if r := anchorRise(set, 300, 2300); r != 400 {
		t.Errorf("2000 K rise: anchor %g K above the inlet, want 400", r)
	}
	if r := anchorRise(set, 300, 700); r != 100 {
		t.Errorf("400 K rise: anchor %g K above the inlet, want 100", r)
	}
}

// Central convection on lean CH4/air (phi 0.8, GRI-Mech 3.0): the upwind
// grid that passes the criteria has intervals with cell Péclet numbers up
// to 12 near the inlet and in the post-flame zone, where the central
// solve stalled (13182 Newton iterations). Halved there first, it
// converges quickly, and on the final grid no interval whose component
// changes has a Péclet number above 2.
func TestCentralConvectionPecletRefinement(t *testing.T) {
	if testing.Short() {
		t.Skip("full flame solve")
	}
	s := builtinSolver(t, "smith1999-natgas")
	in := airMixture(t, s, "CH4", 0.8, 298, 1)
	set := DefaultSettings()
	set.CentralConvection = true
	sol, err := s.Solve(in, set)
	if err != nil {
		t.Fatal(err)
	}
	if sol.Stats.NewtonIterations > 400 {
		t.Errorf("%d Newton iterations, want at most 400", sol.Stats.NewtonIterations)
	}
	pr := s.problemFor(sol, set)
	pr.central = true
	split, err := s.pecletSplit(pr, sol.U)
	if err != nil {
		t.Fatal(err)
	}
	if i := slices.Index(split, true); i >= 0 {
		t.Errorf("interval %d of %d still has a cell Péclet number above 2", i, len(split))
	}
	t.Logf("%d points, %d Newton iterations, %d Jacobians", sol.Points(), sol.Stats.NewtonIterations, sol.Stats.JacobianEvaluations)
}
