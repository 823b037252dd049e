package output

import (
	"fmt"
	"image/color"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/plot/vg"

	"flame1d/flame"
)

// FlamePlot writes the picture of one flame's structure to path, four
// panels on a shared position axis [mm] (the profile's own coordinate, as
// in profile.csv):
//   - the zones: each fuel species' pyrolysis zone and the oxidation zone
//     as bars, with their temperature windows, and the heat-release peak
//     as a dashed line;
//   - temperature [K];
//   - heat-release rate (in W/m³ with an SI prefix);
//   - mole fractions of the fuel species and of the largest pool species;
//
// the zones shaded behind the curves, a marker on every grid point. The
// window runs from a little upstream of the first zone to a few thermal
// thicknesses past the last, where the structure is.
func FlamePlot(path string, c Chart, p *flame.Profile, z *flame.Zones) error {
	if p == nil || z == nil || len(p.X) < 2 {
		return fmt.Errorf("flame plot %s: no profile or no zone diagnostics", path)
	}
	lo, hi := flameWindow(p, z)
	var win []int
	for j, x := range p.X {
		if x >= lo && x <= hi {
			win = append(win, j)
		}
	}
	if len(win) < 2 {
		return fmt.Errorf("flame plot %s: fewer than two grid points in the flame (%.4g to %.4g m)", path, lo, hi)
	}
	column := func(v func(j int) float64, scale float64) ([]float64, []float64) {
		xs, ys := make([]float64, len(win)), make([]float64, len(win))
		for i, j := range win {
			xs[i], ys[i] = 1e3*p.X[j], scale*v(j)
		}
		return xs, ys
	}

	var bands []Band
	for _, pz := range z.Pyrolysis {
		bands = append(bands, Band{From: 1e3 * pz.StartX, To: 1e3 * pz.EndX, Color: PyrolysisColor})
	}
	bands = append(bands, Band{From: 1e3 * z.Oxidation.StartX, To: 1e3 * z.Oxidation.EndX, Color: OxidationColor})

	tx, ty := column(func(j int) float64 { return p.T[j] }, 1)
	scale, prefix := SIPrefix(z.Oxidation.PeakValue)
	qx, qy := column(func(j int) float64 { return p.HeatRelease[j] }, scale)
	var species []Series
	for _, name := range plottedSpecies(z) {
		k := speciesIndex(p.Species, name)
		if k < 0 {
			continue
		}
		sx, sy := column(func(j int) float64 { return p.MoleFractions[j][k] }, 1)
		species = append(species, Series{Name: name, X: sx, Y: sy})
	}
	if len(species) == 0 {
		return fmt.Errorf("flame plot %s: none of the fuel species is in the profile", path)
	}
	zones := ZoneRows("", z, 0)
	clipRows(zones, 1e3*p.X[win[0]], 1e3*p.X[win[len(win)-1]])
	panels := []Panel{
		{YLabel: "zones", Rows: zones, Keys: zoneKeys, Rules: []float64{1e3 * z.Oxidation.PeakX}, Weight: 0.22 * float64(len(zones)+1)},
		{YLabel: "T [K]", Series: []Series{{Name: "temperature", X: tx, Y: ty, Color: color.Black}}, Bands: bands},
		{YLabel: "heat release [" + prefix + "W/m³]", Series: []Series{{Name: "heat-release rate", X: qx, Y: qy, Color: OxidationColor}}, Bands: bands, YFromZero: true},
		{YLabel: "mole fraction [-]", Series: species, Bands: bands, YFromZero: true},
	}
	if c.XLabel == "" {
		c.XLabel = "position [mm]"
	}
	if c.Height == 0 {
		c.Height = 18 * vg.Centimeter
	}
	return StackedPanels(path, c, panels)
}

// flameWindow is the x range (m) the flame plot shows: from one thermal
// thickness upstream of the first zone start to two past the last zone
// end, within the domain. A zone reaching more than windowReach thermal
// thicknesses beyond the oxidation zone (the fuel of a rich flame, or H2
// left by dissociation in the burned gas, falls to 5% only far downstream)
// is cut there, so that the flame itself is not squeezed into a line.
func flameWindow(p *flame.Profile, z *flame.Zones) (lo, hi float64) {
	ox := z.Oxidation
	d := p.ThermalThick
	if !(d > 0) {
		d = ox.EndX - ox.StartX
	}
	lo, hi = ox.StartX, ox.EndX
	for _, pz := range z.Pyrolysis {
		lo, hi = math.Min(lo, pz.StartX), math.Max(hi, pz.EndX)
	}
	lo = math.Max(lo, ox.StartX-windowReach*d)
	hi = math.Min(hi, ox.EndX+windowReach*d)
	return math.Max(p.X[0], lo-d), math.Min(p.X[len(p.X)-1], hi+2*d)
}

// windowReach is how far (in thermal thicknesses) beyond the oxidation
// zone the flame plot follows a pyrolysis zone.
const windowReach = 5

// clipRows cuts the bars to the window [lo, hi] (mm, the bars' unit) and
// says on the text where a cut bar really ends.
func clipRows(rows []BarRow, lo, hi float64) {
	for i := range rows {
		r := &rows[i]
		if r.To > hi {
			r.Text += fmt.Sprintf(", to %.3g mm", r.To)
			r.To = hi
		}
		if r.From < lo {
			r.Text += fmt.Sprintf(", from %.3g mm", r.From)
			r.From = lo
		}
		r.From, r.To = math.Min(r.From, hi), math.Max(r.To, lo)
	}
}

// plottedSpecies are the fuel species (consumed or not) and the pool species
// with the largest peak.
func plottedSpecies(z *flame.Zones) []string {
	var names []string
	for _, pz := range z.Pyrolysis {
		names = append(names, pz.Species)
	}
	names = append(names, z.Unconsumed...)
	sort.Strings(names)
	if len(z.PoolPeaks) > 0 {
		best := z.PoolPeaks[0]
		for _, pk := range z.PoolPeaks[1:] {
			if pk.MoleFraction > best.MoleFraction {
				best = pk
			}
		}
		names = append(names, best.Species)
	}
	return names
}

func speciesIndex(species []string, name string) int {
	for k, s := range species {
		if strings.EqualFold(s, name) {
			return k
		}
	}
	return -1
}

// SIPrefix returns the factor that brings v into [1, 1000) and its SI prefix.
func SIPrefix(v float64) (float64, string) {
	for _, p := range []struct {
		exp    float64
		prefix string
	}{{12, "T"}, {9, "G"}, {6, "M"}, {3, "k"}} {
		if math.Abs(v) >= math.Pow(10, p.exp) {
			return math.Pow(10, -p.exp), p.prefix
		}
	}
	return 1, ""
}
