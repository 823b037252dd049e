package correlation

import (
	"bytes"
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// propane is the Metghalchi & Keck (1982) propane/air correlation as
// tabulated by Turns ("An Introduction to Combustion", 3rd ed., 2012,
// Table 8.3 and eqs. 8.33-8.34): B_m = 34.22 cm/s, B_2 = -138.65 cm/s,
// phi_m = 1.08, alpha = 2.18 - 0.8 (phi - 1), beta = -0.16 + 0.22 (phi - 1)
// (values from memory).
func propane() *Correlation {
	c := &Correlation{T0: DefaultT0, P0: DefaultP0}
	c.Coef = [NumCoef]float64{0.3422, -1.3865, 1.08, 2.18, -0.8, -0.16, 0.22}
	for i := range c.Free {
		c.Free[i] = true
	}
	c.Phi, c.T, c.P = Range{0.8, 1.5}, Range{298, 700}, Range{0.4e5, 50e5}
	return c
}

// grid samples the correlation over phi 0.8-1.5, T 298-650 K and P 1-20
// atm; noise, when positive, multiplies each S_L by exp(N(0, noise^2)).
func grid(c *Correlation, noise float64, rng *rand.Rand) []Point {
	var out []Point
	for _, phi := range []float64{0.8, 0.9, 1.0, 1.1, 1.2, 1.3, 1.4, 1.5} {
		for _, T := range []float64{298, 400, 500, 650} {
			for _, P := range []float64{101325, 5 * 101325, 20 * 101325} {
				s, _ := c.Evaluate(phi, T, P)
				if noise > 0 {
					s *= math.Exp(noise * rng.NormFloat64())
				}
				out = append(out, Point{Phi: phi, T: T, P: P, FlameSpeed: s})
			}
		}
	}
	return out
}

func TestEvaluatePublishedPropane(t *testing.T) {
	c := propane()
	// At phi = 1, 298 K, 1 atm: S_L = B_m + B_2 (1 - 1.08)^2
	// = 34.22 - 138.65 * 0.0064 = 33.33 cm/s (hand calculation).
	s, warn := c.Evaluate(1, 298, 101325)
	if math.Abs(s-0.333326) > 1e-6 || len(warn) != 0 {
		t.Errorf("S_L(1, 298 K, 1 atm) = %.6f m/s with warnings %q, want 0.333326", s, warn)
	}
	// At phi = 0.8, 500 K, 10 atm (hand calculation):
	// S_L0 = 34.22 - 138.65 * 0.0784 = 23.35 cm/s, alpha = 2.34, beta = -0.204,
	// S_L = 23.35 * (500/298)^2.34 * 10^-0.204 = 23.35 * 3.3568 * 0.62517 = 49.00 cm/s.
	want := (0.3422 - 1.3865*0.0784) * math.Pow(500.0/298, 2.34) * math.Pow(10, -0.204)
	s, _ = c.Evaluate(0.8, 500, 10*101325)
	if math.Abs(s/want-1) > 1e-12 {
		t.Errorf("S_L(0.8, 500 K, 10 atm) = %.6g m/s, want %.6g", s, want)
	}
	if math.Abs(want-0.4900) > 1e-4 {
		t.Errorf("hand value %.5f m/s, want about 0.4900", want)
	}
}

func TestEvaluateWarnings(t *testing.T) {
	c := propane()
	for _, tc := range []struct {
		phi, T, P float64
		zero      bool
		want      string
	}{
		{1.0, 298, 101325, false, ""},
		{0.6, 298, 101325, false, "equivalence ratio 0.6 is outside the fitted range 0.8 - 1.5"},
		{1.0, 800, 101325, false, "temperature 800 K is outside the fitted range 298 - 700 K"},
		{1.0, 298, 100e5, false, "pressure 1e+07 Pa is outside"},
		{3.0, 298, 101325, true, "no flame speed predicted"},
		{math.NaN(), 298, 101325, true, "not a finite positive number"},
		{1.0, -5, 101325, true, "not a finite positive number"},
	} {
		s, warn := c.Evaluate(tc.phi, tc.T, tc.P)
		joined := strings.Join(warn, "; ")
		if tc.want == "" && len(warn) != 0 {
			t.Errorf("Evaluate(%g, %g, %g): unexpected warnings %q", tc.phi, tc.T, tc.P, joined)
		}
		if tc.want != "" && !strings.Contains(joined, tc.want) {
			t.Errorf("Evaluate(%g, %g, %g): warnings %q do not say %q", tc.phi, tc.T, tc.P, joined, tc.want)
		}
		if math.IsNaN(s) || (tc.zero && s != 0) || (!tc.zero && !(s > 0)) {
			t.Errorf("Evaluate(%g, %g, %g) = %v", tc.phi, tc.T, tc.P, s)
		}
	}
}

func TestFitRecoversExactCoefficients(t *testing.T) {
	truth := propane()
	c, err := Fit(grid(truth, 0, nil), Options{})
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	for i := 0; i < NumCoef; i++ {
		worst = math.Max(worst, math.Abs(c.Coef[i]/truth.Coef[i]-1))
	}
	t.Logf("largest relative coefficient error on exact data: %.1e", worst)
	for i := 0; i < NumCoef; i++ {
		if !c.Free[i] {
			t.Errorf("%s not fitted", CoefNames[i])
		}
		if d := math.Abs(c.Coef[i]/truth.Coef[i] - 1); d > 1e-8 {
			t.Errorf("%s = %.12g, want %.12g (relative error %.1e)", CoefNames[i], c.Coef[i], truth.Coef[i], d)
		}
	}
	if c.RMSRelative > 1e-10 || c.MaxRelative > 1e-10 {
		t.Errorf("RMS %.2e, max %.2e relative error on exact data", c.RMSRelative, c.MaxRelative)
	}
	if c.Points != 96 || c.DOF != 89 {
		t.Errorf("%d points, %d degrees of freedom; want 96 and 89", c.Points, c.DOF)
	}
	if c.Phi != (Range{0.8, 1.5}) || c.T != (Range{298, 650}) || c.P != (Range{101325, 20 * 101325}) {
		t.Errorf("validity phi %v, T %v, P %v", c.Phi, c.T, c.P)
	}
}

func TestFitNoisyDataWithinErrorBars(t *testing.T) {
	truth := propane()
	const noise = 0.02 // 2 % scatter, about that of measured flame speeds (common practice, no source)
	c, err := Fit(grid(truth, noise, rand.New(rand.NewPCG(1, 2))), Options{})
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < NumCoef; i++ {
		z := (c.Coef[i] - truth.Coef[i]) / c.StdErr[i]
		t.Logf("%-7s = %10.5g +- %.2g (truth %.5g, %+.2f standard errors)", CoefNames[i], c.Coef[i], c.StdErr[i], truth.Coef[i], z)
		if math.Abs(z) > 3 {
			t.Errorf("%s = %.5g +- %.2g, truth %.5g: %.1f standard errors off", CoefNames[i], c.Coef[i], c.StdErr[i], truth.Coef[i], z)
		}
	}
	// The RMS relative error estimates the scatter.
	if c.RMSRelative < 0.7*noise || c.RMSRelative > 1.3*noise {
		t.Errorf("RMS relative error %.4f for %.2f scatter", c.RMSRelative, noise)
	}
}

// The standard errors must be right, not merely large: over many noisy
// data sets, about 95 % of the estimates lie within 1.96 standard errors of
// the truth (normal coverage; with 89 degrees of freedom the t quantile is
// 1.99, close enough).
func TestFitStandardErrorCoverage(t *testing.T) {
	if testing.Short() {
		t.Skip("300 fits")
	}
	truth := propane()
	const sets = 300
	var inside [NumCoef]int
	rng := rand.New(rand.NewPCG(7, 11))
	for k := 0; k < sets; k++ {
		c, err := Fit(grid(truth, 0.03, rng), Options{})
		if err != nil {
			t.Fatal(err)
		}
		for i := 0; i < NumCoef; i++ {
			if math.Abs(c.Coef[i]-truth.Coef[i]) <= 1.96*c.StdErr[i] {
				inside[i]++
			}
		}
	}
	for i := 0; i < NumCoef; i++ {
		t.Logf("%-7s within 1.96 standard errors in %d of %d sets", CoefNames[i], inside[i], sets)
		// Binomial(300, 0.95) has standard deviation 3.8 points: 0.90-0.99
		// is over 3 of them either way.
		if f := float64(inside[i]) / sets; f < 0.90 || f > 0.99 {
			t.Errorf("%s: %.1f %% of estimates within 1.96 standard errors, want about 95 %%", CoefNames[i], 100*f)
		}
	}
}

func TestFitReducedForms(t *testing.T) {
	truth := propane()
	truth.Coef[Alpha1] = 0
	var oneT []Point
	for _, d := range grid(truth, 0, nil) {
		if d.T == 400 {
			oneT = append(oneT, d)
		}
	}
	t.Run("one temperature", func(t *testing.T) {
		c, err := Fit(oneT, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if c.Free[Alpha0] || c.Free[Alpha1] || c.T0 != 400 || c.Coef[Alpha0] != 0 {
			t.Errorf("alpha fitted %v/%v = %g, T_0 = %g; want neither fitted and T_0 = 400 K", c.Free[Alpha0], c.Free[Alpha1], c.Coef[Alpha0], c.T0)
		}
		// With alpha_1 = 0 the data are K S_L0(phi), K = (400/298)^2.18:
		// the reduced form is exact.
		K := math.Pow(400.0/298, 2.18)
		for _, tc := range []struct {
			i    int
			want float64
		}{{BM, K * truth.Coef[BM]}, {B2, K * truth.Coef[B2]}, {PhiM, truth.Coef[PhiM]}, {Beta0, truth.Coef[Beta0]}, {Beta1, truth.Coef[Beta1]}} {
			if d := math.Abs(c.Coef[tc.i]/tc.want - 1); d > 1e-8 {
				t.Errorf("%s = %.10g, want %.10g", CoefNames[tc.i], c.Coef[tc.i], tc.want)
			}
		}
		if !strings.Contains(strings.Join(c.Notes, " "), "no temperature exponent is fitted") {
			t.Errorf("notes %q", c.Notes)
		}
		s, warn := c.Evaluate(1, 500, 101325)
		if !(s > 0) || !strings.Contains(strings.Join(warn, " "), "the data are at 400 K only") {
			t.Errorf("Evaluate at 500 K = %g with warnings %q", s, warn)
		}
	})
	t.Run("temperature varied at phi = 1 only", func(t *testing.T) {
		truth := propane() // alpha_1 = -0.8, invisible at phi = 1
		var data []Point
		for _, d := range grid(truth, 0, nil) {
			if d.T == 298 || d.Phi == 1.0 {
				data = append(data, d)
			}
		}
		c, err := Fit(data, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if !c.Free[Alpha0] || c.Free[Alpha1] {
			t.Errorf("free alpha_0 %v, alpha_1 %v; want only alpha_0", c.Free[Alpha0], c.Free[Alpha1])
		}
		if d := math.Abs(c.Coef[Alpha0]/2.18 - 1); d > 1e-8 {
			t.Errorf("alpha_0 = %.10g, want 2.18", c.Coef[Alpha0])
		}
		if !strings.Contains(strings.Join(c.Notes, " "), "alpha_1 is not fitted") {
			t.Errorf("notes %q", c.Notes)
		}
	})
	t.Run("temperature and pressure in lockstep", func(t *testing.T) {
		// Isentropic compression of a gas with gamma = 1.4:
		// T/T_0 = (P/P_0)^((gamma-1)/gamma).
		var data []Point
		for _, phi := range []float64{0.8, 1.0, 1.2, 1.4} {
			for _, r := range []float64{1, 2, 5, 10} {
				T := 298 * math.Pow(r, 0.4/1.4)
				s, _ := truth.Evaluate(phi, T, r*101325)
				data = append(data, Point{Phi: phi, T: T, P: r * 101325, FlameSpeed: s})
			}
		}
		c, err := Fit(data, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if c.Free[Beta0] || c.Free[Beta1] || !c.Free[Alpha0] {
			t.Errorf("free alpha_0 %v, beta_0 %v, beta_1 %v; want alpha_0 only", c.Free[Alpha0], c.Free[Beta0], c.Free[Beta1])
		}
		if !strings.Contains(strings.Join(c.Notes, " "), "beta_0 is not fitted") {
			t.Errorf("notes %q", c.Notes)
		}
		// The fitted alpha_0 carries both effects: alpha_0 + beta_0 / 0.2857.
		if want := 2.18 - 0.16*1.4/0.4; math.Abs(c.Coef[Alpha0]-want) > 1e-8 {
			t.Errorf("alpha_0 = %.10g, want the combined exponent %.10g", c.Coef[Alpha0], want)
		}
	})
}

func TestFitRefusals(t *testing.T) {
	truth := propane()
	all := grid(truth, 0, nil)
	pick := func(keep func(Point) bool) []Point {
		var out []Point
		for _, d := range all {
			if keep(d) {
				out = append(out, d)
			}
		}
		return out
	}
	for _, tc := range []struct {
		name string
		data []Point
		want string
	}{
		{"no data", nil, "no data points"},
		{"two equivalence ratios", pick(func(d Point) bool { return d.Phi == 0.9 || d.Phi == 1.2 }), "2 distinct equivalence ratio(s) (0.9, 1.2)"},
		{"as many points as coefficients", pick(func(d Point) bool { return d.T == 298 && d.P == 101325 && d.Phi <= 1.0 }),
			"3 points for 3 coefficients"},
		{"negative flame speed", []Point{{1, 298, 101325, -0.3}, {0.9, 298, 101325, 0.3}, {1.1, 298, 101325, 0.3}, {1.2, 298, 101325, 0.3}},
			"flame speed -0.3 is not a finite positive number"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Fit(tc.data, Options{})
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want one saying %q", err, tc.want)
			}
			if tc.name != "negative flame speed" && !errors.Is(err, ErrDesign) {
				t.Errorf("error %v does not wrap ErrDesign", err)
			}
		})
	}
}

func TestTOMLRoundTrip(t *testing.T) {
	truth := propane()
	c, err := Fit(grid(truth, 0.01, rand.New(rand.NewPCG(3, 4))), Options{Source: "out/results.csv"})
	if err != nil {
		t.Fatal(err)
	}
	c.Notes = append(c.Notes, `a note with "quotes"`)
	var buf bytes.Buffer
	if err := c.WriteTOML(&buf, "model predictions only"); err != nil {
		t.Fatal(err)
	}
	back, err := ReadTOML(buf.Bytes(), "c.toml")
	if err != nil {
		t.Fatalf("%v\n%s", err, buf.String())
	}
	if back.Coef != c.Coef || back.StdErr != c.StdErr || back.Free != c.Free || back.T0 != c.T0 || back.P0 != c.P0 ||
		back.Phi != c.Phi || back.T != c.T || back.P != c.P || back.RMSRelative != c.RMSRelative ||
		back.Points != c.Points || back.DOF != c.DOF || strings.Join(back.Notes, "|") != strings.Join(c.Notes, "|") {
		t.Errorf("round trip changed the correlation:\n%+v\n%+v", c, back)
	}
	for _, bad := range []struct{ edit, want string }{
		{strings.Replace(buf.String(), "\nphi_m ", "\nphi_x ", 1), "lacks phi_m"},
		{strings.Replace(buf.String(), "version 1", "version 9", 1), "format"},
		{buf.String() + "\nextra = 1\n", "unknown key"},
	} {
		if _, err := ReadTOML([]byte(bad.edit), "c.toml"); err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("edited file: error %v, want one saying %q", err, bad.want)
		}
	}
}
