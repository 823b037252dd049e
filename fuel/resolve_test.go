package fuel

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
	"flame1d/transport"
)

var air = map[string]float64{"O2": 0.21, "N2": 0.79}

// kerosene is an invented reference kerosene: H/C 1.95, LHV 43.2 MJ/kg,
// typical of jet fuels (common practice, no source), cracking by measured
// yields (invented: ethylene-rich as pyrolysis yields are, with enough
// hydrogen-poor butadiene and acetylene to stand for the aromatics the
// skeletal mechanism lacks; given H/C 1.93, so closing takes a little H2).
func kerosene() Spec {
	return Spec{
		Name: "ref-kerosene", Formula: "C11.4H22.23", LowerHeatingValue: 43.2e6,
		Cracking: CrackingSpec{Yields: map[string]float64{"c2h4": 2.6, "ch4": 0.8, "c3h6": 0.5, "c4h6": 0.6, "c2h2": 0.8, "h2": 0.2}},
	}
}

func TestResolveClosureAndHeatingValue(t *testing.T) {
	m, set := builtinMech(t, "lu2009-heptane")
	eq := Spec{Name: "eq", HToC: 2, MolarMass: 0.1543, LowerHeatingValue: 43e6,
		Cracking: CrackingSpec{Method: "equilibrium", Temperature: 1300, Pressure: 10e5, Exclude: []string{"c2h2", "c3h4-a", "c3h4-p", "c3h2", "c4h6"}}}
	oxy := Spec{Name: "oxy", Formula: "C10H20O0.5", HigherHeatingValue: 45e6,
		Cracking: CrackingSpec{Yields: map[string]float64{"c2h4": 3, "c2h2": 0.5}}}
	liquid := kerosene()
	liquid.Name, liquid.VaporizationEnthalpy = "liquid", 0.36e6
	for _, s := range []Spec{kerosene(), eq, oxy, liquid} {
		for _, mode := range []string{ModeFiniteRate, ModePreCracked} {
			s.Mode = mode
			r, err := s.Resolve(m, set)
			if err != nil {
				t.Fatalf("%s (%s): %v", s.Name, mode, err)
			}
			checkClosure(t, set, r.Pool)
			rep := r.Report
			if max(abs(rep.Residuals.C), abs(rep.Residuals.H), abs(rep.Residuals.O)) > 1e-12 {
				t.Errorf("%s: reported residuals %+v", s.Name, rep.Residuals)
			}
			// The heating value recomputed from the pseudo-species' own thermo
			// by thermo.SpeciesSet.LowerHeatingValue (complete combustion at
			// 298.15 K) equals the input; exact by construction up to
			// round-off, so 1e-6 is loose.
			one, err := thermo.NewSpeciesSet(append(append([]thermo.Species(nil), set.Species...), r.Pool.Pseudo.Species))
			if err != nil {
				t.Fatal(err)
			}
			x := make([]float64, one.Len())
			x[one.Len()-1] = 1
			lhv, err := one.LowerHeatingValue(x)
			if err != nil {
				t.Fatal(err)
			}
			hhv, _ := one.HigherHeatingValue(x)
			var want, got float64
			switch {
			case s.HigherHeatingValue != 0:
				want, got = 45e6, hhv
			case s.VaporizationEnthalpy != 0:
				want, got = 43.2e6+0.36e6, lhv
			default:
				want, got = map[string]float64{"ref-kerosene": 43.2e6, "eq": 43e6}[s.Name], lhv
			}
			if relErr(got, want) > 1e-6 {
				t.Errorf("%s: heating value from the pseudo-species %.9g J/kg, input %.9g", s.Name, got, want)
			}
			if mode == ModeFiniteRate {
				t.Logf("%s: heating value relative error %.2g; residuals %+v; cracking enthalpy %.4g MJ/kg; cp fit %.2g",
					s.Name, relErr(got, want), rep.Residuals, rep.CrackingEnthalpy/1e6, rep.Pseudo.CpFitDeviation)
			}
			if relErr(rep.LHV, lhv) > 1e-9 || relErr(rep.HHV, hhv) > 1e-9 {
				t.Errorf("%s: reported LHV/HHV %g/%g, thermo %g/%g", s.Name, rep.LHV, rep.HHV, lhv, hhv)
			}
			// h(298.15 K) of the pseudo-species is the enthalpy of formation.
			if h := r.Pool.Pseudo.EnthalpyMole(thermo.ReferenceTemperature); relErr(h, r.Pool.FormationEnthalpy) > 1e-12 {
				t.Errorf("%s: h(298.15) = %.12g J/mol, formation enthalpy %.12g", s.Name, h, r.Pool.FormationEnthalpy)
			}
			// cp is the pool's per mole of fuel: the fit follows it to 0.5 %
			// (measured 0.1-0.2 %) across the range.
			if dev := rep.Pseudo.CpFitDeviation; dev > 0.005 {
				t.Errorf("%s: cp fit deviates by %.3g from the pool's cp", s.Name, dev)
			}
			for _, T := range []float64{300, 700, 1000, 1500, 2500} {
				pool := 0.0
				for i, n := range r.Pool.Species {
					pool += r.Pool.Moles[i] * set.Species[set.Index(n)].CpMole(T)
				}
				if e := relErr(r.Pool.Pseudo.CpMole(T), pool); e > 0.005 {
					t.Errorf("%s: cp(%g K) = %.2f J/(mol K), pool %.2f", s.Name, T, r.Pool.Pseudo.CpMole(T), pool)
				}
			}
			if jump := r.Pool.Pseudo.Thermo.MidpointJump(); jump > 1e-10 {
				t.Errorf("%s: pseudo-species polynomials jump by %g at 1000 K", s.Name, jump)
			}
			// Cracking a fuel to light olefins takes heat (common practice, no
			// source): 1-5 MJ/kg for pools like these.
			if !(rep.CrackingEnthalpy > 1e6 && rep.CrackingEnthalpy < 5e6) {
				t.Errorf("%s: cracking enthalpy %g J/kg outside 1-5 MJ/kg", s.Name, rep.CrackingEnthalpy)
			}
		}
	}
}

// TestFormationEnthalpyNHeptane checks the heating-value inversion
// against n-heptane: NIST Chemistry WebBook, liquid ΔcH° = -4817 kJ/mol,
// ΔvapH°(298 K) = 36.6 kJ/mol, gas ΔfH° = -187.8 kJ/mol (values quoted
// from memory). The tolerance, 1.5 kJ/mol, covers their rounding and the
// mechanism's CO2/H2O enthalpies.
func TestFormationEnthalpyNHeptane(t *testing.T) {
	m, set := builtinMech(t, "lu2009-heptane")
	W := Formula{C: 7, H: 16}.MolarMass()
	s := Spec{Name: "heptane-as-pool", Formula: "C7H16",
		HigherHeatingValue: 4817e3 / W, VaporizationEnthalpy: 36.6e3 / W,
		Cracking: CrackingSpec{Yields: map[string]float64{"c2h4": 3, "ch4": 1}}}
	r, err := s.Resolve(m, set)
	if err != nil {
		t.Fatal(err)
	}
	if hf := r.Pool.FormationEnthalpy; math.Abs(hf-(-187.8e3)) > 1.5e3 {
		t.Errorf("n-heptane vapour Δh_f from its heating value = %.1f kJ/mol, NIST -187.8", hf/1e3)
	}
	t.Logf("n-heptane vapour Δh_f from HHV(liquid) and ΔvapH: %.2f kJ/mol (NIST -187.8)", r.Pool.FormationEnthalpy/1e3)
	// Round trip with the mechanism's own n-heptane: its LHV as input gives
	// back its enthalpy of formation.
	k := set.Index("nc7h16")
	x := make([]float64, set.Len())
	x[k] = 1
	lhv, err := set.LowerHeatingValue(x)
	if err != nil {
		t.Fatal(err)
	}
	hf, err := FormationEnthalpyFromLHV(set, Formula{C: 7, H: 16}, lhv)
	if err != nil {
		t.Fatal(err)
	}
	if want := set.Species[k].FormationEnthalpy(); math.Abs(hf-want) > 1e-9*math.Abs(want) {
		t.Errorf("round trip Δh_f = %.12g, mechanism %.12g J/mol", hf, want)
	}
}

func ftoa(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

func TestAugmentMechanism(t *testing.T) {
	m, set := builtinMech(t, "lu2009-heptane")
	s := kerosene()
	s.SpeciesName = "KERO"
	r, err := s.Resolve(m, set)
	if err != nil {
		t.Fatal(err)
	}
	aug := r.Mechanism
	if len(aug.Species) != len(m.Species)+1 || len(aug.Reactions) != len(m.Reactions)+1 {
		t.Fatalf("augmented mechanism has %d species, %d reactions; want %d, %d",
			len(aug.Species), len(aug.Reactions), len(m.Species)+1, len(m.Reactions)+1)
	}
	if _, err := aug.Validate(); err != nil {
		t.Fatalf("augmented mechanism does not validate: %v", err)
	}
	// The global step balances to round-off (Validate allows 1e-3).
	rx := aug.Reactions[len(aug.Reactions)-1]
	net := map[string]float64{}
	for _, p := range rx.Reactants {
		for e, n := range aug.Species[p.Species].Composition {
			net[strings.ToUpper(e)] += p.Coefficient * n
		}
	}
	for _, p := range rx.Products {
		for e, n := range aug.Species[p.Species].Composition {
			net[strings.ToUpper(e)] -= p.Coefficient * n
		}
	}
	for e, d := range net {
		if math.Abs(d) > 1e-12*r.Pool.Formula.C {
			t.Errorf("global step %s: element %s imbalance %g", rx.Equation, e, d)
		}
	}
	if rx.Reversible || !strings.HasPrefix(rx.Equation, "KERO => ") {
		t.Errorf("global step %q: want an irreversible step from KERO", rx.Equation)
	}
	if len(m.Reactions) == len(aug.Reactions) || m.SpeciesIndex("KERO") >= 0 {
		t.Error("AugmentMechanism modified its input")
	}
	// Rate: the default cracking time is 0.1 ms at 1300 K (k = 1e4 /s),
	// and the chemistry package evaluates the step so.
	kin, err := chem.NewKinetics(aug)
	if err != nil {
		t.Fatal(err)
	}
	n := len(aug.Species)
	C := make([]float64, n)
	C[n-1] = 1
	kf, kr := make([]float64, len(aug.Reactions)), make([]float64, len(aug.Reactions))
	kin.RateConstants(1300, C, kf, kr)
	if last := len(kf) - 1; relErr(kf[last], 1e4) > 1e-9 || kr[last] != 0 {
		t.Errorf("global step at 1300 K: kf = %g /s, kr = %g; want 1e4 /s, 0", kf[last], kr[last])
	}
	if tau := CrackingTime(r.Rate, 1300); relErr(tau, 1e-4) > 1e-12 {
		t.Errorf("cracking time at 1300 K = %g s, want 1e-4", tau)
	}
	// The flame's transport model accepts the pseudo-species.
	if _, err := transport.New(aug, transport.Options{}); err != nil {
		t.Errorf("transport model of the augmented mechanism: %v", err)
	}
	// A name clash is refused.
	if _, err := AugmentMechanism(m, &Pool{Fuel: "x", Pseudo: &chem.Species{Species: thermo.Species{Name: "ch4"}}}, r.Rate); err == nil ||
		!strings.Contains(err.Error(), "already a species") {
		t.Errorf("pseudo-species named like a mechanism species: err = %v", err)
	}
}

func TestGlobalStepRate(t *testing.T) {
	for _, c := range []struct {
		g       GlobalStepSpec
		T, tau  float64
		wantErr string
	}{
		{GlobalStepSpec{}, 1300, 1e-4, ""},
		{GlobalStepSpec{CrackingTime: 50e-6, AtTemperature: 1400, ActivationEnergy: joulesPerMole(200e3)}, 1400, 50e-6, ""},
		{GlobalStepSpec{CrackingTime: 1e-3, TemperatureExponent: 1.5}, 1300, 1e-3, ""},
		{GlobalStepSpec{PreExponential: 1e13, ActivationEnergy: joulesPerMole(0)}, 1000, 1e-13, ""},
		{GlobalStepSpec{PreExponential: 1e13, CrackingTime: 1e-3}, 0, 0, "not both"},
		{GlobalStepSpec{CrackingTime: -1e-3}, 0, 0, "positive"},
		{GlobalStepSpec{ActivationEnergy: joulesPerMole(-1)}, 0, 0, "non-negative"},
	} {
		r, err := c.g.Rate()
		if c.wantErr != "" {
			if err == nil || !strings.Contains(err.Error(), c.wantErr) {
				t.Errorf("%+v: error %v, want %q", c.g, err, c.wantErr)
			}
			continue
		}
		if err != nil {
			t.Errorf("%+v: %v", c.g, err)
			continue
		}
		if tau := CrackingTime(r, c.T); relErr(tau, c.tau) > 1e-12 {
			t.Errorf("%+v: cracking time at %g K = %g s, want %g", c.g, c.T, tau, c.tau)
		}
	}
}

func TestPrecrackedInlet(t *testing.T) {
	m, set := builtinMech(t, "lu2009-heptane")
	s := kerosene()
	s.Mode = ModePreCracked
	r, err := s.Resolve(m, set)
	if err != nil {
		t.Fatal(err)
	}
	fr := kerosene()
	rf, err := fr.Resolve(m, set)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ phi, Tu float64 }{{1, 600}, {0.6, 450}, {1.4, 700}} {
		in, err := r.Inlet(air, c.phi, c.Tu)
		if err != nil {
			t.Fatalf("phi %g, %g K: %v", c.phi, c.Tu, err)
		}
		// Cracking is endothermic, so the pool enters colder (common
		// practice, no source).
		if !(in.TemperatureShift < 0) {
			t.Errorf("phi %g, %g K: temperature shift %g K, want a drop", c.phi, c.Tu, in.TemperatureShift)
		}
		// The uncracked reference: fuel vapour + air at Tu.
		fin, err := rf.Inlet(air, c.phi, c.Tu)
		if err != nil {
			t.Fatal(err)
		}
		// Size of the drop: the pool mixture's cp, taken at the mid
		// temperature, times the drop equals the fuel's mass fraction times
		// its cracking enthalpy at Tu (mean-value theorem; 3 % covers the
		// curvature of cp).
		Wf := r.Pool.MolarMass
		crack := -r.Pool.Pseudo.EnthalpyMole(c.Tu)
		for i, n := range r.Pool.Species {
			crack += r.Pool.Moles[i] * set.Species[set.Index(n)].EnthalpyMole(c.Tu)
		}
		yFuel := fin.Y[rf.Set.Index(rf.Pool.Pseudo.Name)]
		want := -yFuel * crack / Wf / set.CpMass(c.Tu+in.TemperatureShift/2, in.Y)
		if relErr(in.TemperatureShift, want) > 0.03 {
			t.Errorf("phi %g, %g K: shift %.2f K, estimate from the cracking enthalpy %.2f K", c.phi, c.Tu, in.TemperatureShift, want)
		}
		// Enthalpy balance: both inlets carry the same enthalpy per kg.
		hPool := set.EnthalpyMass(in.T, in.Y)
		t.Logf("phi %g, Tu %g K: pool enters at %.2f K (shift %.2f K), enthalpy mismatch %.2g", c.phi, c.Tu, in.T, in.TemperatureShift, relErr(hPool, fin.Enthalpy))
		if relErr(hPool, fin.Enthalpy) > 1e-9 {
			t.Errorf("phi %g: pre-cracked inlet h = %.12g J/kg, fuel + air %.12g", c.phi, hPool, fin.Enthalpy)
		}
		// Same atoms per kg in both inlets (equivalence ratio on the real
		// fuel's formula).
		b1, b2 := elementsPerKg(set, in.Y), elementsPerKg(rf.Set, fin.Y)
		for e, v := range b1 {
			if relErr(v, b2[e]) > 1e-12 {
				t.Errorf("phi %g: element %s %.15g mol/kg pre-cracked, %.15g finite-rate", c.phi, e, v, b2[e])
			}
		}
	}
	// Too cold: a pool that must enter below 200 K is refused with the
	// explanation.
	if _, err := r.Inlet(air, 1, 230); err == nil || !strings.Contains(err.Error(), "below the 200 K floor") {
		t.Errorf("inlet at 230 K: err = %v, want a refusal below 200 K", err)
	}
}

func elementsPerKg(set *thermo.SpeciesSet, Y []float64) map[string]float64 {
	out := map[string]float64{}
	for k, y := range Y {
		for e, n := range set.Species[k].Composition {
			out[strings.ToUpper(e)] += y / set.MolarMass[k] * n
		}
	}
	return out
}

func TestNeatFuel(t *testing.T) {
	m, set := builtinMech(t, "smith1999-natgas")
	s := Spec{Name: "natural gas", Composition: map[string]float64{"CH4": 0.9, "C2H6": 0.1}}
	r, err := s.Resolve(m, set)
	if err != nil {
		t.Fatal(err)
	}
	in, err := r.Inlet(air, 0.8, 300)
	if err != nil {
		t.Fatal(err)
	}
	ch, _ := Premixed(m, set, s.Composition, air, 0.8)
	for k := range ch.X {
		if in.X[k] != ch.X[k] {
			t.Fatalf("neat inlet differs from Premixed at %s", set.Species[k].Name)
		}
	}
	if r.Mechanism != m || in.T != 300 {
		t.Error("a neat fuel must burn the given mechanism at the unburned temperature")
	}
	s.Formula = "C11H22"
	if _, err := s.Resolve(m, set); err == nil || !strings.Contains(err.Error(), "not both") {
		t.Errorf("composition plus formula: err = %v", err)
	}
}

func TestResolveRefusals(t *testing.T) {
	m, set := builtinMech(t, "lu2009-heptane")
	base := kerosene()
	for _, c := range []struct {
		name string
		edit func(s *Spec)
		want string
	}{
		{"no heating value", func(s *Spec) { s.LowerHeatingValue = 0 }, "exactly one of"},
		{"two heating values", func(s *Spec) { s.HigherHeatingValue = 46e6 }, "exactly one of"},
		{"heating value unit", func(s *Spec) { s.LowerHeatingValue = 43.2 }, "outside 1-200 MJ/kg"},
		{"mode", func(s *Spec) { s.Mode = "cracked" }, "mode \"cracked\""},
		{"molar mass disagrees", func(s *Spec) { s.MolarMass = 0.170 }, "disagrees with formula"},
		{"h_to_c without molar mass", func(s *Spec) { s.Formula, s.HToC = "", 1.95 }, "needs molar_mass"},
		{"equilibrium without conditions", func(s *Spec) {
			s.Cracking = CrackingSpec{Method: "equilibrium"}
		}, "needs temperature and pressure"},
		{"keys of the other method", func(s *Spec) { s.Cracking.Temperature = 1300 }, "belong to method = \"equilibrium\""},
		{"global step in pre-cracked mode", func(s *Spec) {
			s.Mode, s.GlobalStep.CrackingTime = ModePreCracked, 1e-3
		}, "only to mode"},
		{"transport out of range", func(s *Spec) { s.Formula = "C30H62" }, "outside the n-alkane range"},
		{"bad species name", func(s *Spec) { s.SpeciesName = "KERO A" }, "may not contain blanks"},
		{"walled to infeasibility", func(s *Spec) {
			s.Cracking = CrackingSpec{Method: "equilibrium", Temperature: 1300, Pressure: 101325,
				Candidates: []string{"ch4", "c2h6", "h2"}}
		}, "cannot hold the fuel's atoms"},
	} {
		s := base
		s.Cracking.Yields = map[string]float64{}
		for k, v := range base.Cracking.Yields {
			s.Cracking.Yields[k] = v
		}
		c.edit(&s)
		_, err := s.Resolve(m, set)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want one containing %q", c.name, err, c.want)
		}
	}
}

func joulesPerMole(e float64) *float64 { return &e }
