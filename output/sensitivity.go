package output

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"flame1d/sensitivity"
)

// SensitivityEntry is one coefficient in the summaries.
type SensitivityEntry struct {
	Kind      string `json:"kind"`
	Parameter string `json:"parameter"`
	// Reaction is the 1-based reaction number (rate constants and
	// activation energies), else 0.
	Reaction int     `json:"reaction,omitempty"`
	Value    float64 `json:"d_ln_flame_speed_d_ln_parameter"`
}

// SensitivityEntries converts the first n coefficients of an analysis.
func SensitivityEntries(a *sensitivity.Analysis, n int) []SensitivityEntry {
	var out []SensitivityEntry
	for _, c := range a.Top(n) {
		out = append(out, SensitivityEntry{Kind: string(c.Kind), Parameter: c.Parameter, Reaction: c.Reaction, Value: c.Value})
	}
	return out
}

// BandNote says what the rate-constant band of S_L covers.
const BandNote = "1σ band from the rate-constant uncertainty factors only (first-order propagation of ln k); " +
	"transport data, thermochemistry and the cracked-pool model are not included"

// WriteSensitivityCSV writes every coefficient of an analysis, largest
// magnitude first: rank, kind, reaction number (0 for other parameters),
// parameter, d ln S_L/d ln p, the uncertainty factor and the reaction's
// share of σ(S_L) (S_L |S_i| ln(f_i)/2); the reaction number is empty for
// species parameters, factor and share for everything but rate constants.
func WriteSensitivityCSV(w io.Writer, a *sensitivity.Analysis, comments []string) error {
	for _, c := range comments {
		if _, err := fmt.Fprintf(w, "# %s\n", c); err != nil {
			return err
		}
	}
	fmt.Fprintf(w, "# %s\n# %s\n", sensitivity.FormatBand(a.FlameSpeed, a.Sigma), BandNote)
	cw := csv.NewWriter(w)
	cw.Write([]string{"rank", "kind", "reaction", "parameter", "d ln S_L/d ln p [-]", "uncertainty factor [-]", "sigma contribution [m/s]"})
	for i, c := range a.Coefficients {
		if math.IsNaN(c.Value) || math.IsInf(c.Value, 0) {
			return fmt.Errorf("sensitivity of %s %s is not a finite number", c.Kind, c.Parameter)
		}
		// Factor and share are empty for parameters outside the band.
		reaction, factor, share := "", "", ""
		if c.Reaction > 0 {
			reaction = strconv.Itoa(c.Reaction)
		}
		if c.Kind == sensitivity.RateConstant {
			factor = FormatFloat(c.UncertaintyFactor)
			share = FormatFloat(a.FlameSpeed * math.Abs(c.Value) * math.Log(c.UncertaintyFactor) / 2)
		}
		cw.Write([]string{strconv.Itoa(i + 1), string(c.Kind), reaction, c.Parameter, FormatFloat(c.Value), factor, share})
	}
	cw.Flush()
	return cw.Error()
}

// writeSensitivityText adds the band and the ten largest coefficients to
// the human summary.
func writeSensitivityText(b *strings.Builder, s *FlameSummary) {
	if s.FlameSpeedBand == "" {
		return
	}
	fmt.Fprintf(b, "  uncertainty             %s\n", s.FlameSpeedBand)
	fmt.Fprintf(b, "                          (%s)\n", BandNote)
	if len(s.Sensitivities) == 0 {
		return
	}
	fmt.Fprintf(b, "  largest sensitivities   d ln S_L / d ln p\n")
	for i, e := range s.Sensitivities {
		what := e.Parameter
		switch {
		case e.Reaction > 0 && e.Kind == string(sensitivity.RateConstant):
			what = fmt.Sprintf("R%d %s", e.Reaction, e.Parameter)
		case e.Reaction > 0:
			what = fmt.Sprintf("R%d %s (%s)", e.Reaction, e.Parameter, e.Kind)
		default:
			what = fmt.Sprintf("%s of %s", e.Kind, e.Parameter)
		}
		fmt.Fprintf(b, "    %2d  %+8.4f  %s\n", i+1, e.Value, what)
	}
}
