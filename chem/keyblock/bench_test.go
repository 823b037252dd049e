package keyblock

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// benchmarkImport measures a full import (reactions, thermo, transport,
// validation) of a shared set from memory.
func benchmarkImport(b *testing.B, set string) {
	d := filepath.Join(mechanismsDir(b), set)
	var data [3][]byte
	for i, f := range []string{"mech.inp", "thermo.dat", "transport.dat"} {
		var err error
		if data[i], err = os.ReadFile(filepath.Join(d, f)); err != nil {
			b.Skip(err)
		}
	}
	b.SetBytes(int64(len(data[0]) + len(data[1]) + len(data[2])))
	b.ResetTimer()
	for b.Loop() {
		_, _, err := Read(bytes.NewReader(data[0]), bytes.NewReader(data[1]), bytes.NewReader(data[2]), "mech.inp", "thermo.dat", "transport.dat")
		if err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkImportGRI30(b *testing.B) { benchmarkImport(b, "gri30") }
func BenchmarkImportC0C4(b *testing.B)  { benchmarkImport(b, "c0c4") }

func BenchmarkReadThermoNHeptane(b *testing.B) {
	data, err := os.ReadFile(filepath.Join(mechanismsDir(b), "nheptane-sk68", "thermo.dat"))
	if err != nil {
		b.Skip(err)
	}
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, _, err := ReadThermo(bytes.NewReader(data), "thermo.dat"); err != nil {
			b.Fatal(err)
		}
	}
}
