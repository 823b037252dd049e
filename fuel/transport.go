package fuel

import (
	"fmt"
	"math"

	"flame1d/chem"
)

// alkaneCritical lists critical temperature (K), critical pressure (bar)
// and acentric factor of the n-alkanes C5-C16 against molar mass (g/mol):
// Poling, Prausnitz & O'Connell, "The Properties of Gases and Liquids",
// 5th ed. (2001), Appendix A (values quoted from memory, to the digits
// shown).
var alkaneCritical = []struct {
	W, Tc, Pc, omega float64
}{
	{72.15, 469.7, 33.70, 0.252},  // n-pentane
	{86.18, 507.6, 30.25, 0.301},  // n-hexane
	{100.20, 540.2, 27.40, 0.350}, // n-heptane
	{114.23, 568.7, 24.90, 0.399}, // n-octane
	{128.26, 594.6, 22.90, 0.445}, // n-nonane
	{142.29, 617.7, 21.10, 0.490}, // n-decane
	{156.31, 639.0, 19.50, 0.537}, // n-undecane
	{170.34, 658.0, 18.20, 0.576}, // n-dodecane
	{184.37, 675.0, 16.80, 0.619}, // n-tridecane
	{198.39, 693.0, 15.70, 0.643}, // n-tetradecane
	{212.42, 708.0, 14.80, 0.685}, // n-pentadecane
	{226.45, 723.0, 14.00, 0.717}, // n-hexadecane
}

// EstimateTransport returns Lennard-Jones parameters for a lumped fuel of
// molar mass W (kg/mol): critical constants interpolated linearly in molar
// mass between the n-alkanes C5-C16 (alkaneCritical), then the
// corresponding-states correlation of Tee, Gotoh & Stewart (1966, Ind.
// Eng. Chem. Fundam. 5, 356; coefficients quoted from memory):
//
//	sigma (Pc/Tc)^(1/3) = 2.3551 - 0.087 omega    (sigma in Å, Pc in atm)
//	epsilon/(k Tc)      = 0.7915 + 0.1693 omega
//
// Nonlinear, no dipole, no polarizability, Z_rot = 1. For n-heptane this
// gives 459.6 K and 6.31 Å, against 459.6 K and 6.253 Å in the transport
// file of Lu, Law, Yoo & Chen (2009). Fuels rich in aromatics or
// cycloalkanes are less well served; give [transport] yourself then.
func EstimateTransport(W float64) (chem.TransportParams, error) {
	wg := W * 1e3
	first, last := alkaneCritical[0], alkaneCritical[len(alkaneCritical)-1]
	if !(wg >= first.W && wg <= last.W) {
		return chem.TransportParams{}, fmt.Errorf("transport estimate: molar mass %.4g g/mol is outside the n-alkane range %.5g-%.5g g/mol (C5-C16) of the correlation; give [fuels.NAME.kinetic_theory] lj_well_depth_K and lj_diameter for this fuel",
			wg, first.W, last.W)
	}
	i := 1
	for i < len(alkaneCritical)-1 && alkaneCritical[i].W < wg {
		i++
	}
	a, b := alkaneCritical[i-1], alkaneCritical[i]
	t := (wg - a.W) / (b.W - a.W)
	Tc := a.Tc + t*(b.Tc-a.Tc)
	Pc := (a.Pc + t*(b.Pc-a.Pc)) * 1e5 / 101325 // atm
	om := a.omega + t*(b.omega-a.omega)
	sigma := (2.3551 - 0.087*om) / math.Cbrt(Pc/Tc) // Å
	eps := Tc * (0.7915 + 0.1693*om)
	return chem.TransportParams{
		Geometry:      chem.Nonlinear,
		WellDepth:     eps,
		Diameter:      sigma * 1e-10,
		RotRelaxation: 1,
	}, nil
}
