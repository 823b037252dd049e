package study

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"sort"
	"strings"

	"flame1d/casefile"
	"flame1d/chem"
	"flame1d/flame"
	"flame1d/output"
)

// Comparison is several fuels solved at the same conditions.
type Comparison struct {
	Fuels   []string
	Phis    []float64
	Results map[string][]*Result // per fuel, aligned with Phis; nil where the solve failed
	Errors  map[string][]error   // per fuel, aligned with Phis
	Studies map[string]*Study
}

// Compare solves the named fuels (none: every [fuels.NAME] table of the
// case) over the equivalence ratios, at the case's unburned temperature
// and pressure. Each fuel walks its equivalence ratios outwards from the
// one nearest stoichiometric, each flame starting from its neighbour.
// Failed points are recorded, not fatal.
func Compare(c *casefile.Case, fuels []string, phis []float64, progress io.Writer) (*Comparison, error) {
	if len(fuels) == 0 {
		// No [compare] table and no list: every fuel table of the case.
		for _, f := range c.Fuels {
			fuels = append(fuels, f.Name)
		}
	}
	if len(fuels) < 2 {
		return nil, fmt.Errorf("%s: compare needs at least two fuels, got %d: define [fuels.NAME] tables (every one is compared by default), or name them in [compare] fuels or --fuels",
			c.File, len(fuels))
	}
	if len(phis) == 0 {
		return nil, fmt.Errorf("compare needs at least one equivalence ratio")
	}
	mechs := map[string]*chem.Mechanism{}
	cmp := &Comparison{Fuels: fuels, Phis: phis, Results: map[string][]*Result{}, Errors: map[string][]error{}, Studies: map[string]*Study{}}
	for _, name := range fuels {
		spec, ok := c.FuelByName(name)
		if !ok {
			return nil, fmt.Errorf("%s: no [fuels.%s] table", c.File, name)
		}
		mechName := c.MechanismOf(spec)
		mech, ok := mechs[mechName]
		if !ok {
			m, err := LoadMechanismFor(mechName, c.File)
			if err != nil {
				return nil, fmt.Errorf("fuel %s: %w", name, err)
			}
			mech, mechs[mechName] = m, m
		}
		st, err := NewForFuel(c, mech, spec, progress)
		if err != nil {
			return nil, err
		}
		cmp.Studies[name] = st
		res, errs := st.SolveAlongPhi(phis, c.Temperature, c.Pressure, func(i int, r *Result, err error) {
			if progress != nil {
				fmt.Fprintf(progress, "compare: %s at %v: %s\n", name, Condition{Phi: phis[i], T: c.Temperature, P: c.Pressure}, outcome(r, err))
			}
		})
		cmp.Results[name], cmp.Errors[name] = res, errs
	}
	return cmp, nil
}

// MechanismOf names the mechanism a fuel of the comparison burns on.
func (c *Comparison) MechanismOf(fuel string) string {
	if st := c.Studies[fuel]; st != nil {
		return st.MechanismName
	}
	return ""
}

// Label is a fuel's name with its mechanism, as charts show it.
func (c *Comparison) Label(fuel string) string {
	return fuel + " (" + c.MechanismOf(fuel) + ")"
}

// MechanismNote says which mechanism each fuel burns on, in one line.
func (c *Comparison) MechanismNote() string {
	parts := make([]string, len(c.Fuels))
	for i, f := range c.Fuels {
		parts[i] = f + " on " + c.MechanismOf(f)
	}
	return "mechanisms: " + strings.Join(parts, "; ")
}

// Table lays the comparison out as CSV rows: one row per fuel and
// equivalence ratio. Failed points have empty numeric fields and the reason.
func (c *Comparison) Table() [][]string {
	rows := [][]string{{"fuel", "mechanism", "equivalence_ratio [-]", "S_L [m/s]", "S_L/S_L(" + c.Fuels[0] + ") [-]",
		"T_adiabatic [K]", "T_burned [K]", "thermal_thickness [m]", "pyrolysis_end [m]", "heat_release_peak [m]",
		"pyrolysis_to_peak [m]", "status"}}
	withBand := c.hasBand()
	if withBand {
		rows[0] = append(rows[0], bandColumn)
	}
	f := output.FormatFloat
	for _, name := range c.Fuels {
		for i, phi := range c.Phis {
			r := c.Results[name][i]
			if r == nil {
				row := []string{name, c.MechanismOf(name), f(phi), "", "", "", "", "", "", "", "", "failed: " + oneLine(c.Errors[name][i])}
				if withBand {
					row = append(row, "")
				}
				rows = append(rows, row)
				continue
			}
			s := r.Summary
			ratio := ""
			if ref := c.Results[c.Fuels[0]][i]; ref != nil {
				ratio = f(s.FlameSpeed / ref.Summary.FlameSpeed)
			}
			pyEnd := ""
			if z := s.Zones; z != nil && len(z.Pyrolysis) > 0 {
				end := z.Pyrolysis[0].EndX
				for _, p := range z.Pyrolysis {
					end = math.Max(end, p.EndX)
				}
				pyEnd = f(end)
			}
			sep := ""
			if s.Zones != nil && len(s.Zones.Pyrolysis) > 0 {
				sep = f(s.Zones.SeparationM)
			}
			row := []string{name, c.MechanismOf(name), f(phi), f(s.FlameSpeed), ratio, f(s.AdiabaticTemperature), f(s.BurnedTemperature),
				f(s.ThermalThickness), pyEnd, f(s.Zones.Oxidation.PeakX), sep, "converged"}
			if withBand {
				row = append(row, bandCell(r))
			}
			rows = append(rows, row)
		}
	}
	return rows
}

func oneLine(err error) string {
	if err == nil {
		return ""
	}
	s := err.Error()
	for i, ch := range s {
		if ch == '\n' {
			return s[:i]
		}
	}
	return s
}

// WritePlots writes, each as SVG and PNG:
//   - flame-speed: S_L against phi, one line per fuel;
//   - profiles-thermal: temperature and heat-release rate at the profile
//     equivalence ratio, aligned at each flame's heat-release peak;
//   - profiles-species: the fuel and main pool species, aligned likewise;
//   - zone-map: where each fuel cracks and burns, as bars aligned at the
//     heat-release peak, at the profile equivalence ratio and across phi.
func (c *Comparison) WritePlots(dir string, profilePhi float64) error {
	cs := c.Studies[c.Fuels[0]].Case
	condition := fmt.Sprintf("%.0f K, %.4g atm", cs.Temperature, cs.Pressure/101325)
	var speed []output.Series
	for _, name := range c.Fuels {
		s := output.Series{Name: c.Label(name)}
		for _, i := range c.byPhi() {
			if r := c.Results[name][i]; r != nil {
				s.X = append(s.X, c.Phis[i])
				s.Y = append(s.Y, r.Summary.FlameSpeed)
				s.YErr = append(s.YErr, r.Summary.FlameSpeedSigma)
			} else {
				s.Break() // a failed point: no line across it
			}
		}
		if len(s.X) > 0 {
			speed = append(speed, s)
		}
	}
	if len(speed) > 0 {
		chart := output.Chart{Title: "Laminar flame speed", Note: titled(cs.Title, condition),
			XLabel: "equivalence ratio φ [-]", YLabel: "S_L [m/s]", YFromZero: true}
		if c.hasBand() {
			chart.Note += "; error bars: 1σ from rate constants"
		}
		if err := writeBoth(dir, "flame-speed", func(path string) error { return output.Lines(path, chart, speed) }); err != nil {
			return err
		}
	}
	ip := c.nearestPhi(profilePhi)
	var temperature, heat, species []output.Series
	var speciesOrder []string
	speciesColor := func(sp string) color.Color {
		for i, s := range speciesOrder {
			if s == sp {
				return output.SeriesColor(i)
			}
		}
		speciesOrder = append(speciesOrder, sp)
		return output.SeriesColor(len(speciesOrder) - 1)
	}
	peakHeat := 0.0
	for _, name := range c.Fuels {
		if r := c.Results[name][ip]; r != nil {
			peakHeat = math.Max(peakHeat, r.Summary.Zones.Oxidation.PeakValue)
		}
	}
	scale, prefix := output.SIPrefix(peakHeat)
	for f, name := range c.Fuels {
		r := c.Results[name][ip]
		if r == nil {
			continue
		}
		p := r.Profile
		x0 := r.Summary.Zones.Oxidation.PeakX
		// Window: 4 thermal thicknesses either side of the peak, where the
		// structure is; the long post-flame zone would squeeze it into a
		// line.
		var win []int
		var xs []float64
		for j := range p.X {
			if d := p.X[j] - x0; d >= -4*p.ThermalThick && d <= 4*p.ThermalThick {
				win = append(win, j)
				xs = append(xs, 1e3*d)
			}
		}
		clr := output.SeriesColor(f)
		T := output.Series{Name: c.Label(name), X: xs, Color: clr}
		Q := output.Series{Name: c.Label(name), X: xs, Color: clr}
		for _, j := range win {
			T.Y = append(T.Y, p.T[j])
			Q.Y = append(Q.Y, scale*p.HeatRelease[j])
		}
		temperature, heat = append(temperature, T), append(heat, Q)
		names := append(c.Studies[name].FuelSpecies(), poolNames(r)...)
		for _, sp := range names {
			k := -1
			for i, s := range p.Species {
				if s == sp {
					k = i
				}
			}
			if k < 0 {
				continue
			}
			// Colour marks the species, the line pattern the fuel.
			s := output.Series{Name: c.Label(name) + " " + sp, X: xs, Color: speciesColor(sp), Dash: f}
			for _, j := range win {
				s.Y = append(s.Y, p.MoleFractions[j][k])
			}
			species = append(species, s)
		}
	}
	note := titled(cs.Title, fmt.Sprintf("φ = %g, %s", c.Phis[ip], condition))
	label := "distance from the heat-release peak [mm]"
	if len(temperature) > 0 {
		chart := output.Chart{Title: "Temperature and heat release", Note: note, XLabel: label}
		panels := []output.Panel{
			{YLabel: "T [K]", Series: temperature},
			{YLabel: "heat release [" + prefix + "W/m³]", Series: heat, YFromZero: true},
		}
		if err := writeBoth(dir, "profiles-thermal", func(path string) error { return output.StackedPanels(path, chart, panels) }); err != nil {
			return err
		}
	}
	if len(species) > 0 {
		chart := output.Chart{Title: "Fuel and pool species", Note: note, XLabel: label, YLabel: "mole fraction [-]", YFromZero: true}
		if err := writeBoth(dir, "profiles-species", func(path string) error { return output.Lines(path, chart, species) }); err != nil {
			return err
		}
	}
	return c.writeZoneMap(dir, ip, titled(cs.Title, condition))
}

// writeZoneMap draws the zone map: the fuels at the profile equivalence
// ratio (index ip) and, where there are several, every fuel across phi.
func (c *Comparison) writeZoneMap(dir string, ip int, note string) error {
	atProfile := output.ZonePanel{Title: fmt.Sprintf("φ = %g", c.Phis[ip])}
	across := output.ZonePanel{Title: "across φ"}
	for _, name := range c.Fuels {
		if r := c.Results[name][ip]; r != nil {
			atProfile.Flames = append(atProfile.Flames, output.ZoneSet{Label: name, Zones: r.Summary.Zones, ThermalThickness: r.Profile.ThermalThick})
		}
		for _, i := range c.byPhi() {
			if r := c.Results[name][i]; r != nil && len(c.Phis) > 1 {
				across.Flames = append(across.Flames, output.ZoneSet{Label: fmt.Sprintf("%s, φ %g", name, c.Phis[i]), Zones: r.Summary.Zones,
					ThermalThickness: r.Profile.ThermalThick})
			}
		}
	}
	var panels []output.ZonePanel
	for _, p := range []output.ZonePanel{atProfile, across} {
		if len(p.Flames) > 0 {
			panels = append(panels, p)
		}
	}
	if len(panels) == 0 {
		return nil
	}
	chart := output.Chart{Title: "Where each fuel cracks and burns", Note: note}
	return writeBoth(dir, "zone-map", func(path string) error { return output.ZoneMap(path, chart, panels) })
}

// titled prefixes a chart note with the case title, when there is one.
func titled(title, note string) string {
	if title == "" {
		return note
	}
	return title + ": " + note
}

// writeBoth writes a chart as base.svg and base.png in dir.
func writeBoth(dir, base string, write func(path string) error) error {
	for _, ext := range []string{".svg", ".png"} {
		if err := write(filepath.Join(dir, base+ext)); err != nil {
			return err
		}
	}
	return nil
}

// byPhi lists the indices of the equivalence ratios in ascending order.
func (c *Comparison) byPhi() []int {
	idx := make([]int, len(c.Phis))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return c.Phis[idx[a]] < c.Phis[idx[b]] })
	return idx
}

// nearestPhi is the index of the equivalence ratio nearest phi.
func (c *Comparison) nearestPhi(phi float64) int {
	ip := 0
	for i, v := range c.Phis {
		if math.Abs(v-phi) < math.Abs(c.Phis[ip]-phi) {
			ip = i
		}
	}
	return ip
}

// overlayPoolSpecies is how many pool species per fuel the species overlay
// shows (the largest peaks), so the chart stays readable.
const overlayPoolSpecies = 3

func poolNames(r *Result) []string {
	if r.Summary.Zones == nil {
		return nil
	}
	peaks := append([]flame.SpeciesPeak(nil), r.Summary.Zones.PoolPeaks...)
	sort.Slice(peaks, func(a, b int) bool { return peaks[a].MoleFraction > peaks[b].MoleFraction })
	var out []string
	for i := 0; i < len(peaks) && i < overlayPoolSpecies; i++ {
		out = append(out, peaks[i].Species)
	}
	return out
}
