package flame

import (
	"math"
	"testing"
)

// Zone positions on a synthetic profile whose crossings are known in closed
// form: fuel fraction f(x) = 1/(1+exp((x-x0)/d)) crosses 0.95 at
// x0 - d ln 19 and 0.05 at x0 + d ln 19; the residence time through the zone
// at constant velocity u is its width over u.
func TestZonesOnClosedFormProfile(t *testing.T) {
	const n, x0, d, u = 4001, 0.01, 2e-4, 0.5
	p := &Profile{Species: []string{"FUEL", "OH", "H2"}}
	for j := 0; j < n; j++ {
		x := 0.02 * float64(j) / float64(n-1)
		f := 1 / (1 + math.Exp((x-x0)/d))
		p.X = append(p.X, x)
		p.T = append(p.T, 300+1700*(1-f))
		p.Velocity = append(p.Velocity, u)
		p.HeatRelease = append(p.HeatRelease, math.Exp(-math.Pow((x-0.0105)/1e-4, 2)))
		p.MassFractions = append(p.MassFractions, []float64{0.05 * f, 0, 0})
		p.MoleFractions = append(p.MoleFractions, []float64{0.1 * f, 0.01 * math.Exp(-math.Pow((x-0.011)/2e-4, 2)), 0.02 * f * (1 - f)})
	}
	p.ThermalThick = 1e-3
	z, err := p.Zones([]string{"FUEL"}, []float64{0.05, 0, 0})
	if err != nil {
		t.Fatal(err)
	}
	pz := z.Pyrolysis[0]
	h := 0.02 / (n - 1)
	if want := x0 - d*math.Log(19); math.Abs(pz.StartX-want) > h*h/d {
		t.Errorf("pyrolysis start %.6g m, want %.6g", pz.StartX, want)
	}
	if want := x0 + d*math.Log(19); math.Abs(pz.EndX-want) > h*h/d {
		t.Errorf("pyrolysis end %.6g m, want %.6g", pz.EndX, want)
	}
	if want := (pz.EndX - pz.StartX) / u; math.Abs(pz.ResidenceTime-want) > 1e-12 {
		t.Errorf("residence time %.6g s, want %.6g", pz.ResidenceTime, want)
	}
	// Gaussian heat release exp(-((x-xp)/w)^2) is above half its peak over
	// xp ± w sqrt(ln 2).
	half := 1e-4 * math.Sqrt(math.Ln2)
	if math.Abs(z.Oxidation.StartX-(0.0105-half)) > 2*h || math.Abs(z.Oxidation.EndX-(0.0105+half)) > 2*h {
		t.Errorf("oxidation zone %.6g-%.6g m, want %.6g-%.6g", z.Oxidation.StartX, z.Oxidation.EndX, 0.0105-half, 0.0105+half)
	}
	// The oxidation window's temperatures are the profile's at its ends:
	// T = 300 + 1700 (1 - f(x)).
	for _, c := range []struct{ x, T float64 }{{z.Oxidation.StartX, z.Oxidation.StartT}, {z.Oxidation.EndX, z.Oxidation.EndT}} {
		if want := 300 + 1700*(1-1/(1+math.Exp((c.x-x0)/d))); math.Abs(c.T-want) > 1e-9 {
			t.Errorf("oxidation window T %.6g K at %.6g m, want %.6g", c.T, c.x, want)
		}
	}
	if math.Abs(z.RadicalPeaks[0].X-0.011) > h {
		t.Errorf("OH peak at %.6g m, want 0.011", z.RadicalPeaks[0].X)
	}
	// H2 = 0.02 f(1-f) peaks at f = 1/2, i.e. x0, with value 0.005.
	if len(z.PoolPeaks) != 1 || math.Abs(z.PoolPeaks[0].X-x0) > h || math.Abs(z.PoolPeaks[0].MoleFraction-0.005) > 1e-6 {
		t.Errorf("pool peaks %+v, want H2 0.005 at %g", z.PoolPeaks, x0)
	}
	if want := 0.0105 - pz.EndX; math.Abs(z.SeparationM-want) > 1e-15 || math.Abs(z.SeparationThickness-want/1e-3) > 1e-12 {
		t.Errorf("separation %.6g m (%.4g thicknesses), want %.6g", z.SeparationM, z.SeparationThickness, want)
	}
	if _, err := p.Zones([]string{"NOPE"}, []float64{0, 0, 0}); err == nil {
		t.Error("unknown fuel species accepted")
	}
}
