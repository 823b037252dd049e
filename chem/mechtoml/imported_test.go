package mechtoml

import (
	"bytes"
	"path/filepath"
	"testing"

	"flame1d/chem/keyblock"
	"flame1d/internal/shareddata"
)

// TestImportedSetsRoundTrip: every published set in ../shared/data/mechanisms,
// imported from the keyword-block files, comes back number for number
// through the TOML format, and writing it again gives the same bytes. It
// covers what hand-built tests may miss: pressure tables with duplicate
// pressures (c0c4), specific falloff colliders (c0c4-aramco13), explicit
// reverse rates (nheptane-sk68) and fractional coefficients.
func TestImportedSetsRoundTrip(t *testing.T) {
	shared := shareddata.MechanismsDir(t)
	for _, set := range []string{"gri30", "h2o2", "nheptane-sk68", "c0c4", "c0c4-aramco13"} {
		t.Run(set, func(t *testing.T) {
			if testing.Short() && (set == "c0c4" || set == "c0c4-aramco13") {
				t.Skip("large set; skipped with -short")
			}
			d := filepath.Join(shared, set)
			m, _, err := keyblock.ReadFiles(filepath.Join(d, "mech.inp"), filepath.Join(d, "thermo.dat"), filepath.Join(d, "transport.dat"))
			if err != nil {
				t.Fatal(err)
			}
			var first bytes.Buffer
			if err := Write(&first, m); err != nil {
				t.Fatal(err)
			}
			back, _, err := Read(bytes.NewReader(first.Bytes()), set+".toml")
			if err != nil {
				t.Fatal(err)
			}
			if d := Diff(m, back); d != "" {
				t.Errorf("round trip changed %s", d)
			}
			var second bytes.Buffer
			if err := Write(&second, back); err != nil {
				t.Fatal(err)
			}
			if !bytes.Equal(first.Bytes(), second.Bytes()) {
				t.Error("writing the read-back mechanism gives different bytes")
			}
		})
	}
}
