package fuel

import (
	"errors"
	"fmt"
	"math"
	"os"
	"sort"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"flame1d/internal/tomlpos"
	"flame1d/units"
)

// Spec defines one fuel. Every key is documented in docs/fuels.md. A fuel
// is either
//
//   - neat or a surrogate: Composition gives mole fractions of mechanism
//     species; or
//   - a cracked pool: a real multicomponent fuel given by its mean formula
//     (Formula, or HToC plus MolarMass), one heating value, and how it
//     cracks (Cracking); it enters the flame as a pseudo-species with a
//     global cracking step (Mode "finite-rate", the default) or as its
//     cracked pool (Mode "pre-cracked").
type Spec struct {
	// Name identifies the fuel in reports; files give it as the table key
	// ([fuels.NAME]).
	Name        string `toml:"-"`
	Description string `toml:"description"`

	// Composition: mole fractions of mechanism species (neat or surrogate).
	Composition map[string]float64 `toml:"composition"`

	// Mean formula CxHyOz, or the H/C (and O/C) ratio with the molar mass.
	Formula   string   `toml:"formula"`
	HToC      float64  `toml:"h_to_c"`
	OToC      float64  `toml:"o_to_c"`
	MolarMass Quantity `toml:"molar_mass"` // "158 g/mol", "0.158 kg/mol"; bare number kg/mol

	// Exactly one heating value (energy per mass, e.g. "43.2 MJ/kg").
	LowerHeatingValue  Quantity `toml:"lower_heating_value"`
	HigherHeatingValue Quantity `toml:"higher_heating_value"`
	// VaporizationEnthalpy, when given, says the heating value is that of
	// the liquid fuel at 298.15 K; the vapour's enthalpy of formation is
	// then the liquid's plus this (energy per mass).
	VaporizationEnthalpy Quantity `toml:"vaporization_enthalpy"`
	// StandardEntropy overrides the estimated s°(298.15 K) of the
	// pseudo-species ("590 J/mol/K"; bare number J/(mol K)).
	StandardEntropy Quantity `toml:"standard_entropy"`

	Mode        string         `toml:"mode"`         // "finite-rate" (default) or "pre-cracked"
	SpeciesName string         `toml:"species_name"` // pseudo-species name; default "FUEL"
	Cracking    CrackingSpec   `toml:"cracking"`
	GlobalStep  GlobalStepSpec `toml:"global_step"`
	Transport   *TransportSpec `toml:"transport"`
}

// CrackingSpec says how a cracked-pool fuel breaks into pool species.
type CrackingSpec struct {
	// Method is "yields" or "equilibrium"; default "yields" when Yields is
	// given, else "equilibrium".
	Method string `toml:"method"`

	// Measured yields: moles of each pool species per mole of fuel.
	Yields map[string]float64 `toml:"yields"`
	// Balance names the species whose amounts are adjusted to close the
	// element balances; default ["H2"] (and "CO" for a fuel with oxygen).
	Balance []string `toml:"balance"`
	// ScaleToCarbon scales every given yield by one common factor as one of
	// the closure unknowns; default true.
	ScaleToCarbon *bool `toml:"scale_to_carbon"`

	// Constrained equilibrium: cracking temperature and pressure, the
	// candidate species (default: the mechanism's closed-shell C0-C4
	// species) and the species walled off.
	Temperature Quantity `toml:"temperature"`
	Pressure    Quantity `toml:"pressure"`
	Candidates  []string `toml:"candidates"`
	Exclude     []string `toml:"exclude"`
}

// GlobalStepSpec gives the irreversible first-order step FUEL -> pool of
// the finite-rate mode, k = A T^b exp(-E/(R T)). Either PreExponential or
// CrackingTime (with AtTemperature) fixes A; the rest have defaults (see
// DefaultGlobalStep).
type GlobalStepSpec struct {
	PreExponential      float64  `toml:"pre_exponential"` // A, 1/s (K^-b/s with an exponent)
	TemperatureExponent float64  `toml:"temperature_exponent"`
	ActivationEnergy    Quantity `toml:"activation_energy"` // "250 kJ/mol"; bare number J/mol
	CrackingTime        Quantity `toml:"cracking_time"`     // 1/k at AtTemperature, "0.1 ms"
	AtTemperature       Quantity `toml:"at_temperature"`    // default 1300 K
}

// TransportSpec overrides the estimated Lennard-Jones parameters of the
// pseudo-species.
type TransportSpec struct {
	WellDepth float64  `toml:"well_depth"` // epsilon/k_B, K
	Diameter  Quantity `toml:"diameter"`   // sigma: "7.2 Å", "0.72 nm", "7.2e-10 m"
}

// Quantity is a value as written in a fuel file: a string with its unit
// ("43.2 MJ/kg", "1300 K") or a bare number in SI units. The empty
// Quantity means "not given".
type Quantity string

// UnmarshalTOML accepts a string, an integer or a float.
func (q *Quantity) UnmarshalTOML(v any) error {
	switch x := v.(type) {
	case string:
		*q = Quantity(x)
	case int64:
		*q = Quantity(strconv.FormatInt(x, 10))
	case float64:
		*q = Quantity(strconv.FormatFloat(x, 'g', -1, 64))
	default:
		return fmt.Errorf("expected a number or a string with units, got %T", v)
	}
	return nil
}

// Given reports whether a value was written.
func (q Quantity) Given() bool { return strings.TrimSpace(string(q)) != "" }

// In converts the quantity to SI units of dimension d.
func (q Quantity) In(d units.Dimension) (float64, error) { return units.Parse(string(q), d) }

// splitUnit separates number and unit of q for the dimensions package
// units does not know (molar mass, entropy, Lennard-Jones diameter).
func (q Quantity) splitUnit() (float64, string, error) {
	s := strings.TrimSpace(string(q))
	end := 0
	for end < len(s) && strings.IndexByte("0123456789+-.eE", s[end]) >= 0 {
		end++
	}
	// Back off an exponent letter that starts the unit ("5e" is not a number).
	for end > 0 {
		if _, err := strconv.ParseFloat(s[:end], 64); err == nil {
			break
		}
		end--
	}
	v, err := strconv.ParseFloat(s[:end], 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, "", fmt.Errorf("%q does not start with a finite number", s)
	}
	return v, strings.TrimSpace(s[end:]), nil
}

func (q Quantity) molarMass() (float64, error) {
	v, u, err := q.splitUnit()
	if err != nil {
		return 0, err
	}
	switch u {
	case "", "kg/mol":
		return v, nil
	case "g/mol", "kg/kmol":
		return v * 1e-3, nil
	}
	return 0, fmt.Errorf("%q: unknown molar-mass unit %q (use g/mol or kg/mol)", string(q), u)
}

func (q Quantity) entropy() (float64, error) {
	v, u, err := q.splitUnit()
	if err != nil {
		return 0, err
	}
	switch strings.ReplaceAll(u, " ", "") {
	case "", "J/mol/K", "J/(molK)", "J/(mol*K)":
		return v, nil
	case "cal/mol/K", "cal/(molK)", "cal/(mol*K)":
		return v * 4.184, nil
	}
	return 0, fmt.Errorf("%q: unknown entropy unit %q (use J/mol/K or cal/mol/K)", string(q), u)
}

func (q Quantity) diameter() (float64, error) {
	v, u, err := q.splitUnit()
	if err != nil {
		return 0, err
	}
	switch u {
	case "Å", "A", "angstrom":
		return v * 1e-10, nil
	case "nm":
		return v * 1e-9, nil
	case "m":
		return v, nil
	case "":
		if v > 1e-8 {
			return 0, fmt.Errorf("%q: a bare number is metres; write the unit, e.g. \"%g Å\"", string(q), v)
		}
		return v, nil
	}
	return 0, fmt.Errorf("%q: unknown length unit %q (use Å, nm or m)", string(q), u)
}

// Mode names.
const (
	ModeFiniteRate = "finite-rate"
	ModePreCracked = "pre-cracked"
)

// Cracking method names.
const (
	MethodYields      = "yields"
	MethodEquilibrium = "equilibrium"
)

// IsPool reports whether the spec describes a cracked-pool fuel rather
// than a neat fuel or surrogate.
func (s *Spec) IsPool() bool {
	return s.Formula != "" || s.HToC != 0 || s.MolarMass.Given() || s.LowerHeatingValue.Given() || s.HigherHeatingValue.Given()
}

// FuelFile is the layout of a TOML file holding fuel definitions, each
// under [fuels.NAME]. Other top-level keys are left to their owners, so a
// case file's fuels table reads the same way.
type FuelFile struct {
	// Mechanism names the mechanism the pools are built on (built-in name
	// or path); optional.
	Mechanism string          `toml:"mechanism"`
	Fuels     map[string]Spec `toml:"fuels"`
}

// ParseFuels reads the fuel definitions of a TOML document; file names the
// source in errors. Unknown keys inside a fuel are errors naming the key
// and its line. Fuels come back sorted by name.
func ParseFuels(src []byte, file string) (mechanism string, specs []Spec, err error) {
	var ff FuelFile
	md, err := toml.Decode(string(src), &ff)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return "", nil, fmt.Errorf("%s:%d: TOML syntax: %s", file, pe.Position.Line, pe.Message)
		}
		return "", nil, fmt.Errorf("%s: %w", file, err)
	}
	for _, k := range md.Undecoded() {
		if len(k) > 2 && k[0] == "fuels" {
			return "", nil, fmt.Errorf("%s:%d: %s: unknown key (check the spelling; docs/fuels.md lists every key)",
				file, tomlpos.Line(src, k), k.String())
		}
	}
	if len(ff.Fuels) == 0 {
		return "", nil, fmt.Errorf("%s: no fuels: define each under a [fuels.NAME] table (see docs/fuels.md)", file)
	}
	names := make([]string, 0, len(ff.Fuels))
	for n := range ff.Fuels {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		s := ff.Fuels[n]
		s.Name = n
		specs = append(specs, s)
	}
	return ff.Mechanism, specs, nil
}

// ReadFuels reads the fuel definitions of a TOML file (see ParseFuels).
func ReadFuels(path string) (mechanism string, specs []Spec, err error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return "", nil, fmt.Errorf("fuel file: %w", err)
	}
	return ParseFuels(src, path)
}
