package main

import (
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"flame1d/casefile"
	"flame1d/fuel"
	"flame1d/output"
	"flame1d/study"
	"flame1d/units"
)

// poolOptions are the flags of `flame1d pool`. The conditions are empty or
// zero where not given on the command line.
type poolOptions struct {
	Mechanism   string
	Fuel        string
	Oxidizer    string
	Phi         float64
	Temperature string
	JSON        bool
}

// Conditions of the inlet shown when neither the command line nor the
// file's [mixture] table gives them.
const (
	poolDefaultOxidizer    = "O2=0.21,N2=0.79"
	poolDefaultPhi         = 1.0
	poolDefaultTemperature = "298.15 K"
)

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
inlet at --phi and --temperature (in pre-cracked mode with the lowered inlet
temperature). No flame is solved. Every key is described in docs/fuels.md.

Every fuel is resolved on --mechanism when given; otherwise on its own
mechanism key, else the file's top-level mechanism key (relative to the
file), else ranzi2012-c1c3 for a cracked pool and smith1999-natgas for a
neat fuel. The inlet's oxidizer,
equivalence ratio and unburned temperature are the flags', else those of the
file's [mixture] table (a case file), else air, 1 and 298.15 K.

` + output.SafetyNote,
		Example: `  flame1d pool examples/fuels/kerosenes.toml
  flame1d pool examples/fuels/kerosenes.toml --fuel syn-kerosene --phi 0.8 --temperature "500 K"
  flame1d pool examples/kerosene-compare.toml
  flame1d pool fuels.toml --mechanism lu2009-heptane --json > pools.json`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runPool(cmd.OutOrStdout(), args[0], o)
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.Mechanism, "mechanism", "", "built-in mechanism name or path to a flame1d TOML mechanism")
	f.StringVar(&o.Fuel, "fuel", "", "only this fuel of the file")
	f.StringVar(&o.Oxidizer, "oxidizer", "", `oxidizer mole fractions, e.g. "O2=0.21,N2=0.79" (default: the file's [mixture], else air)`)
	f.Float64Var(&o.Phi, "phi", 0, "equivalence ratio of the inlet shown (default: the file's [mixture], else 1)")
	f.StringVar(&o.Temperature, "temperature", "", `unburned temperature of the inlet shown, e.g. "500 K" (default: the file's [mixture], else 298.15 K)`)
	f.BoolVar(&o.JSON, "json", false, "print the reports as JSON")
	return cmd
}

func runPool(w io.Writer, path string, o poolOptions) error {
	ff, err := casefile.ReadFuels(path)
	if err != nil {
		return err
	}
	specs := ff.Fuels
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
	var Tu float64
	switch {
	case o.Temperature != "":
		if Tu, err = quantityFlag("temperature", o.Temperature, units.Temperature); err != nil {
			return err
		}
	case ff.Temperature > 0:
		Tu = ff.Temperature
	default:
		Tu = units.MustParse(poolDefaultTemperature, units.Temperature)
	}
	phi := o.Phi
	if phi == 0 {
		phi = ff.EquivalenceRatio
	}
	if phi == 0 {
		phi = poolDefaultPhi
	}
	ox := ff.Oxidizer
	if o.Oxidizer != "" || ox == nil {
		text := o.Oxidizer
		if text == "" {
			text = poolDefaultOxidizer
		}
		if ox, err = compositionFlag("oxidizer", text); err != nil {
			return err
		}
	}
	// Each fuel on --mechanism, else on its own mechanism by the rule of
	// compare (casefile.Case.MechanismOf).
	rule := &casefile.Case{TopLevelMechanism: ff.Mechanism}
	var names []string
	bySpec := map[string][]fuel.Spec{}
	for _, s := range specs {
		name := o.Mechanism
		if name == "" {
			name = rule.MechanismOf(s)
		}
		if bySpec[name] == nil {
			names = append(names, name)
		}
		bySpec[name] = append(bySpec[name], s)
	}
	var results []fuel.Representation
	for _, name := range names {
		m, err := study.LoadMechanismFor(name, path)
		if err != nil {
			return err
		}
		reps, err := fuel.Represent(m, bySpec[name], ox, phi, Tu)
		if err != nil {
			return fmt.Errorf("%s: %w", path, err)
		}
		for i := range reps {
			reps[i].Mechanism = name
		}
		results = append(results, reps...)
	}
	if o.JSON {
		return writeJSON(w, struct {
			Mechanism string                `json:"mechanism"`
			Fuels     []fuel.Representation `json:"fuels"`
			Note      string                `json:"note"`
		}{strings.Join(names, ", "), results, output.SafetyNote})
	}
	var b strings.Builder
	word := "mechanism"
	if len(names) > 1 {
		word = "mechanisms"
	}
	fmt.Fprintf(&b, "Fuels of %s on %s %s\n  note  %s\n", path, word, strings.Join(names, ", "), output.SafetyNote)
	for _, r := range results {
		writePoolText(&b, r)
	}
	_, err = io.WriteString(w, b.String())
	return err
}

func writePoolText(b *strings.Builder, r fuel.Representation) {
	fmt.Fprintf(b, "\nfuel %s (%s) on %s\n", r.Fuel, r.Kind, r.Mechanism)
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
