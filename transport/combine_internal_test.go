package transport

import (
	"math"
	"testing"
)

// The combined potential of a polar and a non-polar molecule is a
// Lennard-Jones potential whose r^-12 term is that of the pair and whose
// r^-6 term holds, in addition, the mean induction energy of the dipole and
// the induced dipole, -alpha_n mu_p^2/((4 pi eps0) r^6) (Hirschfelder,
// Curtiss & Bird 1954, sec. 13.3, with sigma^6 ~ sigma_n^3 sigma_p^3 as in
// their sec. 8.6; section numbers from memory). Both coefficients are
// checked to round-off, so an induction term with the wrong power of the
// dipole (as before the correction, mu_p* instead of mu_p*^2) fails.
func TestCombinePolarNonPolarInduction(t *testing.T) {
	const debye, angstrom = 3.33564e-30, 1e-10
	// H2O and N2 as in GRI-Mech 3.0's transport data (Smith et al. 1999).
	water := molecule{eps: 572.4, sigma: 2.605 * angstrom, dipole: 1.844 * debye}
	nitrogen := molecule{eps: 97.53, sigma: 3.621 * angstrom, alpha: 1.76e-30}
	for _, order := range [][2]*molecule{{&water, &nitrogen}, {&nitrogen, &water}} {
		p := combine(order[0], order[1])
		if p.delta != 0 {
			t.Errorf("polar-non-polar pair has delta* %g, want 0 (treated as non-polar)", p.delta)
		}
		eps0 := math.Sqrt(water.eps * nitrogen.eps)
		sig0 := (water.sigma + nitrogen.sigma) / 2
		c12 := func(eps, sigma float64) float64 { return 4 * boltzmann * eps * math.Pow(sigma, 12) }
		c6 := func(eps, sigma float64) float64 { return 4 * boltzmann * eps * math.Pow(sigma, 6) }
		if e := relErr(c12(p.eps, p.sigma), c12(eps0, sig0)); e > 1e-13 {
			t.Errorf("r^-12 coefficient changed by %.3g: must be that of the pair", e)
		}
		induction := nitrogen.alpha * water.dipole * water.dipole / fourPiEps0 *
			math.Pow(sig0, 6) / (math.Pow(water.sigma, 3) * math.Pow(nitrogen.sigma, 3))
		if e := relErr(c6(p.eps, p.sigma), c6(eps0, sig0)+induction); e > 1e-13 {
			t.Errorf("r^-6 coefficient %.6g, want the pair's %.6g plus the induction %.6g (rel. error %.3g)",
				c6(p.eps, p.sigma), c6(eps0, sig0), induction, e)
		}
		// xi for H2O-N2, by hand: alpha* = 1.76/3.621^3 = 0.03707,
		// mu*^2 = 2 delta* = 2.434, sqrt(572.4/97.53) = 2.4226:
		// 1 + 0.25 0.03707 2.434 2.4226 = 1.0547.
		if xi := math.Sqrt(p.eps / eps0); math.Abs(xi-1.0547) > 2e-4 {
			t.Errorf("xi = %.5f, hand calculation 1.0547", xi)
		}
	}
}

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }
