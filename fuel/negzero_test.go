package fuel

import (
	"strings"
	"testing"
)

// When the given yields are in the fuel's exact proportions, scaling alone
// closes the balances and the balance species needs no change of its own:
// the report says so, never "-0 mol" or a round-off amount such as
// "+1.1e-16 mol" (issue 11, item 8).
func TestBalanceChangeOfZeroIsNotReported(t *testing.T) {
	_, set := builtinMech(t, "lu2009-heptane")
	// 3 C2H4 + 0.6 H2 = C6H13.2, H/C 2.2 = that of C10H22: scale 10/6,
	// H2 needs no change beyond the scaling.
	for _, y := range []map[string]float64{
		{"c2h4": 3, "h2": 0.6},
		{"c2h4": 0.3, "h2": 0.06},
		{"c2h4": 2.7, "h2": 0.54},
	} {
		_, adj, err := CloseYields(set, Formula{C: 10, H: 22}, y, nil, true)
		if err != nil {
			t.Fatal(err)
		}
		for _, a := range adj {
			s := a.String()
			if strings.Contains(s, "-0 ") || strings.Contains(s, "e-1") || strings.Contains(s, "balance species") {
				t.Errorf("yields %v: %s", y, s)
			}
		}
	}
}
