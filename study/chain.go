package study

import (
	"math"
	"sort"

	"flame1d/flame"
	"flame1d/output"
)

// SolveAlongPhi solves the study at each equivalence ratio of phis, all at
// unburned temperature T (K) and pressure P (Pa): natural-parameter
// continuation in phi, starting at the ratio nearest 1.05 (near the fastest
// flame, where a cold start is easiest) and walking outwards, each flame
// starting from its nearest solved neighbour (Study.Solve falls back to a
// cold start when continuation fails). Failed points are recorded, not
// fatal: results and errors are aligned with phis, one of the two nil.
// after, when non-nil, is called after each solve.
func (s *Study) SolveAlongPhi(phis []float64, T, P float64, after func(i int, r *Result, err error)) ([]*Result, []error) {
	res := make([]*Result, len(phis))
	errs := make([]error, len(phis))
	for _, i := range continuationOrder(phis) {
		var start *flame.Solution
		if j := nearestSolved(phis, res, i); j >= 0 {
			start = res[j].Solution
		}
		res[i], errs[i] = s.Solve(Condition{Phi: phis[i], T: T, P: P}, start)
		if after != nil {
			after(i, res[i], errs[i])
		}
	}
	return res, errs
}

// continuationOrder visits indices starting at the equivalence ratio
// nearest 1.05 and walking outwards.
func continuationOrder(phis []float64) []int {
	idx := make([]int, len(phis))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool {
		return math.Abs(phis[idx[a]]-1.05) < math.Abs(phis[idx[b]]-1.05)
	})
	return idx
}

func nearestSolved(phis []float64, res []*Result, i int) int {
	best, bj := math.Inf(1), -1
	for j, r := range res {
		if r != nil && j != i {
			if d := math.Abs(phis[j] - phis[i]); d < best {
				best, bj = d, j
			}
		}
	}
	return bj
}

// outcome is a one-line account of a solve for progress messages.
func outcome(r *Result, err error) string {
	if err != nil {
		return "failed: " + oneLine(err)
	}
	return "S_L " + output.FormatFloat(r.Summary.FlameSpeed) + " m/s"
}
