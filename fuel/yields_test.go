package fuel

import (
	"strings"
	"testing"
)

// yieldCase is one measured-yield closure problem.
type yieldCase struct {
	name    string
	fuel    Formula
	yields  map[string]float64
	balance []string
	scale   bool
}

// The yield sets below are invented; their element sums are exact
// arithmetic (stated beside each case), so closure is checked to 1e-12.
func TestCloseYields(t *testing.T) {
	_, set := builtinMech(t, "lu2009-heptane")
	for _, c := range []struct {
		yieldCase
		want map[string]float64 // closed pool
		nAdj int                // adjustments reported
	}{
		{
			// 4 C2H4 + C2H6 = C10H22 exactly: closes as given.
			yieldCase: yieldCase{
				name: "consistent", fuel: Formula{C: 10, H: 22},
				yields: map[string]float64{"c2h4": 4, "c2h6": 1}, scale: true,
			},
			want: map[string]float64{"c2h4": 4, "c2h6": 1}, nAdj: 0,
		},
		{
			// Given 8.8 C, 16.8 H: scale 11/8.8 = 1.25 -> 11 C, 21 H; H2 0.5
			// closes H to 22.
			yieldCase: yieldCase{
				name: "incomplete", fuel: Formula{C: 11, H: 22},
				yields: map[string]float64{"c2h4": 2.4, "c3h6": 0.8, "c4h6": 0.4}, scale: true,
			},
			want: map[string]float64{"c2h4": 3, "c3h6": 1, "c4h6": 0.5, "h2": 0.5}, nAdj: 4,
		},
		{
			// No scaling; C: 1 + 2a = 10, H: 4 + 4a + 2b = 24 -> a = 4.5, b = 1.
			yieldCase: yieldCase{
				name: "two balance species", fuel: Formula{C: 10, H: 24},
				yields: map[string]float64{"ch4": 1}, balance: []string{"c2h4", "h2"}, scale: false,
			},
			want: map[string]float64{"ch4": 1, "c2h4": 4.5, "h2": 1}, nAdj: 2,
		},
		{
			// Oxygenated fuel, default balance H2 + CO with scaling:
			// C 4s + d_CO = 10, H 4s + 2 d_H2 = 20, O d_CO = 0.5
			// -> s = 2.375, d_CO = 0.5, d_H2 = 5.25.
			yieldCase: yieldCase{
				name: "oxygen closed with CO", fuel: Formula{C: 10, H: 20, O: 0.5},
				yields: map[string]float64{"c2h2": 2}, scale: true,
			},
			want: map[string]float64{"c2h2": 4.75, "co": 0.5, "h2": 5.25}, nAdj: 3,
		},
	} {
		t.Run(c.name, func(t *testing.T) {
			pa, adj, err := CloseYields(set, c.fuel, c.yields, c.balance, c.scale)
			if err != nil {
				t.Fatal(err)
			}
			if len(adj) != c.nAdj {
				t.Errorf("%d adjustments reported, want %d: %v", len(adj), c.nAdj, adj)
			}
			got := map[string]float64{}
			for i, k := range pa.index {
				got[set.Species[k].Name] = pa.moles[i]
			}
			if len(got) != len(c.want) {
				t.Errorf("pool %v, want %v", got, c.want)
			}
			for n, w := range c.want {
				if relErr(got[n], w) > 1e-12 {
					t.Errorf("%s = %.17g, want %g", n, got[n], w)
				}
			}
			r := closureResiduals(set, c.fuel, pa)
			if max(abs(r.C), abs(r.H), abs(r.O)) > 1e-12 {
				t.Errorf("closure residuals %+v exceed 1e-12", r)
			}
			for _, a := range adj {
				if a.Reason == "" || a.Given == a.Closed {
					t.Errorf("adjustment %v carries no change or no reason", a)
				}
			}
		})
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

func TestCloseYieldsRefused(t *testing.T) {
	_, set := builtinMech(t, "lu2009-heptane")
	for _, c := range []struct {
		yieldCase
		want []string
	}{
		{
			// 3 CH4 + 2 C2H6 + C2H4: 9 C, 28 H, H/C 3.1 against the fuel's 1.82.
			yieldCase: yieldCase{
				name: "too hydrogen-rich", fuel: Formula{C: 11, H: 20},
				yields: map[string]float64{"ch4": 3, "c2h6": 2, "c2h4": 1}, scale: true,
			},
			want: []string{"richer in hydrogen than the fuel", "negative amount", "h2"},
		},
		{
			// 3 C2H6 already holds 6 C of the fuel's 4: C2H4 would go to -1.
			yieldCase: yieldCase{
				name: "balance species pushed negative", fuel: Formula{C: 4, H: 10},
				yields: map[string]float64{"c2h6": 3}, balance: []string{"c2h4", "h2"}, scale: false,
			},
			want: []string{"negative amount", "c2h4"},
		},
		{
			yieldCase: yieldCase{
				name: "unknowns do not match elements", fuel: Formula{C: 10, H: 20},
				yields: map[string]float64{"c2h4": 4}, balance: []string{"h2", "ch4"}, scale: true,
			},
			want: []string{"needs exactly 2 adjustable amounts"},
		},
		{
			yieldCase: yieldCase{
				name: "balance species of equal H/C", fuel: Formula{C: 10, H: 22},
				yields: map[string]float64{"ch4": 1}, balance: []string{"c2h4", "c3h6"}, scale: false,
			},
			want: []string{"same proportion"},
		},
		{
			yieldCase: yieldCase{
				name: "unknown species", fuel: Formula{C: 10, H: 22},
				yields: map[string]float64{"c2h44": 1}, scale: true,
			},
			want: []string{"not in the mechanism", "did you mean c2h4"},
		},
		{
			yieldCase: yieldCase{
				name: "negative yield", fuel: Formula{C: 10, H: 22},
				yields: map[string]float64{"c2h4": -1}, scale: true,
			},
			want: []string{"non-negative"},
		},
		{
			yieldCase: yieldCase{
				name: "oxygen species in a hydrocarbon's yields need an O balance", fuel: Formula{C: 10, H: 22},
				yields: map[string]float64{"c2h4": 4, "ch2o": 0.1}, scale: true,
			},
			want: []string{"C, H, O balances needs exactly 3"},
		},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, _, err := CloseYields(set, c.fuel, c.yields, c.balance, c.scale)
			if err == nil {
				t.Fatal("closure accepted")
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not contain %q", err, w)
				}
			}
		})
	}
}
