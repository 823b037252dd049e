package flame

import (
	"math"
	"slices"

	"flame1d/thermo"
	"flame1d/transport"
)

// DiffusionModel selects how the diffusive species fluxes are formed.
type DiffusionModel int

const (
	// MixtureAveraged (the zero value, the default): Fickian fluxes with a
	// mixture-averaged coefficient per species, thermal diffusion of the
	// light species (transport.Model.ThermalDiffusionRatios) and a
	// correction flux -Y_k sum_i j_i so that the fluxes sum to zero.
	MixtureAveraged DiffusionModel = iota
	// Multicomponent: the Stefan-Maxwell relations with every binary
	// coefficient, thermal diffusion ratios of every species and the
	// multicomponent conductivity (transport.Model.Multicomponent). The
	// fluxes sum to zero by construction.
	Multicomponent
)

// multicomponentFaces holds, for every cell face, the multicomponent
// transport state that the frozen-property Jacobian reuses: the factorised
// Stefan-Maxwell system, chi_k/T and the molar concentration, and the state
// and fluxes they were evaluated with.
type multicomponentFaces struct {
	systems   []*transport.StefanMaxwell
	chiOverT  []float64 // (n-1)*K, 1/K
	molarConc []float64 // rho/W at the face, mol/m^3
	// baseU holds the unknowns of both points of each face, (n-1)*2*b, and
	// baseFlux the fluxes, (n-1)*K, at the last unfrozen evaluation: a
	// Jacobian column that perturbs neither point reuses the fluxes.
	baseU, baseFlux []float64
}

// multicomponentScratch is one worker's work space.
type multicomponentScratch struct {
	props transport.MulticomponentProperties
	force []float64 // driving force d_k, then N_k = X_k V_k
}

// setDiffusion switches the problem to the diffusion model of set.
func (p *problem) setDiffusion(model DiffusionModel) {
	if model != Multicomponent {
		p.multi = nil
		return
	}
	K := p.ph.nSpecies
	f := &multicomponentFaces{
		systems:   make([]*transport.StefanMaxwell, p.n-1),
		chiOverT:  make([]float64, (p.n-1)*K),
		molarConc: make([]float64, p.n-1),
		baseU:     make([]float64, (p.n-1)*2*p.b),
		baseFlux:  make([]float64, (p.n-1)*K),
	}
	for j := range f.systems {
		f.systems[j] = transport.NewStefanMaxwell(K)
	}
	p.multi = f
	for _, w := range p.workers {
		w.mc = &multicomponentScratch{
			props: transport.MulticomponentProperties{ThermalDiffusionRatios: make([]float64, K)},
			force: make([]float64, K),
		}
	}
}

// multicomponentFlux fills p.flux and p.lambda at face j (between points j
// and j+1) from the Stefan-Maxwell relations
//
//	sum_i X_k X_i (V_i - V_k)/D_ki = dX_k/dx + chi_k (1/T) dT/dx,  sum_k Y_k V_k = 0,
//
// discretised like the mixture-averaged flux: differences across the face,
// properties at the face mean state; j_k = (rho/W) W_k X_k V_k. While the
// Jacobian is formed (transport frozen) the factorised system, chi_k/T and rho/W of
// the base state are reused, so a perturbed flux costs one pair of
// triangular solves, and a face whose points are not perturbed none.
// A state the properties cannot be evaluated at gives NaN fluxes, which the
// residual reports.
func (p *problem) multicomponentFlux(w *worker, u []float64, j int, e evaluation) {
	K := p.ph.nSpecies
	f := p.multi
	a, b := j*p.b, (j+1)*p.b
	Ta, Tb := u[a+compT], u[b+compT]
	chiT := f.chiOverT[j*K : (j+1)*K]
	fl := p.flux[j*K : (j+1)*K]
	ends := u[a : b+p.b]
	base := f.baseU[j*2*p.b : (j+1)*2*p.b]
	baseFlux := f.baseFlux[j*K : (j+1)*K]
	frozen := e.transportFrozen
	if frozen && slices.Equal(ends, base) {
		copy(fl, baseFlux)
		return
	}
	if !frozen {
		Tm, _ := p.midpointState(w, u, j)
		props := &w.mc.props
		if err := w.tr.Multicomponent(Tm, p.pressure, w.xMid, f.systems[j], props); err != nil {
			for k := range fl {
				fl[k] = math.NaN()
			}
			return
		}
		p.lambda[j] = props.Conductivity
		f.molarConc[j] = p.pressure / (thermo.GasConstant * Tm)
		for k := range chiT {
			chiT[k] = 0
			if p.thermalDiff {
				chiT[k] = props.ThermalDiffusionRatios[k] / Tm
			}
		}
	}
	dx := p.x[j+1] - p.x[j]
	dTdx := (Tb - Ta) / dx
	Xa, Xb := p.X[j*K:(j+1)*K], p.X[(j+1)*K:(j+2)*K]
	d := w.mc.force
	for k := range d {
		d[k] = (Xb[k]-Xa[k])/dx + chiT[k]*dTdx
	}
	f.systems[j].MolarFluxes(d, d)
	c := f.molarConc[j]
	for k := range fl {
		fl[k] = c * p.ph.molarMass[k] * d[k]
	}
	if !frozen {
		copy(base, ends)
		copy(baseFlux, fl)
	}
}
