package fuel

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"flame1d/thermo"
)

// Formula is the mean molecular formula C_x H_y O_z of a real fuel, in atoms
// per mean molecule; non-integer counts are the norm for a multicomponent
// fuel.
type Formula struct {
	C, H, O float64
}

// ParseFormula reads a mean formula such as "C11.2H21.9" or "C12H23O0.05".
// Only C, H and O are accepted (each at most once); a symbol without a
// count means one atom.
func ParseFormula(s string) (Formula, error) {
	var f Formula
	t := strings.TrimSpace(s)
	if t == "" {
		return f, fmt.Errorf("formula is empty: write it like \"C11.2H21.9\"")
	}
	seen := map[byte]bool{}
	for i := 0; i < len(t); {
		c := t[i]
		if c != 'C' && c != 'H' && c != 'O' {
			return f, fmt.Errorf("formula %q: unexpected %q at position %d: only the elements C, H and O are allowed, written with capital letters and counts (e.g. \"C11.2H21.9O0.1\")", s, t[i:i+1], i+1)
		}
		if seen[c] {
			return f, fmt.Errorf("formula %q: element %c appears twice", s, c)
		}
		seen[c] = true
		j := i + 1
		for j < len(t) && (t[j] >= '0' && t[j] <= '9' || t[j] == '.') {
			j++
		}
		n := 1.0
		if j > i+1 {
			v, err := strconv.ParseFloat(t[i+1:j], 64)
			if err != nil || !(v >= 0) || math.IsInf(v, 0) {
				return f, fmt.Errorf("formula %q: count %q of %c is not a non-negative number", s, t[i+1:j], c)
			}
			n = v
		}
		switch c {
		case 'C':
			f.C = n
		case 'H':
			f.H = n
		case 'O':
			f.O = n
		}
		i = j
	}
	if err := f.check(); err != nil {
		return f, fmt.Errorf("formula %q: %w", s, err)
	}
	return f, nil
}

// FormulaFromRatios builds the mean formula from the atomic H/C ratio, the
// atomic O/C ratio (zero for a hydrocarbon) and the mean molar mass W
// (kg/mol): x = W / (W_C + (H/C) W_H + (O/C) W_O), y = (H/C) x, z = (O/C) x.
func FormulaFromRatios(hToC, oToC, molarMass float64) (Formula, error) {
	if !(hToC > 0) || math.IsInf(hToC, 0) {
		return Formula{}, fmt.Errorf("H/C ratio must be positive and finite (got %g)", hToC)
	}
	if !(oToC >= 0) || math.IsInf(oToC, 0) {
		return Formula{}, fmt.Errorf("O/C ratio must be non-negative and finite (got %g)", oToC)
	}
	if !(molarMass > 0) || math.IsInf(molarMass, 0) {
		return Formula{}, fmt.Errorf("molar mass must be positive and finite (got %g kg/mol)", molarMass)
	}
	wC, _ := thermo.AtomicWeight("C")
	wH, _ := thermo.AtomicWeight("H")
	wO, _ := thermo.AtomicWeight("O")
	x := molarMass / (wC + hToC*wH + oToC*wO)
	f := Formula{C: x, H: hToC * x, O: oToC * x}
	return f, f.check()
}

func (f Formula) check() error {
	if !(f.C > 0) {
		return fmt.Errorf("a cracked-pool fuel needs carbon (C count %g)", f.C)
	}
	if !(f.H > 0) {
		return fmt.Errorf("a cracked-pool fuel needs hydrogen (H count %g)", f.H)
	}
	if f.O >= f.C+f.H/2 {
		return fmt.Errorf("the fuel holds as much oxygen as it needs to burn (O %g >= C + H/2 = %g): it is not a fuel", f.O, f.C+f.H/2)
	}
	return nil
}

// Composition returns the formula as an element map for thermo.Species.
func (f Formula) Composition() map[string]float64 {
	c := map[string]float64{"C": f.C, "H": f.H}
	if f.O > 0 {
		c["O"] = f.O
	}
	return c
}

// MolarMass returns the molar mass of the mean molecule in kg/mol from the
// standard atomic weights.
func (f Formula) MolarMass() float64 {
	wC, _ := thermo.AtomicWeight("C")
	wH, _ := thermo.AtomicWeight("H")
	wO, _ := thermo.AtomicWeight("O")
	return f.C*wC + f.H*wH + f.O*wO
}

// HToC returns the atomic hydrogen-to-carbon ratio.
func (f Formula) HToC() float64 { return f.H / f.C }

// OxygenDemand returns the moles of O2 that burn one mole of fuel to CO2
// and H2O: x + y/4 - z/2.
func (f Formula) OxygenDemand() float64 { return f.C + f.H/4 - f.O/2 }

// String writes the formula with up to six significant digits per count,
// e.g. "C11.2H21.9".
func (f Formula) String() string {
	var b strings.Builder
	for _, e := range []struct {
		sym string
		n   float64
	}{{"C", f.C}, {"H", f.H}, {"O", f.O}} {
		if e.n == 0 {
			continue
		}
		b.WriteString(e.sym)
		if e.n != 1 {
			b.WriteString(strconv.FormatFloat(e.n, 'g', 6, 64))
		}
	}
	return b.String()
}

// element returns the atoms of element sym ("C", "H", "O") per molecule.
func (f Formula) element(sym string) float64 {
	switch sym {
	case "C":
		return f.C
	case "H":
		return f.H
	case "O":
		return f.O
	}
	return 0
}

// poolElements are the elements a cracked pool may hold.
var poolElements = []string{"C", "H", "O"}

// FormulaOf is the C, H and O content of a species' elemental composition;
// other elements (N of a diluent, noble gases) are left out.
func FormulaOf(comp map[string]float64) Formula {
	c, h, o, _ := speciesAtoms(comp)
	return Formula{C: c, H: h, O: o}
}

// speciesAtoms returns the atoms of C, H and O in a species, and whether it
// holds any other element.
func speciesAtoms(comp map[string]float64) (c, h, o float64, other bool) {
	for e, n := range comp {
		switch strings.ToUpper(e) {
		case "C":
			c += n
		case "H":
			h += n
		case "O":
			o += n
		default:
			if n != 0 {
				other = true
			}
		}
	}
	return c, h, o, other
}

// atomCount returns the atoms of element sym in a composition, matching
// the symbol case-insensitively.
func atomCount(comp map[string]float64, sym string) float64 {
	n := 0.0
	for e, v := range comp {
		if strings.EqualFold(e, sym) {
			n += v
		}
	}
	return n
}
