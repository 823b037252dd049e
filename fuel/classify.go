package fuel

import "math"

// ClosedShell reports whether a C/H/O species of the given elemental
// composition can be written as a closed-shell molecule with every atom at
// its normal valence (C 4, H 1, O 2). The rule, by formula alone:
//
//  1. the valence-electron count 4 n_C + n_H + 6 n_O is even (an odd count
//     is a radical: CH3, C2H5, OH, HCO);
//  2. the bond order left for the heavy-atom skeleton,
//     B = (4 n_C + 2 n_O - n_H) / 2, is a whole number that can connect the
//     n = n_C + n_O heavy atoms without exceeding triple bonds:
//     n - 1 <= B <= 3 (n - 1), and B = 0 for a single heavy atom.
//
// Rule 2 removes the even-electron species that are not closed-shell
// molecules: atoms (C, O), carbenes (CH2 and its singlet, where one carbon
// carries B = 1 with nothing to bond to) and C2 (B = 4). Molecules with
// no heavy atom must be H2. The rule is the valence-sum (degree-of-
// unsaturation) count of structural chemistry; triplet O2 passes it, which
// is why pool candidates must also carry carbon or hydrogen. Species with
// other elements, or non-integer counts, are not closed-shell by this
// rule.
func ClosedShell(comp map[string]float64) bool {
	c, h, o, other := speciesAtoms(comp)
	if other || !whole(c) || !whole(h) || !whole(o) {
		return false
	}
	if int64(4*c+h+6*o)%2 != 0 {
		return false
	}
	heavy := c + o
	if heavy == 0 {
		return h == 2
	}
	twoB := 4*c + 2*o - h
	if twoB < 0 || int64(twoB)%2 != 0 {
		return false
	}
	B := twoB / 2
	if heavy == 1 {
		return B == 0
	}
	return B >= heavy-1 && B <= 3*(heavy-1)
}

// Aromatic reports whether a hydrocarbon formula can hold a benzene ring:
// at least six carbons and at least four degrees of unsaturation
// (rings plus double bonds, n_C - n_H/2 + 1), which every benzenoid ring
// supplies. Judged by formula only, so non-aromatic isomers of the same
// formula (e.g. linear C6H6 polyynes) count too; in the mechanisms' thermo
// sets those formulas are the aromatics.
func Aromatic(comp map[string]float64) bool {
	c, h, o, other := speciesAtoms(comp)
	if other || o != 0 || c < 6 {
		return false
	}
	return c-h/2+1 >= 4
}

// Polyaromatic reports whether a hydrocarbon formula is aromatic by
// Aromatic and large enough for two fused rings: at least ten carbons and
// seven degrees of unsaturation (naphthalene, C10H8, has seven).
func Polyaromatic(comp map[string]float64) bool {
	c, h, _, _ := speciesAtoms(comp)
	return Aromatic(comp) && c >= 10 && c-h/2+1 >= 7
}

func whole(x float64) bool { return x >= 0 && x == math.Trunc(x) && x < 1e6 }
