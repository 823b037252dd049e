package transport

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"

	"flame1d/thermo"
)

// Multicomponent transport: the first Chapman-Enskog approximation for a
// gas mixture without the mixture-averaged shortcuts.
//
// Diffusion. The diffusion velocities V_k solve the Stefan-Maxwell
// relations (Hirschfelder, Curtiss & Bird, Molecular Theory of Gases and
// Liquids, 1954, eq. 8.2-58; the first approximation of the L^00 block of
// the Sonine expansion)
//
//	sum_j X_i X_j (V_j - V_i)/D_ij = d_i + chi_i grad ln T,   sum_k Y_k V_k = 0,
//
// with d_i = grad X_i at constant pressure and D_ij the binary coefficients.
// They are solved for N_k = X_k V_k (finite for trace species); the mass
// fluxes rho Y_k V_k = rho (W_k/W) N_k then sum to zero by construction.
//
// Thermal conductivity and thermal diffusion. The translational energy
// flux and the thermal diffusion ratios chi_k come from the two-term Sonine
// expansion (S^0 C, S^1 C per species) of the Chapman-Enskog equations for a
// mixture. The bracket integrals are those of Chapman & Cowling, The
// Mathematical Theory of Non-uniform Gases (3rd ed. 1970), sec. 9.8 (also
// Hirschfelder, Curtiss & Bird 1954, sec. 7.4), written with
// M_i = W_i/(W_i + W_j), the collision frequency
// g_ij = n Omega(1,1)_ij = 3 R T/(16 mu_ij D_ij) (mu_ij the reduced molar
// mass) and the ratios A*, B*, C*:
//
//	[C_i, C_i]'_ij        =  8 M_j g
//	[C_i, C_j]''_ij       = -8 (M_i M_j)^(1/2) g
//	[S C_i, C_i]'_ij      = -4 M_j^2 (6C* - 5) g
//	[S C_j, C_i]''_ij     =  4 M_i^(3/2) M_j^(1/2) (6C* - 5) g
//	[S C_i, S C_i]'_ij    =  8 M_j g (15/2 M_i^2 + 25/4 M_j^2 - 3 M_j^2 B* + 4 M_i M_j A*)
//	[S C_i, S C_j]''_ij   = -8 (M_i M_j)^(3/2) g (55/4 - 3B* - 4A*)
//	like collisions, S-S  =  4 n Omega(2,2)_ii = (5/2) P/eta_i
//
// (S = S_{3/2}^(1)(C^2), the first Sonine polynomial). Following Waldmann
// and Ern & Giovangigli (Multicomponent Transport Algorithms, Springer 1994,
// ch. 5), the S-S block alone gives the partial (translational) conductivity
// and, through the S-C coupling, the thermal diffusion ratios:
//
//	sum_j Q11_ij b_j = (15/4) X_i/W_i^(1/2),   lambda_tr = (5/2) R P sum_i X_i b_i/W_i^(1/2),
//	chi_i = (2/3) W_i^(1/2) sum_j Q01_ij b_j,
//
// so that, for a binary mixture, chi_1 = -chi_2 is the first approximation
// [k_T]_1 of Chapman & Cowling (sec. 9.8) and the diffusion velocities are
// those of [D_12]_1 [k_T]_1. The internal (rotational, vibrational) energy
// is carried by diffusion of the excited molecules: each species keeps the
// internal part of its own conductivity (the Mason-Monchick value of
// SpeciesConductivity, rotational relaxation included, minus the
// translational (15/4) R eta/W), and the parts are mixed by the rule of
// Hirschfelder (J. Chem. Phys. 26 (1957) 274) in the form of Monchick,
// Pereira & Mason (J. Chem. Phys. 42 (1965) 3241):
//
//	lambda_int = sum_i X_i lambda_int,i / sum_j X_j D_ii/D_ij.
//
// For a pure gas the total is exactly the species conductivity. Thermal
// diffusion of polyatomic gases is taken from the translational
// (elastic-collision) brackets, as in the Mason-Monchick approximation
// (Monchick, Yun & Mason, J. Chem. Phys. 39 (1963) 654; from memory).

// pairDegree is the polynomial degree in u of the fitted A*, B*, C* of
// every pair (they vary smoothly over a few decades of T*).
const pairDegree = 6

// MulticomponentProperties are the multicomponent conductivity and thermal
// diffusion ratios at one state.
type MulticomponentProperties struct {
	Conductivity float64 // W/(m K): translational (multicomponent) + internal
	// ThermalDiffusionRatios chi_k (len K, allocated by the caller) enter
	// the Stefan-Maxwell relations as d_k + chi_k grad ln T. They sum to
	// zero; a species lighter than the mixture has chi_k < 0 and moves up
	// the temperature gradient. Skipped when nil.
	ThermalDiffusionRatios []float64
}

// StefanMaxwell is the Stefan-Maxwell system of one state, factorised, in
// caller-owned storage: a flame solver keeps one per cell face and solves it
// again for every new driving force without re-forming it.
type StefanMaxwell struct {
	k     int
	lu    []float64 // K*K row-major LU factors
	ipiv  []int
	drop  int     // the species whose relation is replaced by the constraint
	scale float64 // T^(3/2)/P, m^2/s per unit of the matrix
}

// NewStefanMaxwell allocates a system for k species.
func NewStefanMaxwell(k int) *StefanMaxwell {
	return &StefanMaxwell{k: k, lu: make([]float64, k*k), ipiv: make([]int, k)}
}

// MolarFluxes returns in N the diffusive fluxes N_k = X_k V_k, m/s, for the
// driving forces d (len K, 1/m; grad X_k + chi_k grad ln T). They satisfy
// sum_k (W_k/W) N_k = 0 exactly (to round-off), whether or not d sums to
// zero; if it does not, the Stefan-Maxwell relation of the most abundant
// species is the one that is not met. N and d may be the same slice.
// Allocation-free.
func (s *StefanMaxwell) MolarFluxes(d, N []float64) {
	K := s.k
	copy(N[:K], d[:K])
	N[s.drop] = 0
	// P A = L U: apply the row interchanges, then two triangular solves
	// (Getrs with one right-hand side goes through matrix-matrix kernels,
	// many times slower for a single vector).
	for i, p := range s.ipiv {
		N[i], N[p] = N[p], N[i]
	}
	x := blas64.Vector{N: K, Inc: 1, Data: N[:K]}
	blas64.Trsv(blas.NoTrans, blas64.Triangular{Uplo: blas.Lower, Diag: blas.Unit, N: K, Stride: K, Data: s.lu}, x)
	blas64.Trsv(blas.NoTrans, blas64.Triangular{Uplo: blas.Upper, Diag: blas.NonUnit, N: K, Stride: K, Data: s.lu}, x)
	for k := range N[:K] {
		N[k] *= s.scale
	}
}

// mcWork is the Model's work space for multicomponent properties, made on
// first use so that mixture-averaged Models do not carry it.
type mcWork struct {
	cachedT float64
	a, b, c []float64 // K*K: A*, B*, 6C* - 5 of every pair at cachedT
	qSelf   []float64 // T^(3/2)/(D_kk P), self-diffusion
	sym     []float64 // K*K thermal system (scaled Q11)
	z       []float64 // its solution sqrt(X_i) b_i
	sx      []float64 // sqrt(x_i)
}

// multicomponentFits are the fits only the multicomponent model needs. They
// are made on first use (fitted.multicomponent), so that Models used only
// for mixture-averaged properties are built as fast as before.
type multicomponentFits struct {
	pairCoef   []float64 // pairs j<k in row order: A*, B*, 6C*-5, each pairDegree+1
	selfCoef   []float64 // K*(diffusionDegree+1), T^(3/2)/(D_kk P)
	maxErr     float64   // largest fit error, as fitted.maxErr
	maxErrWhat string
}

// multicomponent returns the multicomponent fits, making them on the first
// call (safe for concurrent use by clones).
func (f *fitted) multicomponent() (*multicomponentFits, error) {
	f.mcOnce.Do(func() { f.mc, f.mcErr = f.fitMulticomponent() })
	return f.mc, f.mcErr
}

// fitCollisionRatios returns the fits of A*, B* and 6C* - 5 of the pair
// (j, k) over the fit range, each pairDegree+1 coefficients, with the
// largest fit error and what it is (absolute: the ratios are of order 1 and
// 6C* - 5 may change sign). j == k gives zeros.
func (f *fitted) fitCollisionRatios(j, k int) (coef []float64, worst float64, what string, err error) {
	const n = pairDegree + 1
	out := make([]float64, 0, 3*n)
	if j == k {
		return append(out, make([]float64, 3*n)...), 0, "", nil
	}
	p := combine(&f.species[j], &f.species[k])
	// The three ratios share their collision integrals: evaluate each node
	// once.
	seen := make(map[float64]collision, fitNodes+errorNodes)
	at := func(u float64) collision {
		c, ok := seen[u]
		if !ok {
			c = collisionIntegrals(f.scale.temperature(u)/p.eps, p.delta)
			seen[u] = c
		}
		return c
	}
	for which := 0; which < 3; which++ {
		fn := func(u float64) float64 {
			c := at(u)
			return [3]float64{c.A, c.B, 6*c.C - 5}[which]
		}
		c, err := fitPolynomial(pairDegree, fn)
		if err != nil {
			return nil, 0, "", fmt.Errorf("transport: fitting collision ratios %s-%s: %w", f.species[j].name, f.species[k].name, err)
		}
		if e := fitError(c, fn, func(fit, exact float64) float64 { return math.Abs(fit - exact) }); e > worst {
			worst, what = e, fmt.Sprintf("collision ratio %d of %s-%s", which, f.species[j].name, f.species[k].name)
		}
		out = append(out, c...)
	}
	return out, worst, what, nil
}

// fitMulticomponent fits the pair ratios A*, B*, C* and the self-diffusion
// coefficients over the fit range.
func (f *fitted) fitMulticomponent() (*multicomponentFits, error) {
	K := len(f.species)
	sc := f.scale
	const n = pairDegree + 1
	mc := &multicomponentFits{pairCoef: make([]float64, 0, K*(K-1)/2*3*n)}
	for j := 0; j < K; j++ {
		for k := j + 1; k < K; k++ {
			c, e, what, err := f.fitCollisionRatios(j, k)
			if err != nil {
				return nil, err
			}
			if e > mc.maxErr {
				mc.maxErr, mc.maxErrWhat = e, what
			}
			mc.pairCoef = append(mc.pairCoef, c...)
		}
	}
	for k := range f.species {
		s := &f.species[k]
		p := combine(s, s)
		fn := func(u float64) float64 {
			T := sc.temperature(u)
			return T * math.Sqrt(T) / p.diffusionTimesPressure(T)
		}
		c, err := fitPolynomial(diffusionDegree, fn)
		if err != nil {
			return nil, fmt.Errorf("transport: fitting self-diffusion of %s: %w", s.name, err)
		}
		if e := fitError(c, fn, rel); e > mc.maxErr {
			mc.maxErr, mc.maxErrWhat = e, "self-diffusion "+s.name
		}
		mc.selfCoef = append(mc.selfCoef, c...)
	}
	return mc, nil
}

// MulticomponentFitError returns the largest error of the fits the
// multicomponent model adds (pair ratios A*, B*, 6C* - 5 absolute,
// self-diffusion relative), and what it is; it makes the fits if
// Multicomponent has not yet run.
func (t *Model) MulticomponentFitError() (float64, string, error) {
	mc, err := t.fit.multicomponent()
	if err != nil {
		return 0, "", err
	}
	return mc.maxErr, mc.maxErrWhat, nil
}

// multicomponentTemperature evaluates the pair ratios at the cached
// temperature of t (setTemperature must have run).
func (t *Model) multicomponentTemperature(mc *multicomponentFits) {
	K := len(t.fit.species)
	if t.mc == nil {
		t.mc = &mcWork{
			cachedT: math.NaN(),
			a:       make([]float64, K*K), b: make([]float64, K*K), c: make([]float64, K*K),
			qSelf: make([]float64, K), sym: make([]float64, K*K), z: make([]float64, K), sx: make([]float64, K),
		}
	}
	w := t.mc
	if w.cachedT == t.cachedT {
		return
	}
	w.cachedT = t.cachedT
	f := t.fit
	T := math.Min(math.Max(t.cachedT, f.scale.tMin), f.scale.tMax)
	u := f.scale.u(T)
	const n = pairDegree + 1
	i := 0
	for j := 0; j < K; j++ {
		for k := j + 1; k < K; k++ {
			c := mc.pairCoef[i*3*n : (i+1)*3*n]
			i++
			a, b, c6 := horner(c[:n], u), horner(c[n:2*n], u), horner(c[2*n:], u)
			w.a[j*K+k], w.a[k*K+j] = a, a
			w.b[j*K+k], w.b[k*K+j] = b, b
			w.c[j*K+k], w.c[k*K+j] = c6, c6
		}
	}
	const nd = diffusionDegree + 1
	for k := 0; k < K; k++ {
		w.qSelf[k] = horner(mc.selfCoef[k*nd:(k+1)*nd], u)
	}
}

// Multicomponent evaluates the multicomponent model at T, K, P, Pa, and
// mole fractions X: it factorises the Stefan-Maxwell system into sm (unless
// nil) and fills out (unless nil) with the conductivity and the thermal
// diffusion ratios. Allocation-free after the first call; the first call
// on a Model or any of its clones also makes the fits the model needs
// (for GRI-Mech 3.0 about twice the work of New).
func (t *Model) Multicomponent(T, P float64, X []float64, sm *StefanMaxwell, out *MulticomponentProperties) error {
	mc, err := t.fit.multicomponent()
	if err != nil {
		return err
	}
	t.setTemperature(T)
	t.setComposition(X)
	if sm != nil {
		if err := t.stefanMaxwell(P, sm); err != nil {
			return err
		}
	}
	if out != nil {
		t.multicomponentTemperature(mc)
		return t.thermalSystem(P, out)
	}
	return nil
}

// stefanMaxwell forms and factorises, in units of P/T^(3/2),
//
//	A_ij = x_i/D_ij (j != i),  A_ii = -sum_{j != i} x_j/D_ij,
//
// with the row of the most abundant species replaced by the constraint
// sum_j (W_j/W) N_j = 0 (scaled like the row it replaces).
func (t *Model) stefanMaxwell(P float64, sm *StefanMaxwell) error {
	f := t.fit
	K := len(t.x)
	if sm.k != K {
		return fmt.Errorf("transport: Stefan-Maxwell system for %d species, model has %d", sm.k, K)
	}
	x := t.x
	a := sm.lu
	drop, wMean := 0, 0.0
	for k := range x {
		wMean += x[k] * f.species[k].W
		if x[k] > x[drop] {
			drop = k
		}
	}
	for i := 0; i < K; i++ {
		q := t.q[i*K : (i+1)*K]
		row := a[i*K : (i+1)*K]
		if i == drop {
			continue
		}
		s := 0.0
		for j, qj := range q {
			row[j] = x[i] * qj // q_ii = 0
			s += x[j] * qj
		}
		row[i] = -s
	}
	diag := 0.0
	q := t.q[drop*K : (drop+1)*K]
	for j, qj := range q {
		diag += x[j] * qj
	}
	row := a[drop*K : (drop+1)*K]
	for j := range row {
		row[j] = diag * f.species[j].W / wMean
	}
	sm.scale = t.tPow / P
	sm.drop = drop
	if !lapack64.Getrf(blas64.General{Rows: K, Cols: K, Stride: K, Data: a}, sm.ipiv) {
		return fmt.Errorf("transport: singular Stefan-Maxwell system at %g K", t.cachedT)
	}
	return nil
}

// thermalSystem solves the S-S block for the translational conductivity and
// the thermal diffusion ratios (see the file comment), in the symmetric
// form scaled by sqrt(x_i x_j), and adds the internal conductivity.
func (t *Model) thermalSystem(P float64, out *MulticomponentProperties) error {
	f := t.fit
	w := t.mc
	K := len(t.x)
	x, sx, s := t.x, w.sx, w.sym
	T := t.cachedT
	// g_ij = 3 R T P q_ij/(16 mu_ij T^(3/2)), 1/s.
	gScale := 3 * thermo.GasConstant * T * P / (16 * t.tPow)
	for i := range x {
		sx[i] = math.Sqrt(x[i])
		s[i*K+i] = 2.5 * P / t.mu[i] * x[i]
	}
	for i := 0; i < K; i++ {
		for j := i + 1; j < K; j++ {
			mi, mj, g := t.pairMasses(i, j, gScale)
			A, B := w.a[i*K+j], w.b[i*K+j]
			s[i*K+i] += x[j] * 8 * mj * g * (7.5*mi*mi + 6.25*mj*mj - 3*mj*mj*B + 4*mi*mj*A)
			s[j*K+j] += x[i] * 8 * mi * g * (7.5*mj*mj + 6.25*mi*mi - 3*mi*mi*B + 4*mi*mj*A)
			mm := mi * mj
			off := -sx[i] * sx[j] * 8 * mm * math.Sqrt(mm) * g * (13.75 - 3*B - 4*A)
			s[i*K+j], s[j*K+i] = off, off
		}
	}
	z := w.z
	for i := range z {
		z[i] = 3.75 * sx[i] / math.Sqrt(f.species[i].W)
	}
	tri, ok := lapack64.Potrf(blas64.Symmetric{Uplo: blas.Upper, N: K, Stride: K, Data: s})
	if !ok {
		return fmt.Errorf("transport: thermal conduction system not positive definite at %g K", T)
	}
	// U^T U z = rhs, by two triangular solves (see MolarFluxes).
	zv := blas64.Vector{N: K, Inc: 1, Data: z}
	blas64.Trsv(blas.Trans, tri, zv)
	blas64.Trsv(blas.NoTrans, tri, zv)
	lambdaTr := 0.0
	for i := range z {
		lambdaTr += sx[i] * z[i] / math.Sqrt(f.species[i].W)
	}
	lambdaTr *= 2.5 * thermo.GasConstant * P
	// Internal part, Hirschfelder's rule: D_ii/D_ij = q_ij/q_ii.
	lambdaInt := 0.0
	for i := 0; i < K; i++ {
		li := t.lambda[i] - 3.75*thermo.GasConstant*t.mu[i]/f.species[i].W
		if li == 0 {
			continue
		}
		den := x[i]
		q := t.q[i*K : (i+1)*K]
		for j, qj := range q {
			den += x[j] * qj / w.qSelf[i]
		}
		lambdaInt += x[i] * li / den
	}
	out.Conductivity = lambdaTr + lambdaInt
	chi := out.ThermalDiffusionRatios
	if chi == nil {
		return nil
	}
	_ = chi[K-1]
	for i := 0; i < K; i++ {
		v := 0.0
		for j := 0; j < K; j++ {
			if j == i {
				continue
			}
			mi, mj, g := t.pairMasses(i, j, gScale)
			v += g * w.c[i*K+j] * (mi*math.Sqrt(mi*mj)*x[i]*sx[j]*z[j] - mj*mj*x[j]*sx[i]*z[i])
		}
		chi[i] = 8.0 / 3 * math.Sqrt(f.species[i].W) * v
	}
	return nil
}

// pairMasses returns M_i = W_i/(W_i + W_j), M_j = 1 - M_i and the collision
// frequency g_ij = gScale q_ij/mu_ij (mu_ij the reduced molar mass) of the
// pair (i, j) at the cached temperature.
func (t *Model) pairMasses(i, j int, gScale float64) (mi, mj, g float64) {
	Wi, Wj := t.fit.species[i].W, t.fit.species[j].W
	mi = Wi / (Wi + Wj)
	return mi, 1 - mi, gScale * t.q[i*len(t.x)+j] * (Wi + Wj) / (Wi * Wj)
}

// MulticomponentDiffusion fills D (K*K, row-major, m^2/s) with the
// multicomponent diffusion coefficients at T, K, P, Pa, and mole fractions
// X, in the normalisation of Curtiss & Hirschfelder (J. Chem. Phys. 17
// (1949) 550; Hirschfelder, Curtiss & Bird 1954, eq. 7.3-15 with D_ii = 0):
//
//	X_i V_i = sum_j (W_j/W) D_ij d_j,   D_ii = 0,
//
// so that in a binary mixture D_12 = D_21 is the binary coefficient. It
// allocates; the flame solver uses Multicomponent and StefanMaxwell.
func (t *Model) MulticomponentDiffusion(T, P float64, X []float64, D []float64) error {
	K := len(t.fit.species)
	sm := NewStefanMaxwell(K)
	if err := t.Multicomponent(T, P, X, sm, nil); err != nil {
		return err
	}
	wMean := 0.0
	for k := range t.x {
		wMean += t.x[k] * t.fit.species[k].W
	}
	// G_:j is the response N to d = e_j - e_r, r the replaced row: the
	// right-hand side e_j with its r entry dropped. G_ij - G_ii does not
	// depend on r, and D_ij = (W/W_j)(G_ij - G_ii).
	G := make([]float64, K*K) // column-major: G[j*K+i]
	col := make([]float64, K)
	for j := 0; j < K; j++ {
		if j == sm.drop {
			continue
		}
		for i := range col {
			col[i] = 0
		}
		col[j] = 1
		sm.MolarFluxes(col, G[j*K:(j+1)*K])
	}
	for i := 0; i < K; i++ {
		gii := G[i*K+i]
		for j := 0; j < K; j++ {
			if j == i {
				D[i*K+j] = 0
				continue
			}
			D[i*K+j] = wMean / t.fit.species[j].W * (G[j*K+i] - gii)
		}
	}
	return nil
}
