package main

import (
	"fmt"
	"io"
	"maps"
	"slices"
	"sort"
	"strings"

	"github.com/spf13/cobra"

	"flame1d/builtin"
	"flame1d/fuel"
	"flame1d/output"
	"flame1d/thermo"
	"flame1d/units"
)

// equilibriumFlags are the flags of `flame1d equilibrium`, as written.
type equilibriumFlags struct {
	Mechanism   string
	Fuel        string // "CH4" or "CH4=0.9,C2H6=0.1"
	Oxidizer    string
	Phi         float64
	Temperature string // with units, e.g. "298 K"
	Pressure    string // with units, e.g. "1 atm"
	Mode        string // fuel.Adiabatic or fuel.Isothermal
	Exclude     string // comma-separated species names
	MinFraction float64
}

// equilibriumOutput is what `flame1d equilibrium --json` prints.
type equilibriumOutput struct {
	*fuel.EquilibriumReport
	MinFraction float64 `json:"min_mole_fraction_listed"`
	Note        string  `json:"note"`
}

func newEquilibriumCmd() *cobra.Command {
	fl := equilibriumFlags{}
	var asJSON bool
	cmd := &cobra.Command{
		Use:   "equilibrium",
		Short: "Chemical equilibrium and adiabatic flame temperature of a fuel/oxidizer mixture",
		Long: `Compute the chemical equilibrium of a premixed fuel/oxidizer mixture by Gibbs
energy minimisation over every species of the mechanism.

  --mode adiabatic    constant pressure and enthalpy: the adiabatic flame
                      temperature and burned composition of the mixture
                      starting at --temperature (default)
  --mode isothermal   fixed --temperature and --pressure

Compositions are mole fractions written as in a case file: "CH4" for a neat
fuel, "CH4=0.9,C2H6=0.1" for a blend (normalised). The equivalence ratio is
on an O2-equivalent basis (C -> CO2, H -> H2O; oxygen in fuel and oxidizer
counted; N, Ar, He inert). Temperatures and pressures take units ("298 K",
"25 C", "1 atm", "5 bar"); a bare number is K or Pa. --exclude holds the
listed species at zero.

The table lists species with mole fraction at or above --min-mole-fraction;
--json prints every species above 1e-30 and the element potentials.

` + output.SafetyNote,
		Example: `  flame1d equilibrium --fuel CH4 --phi 1
  flame1d equilibrium --fuel "CH4=0.9,C2H6=0.1" --phi 0.8 --temperature "350 K" --pressure "5 bar"
  flame1d equilibrium --fuel H2 --oxidizer "O2=1" --mode isothermal --temperature "3000 K" --json
  flame1d equilibrium --fuel CH4 --exclude "NO,NO2,N2O" --mechanism my-mechanism.toml`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			req, err := fl.request()
			if err != nil {
				return err
			}
			m, err := builtin.Load(fl.Mechanism)
			if err != nil {
				return fmt.Errorf("--mechanism: %w", err)
			}
			rep, err := fuel.PremixedEquilibrium(m, req)
			if err != nil {
				return err
			}
			out := equilibriumOutput{EquilibriumReport: rep, MinFraction: fl.MinFraction, Note: output.SafetyNote}
			if asJSON {
				return writeJSON(cmd.OutOrStdout(), out)
			}
			return out.writeText(cmd.OutOrStdout())
		},
	}
	f := cmd.Flags()
	f.StringVar(&fl.Mechanism, "mechanism", "smith1999-natgas", "built-in mechanism name or mechanism file (flame1d TOML)")
	f.StringVar(&fl.Fuel, "fuel", "CH4", `fuel mole fractions, e.g. "CH4" or "CH4=0.9,C2H6=0.1"`)
	f.StringVar(&fl.Oxidizer, "oxidizer", "O2=0.21,N2=0.79", "oxidizer mole fractions")
	f.Float64Var(&fl.Phi, "phi", 1, "equivalence ratio")
	f.StringVar(&fl.Temperature, "temperature", "298.15 K", "temperature of the mixture (adiabatic) or of the equilibrium (isothermal)")
	f.StringVar(&fl.Pressure, "pressure", "1 atm", "pressure")
	f.StringVar(&fl.Mode, "mode", fuel.Adiabatic, "adiabatic (constant pressure and enthalpy) or isothermal (fixed temperature and pressure)")
	f.StringVar(&fl.Exclude, "exclude", "", "comma-separated species held at zero")
	f.Float64Var(&fl.MinFraction, "min-mole-fraction", 1e-4, "smallest mole fraction listed in the table")
	f.BoolVar(&asJSON, "json", false, "print the result as JSON")
	return cmd
}

// request converts the flags to SI values.
func (fl equilibriumFlags) request() (fuel.EquilibriumRequest, error) {
	var req fuel.EquilibriumRequest
	var err error
	if req.Temperature, err = quantityFlag("temperature", fl.Temperature, units.Temperature); err != nil {
		return req, err
	}
	if req.Pressure, err = quantityFlag("pressure", fl.Pressure, units.Pressure); err != nil {
		return req, err
	}
	if req.Mode = strings.ToLower(strings.TrimSpace(fl.Mode)); req.Mode != fuel.Adiabatic && req.Mode != fuel.Isothermal {
		return req, fmt.Errorf("--mode: %q is not %s or %s", fl.Mode, fuel.Adiabatic, fuel.Isothermal)
	}
	if err := fractionFlag("min-mole-fraction", fl.MinFraction); err != nil {
		return req, err
	}
	if req.Fuel, err = compositionFlag("fuel", fl.Fuel); err != nil {
		return req, err
	}
	if req.Oxidizer, err = compositionFlag("oxidizer", fl.Oxidizer); err != nil {
		return req, err
	}
	req.EquivalenceRatio = fl.Phi
	for _, n := range strings.Split(fl.Exclude, ",") {
		if n = strings.TrimSpace(n); n != "" {
			req.Exclude = append(req.Exclude, n)
		}
	}
	return req, nil
}

// writeText prints the report for people: state, then the species table
// sorted by mole fraction.
func (r equilibriumOutput) writeText(w io.Writer) error {
	var b strings.Builder
	fmt.Fprintf(&b, "Chemical equilibrium (%s)\n", map[string]string{
		fuel.Adiabatic: "adiabatic, constant pressure", fuel.Isothermal: "fixed temperature and pressure"}[r.Mode])
	fmt.Fprintf(&b, "  note                    %s\n", r.Note)
	fmt.Fprintf(&b, "  mechanism               %s\n", r.Mechanism)
	fmt.Fprintf(&b, "  fuel                    %s\n", compositionText(r.Fuel))
	fmt.Fprintf(&b, "  oxidizer                %s\n", compositionText(r.Oxidizer))
	fmt.Fprintf(&b, "  equivalence ratio       %.4g\n", r.EquivalenceRatio)
	if r.FuelLHV != nil {
		fmt.Fprintf(&b, "  fuel LHV                %.4f MJ/kg\n", *r.FuelLHV/1e6)
	}
	if r.Mode == fuel.Adiabatic {
		fmt.Fprintf(&b, "  initial T, P            %.2f K, %.6g Pa (%.4g atm)\n", r.InitialT, r.Pressure, r.Pressure/thermo.OneAtmosphere)
		fmt.Fprintf(&b, "  adiabatic flame T       %.2f K\n", r.Temperature)
	} else {
		fmt.Fprintf(&b, "  T, P                    %.2f K, %.6g Pa (%.4g atm)\n", r.Temperature, r.Pressure, r.Pressure/thermo.OneAtmosphere)
	}
	fmt.Fprintf(&b, "  density                 %.5g kg/m^3 reactants, %.5g kg/m^3 equilibrium gas\n", r.UnburnedDensity, r.BurnedDensity)
	if len(r.Excluded) > 0 {
		fmt.Fprintf(&b, "  held at zero            %s\n", strings.Join(r.Excluded, ", "))
	}
	fmt.Fprintf(&b, "\n  %-12s %14s %14s\n", "species", "X [-]", "Y [-]")
	names := make([]string, 0, len(r.MoleFractions))
	for n, x := range r.MoleFractions {
		if x >= r.MinFraction {
			names = append(names, n)
		}
	}
	sort.Slice(names, func(i, j int) bool {
		if r.MoleFractions[names[i]] != r.MoleFractions[names[j]] {
			return r.MoleFractions[names[i]] > r.MoleFractions[names[j]]
		}
		return names[i] < names[j]
	})
	for _, n := range names {
		fmt.Fprintf(&b, "  %-12s %14.6e %14.6e\n", n, r.MoleFractions[n], r.MassFractions[n])
	}
	fmt.Fprintf(&b, "  (species below X = %.3g not listed; --json lists all)\n", r.MinFraction)
	if len(r.Condensed) > 0 {
		fmt.Fprintf(&b, "\n  condensed phases (mol per mol of reactants)\n")
		for _, n := range slices.Sorted(maps.Keys(r.Condensed)) {
			fmt.Fprintf(&b, "  %-12s %14.6e\n", n, r.Condensed[n])
		}
	}
	fmt.Fprintf(&b, "\n  %d iterations, element balance to %.1e\n", r.Iterations, r.ElementResidual)
	_, err := io.WriteString(w, b.String())
	return err
}
