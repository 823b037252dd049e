package output

import (
	"fmt"
	"image/color"

	"gonum.org/v1/plot/vg"

	"flame1d/flame"
)

// Zone colours, shared by the zone map and the flame plot (Okabe & Ito
// 2008 colour-blind-safe set: sky blue and vermillion).
var (
	PyrolysisColor color.Color = color.RGBA{86, 180, 233, 255}
	OxidationColor color.Color = color.RGBA{213, 94, 0, 255}
)

// zoneKeys explain the bar colours and say how each zone is defined.
var zoneKeys = []BarKey{
	{Name: "pyrolysis (fuel 95% → 5% left)", Color: PyrolysisColor},
	{Name: "oxidation (heat release > ½ peak)", Color: OxidationColor},
}

// ZoneSet is one flame's zones under the label of its row group (e.g. the
// fuel name, or the fuel and equivalence ratio).
type ZoneSet struct {
	Label string
	Zones *flame.Zones
	// ThermalThickness (m), when positive, cuts bars that reach more than
	// windowReach thicknesses beyond the oxidation zone, with the true end
	// written on the bar, so one long zone does not squeeze the others.
	ThermalThickness float64
}

// ZonePanel is one panel of a zone map: a y-axis title (e.g. "φ = 1") and
// the flames it shows, top to bottom.
type ZonePanel struct {
	Title  string
	Flames []ZoneSet
}

// ZoneMap writes a zone map to path: for each flame its pyrolysis zones
// (one bar per fuel species) and its oxidation zone as horizontal bars on
// one axis, in mm from the flame's heat-release peak (x = 0 for every
// flame), with the temperature window written beside each bar. Panels are
// stacked on the shared axis. A zero c.Height is sized to the number of
// bars; c.XLabel defaults to the distance from the peak.
func ZoneMap(path string, c Chart, panels []ZonePanel) error {
	var ps []Panel
	rows := 0
	for _, zp := range panels {
		pn := Panel{YLabel: zp.Title, Keys: zoneKeys, Rules: []float64{0}}
		for _, f := range zp.Flames {
			if f.Zones == nil {
				return fmt.Errorf("zone map %s: %s has no zone diagnostics", path, f.Label)
			}
			ox := f.Zones.Oxidation
			rows := ZoneRows(f.Label, f.Zones, ox.PeakX)
			if d := f.ThermalThickness; d > 0 {
				clipRows(rows, 1e3*(ox.StartX-ox.PeakX-windowReach*d), 1e3*(ox.EndX-ox.PeakX+windowReach*d))
			}
			pn.Rows = append(pn.Rows, rows...)
		}
		if len(pn.Rows) == 0 {
			continue
		}
		if len(ps) > 0 {
			pn.Keys = nil // one legend for the figure
		}
		pn.Weight = float64(len(pn.Rows)) + 1.5
		rows += len(pn.Rows)
		ps = append(ps, pn)
	}
	if len(ps) == 0 {
		return fmt.Errorf("zone map %s: no flames", path)
	}
	if c.XLabel == "" {
		c.XLabel = "distance from the heat-release peak [mm]"
	}
	if c.Height == 0 {
		c.Height = 4*vg.Centimeter + vg.Length(rows+2*len(ps))*0.55*vg.Centimeter
	}
	return StackedPanels(path, c, ps)
}

// ZoneRows lays one flame's zones out as bar rows in mm from x0 (m): one row
// per fuel species' pyrolysis zone (or a note where the species is not
// consumed in the domain), then the oxidation zone. The first row carries
// label.
func ZoneRows(label string, z *flame.Zones, x0 float64) []BarRow {
	var rows []BarRow
	mm := func(x float64) float64 { return 1e3 * (x - x0) }
	for _, p := range z.Pyrolysis {
		rows = append(rows, BarRow{From: mm(p.StartX), To: mm(p.EndX), Color: PyrolysisColor,
			Text: fmt.Sprintf("%s %s", p.Species, temperatureWindow(p.StartT, p.EndT))})
	}
	for _, s := range z.Unconsumed {
		at := mm(z.Oxidation.PeakX)
		rows = append(rows, BarRow{From: at, To: at, Text: s + " not consumed in the domain"})
	}
	ox := z.Oxidation
	rows = append(rows, BarRow{From: mm(ox.StartX), To: mm(ox.EndX), Color: OxidationColor,
		Text: "oxidation " + temperatureWindow(ox.StartT, ox.EndT)})
	rows[0].Label = label
	return rows
}

func temperatureWindow(from, to float64) string {
	return fmt.Sprintf("%.0f–%.0f K", from, to)
}
