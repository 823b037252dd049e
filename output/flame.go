package output

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"flame1d/flame"
)

// FlameSummary is the machine-readable result of one flame. Field names
// carry their units.
type FlameSummary struct {
	Title                string             `json:"title,omitempty"`
	Mechanism            string             `json:"mechanism"`
	Fuel                 string             `json:"fuel"` // empty for inline mole fractions
	FuelComposition      map[string]float64 `json:"fuel_mole_fractions"`
	Oxidizer             map[string]float64 `json:"oxidizer_mole_fractions"`
	EquivalenceRatio     float64            `json:"equivalence_ratio"`
	UnburnedTemperatureK float64            `json:"unburned_temperature_K"`
	InletTemperatureK    float64            `json:"inlet_temperature_K"`
	PressurePa           float64            `json:"pressure_Pa"`
	Converged            bool               `json:"converged"`
	FlameSpeed           float64            `json:"flame_speed_m_s"`
	MassFlux             float64            `json:"mass_flux_kg_m2_s"`
	BurnedTemperature    float64            `json:"burned_temperature_K"`
	AdiabaticTemperature float64            `json:"adiabatic_temperature_K"`
	ThermalThickness     float64            `json:"thermal_thickness_m"`
	PeakHeatReleaseX     float64            `json:"peak_heat_release_position_m"`
	GridPoints           int                `json:"grid_points"`
	DomainLength         float64            `json:"domain_length_m"`
	NewtonIterations     int                `json:"newton_iterations"`
	TimeSteps            int                `json:"time_steps"`
	JacobianEvaluations  int                `json:"jacobian_evaluations"`
	Refinements          int                `json:"grid_refinements"`
	WallTimeS            float64            `json:"wall_time_s"`
	Zones                *flame.Zones       `json:"zones,omitempty"`
	// FlameSpeedSigma and FlameSpeedBand are the 1σ rate-constant band
	// (output.BandNote); Sensitivities the ten largest coefficients. Empty
	// unless sensitivities were asked for.
	FlameSpeedSigma float64            `json:"flame_speed_sigma_m_s,omitempty"`
	FlameSpeedBand  string             `json:"flame_speed_band,omitempty"`
	Sensitivities   []SensitivityEntry `json:"sensitivities_top10,omitempty"`
	Note            string             `json:"note"`
}

// Check refuses summaries with non-finite numbers.
func (s *FlameSummary) Check() error {
	for name, v := range map[string]float64{
		"flame_speed_m_s": s.FlameSpeed, "burned_temperature_K": s.BurnedTemperature,
		"adiabatic_temperature_K": s.AdiabaticTemperature, "thermal_thickness_m": s.ThermalThickness,
		"flame_speed_sigma_m_s": s.FlameSpeedSigma,
	} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("summary value %s is not a finite number", name)
		}
	}
	return nil
}

// WriteJSON writes the summary as indented JSON.
func (s *FlameSummary) WriteJSON(w io.Writer) error {
	if err := s.Check(); err != nil {
		return err
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(s)
}

// FuelName is the fuel's name; where the case gave mole fractions inline
// (they have no name of their own), the species of a single-species fuel or
// the composition of a mixture.
func (s *FlameSummary) FuelName() string {
	if !s.inlineFuel() {
		return s.Fuel
	}
	if len(s.FuelComposition) == 1 {
		for name := range s.FuelComposition {
			return name
		}
	}
	return formatComposition(s.FuelComposition)
}

// inlineFuel: a fuel given as inline mole fractions has no name of its own.
func (s *FlameSummary) inlineFuel() bool { return s.Fuel == "" }

// WriteText writes the short human summary.
func (s *FlameSummary) WriteText(w io.Writer) error {
	if err := s.Check(); err != nil {
		return err
	}
	var b strings.Builder
	if s.Title != "" {
		fmt.Fprintf(&b, "%s\n", OneLine(s.Title))
	}
	fmt.Fprintf(&b, "  mechanism               %s\n", OneLine(s.Mechanism))
	if s.inlineFuel() {
		fmt.Fprintf(&b, "  fuel                    %s\n", formatComposition(s.FuelComposition))
	} else {
		fmt.Fprintf(&b, "  fuel                    %s: %s\n", s.Fuel, formatComposition(s.FuelComposition))
	}
	fmt.Fprintf(&b, "  oxidizer                %s\n", formatComposition(s.Oxidizer))
	fmt.Fprintf(&b, "  equivalence ratio       %.4g\n", s.EquivalenceRatio)
	fmt.Fprintf(&b, "  unburned T, P           %.2f K, %.6g Pa (%.4g atm)\n", s.UnburnedTemperatureK, s.PressurePa, s.PressurePa/101325)
	if d := s.InletTemperatureK - s.UnburnedTemperatureK; d != 0 {
		fmt.Fprintf(&b, "  inlet temperature       %.2f K (pre-cracked pool: %+.1f K for the cracking enthalpy)\n", s.InletTemperatureK, d)
	}
	fmt.Fprintf(&b, "  laminar flame speed     %.4f m/s  (%.2f cm/s)\n", s.FlameSpeed, 100*s.FlameSpeed)
	fmt.Fprintf(&b, "  burned temperature      %.1f K   (adiabatic equilibrium %.1f K)\n", s.BurnedTemperature, s.AdiabaticTemperature)
	fmt.Fprintf(&b, "  thermal thickness       %.4g mm\n", 1e3*s.ThermalThickness)
	fmt.Fprintf(&b, "  grid                    %d points over %.4g mm\n", s.GridPoints, 1e3*s.DomainLength)
	fmt.Fprintf(&b, "  work                    %d Newton iterations, %d time steps, %d Jacobians, %d refinements, %.2f s\n",
		s.NewtonIterations, s.TimeSteps, s.JacobianEvaluations, s.Refinements, s.WallTimeS)
	if z := s.Zones; z != nil {
		for _, pz := range z.Pyrolysis {
			fmt.Fprintf(&b, "  pyrolysis of %-10s %.4g-%.4g mm (%.0f-%.0f K), residence %.3g ms\n",
				pz.Species, 1e3*pz.StartX, 1e3*pz.EndX, pz.StartT, pz.EndT, 1e3*pz.ResidenceTime)
		}
		ox := z.Oxidation
		fmt.Fprintf(&b, "  oxidation zone          %.4g-%.4g mm (%.0f-%.0f K), heat-release peak at %.4g mm (%.0f K)\n",
			1e3*ox.StartX, 1e3*ox.EndX, ox.StartT, ox.EndT, 1e3*ox.PeakX, ox.PeakT)
		for _, pk := range z.PoolPeaks {
			fmt.Fprintf(&b, "  pool peak %-13s %.3g at %.4g mm (%.0f K)\n", pk.Species, pk.MoleFraction, 1e3*pk.X, pk.T)
		}
		for _, pk := range z.RadicalPeaks {
			fmt.Fprintf(&b, "  radical peak %-10s %.3g at %.4g mm\n", pk.Species, pk.MoleFraction, 1e3*pk.X)
		}
		if len(z.Pyrolysis) > 0 {
			fmt.Fprintf(&b, "  pyrolysis end to peak   %.4g mm (%.3g thermal thicknesses)\n", 1e3*z.SeparationM, z.SeparationThickness)
		}
	}
	writeSensitivityText(&b, s)
	fmt.Fprintf(&b, "  note                    %s\n", s.Note)
	_, err := io.WriteString(w, b.String())
	return err
}

func formatComposition(c map[string]float64) string {
	keys := make([]string, 0, len(c))
	for k := range c {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	parts := make([]string, len(keys))
	for i, k := range keys {
		parts[i] = fmt.Sprintf("%s %.4g", k, c[k])
	}
	return strings.Join(parts, ", ")
}

// ProfileTable lays a flame profile out as CSV columns: position,
// temperature, velocity, density, heat-release rate and the mole fraction of
// every species.
func ProfileTable(p *flame.Profile, comments []string) *Table {
	t := &Table{Comments: comments}
	t.Header = []string{"x [m]", "T [K]", "u [m/s]", "rho [kg/m3]", "heat_release [W/m3]"}
	for _, s := range p.Species {
		t.Header = append(t.Header, "X_"+s+" [-]")
	}
	for j := range p.X {
		row := make([]float64, 0, len(t.Header))
		row = append(row, p.X[j], p.T[j], p.Velocity[j], p.Density[j], p.HeatRelease[j])
		row = append(row, p.MoleFractions[j]...)
		t.Rows = append(t.Rows, row)
	}
	return t
}

// WriteZonesCSV writes the zone diagnostics as a long table: one row per
// zone or peak with its kind, species and positions.
func WriteZonesCSV(w io.Writer, z *flame.Zones, comments []string) error {
	if err := WriteComments(w, comments); err != nil {
		return err
	}
	cw := csv.NewWriter(w)
	rows := [][]string{{"kind", "species", "start [m]", "end [m]", "peak [m]", "T_start [K]", "T_end [K]", "T_peak [K]", "peak_value", "residence_time [s]"}}
	f := FormatFloat
	for _, p := range z.Pyrolysis {
		rows = append(rows, []string{"pyrolysis", p.Species, f(p.StartX), f(p.EndX), "", f(p.StartT), f(p.EndT), "", "", f(p.ResidenceTime)})
	}
	o := z.Oxidation
	rows = append(rows, []string{"oxidation", "", f(o.StartX), f(o.EndX), f(o.PeakX), f(o.StartT), f(o.EndT), f(o.PeakT), f(o.PeakValue), ""})
	for _, p := range z.PoolPeaks {
		rows = append(rows, []string{"pool_peak", p.Species, "", "", f(p.X), "", "", f(p.T), f(p.MoleFraction), ""})
	}
	for _, p := range z.RadicalPeaks {
		rows = append(rows, []string{"radical_peak", p.Species, "", "", f(p.X), "", "", f(p.T), f(p.MoleFraction), ""})
	}
	if len(z.Pyrolysis) > 0 {
		rows = append(rows, []string{"separation", "", "", "", f(z.SeparationM), "", "", "", f(z.SeparationThickness), ""})
	}
	if err := cw.WriteAll(rows); err != nil {
		return err
	}
	return cw.Error()
}
