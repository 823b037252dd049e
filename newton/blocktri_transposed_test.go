package newton

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestSolveTransposedAgainstDense compares the block transposed solve with
// a dense LU solve of Aᵀ·x = b (gonum mat.LU.SolveVecTo with trans = true,
// LAPACK dgetrs; Anderson et al., LAPACK Users' Guide, 3rd ed., SIAM 1999),
// on matrices whose in-block pivoting really interchanges rows.
func TestSolveTransposedAgainstDense(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for _, sz := range []struct{ n, b int }{{1, 1}, {1, 4}, {2, 3}, {5, 1}, {7, 6}, {12, 9}} {
		for _, permute := range []bool{false, true} {
			m := randomBlockTridiagonal(rng, sz.n, sz.b, permute)
			rhs := make([]float64, sz.n*sz.b)
			for i := range rhs {
				rhs[i] = 2*rng.Float64() - 1
			}
			var lu mat.LU
			lu.Factorize(dense(m))
			var want mat.VecDense
			if err := lu.SolveVecTo(&want, true, mat.NewVecDense(len(rhs), append([]float64(nil), rhs...))); err != nil {
				t.Fatal(err)
			}
			if err := m.Factor(); err != nil {
				t.Fatal(err)
			}
			got := append([]float64(nil), rhs...)
			m.SolveTransposed(got)
			if d := maxAbsDiff(got, want.RawVector().Data); d > 1e-12 {
				t.Errorf("n=%d b=%d permute=%v: max |x - x_dense| = %g, want <= 1e-12", sz.n, sz.b, permute, d)
			}
			// The residual of the transposed system, independently of the
			// dense solve: Aᵀ x − rhs.
			var ax mat.VecDense
			ax.MulVec(dense(m).T(), mat.NewVecDense(len(got), got))
			if d := maxAbsDiff(ax.RawVector().Data, rhs); d > 1e-12 {
				t.Errorf("n=%d b=%d permute=%v: max |Aᵀx - b| = %g", sz.n, sz.b, permute, d)
			}
		}
	}
}
