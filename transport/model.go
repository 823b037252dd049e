// Package transport computes gas transport properties from kinetic theory:
// pure-species viscosity, thermal conductivity and binary diffusion
// coefficients by the Chapman-Enskog theory on Lennard-Jones (12-6) and
// Stockmayer potentials, and mixture-averaged properties (Wilke viscosity,
// Mathur-Tondon-Saxena conductivity, mixture diffusion coefficients, thermal
// diffusion ratios of the light species).
//
// A Model fits every species and pair property once, at construction, as a
// polynomial in ln T over a temperature range, and evaluates the fits in the
// flame solver's inner loop without allocating. The unfitted theory stays
// available (SpeciesViscosity, SpeciesConductivity, BinaryDiffusion) for
// checks and reports.
//
// Units are SI: K, Pa, Pa s, W/(m K), m^2/s.
package transport

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"sync"

	"flame1d/chem"
	"flame1d/thermo"
)

// Default fit range, K: from below ambient to above any adiabatic flame
// temperature of hydrocarbon-air mixtures.
const (
	DefaultTMin = 250.0
	DefaultTMax = 3500.0
)

// Polynomial degrees in u = scaled ln T of the fitted quantities.
const (
	viscosityDegree    = 4 // ln mu_k
	conductivityDegree = 4 // h_k and v_k of the conductivity (see conductivityParts)
	diffusionDegree    = 4 // T^(3/2)/(D_jk P)
)

// lightMolarMass is the molar mass below which a species gets a thermal
// diffusion ratio, kg/mol: H, H2, He (and D, D2). Thermal diffusion of
// heavier species changes flame speeds by far less than it costs; common
// practice, no source.
const lightMolarMass = 5e-3

// moleFractionFloor is added to every (non-negative) mole fraction before
// the mixing rules, and the result renormalised. It keeps the mixture
// diffusion coefficient finite when a species is pure (every other X_j = 0)
// and the mixing rules defined when some X are zero or slightly negative (as
// Newton iterates may be). Its effect on any property is below 1e-10
// relative for mechanisms of fewer than 10^3 species.
const moleFractionFloor = 1e-13

// Options configure a Model.
type Options struct {
	// TMin, TMax bound the fit range, K. Zero means DefaultTMin,
	// DefaultTMax. Outside the range the fitted properties are those at the
	// nearer end.
	TMin, TMax float64
}

// Model evaluates mixture transport properties from fits made once at
// construction. The fits are immutable and shared between clones; each
// Model also holds work arrays, so one Model must not be used by two
// goroutines at once: Clone it per goroutine.
type Model struct {
	fit *fitted

	// Work arrays, valid for temperature cachedT.
	cachedT float64
	mu      []float64 // species viscosities, Pa s
	alpha   []float64 // sqrt(mu_k)/W_k^(1/4)
	beta    []float64 // W_k^(1/4)/sqrt(mu_k)
	lambda  []float64 // species conductivities, W/(m K)
	q       []float64 // K*K, T^(3/2)/(D_jk P) (diagonal zero)
	tdf     []float64 // len(light)*K*3: A*, B*, 6C*-5 of the light species' pairs
	tPow    float64   // T^(3/2) at cachedT
	x       []float64 // floored, renormalised mole fractions
	xb      []float64 // X_j b_j of thermalDiffusion
	mc      *mcWork   // multicomponent work space, made on first use
}

// fitted is the immutable part of a Model.
type fitted struct {
	species []molecule
	light   []int // indices of species with thermal diffusion ratios
	scale   lnTScale

	muCoef []float64                      // K*(viscosityDegree+1)
	hCoef  []float64                      // K*(conductivityDegree+1)
	vCoef  []float64                      // K*(conductivityDegree+1)
	dCoef  [][diffusionDegree + 1]float64 // K*(K-1)/2 pairs j<k in row order
	tdCoef []float64                      // len(light)*K pairs: A*, B*, 6C*-5 (fitCollisionRatios)

	// Multicomponent fits (multicomponent.go), made on first use.
	mcOnce sync.Once
	mc     *multicomponentFits
	mcErr  error

	// Wilke's Phi_kj = wilkeA[kj] (1 + alpha_k beta_j)^2 with
	// alpha_k = sqrt(mu_k)/W_k^(1/4), beta_j = W_j^(1/4)/sqrt(mu_j).
	wilkeA []float64
	w4     []float64 // W_k^(1/4)

	maxErr     float64
	maxErrWhat string // the quantity with the largest fit error
}

// New builds a transport Model for the gas species of m, fitting every
// property over opt's temperature range. It fails, naming them, when species
// lack transport data or have unusable parameters.
func New(m *chem.Mechanism, opt Options) (*Model, error) {
	if opt.TMin == 0 {
		opt.TMin = DefaultTMin
	}
	if opt.TMax == 0 {
		opt.TMax = DefaultTMax
	}
	if !(opt.TMin > 0 && opt.TMax > opt.TMin) || math.IsInf(opt.TMax, 0) {
		return nil, fmt.Errorf("transport: fit range %g-%g K: need 0 < TMin < TMax", opt.TMin, opt.TMax)
	}
	if len(m.Species) == 0 {
		return nil, errors.New("transport: mechanism has no species")
	}
	species, err := molecules(m)
	if err != nil {
		return nil, err
	}
	f := &fitted{species: species, scale: newLnTScale(opt.TMin, opt.TMax)}
	for k := range species {
		if species[k].W < lightMolarMass {
			f.light = append(f.light, k)
		}
	}
	if err := f.fitAll(); err != nil {
		return nil, err
	}
	f.wilkeFactors()
	return newModel(f), nil
}

// molecules collects and checks the species' kinetic-theory data.
func molecules(m *chem.Mechanism) ([]molecule, error) {
	var missing, bad []string
	out := make([]molecule, len(m.Species))
	for k := range m.Species {
		s := &m.Species[k]
		tp := s.Transport
		if tp == nil {
			missing = append(missing, s.Name)
			continue
		}
		W, err := s.MolarMass()
		if err != nil {
			bad = append(bad, err.Error())
			continue
		}
		switch {
		case s.Condensed:
			bad = append(bad, fmt.Sprintf("%s is a condensed phase", s.Name))
			continue
		case !(tp.WellDepth > 0) || math.IsInf(tp.WellDepth, 0):
			bad = append(bad, fmt.Sprintf("%s: well depth %g K must be positive", s.Name, tp.WellDepth))
			continue
		case !(tp.Diameter > 0) || tp.Diameter > 1e-8:
			bad = append(bad, fmt.Sprintf("%s: collision diameter %g m must be positive (and in metres)", s.Name, tp.Diameter))
			continue
		case !(tp.Dipole >= 0) || !(tp.Polarizability >= 0) || !(tp.RotRelaxation >= 0):
			bad = append(bad, fmt.Sprintf("%s: dipole, polarizability and rotational relaxation number must be non-negative", s.Name))
			continue
		case tp.Geometry != chem.Atom && tp.Geometry != chem.Linear && tp.Geometry != chem.Nonlinear:
			bad = append(bad, fmt.Sprintf("%s: unknown geometry %d", s.Name, tp.Geometry))
			continue
		}
		out[k] = molecule{
			name:     s.Name,
			W:        W,
			mass:     W / avogadro,
			geometry: tp.Geometry,
			eps:      tp.WellDepth,
			sigma:    tp.Diameter,
			dipole:   tp.Dipole,
			alpha:    tp.Polarizability,
			zrot298:  tp.RotRelaxation,
			delta:    reducedDipole(tp.Dipole, tp.WellDepth, tp.Diameter),
			thermo:   s.Thermo,
		}
	}
	var msgs []string
	if len(missing) > 0 {
		msgs = append(msgs, fmt.Sprintf("%d species have no transport data: %s", len(missing), strings.Join(missing, ", ")))
	}
	msgs = append(msgs, bad...)
	if len(msgs) > 0 {
		return nil, fmt.Errorf("transport: %s", strings.Join(msgs, "; "))
	}
	return out, nil
}

func relLog(fit, exact float64) float64 { return math.Abs(math.Expm1(fit - exact)) }
func rel(fit, exact float64) float64    { return math.Abs(fit-exact) / math.Abs(exact) }

// fitAll fits every species, pair and thermal diffusion quantity and
// records the largest relative fit error.
func (f *fitted) fitAll() error {
	K := len(f.species)
	sc := f.scale
	if err := f.checkCoverage(); err != nil {
		return err
	}
	one := func(deg int, what string, fn func(u float64) float64, errFn func(fit, exact float64) float64) ([]float64, error) {
		c, err := fitPolynomial(deg, fn)
		if err != nil {
			return nil, fmt.Errorf("transport: fitting %s over %g-%g K: %w", what, sc.tMin, sc.tMax, err)
		}
		f.note(what, fitError(c, fn, errFn))
		return c, nil
	}
	for k := range f.species {
		s := &f.species[k]
		c, err := one(viscosityDegree, s.name+" viscosity", func(u float64) float64 {
			return math.Log(s.viscosity(sc.temperature(u)))
		}, relLog)
		if err != nil {
			return err
		}
		f.muCoef = append(f.muCoef, c...)
		if err := f.fitConductivity(k, c); err != nil {
			return err
		}
	}
	for j := 0; j < K; j++ {
		for k := j + 1; k < K; k++ {
			p := combine(&f.species[j], &f.species[k])
			c, err := one(diffusionDegree, "diffusion "+f.species[j].name+"-"+f.species[k].name, func(u float64) float64 {
				T := sc.temperature(u)
				return T * math.Sqrt(T) / p.diffusionTimesPressure(T)
			}, rel)
			if err != nil {
				return err
			}
			f.dCoef = append(f.dCoef, [diffusionDegree + 1]float64(c))
		}
	}
	for _, k := range f.light {
		for j := 0; j < K; j++ {
			c, e, what, err := f.fitCollisionRatios(k, j)
			if err != nil {
				return err
			}
			f.note(what, e)
			f.tdCoef = append(f.tdCoef, c...)
		}
	}
	return nil
}

// checkCoverage fails when a species or pair needs collision integrals
// outside the table over the fit range.
func (f *fitted) checkCoverage() error {
	var bad []string
	check := func(what string, eps, delta float64) {
		if !tableCovers(f.scale.tMin/eps, delta) || !tableCovers(f.scale.tMax/eps, delta) {
			bad = append(bad, fmt.Sprintf("%s (T* %.3g-%.3g, delta* %.3g)", what, f.scale.tMin/eps, f.scale.tMax/eps, delta))
		}
	}
	for j := range f.species {
		check(f.species[j].name, f.species[j].eps, f.species[j].delta)
		for k := j + 1; k < len(f.species); k++ {
			p := combine(&f.species[j], &f.species[k])
			check(f.species[j].name+"-"+f.species[k].name, p.eps, p.delta)
		}
	}
	if len(bad) > 0 {
		if len(bad) > 10 {
			bad = append(bad[:10], fmt.Sprintf("and %d more", len(bad)-10))
		}
		return fmt.Errorf("transport: fit range %g-%g K needs collision integrals outside 0.1 <= T* <= 580, delta* <= 2.5 for %s",
			f.scale.tMin, f.scale.tMax, strings.Join(bad, ", "))
	}
	return nil
}

func (f *fitted) note(what string, e float64) {
	if e > f.maxErr {
		f.maxErr, f.maxErrWhat = e, what
	}
}

// fitConductivity fits h_k and v_k of species k (see conductivityParts) and
// records the relative error of the conductivity they give with the fitted
// viscosity muCoef.
func (f *fitted) fitConductivity(k int, muCoef []float64) error {
	s := &f.species[k]
	sc := f.scale
	part := func(which int) func(u float64) float64 {
		return func(u float64) float64 {
			_, h, v := s.conductivityParts(sc.temperature(u))
			if which == 0 {
				return h
			}
			return v
		}
	}
	h, err := fitPolynomial(conductivityDegree, part(0))
	if err == nil {
		var v []float64
		if v, err = fitPolynomial(conductivityDegree, part(1)); err == nil {
			f.hCoef = append(f.hCoef, h...)
			f.vCoef = append(f.vCoef, v...)
			worst := 0.0
			for i := 0; i < errorNodes; i++ {
				u := -1 + 2*float64(i)/float64(errorNodes-1)
				T := sc.temperature(u)
				fit := math.Exp(horner(muCoef, u)) / s.W * thermo.GasConstant * (horner(h, u) + horner(v, u)*s.thermo.CpR(T))
				worst = math.Max(worst, rel(fit, s.conductivity(T)))
			}
			f.note(s.name+" conductivity", worst)
			return nil
		}
	}
	return fmt.Errorf("transport: fitting %s conductivity over %g-%g K: %w", s.name, sc.tMin, sc.tMax, err)
}

// wilkeFactors precomputes the temperature-independent parts of Wilke's
// interaction parameter (Wilke, J. Chem. Phys. 18 (1950) 517):
//
//	Phi_kj = (1/sqrt 8) (1 + W_k/W_j)^(-1/2) [1 + (mu_k/mu_j)^(1/2) (W_j/W_k)^(1/4)]^2
func (f *fitted) wilkeFactors() {
	K := len(f.species)
	f.wilkeA = make([]float64, K*K)
	f.w4 = make([]float64, K)
	for k := 0; k < K; k++ {
		f.w4[k] = math.Sqrt(math.Sqrt(f.species[k].W))
		for j := 0; j < K; j++ {
			f.wilkeA[k*K+j] = 1 / math.Sqrt(8*(1+f.species[k].W/f.species[j].W))
		}
	}
}

func newModel(f *fitted) *Model {
	K := len(f.species)
	return &Model{
		fit:     f,
		cachedT: math.NaN(),
		mu:      make([]float64, K),
		alpha:   make([]float64, K),
		beta:    make([]float64, K),
		lambda:  make([]float64, K),
		q:       make([]float64, K*K),
		tdf:     make([]float64, len(f.light)*K*3),
		x:       make([]float64, K),
		xb:      make([]float64, K),
	}
}

// Clone returns a Model sharing t's fits with its own work arrays, for use
// in another goroutine.
func (t *Model) Clone() *Model { return newModel(t.fit) }

// MaxFitError returns the largest relative error of the fits against the
// theory they replace, over all species viscosities and conductivities, pair
// diffusion coefficients and the collision ratios A*, B*, 6C* - 5 of the
// light species' pairs (these absolute), measured on a grid finer than the
// fit nodes. The fits of the multicomponent model are reported by
// MulticomponentFitError.
func (t *Model) MaxFitError() float64 { return t.fit.maxErr }

// Range returns the fit range, K.
func (t *Model) Range() (TMin, TMax float64) { return t.fit.scale.tMin, t.fit.scale.tMax }

// setTemperature evaluates every fitted species and pair quantity at T
// (clamped to the fit range), unless already done for this T.
func (t *Model) setTemperature(T float64) {
	if T == t.cachedT {
		return
	}
	t.cachedT = T
	f := t.fit
	T = math.Min(math.Max(T, f.scale.tMin), f.scale.tMax)
	u := f.scale.u(T)
	t.tPow = T * math.Sqrt(T)
	K := len(f.species)
	const nm, nl = viscosityDegree + 1, conductivityDegree + 1
	for k := 0; k < K; k++ {
		s := &f.species[k]
		lm := horner(f.muCoef[k*nm:(k+1)*nm], u)
		t.mu[k] = math.Exp(lm)
		sq := math.Exp(lm / 2)
		t.alpha[k] = sq / f.w4[k]
		t.beta[k] = f.w4[k] / sq
		h := horner(f.hCoef[k*nl:(k+1)*nl], u)
		v := horner(f.vCoef[k*nl:(k+1)*nl], u)
		t.lambda[k] = t.mu[k] / s.W * thermo.GasConstant * (h + v*s.thermo.CpR(T))
	}
	// Horner written out for degree 4: the constants below fail to compile
	// if diffusionDegree changes.
	const _, _ = uint(diffusionDegree - 4), uint(4 - diffusionDegree)
	i := 0
	for j := 0; j < K; j++ {
		for k := j + 1; k < K; k++ {
			c := &f.dCoef[i]
			i++
			v := (((c[4]*u+c[3])*u+c[2])*u+c[1])*u + c[0]
			t.q[j*K+k] = v
			t.q[k*K+j] = v
		}
	}
	const nt = pairDegree + 1
	for i := range t.tdf {
		t.tdf[i] = horner(f.tdCoef[i*nt:(i+1)*nt], u)
	}
}

// setComposition stores max(X_k, 0) + floor, renormalised, in t.x.
func (t *Model) setComposition(X []float64) {
	x := t.x
	_ = X[len(x)-1]
	sum := 0.0
	for k := range x {
		v := X[k]
		if v < 0 {
			v = 0
		}
		v += moleFractionFloor
		x[k] = v
		sum += v
	}
	inv := 1 / sum
	for k := range x {
		x[k] *= inv
	}
}

// wilke returns the mixture viscosity of t.x at the cached temperature:
// mu = sum_k x_k mu_k / sum_j x_j Phi_kj (Wilke 1950).
func (t *Model) wilke() float64 {
	f := t.fit
	K := len(t.x)
	x, beta := t.x, t.beta
	mu := 0.0
	for k := 0; k < K; k++ {
		a := f.wilkeA[k*K : (k+1)*K]
		ak := t.alpha[k]
		den := 0.0
		for j := range a {
			s := 1 + ak*beta[j]
			den += x[j] * a[j] * s * s
		}
		mu += x[k] * t.mu[k] / den
	}
	return mu
}

// mathurTondonSaxena returns the mixture conductivity of t.x at the cached
// temperature: lambda = (1/2)(sum_k x_k lambda_k + 1/sum_k (x_k/lambda_k))
// (Mathur, Tondon & Saxena, Mol. Phys. 12 (1967) 569).
func (t *Model) mathurTondonSaxena() float64 {
	s, r := 0.0, 0.0
	for k, xk := range t.x {
		s += xk * t.lambda[k]
		r += xk / t.lambda[k]
	}
	return (s + 1/r) / 2
}

// mixtureDiffusion fills D with D_km at pressure P from t.x:
//
//	D_km = (1 - Y_k) / sum_{j != k} x_j/D_jk
//
// (the approximation of Hirschfelder & Curtiss, J. Chem. Phys. 17 (1949)
// 550, in mass-fraction form; e.g. Kee, Coltrin & Glarborg, Chemically
// Reacting Flow, Wiley 2003, ch. 12), with
// 1 - Y_k = sum_{j != k} x_j W_j / sum_j x_j W_j evaluated from the floored
// x. For a pure species k (every other X_j = 0) the floor gives the finite
// limit D_km = (sum_{j != k} W_j / W_k)/(sum_{j != k} 1/D_jk).
func (t *Model) mixtureDiffusion(P float64, D []float64) {
	f := t.fit
	K := len(t.x)
	x := t.x
	_ = D[K-1]
	wMean := 0.0
	for k := range x {
		wMean += x[k] * f.species[k].W
	}
	scale := t.tPow / (P * wMean)
	for k := 0; k < K; k++ {
		q := t.q[k*K : (k+1)*K]
		s := 0.0
		for j, qj := range q {
			s += x[j] * qj // q_kk = 0
		}
		D[k] = (wMean - x[k]*f.species[k].W) * scale / s
	}
}

// thermalDiffusion fills theta with the thermal diffusion ratios of the
// light species from t.x (zero for the others): the first-approximation
// ratios of the multicomponent model (thermalSystem), with its S-S system
// reduced to the diagonal for the light species and to the pure-gas
// solution b_j = (3/2) eta_j/(P W_j^(1/2)) for the others:
//
//	S_ll  = X_l (5/2) P/eta_l + sum_{k != l} X_k 8 M_k g_lk (15/2 M_l^2 + 25/4 M_k^2 - 3 M_k^2 B* + 4 M_l M_k A*)
//	b_l   = (15/4)/(W_l^(1/2) S_ll)
//	Theta_l = (8/3) W_l^(1/2) sum_{j != l} g_lj (6C* - 5) (M_l^(3/2) M_j^(1/2) X_l X_j b_j - M_j^2 X_j X_l b_l)
//
// (M_l = W_l/(W_l + W_j) in each pair; P cancels and is set to 1). In the
// mixtures of hydrogen flames this is within 2-6% of the full first
// approximation, where the isotopic formula f_kj (W_k - W_j)/(W_k + W_j)
// of Chapman & Cowling (1970, sec. 10.3), the usual mixture-averaged
// choice, overstates it by 15-80% (docs/transport.md).
func (t *Model) thermalDiffusion(theta []float64) {
	f := t.fit
	K := len(t.x)
	x := t.x
	_ = theta[K-1]
	for k := range theta {
		theta[k] = 0
	}
	gScale := 3 * thermo.GasConstant * t.cachedT / (16 * t.tPow) // g_ij = gScale q_ij/mu_ij at P = 1
	// xb_j = X_j b_j: pure-gas values, replaced for the light species below.
	xb := t.xb
	for j := range xb {
		xb[j] = 1.5 * x[j] * t.mu[j] / math.Sqrt(f.species[j].W)
	}
	for i, l := range f.light {
		Wl := f.species[l].W
		ratios := t.tdf[i*K*3 : (i+1)*K*3]
		s := 2.5 * x[l] / t.mu[l]
		for k := 0; k < K; k++ {
			if k == l {
				continue
			}
			ml, mk, g := t.pairMasses(l, k, gScale)
			A, B := ratios[3*k], ratios[3*k+1]
			s += x[k] * 8 * mk * g * (7.5*ml*ml + 6.25*mk*mk - 3*mk*mk*B + 4*ml*mk*A)
		}
		xb[l] = 3.75 * x[l] / (math.Sqrt(Wl) * s)
	}
	for i, l := range f.light {
		Wl := f.species[l].W
		ratios := t.tdf[i*K*3 : (i+1)*K*3]
		v := 0.0
		for j := 0; j < K; j++ {
			if j == l {
				continue
			}
			ml, mj, g := t.pairMasses(l, j, gScale)
			v += g * ratios[3*j+2] * (ml*math.Sqrt(ml*mj)*x[l]*xb[j] - mj*mj*x[j]*xb[l])
		}
		theta[l] = 8.0 / 3 * math.Sqrt(Wl) * v
	}
}

// Viscosity returns the mixture viscosity at T, K, and mole fractions X,
// Pa s, by Wilke's rule (Wilke, J. Chem. Phys. 18 (1950) 517).
func (t *Model) Viscosity(T float64, X []float64) float64 {
	t.setTemperature(T)
	t.setComposition(X)
	return t.wilke()
}

// Conductivity returns the mixture thermal conductivity at T, K, and mole
// fractions X, W/(m K), by the combination rule of Mathur, Tondon & Saxena,
// Mol. Phys. 12 (1967) 569.
func (t *Model) Conductivity(T float64, X []float64) float64 {
	t.setTemperature(T)
	t.setComposition(X)
	return t.mathurTondonSaxena()
}

// MixtureDiffusion fills D (len K) with the mixture-averaged diffusion
// coefficients D_km at T, K, and P, Pa, in m^2/s. X are the mole fractions;
// Y, the matching mass fractions, are accepted for callers that hold both
// but not read: 1 - Y_k is formed from X (see mixtureDiffusion) so that it
// stays accurate and positive as Y_k -> 1.
func (t *Model) MixtureDiffusion(T, P float64, X, Y []float64, D []float64) {
	t.setTemperature(T)
	t.setComposition(X)
	t.mixtureDiffusion(P, D)
}

// ThermalDiffusionRatios fills theta (len K) with the thermal diffusion
// ratios Theta_k at T, K, and mole fractions X. They are non-zero only for
// the light species (molar mass below 5 g/mol), from the first
// approximation of Chapman-Enskog theory (see thermalDiffusion). The
// sign convention is that of the thermal diffusion velocity
// V_k^T = -(D_km Theta_k/X_k) (1/T) dT/dx: light species have Theta_k < 0
// and move towards the hot side.
func (t *Model) ThermalDiffusionRatios(T float64, X []float64, theta []float64) {
	t.setTemperature(T)
	t.setComposition(X)
	t.thermalDiffusion(theta)
}

// MixtureProperties collects the mixture-averaged properties at one state.
// Diffusion and ThermalDiffusionRatios are allocated by the caller, len K.
type MixtureProperties struct {
	Viscosity    float64   // Pa s
	Conductivity float64   // W/(m K)
	Diffusion    []float64 // D_km, m^2/s
	// ThermalDiffusionRatios are skipped when nil.
	ThermalDiffusionRatios []float64
}

// Mixture evaluates every mixture property at T, K, P, Pa, and mole
// fractions X (mass fractions Y as in MixtureDiffusion), sharing the
// species and pair evaluations.
func (t *Model) Mixture(T, P float64, X, Y []float64, out *MixtureProperties) {
	t.setTemperature(T)
	t.setComposition(X)
	out.Viscosity = t.wilke()
	out.Conductivity = t.mathurTondonSaxena()
	t.mixtureDiffusion(P, out.Diffusion)
	if out.ThermalDiffusionRatios != nil {
		t.thermalDiffusion(out.ThermalDiffusionRatios)
	}
}

// SpeciesViscosity returns the viscosity of pure species k at T, Pa s, from
// the theory (no fit).
func (t *Model) SpeciesViscosity(k int, T float64) float64 {
	return t.fit.species[k].viscosity(T)
}

// SpeciesConductivity returns the thermal conductivity of pure species k at
// T, W/(m K), from the theory (no fit).
func (t *Model) SpeciesConductivity(k int, T float64) float64 {
	return t.fit.species[k].conductivity(T)
}

// BinaryDiffusion returns the binary diffusion coefficient D_jk at T, K, and
// P, Pa, in m^2/s, from the theory (no fit). j == k gives the
// self-diffusion coefficient.
func (t *Model) BinaryDiffusion(j, k int, T, P float64) float64 {
	p := combine(&t.fit.species[j], &t.fit.species[k])
	return p.diffusionTimesPressure(T) / P
}
