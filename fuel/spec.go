package fuel

// Spec defines one fuel, in SI units; casefile reads it from TOML (every
// key is documented in docs/fuels.md). A zero number means "not given". A
// fuel is either
//
//   - neat or a surrogate: Composition gives mole fractions of mechanism
//     species; or
//   - a cracked pool: a real multicomponent fuel given by its mean formula
//     (Formula, or HToC plus MolarMass), one heating value, and how it
//     cracks (Cracking); it enters the flame as a pseudo-species with a
//     global cracking step (Mode "finite-rate", the default) or as its
//     cracked pool (Mode "pre-cracked").
type Spec struct {
	// Name identifies the fuel in reports (the file's [fuels.NAME]).
	Name        string
	Description string
	// Mechanism names the mechanism this fuel burns on (built-in name or
	// path relative to the file that gives it); empty means the file's
	// (casefile.Case.MechanismOf).
	Mechanism string

	// Composition: mole fractions of mechanism species (neat or surrogate).
	Composition map[string]float64

	// Mean formula CxHyOz, or the H/C (and O/C) ratio with the molar mass.
	Formula   string
	HToC      float64
	OToC      float64
	MolarMass float64 // kg/mol

	// Exactly one heating value, J/kg.
	LowerHeatingValue  float64
	HigherHeatingValue float64
	// VaporizationEnthalpy, J/kg, when positive says the heating value is
	// that of the liquid fuel at 298.15 K; the vapour's enthalpy of
	// formation is then the liquid's plus this.
	VaporizationEnthalpy float64
	// StandardEntropy, J/(mol K), overrides the estimated s°(298.15 K) of
	// the pseudo-species.
	StandardEntropy float64

	Mode        string // "finite-rate" (default) or "pre-cracked"
	SpeciesName string // pseudo-species name; default "FUEL"
	Cracking    CrackingSpec
	GlobalStep  GlobalStepSpec
	Transport   *TransportSpec
}

// CrackingSpec says how a cracked-pool fuel breaks into pool species.
type CrackingSpec struct {
	// Method is "yields" or "equilibrium"; default "yields" when Yields is
	// given, else "equilibrium".
	Method string

	// Measured yields: moles of each pool species per mole of fuel.
	Yields map[string]float64
	// Balance names the species whose amounts are adjusted to close the
	// element balances; default ["H2"] (and "CO" for a fuel with oxygen).
	Balance []string
	// ScaleToCarbon scales every given yield by one common factor as one of
	// the closure unknowns; nil means true.
	ScaleToCarbon *bool

	// Constrained equilibrium: cracking temperature (K) and pressure (Pa),
	// the candidate species (default: the mechanism's closed-shell C0-C4
	// species) and the species walled off.
	Temperature float64
	Pressure    float64
	Candidates  []string
	Exclude     []string
}

// GlobalStepSpec gives the irreversible first-order step FUEL -> pool of
// the finite-rate mode, k = A T^b exp(-E/(R T)). Either PreExponential or
// CrackingTime (with AtTemperature) fixes A; the rest have defaults (see
// Rate).
type GlobalStepSpec struct {
	PreExponential      float64 // A, 1/s (K^-b/s with an exponent)
	TemperatureExponent float64
	// ActivationEnergy, J/mol; nil means DefaultActivationEnergy.
	ActivationEnergy *float64
	CrackingTime     float64 // 1/k at AtTemperature, s; 0 means DefaultCrackingTime
	AtTemperature    float64 // K; 0 means DefaultCrackingTempK
}

// Given reports whether any key of the step was given.
func (g GlobalStepSpec) Given() bool {
	return g.PreExponential != 0 || g.TemperatureExponent != 0 || g.ActivationEnergy != nil || g.CrackingTime != 0 || g.AtTemperature != 0
}

// TransportSpec overrides the estimated Lennard-Jones parameters of the
// pseudo-species.
type TransportSpec struct {
	WellDepth float64 // epsilon/k_B, K
	Diameter  float64 // sigma, m
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
	return s.Formula != "" || s.HToC != 0 || s.MolarMass != 0 || s.LowerHeatingValue != 0 || s.HigherHeatingValue != 0
}
