package validation

import (
	"strings"
	"testing"
)

// The bundled measurements cover what issue 13 asks: H2, CH4, C2H4, C2H6,
// C3H6, C3H8 and n-heptane in air at 298 K and 1 atm over phi 0.7-1.5, at
// least 60 points, at least 10 above 1 atm or 298 K; every point cites a
// publication, and every recalled source says so.
func TestBundledCoverage(t *testing.T) {
	sets, err := Bundled()
	if err != nil {
		t.Fatal(err)
	}
	points, elevated := 0, 0
	byFuel := map[string]*Dataset{}
	for _, d := range sets {
		byFuel[d.Fuel] = d
		for _, p := range d.Points {
			points++
			if p.Elevated() {
				elevated++
			}
			if p.Low > p.Speed || p.Speed > p.High {
				t.Errorf("%s:%d: band [%g, %g] does not hold %g", d.File, p.Line, p.Low, p.High, p.Speed)
			}
			if p.Line == 0 {
				t.Errorf("%s: point phi %g has no line number", d.File, p.Phi)
			}
		}
		for id, s := range d.Sources {
			if !strings.Contains(s.Citation, "(") || s.Where == "" {
				t.Errorf("%s: source %s lacks a year in parentheses or the figure/table it comes from", d.File, id)
			}
			if !s.FromMemory {
				t.Errorf("%s: source %s: every bundled value was recalled, so from_memory must be true until checked against the paper", d.File, id)
			}
		}
	}
	if points < 60 || elevated < 10 {
		t.Errorf("%d points, %d at elevated T or P; want at least 60 and 10", points, elevated)
	}
	for _, f := range []string{"H2", "CH4", "C2H4", "C2H6", "C3H6", "C3H8", "NC7H16"} {
		d := byFuel[f]
		if d == nil {
			t.Errorf("no measurements of %s", f)
			continue
		}
		lo, hi := 10.0, 0.0
		for _, p := range d.Points {
			if !p.Elevated() {
				lo, hi = min(lo, p.Phi), max(hi, p.Phi)
			}
		}
		if lo > 0.7 || hi < 1.4 {
			t.Errorf("%s at 298 K, 1 atm covers phi %g-%g; want 0.7 to at least 1.4", f, lo, hi)
		}
	}
}

// Bad files are refused with the file, the line or key, and what to do.
func TestParseErrors(t *testing.T) {
	const head = "fuel = \"CH4\"\nspecies = [\"CH4\"]\nformula = \"CH4\"\n[sources.a]\ncitation = \"A. Author, J. Comb. 1 (2000) 1\"\nwhere = \"Fig. 1\"\n"
	const series = "[[series]]\ntemperature = \"298 K\"\npressure = \"1 atm\"\nsources = [\"a\"]\n"
	for _, tc := range []struct{ name, src, want string }{
		{"band not around value", head + series + "points = [\n  { phi = 1.0, speed_cm_s = 36, band_cm_s = [37, 38] },\n]\n", "band_cm_s = [37, 38] must be [low, high] around speed_cm_s = 36"},
		{"unknown source", head + "[[series]]\ntemperature = \"298 K\"\npressure = \"1 atm\"\nsources = [\"b\"]\npoints = [ { phi = 1.0, speed_cm_s = 36, band_cm_s = [35, 37] } ]\n", `source "b" has no [sources.b] table`},
		{"unknown key", head + series + "points = [ { phi = 1.0, speed_cm_s = 36, band_cm_s = [35, 37] } ]\nspeed = 3\n", "x.toml:12: unknown key"},
		{"bad temperature", head + "[[series]]\ntemperature = \"298 kelvin\"\npressure = \"1 atm\"\nsources = [\"a\"]\npoints = []\n", `series[1].temperature: "298 kelvin"`},
		{"no points", head, "no measured points"},
		{"no citation", "fuel = \"CH4\"\nspecies = [\"CH4\"]\nformula = \"CH4\"\n[sources.a]\nwhere = \"Fig. 1\"\n", "x.toml:4: sources.a.citation: missing"},
	} {
		_, err := Parse([]byte(tc.src), "x.toml")
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want one containing %q", tc.name, err, tc.want)
		}
	}
	good := head + series + "points = [\n  { phi = 0.8, speed_cm_s = 26, band_cm_s = [25, 28] },\n  { phi = 1.0, speed_cm_s = 36, band_cm_s = [35, 37], note = \"n\" },\n]\n"
	d, err := Parse([]byte(good), "x.toml")
	if err != nil {
		t.Fatal(err)
	}
	if p := d.Points[1]; p.Phi != 1 || p.Speed != 0.36 || p.Low != 0.35 || p.High != 0.37 || p.T != 298 || p.P != 101325 || p.Line != 13 || p.Note != "n" {
		t.Errorf("parsed point %+v", p)
	}
	if _, err := SelectFuels([]*Dataset{d}, []string{"propane"}); err == nil || !strings.Contains(err.Error(), "known: CH4") {
		t.Errorf("unknown fuel: %v", err)
	}
	if err := CheckDistinct([]*Dataset{d, d}); err == nil {
		t.Error("two datasets of one fuel accepted")
	}
}
