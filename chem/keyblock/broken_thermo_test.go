package keyblock

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A thermo record with one unreadable number is reported once, where it
// is, and its species once, as having a record that cannot be read, not as
// missing; the reactions of that species are not reported as unbalanced
// (issue 11, item 8: one bad number gave a "no thermo record" error and
// seven element-balance errors).
func TestBrokenThermoRecordIsReportedOnce(t *testing.T) {
	f, name := openShared(t, "h2o2", "mech.inp")
	defer f.Close()
	src, err := os.ReadFile(name)
	if err != nil {
		t.Fatal(err)
	}
	text := string(src)
	const good = " 0.04573167E+02 0.04336136E-01"
	if strings.Count(text, good) != 1 {
		t.Skipf("%s: the H2O2 record is not as expected", name)
	}
	bad := filepath.Join(t.TempDir(), "mech.inp")
	if err := os.WriteFile(bad, []byte(strings.Replace(text, good, " 0.04573167E+02 0.0433X136E-01", 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	_, probs, err := ReadFiles(bad, "", "")
	if err == nil {
		t.Fatal("accepted a bad coefficient")
	}
	var msgs []string
	for _, p := range probs {
		msgs = append(msgs, p.String())
	}
	all := strings.Join(msgs, "\n")
	if len(probs) != 2 || !strings.Contains(all, `bad coefficient 2 "0.0433X136E-01"`) ||
		!strings.Contains(all, "its thermo record") || strings.Contains(all, "element-balanced") || strings.Contains(all, "has no thermo record") {
		t.Errorf("%d problems:\n%s", len(probs), all)
	}
}
