package transport

// WorstFit names the fitted quantity with the largest error (tests only).
func (t *Model) WorstFit() string { return t.fit.maxErrWhat }

// Molecule holds the kinetic-theory parameters of a trial species for the
// parameter scans of the tests: molar mass kg/mol, well depth K, diameter
// m, dipole C m, polarizability volume m^3.
type Molecule struct{ W, Eps, Sigma, Dipole, Alpha float64 }

func (m Molecule) molecule() molecule {
	return molecule{W: m.W, mass: m.W / avogadro, eps: m.Eps, sigma: m.Sigma, dipole: m.Dipole, alpha: m.Alpha,
		delta: reducedDipole(m.Dipole, m.Eps, m.Sigma)}
}

// Covers reports whether the collision-integral table covers m over
// tMin-tMax K.
func (m Molecule) Covers(tMin, tMax float64) bool {
	d := reducedDipole(m.Dipole, m.Eps, m.Sigma)
	return tableCovers(tMin/m.Eps, d) && tableCovers(tMax/m.Eps, d)
}

// Viscosity is the first-approximation viscosity of m at T, Pa s.
func (m Molecule) Viscosity(T float64) float64 { s := m.molecule(); return s.viscosity(T) }

// PairDiffusion is the first-approximation binary diffusion coefficient of
// a and b at T, K, and P, Pa, m^2/s.
func PairDiffusion(a, b Molecule, T, P float64) float64 {
	sa, sb := a.molecule(), b.molecule()
	p := combine(&sa, &sb)
	return p.diffusionTimesPressure(T) / P
}

// SpeciesConductivityZrot is the conductivity of species k at T with the
// rotational collision number at 298 K set to zrot298 (tests only).
func (t *Model) SpeciesConductivityZrot(k int, T, zrot298 float64) float64 {
	s := t.fit.species[k]
	s.zrot298 = zrot298
	return s.conductivity(T)
}
