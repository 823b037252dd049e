package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/fuel"
	"flame1d/output"
	"flame1d/thermo"
	"flame1d/units"
)

// poolOptions are the flags of `flame1d pool`.
type poolOptions struct {
	Mechanism   string
	Fuel        string
	Oxidizer    string
	Phi         float64
	Temperature string
	JSON        bool
}

// poolResult is one fuel of `flame1d pool`. Field names carry units.
type poolResult struct {
	Fuel        string             `json:"fuel"`
	Kind        string             `json:"kind"`
	Composition map[string]float64 `json:"composition,omitempty"`
	Report      *fuel.PoolReport   `json:"report,omitempty"`
	Inlet       *poolInlet         `json:"inlet"`
}

// poolInlet summarises the premixed inlet at the requested conditions.
type poolInlet struct {
	EquivalenceRatio    float64            `json:"equivalence_ratio"`
	UnburnedTemperature float64            `json:"unburned_temperature_K"`
	InletTemperature    float64            `json:"inlet_temperature_K"`
	TemperatureShift    float64            `json:"temperature_shift_K"`
	MoleFractions       map[string]float64 `json:"mole_fractions,omitempty"`
	MassFractions       map[string]float64 `json:"mass_fractions,omitempty"`
	// Error says why no inlet exists at these conditions.
	Error string `json:"error,omitempty"`
}

func newPoolCmd() *cobra.Command {
	o := poolOptions{}
	cmd := &cobra.Command{
		Use:   "pool FUELS.toml",
		Short: "Show how real fuels are represented: formula, heating value, cracked pool, pseudo-species",
		Long: `Resolve the fuel definitions of a TOML file (each under [fuels.NAME]; a case
file's fuels table reads the same way) on a mechanism and print, for every
cracked-pool fuel: mean formula, H/C, molar mass, lower and higher heating
value, the enthalpy of formation they imply, the pool (mol per mol and kg
per kg of fuel, share of the carbon), the cracking enthalpy, the element
closure residuals, every adjustment made to measured yields, the
pseudo-species (thermo, transport, global cracking step) and the premixed
inlet at --phi and --T (in pre-cracked mode with the lowered inlet
temperature). No flame is solved. Every key is described in docs/fuels.md.

The mechanism is --mechanism, else the file's top-level mechanism key
(relative to the file), else smith1999-natgas.

` + output.SafetyNote,
		Example: `  flame1d pool examples/fuels/kerosenes.toml
  flame1d pool examples/fuels/kerosenes.toml --fuel syn-kerosene --phi 0.8 --T "500 K"
  flame1d pool fuels.toml --mechanism lu2009-heptane --json > pools.json`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runPool(cmd.OutOrStdout(), args[0], o)
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.Mechanism, "mechanism", "", "built-in mechanism name or path to a flame1d TOML mechanism")
	f.StringVar(&o.Fuel, "fuel", "", "only this fuel of the file")
	f.StringVar(&o.Oxidizer, "oxidizer", "O2:0.21,N2:0.79", "oxidizer mole fractions")
	f.Float64Var(&o.Phi, "phi", 1, "equivalence ratio of the inlet shown")
	f.StringVar(&o.Temperature, "T", "298.15 K", "unburned temperature of the inlet shown")
	f.BoolVar(&o.JSON, "json", false, "print the reports as JSON")
	return cmd
}

// mechanismFor resolves a mechanism named by a flag or a file key: a
// built-in name, or a path relative to the file's folder.
func mechanismFor(flag, key, file string) (*chem.Mechanism, error) {
	name := flag
	if name == "" && key != "" {
		name = key
		if strings.HasSuffix(name, ".toml") && !filepath.IsAbs(name) {
			if _, err := os.Stat(name); err != nil {
				name = filepath.Join(filepath.Dir(file), name)
			}
		}
	}
	if name == "" {
		name = "smith1999-natgas"
	}
	m, err := builtin.Load(name)
	if err != nil {
		return nil, fmt.Errorf("%s: mechanism: %w", file, err)
	}
	return m, nil
}

func runPool(w io.Writer, path string, o poolOptions) error {
	mechKey, specs, err := fuel.ReadFuels(path)
	if err != nil {
		return err
	}
	if o.Fuel != "" {
		var keep []fuel.Spec
		var names []string
		for _, s := range specs {
			names = append(names, s.Name)
			if s.Name == o.Fuel {
				keep = append(keep, s)
			}
		}
		if len(keep) == 0 {
			return fmt.Errorf("%s: no fuel %q (the file defines %s)", path, o.Fuel, strings.Join(names, ", "))
		}
		specs = keep
	}
	Tu, err := units.Parse(o.Temperature, units.Temperature)
	if err != nil {
		return fmt.Errorf("--T: %w", err)
	}
	ox, err := parseComposition(o.Oxidizer)
	if err != nil {
		return fmt.Errorf("--oxidizer: %w", err)
	}
	ox = normalise(ox)
	m, err := mechanismFor(o.Mechanism, mechKey, path)
	if err != nil {
		return err
	}
	set, err := fuel.SpeciesSet(m)
	if err != nil {
		return err
	}
	var results []poolResult
	for _, s := range specs {
		r, err := s.Resolve(m, set)
		if err != nil {
			return fmt.Errorf("%s: %w", path, err)
		}
		res := poolResult{Fuel: s.Name, Kind: r.Kind.String(), Composition: r.Composition, Report: r.Report,
			Inlet: &poolInlet{EquivalenceRatio: o.Phi, UnburnedTemperature: Tu}}
		// An inlet that cannot be built (a pre-cracked pool too cold at
		// this unburned temperature) is reported, not fatal: the pool
		// itself is still what the user asked to see.
		if in, err := r.Inlet(ox, o.Phi, Tu); err != nil {
			res.Inlet.Error = err.Error()
		} else {
			res.Inlet.InletTemperature, res.Inlet.TemperatureShift = in.T, in.TemperatureShift
			res.Inlet.MoleFractions, res.Inlet.MassFractions = byName(r.Set, in.X), byName(r.Set, in.Y)
		}
		results = append(results, res)
	}
	if o.JSON {
		return writeJSON(w, struct {
			Mechanism string       `json:"mechanism"`
			Fuels     []poolResult `json:"fuels"`
			Note      string       `json:"note"`
		}{m.Name, results, output.SafetyNote})
	}
	var b strings.Builder
	fmt.Fprintf(&b, "Fuels of %s on mechanism %s\n  note  %s\n", path, m.Name, output.SafetyNote)
	for _, r := range results {
		writePoolText(&b, r)
	}
	_, err = io.WriteString(w, b.String())
	return err
}

// byName maps the non-zero entries of v onto species names.
func byName(set *thermo.SpeciesSet, v []float64) map[string]float64 {
	out := map[string]float64{}
	for k, x := range v {
		if x != 0 {
			out[set.Species[k].Name] = x
		}
	}
	return out
}

func writePoolText(b *strings.Builder, r poolResult) {
	fmt.Fprintf(b, "\nfuel %s (%s)\n", r.Fuel, r.Kind)
	in := r.Inlet
	if r.Report == nil {
		fmt.Fprintf(b, "  composition             %s\n", compositionText(r.Composition))
		fmt.Fprintf(b, "  inlet                   phi %.4g at %.2f K\n", in.EquivalenceRatio, in.UnburnedTemperature)
		if in.Error != "" {
			fmt.Fprintf(b, "  inlet error             %s\n", in.Error)
		}
		return
	}
	p := r.Report
	if p.Description != "" {
		fmt.Fprintf(b, "  description             %s\n", p.Description)
	}
	fmt.Fprintf(b, "  mode                    %s\n", p.Mode)
	fmt.Fprintf(b, "  formula                 %s   H/C %.4f   O/C %.4g   molar mass %.3f g/mol\n", p.Formula, p.HToC, p.OToC, p.MolarMass*1e3)
	fmt.Fprintf(b, "  heating value (vapour)  LHV %.4f MJ/kg   HHV %.4f MJ/kg\n", p.LHV/1e6, p.HHV/1e6)
	if p.VaporizationEnthalpy > 0 {
		fmt.Fprintf(b, "  heating value (liquid)  LHV %.4f MJ/kg   HHV %.4f MJ/kg   (vaporization %.4g kJ/kg)\n", p.LiquidLHV/1e6, p.LiquidHHV/1e6, p.VaporizationEnthalpy/1e3)
	}
	fmt.Fprintf(b, "  enthalpy of formation   %.2f kJ/mol   %.4f MJ/kg (vapour, 298.15 K)\n", p.FormationEnthalpyMole/1e3, p.FormationEnthalpyMass/1e6)
	fmt.Fprintf(b, "  cracking                %s\n", p.Method)
	fmt.Fprintf(b, "  pool                    %-10s %14s %14s %10s\n", "species", "mol/mol fuel", "kg/kg fuel", "C share")
	for _, e := range p.Pool {
		fmt.Fprintf(b, "                          %-10s %14.6g %14.6g %10.4f\n", e.Species, e.Moles, e.Mass, e.CarbonShare)
	}
	kind := "endothermic"
	if p.CrackingEnthalpy < 0 {
		kind = "exothermic"
	}
	fmt.Fprintf(b, "  cracking enthalpy       %+.4f MJ/kg fuel at 298.15 K (%s)\n", p.CrackingEnthalpy/1e6, kind)
	fmt.Fprintf(b, "  closure residuals       C %.2g   H %.2g   O %.2g (relative)\n", p.Residuals.C, p.Residuals.H, p.Residuals.O)
	if len(p.Adjustments) == 0 {
		fmt.Fprintf(b, "  adjustments             none\n")
	}
	for i, a := range p.Adjustments {
		label := ""
		if i == 0 {
			label = "adjustments"
		}
		fmt.Fprintf(b, "  %-23s %s\n", label, a)
	}
	if ps := p.Pseudo; ps != nil {
		est := "given"
		if ps.EntropyEstimated {
			est = "estimated"
		}
		fmt.Fprintf(b, "  pseudo-species          %s: cp %.1f J/(mol K) at 298 K, %.1f at 1000 K (pool sum, fit within %.2g%%); s° %.1f J/(mol K) (%s); %g-%g K\n",
			ps.Name, ps.Cp298, ps.Cp1000, 100*ps.CpFitDeviation, ps.S298, est, ps.TLow, ps.THigh)
		fmt.Fprintf(b, "  transport               epsilon/k %.1f K, sigma %.3f Å (%s)\n", ps.WellDepth, ps.Diameter*1e10, ps.TransportSource)
		if ps.Equation != "" {
			fmt.Fprintf(b, "  global step             %s\n", ps.Equation)
			fmt.Fprintf(b, "                          A %.4g 1/s, b %g, E %.4g kJ/mol; cracking time %.3g ms at 1300 K\n",
				ps.PreExponential, ps.TemperatureExponent, ps.ActivationEnergy/1e3, ps.CrackingTime1300K*1e3)
		}
	}
	fmt.Fprintf(b, "  inlet                   phi %.4g, unburned %.2f K", in.EquivalenceRatio, in.UnburnedTemperature)
	if in.Error != "" {
		fmt.Fprintf(b, ": not possible: %s", in.Error)
	} else if in.TemperatureShift != 0 {
		fmt.Fprintf(b, ", pool enters at %.2f K (%+.2f K)", in.InletTemperature, in.TemperatureShift)
	}
	b.WriteString("\n")
	for _, n := range p.Notes {
		fmt.Fprintf(b, "  note                    %s\n", n)
	}
}
