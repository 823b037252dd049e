package keyblock

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"flame1d/chem"
)

// thermoRecord writes a four-line record with a constant cp = 2.5 R
// polynomial; element fields hold up to four "symbol count" pairs. The
// polynomials only need to be valid; these tests are about the parser.
func thermoRecord(name string, elems ...any) string {
	var el strings.Builder
	for i := 0; i+1 < len(elems); i += 2 {
		fmt.Fprintf(&el, "%-2s%3d", elems[i], elems[i+1])
	}
	l1 := fmt.Sprintf("%-18s%-6s%-20sG%10.3f%10.3f%8.2f%6s1", name, "test", el.String(), 300.0, 5000.0, 1000.0, "")
	return l1 + "\n" +
		" 2.50000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00    2\n" +
		"-7.45375000E+02 4.36600000E+00 2.50000000E+00 0.00000000E+00 0.00000000E+00    3\n" +
		" 0.00000000E+00 0.00000000E+00-7.45375000E+02 4.36600000E+00                   4\n"
}

// testSpecies are the species of the synthetic mechanisms below, with names
// of the kinds real files use (parentheses, '*', '-', commas).
var testSpecies = [][]any{
	{"H", "H", 1}, {"O", "O", 1}, {"H2", "H", 2}, {"O2", "O", 2}, {"OH", "O", 1, "H", 1},
	{"H2O", "H", 2, "O", 1}, {"HO2", "H", 1, "O", 2}, {"AR", "AR", 1}, {"N2", "N", 2},
	{"CH3", "C", 1, "H", 3}, {"CH4", "C", 1, "H", 4}, {"C2H6", "C", 2, "H", 6}, {"CH2(S)", "C", 1, "H", 2},
	{"C4H8-1", "C", 4, "H", 8}, {"I*C3H7", "C", 3, "H", 7}, {"OH*", "O", 1, "H", 1},
	{"A1-", "C", 6, "H", 5}, {"A1", "C", 6, "H", 6}, {"C3H51-2,3OOH", "C", 3, "H", 7, "O", 4}, {"C3H5O2", "C", 3, "H", 5, "O", 2},
}

// mechHeader returns ELEMENTS, SPECIES and an embedded THERMO block, with
// the REACTIONS keyword line last (so reactions start on the next line).
func mechHeader(reactionsLine string) string {
	var b strings.Builder
	b.WriteString("! synthetic test mechanism\nelements\nH O C N\tAR end\nSPECIES\n")
	for i, s := range testSpecies {
		b.WriteString(s[0].(string))
		if i%4 == 3 {
			b.WriteString("\n")
		} else {
			b.WriteString("\t ")
		}
	}
	b.WriteString("\nEND\nTHERMO ALL\n   300.000  1000.000  5000.000\n")
	for _, s := range testSpecies {
		b.WriteString(thermoRecord(s[0].(string), s[1:]...))
	}
	b.WriteString("END\n" + reactionsLine + "\n")
	return b.String()
}

// firstReactionLine is the line number of the first line after mechHeader.
func firstReactionLine() int { return strings.Count(mechHeader("REACTIONS"), "\n") + 1 }

const featureReactions = `! every feature of the format once
h+o2 <=> o+oh        3.52E16 -0.7 17069.79 ! trailing comment
2 OH = O + H2O	1.0E9	1.0	0.0
OH*+AR=>OH+AR        1.0E13 0 0
H+O2(+M) = HO2(+M)   4.65E12 0.44 0
  low/6.366E+20 -1.72 524.8/ troe/0.5 1E-30 1E+30 1E+30/ H2O/14/ XX/2/
  ar/0.67/
CH3+OH(+M)<=>CH2(S)+H2O(+M)  1.0E13 0 0
  HIGH/ 2.0E10 0 0/ SRI/ 0.5 100 1000/
H+CH3(+M)<=>CH4(+M)  1.0E14 0 0
  LOW/ 1.0E20 0 0/ SRI/0.45 797 979 1.1 0.2/
CH3+OH=>CH2(S)+H2O   1 0 0
  PLOG/1.0 1e12 0 0/ PLOG/0.1 5e11 0 1000/
  PLOG/1.0 2e12 0 0/
CH3+CH3(+M)<=>C2H6(+M)   1 0 0
  TCHEB/ 290 3000/ PCHEB/0.01 98.7/
  CHEB/ 2 3 1 2 3 /
  CHEB/ 4 5 6/
H2+O2=>2OH           1.0E13 0 0
  FORD/ H2 0.5/
H2+O=H+OH            1.0E13 0 0
  REV/ 2.0E13 0 0/ RORD/ OH 0.5/
H+O2+m=HO2+m         2.0E18 -0.8 0
  H2O/10/ AR/0/ N2/1.5/
H+O2 (+ AR) = HO2 (+ AR)  1.0E12 0 0
  LOW/1.0E18 0 0/
I*C3H7+CH3<=>C4H8-1+H2   1.0E12 0 0
A1-+H(+M)<=>A1(+M)   1.0E14 0 0
  LOW/1.0E27 -3 0/
C3H51-2,3OOH=>C3H5O2+2.0OH   1.0E13 0 0
H+HO2<=>2OH          7.0E13 0 295
  DUP
H+HO2<=>OH+OH        1.0E12 0 0 ! same equation after merging OH+OH
  dup
`

func readText(t *testing.T, text string) (*chem.Mechanism, []chem.Problem, error) {
	t.Helper()
	return Read(strings.NewReader(text), nil, nil, "test.inp")
}

func TestFormatFeatures(t *testing.T) {
	text := mechHeader("reactions") + featureReactions + "end\n"
	m, probs, err := readText(t, text)
	if err != nil {
		t.Fatalf("%v", err)
	}
	line0 := firstReactionLine()
	if len(m.Reactions) != 17 || len(m.Species) != len(testSpecies) || len(m.Elements) != 5 {
		t.Fatalf("%d reactions, %d species, %d elements", len(m.Reactions), len(m.Species), len(m.Elements))
	}
	if m.Description != "synthetic test mechanism" {
		t.Errorf("description %q", m.Description)
	}
	k := func(name string) int {
		i := m.SpeciesIndex(name)
		if i < 0 {
			t.Fatalf("species %q missing", name)
		}
		return i
	}
	const rel = 1e-12
	r := m.Reactions
	t.Run("elementary, lower case, comment", func(t *testing.T) {
		if r[0].Equation != "h+o2 <=> o+oh" || !r[0].Reversible || !closeTo(r[0].Rate.A, 3.52e10, rel) ||
			!closeTo(r[0].Rate.E, 17069.79*4.184, rel) || r[0].Origin.Line != line0+1 {
			t.Errorf("%+v", r[0])
		}
	})
	t.Run("coefficient with blank, TABs", func(t *testing.T) {
		if r[1].Reactants[0].Species != k("OH") || r[1].Reactants[0].Coefficient != 2 || len(r[1].Products) != 2 {
			t.Errorf("%+v", r[1].Reactants)
		}
	})
	t.Run("irreversible, star in name", func(t *testing.T) {
		if r[2].Reversible || r[2].Reactants[0].Species != k("OH*") {
			t.Errorf("%+v", r[2])
		}
	})
	t.Run("falloff, several keywords on a line, unknown collider warned", func(t *testing.T) {
		f := r[3].FalloffRate
		if r[3].Form != chem.Falloff || !closeTo(f.Low.A, 6.366e8, rel) || !closeTo(f.High.A, 4.65e6, rel) || !f.Troe.HasT2 {
			t.Errorf("%+v", f)
		}
		eff := r[3].ThirdBody.Efficiencies
		if len(eff) != 2 || eff[k("H2O")] != 14 || eff[k("AR")] != 0.67 {
			t.Errorf("efficiencies %v", eff)
		}
		warned := false
		for _, p := range probs {
			warned = warned || p.Warning && strings.Contains(p.Message, "'XX'") && p.Pos.Line == line0+5
		}
		if !warned {
			t.Errorf("no warning for efficiency of unknown species XX at line %d: %v", line0+5, probs)
		}
	})
	t.Run("chemically activated with SRI", func(t *testing.T) {
		// The line rate is k0 of a bimolecular step (order 2); HIGH is k_inf,
		// one order lower (order 1, no unit change).
		f := r[4].FalloffRate
		if r[4].Form != chem.ChemicallyActivated || !closeTo(f.Low.A, 1e7, rel) || f.High.A != 2e10 ||
			*f.SRI != (chem.SRI{A: 0.5, B: 100, C: 1000, D: 1, E: 0}) {
			t.Errorf("%+v %+v", f, f.SRI)
		}
	})
	t.Run("SRI five parameters", func(t *testing.T) {
		if s := r[5].FalloffRate.SRI; *s != (chem.SRI{A: 0.45, B: 797, C: 979, D: 1.1, E: 0.2}) {
			t.Errorf("%+v", s)
		}
	})
	t.Run("PLOG sorted, same pressure kept", func(t *testing.T) {
		pr := r[6].PressureRates
		if r[6].Form != chem.PressureTable || len(pr) != 3 || pr[0].P != 0.1*101325 || !closeTo(pr[0].Rate.E, 4184, rel) ||
			pr[1].P != 101325 || pr[2].P != 101325 || !closeTo(pr[1].Rate.A, 1e6, rel) || !closeTo(pr[2].Rate.A, 2e6, rel) {
			t.Errorf("%+v", pr)
		}
	})
	t.Run("Chebyshev over two CHEB lines", func(t *testing.T) {
		c := r[7].ChebyshevRate
		// Bimolecular: log10 k_SI = log10 k_cgs - 6, folded into c[0][0].
		want := [][]float64{{1 - 6, 2, 3}, {4, 5, 6}}
		if r[7].Form != chem.Chebyshev || c.TMin != 290 || c.TMax != 3000 || !closeTo(c.PMin, 1013.25, rel) ||
			!closeTo(c.PMax, 98.7*101325, rel) || fmt.Sprint(c.Coeffs) != fmt.Sprint(want) || r[7].ThirdBody != nil {
			t.Errorf("%+v", c)
		}
	})
	t.Run("FORD changes the unit order", func(t *testing.T) {
		// Orders H2 0.5 + O2 1 = 1.5: A [(cm^3/mol)^0.5/s] * (1e-6)^0.5.
		if r[8].Orders[k("H2")] != 0.5 || !closeTo(r[8].Rate.A, 1e13*1e-3, 1e-9) {
			t.Errorf("orders %v A %g", r[8].Orders, r[8].Rate.A)
		}
	})
	t.Run("REV with RORD", func(t *testing.T) {
		// Reverse orders H 1 + OH 0.5 = 1.5.
		if rv := r[9].ReverseRate; rv == nil || !closeTo(rv.A, 2e13*1e-3, 1e-9) || r[9].ReverseOrders[k("OH")] != 0.5 {
			t.Errorf("%+v %v", r[9].ReverseRate, r[9].ReverseOrders)
		}
	})
	t.Run("three-body +m lower case", func(t *testing.T) {
		tb := r[10].ThirdBody
		if r[10].Form != chem.ThreeBody || !closeTo(r[10].Rate.A, 2e6, rel) || tb.Default != 1 ||
			tb.Efficiencies[k("AR")] != 0 || tb.Efficiencies[k("N2")] != 1.5 {
			t.Errorf("%+v %+v", r[10].Rate, tb)
		}
	})
	t.Run("specific collider written with blanks", func(t *testing.T) {
		tb := r[11].ThirdBody
		if r[11].Form != chem.Falloff || tb.Default != 0 || len(tb.Efficiencies) != 1 || tb.Efficiencies[k("AR")] != 1 {
			t.Errorf("%+v", tb)
		}
	})
	t.Run("names with '*', '-', ','", func(t *testing.T) {
		if r[12].Reactants[0].Species != k("I*C3H7") || r[12].Products[0].Species != k("C4H8-1") ||
			r[13].Reactants[0].Species != k("A1-") || r[14].Reactants[0].Species != k("C3H51-2,3OOH") ||
			r[14].Products[1].Coefficient != 2 {
			t.Errorf("participants %+v %+v %+v", r[12], r[13], r[14])
		}
	})
	t.Run("duplicates after merging repeated species", func(t *testing.T) {
		if !r[15].Duplicate || !r[16].Duplicate || len(r[16].Products) != 1 || r[16].Products[0].Coefficient != 2 {
			t.Errorf("%+v %+v", r[15], r[16])
		}
	})
}

// TestUnitWords checks the REACTIONS-line units against worked conversions.
func TestUnitWords(t *testing.T) {
	tests := []struct {
		units      string
		A, E       float64 // as written, for the bimolecular H+O2<=>O+OH
		wantA      float64 // m^3/(mol s)
		wantE      float64 // J/mol
		wantSource string
	}{
		{"", 1e14, 1000, 1e8, 4184, "thermochemical calorie 4.184 J (exact)"},
		{"CAL/MOLE MOLES", 1e14, 1000, 1e8, 4184, "same, explicit"},
		{"KCAL/MOLE", 1e14, 1, 1e8, 4184, "1 kcal = 4184 J"},
		{"JOULES/MOLE", 1e14, 1000, 1e8, 1000, "SI"},
		{"KJOULES/MOLE", 1e14, 1, 1e8, 1000, "SI"},
		{"KELVINS", 1e14, 1000, 1e8, 8314.462618, "E = R T_a, R = 8.314462618 J/(mol K) (CODATA 2018)"},
		{"EVOLTS", 1e14, 1, 1e8, 96485.33212, "1 eV per molecule = F = 96485.33212 J/mol (CODATA 2018)"},
		// 1e-10 cm^3/(molecule s), a typical gas-kinetic collision rate
		// constant: x N_A = 6.02214076e13 cm^3/(mol s) = 6.02214076e7 m^3/(mol s).
		{"MOLECULES KJOULES/MOLE", 1e-10, 1, 6.02214076e7, 1000, "N_A = 6.02214076e23 /mol (exact)"},
	}
	for _, tc := range tests {
		t.Run(tc.units, func(t *testing.T) {
			text := mechHeader("REACTIONS "+tc.units) + fmt.Sprintf("H+O2<=>O+OH %g 0 %g\nEND\n", tc.A, tc.E)
			m, probs, err := readText(t, text)
			if err != nil {
				t.Fatalf("%v %v", err, probs)
			}
			got := m.Reactions[0].Rate
			if !closeTo(got.A, tc.wantA, 1e-12) || !closeTo(got.E, tc.wantE, 1e-12) {
				t.Errorf("A %g E %g, want %g %g (%s)", got.A, got.E, tc.wantA, tc.wantE, tc.wantSource)
			}
		})
	}
	t.Run("MOLECULES termolecular", func(t *testing.T) {
		// Order 3: A x N_A^2 x 1e-12.
		text := mechHeader("REACTIONS MOLECULES") + "H+O2+M<=>HO2+M 1e-32 0 0\nEND\n"
		m, _, err := readText(t, text)
		if err != nil {
			t.Fatal(err)
		}
		if want := 1e-32 * avogadro * avogadro * 1e-12; !closeTo(m.Reactions[0].Rate.A, want, 1e-12) {
			t.Errorf("A %g, want %g", m.Reactions[0].Rate.A, want)
		}
	})
}

// brokenCase is one defective input: the error expected and its line,
// relative to the first reaction line (or absolute when abs is set).
type brokenCase struct {
	name      string
	text      string
	line      int
	abs       bool
	want      string
	transport string
}

func brokenCases() []brokenCase {
	h := mechHeader("REACTIONS")
	return []brokenCase{
		{name: "unbalanced", text: h + "H+O2<=>OH 1 0 0\nEND\n", want: "is not element-balanced: O +1"},
		{name: "non-ASCII species name", text: strings.Replace(h, "A1\t", "A1 CH\xe9\t", 1) + "END\n", line: 9, abs: true, want: "cannot be a species name"},
		{name: "unknown species", text: h + "CH2X+O2=CH2O+O 1 0 0\nEND\n", want: `reactants: unknown species "CH2X" in reaction 'CH2X+O2=CH2O+O'`},
		{name: "bad number", text: h + "H+O2<=>O+OH 1.0E1x4 0 0\nEND\n", want: `bad Arrhenius parameter "1.0E1x4"`},
		{name: "bad number in aux", text: h + "H+O2(+M)<=>HO2(+M) 1 0 0\n LOW/1.0 2.0 abc/\nEND\n", line: 1, want: `LOW: bad number "abc"`},
		{name: "missing numbers", text: h + "H+O2<=>O+OH 1 0\nEND\n", want: "three Arrhenius parameters"},
		{name: "garbage outside blocks", text: "THIS IS GARBAGE\n" + h + "H+O2<=>O+OH 1 0 0\nEND\n", line: 1, abs: true, want: "unexpected text outside any block"},
		{name: "garbage in reactions", text: h + "H+O2<=>O+OH 1 0 0\nfoo bar\nEND\n", line: 1, want: `unexpected text "foo"`},
		{name: "aux before reaction", text: h + "LOW/1 2 3/\nEND\n", want: "before any reaction"},
		{name: "LOW without collider", text: h + "H+O2<=>HO2 1 0 0\nLOW/1 0 0/\nEND\n", want: "no '(+M)' collider"},
		{name: "falloff without LOW", text: h + "H+O2(+M)<=>HO2(+M) 1 0 0\nEND\n", want: "needs a LOW or HIGH line"},
		{name: "efficiencies without M", text: h + "H+O2<=>O+OH 1 0 0\nH2O/5/\nEND\n", want: "no '+M' or '(+M)'"},
		{name: "unmarked duplicate", text: h + "H+O2<=>O+OH 1 0 0\nO+OH<=>H+O2 1 0 0\nEND\n", line: 1, want: "not marked duplicate"},
		{name: "TROE count", text: h + "H+O2(+M)<=>HO2(+M) 1 0 0\nLOW/1 0 0/ TROE/0.5 100/\nEND\n", line: 1, want: "TROE needs 3 to 4 numbers"},
		{name: "SRI count", text: h + "H+O2(+M)<=>HO2(+M) 1 0 0\nLOW/1 0 0/ SRI/0.5 100 1 2/\nEND\n", line: 1, want: "SRI needs 3 or 5"},
		{name: "collider mismatch", text: h + "H+O2(+M)<=>HO2(+AR) 1 0 0\nEND\n", want: "does not match"},
		{name: "M on one side", text: h + "H+O2+M<=>HO2 1 0 0\nEND\n", want: "must be written on both sides"},
		{name: "two arrows", text: h + "H+O2=HO2=O 1 0 0\nEND\n", want: "more than one arrow"},
		{name: "unknown unit", text: mechHeader("REACTIONS KCAL/FORTNIGHT") + "H+O2<=>O+OH 1 0 0\nEND\n", line: -1, want: `unknown unit word "KCAL/FORTNIGHT"`},
		{name: "REV on irreversible", text: h + "H+O2=>O+OH 1 0 0\nREV/1 0 0/\nEND\n", want: "REV on an irreversible"},
		{name: "unsupported keyword", text: h + "H+O2<=>O+OH 1 0 0\nLT/1 2/\nEND\n", line: 1, want: "LT (Landau-Teller rate) is not supported"},
		{name: "Chebyshev size", text: h + "H+O2(+M)<=>HO2(+M) 1 0 0\nCHEB/2 2 1 2 3/\nEND\n", want: "declares 2 x 2 coefficients but gives 3"},
		{name: "keyword twice", text: h + "H+O2(+M)<=>HO2(+M) 1 0 0\nLOW/1 0 0/\nLOW/1 0 0/\nEND\n", line: 2, want: "LOW given twice"},
		{name: "unclosed slash", text: h + "H+O2(+M)<=>HO2(+M) 1 0 0\nLOW/1 0 0\nEND\n", line: 1, want: "unclosed '/'"},
		{name: "missing thermo", text: strings.Replace(h, "A1\t", "A1 XYZ\t", 1) + "H+O2<=>O+OH 1 0 0\nEND\n",
			line: 9, abs: true, want: "species 'XYZ' has no thermo record (searched the THERMO block of test.inp)"},
		{name: "truncated thermo record", text: strings.Replace(h, "THERMO ALL\n   300.000  1000.000  5000.000\n",
			"THERMO ALL\n   300.000  1000.000  5000.000\n"+strings.Join(strings.Split(thermoRecord("H"), "\n")[:2], "\n")+"\n", 1) + "END\n",
			line: 14, abs: true, want: `truncated thermo record "H"`},
		{name: "overflow after conversion", text: mechHeader("REACTIONS MOLECULES") + "H2+O2=>2OH 1e300 0 0\nFORD/H2 40/\nEND\n",
			want: "not finite after conversion"},
		{name: "missing transport line", text: h + "H+O2<=>O+OH 1 0 0\nEND\n", line: 5, abs: true,
			transport: "H 0 145.0 2.05 0 0 0\n", want: "species 'O' has no transport line in test.tran"},
		{name: "bad transport number", text: h + "H+O2<=>O+OH 1 0 0\nEND\n", line: 1, abs: true,
			transport: "H 0 145.0 2.O5 0 0 0\n", want: `bad sigma "2.O5"`},
	}
}

// TestBrokenInputs checks that each defect yields its own clear error with
// file:line, and never a panic.
func TestBrokenInputs(t *testing.T) {
	line0 := firstReactionLine()
	for _, tc := range brokenCases() {
		t.Run(tc.name, func(t *testing.T) {
			var tr *strings.Reader
			names := []string{"test.inp", "", "test.tran"}
			var m *chem.Mechanism
			var probs []chem.Problem
			var err error
			if tc.transport != "" {
				tr = strings.NewReader(tc.transport)
				m, probs, err = Read(strings.NewReader(tc.text), nil, tr, names...)
			} else {
				m, probs, err = Read(strings.NewReader(tc.text), nil, nil, names...)
			}
			var verr *chem.ValidationError
			if !errors.As(err, &verr) || m == nil {
				t.Fatalf("err = %v (mechanism %v), want a *chem.ValidationError", err, m != nil)
			}
			line := line0 + tc.line
			if tc.abs {
				line = tc.line
			}
			for _, p := range probs {
				if !p.Warning && strings.Contains(p.Message, tc.want) && p.Pos.Line == line && p.Pos.File != "" {
					if !strings.HasPrefix(p.String(), p.Pos.File+":"+fmt.Sprint(line)+": error: ") {
						t.Errorf("problem text %q does not start with file:line", p.String())
					}
					return
				}
			}
			t.Errorf("no error containing %q at line %d; got:\n%s", tc.want, line, problemText(probs))
		})
	}
}

func problemText(ps []chem.Problem) string {
	s := make([]string, len(ps))
	for i, p := range ps {
		s[i] = p.String()
	}
	return strings.Join(s, "\n")
}

func TestWarnings(t *testing.T) {
	h := mechHeader("REACTIONS")
	tests := []struct {
		name, text, want string
	}{
		{"missing END at EOF", h + "H+O2<=>O+OH 1 0 0\n", "REACTIONS block not closed by END (end of file)"},
		{"DUP without partner", h + "H+O2<=>O+OH 1 0 0\nDUP\nEND\n", "no other marked reaction"},
		{"atomic weight", strings.Replace(h, "H O C N", "H O C N D/2.014/", 1) + "END\n", "atomic weight \"2.014\" given for element D ignored"},
		{"species twice", strings.Replace(h, "A1\t", "A1 H2\t", 1) + "END\n", "species \"H2\" declared twice"},
		{"efficiency of unknown species", h + "H+O2+M<=>HO2+M 1 0 0\nQQ/2/\nEND\n", "'QQ', which is not a species"},
		{"defective record of an unused species", strings.Replace(h, "THERMO ALL\n   300.000  1000.000  5000.000\n",
			"THERMO ALL\n   300.000  1000.000  5000.000\n"+strings.Replace(thermoRecord("UNUSED", "H", 1), "4.36600000E+00", "4.366000X0E+00", 1), 1) + "END\n",
			`thermo record "UNUSED": bad coefficient`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, probs, err := readText(t, tc.text)
			if err != nil {
				t.Fatalf("%v", err)
			}
			for _, p := range probs {
				if p.Warning && strings.Contains(p.Message, tc.want) {
					return
				}
			}
			t.Errorf("no warning %q in\n%s", tc.want, problemText(probs))
		})
	}
}

// TestLongLines reads lines far longer than a bufio.Scanner's default limit.
func TestLongLines(t *testing.T) {
	long := "H+O2+M<=>HO2+M 1 0 0 !" + strings.Repeat("x", 200000) + "\n" + strings.Repeat("H2O/5/ ", 20000) + "\nEND\n"
	m, _, err := readText(t, mechHeader("REACTIONS")+long)
	if err != nil || m.Reactions[0].ThirdBody.Efficiencies[m.SpeciesIndex("H2O")] != 5 {
		t.Fatalf("err %v", err)
	}
}

func FuzzReadMechanism(f *testing.F) {
	f.Add(mechHeader("REACTIONS") + featureReactions + "END\n")
	for _, tc := range brokenCases() {
		f.Add(tc.text)
	}
	f.Add("ELEMENTS H END SPECIES H H2 END REACTIONS\nH+H=H2 1 0 0\n")
	f.Add("REAC\n=\n/\n(+\n")
	f.Fuzz(func(t *testing.T, s string) {
		m, probs, err := Read(strings.NewReader(s), nil, nil, "fuzz.inp")
		if (err != nil) != (errorCount(probs) > 0) {
			t.Fatalf("err %v but %d error problems", err, errorCount(probs))
		}
		if m == nil {
			t.Fatal("no mechanism returned for in-memory input")
		}
		if err == nil {
			for i := range m.Reactions {
				if !finiteRates(&m.Reactions[i]) {
					t.Fatalf("reaction %d has non-finite rates", i)
				}
			}
		}
		for _, p := range probs {
			if p.Message == "" || math.IsNaN(float64(p.Pos.Line)) {
				t.Fatal("empty problem")
			}
		}
	})
}

// TestBlocksOnOneLine reads blocks closed and opened on the same line.
func TestBlocksOnOneLine(t *testing.T) {
	h := mechHeader("REACTIONS")
	thermo := h[strings.Index(h, "THERMO ALL"):strings.LastIndex(h, "REACTIONS")]
	text := "ELEMENTS H O END SPECIES H O OH END\n" + thermo + "REACTIONS\nH+O<=>OH 1e13 0 0\nEND\n"
	m, probs, err := readText(t, text)
	if err != nil || len(m.Elements) != 2 || len(m.Species) != 3 || len(m.Reactions) != 1 {
		t.Fatalf("err %v; %d elements, %d species, %d reactions; %v", err, len(m.Elements), len(m.Species), len(m.Reactions), probs)
	}
}

// TestTransportGeometryWarning flags a geometry that contradicts the atom
// count, at the transport line.
func TestTransportGeometryWarning(t *testing.T) {
	var tr strings.Builder
	for _, s := range testSpecies {
		geom := 2
		switch atoms := len(s) / 2; {
		case s[0] == "H" || s[0] == "O" || s[0] == "AR":
			geom = 0
		case atoms == 1 && s[2] == 2, s[0] == "OH", s[0] == "OH*":
			geom = 1
		}
		if s[0] == "H2" {
			geom = 0 // wrong on purpose: H2 is linear
		}
		fmt.Fprintf(&tr, "%s %d 100.0 3.0 0.0 0.0 1.0\n", s[0], geom)
	}
	_, probs, err := Read(strings.NewReader(mechHeader("REACTIONS")+"END\n"), nil, strings.NewReader(tr.String()), "t.inp", "", "t.tran")
	if err != nil {
		t.Fatal(err)
	}
	if len(probs) != 1 || !probs[0].Warning || probs[0].Pos != (chem.Position{File: "t.tran", Line: 3}) ||
		!strings.Contains(probs[0].Message, "species 'H2' has several atoms but its transport geometry is 0") {
		t.Errorf("problems:\n%s", problemText(probs))
	}
}

func TestByteOrderMark(t *testing.T) {
	m, probs, err := readText(t, "\ufeff"+mechHeader("REACTIONS")+"END\n")
	if err != nil || len(probs) != 0 || m.Description != "synthetic test mechanism" {
		t.Fatalf("err %v, description %q, problems %v", err, m.Description, probs)
	}
}
