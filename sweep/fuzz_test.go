package sweep

import (
	"context"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// FuzzReadResults: a results table (as fit and merge read it) never makes
// the reader panic; every error names the file; every accepted row has all
// columns, and every parsed row finite conditions and, when solved, a
// finite flame speed (issue 11, item 10).
//
//	go test ./sweep -run XXX -fuzz FuzzReadResults -fuzztime 120s
func FuzzReadResults(f *testing.F) {
	dir := f.TempDir()
	c := sweepCase(f, "equivalence_ratio = [0.8, 1.0, 1.2]\ntemperature = [\"298 K\", \"400 K\"]")
	opt, _ := fakeOptions(1, failAt(false, 1.2))
	if _, err := Run(context.Background(), c, dir, opt); err != nil && !strings.Contains(err.Error(), "interrupted") {
		f.Fatal(err)
	}
	if b, err := os.ReadFile(filepath.Join(dir, ResultsName)); err == nil {
		f.Add(string(b))
	}
	f.Add(strings.Join(Columns, ",") + "\n" + "p,1,298,101325,solved,NaN,,,,,,,,,\n")
	f.Add("# x\n" + strings.Join(Columns, ",") + "\n\"a\nb\",1,298,101325,pending,,,,,,,,,,\n")
	f.Fuzz(func(t *testing.T, text string) {
		tab, err := readTable(strings.NewReader(text), "fuzz.csv")
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz.csv") {
				t.Fatalf("error without the file name: %v", err)
			}
			return
		}
		for _, r := range tab.Rows {
			if len(r) != len(Columns) {
				t.Fatalf("row of %d fields accepted", len(r))
			}
		}
		rows, err := tab.Parsed()
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz.csv") {
				t.Fatalf("error without the file name: %v", err)
			}
			return
		}
		for _, r := range rows {
			for _, v := range []float64{r.Condition.Phi, r.Condition.T, r.Condition.P, r.FlameSpeed} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("row %+v has a value that is not finite", r)
				}
			}
		}
	})
}
