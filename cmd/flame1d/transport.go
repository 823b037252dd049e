package main

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/fuel"
	"flame1d/thermo"
	"flame1d/transport"
	"flame1d/units"
)

// transportFlags are the flags of `flame1d transport`, as written.
type transportFlags struct {
	Mechanism     string
	MoleFractions string // "CH4=0.095,O2=0.19,N2=0.715"; or Fuel/Oxidizer/Phi
	Fuel          string
	Oxidizer      string
	Phi           float64
	Temperature   string // with units, e.g. "300 K"
	Pressure      string // with units, e.g. "1 atm"
	MinFraction   float64
	All           bool
}

// transportSpecies is one row of the per-species table.
type transportSpecies struct {
	Name           string  `json:"name"`
	MoleFraction   float64 `json:"mole_fraction"`
	Diffusion      float64 `json:"mixture_diffusion_m2_s"`
	Lewis          float64 `json:"lewis_number"`
	ThermalDiffRat float64 `json:"thermal_diffusion_ratio"`
	// MulticomponentThermalDiffRat is chi_k of the multicomponent model.
	MulticomponentThermalDiffRat float64 `json:"multicomponent_thermal_diffusion_ratio"`
}

// transportReport is the result of `flame1d transport`. Field names carry units.
type transportReport struct {
	Mechanism    string             `json:"mechanism"`
	Temperature  float64            `json:"temperature_K"`
	Pressure     float64            `json:"pressure_Pa"`
	Composition  map[string]float64 `json:"mole_fractions"`
	Viscosity    float64            `json:"viscosity_Pa_s"`
	Conductivity float64            `json:"thermal_conductivity_W_m_K"`
	// MulticomponentConductivity is the conductivity of the multicomponent model.
	MulticomponentConductivity float64            `json:"multicomponent_thermal_conductivity_W_m_K"`
	Cp                         float64            `json:"cp_J_kg_K"`
	Density                    float64            `json:"density_kg_m3"`
	Prandtl                    float64            `json:"prandtl_number"`
	FitError                   float64            `json:"max_fit_error"`
	Species                    []transportSpecies `json:"species"`
	Note                       string             `json:"note"`
}

const transportNote = "Mixture-averaged transport from kinetic theory (Chapman-Enskog, Wilke, " +
	"Mathur-Tondon-Saxena) on the mechanism's transport parameters. Model predictions: " +
	"where they feed safety decisions, confirm them against local codes and licensed practice."

func newTransportCmd() *cobra.Command {
	fl := transportFlags{}
	var asJSON bool
	cmd := &cobra.Command{
		Use:   "transport",
		Short: "Mixture viscosity, conductivity, diffusion coefficients and Lewis numbers of a gas",
		Long: `Evaluate the mixture-averaged transport properties of a gas mixture at one
temperature and pressure: viscosity (Wilke), thermal conductivity
(Mathur-Tondon-Saxena), cp, density, Prandtl number, and per species the mixture
diffusion coefficient D_km, the Lewis number lambda/(rho cp D_km) and the
thermal diffusion ratio (light species only). For comparison it also gives
the multicomponent conductivity and thermal diffusion ratios chi (every
species; docs/transport.md), the values [solver] diffusion = "multicomponent"
uses.

Give the composition either as mole fractions written as in a case file,
--mole-fractions "CH4=0.095,O2=0.19,N2=0.715" (normalised), or as a premixed
charge with --fuel, --oxidizer and --phi (O2-equivalent equivalence ratio).
Temperatures and pressures take units ("300 K", "25 C", "1 atm", "5 bar"); a
bare number is K or Pa. Species below --min-mole-fraction are left out of the
table unless --all is given.`,
		Example: `  flame1d transport --mole-fractions "O2=0.21,N2=0.79"
  flame1d transport --fuel CH4 --phi 1 --temperature "600 K" --pressure "5 bar"
  flame1d transport --fuel H2 --phi 0.5 --all --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			m, err := builtin.Load(fl.Mechanism)
			if err != nil {
				return fmt.Errorf("--mechanism: %w", err)
			}
			rep, err := transportReportFor(m, fl)
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
	f.StringVar(&fl.Mechanism, "mechanism", "smith1999-natgas", "built-in mechanism name or mechanism file (flame1d TOML)")
	f.StringVar(&fl.MoleFractions, "mole-fractions", "", `mole fractions, e.g. "CH4=0.095,O2=0.19,N2=0.715"`)
	f.StringVar(&fl.Fuel, "fuel", "", `fuel for a premixed charge, e.g. "CH4" or "CH4=0.9,C2H6=0.1"`)
	f.StringVar(&fl.Oxidizer, "oxidizer", "O2=0.21,N2=0.79", "oxidizer for a premixed charge (mole fractions)")
	f.Float64Var(&fl.Phi, "phi", 1, "equivalence ratio of the premixed charge")
	f.StringVar(&fl.Temperature, "temperature", "300 K", "temperature")
	f.StringVar(&fl.Pressure, "pressure", "1 atm", "pressure")
	f.Float64Var(&fl.MinFraction, "min-mole-fraction", 1e-6, "smallest mole fraction listed in the species table")
	f.BoolVar(&fl.All, "all", false, "list every species")
	f.BoolVar(&asJSON, "json", false, "print JSON instead of text")
	return cmd
}

// transportComposition returns the mole fractions the flags ask for.
func transportComposition(m *chem.Mechanism, set *thermo.SpeciesSet, fl transportFlags) ([]float64, error) {
	hasX, hasFuel := strings.TrimSpace(fl.MoleFractions) != "", strings.TrimSpace(fl.Fuel) != ""
	switch {
	case hasX && hasFuel:
		return nil, errors.New("give either --mole-fractions or --fuel (with --oxidizer, --phi), not both")
	case hasFuel:
		fuelX, err := compositionFlag("fuel", fl.Fuel)
		if err != nil {
			return nil, err
		}
		oxX, err := compositionFlag("oxidizer", fl.Oxidizer)
		if err != nil {
			return nil, err
		}
		charge, err := fuel.Premixed(m, set, fuelX, oxX, fl.Phi)
		if err != nil {
			return nil, err
		}
		return charge.X, nil
	case hasX:
		c, err := compositionFlag("mole-fractions", fl.MoleFractions)
		if err != nil {
			return nil, err
		}
		return fuel.MoleFractions(m, "--mole-fractions", c)
	}
	return nil, errors.New(`give the composition: --mole-fractions "CH4=0.095,O2=0.19,N2=0.715" or --fuel CH4 --phi 1`)
}

// transportReportFor converts the flags and evaluates the gas with
// transport.Model.Properties.
func transportReportFor(m *chem.Mechanism, fl transportFlags) (*transportReport, error) {
	T, err := quantityFlag("temperature", fl.Temperature, units.Temperature)
	if err != nil {
		return nil, err
	}
	P, err := quantityFlag("pressure", fl.Pressure, units.Pressure)
	if err != nil {
		return nil, err
	}
	if err := fractionFlag("min-mole-fraction", fl.MinFraction); err != nil {
		return nil, err
	}
	set, err := fuel.SpeciesSet(m)
	if err != nil {
		return nil, err
	}
	X, err := transportComposition(m, set, fl)
	if err != nil {
		return nil, err
	}
	tr, err := transport.New(m, transport.Options{})
	if err != nil {
		return nil, err
	}
	g, err := tr.Properties(set, T, P, X)
	if err != nil {
		return nil, err
	}
	rep := &transportReport{
		Mechanism: m.Name, Temperature: T, Pressure: P, Composition: map[string]float64{},
		Viscosity: g.Viscosity, Conductivity: g.Conductivity, MulticomponentConductivity: g.MulticomponentConductivity,
		Cp: g.Cp, Density: g.Density, Prandtl: g.Prandtl,
		FitError: tr.MaxFitError(), Note: transportNote,
	}
	for k, x := range X {
		if x > 0 {
			rep.Composition[m.Species[k].Name] = x
		}
		if !fl.All && !(x >= fl.MinFraction && x > 0) {
			continue
		}
		rep.Species = append(rep.Species, transportSpecies{
			Name: m.Species[k].Name, MoleFraction: x, Diffusion: g.Diffusion[k], Lewis: g.Lewis[k],
			ThermalDiffRat:               g.ThermalDiffusionRatios[k],
			MulticomponentThermalDiffRat: g.MulticomponentThermalDiffusionRatios[k],
		})
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
	fmt.Fprintf(&b, "thermal conductivity %.5g W/(m K) (multicomponent: %.5g)\n", r.Conductivity, r.MulticomponentConductivity)
	fmt.Fprintf(&b, "cp                   %.5g J/(kg K)\n", r.Cp)
	fmt.Fprintf(&b, "density              %.5g kg/m^3\n", r.Density)
	fmt.Fprintf(&b, "Prandtl number       %.4f\n", r.Prandtl)
	fmt.Fprintf(&b, "largest fit error    %.2g (relative, fits vs kinetic theory)\n\n", r.FitError)
	fmt.Fprintf(&b, "%-12s %12s %14s %8s %12s %12s\n", "species", "X [-]", "D_km [m^2/s]", "Le [-]", "Theta [-]", "chi [-]")
	for _, s := range r.Species {
		fmt.Fprintf(&b, "%-12s %12.5g %14.5g %8.4f %12.4g %12.4g\n", s.Name, s.MoleFraction, s.Diffusion, s.Lewis, s.ThermalDiffRat, s.MulticomponentThermalDiffRat)
	}
	_, err := io.WriteString(w, b.String())
	return err
}
