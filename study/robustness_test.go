package study

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"flame1d/casefile"
	"flame1d/flame"
	"flame1d/thermo"
)

// TestKeroseneColdStartRobustness is the cracked-pool part of the solver
// issue's cold-start matrix: the kerosene demo's reference kerosene
// (finite-rate pseudo-fuel over its yields pool, on ranzi2012-c1c3) at
// phi 0.7/1.0/1.4, 400/700 K and 1/20 atm, each from a cold start. Every
// case must converge or be refused because no flame exists. It runs only
// with FLAME1D_ROBUSTNESS set (about ten minutes) and prints its table.
func TestKeroseneColdStartRobustness(t *testing.T) {
	if os.Getenv("FLAME1D_ROBUSTNESS") == "" {
		t.Skip("set FLAME1D_ROBUSTNESS=1 for the cracked-pool cold-start matrix")
	}
	c, err := casefile.ReadFile(filepath.Join("..", "examples", "kerosene-compare.toml"))
	if err != nil {
		t.Fatal(err)
	}
	spec, ok := c.FuelByName("ref-kerosene")
	if !ok {
		t.Fatal("the kerosene demo has no ref-kerosene fuel")
	}
	mech, err := LoadMechanismFor(c.MechanismOf(spec), c.File)
	if err != nil {
		t.Fatal(err)
	}
	st, err := NewForFuel(c, mech, spec, nil)
	if err != nil {
		t.Fatal(err)
	}
	var table strings.Builder
	fmt.Fprintf(&table, "%-34s %-10s %8s %6s %6s %9s\n", "case", "result", "time_s", "iters", "jacs", "S_L_m/s")
	for _, P := range []float64{1, 20} {
		for _, T := range []float64{400, 700} {
			for _, phi := range []float64{0.7, 1.0, 1.4} {
				name := fmt.Sprintf("ref-kerosene phi=%g %gK %gatm", phi, T, P)
				start := time.Now()
				r, err := st.Solve(Condition{Phi: phi, T: T, P: P * thermo.OneAtmosphere}, nil)
				wall := time.Since(start).Seconds()
				var line string
				switch {
				case err == nil:
					s := r.Solution.Stats
					line = fmt.Sprintf("%-34s %-10s %8.2f %6d %6d %9.4f", name, "converged", wall, s.NewtonIterations, s.JacobianEvaluations, r.Summary.FlameSpeed)
				case errors.Is(err, flame.ErrNotConverged):
					line = fmt.Sprintf("%-34s %-10s %8.2f", name, "FAILED", wall)
					t.Errorf("%s: %v", name, err)
				default:
					line = fmt.Sprintf("%-34s %-10s %8.2f", name, "refused", wall)
					t.Logf("%s refused: %v", name, err)
				}
				t.Log(line)
				table.WriteString(line + "\n")
			}
		}
	}
	t.Logf("cracked-pool cold starts (wall times under the machine's load):\n%s", table.String())
}
