package mechtoml

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// gri30File is the built-in GRI-Mech 3.0 in this format (53 species, 325
// reactions), the file the CLI reads on every run.
func gri30File(b *testing.B) []byte {
	data, err := os.ReadFile(filepath.Join("..", "..", "builtin", "mechanisms", "gri30.toml"))
	if err != nil {
		b.Skipf("built-in GRI-Mech 3.0 file not available: %v", err)
	}
	return data
}

// BenchmarkReadGRI30 measures Read on GRI-Mech 3.0; target well under 50 ms.
func BenchmarkReadGRI30(b *testing.B) {
	data := gri30File(b)
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, _, err := Read(bytes.NewReader(data), "gri30.toml"); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkWriteGRI30(b *testing.B) {
	m, _, err := Read(bytes.NewReader(gri30File(b)), "gri30.toml")
	if err != nil {
		b.Fatal(err)
	}
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := Write(&buf, m); err != nil {
			b.Fatal(err)
		}
	}
}
