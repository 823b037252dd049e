package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/fuel"
	"flame1d/output"
	"flame1d/thermo"
	"flame1d/units"
)

// equilRequest is what `flame1d equil` is asked to compute.
type equilRequest struct {
	Mechanism   string
	Fuel        string // "CH4" or "CH4:0.9,C2H6:0.1"
	Oxidizer    string
	Phi         float64
	Temperature string // with units, e.g. "298 K"
	Pressure    string // with units, e.g. "1 atm"
	Mode        string // "hp" or "tp"
	Exclude     string // comma-separated species names
	MinFraction float64
}

// equilReport is the result of `flame1d equil`. Field names carry units.
type equilReport struct {
	Mechanism         string             `json:"mechanism"`
	Fuel              map[string]float64 `json:"fuel_mole_fractions"`
	Oxidizer          map[string]float64 `json:"oxidizer_mole_fractions"`
	EquivalenceRatio  float64            `json:"equivalence_ratio"`
	Mode              string             `json:"mode"`
	InitialT          float64            `json:"initial_temperature_K"`
	Pressure          float64            `json:"pressure_Pa"`
	Temperature       float64            `json:"equilibrium_temperature_K"`
	Excluded          []string           `json:"excluded_species,omitempty"`
	FuelLHV           *float64           `json:"fuel_lower_heating_value_J_kg,omitempty"`
	UnburnedDensity   float64            `json:"unburned_density_kg_m3"`
	BurnedDensity     float64            `json:"equilibrium_gas_density_kg_m3"`
	MeanMolarMass     float64            `json:"equilibrium_mean_molar_mass_kg_mol"`
	Reactants         map[string]float64 `json:"reactant_mole_fractions"`
	MoleFractions     map[string]float64 `json:"mole_fractions"`
	MassFractions     map[string]float64 `json:"mass_fractions"`
	Condensed         map[string]float64 `json:"condensed_mol_per_mol_reactants,omitempty"`
	ElementPotentials map[string]float64 `json:"element_potentials_over_RT"`
	Iterations        int                `json:"iterations"`
	ElementResidual   float64            `json:"element_balance_residual"`
	MinFraction       float64            `json:"min_mole_fraction_listed"`
	Note              string             `json:"note"`
}

func newEquilCmd() *cobra.Command {
	req := equilRequest{}
	var asJSON bool
	cmd := &cobra.Command{
		Use:   "equil",
		Short: "Chemical equilibrium and adiabatic flame temperature of a fuel/oxidizer mixture",
		Long: `Compute the chemical equilibrium of a premixed fuel/oxidizer mixture by Gibbs
energy minimisation over every species of the mechanism.

  --mode hp   adiabatic, constant pressure: the adiabatic flame temperature and
              burned composition of the mixture starting at --T (default)
  --mode tp   fixed temperature --T and pressure --P

Compositions are mole fractions, "CH4" for a neat fuel or "CH4:0.9,C2H6:0.1"
for a blend (normalised). The equivalence ratio is on an O2-equivalent basis
(C -> CO2, H -> H2O; oxygen in fuel and oxidizer counted; N, Ar, He inert).
Temperatures and pressures take units ("298 K", "25 C", "1 atm", "5 bar");
a bare number is K or Pa. --exclude holds the listed species at zero.

The table lists species with mole fraction at or above --min-x; --json prints
every species above 1e-30 and the element potentials.

` + output.SafetyNote,
		Example: `  flame1d equil --fuel CH4 --phi 1
  flame1d equil --fuel "CH4:0.9,C2H6:0.1" --phi 0.8 --T "350 K" --P "5 bar"
  flame1d equil --fuel H2 --oxidizer "O2:1" --mode tp --T "3000 K" --json
  flame1d equil --fuel CH4 --exclude "NO,NO2,N2O" --mechanism my-mech.toml`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			m, err := builtin.Load(req.Mechanism)
			if err != nil {
				return fmt.Errorf("mechanism: %w", err)
			}
			rep, err := computeEquilibrium(m, req)
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
	f.StringVar(&req.Fuel, "fuel", "CH4", `fuel mole fractions, e.g. "CH4" or "CH4:0.9,C2H6:0.1"`)
	f.StringVar(&req.Oxidizer, "oxidizer", "O2:0.21,N2:0.79", "oxidizer mole fractions")
	f.Float64Var(&req.Phi, "phi", 1, "equivalence ratio")
	f.StringVar(&req.Temperature, "T", "298.15 K", "initial temperature (hp) or fixed temperature (tp)")
	f.StringVar(&req.Pressure, "P", "1 atm", "pressure")
	f.StringVar(&req.Mode, "mode", "hp", "hp (adiabatic, constant pressure) or tp (fixed temperature and pressure)")
	f.StringVar(&req.Exclude, "exclude", "", "comma-separated species held at zero")
	f.Float64Var(&req.MinFraction, "min-x", 1e-4, "smallest mole fraction listed in the table")
	f.BoolVar(&asJSON, "json", false, "print the result as JSON")
	return cmd
}

// computeEquilibrium runs the equilibrium a request describes on mechanism m.
func computeEquilibrium(m *chem.Mechanism, req equilRequest) (*equilReport, error) {
	T, err := units.Parse(req.Temperature, units.Temperature)
	if err != nil {
		return nil, fmt.Errorf("--T: %w", err)
	}
	if T <= 0 {
		return nil, fmt.Errorf("--T: temperature must be above 0 K")
	}
	P, err := units.Parse(req.Pressure, units.Pressure)
	if err != nil {
		return nil, fmt.Errorf("--P: %w", err)
	}
	if P <= 0 {
		return nil, fmt.Errorf("--P: pressure must be positive")
	}
	mode := strings.ToLower(strings.TrimSpace(req.Mode))
	if mode != "hp" && mode != "tp" {
		return nil, fmt.Errorf("--mode: %q is not hp or tp", req.Mode)
	}
	if !(req.MinFraction >= 0 && req.MinFraction < 1) {
		return nil, fmt.Errorf("--min-x: %g is not in [0, 1)", req.MinFraction)
	}
	fuelX, err := parseComposition(req.Fuel)
	if err != nil {
		return nil, fmt.Errorf("--fuel: %w", err)
	}
	oxX, err := parseComposition(req.Oxidizer)
	if err != nil {
		return nil, fmt.Errorf("--oxidizer: %w", err)
	}
	set, err := fuel.SpeciesSet(m)
	if err != nil {
		return nil, err
	}
	charge, err := fuel.Premixed(m, set, fuelX, oxX, req.Phi)
	if err != nil {
		return nil, err
	}
	var opt thermo.EquilibriumOptions
	var excluded []string
	if strings.TrimSpace(req.Exclude) != "" {
		for _, n := range strings.Split(req.Exclude, ",") {
			if n = strings.TrimSpace(n); n != "" {
				excluded = append(excluded, n)
			}
		}
		if opt.Exclude, err = set.ExcludeMask(excluded); err != nil {
			return nil, fmt.Errorf("--exclude: %w", err)
		}
	}
	var res *thermo.EquilibriumResult
	if mode == "hp" {
		res, err = set.AdiabaticFlame(T, P, charge.X, opt)
	} else {
		res, err = set.EquilibrateTP(T, P, charge.X, opt)
	}
	if err != nil {
		return nil, err
	}
	rep := &equilReport{
		Mechanism: m.Name, Fuel: normalise(fuelX), Oxidizer: normalise(oxX), EquivalenceRatio: req.Phi,
		Mode: mode, InitialT: T, Pressure: P, Temperature: res.T, Excluded: excluded,
		UnburnedDensity: set.Density(P, T, charge.Y),
		Reactants:       map[string]float64{}, MoleFractions: map[string]float64{}, MassFractions: map[string]float64{},
		ElementPotentials: map[string]float64{},
		Iterations:        res.Iterations, ElementResidual: res.ElementResidual,
		MinFraction: req.MinFraction, Note: output.SafetyNote,
	}
	if fv, err := fuel.Composition(m, "fuel", fuelX); err == nil {
		if lhv, err := set.LowerHeatingValue(fv); err == nil {
			rep.FuelLHV = &lhv
		}
	}
	Y := make([]float64, set.Len())
	set.MoleToMass(res.MoleFractions, Y)
	rep.BurnedDensity = set.Density(P, res.T, Y)
	rep.MeanMolarMass = set.MeanMolarMassX(res.MoleFractions)
	total := 0.0
	for _, n := range charge.X {
		total += n
	}
	for k, sp := range set.Species {
		if charge.X[k] > 0 {
			rep.Reactants[sp.Name] = charge.X[k]
		}
		if sp.Condensed {
			if res.Moles[k] > 0 {
				if rep.Condensed == nil {
					rep.Condensed = map[string]float64{}
				}
				rep.Condensed[sp.Name] = res.Moles[k] / total
			}
			continue
		}
		if res.MoleFractions[k] >= 1e-30 {
			rep.MoleFractions[sp.Name] = res.MoleFractions[k]
			rep.MassFractions[sp.Name] = Y[k]
		}
	}
	for e, el := range set.Elements {
		if v := res.ElementPotentials[e]; !math.IsInf(v, 0) && !math.IsNaN(v) {
			rep.ElementPotentials[el] = v
		}
	}
	return rep, nil
}

// parseComposition reads "CH4" (neat) or "CH4:0.9,C2H6:0.1" (mole
// fractions, normalised later) into species amounts.
func parseComposition(s string) (map[string]float64, error) {
	out := map[string]float64{}
	s = strings.TrimSpace(s)
	if s == "" {
		return nil, errors.New("empty composition")
	}
	for _, part := range strings.Split(s, ",") {
		part = strings.TrimSpace(part)
		if part == "" {
			continue
		}
		name, val, hasVal := strings.Cut(part, ":")
		name = strings.TrimSpace(name)
		if name == "" {
			return nil, fmt.Errorf("%q: missing species name", part)
		}
		x := 1.0
		if hasVal {
			v, err := strconv.ParseFloat(strings.TrimSpace(val), 64)
			if err != nil || !(v >= 0) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("%q: amount must be a non-negative number (write e.g. CH4:0.9,C2H6:0.1)", part)
			}
			x = v
		} else if strings.Contains(s, ",") {
			return nil, fmt.Errorf("%q: give every species of a blend an amount (write e.g. CH4:0.9,C2H6:0.1)", part)
		}
		if _, dup := out[name]; dup {
			return nil, fmt.Errorf("species %s given twice", name)
		}
		out[name] = x
	}
	if len(out) == 0 {
		return nil, errors.New("empty composition")
	}
	return out, nil
}

func normalise(c map[string]float64) map[string]float64 {
	sum := 0.0
	for _, v := range c {
		sum += v
	}
	out := make(map[string]float64, len(c))
	for k, v := range c {
		if sum > 0 {
			out[k] = v / sum
		}
	}
	return out
}

// writeText prints the report for people: state, then the species table
// sorted by mole fraction.
func (r *equilReport) writeText(w io.Writer) error {
	var b strings.Builder
	fmt.Fprintf(&b, "Chemical equilibrium (%s)\n", map[string]string{
		"hp": "adiabatic, constant pressure", "tp": "fixed temperature and pressure"}[r.Mode])
	fmt.Fprintf(&b, "  note                    %s\n", r.Note)
	fmt.Fprintf(&b, "  mechanism               %s\n", r.Mechanism)
	fmt.Fprintf(&b, "  fuel                    %s\n", compositionText(r.Fuel))
	fmt.Fprintf(&b, "  oxidizer                %s\n", compositionText(r.Oxidizer))
	fmt.Fprintf(&b, "  equivalence ratio       %.4g\n", r.EquivalenceRatio)
	if r.FuelLHV != nil {
		fmt.Fprintf(&b, "  fuel LHV                %.4f MJ/kg\n", *r.FuelLHV/1e6)
	}
	if r.Mode == "hp" {
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
		for _, n := range sortedNames(r.Condensed) {
			fmt.Fprintf(&b, "  %-12s %14.6e\n", n, r.Condensed[n])
		}
	}
	fmt.Fprintf(&b, "\n  %d iterations, element balance to %.1e\n", r.Iterations, r.ElementResidual)
	_, err := io.WriteString(w, b.String())
	return err
}

func compositionText(c map[string]float64) string {
	parts := make([]string, 0, len(c))
	for _, k := range sortedNames(c) {
		parts = append(parts, fmt.Sprintf("%s %.4g", k, c[k]))
	}
	return strings.Join(parts, ", ")
}

func sortedNames(c map[string]float64) []string {
	keys := make([]string, 0, len(c))
	for k := range c {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}
