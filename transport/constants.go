package transport

import "math"

// Physical constants, SI. CODATA 2018 (exact since the 2019 SI redefinition
// except the vacuum permittivity).
const (
	boltzmann = 1.380649e-23     // k_B, J/K (exact)
	avogadro  = 6.02214076e23    // N_A, 1/mol (exact)
	epsilon0  = 8.8541878128e-12 // vacuum permittivity, F/m (CODATA 2018)
)

// fourPiEps0 is 4 pi epsilon_0 in C^2/(J m): a dipole energy mu1 mu2/r^3 in
// Gaussian form becomes mu1 mu2/(4 pi eps0 r^3) in SI.
const fourPiEps0 = 4 * math.Pi * epsilon0
