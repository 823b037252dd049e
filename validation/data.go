// Package validation scores a reaction mechanism against published
// laminar-flame-speed measurements: it solves the flame of every measured
// condition the mechanism can represent, by continuation along the
// equivalence ratio, and reports each prediction against the measured
// value and its scatter band, with RMS and worst deviations per fuel and
// overall (the `flame1d validate` scorecard; docs/validation.md).
//
// The measurements ship inside the program (data/*.toml, one file per fuel;
// their provenance is in data/README.md); users may add files of their own
// in the same format.
package validation

import (
	"embed"
	"fmt"
	"io/fs"
	"math"
	"os"
	"path"
	"sort"
	"strings"

	"flame1d/internal/tomlpos"
	"flame1d/units"
)

//go:embed data/*.toml
var bundled embed.FS

// Dataset is the measurements of one fuel in air.
type Dataset struct {
	File string // where it was read, for messages
	// Fuel is the short key (`--fuels`), e.g. "CH4"; Name the fuel in
	// words, e.g. "methane".
	Fuel, Name string
	// Species lists the mechanism species names that are this fuel,
	// matched without regard to letter case; Formula is its elemental
	// formula, checked against the mechanism species found.
	Species []string
	Formula string
	Sources map[string]Source
	Points  []Point
}

// Source is one publication behind measured points.
type Source struct {
	ID       string
	Citation string // authors, title, journal, volume, year, pages
	Where    string // figure or table, and the method
	// FromMemory says the values were recalled from the publication, not
	// transcribed from it.
	FromMemory bool
}

// Point is one measured laminar flame speed of the fuel in air.
type Point struct {
	Fuel string
	Phi  float64 // equivalence ratio
	T    float64 // unburned temperature, K
	P    float64 // pressure, Pa
	// Speed is the measured laminar flame speed and [Low, High] its
	// scatter band (the spread between the cited measurements), m/s.
	Speed, Low, High float64
	Sources          []string
	Note             string
	Line             int // line in File
}

// Elevated reports whether the point lies above 1 atm or 298 K (by more
// than 2 K or 1 kPa).
func (p Point) Elevated() bool { return p.T > 300 || p.P > 101325+1000 }

// rawDataset is the file layout (docs/validation.md).
type rawDataset struct {
	Fuel    string               `toml:"fuel"`
	Name    string               `toml:"name"`
	Species []string             `toml:"species"`
	Formula string               `toml:"formula"`
	Sources map[string]rawSource `toml:"sources"`
	Series  []struct {
		Temperature string   `toml:"temperature"`
		Pressure    string   `toml:"pressure"`
		Sources     []string `toml:"sources"`
		Points      []struct {
			Phi      float64    `toml:"phi"`
			SpeedCmS float64    `toml:"speed_cm_s"`
			BandCmS  [2]float64 `toml:"band_cm_s"`
			Sources  []string   `toml:"sources"`
			Note     string     `toml:"note"`
		} `toml:"points"`
	} `toml:"series"`
}

type rawSource struct {
	Citation   string `toml:"citation"`
	Where      string `toml:"where"`
	FromMemory bool   `toml:"from_memory"`
}

// Bundled returns the measurements that ship with flame1d, sorted by fuel.
func Bundled() ([]*Dataset, error) {
	entries, err := fs.ReadDir(bundled, "data")
	if err != nil {
		return nil, fmt.Errorf("bundled validation data: %w", err)
	}
	var sets []*Dataset
	for _, e := range entries {
		if e.IsDir() || path.Ext(e.Name()) != ".toml" {
			continue
		}
		name := path.Join("data", e.Name())
		src, err := bundled.ReadFile(name)
		if err != nil {
			return nil, fmt.Errorf("bundled validation data: %w", err)
		}
		d, err := Parse(src, "validation/"+name)
		if err != nil {
			return nil, err
		}
		sets = append(sets, d)
	}
	sort.Slice(sets, func(i, j int) bool { return sets[i].Fuel < sets[j].Fuel })
	return sets, nil
}

// ReadFile reads a measurement file of the bundled format.
func ReadFile(file string) (*Dataset, error) {
	src, err := os.ReadFile(file)
	if err != nil {
		return nil, fmt.Errorf("validation data: %w", err)
	}
	return Parse(src, file)
}

// Parse reads measurement-file text; file names it in messages.
func Parse(src []byte, file string) (*Dataset, error) {
	var r rawDataset
	md, err := tomlpos.Decode(src, file, &r)
	if err != nil {
		return nil, err
	}
	if und := md.Undecoded(); len(und) > 0 {
		return nil, fmt.Errorf("%s:%d: unknown key %s (check the spelling; docs/validation.md lists the keys)", file, tomlpos.Line(src, und[0]), und[0])
	}
	at := func(key ...string) string { return fmt.Sprintf("%s:%d", file, tomlpos.Line(src, key)) }
	d := &Dataset{File: file, Fuel: r.Fuel, Name: r.Name, Species: r.Species, Formula: r.Formula, Sources: map[string]Source{}}
	switch {
	case d.Fuel == "":
		return nil, fmt.Errorf("%s: fuel: missing (the short name used with --fuels, e.g. fuel = \"CH4\")", file)
	case len(d.Species) == 0:
		return nil, fmt.Errorf("%s: species: missing (the mechanism species names of the fuel, e.g. species = [\"CH4\"])", at("species"))
	case d.Formula == "":
		return nil, fmt.Errorf("%s: formula: missing (e.g. formula = \"CH4\")", file)
	}
	if d.Name == "" {
		d.Name = d.Fuel
	}
	for id, s := range r.Sources {
		if strings.TrimSpace(s.Citation) == "" {
			return nil, fmt.Errorf("%s: sources.%s.citation: missing (authors, title, journal, volume, year, pages)", at("sources", id), id)
		}
		d.Sources[id] = Source{ID: id, Citation: s.Citation, Where: s.Where, FromMemory: s.FromMemory}
	}
	for i, s := range r.Series {
		key := fmt.Sprintf("series[%d]", i+1)
		T, err := units.Parse(s.Temperature, units.Temperature)
		if err != nil || !(T > 200 && T < 1500) {
			return nil, fmt.Errorf("%s: %s.temperature: %q is not an unburned temperature in 200-1500 K", file, key, s.Temperature)
		}
		P, err := units.Parse(s.Pressure, units.Pressure)
		if err != nil || !(P >= 1e3 && P <= 1e8) {
			return nil, fmt.Errorf("%s: %s.pressure: %q is not a pressure in 1 kPa - 100 MPa", file, key, s.Pressure)
		}
		for j, q := range s.Points {
			pk := fmt.Sprintf("%s.points[%d] (phi = %g)", key, j+1, q.Phi)
			lo, hi := q.BandCmS[0]/100, q.BandCmS[1]/100
			p := Point{Fuel: d.Fuel, Phi: q.Phi, T: T, P: P, Speed: q.SpeedCmS / 100, Low: lo, High: hi, Sources: q.Sources, Note: q.Note}
			if len(p.Sources) == 0 {
				p.Sources = s.Sources
			}
			p.Line = phiLine(src, q.Phi, seriesLine(src, i))
			switch {
			case !(p.Phi > 0 && p.Phi < 10):
				return nil, fmt.Errorf("%s: %s: phi must lie in (0, 10)", file, pk)
			case !(p.Speed > 0) || math.IsInf(p.Speed, 0):
				return nil, fmt.Errorf("%s: %s: speed_cm_s must be a positive flame speed in cm/s", file, pk)
			case !(lo > 0 && lo <= p.Speed && p.Speed <= hi) || math.IsInf(hi, 0):
				return nil, fmt.Errorf("%s: %s: band_cm_s = [%g, %g] must be [low, high] around speed_cm_s = %g", file, pk, q.BandCmS[0], q.BandCmS[1], q.SpeedCmS)
			case len(p.Sources) == 0:
				return nil, fmt.Errorf("%s: %s: no sources (give sources = [...] on the series or the point)", file, pk)
			}
			for _, id := range p.Sources {
				if _, ok := d.Sources[id]; !ok {
					return nil, fmt.Errorf("%s: %s: source %q has no [sources.%s] table", file, pk, id, id)
				}
			}
			d.Points = append(d.Points, p)
		}
	}
	if len(d.Points) == 0 {
		return nil, fmt.Errorf("%s: no measured points (give [[series]] tables with points = [...])", file)
	}
	return d, nil
}

// seriesLine is the line of the i-th (from 0) [[series]] header; 0 when
// not found.
func seriesLine(src []byte, i int) int {
	for n, l := range strings.Split(string(src), "\n") {
		if strings.HasPrefix(strings.TrimSpace(l), "[[series]]") {
			if i == 0 {
				return n + 1
			}
			i--
		}
	}
	return 0
}

// phiLine finds the line of a point in its inline array: the first line
// after from that holds "phi = <value>"; 0 when not found.
func phiLine(src []byte, phi float64, from int) int {
	lines := strings.Split(string(src), "\n")
	for i := max(0, from-1); i < len(lines); i++ {
		l := lines[i]
		k := strings.Index(l, "phi")
		if k < 0 {
			continue
		}
		rest := strings.TrimLeft(l[k+3:], " =")
		end := strings.IndexAny(rest, " ,}")
		if end < 0 {
			end = len(rest)
		}
		var v float64
		if _, err := fmt.Sscan(rest[:end], &v); err == nil && v == phi {
			return i + 1
		}
	}
	return 0
}

// SelectFuels keeps the datasets named (by fuel key or name, any letter
// case); nil or empty names keep all. An unknown name is an error listing
// the known ones.
func SelectFuels(sets []*Dataset, names []string) ([]*Dataset, error) {
	if len(names) == 0 {
		return sets, nil
	}
	var out []*Dataset
	for _, n := range names {
		n = strings.TrimSpace(n)
		found := false
		for _, d := range sets {
			if strings.EqualFold(d.Fuel, n) || strings.EqualFold(d.Name, n) {
				out = append(out, d)
				found = true
				break
			}
		}
		if !found {
			var known []string
			for _, d := range sets {
				known = append(known, d.Fuel)
			}
			return nil, fmt.Errorf("no measurements of fuel %q (known: %s)", n, strings.Join(known, ", "))
		}
	}
	return out, nil
}

// CheckDistinct refuses two datasets of the same fuel key (their points
// would merge into one score).
func CheckDistinct(sets []*Dataset) error {
	seen := map[string]string{}
	for _, d := range sets {
		k := strings.ToUpper(d.Fuel)
		if f, ok := seen[k]; ok {
			return fmt.Errorf("fuel %s is measured in both %s and %s: give each fuel once (merge the points into one file)", d.Fuel, f, d.File)
		}
		seen[k] = d.File
	}
	return nil
}
