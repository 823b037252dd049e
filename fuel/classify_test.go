package fuel

import "testing"

func TestClosedShell(t *testing.T) {
	// Ground-state electronic structures as in any physical-chemistry text
	// (common knowledge, no single source): stable molecules are
	// closed-shell singlets; CH3, C2H3, OH, HCO are radicals; CH2 and C are
	// triplets; C2 has no closed-shell single structure with normal
	// valences.
	for _, c := range []struct {
		name string
		comp map[string]float64
		want bool
	}{
		{"H2", map[string]float64{"H": 2}, true},
		{"H", map[string]float64{"H": 1}, false},
		{"CH4", map[string]float64{"C": 1, "H": 4}, true},
		{"CH3", map[string]float64{"C": 1, "H": 3}, false},
		{"CH2", map[string]float64{"C": 1, "H": 2}, false},
		{"C", map[string]float64{"C": 1}, false},
		{"C2", map[string]float64{"C": 2}, false},
		{"C2H2", map[string]float64{"C": 2, "H": 2}, true},
		{"C2H3", map[string]float64{"C": 2, "H": 3}, false},
		{"C2H4", map[string]float64{"C": 2, "H": 4}, true},
		{"C2H5", map[string]float64{"C": 2, "H": 5}, false},
		{"C2H6", map[string]float64{"C": 2, "H": 6}, true},
		{"C4H6", map[string]float64{"C": 4, "H": 6}, true},
		{"C4H2", map[string]float64{"C": 4, "H": 2}, true},
		{"C6H6", map[string]float64{"C": 6, "H": 6}, true},
		{"H2O", map[string]float64{"H": 2, "O": 1}, true},
		{"OH", map[string]float64{"H": 1, "O": 1}, false},
		{"O", map[string]float64{"O": 1}, false},
		{"CO", map[string]float64{"C": 1, "O": 1}, true},
		{"CO2", map[string]float64{"C": 1, "O": 2}, true},
		{"HCO", map[string]float64{"C": 1, "H": 1, "O": 1}, false},
		{"CH2O", map[string]float64{"C": 1, "H": 2, "O": 1}, true},
		{"CH2CO", map[string]float64{"C": 2, "H": 2, "O": 1}, true},
		{"N2", map[string]float64{"N": 2}, false}, // not a C/H/O species
		{"lumped", map[string]float64{"C": 11.2, "H": 21.9}, false},
	} {
		if got := ClosedShell(c.comp); got != c.want {
			t.Errorf("ClosedShell(%s) = %v, want %v", c.name, got, c.want)
		}
	}
}

func TestAromaticGroups(t *testing.T) {
	for _, c := range []struct {
		name        string
		comp        map[string]float64
		arom, multi bool
	}{
		{"benzene C6H6", map[string]float64{"C": 6, "H": 6}, true, false},
		{"toluene C7H8", map[string]float64{"C": 7, "H": 8}, true, false},
		{"styrene C8H8", map[string]float64{"C": 8, "H": 8}, true, false},
		{"naphthalene C10H8", map[string]float64{"C": 10, "H": 8}, true, true},
		{"biphenyl C12H10", map[string]float64{"C": 12, "H": 10}, true, true},
		{"pyrene C16H10", map[string]float64{"C": 16, "H": 10}, true, true},
		{"cyclohexane C6H12", map[string]float64{"C": 6, "H": 12}, false, false},
		{"cyclopentadiene C5H6", map[string]float64{"C": 5, "H": 6}, false, false},
		{"n-decane C10H22", map[string]float64{"C": 10, "H": 22}, false, false},
		{"graphite C", map[string]float64{"C": 1}, false, false},
	} {
		if got := Aromatic(c.comp); got != c.arom {
			t.Errorf("Aromatic(%s) = %v, want %v", c.name, got, c.arom)
		}
		if got := Polyaromatic(c.comp); got != c.multi {
			t.Errorf("Polyaromatic(%s) = %v, want %v", c.name, got, c.multi)
		}
	}
}
