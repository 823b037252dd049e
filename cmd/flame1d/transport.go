package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/spf13/cobra"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/fuel"
	"flame1d/thermo"
	"flame1d/transport"
	"flame1d/units"
)

// transportRequest is what `flame1d transport` is asked to evaluate.
type transportRequest struct {
	Mechanism   string
	X           string // "CH4:0.095,O2:0.19,N2:0.715"; or Fuel/Oxidizer/Phi
	Fuel        string
	Oxidizer    string
	Phi         float64
	Temperature string // with units, e.g. "300 K"
	Pressure    string // with units, e.g. "1 atm"
	MinFraction float64
	All         bool
}

// transportSpecies is one row of the per-species table.
type transportSpecies struct {
	Name           string  `json:"name"`
	MoleFraction   float64 `json:"mole_fraction"`
	Diffusion      float64 `json:"mixture_diffusion_m2_s"`
	Lewis          float64 `json:"lewis_number"`
	ThermalDiffRat float64 `json:"thermal_diffusion_ratio"`
}

// transportReport is the result of `flame1d transport`. Field names carry units.
type transportReport struct {
	Mechanism    string             `json:"mechanism"`
	Temperature  float64            `json:"temperature_K"`
	Pressure     float64            `json:"pressure_Pa"`
	Composition  map[string]float64 `json:"mole_fractions"`
	Viscosity    float64            `json:"viscosity_Pa_s"`
	Conductivity float64            `json:"thermal_conductivity_W_m_K"`
	Cp           float64            `json:"cp_J_kg_K"`
	Density      float64            `json:"density_kg_m3"`
	Prandtl      float64            `json:"prandtl_number"`
	FitError     float64            `json:"max_fit_error"`
	Species      []transportSpecies `json:"species"`
	Note         string             `json:"note"`
}

const transportNote = "Mixture-averaged transport from kinetic theory (Chapman-Enskog, Wilke, " +
	"Mathur-Tondon-Saxena) on the mechanism's transport parameters. Model predictions: " +
	"where they feed safety decisions, confirm them against local codes and licensed practice."

func newTransportCmd() *cobra.Command {
	req := transportRequest{}
	var asJSON bool
	cmd := &cobra.Command{
		Use:   "transport",
		Short: "Mixture viscosity, conductivity, diffusion coefficients and Lewis numbers of a gas",
		Long: `Evaluate the mixture-averaged transport properties of a gas mixture at one
temperature and pressure: viscosity (Wilke), thermal conductivity
(Mathur-Tondon-Saxena), cp, density, Prandtl number, and per species the mixture
diffusion coefficient D_km, the Lewis number lambda/(rho cp D_km) and the
thermal diffusion ratio (light species only).

Give the composition either as mole fractions, --X "CH4:0.095,O2:0.19,N2:0.715"
(normalised), or as a premixed charge with --fuel, --oxidizer and --phi
(O2-equivalent equivalence ratio). Temperatures and pressures take units
("300 K", "25 C", "1 atm", "5 bar"); a bare number is K or Pa. Species below
--min-x are left out of the table unless --all is given.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			m, err := builtin.Load(req.Mechanism)
			if err != nil {
				return err
			}
			rep, err := computeTransport(m, req)
			if err != nil {
				return err
			}
			if asJSON {
				return writeJSON(cmd.OutOrStdout(), rep)
			}
			return rep.writeText(cmd.OutOrStdout())
		},
	}
	f := cmd.Flags()
	f.StringVar(&req.Mechanism, "mechanism", "smith1999-natgas", "built-in mechanism name or mechanism file (flame1d TOML)")
	f.StringVar(&req.X, "X", "", `mole fractions, e.g. "CH4:0.095,O2:0.19,N2:0.715"`)
	f.StringVar(&req.Fuel, "fuel", "", `fuel for a premixed charge, e.g. "CH4" or "CH4:0.9,C2H6:0.1"`)
	f.StringVar(&req.Oxidizer, "oxidizer", "O2:0.21,N2:0.79", "oxidizer for a premixed charge (mole fractions)")
	f.Float64Var(&req.Phi, "phi", 1, "equivalence ratio of the premixed charge")
	f.StringVar(&req.Temperature, "T", "300 K", "temperature")
	f.StringVar(&req.Pressure, "P", "1 atm", "pressure")
	f.Float64Var(&req.MinFraction, "min-x", 1e-6, "smallest mole fraction listed in the species table")
	f.BoolVar(&req.All, "all", false, "list every species")
	f.BoolVar(&asJSON, "json", false, "print JSON instead of text")
	return cmd
}

// transportComposition returns the mole fractions the request asks for.
func transportComposition(m *chem.Mechanism, set *thermo.SpeciesSet, req transportRequest) ([]float64, error) {
	hasX, hasFuel := strings.TrimSpace(req.X) != "", strings.TrimSpace(req.Fuel) != ""
	switch {
	case hasX && hasFuel:
		return nil, errors.New("give either --X or --fuel (with --oxidizer, --phi), not both")
	case hasFuel:
		fuelX, err := parseComposition(req.Fuel)
		if err != nil {
			return nil, fmt.Errorf("--fuel: %w", err)
		}
		oxX, err := parseComposition(req.Oxidizer)
		if err != nil {
			return nil, fmt.Errorf("--oxidizer: %w", err)
		}
		charge, err := fuel.Premixed(m, set, fuelX, oxX, req.Phi)
		if err != nil {
			return nil, err
		}
		return charge.X, nil
	case hasX:
		c, err := parseComposition(req.X)
		if err != nil {
			return nil, fmt.Errorf("--X: %w", err)
		}
		X := make([]float64, len(m.Species))
		sum := 0.0
		for name, v := range c {
			k := m.SpeciesIndex(name)
			if k < 0 {
				return nil, fmt.Errorf("--X: species %s is not in mechanism %s", name, m.Name)
			}
			X[k] = v
			sum += v
		}
		if !(sum > 0) {
			return nil, errors.New("--X: mole fractions sum to zero")
		}
		for k := range X {
			X[k] /= sum
		}
		return X, nil
	}
	return nil, errors.New(`give the composition: --X "CH4:0.095,O2:0.19,N2:0.715" or --fuel CH4 --phi 1`)
}

func computeTransport(m *chem.Mechanism, req transportRequest) (*transportReport, error) {
	T, err := units.Parse(req.Temperature, units.Temperature)
	if err != nil {
		return nil, fmt.Errorf("--T: %w", err)
	}
	P, err := units.Parse(req.Pressure, units.Pressure)
	if err != nil {
		return nil, fmt.Errorf("--P: %w", err)
	}
	if !(P > 0) || math.IsInf(P, 0) {
		return nil, errors.New("--P: pressure must be positive")
	}
	if !(req.MinFraction >= 0 && req.MinFraction < 1) {
		return nil, fmt.Errorf("--min-x: %g is not in [0, 1)", req.MinFraction)
	}
	tr, err := transport.New(m, transport.Options{})
	if err != nil {
		return nil, err
	}
	if tMin, tMax := tr.Range(); !(T >= tMin && T <= tMax) {
		return nil, fmt.Errorf("--T: %g K is outside the transport fit range %g-%g K", T, tMin, tMax)
	}
	set, err := fuel.SpeciesSet(m)
	if err != nil {
		return nil, err
	}
	X, err := transportComposition(m, set, req)
	if err != nil {
		return nil, err
	}
	K := len(X)
	Y := make([]float64, K)
	set.MoleToMass(X, Y)
	out := transport.MixtureProperties{Diffusion: make([]float64, K), ThermalDiffusionRatios: make([]float64, K)}
	tr.Mixture(T, P, X, Y, &out)
	cp := set.CpMass(T, Y)
	rho := set.Density(P, T, Y)
	rep := &transportReport{
		Mechanism:    m.Name,
		Temperature:  T,
		Pressure:     P,
		Composition:  map[string]float64{},
		Viscosity:    out.Viscosity,
		Conductivity: out.Conductivity,
		Cp:           cp,
		Density:      rho,
		Prandtl:      out.Viscosity * cp / out.Conductivity,
		FitError:     tr.MaxFitError(),
		Note:         transportNote,
	}
	for k, x := range X {
		if x > 0 {
			rep.Composition[m.Species[k].Name] = x
		}
		if !req.All && !(x >= req.MinFraction && x > 0) {
			continue
		}
		rep.Species = append(rep.Species, transportSpecies{
			Name:           m.Species[k].Name,
			MoleFraction:   x,
			Diffusion:      out.Diffusion[k],
			Lewis:          out.Conductivity / (rho * cp * out.Diffusion[k]),
			ThermalDiffRat: out.ThermalDiffusionRatios[k],
		})
	}
	for _, v := range []float64{rep.Viscosity, rep.Conductivity, rep.Cp, rep.Density} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("transport properties at %g K, %g Pa are not finite", T, P)
		}
	}
	return rep, nil
}

func (r *transportReport) writeText(w io.Writer) error {
	var b strings.Builder
	fmt.Fprintf(&b, "# %s\n", r.Note)
	fmt.Fprintf(&b, "mechanism            %s\n", r.Mechanism)
	fmt.Fprintf(&b, "temperature          %.2f K\n", r.Temperature)
	fmt.Fprintf(&b, "pressure             %.6g Pa\n", r.Pressure)
	fmt.Fprintf(&b, "composition          %s\n", compositionText(r.Composition))
	fmt.Fprintf(&b, "viscosity            %.5g Pa s\n", r.Viscosity)
	fmt.Fprintf(&b, "thermal conductivity %.5g W/(m K)\n", r.Conductivity)
	fmt.Fprintf(&b, "cp                   %.5g J/(kg K)\n", r.Cp)
	fmt.Fprintf(&b, "density              %.5g kg/m^3\n", r.Density)
	fmt.Fprintf(&b, "Prandtl number       %.4f\n", r.Prandtl)
	fmt.Fprintf(&b, "largest fit error    %.2g (relative, fits vs kinetic theory)\n\n", r.FitError)
	fmt.Fprintf(&b, "%-12s %12s %14s %8s %12s\n", "species", "X [-]", "D_km [m^2/s]", "Le [-]", "Theta [-]")
	for _, s := range r.Species {
		fmt.Fprintf(&b, "%-12s %12.5g %14.5g %8.4f %12.4g\n", s.Name, s.MoleFraction, s.Diffusion, s.Lewis, s.ThermalDiffRat)
	}
	_, err := io.WriteString(w, b.String())
	return err
}
