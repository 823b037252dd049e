package transport

import (
	"math"

	"flame1d/chem"
	"flame1d/thermo"
)

// molecule is one species' kinetic-theory data in SI units.
type molecule struct {
	name     string
	W        float64 // molar mass, kg/mol
	mass     float64 // molecular mass, kg
	geometry chem.Geometry
	eps      float64 // well depth epsilon/k_B, K
	sigma    float64 // collision diameter, m
	dipole   float64 // C m
	alpha    float64 // polarizability volume, m^3
	zrot298  float64 // rotational collision number at 298 K
	delta    float64 // reduced dipole delta* = mu^2/(2 (4 pi eps0) epsilon sigma^3)
	thermo   thermo.NASA7
}

// pair is the potential of one interacting pair after the combining rules.
type pair struct {
	eps   float64 // K
	sigma float64 // m
	delta float64 // reduced dipole of the pair
	mred  float64 // reduced mass m_j m_k/(m_j + m_k), kg
}

// reducedDipole returns delta* = mu^2/(2 (4 pi eps0) k_B epsilon sigma^3),
// the Stockmayer strength parameter of Monchick & Mason, J. Chem. Phys. 35
// (1961) 1676, eq. (8), written in SI.
func reducedDipole(dipole, eps, sigma float64) float64 {
	return dipole * dipole / (2 * fourPiEps0 * boltzmann * eps * sigma * sigma * sigma)
}

// combine returns the pair potential of molecules a and b.
//
// Two non-polar or two polar molecules: sigma = (sigma_a + sigma_b)/2,
// epsilon = sqrt(epsilon_a epsilon_b), delta* = mu_a mu_b/(2 (4 pi eps0)
// k_B epsilon sigma^3) (Monchick & Mason 1961).
//
// One polar (p) and one non-polar (n) molecule: the dipole of p induces one
// in n, which deepens the well; Hirschfelder, Curtiss & Bird, Molecular
// Theory of Gases and Liquids (1954), sec. 8.6 (eqs. 8.6-8 to 8.6-10;
// equation numbers from memory). The mean induction energy of a dipole
// mu_p and a molecule of polarizability volume alpha_n,
// -alpha_n mu_p^2/((4 pi eps0) r^6) (HCB 1954, sec. 13.3), is added to the
// r^-6 term of the Lennard-Jones pair (with sigma^6 ~ sigma_n^3 sigma_p^3)
// and the r^-12 term kept, which gives
//
//	xi      = 1 + (1/4) alpha_n* mu_p*^2 sqrt(epsilon_p/epsilon_n)
//	epsilon = sqrt(epsilon_p epsilon_n) xi^2
//	sigma   = (sigma_p + sigma_n)/2 xi^(-1/6)
//
// with alpha_n* = alpha_n/sigma_n^3 and mu_p*^2 = mu_p^2/((4 pi eps0)
// k_B epsilon_p sigma_p^3) = 2 delta*_p; the pair is then treated as
// non-polar. (Until this was corrected, mu_p* entered to the first power,
// which is not an induction energy: for H2O-N2 xi was 1.035, not 1.055.)
func combine(a, b *molecule) pair {
	p := pair{
		eps:   math.Sqrt(a.eps * b.eps),
		sigma: (a.sigma + b.sigma) / 2,
		mred:  a.mass * b.mass / (a.mass + b.mass),
	}
	polarA, polarB := a.dipole != 0, b.dipole != 0
	switch {
	case polarA && polarB:
		p.delta = a.dipole * b.dipole / (2 * fourPiEps0 * boltzmann * p.eps * p.sigma * p.sigma * p.sigma)
	case polarA || polarB:
		pol, non := a, b
		if polarB {
			pol, non = b, a
		}
		alphaStar := non.alpha / (non.sigma * non.sigma * non.sigma)
		muStar2 := 2 * reducedDipole(pol.dipole, pol.eps, pol.sigma)
		xi := 1 + alphaStar*muStar2*math.Sqrt(pol.eps/non.eps)/4
		p.eps *= xi * xi
		p.sigma *= math.Pow(xi, -1.0/6)
	}
	return p
}

// viscosity returns the Chapman-Enskog first-approximation viscosity of a
// pure gas, Pa s (Hirschfelder, Curtiss & Bird 1954, eq. 8.2-18):
//
//	mu = (5/16) sqrt(pi m k_B T) / (pi sigma^2 Omega(2,2)*(T*, delta*))
func (s *molecule) viscosity(T float64) float64 {
	c := collisionIntegrals(T/s.eps, s.delta)
	return 5.0 / 16 * math.Sqrt(math.Pi*s.mass*boltzmann*T) / (math.Pi * s.sigma * s.sigma * c.O22)
}

// diffusionTimesPressure returns the Chapman-Enskog first-approximation
// binary diffusion coefficient times pressure, D_jk P, in Pa m^2/s (Hirschfelder, Curtiss & Bird
// 1954, eq. 8.2-44):
//
//	D_jk = (3/16) sqrt(2 pi k_B^3 T^3/m_jk) / (P pi sigma_jk^2 Omega(1,1)*(T*_jk, delta*_jk))
func (p *pair) diffusionTimesPressure(T float64) float64 {
	c := collisionIntegrals(T/p.eps, p.delta)
	return 3.0 / 16 * math.Sqrt(2*math.Pi*boltzmann*boltzmann*boltzmann*T*T*T/p.mred) /
		(math.Pi * p.sigma * p.sigma * c.O11)
}

// parkerF is Parker's temperature function of rotational relaxation, Phys.
// Fluids 2 (1959) 449, in the form of Brau & Jonkman, J. Chem. Phys. 52
// (1970) 477:
//
//	F(T) = 1 + (pi^(3/2)/2) (eps/T)^(1/2) + (pi^2/4 + 2) (eps/T) + pi^(3/2) (eps/T)^(3/2)
//
// so that Z_rot(T) = Z_rot(298 K) F(298 K)/F(T).
func parkerF(epsOverT float64) float64 {
	const pi32 = 5.568327996831708 // pi^(3/2)
	r := math.Sqrt(epsOverT)
	return 1 + pi32/2*r + (math.Pi*math.Pi/4+2)*epsOverT + pi32*epsOverT*r
}

// conductivity returns the thermal conductivity of a pure gas, W/(m K),
// by the Mason & Monchick (1962) treatment of internal energy transport in
// the form of Warnatz (1982, in Numerical Methods in Laminar Flame
// Propagation, Vieweg, pp. 87-111):
//
//	lambda = (mu/W) (f_trans cv_trans + f_rot cv_rot + f_vib cv_vib)
//	f_trans = (5/2) (1 - (2/pi) (cv_rot/cv_trans) (A/B))
//	f_rot   = (rho D_kk/mu) (1 + (2/pi) A/B)
//	f_vib   = rho D_kk/mu
//	A = 5/2 - rho D_kk/mu
//	B = Z_rot(T) + (2/pi) ((5/3) cv_rot/R + rho D_kk/mu)
//
// with molar heat capacities cv_trans = 3R/2, cv_rot = R (linear) or 3R/2
// (nonlinear), cv_vib = cv - cv_trans - cv_rot from the species' NASA-7
// cp (cv = cp - R), and rho D_kk/mu = (6/5) A*_kk the self-diffusion ratio.
// An atom has lambda = (15/4) R mu/W (Chapman-Enskog first approximation).
// cv_vib is used as it comes: for H2 below ~300 K it is slightly negative
// because the rotational modes are not fully excited, and the total cv stays
// right.
func (s *molecule) conductivity(T float64) float64 {
	mu, h, v := s.conductivityParts(T)
	return mu / s.W * thermo.GasConstant * (h + v*s.thermo.CpR(T))
}

// conductivityParts splits the conductivity as
// lambda = (mu/W) R (h + v cp/R): h and v depend on T only through the
// collision integrals and Z_rot, smoothly, while cp/R comes from the NASA-7
// polynomials, whose slope jumps at their mid temperature. Fitting h and v
// and evaluating cp exactly keeps that kink out of the fits.
func (s *molecule) conductivityParts(T float64) (mu, h, v float64) {
	c := collisionIntegrals(T/s.eps, s.delta)
	mu = 5.0 / 16 * math.Sqrt(math.Pi*s.mass*boltzmann*T) / (math.Pi * s.sigma * s.sigma * c.O22)
	const cvTrans = 1.5 // cv_trans/R
	if s.geometry == chem.Atom {
		return mu, 2.5 * cvTrans, 0
	}
	cvRot := 1.0 // cv_rot/R
	if s.geometry == chem.Nonlinear {
		cvRot = 1.5
	}
	rhoDoverMu := 1.2 * c.A
	zrot := s.zrot298 * parkerF(s.eps/298) / parkerF(s.eps/T)
	a := 2.5 - rhoDoverMu
	b := zrot + 2/math.Pi*(5.0/3*cvRot+rhoDoverMu)
	fTrans := 2.5 * (1 - 2/math.Pi*(cvRot/cvTrans)*(a/b))
	fRot := rhoDoverMu * (1 + 2/math.Pi*a/b)
	fVib := rhoDoverMu
	// cv_vib/R = cp/R - 1 - cv_trans/R - cv_rot/R
	return mu, fTrans*cvTrans + fRot*cvRot - fVib*(1+cvTrans+cvRot), fVib
}
