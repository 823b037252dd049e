package keyblock

import (
	"math"
	"path/filepath"
	"strings"
	"testing"

	"flame1d/chem"
)

func readSet(t *testing.T, set string, thermoFile string) *chem.Mechanism {
	t.Helper()
	d := filepath.Join(mechanismsDir(t), set)
	th := ""
	if thermoFile != "" {
		th = filepath.Join(d, thermoFile)
	}
	m, probs, err := ReadFiles(filepath.Join(d, "mech.inp"), th, filepath.Join(d, "transport.dat"))
	if err != nil {
		t.Fatalf("%s: %v", set, err)
	}
	for _, p := range probs {
		if !p.Warning {
			t.Fatalf("%s: error problem without error: %v", set, p)
		}
	}
	return m
}

// reaction returns the nth (0-based) reaction whose equation is eq.
func reaction(t *testing.T, m *chem.Mechanism, eq string, nth int) *chem.Reaction {
	t.Helper()
	for i := range m.Reactions {
		if m.Reactions[i].Equation == eq {
			if nth == 0 {
				return &m.Reactions[i]
			}
			nth--
		}
	}
	t.Fatalf("reaction %q not found", eq)
	return nil
}

func closeTo(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Abs(want)
}

type setCounts struct {
	elements, species, reactions int
	reversible, irreversible     int
	elementary, threeBody        int
	falloff, chemAct, plog, cheb int
	troe4, troe3, duplicates     int
	explicitReverse, fractional  int
	specificCollider             int
}

func countMechanism(m *chem.Mechanism) setCounts {
	c := setCounts{elements: len(m.Elements), species: len(m.Species), reactions: len(m.Reactions)}
	for i := range m.Reactions {
		r := &m.Reactions[i]
		if r.Reversible {
			c.reversible++
		} else {
			c.irreversible++
		}
		switch r.Form {
		case chem.Elementary:
			c.elementary++
		case chem.ThreeBody:
			c.threeBody++
		case chem.Falloff:
			c.falloff++
		case chem.ChemicallyActivated:
			c.chemAct++
		case chem.PressureTable:
			c.plog++
		case chem.Chebyshev:
			c.cheb++
		}
		if f := r.FalloffRate; f != nil && f.Troe != nil {
			if f.Troe.HasT2 {
				c.troe4++
			} else {
				c.troe3++
			}
		}
		if r.Duplicate {
			c.duplicates++
		}
		if r.ReverseRate != nil {
			c.explicitReverse++
		}
		frac := false
		for _, side := range [][]chem.Participant{r.Reactants, r.Products} {
			for _, q := range side {
				frac = frac || q.Coefficient != math.Trunc(q.Coefficient)
			}
		}
		if frac {
			c.fractional++
		}
		if tb := r.ThirdBody; tb != nil && tb.Default == 0 && len(tb.Efficiencies) == 1 {
			c.specificCollider++
		}
	}
	return c
}

// TestSharedSetCounts imports every published set and compares its census
// with the counts stated in the set's PROVENANCE.md (made there by
// independent text processing of the files). Import also runs Validate, so
// every reaction of every set is element-balanced (a conservation check).
func TestSharedSetCounts(t *testing.T) {
	tests := []struct {
		set, thermo string
		want        setCounts // zero fields (not stated by PROVENANCE.md) are not compared, except those marked always
	}{
		// gri30/PROVENANCE.md: 309 <=>, 16 =>; 29 falloff, 26 with 4-parameter
		// TROE; 6 DUPLICATE lines.
		{"gri30", "thermo.dat", setCounts{elements: 5, species: 53, reactions: 325, reversible: 309, irreversible: 16,
			falloff: 29, troe4: 26, duplicates: 6}},
		// h2o2/PROVENANCE.md: 27 reactions, two falloff steps with 3-parameter TROE;
		// thermo embedded in mech.inp (no thermo file given here).
		{"h2o2", "", setCounts{elements: 6, species: 13, reactions: 27, reversible: 27, falloff: 2, troe3: 2}},
		// nheptane-sk68: 68 species, 283 reactions (README); the file has 259 REV lines.
		{"nheptane-sk68", "thermo.dat", setCounts{elements: 4, species: 68, reactions: 283, explicitReverse: 259}},
		// c0c4/PROVENANCE.md: 858 '=', 1141 '=>'; 188 PLOG; 94 DUPLICATE; 130
		// fractional; 40 LOW (36 TROE-4, 2 TROE-3); 9 '+M'.
		{"c0c4", "thermo.dat", setCounts{elements: 6, species: 114, reactions: 1999, reversible: 858, irreversible: 1141,
			plog: 188, duplicates: 94, fractional: 130, falloff: 40, troe4: 36, troe3: 2, threeBody: 9}},
		// c0c4-aramco13/PROVENANCE.md: 1387 '<=>', 155 '=>'; 79 PLOG; 44 LOW
		// (38 TROE-4, 4 TROE-3); 14 DUP; (+AR), (+HE), (+H2O) colliders.
		{"c0c4-aramco13", "thermo.dat", setCounts{elements: 6, species: 253, reactions: 1542, reversible: 1387, irreversible: 155,
			plog: 79, falloff: 44, troe4: 38, troe3: 4, duplicates: 14, specificCollider: 3}},
	}
	for _, tc := range tests {
		t.Run(tc.set, func(t *testing.T) {
			m := readSet(t, tc.set, tc.thermo)
			got := countMechanism(m)
			w := tc.want
			check := func(name string, g, want int, always bool) {
				if (always || want != 0) && g != want {
					t.Errorf("%s = %d, want %d", name, g, want)
				}
			}
			check("elements", got.elements, w.elements, true)
			check("species", got.species, w.species, true)
			check("reactions", got.reactions, w.reactions, true)
			check("reversible", got.reversible, w.reversible, false)
			check("irreversible", got.irreversible, w.irreversible, false)
			check("falloff", got.falloff, w.falloff, false)
			check("TROE 4-parameter", got.troe4, w.troe4, false)
			check("TROE 3-parameter", got.troe3, w.troe3, false)
			check("duplicates", got.duplicates, w.duplicates, false)
			check("pressure tables", got.plog, w.plog, true)
			check("fractional", got.fractional, w.fractional, true)
			check("three-body", got.threeBody, w.threeBody, false)
			check("explicit reverse", got.explicitReverse, w.explicitReverse, false)
			check("specific collider", got.specificCollider, w.specificCollider, false)
			for i := range m.Species {
				if m.Species[i].Transport == nil {
					t.Errorf("species %s has no transport", m.Species[i].Name)
				}
			}
		})
	}
}

// TestConvertedNumbers compares converted values with the file text. Unit
// factors: 1 cm^3/mol = 1e-6 m^3/mol; 1 cal = 4.184 J (thermochemical
// calorie, exact); 1 atm = 101325 Pa (exact); 1 Å = 1e-10 m; 1 debye =
// 3.33564e-30 C m (CODATA 2018).
func TestConvertedNumbers(t *testing.T) {
	const rel = 1e-12 // unit changes are exact up to floating-point rounding
	gri := readSet(t, "gri30", "thermo.dat")
	sp := func(m *chem.Mechanism, name string) int {
		k := m.SpeciesIndex(name)
		if k < 0 {
			t.Fatalf("species %s missing", name)
		}
		return k
	}
	t.Run("gri30 elementary", func(t *testing.T) {
		// "O+H2<=>H+OH   3.870E+04    2.700    6260.00", bimolecular.
		r := reaction(t, gri, "O+H2<=>H+OH", 0)
		if r.Form != chem.Elementary || !closeTo(r.Rate.A, 3.87e4*1e-6, rel) || r.Rate.B != 2.7 || !closeTo(r.Rate.E, 6260*4.184, rel) {
			t.Errorf("rate %+v", r.Rate)
		}
	})
	t.Run("gri30 three-body", func(t *testing.T) {
		// "2O+M<=>O2+M 1.200E+17 -1.000 .00" is third order: A 1.2e17 cm^6/mol^2/s
		// = 1.2e5 m^6/mol^2/s; efficiencies "H2/ 2.40/ H2O/15.40/ ... AR/ .83/".
		r := reaction(t, gri, "2O+M<=>O2+M", 0)
		if r.Form != chem.ThreeBody || !closeTo(r.Rate.A, 1.2e5, rel) || r.Rate.B != -1 || r.Rate.E != 0 {
			t.Errorf("rate %+v form %v", r.Rate, r.Form)
		}
		if len(r.Reactants) != 1 || r.Reactants[0].Coefficient != 2 || r.Reactants[0].Species != sp(gri, "O") {
			t.Errorf("reactants %+v", r.Reactants)
		}
		tb := r.ThirdBody
		if tb.Default != 1 || tb.Efficiencies[sp(gri, "H2O")] != 15.4 || tb.Efficiencies[sp(gri, "AR")] != 0.83 || len(tb.Efficiencies) != 7 {
			t.Errorf("third body %+v", tb)
		}
	})
	t.Run("gri30 falloff with Troe", func(t *testing.T) {
		// "H+CH2(+M)<=>CH3(+M) 6.000E+14 .000 .00
		//  LOW / 1.040E+26 -2.760 1600.00/ TROE/ .5620 91.00 5836.00 8552.00/"
		r := reaction(t, gri, "H+CH2(+M)<=>CH3(+M)", 0)
		f := r.FalloffRate
		if r.Form != chem.Falloff || f == nil || r.ThirdBody == nil || r.ThirdBody.Default != 1 {
			t.Fatalf("form %v falloff %+v", r.Form, f)
		}
		if !closeTo(f.High.A, 6e14*1e-6, rel) || !closeTo(f.Low.A, 1.04e26*1e-12, rel) || f.Low.B != -2.76 || !closeTo(f.Low.E, 1600*4.184, rel) {
			t.Errorf("limits %+v", f)
		}
		if tr := f.Troe; tr == nil || *tr != (chem.Troe{A: 0.562, T3: 91, T1: 5836, T2: 8552, HasT2: true}) {
			t.Errorf("Troe %+v", f.Troe)
		}
	})
	t.Run("gri30 transport", func(t *testing.T) {
		// gri30/transport.dat: "H2O 2 572.400 2.605 1.844 0.000 4.000".
		tp := gri.Species[sp(gri, "H2O")].Transport
		want := chem.TransportParams{Geometry: chem.Nonlinear, WellDepth: 572.4, Diameter: 2.605e-10,
			Dipole: 1.844 * 3.33564095e-30, Polarizability: 0, RotRelaxation: 4}
		if tp == nil || tp.Geometry != want.Geometry || tp.WellDepth != want.WellDepth || !closeTo(tp.Diameter, want.Diameter, rel) ||
			!closeTo(tp.Dipole, want.Dipole, 1e-8) || tp.RotRelaxation != want.RotRelaxation {
			t.Errorf("H2O transport %+v, want %+v", tp, want)
		}
	})
	t.Run("h2o2 three-parameter Troe, embedded thermo", func(t *testing.T) {
		m := readSet(t, "h2o2", "")
		// "H+O2(+M) = HO2(+M) 4.65084E+12 0.44 0.000E+00 / LOW/6.366E+20 -1.72
		// 5.248E+02/ TROE/0.5 1E-30 1E+30/"
		r := reaction(t, m, "H+O2(+M) = HO2(+M)", 0)
		f := r.FalloffRate
		if !closeTo(f.Low.A, 6.366e20*1e-12, rel) || !closeTo(f.Low.E, 524.8*4.184, rel) ||
			*f.Troe != (chem.Troe{A: 0.5, T3: 1e-30, T1: 1e30}) {
			t.Errorf("falloff %+v troe %+v", f, f.Troe)
		}
		if h := m.Species[m.SpeciesIndex("H")]; h.Origin.Line != 76 || !strings.HasSuffix(h.Origin.File, "mech.inp") {
			t.Errorf("H thermo origin %+v, want mech.inp:76 (embedded block)", h.Origin)
		}
	})
	t.Run("c0c4 PLOG", func(t *testing.T) {
		m := readSet(t, "c0c4", "thermo.dat")
		// "HOCO=OH+CO" unimolecular, 12 PLOG lines from 1e-3 to 986.9 atm;
		// first "PLOG / 1.000000e-03 1.550000e-08 2.930000e+00 8.768000e+03 /".
		r := reaction(t, m, "HOCO=OH+CO", 0)
		if r.Form != chem.PressureTable || len(r.PressureRates) != 12 {
			t.Fatalf("form %v, %d pressures", r.Form, len(r.PressureRates))
		}
		p0 := r.PressureRates[0]
		if !closeTo(p0.P, 1e-3*101325, rel) || !closeTo(p0.Rate.A, 1.55e-8, rel) || p0.Rate.B != 2.93 || !closeTo(p0.Rate.E, 8768*4.184, rel) {
			t.Errorf("first PLOG entry %+v", p0)
		}
		if last := r.PressureRates[11]; !closeTo(last.P, 986.9*101325, rel) {
			t.Errorf("last pressure %g Pa", last.P)
		}
		// Bimolecular table: "OH+CH3=H2O+CH2(S)", "PLOG / 1.000000e-02 4.936000e+14 ...".
		r = reaction(t, m, "OH+CH3=H2O+CH2(S)", 0)
		if !closeTo(r.PressureRates[0].Rate.A, 4.936e14*1e-6, rel) || !closeTo(r.PressureRates[0].P, 1013.25, rel) {
			t.Errorf("bimolecular PLOG entry %+v", r.PressureRates[0])
		}
		// A duplicate pair of PLOG tables: "O2+C2H3=O+CH2CHO" twice, lines 672 and 683.
		a, b := reaction(t, m, "O2+C2H3=O+CH2CHO", 0), reaction(t, m, "O2+C2H3=O+CH2CHO", 1)
		if !a.Duplicate || !b.Duplicate || a.Origin.Line != 672 || b.Origin.Line != 683 ||
			!closeTo(b.PressureRates[0].Rate.A, 1.36e10*1e-6, rel) {
			t.Errorf("duplicate PLOG pair: %+v / %+v", a.Origin, b.Origin)
		}
		// Fractional products: "C2H3+MCPTD=>H+C2H4+0.85C6H6+0.15FULVENE".
		r = reaction(t, m, "C2H3+MCPTD=>H+C2H4+0.85C6H6+0.15FULVENE", 0)
		coef := map[string]float64{}
		for _, q := range r.Products {
			coef[m.Species[q.Species].Name] = q.Coefficient
		}
		if r.Reversible || coef["C6H6"] != 0.85 || coef["FULVENE"] != 0.15 || coef["H"] != 1 {
			t.Errorf("products %v reversible %v", coef, r.Reversible)
		}
	})
	t.Run("aramco specific collider", func(t *testing.T) {
		m := readSet(t, "c0c4-aramco13", "thermo.dat")
		// "H+O2(+AR)<=>HO2(+AR) 4.650E+012 0.440 0.0 / LOW/ 6.810E+018 -1.200 0.0/"
		r := reaction(t, m, "H+O2(+AR)<=>HO2(+AR)", 0)
		ar := sp(m, "AR")
		if r.Form != chem.Falloff || r.ThirdBody.Default != 0 || len(r.ThirdBody.Efficiencies) != 1 || r.ThirdBody.Efficiencies[ar] != 1 {
			t.Errorf("collider %+v", r.ThirdBody)
		}
		if !closeTo(r.FalloffRate.Low.A, 6.81e18*1e-12, rel) {
			t.Errorf("LOW A %g", r.FalloffRate.Low.A)
		}
		// A PLOG/plain-Arrhenius duplicate pair, lines 694 and 699.
		a, b := reaction(t, m, "C2H5+O2<=>C2H4+HO2", 0), reaction(t, m, "C2H5+O2<=>C2H4+HO2", 1)
		if a.Form != chem.PressureTable || b.Form != chem.Elementary || !a.Duplicate || !b.Duplicate {
			t.Errorf("mixed duplicate pair: %v %v", a.Form, b.Form)
		}
	})
	t.Run("nheptane REV", func(t *testing.T) {
		m := readSet(t, "nheptane-sk68", "thermo.dat")
		// "ch4+h = ch3+h2 1.727E+04 3.00 8.224E+03 / rev / 6.610E+02 3.00 7.744E+03 /"
		r := reaction(t, m, "ch4+h = ch3+h2", 0)
		if r.ReverseRate == nil || !closeTo(r.ReverseRate.A, 6.61e2*1e-6, rel) || !closeTo(r.ReverseRate.E, 7744*4.184, rel) {
			t.Errorf("reverse rate %+v", r.ReverseRate)
		}
		if m.Species[r.Reactants[0].Species].Name != "ch4" {
			t.Errorf("declared lower-case spelling not kept: %s", m.Species[r.Reactants[0].Species].Name)
		}
	})
}
