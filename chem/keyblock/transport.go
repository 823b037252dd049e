package keyblock

import (
	"io"
	"math"
	"strings"

	"flame1d/chem"
)

// Unit factors for the transport file (to SI).
const (
	angstrom = 1e-10 // m
	// debye is 1e-21/c C m with c = 299792458 m/s (exact by definition of
	// the unit; CODATA 2018 gives 3.33564095e-30 C m).
	debye = 1e-21 / 299792458.0
)

// ReadTransport reads a transport file: one line per species with, separated
// by blanks or TABs, the name, the geometry (0 atom, 1 linear, 2 nonlinear),
// the Lennard-Jones well depth epsilon/k_B [K] and diameter sigma [Å], the
// dipole moment [debye], the polarizability [Å^3] and the rotational
// relaxation number at 298 K. "!" starts a comment. The values are returned
// in SI units keyed by the name as written. A name repeated with different
// numbers keeps its first line, with a warning.
func ReadTransport(r io.Reader, file string) (map[string]chem.TransportParams, []chem.Problem, error) {
	lines, err := readLines(r, file)
	if err != nil {
		return nil, nil, err
	}
	var p problemList
	out := map[string]chem.TransportParams{}
	for name, e := range parseTransport(lines, file, nil, &p) {
		out[name] = e.params
	}
	probs, verr := p.result()
	return out, probs, verr
}

type transportEntry struct {
	params chem.TransportParams
	line   int
}

// parseTransport reads transport lines. When wanted is non-nil, defects in
// lines for species it rejects are only warnings (generic databases carry
// many species a mechanism does not use). Entries are keyed by the name as
// written.
func parseTransport(lines []srcLine, file string, wanted func(string) bool, p *problemList) map[string]transportEntry {
	out := map[string]transportEntry{}
	first := map[string]transportEntry{} // upper-case name -> first entry
	for _, ln := range lines {
		s := stripComment(ln.text)
		if s == "" {
			continue
		}
		pos := chem.Position{File: file, Line: ln.num}
		f := strings.Fields(s)
		if w := strings.ToUpper(f[0]); w == "END" || w == "TRANSPORT" || w == "TRAN" {
			continue
		}
		name := f[0]
		report := p.errorf
		if wanted != nil && !wanted(name) {
			report = p.warnf
		}
		if len(f) < 7 {
			report(pos, "transport line for %q has %d fields, expected 7 (name, geometry, eps/k [K], sigma [Å], dipole [debye], polarizability [Å^3], Zrot)", name, len(f))
			continue
		}
		if len(f) > 7 {
			p.warnf(pos, "transport line for %q: %d extra field(s) after the 7th ignored", name, len(f)-7)
		}
		var v [6]float64
		bad := false
		labels := [6]string{"geometry", "eps/k", "sigma", "dipole", "polarizability", "Zrot"}
		for j := 0; j < 6; j++ {
			x, err := parseNumber(f[j+1])
			if err != nil {
				report(pos, "transport line for %q: bad %s %q", name, labels[j], f[j+1])
				bad = true
				break
			}
			v[j] = x
		}
		if bad {
			continue
		}
		if v[0] != 0 && v[0] != 1 && v[0] != 2 {
			report(pos, "transport line for %q: geometry %q must be 0 (atom), 1 (linear) or 2 (nonlinear)", name, f[1])
			continue
		}
		if !(v[1] > 0 && v[2] > 0) || v[3] < 0 || v[4] < 0 || v[5] < 0 {
			report(pos, "transport line for %q: eps/k and sigma must be positive, dipole, polarizability and Zrot non-negative", name)
			continue
		}
		tp := chem.TransportParams{
			Geometry:       chem.Geometry(int(v[0])),
			WellDepth:      v[1],
			Diameter:       v[2] * angstrom,
			Dipole:         v[3] * debye,
			Polarizability: v[4] * angstrom * angstrom * angstrom,
			RotRelaxation:  v[5],
		}
		key := strings.ToUpper(name)
		if prev, dup := first[key]; dup {
			if !sameTransport(prev.params, tp) {
				p.warnf(pos, "species %q repeats in the transport file with different values; the first line (%d) is used", name, prev.line)
			}
			continue
		}
		first[key] = transportEntry{tp, ln.num}
		out[name] = first[key]
	}
	return out
}

func sameTransport(a, b chem.TransportParams) bool {
	eq := func(x, y float64) bool { return math.Abs(x-y) <= 1e-12*math.Max(math.Abs(x), math.Abs(y)) }
	return a.Geometry == b.Geometry && eq(a.WellDepth, b.WellDepth) && eq(a.Diameter, b.Diameter) &&
		eq(a.Dipole, b.Dipole) && eq(a.Polarizability, b.Polarizability) && eq(a.RotRelaxation, b.RotRelaxation)
}
