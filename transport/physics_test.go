package transport_test

import (
	"math"
	"testing"

	"flame1d/transport"
)

const atm = 101325.0

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

// lemmonJacobsenDilute is the dilute-gas viscosity correlation of Lemmon &
// Jacobsen, Int. J. Thermophys. 25 (2004) 21, eq. (2) with the collision
// integral of their eq. (3) and Table I (coefficients from memory):
//
//	eta0 = 0.0266958 sqrt(M T)/(sigma^2 Omega(T*)),  ln Omega = sum b_i (ln T*)^i
//
// eta0 in uPa s, M in g/mol, sigma in nm. The correlation reproduces the
// NIST reference data to ~0.5% from 100 to 2000 K.
func lemmonJacobsenDilute(T, M, sigmaNM, epsK float64) float64 {
	b := [5]float64{0.431, -0.4623, 0.08406, 0.005341, -0.00331}
	l := math.Log(T / epsK)
	s := 0.0
	for i := 4; i >= 0; i-- {
		s = s*l + b[i]
	}
	return 0.0266958 * math.Sqrt(M*T) / (sigmaNM * sigmaNM * math.Exp(s)) * 1e-6
}

// lemmonJacobsenDiluteConductivity is the dilute-gas thermal conductivity
// of Lemmon & Jacobsen, Int. J. Thermophys. 25 (2004) 21, eq. (5):
//
//	lambda0 = N1 eta0 + N2 tau^t2 + N3 tau^t3,  tau = Tc/T
//
// lambda0 in mW/(m K), eta0 (their dilute viscosity) in uPa s; returned in
// W/(m K). N2 (Table IV, coefficients from memory): Tc = 126.192 K, N1 =
// 1.511, N2 = 2.117, t2 = -1.0, N3 = -3.332, t3 = -0.7. At 300 K it gives
// 25.94 mW/(m K), against 25.97 at 1 atm in the NIST WebBook (from memory;
// the density term adds ~0.03 at 1 atm), which checks the recalled
// coefficients.
func lemmonJacobsenDiluteConductivityN2(T float64) float64 {
	eta0 := lemmonJacobsenDilute(T, 28.01348, 0.3656, 98.94) * 1e6
	tau := 126.192 / T
	return (1.511*eta0 + 2.117*math.Pow(tau, -1.0) - 3.332*math.Pow(tau, -0.7)) * 1e-3
}

// iapwsDiluteSteam is the dilute-gas viscosity of water vapour of IAPWS
// R12-08 (Huber et al., J. Phys. Chem. Ref. Data 38 (2009) 101), eq. (11)
// with Table 1 (coefficients from memory), Pa s.
func iapwsDiluteSteam(T float64) float64 {
	tr := T / 647.096
	H := [4]float64{1.67752, 2.20462, 0.6366564, -0.241605}
	s := 0.0
	for i, h := range H {
		s += h / math.Pow(tr, float64(i))
	}
	return 100 * math.Sqrt(tr) / s * 1e-6
}

// iapwsDiluteSteamConductivity is the dilute-gas thermal conductivity of
// water vapour of IAPWS R15-11 (Huber et al., J. Phys. Chem. Ref. Data 41
// (2012) 033102), eq. (16) with Table 1 (coefficients from memory), W/(m K):
// lambda0 = sqrt(Tr)/sum_k L_k/Tr^k mW/(m K), Tr = T/647.096 K. It gives
// 24.2 mW/(m K) at 373 K (the 1 atm value 24.8, from memory, holds a small
// density term).
func iapwsDiluteSteamConductivity(T float64) float64 {
	tr := T / 647.096
	L := [5]float64{2.443221e-3, 1.323095e-2, 6.770357e-3, -3.454586e-3, 4.096266e-4}
	s := 0.0
	for k, l := range L {
		s += l / math.Pow(tr, float64(k))
	}
	return math.Sqrt(tr) / s * 1e-3
}

func TestSpeciesViscosity(t *testing.T) {
	m, tr := natgas(t)
	// Tolerances: the Chapman-Enskog first approximation on the GRI-Mech
	// Lennard-Jones parameters (fitted to viscosity and second virial data
	// decades ago) is typically within 1-2% of reference data for these
	// gases; 3% at the ends of the range, where the parameters were not fitted.
	type ref struct {
		T, mu, tol float64
	}
	cases := []struct {
		name   string
		source string
		refs   []ref
	}{
		{"N2", "Lemmon & Jacobsen 2004, N2", nil},
		{"O2", "Lemmon & Jacobsen 2004, O2", nil},
		{"AR", "Lemmon & Jacobsen 2004, Ar", nil},
		{"H2O", "IAPWS R12-08 dilute steam", nil},
		// NIST Chemistry WebBook fluid data at 0.1 MPa (from memory):
		{"CO2", "NIST WebBook (Fenghour et al. 1998 correlation), from memory", []ref{{300, 15.02e-6, 0.02}, {500, 23.5e-6, 0.03}}},
		// CH4 3% at 300 K: the GRI-Mech CH4 parameters run ~2.5% high there.
		{"CH4", "NIST WebBook (Quinones-Cisneros & Deiters 2006), from memory", []ref{{300, 11.18e-6, 0.03}, {500, 16.9e-6, 0.03}}},
		{"H2", "NIST WebBook (Muzny et al. 2013), from memory", []ref{{300, 8.96e-6, 0.02}, {500, 12.6e-6, 0.03}, {1000, 20.2e-6, 0.03}}},
	}
	lj := map[string][3]float64{ // M g/mol, sigma nm, eps/k K: Lemmon & Jacobsen 2004 Table I (from memory)
		"N2": {28.01348, 0.3656, 98.94},
		"O2": {31.9988, 0.3428, 118.5},
		"AR": {39.948, 0.335, 143.2},
	}
	for _, c := range cases {
		k := index(t, m, c.name)
		refs := c.refs
		if p, ok := lj[c.name]; ok {
			for _, T := range []float64{300, 500, 1000, 1500} {
				tol := 0.02
				if T >= 1000 {
					tol = 0.03 // O2 runs -2.5% here: parameters fitted to lower-T data
				}
				refs = append(refs, ref{T, lemmonJacobsenDilute(T, p[0], p[1], p[2]), tol})
			}
		}
		if c.name == "H2O" {
			// Steam: 6%. The GRI-Mech H2O parameters (572.4 K, 2.605 A,
			// 1.844 D) in the Stockmayer integrals run +5.4% at 400 K and
			// -4.5% at 1500 K against IAPWS. Not the integrals: read
			// through the table they match a direct computation at water's
			// delta* = 1.217 to 0.001% (TestCollisionTableOffNodes), and the
			// Lennard-Jones ones match Neufeld et al. (1972) to 0.16%. Not the
			// parameters either: no Stockmayer (epsilon/k, sigma) at water's
			// dipole comes within 3% over 400-1500 K
			// (TestSteamViscosityStockmayerLimit, best +-4.6%): the
			// orientation-averaged Stockmayer model (Monchick & Mason 1961)
			// gives water too weak a temperature dependence.
			for _, T := range []float64{400, 600, 1000, 1500} {
				refs = append(refs, ref{T, iapwsDiluteSteam(T), 0.06})
			}
		}
		for _, r := range refs {
			got := tr.SpeciesViscosity(k, r.T)
			t.Logf("%-4s %5.0f K: mu = %.4g Pa s, reference %.4g (%s): %+.2f%%", c.name, r.T, got, r.mu, c.source, 100*(got/r.mu-1))
			if e := relErr(got, r.mu); e > r.tol {
				t.Errorf("%s viscosity at %g K = %.4g Pa s, want %.4g within %.0f%% (%s)", c.name, r.T, got, r.mu, 100*r.tol, c.source)
			}
		}
	}
}

func TestSpeciesConductivity(t *testing.T) {
	m, tr := natgas(t)
	// Values in W/(m K). 5% tolerance: the Mason-Monchick/Warnatz treatment
	// of internal energy transport is approximate for polyatomic molecules
	// (a fixed collision number Z_rot with Parker's T dependence, the
	// vibrational modes diffusing like the molecule itself), so errors of
	// 2-5% are expected. Monatomic argon has lambda = (15/4)(R/W) mu in the
	// first Chapman-Enskog approximation, so it inherits the 2-3% of its
	// viscosity: 3%.
	//
	// N2 against Lemmon & Jacobsen (2004): +1.5% at 300 K, +0.4% at 600 K,
	// +5.3% at 1000 K (and +8.1% at 1500 K, not tested). The viscosity is
	// within 0.1% of theirs at 600-1500 K, so the excess is in the internal
	// part, and it grows with the vibrational heat capacity: carrying no
	// vibrational energy at all gives -2.7%, -5.8%, -8.6% at 600, 1000,
	// 1500 K; the reference lies half-way. Not Z_rot: with Parker's
	// Z_rot(1000 K) = 8.2 the relaxation term is 1.5% of lambda, and Z_rot
	// would have to fall below 1 to remove 5%. The model carries vibrational
	// energy at the self-diffusion rate, the equilibrium (Mason & Monchick,
	// J. Chem. Phys. 36 (1962) 1622) value that matches the flame equations'
	// equilibrium cp; N2 vibration relaxes slowly (Millikan & White, J.
	// Chem. Phys. 39 (1963) 3209: p tau ~ 0.05 atm s at 1000 K, a relaxation
	// length ~3 mm at 1 atm), so measurements may hold it partly frozen - a
	// likely explanation, not verified. 6% at 1000 K, the model's +5.3% with
	// room for the recalled coefficients; docs/transport.md.
	cases := []struct {
		name   string
		T, lam float64
		tol    float64
		source string
	}{
		{"N2", 300, lemmonJacobsenDiluteConductivityN2(300), 0.03, "Lemmon & Jacobsen 2004 dilute gas, coefficients from memory"},
		{"N2", 600, lemmonJacobsenDiluteConductivityN2(600), 0.03, "Lemmon & Jacobsen 2004 dilute gas, coefficients from memory"},
		{"N2", 1000, lemmonJacobsenDiluteConductivityN2(1000), 0.06, "Lemmon & Jacobsen 2004 dilute gas, coefficients from memory"},
		{"AR", 300, 17.7e-3, 0.03, "NIST WebBook (Lemmon & Jacobsen 2004), from memory"},
		{"H2", 300, 0.1868, 0.05, "NIST WebBook (Assael et al. 2011), from memory"},
		{"H2", 600, 0.305, 0.05, "Incropera & DeWitt Table A.4, from memory"},
		{"H2", 1000, 0.448, 0.05, "Incropera & DeWitt Table A.4, from memory"},
		{"CO2", 300, 16.8e-3, 0.05, "NIST WebBook (Vesovic et al. 1990), from memory"},
		{"CO2", 500, 32.5e-3, 0.05, "Incropera & DeWitt Table A.4, from memory"},
		{"CO2", 800, 55.1e-3, 0.05, "Incropera & DeWitt Table A.4, from memory"},
		{"CH4", 300, 34.4e-3, 0.05, "NIST WebBook (Friend, Ely & Ingham 1989), from memory"},
	}
	for _, c := range cases {
		k := index(t, m, c.name)
		got := tr.SpeciesConductivity(k, c.T)
		t.Logf("%-4s %5.0f K: lambda = %.4g W/(m K), reference %.4g: %+.2f%%", c.name, c.T, got, c.lam, 100*(got/c.lam-1))
		if e := relErr(got, c.lam); e > c.tol {
			t.Errorf("%s conductivity at %g K = %.4g W/(m K), want %.4g within %.0f%% (%s)", c.name, c.T, got, c.lam, 100*c.tol, c.source)
		}
	}
}

func TestBinaryDiffusion(t *testing.T) {
	m, tr := natgas(t)
	// Measured values at 1 atm (from memory), m^2/s: Marrero & Mason, J.
	// Phys. Chem. Ref. Data 1 (1972) 3, recommended values at 300 K; CO2-N2
	// from Cussler, Diffusion (2nd ed. 1997), Table 5.1-1, at 298 K. 5%:
	// Marrero & Mason give uncertainties of 2-5% for these pairs, and the
	// combining rules add their own error.
	cases := []struct {
		a, b      string
		T, D, tol float64
	}{
		{"H2", "N2", 300, 0.784e-4, 0.05},
		{"O2", "N2", 300, 0.2025e-4, 0.05},
		{"CH4", "N2", 300, 0.219e-4, 0.05},
		// CO2-N2: 6%. The model is -5.6% here, the largest deviation
		// among these pairs. Not the implementation: by hand, HCB's
		// practical form D = 0.0018583 sqrt(T^3 (1/M1 + 1/M2))/(P sigma^2
		// Omega(1,1)*) (cm^2/s, atm, A) with sigma = 3.692 A, T* = 298/154.3
		// and Neufeld et al.'s Omega(1,1)* = 1.089 gives 0.1557 cm^2/s, the
		// model's value. It is the combining rules on single-gas
		// parameters: no CO2 potential with the right viscosity does better
		// (TestCO2NitrogenDiffusionCombiningRuleLimit).
		{"CO2", "N2", 298, 0.165e-4, 0.06},
	}
	for _, c := range cases {
		j, k := index(t, m, c.a), index(t, m, c.b)
		got := tr.BinaryDiffusion(j, k, c.T, atm)
		t.Logf("D(%s-%s, %g K, 1 atm) = %.4g m^2/s, measured %.4g: %+.2f%%", c.a, c.b, c.T, got, c.D, 100*(got/c.D-1))
		if e := relErr(got, c.D); e > c.tol {
			t.Errorf("D(%s-%s) = %.4g m^2/s, want %.4g within %.0f%%", c.a, c.b, got, c.D, 100*c.tol)
		}
		if sym := tr.BinaryDiffusion(k, j, c.T, atm); sym != got {
			t.Errorf("D(%s-%s) = %g but D(%s-%s) = %g: must be symmetric", c.a, c.b, got, c.b, c.a, sym)
		}
		// D P depends on T only (ideal gas, first approximation): exact.
		for _, P := range []float64{0.1 * atm, 10 * atm, 40 * atm} {
			if e := relErr(tr.BinaryDiffusion(j, k, c.T, P)*P, got*atm); e > 1e-14 {
				t.Errorf("D(%s-%s) P at %g Pa differs by %.2g from 1 atm: D must scale as 1/P", c.a, c.b, P, e)
			}
		}
	}
}

// Wilke's rule for air against the air reference viscosity.
func TestAirViscosity(t *testing.T) {
	m, tr := natgas(t)
	X := make([]float64, len(m.Species))
	X[index(t, m, "O2")] = 0.21
	X[index(t, m, "N2")] = 0.79
	// Lemmon, Jacobsen, Penoncello & Friend 2000 / Lemmon & Jacobsen 2004
	// give air (dry, with Ar) 18.54 uPa s at 300 K and 1 atm (from memory);
	// the Lemmon-Jacobsen air pseudo-fluid parameters (M 28.9586, sigma
	// 0.360 nm, eps/k 103.3 K; from memory) give the dilute value at 1000 K.
	for _, c := range []struct{ T, mu float64 }{
		{300, 18.54e-6},
		{1000, lemmonJacobsenDilute(1000, 28.9586, 0.360, 103.3)},
	} {
		got := tr.Viscosity(c.T, X)
		t.Logf("air %g K: %.4g Pa s, reference %.4g: %+.2f%%", c.T, got, c.mu, 100*(got/c.mu-1))
		if e := relErr(got, c.mu); e > 0.02 {
			t.Errorf("air viscosity at %g K = %.4g Pa s, want %.4g within 2%%", c.T, got, c.mu)
		}
	}
}

// Lewis numbers Le_k = lambda/(rho cp D_km) in stoichiometric methane-air
// at 300 K, 1 atm. Expected: Le_CH4 ~ 0.96-1.0 and Le_H2 ~ 0.3 (common
// practice, no source); bands below are those values with room for the
// model's few-percent errors in lambda and D.
func TestLewisNumbers(t *testing.T) {
	m, tr := natgas(t)
	set := speciesSet(t, m)
	X := make([]float64, len(m.Species))
	X[index(t, m, "CH4")] = 0.095
	X[index(t, m, "O2")] = 0.19
	X[index(t, m, "N2")] = 0.715
	g, err := tr.Properties(set, 300, atm, X)
	if err != nil {
		t.Fatal(err)
	}
	le := func(name string) float64 { return g.Lewis[index(t, m, name)] }
	for _, c := range []struct {
		name   string
		lo, hi float64
	}{
		{"CH4", 0.93, 1.03},
		{"H2", 0.27, 0.33},
	} {
		got := le(c.name)
		t.Logf("Le_%s = %.3f", c.name, got)
		if got < c.lo || got > c.hi {
			t.Errorf("Le_%s = %.3f, want %.2f-%.2f", c.name, got, c.lo, c.hi)
		}
	}
}

// The first Chapman-Enskog approximation on the orientation-averaged
// Stockmayer potential (Monchick & Mason, J. Chem. Phys. 35 (1961) 1676)
// cannot give steam's viscosity within 3% over 400-1500 K with water's own
// dipole moment (1.844 D; 1.85 D is the measured gas-phase value, e.g. CRC
// Handbook, from memory), whatever (epsilon/k, sigma): the scan below finds
// the best pair, and its largest deviation from IAPWS R12-08 (Huber et al.
// 2009) is 4.6%, at about epsilon/k = 770 K, sigma = 2.48 A, delta* = 1.05 -
// close to Monchick & Mason's own water parameters fitted to viscosity
// (775 K, 2.52 A, delta* = 1.0; from memory). The mechanism's set
// (572.4 K, 2.605 A) reaches 5.4%. Only a free dipole (delta* near 2.5,
// twice water's) brings the Stockmayer shape within 1.5%.
func TestSteamViscosityStockmayerLimit(t *testing.T) {
	const debye, angstrom = 3.33564e-30, 1e-10
	var temps []float64
	for T := 400.0; T <= 1500; T += 100 {
		temps = append(temps, T)
	}
	best, bestEps, bestSigma := math.Inf(1), 0.0, 0.0
	for eps := 200.0; eps <= 1500; eps += 10 {
		for sigma := 2.2; sigma <= 3.2; sigma += 0.01 {
			w := transport.Molecule{W: 18.01528e-3, Eps: eps, Sigma: sigma * angstrom, Dipole: 1.844 * debye}
			if !w.Covers(temps[0], temps[len(temps)-1]) {
				continue
			}
			worst := 0.0
			for _, T := range temps {
				worst = math.Max(worst, relErr(w.Viscosity(T), iapwsDiluteSteam(T)))
			}
			if worst < best {
				best, bestEps, bestSigma = worst, eps, sigma
			}
		}
	}
	t.Logf("best Stockmayer water at 1.844 D: epsilon/k = %.0f K, sigma = %.2f A: largest deviation %.2f%% over 400-1500 K",
		bestEps, bestSigma, 100*best)
	if best < 0.03 {
		t.Errorf("a Stockmayer water (%.0f K, %.2f A) comes within %.2f%% of IAPWS over 400-1500 K: the mechanism's parameters, not the model, are then the cause of the steam deviation",
			bestEps, bestSigma, 100*best)
	}
}

// Binary diffusion of CO2-N2 in the first Chapman-Enskog approximation with
// the Lennard-Jones combining rules (sigma arithmetic mean, epsilon
// geometric mean; Hirschfelder, Curtiss & Bird 1954, eq. 8.6-1) cannot
// reach the measured value within 3% with any CO2 potential that keeps the
// CO2 viscosity right: among all CO2 (epsilon/k, sigma) within 2% of the
// CO2 viscosity at 300 and 500 K (NIST WebBook, Fenghour et al. 1998
// correlation, from memory, as in TestSpeciesViscosity), with N2 as in
// GRI-Mech 3.0, the largest D(CO2-N2) at 298 K is still more than 3% below
// Cussler's 0.165 cm^2/s (Diffusion, 2nd ed. 1997, Table 5.1-1, from
// memory). The single-gas CO2 parameters absorb its strong quadrupole
// (CO2-CO2 attraction), which the geometric mean carries over into the
// CO2-N2 well; pair-specific parameters fitted to mixture data are needed
// (as in the corresponding-states correlations of Bzowski, Kestin, Mason
// & Uribe, J. Phys. Chem. Ref. Data 19 (1990) 1179, from memory).
func TestCO2NitrogenDiffusionCombiningRuleLimit(t *testing.T) {
	const angstrom, measured = 1e-10, 0.165e-4
	n2 := transport.Molecule{W: 28.0134e-3, Eps: 97.53, Sigma: 3.621 * angstrom}
	best, bestEps, bestSigma := 0.0, 0.0, 0.0
	for eps := 100.0; eps <= 500; eps += 2 {
		for sigma := 3.2; sigma <= 4.4; sigma += 0.005 {
			co2 := transport.Molecule{W: 44.0095e-3, Eps: eps, Sigma: sigma * angstrom}
			if !co2.Covers(250, 600) || relErr(co2.Viscosity(300), 15.02e-6) > 0.02 || relErr(co2.Viscosity(500), 23.5e-6) > 0.02 {
				continue
			}
			if d := transport.PairDiffusion(co2, n2, 298, atm); d > best {
				best, bestEps, bestSigma = d, eps, sigma
			}
		}
	}
	t.Logf("largest D(CO2-N2, 298 K) with a CO2 viscosity within 2%%: %.4g m^2/s (%+.2f%%) at epsilon/k = %.0f K, sigma = %.3f A",
		best, 100*(best/measured-1), bestEps, bestSigma)
	if best == 0 || best > 0.97*measured {
		t.Errorf("a CO2 potential (%.0f K, %.3f A) with the right viscosity gives D(CO2-N2) = %.4g m^2/s, within 3%% of %.4g: the combining rules are then not the limit",
			bestEps, bestSigma, best, measured)
	}
}

// Steam's thermal conductivity is far below the Mason-Monchick value: the
// model is +40% at 400 K, +31% at 600 K, +22% at 1000 K and +17% at 1500 K
// against IAPWS R15-11 (Huber et al. 2012), while its viscosity is within
// 5.4%. No rotational collision number mends it: even Z_rot = 0
// (instantaneous rotational relaxation, the largest reduction the
// relaxation term can make) leaves the model +31%, +22% and +14% high at
// 400, 600 and 1000 K. What the model lacks is the resonant exchange of rotational energy
// between polar molecules, which makes internal energy diffuse more slowly
// than the molecules themselves (Mason & Monchick, J. Chem. Phys. 36 (1962)
// 1622, from memory). This test holds the finding: it fails when the model
// with Z_rot = 0 comes within 10% (then update docs/transport.md and this test), and the
// flame speeds carry it (docs/transport.md, open discrepancies).
func TestSteamConductivityResonantExchangeMissing(t *testing.T) {
	m, tr := natgas(t)
	k := index(t, m, "H2O")
	for _, T := range []float64{400, 600, 1000} {
		ref := iapwsDiluteSteamConductivity(T)
		got, z0 := tr.SpeciesConductivity(k, T), tr.SpeciesConductivityZrot(k, T, 0)
		t.Logf("H2O %5.0f K: lambda = %.4g W/(m K) (Z_rot = 0: %.4g), IAPWS %.4g: %+.1f%% (%+.1f%%)", T, got, z0, ref, 100*(got/ref-1), 100*(z0/ref-1))
		if z0/ref-1 < 0.10 {
			t.Errorf("H2O at %g K: the model with Z_rot = 0 is within 10%% of IAPWS (%.4g against %.4g): the steam conductivity finding is stale", T, z0, ref)
		}
	}
}
