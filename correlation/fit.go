package correlation

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/optimize"

	"flame1d/internal/dense"
)

// Point is one flame speed to fit: equivalence ratio, unburned temperature
// (K), pressure (Pa) and S_L (m/s).
type Point struct {
	Phi, T, P, FlameSpeed float64
}

// Options control a fit; zero values take the defaults.
type Options struct {
	T0, P0 float64 // reference state, K and Pa (default 298 K, 1 atm)
	Source string  // copied into the correlation
}

// ErrDesign is wrapped by refusals caused by the data's layout: too few
// points or conditions that cannot determine the coefficients.
var ErrDesign = errors.New("the data cannot determine the correlation")

// dependenceTol is the relative size below which a Jacobian column's part
// outside the span of the columns before it counts as zero: the coefficient
// is then not determined by the data.
const dependenceTol = 1e-8

// Fit fits the correlation to flame speeds by least squares on ln S_L.
//
// The data must hold at least three equivalence ratios (S_L0 has three
// coefficients) and more points than free coefficients. With a single
// temperature (pressure) the reference temperature (pressure) becomes that
// value and the exponents alpha (beta) are not fitted. Any other
// coefficient whose Jacobian column is a combination of the others (for
// example alpha_1 when the temperature varies at one equivalence ratio only,
// or beta when T_u and P vary in lockstep) is held at zero and named in
// Notes. The minimisation is Newton's method on the Gauss-Newton Hessian
// J^T J (gonum optimize), polished by plain Gauss-Newton steps; standard
// errors come from s^2 (J^T J)^-1 with s^2 = sum r^2 / (n - p).
func Fit(data []Point, opt Options) (*Correlation, error) {
	if len(data) == 0 {
		return nil, fmt.Errorf("%w: no data points", ErrDesign)
	}
	c := &Correlation{T0: opt.T0, P0: opt.P0, Source: opt.Source, Points: len(data)}
	if c.T0 == 0 {
		c.T0 = DefaultT0
	}
	if c.P0 == 0 {
		c.P0 = DefaultP0
	}
	if !(c.T0 > 0 && c.P0 > 0) {
		return nil, fmt.Errorf("reference state T_0 = %g K, P_0 = %g Pa: both must be positive", c.T0, c.P0)
	}
	for i, d := range data {
		for _, v := range []struct {
			name string
			v    float64
		}{{"equivalence ratio", d.Phi}, {"temperature", d.T}, {"pressure", d.P}, {"flame speed", d.FlameSpeed}} {
			if !(v.v > 0) || math.IsInf(v.v, 0) {
				return nil, fmt.Errorf("data point %d: %s %v is not a finite positive number", i+1, v.name, v.v)
			}
		}
	}
	phis := distinct(data, func(d Point) float64 { return d.Phi })
	Ts := distinct(data, func(d Point) float64 { return d.T })
	Ps := distinct(data, func(d Point) float64 { return d.P })
	c.Phi, c.T, c.P = Range{phis[0], phis[len(phis)-1]}, Range{Ts[0], Ts[len(Ts)-1]}, Range{Ps[0], Ps[len(Ps)-1]}
	if len(phis) < 3 {
		return nil, fmt.Errorf("%w: %d distinct equivalence ratio(s) (%s); S_L0 = B_m + B_2 (phi - phi_m)^2 needs at least 3",
			ErrDesign, len(phis), joinFloats(phis))
	}
	if len(Ts) == 1 {
		c.T0 = Ts[0]
		c.Notes = append(c.Notes, fmt.Sprintf("all points are at T_u = %g K: no temperature exponent is fitted and T_0 is %g K; the correlation holds at that temperature only", Ts[0], Ts[0]))
	}
	if len(Ps) == 1 {
		c.P0 = Ps[0]
		c.Notes = append(c.Notes, fmt.Sprintf("all points are at P = %g Pa: no pressure exponent is fitted and P_0 is %g Pa; the correlation holds at that pressure only", Ps[0], Ps[0]))
	}
	f := &fitter{data: data, lnT: make([]float64, len(data)), lnP: make([]float64, len(data)), lnS: make([]float64, len(data))}
	for i, d := range data {
		f.lnT[i] = math.Log(d.T / c.T0)
		f.lnP[i] = math.Log(d.P / c.P0)
		f.lnS[i] = math.Log(d.FlameSpeed)
	}
	guess, err := f.initialGuess()
	if err != nil {
		return nil, err
	}
	// Which coefficients can the data determine? S_L0's three always
	// (checked above); the exponents in the order alpha_0, beta_0,
	// alpha_1, beta_1.
	free := []int{BM, B2, PhiM}
	J := f.jacobian(guess, []int{BM, B2, PhiM, Alpha0, Beta0, Alpha1, Beta1})
	basis := dense.Basis{Tol: dependenceTol}
	for c := 0; c < 3; c++ {
		basis.Add(mat.Col(nil, c, J))
	}
	if len(basis.Vectors) < 3 {
		return nil, fmt.Errorf("%w: the equivalence ratios do not determine B_m, B_2 and phi_m", ErrDesign)
	}
	for k, coef := range []int{Alpha0, Beta0, Alpha1, Beta1} {
		if (coef == Alpha1 && !contains(free, Alpha0)) || (coef == Beta1 && !contains(free, Beta0)) {
			continue // the slope of an exponent that is not fitted
		}
		if basis.Add(mat.Col(nil, 3+k, J)) {
			free = append(free, coef)
			continue
		}
		if (coef == Alpha0 && len(Ts) == 1) || (coef == Beta0 && len(Ps) == 1) {
			continue // explained above
		}
		c.Notes = append(c.Notes, fmt.Sprintf("%s is not fitted (held at 0): %s", CoefNames[coef], whyDependent(coef)))
	}
	sort.Ints(free)
	p := len(free)
	if len(data) <= p {
		return nil, fmt.Errorf("%w: %d points for %d coefficients (%s); give at least %d points so that the fit has residual degrees of freedom",
			ErrDesign, len(data), p, coefList(free), p+1)
	}
	x := make([]float64, p)
	for k, i := range free {
		x[k] = guess[i]
	}
	x, err = f.minimise(free, x)
	if err != nil {
		return nil, err
	}
	for k, i := range free {
		c.Coef[i] = x[k]
		c.Free[i] = true
	}
	// Covariance from the Gauss-Newton matrix at the optimum.
	var full [NumCoef]float64
	copy(full[:], c.Coef[:])
	Jf := f.jacobian(full[:], free)
	var jtj mat.SymDense
	jtj.SymOuterK(1, Jf.T())
	var chol mat.Cholesky
	if !chol.Factorize(&jtj) {
		return nil, fmt.Errorf("%w: the normal matrix of %s is singular at the optimum", ErrDesign, coefList(free))
	}
	var cov mat.SymDense
	if err := chol.InverseTo(&cov); err != nil {
		return nil, fmt.Errorf("%w: %v", ErrDesign, err)
	}
	ssr := 0.0
	for i := range data {
		r := f.lnS[i] - f.model(full[:], i)
		ssr += r * r
	}
	c.DOF = len(data) - p
	s2 := ssr / float64(c.DOF)
	for k, i := range free {
		c.StdErr[i] = math.Sqrt(s2 * cov.At(k, k))
	}
	sum2 := 0.0
	for i, d := range data {
		fit, _ := c.Evaluate(d.Phi, d.T, d.P)
		rel := (fit - d.FlameSpeed) / d.FlameSpeed
		sum2 += rel * rel
		if math.Abs(rel) > math.Abs(c.MaxRelative) || i == 0 {
			c.MaxRelative, c.WorstPoint = rel, i
		}
	}
	c.MaxRelative = math.Abs(c.MaxRelative)
	c.RMSRelative = math.Sqrt(sum2 / float64(len(data)))
	for _, v := range append(c.Coef[:], c.StdErr[:]...) {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("%w: the fit gave a coefficient or standard error that is not a finite number", ErrDesign)
		}
	}
	return c, nil
}

func whyDependent(coef int) string {
	switch coef {
	case Alpha0:
		return "the temperature varies together with the other variables, so its own effect cannot be separated"
	case Beta0:
		return "the pressure varies together with the other variables (for example in lockstep with the temperature), so its own effect cannot be separated"
	case Alpha1:
		return "the temperature varies at one equivalence ratio only, so the exponent's change with phi cannot be seen"
	case Beta1:
		return "the pressure varies at one equivalence ratio only (or with the temperature), so the exponent's change with phi cannot be seen"
	}
	return "not determined by the data"
}

// fitter holds the data in the form the residual needs.
type fitter struct {
	data          []Point
	lnT, lnP, lnS []float64
}

// model returns ln S_L of the correlation with coefficients c (length
// NumCoef) at data point i; -Inf where S_L0 <= 0.
func (f *fitter) model(c []float64, i int) float64 {
	phi := f.data[i].Phi
	d := phi - c[PhiM]
	s0 := c[BM] + c[B2]*d*d
	if !(s0 > 0) {
		return math.Inf(-1)
	}
	return math.Log(s0) + (c[Alpha0]+c[Alpha1]*(phi-1))*f.lnT[i] + (c[Beta0]+c[Beta1]*(phi-1))*f.lnP[i]
}

// jacobian returns d model_i / d c_j for the coefficients cols.
func (f *fitter) jacobian(c []float64, cols []int) *mat.Dense {
	J := mat.NewDense(len(f.data), len(cols), nil)
	for i, d := range f.data {
		dphi := d.Phi - c[PhiM]
		s0 := c[BM] + c[B2]*dphi*dphi
		for k, col := range cols {
			var v float64
			switch col {
			case BM:
				v = 1 / s0
			case B2:
				v = dphi * dphi / s0
			case PhiM:
				v = -2 * c[B2] * dphi / s0
			case Alpha0:
				v = f.lnT[i]
			case Alpha1:
				v = (d.Phi - 1) * f.lnT[i]
			case Beta0:
				v = f.lnP[i]
			case Beta1:
				v = (d.Phi - 1) * f.lnP[i]
			}
			J.Set(i, k, v)
		}
	}
	return J
}

// initialGuess fits ln S_L linearly in (1, phi, phi^2, ln T, (phi-1) ln T,
// ln P, (phi-1) ln P), which fixes the exponents, then fits B_m + B_2
// (phi - phi_m)^2 to the resulting S_L0 at the data's equivalence ratios.
func (f *fitter) initialGuess() ([]float64, error) {
	n := len(f.data)
	A := mat.NewDense(n, 7, nil)
	for i, d := range f.data {
		A.SetRow(i, []float64{1, d.Phi, d.Phi * d.Phi, f.lnT[i], (d.Phi - 1) * f.lnT[i], f.lnP[i], (d.Phi - 1) * f.lnP[i]})
	}
	lin := leastSquares(A, f.lnS)
	g := make([]float64, NumCoef)
	g[Alpha0], g[Alpha1], g[Beta0], g[Beta1] = lin[3], lin[4], lin[5], lin[6]
	Q := mat.NewDense(n, 3, nil)
	s0 := make([]float64, n)
	for i, d := range f.data {
		Q.SetRow(i, []float64{1, d.Phi, d.Phi * d.Phi})
		s0[i] = math.Exp(lin[0] + lin[1]*d.Phi + lin[2]*d.Phi*d.Phi)
	}
	q := leastSquares(Q, s0)
	if math.Abs(q[2]) < 1e-12 {
		q[2] = -1e-3
	}
	g[B2] = q[2]
	g[PhiM] = -q[1] / (2 * q[2])
	g[BM] = q[0] - q[1]*q[1]/(4*q[2])
	for i := range f.data {
		if math.IsInf(f.model(g, i), -1) {
			// A guess with S_L0 <= 0 at a data point: start from a flat
			// S_L0 at the data's geometric-mean level instead.
			mean := 0.0
			for _, v := range s0 {
				mean += math.Log(v)
			}
			g[BM], g[B2], g[PhiM] = math.Exp(mean/float64(n)), -1e-3, 1
			break
		}
	}
	for _, v := range g {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("%w: no starting point for the fit could be formed from the data", ErrDesign)
		}
	}
	return g, nil
}

// leastSquares solves min |A x - b| by SVD, giving the minimum-norm
// solution when A is rank deficient (unused columns get 0).
func leastSquares(A *mat.Dense, b []float64) []float64 {
	_, c := A.Dims()
	var svd mat.SVD
	x := make([]float64, c)
	if !svd.Factorize(A, mat.SVDThin) {
		return x
	}
	rank := svd.Rank(1e-10)
	if rank == 0 {
		return x
	}
	var sol mat.Dense
	svd.SolveTo(&sol, mat.NewDense(len(b), 1, b), rank)
	for i := range x {
		x[i] = sol.At(i, 0)
	}
	return x
}

// minimise finds the least-squares coefficients: Newton's method on the
// Gauss-Newton Hessian with a backtracking line search (gonum optimize),
// then Gauss-Newton steps while they reduce the sum of squares, which
// carries a zero-residual fit to round-off.
func (f *fitter) minimise(free []int, x0 []float64) ([]float64, error) {
	full := func(x []float64) []float64 {
		c := make([]float64, NumCoef)
		for k, i := range free {
			c[i] = x[k]
		}
		return c
	}
	ssr := func(x []float64) float64 {
		c := full(x)
		s := 0.0
		for i := range f.data {
			m := f.model(c, i)
			if math.IsInf(m, -1) {
				return math.Inf(1)
			}
			r := f.lnS[i] - m
			s += r * r
		}
		return 0.5 * s
	}
	grad := func(g, x []float64) {
		c := full(x)
		J := f.jacobian(c, free)
		for k := range g {
			g[k] = 0
		}
		for i := range f.data {
			r := f.lnS[i] - f.model(c, i)
			for k := range g {
				g[k] -= J.At(i, k) * r
			}
		}
	}
	hess := func(h *mat.SymDense, x []float64) {
		J := f.jacobian(full(x), free)
		h.SymOuterK(1, J.T())
	}
	prob := optimize.Problem{Func: ssr, Grad: grad, Hess: hess}
	res, err := optimize.Minimize(prob, x0, &optimize.Settings{MajorIterations: 500},
		&optimize.Newton{Linesearcher: &optimize.Backtracking{}})
	x := x0
	if res != nil && res.F <= ssr(x0) {
		x = res.X
	}
	if err != nil && !(res != nil && res.F < math.Inf(1)) {
		return nil, fmt.Errorf("least-squares fit did not converge: %v", err)
	}
	// Gauss-Newton polish.
	p := len(free)
	for it := 0; it < 20; it++ {
		c := full(x)
		J := f.jacobian(c, free)
		r := make([]float64, len(f.data))
		for i := range r {
			r[i] = f.lnS[i] - f.model(c, i)
		}
		step := leastSquares(J, r)
		trial := make([]float64, p)
		for k := range trial {
			trial[k] = x[k] + step[k]
		}
		if !(ssr(trial) < ssr(x)) {
			break
		}
		x = trial
	}
	if s := ssr(x); math.IsInf(s, 0) || math.IsNaN(s) {
		return nil, fmt.Errorf("least-squares fit failed: S_L0 is not positive at every data point")
	}
	return x, nil
}

func distinct(data []Point, v func(Point) float64) []float64 {
	seen := map[float64]bool{}
	var out []float64
	for _, d := range data {
		x := v(d)
		if !seen[x] {
			seen[x] = true
			out = append(out, x)
		}
	}
	sort.Float64s(out)
	return out
}

func contains(s []int, v int) bool {
	for _, x := range s {
		if x == v {
			return true
		}
	}
	return false
}

func coefList(idx []int) string {
	names := make([]string, len(idx))
	for k, i := range idx {
		names[k] = CoefNames[i]
	}
	return strings.Join(names, ", ")
}

func joinFloats(v []float64) string {
	parts := make([]string, len(v))
	for i, x := range v {
		parts[i] = fmt.Sprintf("%g", x)
	}
	return strings.Join(parts, ", ")
}
