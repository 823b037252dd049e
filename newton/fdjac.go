package newton

import (
	"fmt"
	"math"
)

// FiniteDifferenceJacobian sets every entry of J to a forward-difference
// approximation of the Jacobian of residual at u, given f0 = residual(u):
//
//	∂F_i/∂u_k ≈ (F_i(u + h_k e_k) − F_i(u)) / h_k,   h_k = relPert·|u_k| + absPert.
//
// Because F_j depends only on points j−1, j and j+1, the columns of points
// j ≡ c (mod 3) touch disjoint rows and are perturbed together (three-colour
// grouping of Curtis, Powell & Reid, "On the estimation of sparse Jacobian
// matrices", IMA J. Appl. Math. 13 (1974) 117–119), so the whole Jacobian
// costs min(N,3)·B residual evaluations instead of N·B.
//
// If the residual fails at a perturbed state (for example a species mass
// fraction pushed past a physical limit), that column group is retried with
// the opposite sign, −h_k; if that fails too the error is returned. The
// difference uses the increment actually represented in floating point,
// (u_k + h_k) − u_k. u is restored before return; on error the contents
// of J are unspecified. After its first call for a given J the function
// allocates nothing.
//
// The truncation error is O(h·|F”|) and the rounding error O(ε·|F|/h); with
// relPert ≈ absPert/|u| ≈ √ε ≈ 1.5e−8 both are about √ε relative (Dennis &
// Schnabel, "Numerical Methods for Unconstrained Optimization and Nonlinear
// Equations", SIAM 1996, §5.4).
func FiniteDifferenceJacobian(residual func(u, f []float64) error, u, f0 []float64, J *BlockTridiagonal, relPert, absPert float64) error {
	n, b := J.N, J.B
	size := n * b
	if len(u) != size || len(f0) != size {
		return fmt.Errorf("finite-difference Jacobian: len(u) = %d, len(f0) = %d, want %d (%d points × %d components)", len(u), len(f0), size, n, b)
	}
	if !(relPert >= 0) || !(absPert > 0) || math.IsInf(relPert, 0) || math.IsInf(absPert, 0) {
		return fmt.Errorf("finite-difference Jacobian: perturbations must be finite with relPert ≥ 0 and absPert > 0, got %g and %g", relPert, absPert)
	}
	if len(J.fdU) != size {
		J.fdU = make([]float64, size)
		J.fdF = make([]float64, size)
	}
	up, fp := J.fdU, J.fdF
	copy(up, u)
	J.factored = false
	bb := b * b
	// Blocks outside the matrix are never written below; keep them zero.
	clear(J.Lower[:bb])
	clear(J.Upper[(n-1)*bb:])

	colours := min(n, 3)
	for colour := 0; colour < colours; colour++ {
		for k := 0; k < b; k++ {
			sign := 1.0
			err := perturbColumns(residual, u, up, fp, n, b, colour, k, relPert, absPert, sign)
			if err != nil {
				sign = -1
				if err2 := perturbColumns(residual, u, up, fp, n, b, colour, k, relPert, absPert, sign); err2 != nil {
					return fmt.Errorf("finite-difference Jacobian: residual failed with component %d of points ≡ %d (mod 3) perturbed either way: %w", k, colour, err)
				}
			}
			for j := colour; j < n; j += 3 {
				i := j*b + k
				h := up[i] - u[i]
				up[i] = u[i]
				if h == 0 {
					return fmt.Errorf("finite-difference Jacobian: perturbation of point %d, component %d vanishes in floating point (u = %g, relPert = %g, absPert = %g)", j, k, u[i], relPert, absPert)
				}
				inv := 1 / h
				for jr := max(j-1, 0); jr <= min(j+1, n-1); jr++ {
					var blk []float64
					switch jr {
					case j - 1:
						blk = J.Upper[jr*bb : (jr+1)*bb]
					case j:
						blk = J.Diag[jr*bb : (jr+1)*bb]
					default:
						blk = J.Lower[jr*bb : (jr+1)*bb]
					}
					// Column k is stored as row k for now (contiguous
					// writes); the blocks are transposed at the end.
					col := blk[k*b : (k+1)*b]
					fr, f0r := fp[jr*b:(jr+1)*b], f0[jr*b:(jr+1)*b]
					for r := range col {
						col[r] = (fr[r] - f0r[r]) * inv
					}
				}
			}
		}
	}
	for j := range n {
		transposeBlock(J.Diag[j*bb:(j+1)*bb], b)
		if j > 0 {
			transposeBlock(J.Lower[j*bb:(j+1)*bb], b)
		}
		if j < n-1 {
			transposeBlock(J.Upper[j*bb:(j+1)*bb], b)
		}
	}
	return nil
}

// transposeBlock transposes the b×b row-major matrix a in place.
func transposeBlock(a []float64, b int) {
	for r := 0; r < b; r++ {
		for c := r + 1; c < b; c++ {
			a[r*b+c], a[c*b+r] = a[c*b+r], a[r*b+c]
		}
	}
}

// perturbColumns sets component k of every point j ≡ colour (mod 3) of up to
// u + sign·h and evaluates the residual into fp. On error up is restored.
func perturbColumns(residual func(u, f []float64) error, u, up, fp []float64, n, b, colour, k int, relPert, absPert, sign float64) error {
	for j := colour; j < n; j += 3 {
		i := j*b + k
		h := relPert*math.Abs(u[i]) + absPert
		up[i] = u[i] + sign*h
	}
	err := residual(up, fp)
	if err != nil {
		for j := colour; j < n; j += 3 {
			up[j*b+k] = u[j*b+k]
		}
	}
	return err
}
