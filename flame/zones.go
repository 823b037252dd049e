package flame

import (
	"fmt"
	"math"
	"strings"
)

// Zones locates where a flame cracks its fuel and where it oxidises it.
type Zones struct {
	// Pyrolysis has one entry per fuel species: the zone in which its mass
	// fraction falls from 95% to 5% of its unburned value.
	Pyrolysis []PyrolysisZone `json:"pyrolysis"`
	// Unconsumed lists fuel species that do not fall to 5% of their
	// unburned amount inside the domain (e.g. H2 of a rich pool).
	Unconsumed []string `json:"unconsumed_fuel_species,omitempty"`
	// PoolPeaks are the maxima of the main cracking-pool species (light
	// hydrocarbons and H2 that are not themselves fuel species) whose peak
	// mole fraction exceeds PoolPeakThreshold.
	PoolPeaks []SpeciesPeak `json:"pool_peaks"`
	Oxidation OxidationZone `json:"oxidation"`
	// RadicalPeaks holds the OH and CH maxima where the mechanism has them.
	RadicalPeaks []SpeciesPeak `json:"radical_peaks"`
	// Separation is the distance from the end of pyrolysis (the last fuel
	// species to reach 5%) to the heat-release peak, in m and in thermal
	// thicknesses; negative when the fuel outlives the heat-release peak.
	SeparationM         float64 `json:"pyrolysis_to_heat_release_m"`
	SeparationThickness float64 `json:"pyrolysis_to_heat_release_thicknesses"`
}

// PyrolysisZone is where one fuel species is consumed.
type PyrolysisZone struct {
	Species       string  `json:"species"`
	StartX        float64 `json:"start_m"` // 95% of the unburned amount left
	EndX          float64 `json:"end_m"`   // 5% left
	StartT        float64 `json:"start_T_K"`
	EndT          float64 `json:"end_T_K"`
	ResidenceTime float64 `json:"residence_time_s"` // integral of dx/u across the zone
}

// SpeciesPeak is the maximum of one species' mole fraction.
type SpeciesPeak struct {
	Species      string  `json:"species"`
	X            float64 `json:"position_m"`
	T            float64 `json:"T_K"`
	MoleFraction float64 `json:"peak_mole_fraction"`
}

// OxidationZone is where the heat-release rate exceeds half its peak.
type OxidationZone struct {
	StartX    float64 `json:"start_m"`
	EndX      float64 `json:"end_m"`
	StartT    float64 `json:"start_T_K"`
	EndT      float64 `json:"end_T_K"`
	PeakX     float64 `json:"peak_m"`
	PeakT     float64 `json:"peak_T_K"`
	PeakValue float64 `json:"peak_heat_release_W_m3"`
}

// PoolPeakThreshold is the smallest peak mole fraction reported for a pool
// species (100 ppm).
const PoolPeakThreshold = 1e-4

// poolCandidates are the light species a cracked fuel pool is made of
// (upper-case names; mechanisms spell them differently).
var poolCandidates = []string{"H2", "CH4", "C2H2", "C2H4", "C2H6", "C3H6", "C3H8", "C4H6",
	"C4H8", "C4H8-1", "C4H81", "C4H8-2", "IC4H8", "C6H6", "A1"}

// Zones computes the zone diagnostics of a profile. fuelSpecies names the
// species that make up the fuel as it enters (the neat fuel, the surrogate
// components, or a pseudo-species); inletY are the unburned mass fractions.
func (p *Profile) Zones(fuelSpecies []string, inletY []float64) (*Zones, error) {
	idx := map[string]int{}
	for k, s := range p.Species {
		idx[strings.ToUpper(s)] = k
	}
	z := &Zones{}
	n := len(p.X)
	isFuel := map[int]bool{}
	lastEnd := math.Inf(-1)
	for _, name := range fuelSpecies {
		k, ok := idx[strings.ToUpper(name)]
		if !ok {
			return nil, fmt.Errorf("zones: fuel species %q not in the mechanism", name)
		}
		isFuel[k] = true
		y0 := inletY[k]
		if !(y0 > 0) {
			continue
		}
		frac := make([]float64, n)
		for j := range frac {
			frac[j] = p.MassFractions[j][k] / y0
		}
		x95, ok1 := p.firstCrossing(frac, 0.95)
		x05, ok2 := p.firstCrossing(frac, 0.05)
		if !ok1 || !ok2 {
			z.Unconsumed = append(z.Unconsumed, name)
			continue
		}
		zn := PyrolysisZone{Species: name, StartX: x95, EndX: x05,
			StartT: p.interp(p.T, x95), EndT: p.interp(p.T, x05), ResidenceTime: p.residenceTime(x95, x05)}
		z.Pyrolysis = append(z.Pyrolysis, zn)
		lastEnd = math.Max(lastEnd, x05)
	}
	peakJ := 0
	for j := range p.HeatRelease {
		if p.HeatRelease[j] > p.HeatRelease[peakJ] {
			peakJ = j
		}
	}
	half := 0.5 * p.HeatRelease[peakJ]
	ox := OxidationZone{PeakX: p.X[peakJ], PeakT: p.T[peakJ], PeakValue: p.HeatRelease[peakJ], StartX: p.X[peakJ], EndX: p.X[peakJ]}
	for j := peakJ; j > 0 && p.HeatRelease[j-1] >= half; j-- {
		ox.StartX = p.X[j-1]
	}
	for j := peakJ; j+1 < n && p.HeatRelease[j+1] >= half; j++ {
		ox.EndX = p.X[j+1]
	}
	ox.StartT, ox.EndT = p.interp(p.T, ox.StartX), p.interp(p.T, ox.EndX)
	z.Oxidation = ox
	for _, name := range poolCandidates {
		k, ok := idx[name]
		if !ok || isFuel[k] {
			continue
		}
		pk := p.peak(k)
		if pk.MoleFraction >= PoolPeakThreshold {
			z.PoolPeaks = append(z.PoolPeaks, pk)
		}
	}
	for _, name := range []string{"OH", "CH"} {
		if k, ok := idx[name]; ok {
			z.RadicalPeaks = append(z.RadicalPeaks, p.peak(k))
		}
	}
	if len(z.Pyrolysis) > 0 {
		z.SeparationM = ox.PeakX - lastEnd
		if p.ThermalThick > 0 {
			z.SeparationThickness = z.SeparationM / p.ThermalThick
		}
	}
	return z, nil
}

func (p *Profile) peak(k int) SpeciesPeak {
	best := 0
	for j := range p.X {
		if p.MoleFractions[j][k] > p.MoleFractions[best][k] {
			best = j
		}
	}
	return SpeciesPeak{Species: p.Species[k], X: p.X[best], T: p.T[best], MoleFraction: p.MoleFractions[best][k]}
}

// firstCrossing is the first position where v falls below level, by linear
// interpolation between grid points.
func (p *Profile) firstCrossing(v []float64, level float64) (float64, bool) {
	if v[0] < level {
		return p.X[0], true
	}
	for j := 0; j+1 < len(v); j++ {
		if v[j] >= level && v[j+1] < level {
			f := (v[j] - level) / (v[j] - v[j+1])
			return p.X[j] + f*(p.X[j+1]-p.X[j]), true
		}
	}
	return 0, false
}

// interp evaluates a column at position x by linear interpolation.
func (p *Profile) interp(col []float64, x float64) float64 {
	n := len(p.X)
	if x <= p.X[0] {
		return col[0]
	}
	for j := 0; j+1 < n; j++ {
		if x <= p.X[j+1] {
			f := (x - p.X[j]) / (p.X[j+1] - p.X[j])
			return col[j] + f*(col[j+1]-col[j])
		}
	}
	return col[n-1]
}

// residenceTime integrates dx/u from a to b (trapezoid rule on the grid,
// with the interpolated end values).
func (p *Profile) residenceTime(a, b float64) float64 {
	if b <= a {
		return 0
	}
	xs := []float64{a}
	for _, x := range p.X {
		if x > a && x < b {
			xs = append(xs, x)
		}
	}
	xs = append(xs, b)
	t := 0.0
	for i := 0; i+1 < len(xs); i++ {
		u0, u1 := p.interp(p.Velocity, xs[i]), p.interp(p.Velocity, xs[i+1])
		t += 0.5 * (1/u0 + 1/u1) * (xs[i+1] - xs[i])
	}
	return t
}
