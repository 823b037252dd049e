package study

import (
	"fmt"
	"io"
	"math"
	"path/filepath"
	"sort"

	"flame1d/casefile"
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

// Compare solves every fuel of the case's [compare] table (or the given
// names) over the equivalence ratios, at the case's unburned temperature
// and pressure. Each fuel walks its equivalence ratios outwards from the
// one nearest stoichiometric, each flame starting from its neighbour.
// Failed points are recorded, not fatal.
func Compare(c *casefile.Case, fuels []string, phis []float64, progress io.Writer) (*Comparison, error) {
	if len(fuels) < 2 {
		return nil, fmt.Errorf("compare needs at least two fuels, got %d", len(fuels))
	}
	if len(phis) == 0 {
		return nil, fmt.Errorf("compare needs at least one equivalence ratio")
	}
	mech, err := LoadMechanism(c)
	if err != nil {
		return nil, err
	}
	cmp := &Comparison{Fuels: fuels, Phis: phis, Results: map[string][]*Result{}, Errors: map[string][]error{}, Studies: map[string]*Study{}}
	for _, name := range fuels {
		spec, ok := c.FuelByName(name)
		if !ok {
			return nil, fmt.Errorf("%s: no [fuels.%s] table", c.File, name)
		}
		st, err := NewForFuel(c, mech, spec, progress)
		if err != nil {
			return nil, err
		}
		cmp.Studies[name] = st
		res := make([]*Result, len(phis))
		errs := make([]error, len(phis))
		for _, i := range continuationOrder(phis) {
			var start *flame.Solution
			if j := nearestSolved(phis, res, i); j >= 0 {
				start = res[j].Solution
			}
			cond := Condition{Phi: phis[i], T: c.Temperature, P: c.Pressure}
			if progress != nil {
				fmt.Fprintf(progress, "compare: %s at %v\n", name, cond)
			}
			r, err := st.Solve(cond, start)
			res[i], errs[i] = r, err
		}
		cmp.Results[name], cmp.Errors[name] = res, errs
	}
	return cmp, nil
}

// continuationOrder visits indices starting at the equivalence ratio
// nearest 1.05 (near the fastest flame, where a cold start is easiest) and
// walking outwards.
func continuationOrder(phis []float64) []int {
	idx := make([]int, len(phis))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool {
		return math.Abs(phis[idx[a]]-1.05) < math.Abs(phis[idx[b]]-1.05)
	})
	return idx
}

func nearestSolved(phis []float64, res []*Result, i int) int {
	best, bj := math.Inf(1), -1
	for j, r := range res {
		if r != nil && j != i {
			if d := math.Abs(phis[j] - phis[i]); d < best {
				best, bj = d, j
			}
		}
	}
	return bj
}

// Table lays the comparison out as CSV rows: one row per fuel and
// equivalence ratio. Failed points have empty numeric fields and the reason.
func (c *Comparison) Table() [][]string {
	rows := [][]string{{"fuel", "equivalence_ratio [-]", "S_L [m/s]", "S_L/S_L(" + c.Fuels[0] + ") [-]",
		"T_adiabatic [K]", "T_burned [K]", "thermal_thickness [m]", "pyrolysis_end [m]", "heat_release_peak [m]",
		"pyrolysis_to_peak [m]", "status"}}
	f := output.FormatFloat
	for _, name := range c.Fuels {
		for i, phi := range c.Phis {
			r := c.Results[name][i]
			if r == nil {
				rows = append(rows, []string{name, f(phi), "", "", "", "", "", "", "", "", "failed: " + oneLine(c.Errors[name][i])})
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
			rows = append(rows, []string{name, f(phi), f(s.FlameSpeed), ratio, f(s.AdiabaticTemperature), f(s.BurnedTemperature),
				f(s.ThermalThickness), pyEnd, f(s.Zones.Oxidation.PeakX), sep, "converged"})
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

// WritePlots writes the flame-speed chart (S_L against phi, one line per
// fuel) and, at the profile equivalence ratio, overlays of temperature and
// heat release and of the fuel and main pool species, aligned at each
// flame's heat-release peak. Each chart is written as SVG and PNG.
func (c *Comparison) WritePlots(dir string, profilePhi float64) error {
	var speed []output.Series
	for _, name := range c.Fuels {
		s := output.Series{Name: name}
		for i, phi := range c.Phis {
			if r := c.Results[name][i]; r != nil {
				s.X = append(s.X, phi)
				s.Y = append(s.Y, r.Summary.FlameSpeed)
			}
		}
		if len(s.X) > 0 {
			speed = append(speed, s)
		}
	}
	chart := output.Chart{Title: "Laminar flame speed", XLabel: "equivalence ratio [-]", YLabel: "S_L [m/s]",
		Note: "model predictions; confirm against local codes and licensed practice"}
	for _, ext := range []string{".svg", ".png"} {
		if err := output.Lines(filepath.Join(dir, "flame-speed"+ext), chart, speed); err != nil {
			return err
		}
	}
	ip := -1
	for i, phi := range c.Phis {
		if ip < 0 || math.Abs(phi-profilePhi) < math.Abs(c.Phis[ip]-profilePhi) {
			ip = i
		}
	}
	var thermal, species []output.Series
	for _, name := range c.Fuels {
		r := c.Results[name][ip]
		if r == nil {
			continue
		}
		p := r.Profile
		x0 := r.Summary.Zones.Oxidation.PeakX
		peak := r.Summary.Zones.Oxidation.PeakValue
		// Window: from 6 thermal thicknesses upstream of the peak to 10
		// downstream, where the structure is; the long post-flame zone
		// would squeeze it into a line.
		var win []int
		var xs []float64
		for j := range p.X {
			if d := p.X[j] - x0; d >= -6*p.ThermalThick && d <= 10*p.ThermalThick {
				win = append(win, j)
				xs = append(xs, 1e3*d)
			}
		}
		T := output.Series{Name: name + " T/1000 K", X: xs}
		Q := output.Series{Name: name + " heat release/peak", X: xs}
		for _, j := range win {
			T.Y = append(T.Y, p.T[j]/1000)
			Q.Y = append(Q.Y, p.HeatRelease[j]/peak)
		}
		thermal = append(thermal, T, Q)
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
			s := output.Series{Name: name + " " + sp, X: xs}
			for _, j := range win {
				s.Y = append(s.Y, p.MoleFractions[j][k])
			}
			species = append(species, s)
		}
	}
	label := fmt.Sprintf("distance from heat-release peak [mm] (phi = %g)", c.Phis[ip])
	for _, ext := range []string{".svg", ".png"} {
		if len(thermal) > 0 {
			if err := output.Lines(filepath.Join(dir, "profiles-thermal"+ext),
				output.Chart{Title: "Temperature and heat release", XLabel: label, YLabel: "[-]"}, thermal); err != nil {
				return err
			}
		}
		if len(species) > 0 {
			if err := output.Lines(filepath.Join(dir, "profiles-species"+ext),
				output.Chart{Title: "Fuel and pool species", XLabel: label, YLabel: "mole fraction [-]"}, species); err != nil {
				return err
			}
		}
	}
	return nil
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
