package study

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"flame1d/builtin"
)

// restartSample is a restart file on burke2012-hydrogen as WriteRestart
// lays it out (made-up numbers, five points through a flame).
func restartSample() string {
	var b strings.Builder
	b.WriteString("# flame1d restart\n# mechanism burke2012-hydrogen\n# anchor_x_m 0.004\n# anchor_T_K 700\n# initial_length_m 0.01\n# inlet_T_K 298\n# pressure_Pa 101325\n")
	b.WriteString("x [m],T [K],mass_flux [kg/m2/s],Y_H2 [-],Y_O2 [-],Y_H2O [-],Y_N2 [-]\n")
	b.WriteString("inlet,298,,0.0285,0.2264,0,0.7451\n")
	for j, T := range []float64{298, 500, 700, 1800, 2300} {
		burnt := (T - 298) / 2002
		fmt.Fprintf(&b, "%g,%g,2.1,%g,%g,%g,0.7451\n", 0.002*float64(j), T, 0.0285*(1-burnt), 0.2264*(1-burnt), 0.2549*burnt)
	}
	return b.String()
}

// FuzzReadRestart: a restart file never makes the reader panic; every
// error names the file; an accepted state is physical (finite positive
// temperatures, pressure and mass flux, mass fractions in [0, 1], rising
// positions) — issue 11, item 10.
//
//	go test ./study -run XXX -fuzz FuzzReadRestart -fuzztime 120s
func FuzzReadRestart(f *testing.F) {
	m, err := builtin.Load("burke2012-hydrogen")
	if err != nil {
		f.Fatal(err)
	}
	good := restartSample()
	f.Add(good)
	f.Add(strings.Replace(good, "# pressure_Pa 101325", "# pressure_Pa NaN", 1))
	f.Add(strings.Replace(good, "2.1,", "-2.1,", 1))
	f.Add(strings.Replace(good, "inlet,298,,0.0285,0.2264,0,", "inlet,298,,0.0285,0.2264,-0.1,", 1))
	f.Fuzz(func(t *testing.T, text string) {
		sol, err := readRestart(strings.NewReader(text), "fuzz.csv", m)
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz.csv") {
				t.Fatalf("error without the file name: %v", err)
			}
			return
		}
		for j := range sol.X {
			if math.IsNaN(sol.X[j]) || math.IsInf(sol.X[j], 0) || (j > 0 && !(sol.X[j] > sol.X[j-1])) {
				t.Fatalf("positions %v accepted", sol.X)
			}
		}
		if err := checkRestart(sol); err != nil {
			t.Fatalf("accepted a state that fails the check: %v", err)
		}
		for _, v := range sol.U {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("state value %v accepted", v)
			}
		}
	})
}

// A restart file whose header or state is not physical is refused with the
// reason (found by FuzzReadRestart: the reader took "NaN" for the pressure,
// negative mass fluxes and negative mass fractions).
func TestRestartStateIsChecked(t *testing.T) {
	m, err := builtin.Load("burke2012-hydrogen")
	if err != nil {
		t.Fatal(err)
	}
	good := restartSample()
	if _, err := readRestart(strings.NewReader(good), "r.csv", m); err != nil {
		t.Fatalf("good restart: %v", err)
	}
	for _, tc := range []struct{ old, new, want string }{
		{"# pressure_Pa 101325", "# pressure_Pa NaN", "pressure NaN is not a finite positive number"},
		{"# inlet_T_K 298", "# inlet_T_K -1", "inlet temperature -1"},
		{"2.1,", "-2.1,", "mass flux -2.1"},
		{"inlet,298,,0.0285,0.2264,0,", "inlet,298,,0.0285,0.2264,-0.1,", "inlet mass fraction"},
		{"# anchor_x_m 0.004", "# anchor_x_m 7", "anchor at 7 m"},
		{"0.006,1800,", "0.006,-1800,", "temperature at point 4"},
	} {
		_, err := readRestart(strings.NewReader(strings.Replace(good, tc.old, tc.new, 1)), "r.csv", m)
		if err == nil || !strings.Contains(err.Error(), tc.want) || !strings.HasPrefix(err.Error(), "r.csv") {
			t.Errorf("%s: %v, want %q", tc.new, err, tc.want)
		}
	}
}
