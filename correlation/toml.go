package correlation

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"flame1d/internal/infile"
	"flame1d/internal/tomlpos"
)

// FileFormat identifies flame1d's correlation files.
const FileFormat = "flame1d flame-speed correlation, version 1"

// WriteTOML writes the correlation as TOML for other tools: the formula, the
// reference state, coefficients with standard errors, the validity ranges
// and the fit quality. note, when not empty, is written as a comment (the
// safety note).
func (c *Correlation) WriteTOML(w io.Writer, note string) error {
	var b strings.Builder
	fmt.Fprintf(&b, "# flame1d laminar flame-speed correlation, power-law form of Metghalchi & Keck (1982, Combust. Flame 48)\n")
	fmt.Fprintf(&b, "# %s\n", Form)
	fmt.Fprintf(&b, "# S_L, B_m, B_2 in m/s; T_u in K; P in Pa.\n")
	if note != "" {
		fmt.Fprintf(&b, "# %s\n", note)
	}
	fmt.Fprintf(&b, "format = %q\n", FileFormat)
	fmt.Fprintf(&b, "form = %q\n", Form)
	if c.Source != "" {
		fmt.Fprintf(&b, "source = %q\n", c.Source)
	}
	fmt.Fprintf(&b, "reference_temperature_K = %s\n", tomlFloat(c.T0))
	fmt.Fprintf(&b, "reference_pressure_Pa = %s\n", tomlFloat(c.P0))
	fmt.Fprintf(&b, "\n[coefficients]\n")
	for i := 0; i < NumCoef; i++ {
		fmt.Fprintf(&b, "%-7s = %-24s # %s\n", CoefNames[i], tomlFloat(c.Coef[i]), coefUnits[i])
	}
	fmt.Fprintf(&b, "\n[standard_errors]\n")
	for i := 0; i < NumCoef; i++ {
		fmt.Fprintf(&b, "%-7s = %s\n", CoefNames[i], tomlFloat(c.StdErr[i]))
	}
	var fixed []string
	for i := 0; i < NumCoef; i++ {
		if !c.Free[i] {
			fixed = append(fixed, strconv.Quote(CoefNames[i]))
		}
	}
	fmt.Fprintf(&b, "\n[fit]\n")
	fmt.Fprintf(&b, "# coefficients held at 0 because the data cannot determine them\n")
	fmt.Fprintf(&b, "not_fitted = [%s]\n", strings.Join(fixed, ", "))
	fmt.Fprintf(&b, "points = %d\n", c.Points)
	fmt.Fprintf(&b, "degrees_of_freedom = %d\n", c.DOF)
	fmt.Fprintf(&b, "rms_relative_error = %s\n", tomlFloat(c.RMSRelative))
	fmt.Fprintf(&b, "max_relative_error = %s\n", tomlFloat(c.MaxRelative))
	notes := make([]string, len(c.Notes))
	for i, n := range c.Notes {
		notes[i] = strconv.Quote(n)
	}
	fmt.Fprintf(&b, "notes = [%s]\n", strings.Join(notes, ", "))
	fmt.Fprintf(&b, "\n[validity]\n")
	fmt.Fprintf(&b, "equivalence_ratio = [%s, %s]\n", tomlFloat(c.Phi.Min), tomlFloat(c.Phi.Max))
	fmt.Fprintf(&b, "temperature_K = [%s, %s]\n", tomlFloat(c.T.Min), tomlFloat(c.T.Max))
	fmt.Fprintf(&b, "pressure_Pa = [%s, %s]\n", tomlFloat(c.P.Min), tomlFloat(c.P.Max))
	_, err := io.WriteString(w, b.String())
	return err
}

// tomlFloat renders a float at full precision as a TOML float (always with
// a decimal point or an exponent, so that it does not read as an integer).
func tomlFloat(v float64) string {
	s := strconv.FormatFloat(v, 'g', -1, 64)
	if !strings.ContainsAny(s, ".eE") {
		s += ".0"
	}
	return s
}

type tomlFile struct {
	Format       string             `toml:"format"`
	Form         string             `toml:"form"`
	Source       string             `toml:"source"`
	T0           float64            `toml:"reference_temperature_K"`
	P0           float64            `toml:"reference_pressure_Pa"`
	Coefficients map[string]float64 `toml:"coefficients"`
	StdErrors    map[string]float64 `toml:"standard_errors"`
	Fit          struct {
		NotFitted []string `toml:"not_fitted"`
		Points    int      `toml:"points"`
		DOF       int      `toml:"degrees_of_freedom"`
		RMS       float64  `toml:"rms_relative_error"`
		Max       float64  `toml:"max_relative_error"`
		Notes     []string `toml:"notes"`
	} `toml:"fit"`
	Validity struct {
		Phi []float64 `toml:"equivalence_ratio"`
		T   []float64 `toml:"temperature_K"`
		P   []float64 `toml:"pressure_Pa"`
	} `toml:"validity"`
}

// ReadTOMLFile reads a correlation written by WriteTOML.
func ReadTOMLFile(path string) (*Correlation, error) {
	src, err := infile.ReadFile(path, infile.Correlation)
	if err != nil {
		return nil, err
	}
	return ReadTOML(src, path)
}

// ReadTOML parses a correlation written by WriteTOML; file names the
// source in errors.
func ReadTOML(src []byte, file string) (*Correlation, error) {
	var f tomlFile
	md, err := tomlpos.Decode(src, file, &f)
	if err != nil {
		return nil, err
	}
	if und := md.Undecoded(); len(und) > 0 {
		return nil, fmt.Errorf("%s: unknown key %s", file, und[0])
	}
	if f.Format != FileFormat {
		return nil, fmt.Errorf("%s: format %q, expected %q", file, f.Format, FileFormat)
	}
	if f.Form != Form {
		return nil, fmt.Errorf("%s: form %q is not the one this flame1d evaluates (%s)", file, f.Form, Form)
	}
	c := &Correlation{T0: f.T0, P0: f.P0, Source: f.Source, Points: f.Fit.Points, DOF: f.Fit.DOF,
		RMSRelative: f.Fit.RMS, MaxRelative: f.Fit.Max, Notes: f.Fit.Notes}
	if !(c.T0 > 0 && c.P0 > 0) {
		return nil, fmt.Errorf("%s: reference_temperature_K and reference_pressure_Pa must be positive", file)
	}
	notFitted := map[string]bool{}
	for _, n := range f.Fit.NotFitted {
		notFitted[n] = true
	}
	known := map[string]bool{}
	for i, name := range CoefNames {
		known[name] = true
		v, ok := f.Coefficients[name]
		if !ok {
			return nil, fmt.Errorf("%s: [coefficients] lacks %s", file, name)
		}
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("%s: coefficient %s is not a finite number", file, name)
		}
		c.Coef[i] = v
		c.StdErr[i] = f.StdErrors[name]
		c.Free[i] = !notFitted[name]
	}
	for _, m := range []map[string]float64{f.Coefficients, f.StdErrors} {
		for k := range m {
			if !known[k] {
				return nil, fmt.Errorf("%s: unknown coefficient %s (known: %s)", file, k, strings.Join(CoefNames[:], ", "))
			}
		}
	}
	for _, r := range []struct {
		name string
		v    []float64
		dst  *Range
	}{{"equivalence_ratio", f.Validity.Phi, &c.Phi}, {"temperature_K", f.Validity.T, &c.T}, {"pressure_Pa", f.Validity.P, &c.P}} {
		if len(r.v) != 2 || !(r.v[0] <= r.v[1]) {
			return nil, fmt.Errorf("%s: [validity] %s must be [min, max]", file, r.name)
		}
		*r.dst = Range{r.v[0], r.v[1]}
	}
	return c, nil
}
