package casefile

import (
	"fmt"
	"sort"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"flame1d/fuel"
	"flame1d/internal/infile"
	"flame1d/internal/tomlpos"
	"flame1d/units"
)

// fuelTable is the TOML layout of one [fuels.NAME] table; docs/fuels.md
// documents every key. Quantities are `any` so that both "43.2 MJ/kg" and
// 4.32e7 are accepted; spec converts them to SI.
type fuelTable struct {
	Description string             `toml:"description"`
	Mechanism   string             `toml:"mechanism"`
	Composition map[string]float64 `toml:"composition"`

	Formula   string  `toml:"formula"`
	HToC      float64 `toml:"h_to_c"`
	OToC      float64 `toml:"o_to_c"`
	MolarMass any     `toml:"molar_mass"`

	LowerHeatingValue    any `toml:"lower_heating_value"`
	HigherHeatingValue   any `toml:"higher_heating_value"`
	VaporizationEnthalpy any `toml:"vaporization_enthalpy"`
	StandardEntropy      any `toml:"standard_entropy"`

	Mode        string `toml:"mode"`
	SpeciesName string `toml:"species_name"`
	Cracking    struct {
		Method        string             `toml:"method"`
		Yields        map[string]float64 `toml:"yields"`
		Balance       []string           `toml:"balance"`
		ScaleToCarbon *bool              `toml:"scale_to_carbon"`
		Temperature   any                `toml:"temperature"`
		Pressure      any                `toml:"pressure"`
		Candidates    []string           `toml:"candidates"`
		Exclude       []string           `toml:"exclude"`
	} `toml:"cracking"`
	GlobalStep struct {
		PreExponential      float64 `toml:"pre_exponential"`
		TemperatureExponent float64 `toml:"temperature_exponent"`
		ActivationEnergy    any     `toml:"activation_energy"`
		CrackingTime        any     `toml:"cracking_time"`
		AtTemperature       any     `toml:"at_temperature"`
	} `toml:"global_step"`
	Transport *struct {
		WellDepth float64 `toml:"lj_well_depth_K"`
		Diameter  any     `toml:"lj_diameter"`
	} `toml:"kinetic_theory"`
}

// keyError builds the error of one key (a dotted path) of file src.
type keyError func(key, format string, a ...any) error

// decodeStrict decodes src into v; a key v does not hold is an error
// naming it, its line and doc, the page that lists every key.
func decodeStrict(src []byte, file string, v any, doc string) (toml.MetaData, error) {
	md, err := tomlpos.Decode(src, file, v)
	if err != nil {
		return md, err
	}
	if und := md.Undecoded(); len(und) > 0 {
		k := und[0]
		// A table where a quantity belongs leaves its keys undecoded.
		for n := 1; n < len(k); n++ {
			if quantityNames[k[n-1]] {
				return md, &FieldError{File: file, Line: tomlpos.Line(src, k[:n]), Key: k[:n].String(),
					Msg: "expected a number or a string with units, got a table"}
			}
		}
		return md, &FieldError{File: file, Line: tomlpos.Line(src, k), Key: k.String(),
			Msg: "unknown key (check the spelling; " + doc + " lists every key)"}
	}
	return md, nil
}

func keyErrors(src []byte, file string) keyError {
	return func(key, format string, a ...any) error {
		return &FieldError{File: file, Line: tomlpos.Line(src, strings.Split(key, ".")), Key: key, Msg: fmt.Sprintf(format, a...)}
	}
}

// spec converts the table [fuels.name] to SI units.
func (t *fuelTable) spec(name string, fe keyError) (fuel.Spec, error) {
	// The name and description are copied into outputs; the name also
	// names a folder.
	table := toml.Key{"fuels", name}.String()
	if err := checkText(name, maxNameBytes); err != nil {
		return fuel.Spec{}, fe(table, "fuel name: %v", err)
	}
	if err := checkText(t.Description, maxTitleBytes); err != nil {
		return fuel.Spec{}, fe(table+".description", "%v", err)
	}
	s := fuel.Spec{Name: name, Description: t.Description, Mechanism: t.Mechanism, Composition: t.Composition,
		Formula: t.Formula, HToC: t.HToC, OToC: t.OToC, Mode: t.Mode, SpeciesName: t.SpeciesName}
	key := "fuels." + name + "."
	for _, q := range []struct {
		key string
		v   any
		d   units.Dimension
		dst *float64
	}{
		{"molar_mass", t.MolarMass, units.MolarMass, &s.MolarMass},
		{"lower_heating_value", t.LowerHeatingValue, units.EnergyPerMass, &s.LowerHeatingValue},
		{"higher_heating_value", t.HigherHeatingValue, units.EnergyPerMass, &s.HigherHeatingValue},
		{"vaporization_enthalpy", t.VaporizationEnthalpy, units.EnergyPerMass, &s.VaporizationEnthalpy},
		{"standard_entropy", t.StandardEntropy, units.MolarEntropy, &s.StandardEntropy},
		{"cracking.temperature", t.Cracking.Temperature, units.Temperature, &s.Cracking.Temperature},
		{"cracking.pressure", t.Cracking.Pressure, units.Pressure, &s.Cracking.Pressure},
		{"global_step.cracking_time", t.GlobalStep.CrackingTime, units.Time, &s.GlobalStep.CrackingTime},
		{"global_step.at_temperature", t.GlobalStep.AtTemperature, units.Temperature, &s.GlobalStep.AtTemperature},
	} {
		v, err := quantity(q.v, q.d, 0)
		if err != nil {
			return fuel.Spec{}, fe(key+q.key, "%v", err)
		}
		*q.dst = v
	}
	c := &t.Cracking
	s.Cracking.Method, s.Cracking.Yields, s.Cracking.Balance = c.Method, c.Yields, c.Balance
	s.Cracking.ScaleToCarbon, s.Cracking.Candidates, s.Cracking.Exclude = c.ScaleToCarbon, c.Candidates, c.Exclude
	g := &t.GlobalStep
	s.GlobalStep.PreExponential, s.GlobalStep.TemperatureExponent = g.PreExponential, g.TemperatureExponent
	if g.ActivationEnergy != nil {
		e, err := quantity(g.ActivationEnergy, units.EnergyPerMole, 0)
		if err != nil {
			return fuel.Spec{}, fe(key+"global_step.activation_energy", "%v", err)
		}
		s.GlobalStep.ActivationEnergy = &e
	}
	if tr := t.Transport; tr != nil {
		d, err := quantity(tr.Diameter, units.Length, 0)
		if err != nil {
			return fuel.Spec{}, fe(key+"kinetic_theory.lj_diameter", "%v", err)
		}
		// Lennard-Jones diameters are a few Å: a bare number above 1e-8 is
		// a diameter in Å written without its unit, not metres.
		if str, isString := tr.Diameter.(string); (!isString || isBareNumber(str)) && d > 1e-8 {
			return fuel.Spec{}, fe(key+"kinetic_theory.lj_diameter", "a bare number is metres; write the unit, e.g. \"%g Å\"", d)
		}
		s.Transport = &fuel.TransportSpec{WellDepth: tr.WellDepth, Diameter: d}
	}
	return s, nil
}

func isBareNumber(s string) bool {
	_, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	return err == nil
}

// fuelFile is the TOML layout of a file holding fuel definitions, each
// under [fuels.NAME]. Other top-level keys and tables are left to their
// owners, so a case file's fuels read the same way.
type fuelFile struct {
	Mechanism string               `toml:"mechanism"`
	Fuels     map[string]fuelTable `toml:"fuels"`
	Mixture   struct {
		Oxidizer         map[string]float64 `toml:"oxidizer"`
		EquivalenceRatio float64            `toml:"equivalence_ratio"`
		Temperature      any                `toml:"temperature"`
	} `toml:"mixture"`
}

// FuelFile is the fuel definitions of a file in SI units and, when the file
// is a case file, the conditions of its [mixture] table.
type FuelFile struct {
	// Mechanism names the mechanism the pools are built on (built-in name
	// or path relative to the file); empty when not given.
	Mechanism string
	// Fuels are the [fuels.NAME] tables, sorted by name.
	Fuels []fuel.Spec
	// Oxidizer (mole fractions, normalised), EquivalenceRatio and
	// Temperature (unburned, K) of the [mixture] table; nil or zero where
	// the file does not give them.
	Oxidizer         map[string]float64
	EquivalenceRatio float64
	Temperature      float64
}

// ParseFuels reads the fuel definitions of a TOML document; file names the
// source in errors. Unknown keys inside a fuel are errors naming the key
// and its line.
func ParseFuels(src []byte, file string) (*FuelFile, error) {
	var ff fuelFile
	md, err := tomlpos.Decode(src, file, &ff)
	if err != nil {
		return nil, err
	}
	for _, k := range md.Undecoded() {
		if len(k) > 2 && k[0] == "fuels" {
			return nil, &FieldError{File: file, Line: tomlpos.Line(src, k), Key: k.String(),
				Msg: "unknown key (check the spelling; docs/fuels.md lists every key)"}
		}
	}
	if len(ff.Fuels) == 0 {
		return nil, fmt.Errorf("%s: no fuels: define each under a [fuels.NAME] table (see docs/fuels.md)", file)
	}
	names := make([]string, 0, len(ff.Fuels))
	for n := range ff.Fuels {
		names = append(names, n)
	}
	sort.Strings(names)
	fe := keyErrors(src, file)
	out := &FuelFile{Mechanism: ff.Mechanism, EquivalenceRatio: ff.Mixture.EquivalenceRatio}
	for _, n := range names {
		t := ff.Fuels[n]
		s, err := t.spec(n, fe)
		if err != nil {
			return nil, err
		}
		out.Fuels = append(out.Fuels, s)
	}
	if len(ff.Mixture.Oxidizer) > 0 {
		if out.Oxidizer, err = normalised(ff.Mixture.Oxidizer); err != nil {
			return nil, fe("mixture.oxidizer", "%v", err)
		}
	}
	if out.Temperature, err = quantity(ff.Mixture.Temperature, units.Temperature, 0); err != nil {
		return nil, fe("mixture.temperature", "%v", err)
	}
	return out, nil
}

// ReadFuels reads the fuel definitions of a TOML file (see ParseFuels).
func ReadFuels(path string) (*FuelFile, error) {
	src, err := infile.ReadFile(path, infile.FuelFile)
	if err != nil {
		return nil, err
	}
	return ParseFuels(src, path)
}
