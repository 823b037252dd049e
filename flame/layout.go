// Package flame sets up and solves the steady, isobaric, low-Mach 1-D freely
// propagating premixed flame: the species and energy equations on an adaptive
// grid with the mass flux m = rho u as eigenvalue, pinned by fixing the
// temperature at one interior point.
//
// Governing equations (Kee, Coltrin & Glarborg 2003, "Chemically Reacting
// Flow", ch. 16; Smooke, Miller & Kee 1983):
//
//	m dY_k/dx + d(j_k)/dx - w_k W_k = 0
//	m cp dT/dx - d(lambda dT/dx)/dx + (sum_k j_k cp_k) dT/dx + sum_k h_k w_k = 0
//	dm/dx = 0
//
// with j_k = rho Y_k V_k the diffusive mass flux (mixture-averaged Fickian
// diffusion, optional thermal diffusion of light species, and a correction
// velocity so that sum_k j_k = 0 exactly).
package flame

// Unknowns at each grid point are stored point-major in one vector:
// u[j*block + c] with c = 0 the temperature, c = 1..K the species mass
// fractions and c = K+1 the mass flux.
const compT = 0

func compY(k int) int            { return 1 + k }
func compM(nSpecies int) int     { return nSpecies + 1 }
func blockSize(nSpecies int) int { return nSpecies + 2 }
