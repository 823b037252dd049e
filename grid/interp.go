package grid

import (
	"fmt"
	"sort"
)

// Interpolate fills uNew (len(xNew)*block, point-major) with the solution
// uOld on the strictly increasing grid xOld, evaluated at xNew:
//
//	u(x) = u_j + (x - x_j)/(x_j+1 - x_j) * (u_j+1 - u_j),  x_j <= x <= x_j+1,
//
// piecewise linear, so it is exact for linear profiles and at the nodes; it
// is constant (the end value) outside [xOld[0], xOld[n-1]]. xNew need not be
// sorted, but sorted positions are found in O(1) each. A NaN position gives
// NaN values; callers validate positions (Analyse does). Interpolate panics
// on inconsistent lengths or an empty xOld, which are programming errors.
func Interpolate(xOld, uOld []float64, block int, xNew []float64, uNew []float64) {
	n := len(xOld)
	if n == 0 || block < 1 || len(uOld) != n*block || len(uNew) != len(xNew)*block {
		panic(fmt.Sprintf("grid: Interpolate: len(xOld) = %d, len(uOld) = %d, len(xNew) = %d, len(uNew) = %d, block = %d",
			n, len(uOld), len(xNew), len(uNew), block))
	}
	j := 0 // interval of the previous position, the hint for sorted xNew
	for i, xv := range xNew {
		dst := uNew[i*block : (i+1)*block]
		switch {
		case xv != xv:
			for c := range dst {
				dst[c] = xv
			}
			continue
		case xv <= xOld[0]:
			copy(dst, uOld[:block])
			continue
		case xv >= xOld[n-1]:
			copy(dst, uOld[(n-1)*block:])
			continue
		}
		// Here n >= 2 and xOld[0] < xv < xOld[n-1]; find j with
		// xOld[j] <= xv < xOld[j+1].
		if !(j < n-1 && xOld[j] <= xv && xv < xOld[j+1]) {
			if j+2 < n && xOld[j+1] <= xv && xv < xOld[j+2] {
				j++
			} else {
				j = sort.SearchFloat64s(xOld, xv)
				if xOld[j] > xv {
					j--
				}
			}
		}
		t := (xv - xOld[j]) / (xOld[j+1] - xOld[j])
		lo, hi := uOld[j*block:(j+1)*block], uOld[(j+1)*block:(j+2)*block]
		for c := range dst {
			dst[c] = lo[c] + t*(hi[c]-lo[c])
		}
	}
}
