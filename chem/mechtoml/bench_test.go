package mechtoml

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// natgasFile is the built-in GRI-Mech 3.0 in this format (53 species, 325
// reactions), the file the CLI reads on every run.
func natgasFile(b *testing.B) []byte {
	data, err := os.ReadFile(filepath.Join("..", "..", "builtin", "mechanisms", "smith1999-natgas.toml"))
	if err != nil {
		b.Skipf("built-in GRI-Mech 3.0 file not available: %v", err)
	}
	return data
}

// BenchmarkReadGRI30 measures Read on GRI-Mech 3.0; target well under 50 ms.
func BenchmarkReadGRI30(b *testing.B) {
	data := natgasFile(b)
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, _, err := Read(bytes.NewReader(data), "smith1999-natgas.toml"); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkWriteGRI30(b *testing.B) {
	m, _, err := Read(bytes.NewReader(natgasFile(b)), "smith1999-natgas.toml")
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
