package sweep

import (
	"testing"

	"flame1d/output"
	"flame1d/study"
)

// The rate-constant band travels from the flame summary to point.json and
// to its own column of results.csv; without sensitivities the column stays
// empty.
func TestBandColumn(t *testing.T) {
	pt := Point{ID: "p1", Condition: study.Condition{Phi: 1, T: 298, P: 101325}}
	for _, sigma := range []float64{0.021, 0} {
		var rec Record
		res := &study.Result{Summary: &output.FlameSummary{FlameSpeed: 0.36, BurnedTemperature: 2200, AdiabaticTemperature: 2210,
			ThermalThickness: 4e-4, PeakHeatReleaseX: 0.006, FlameSpeedSigma: sigma}}
		if err := rec.fill(res); err != nil {
			t.Fatal(err)
		}
		rec.Status = Solved
		got := rowOf(pt, &rec)[Column(ColFlameSpeedSigma)]
		want := ""
		if sigma > 0 {
			want = "0.021"
		}
		if got != want {
			t.Errorf("σ = %g: column %q holds %q, want %q", sigma, ColFlameSpeedSigma, got, want)
		}
	}
}
