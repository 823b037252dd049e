package mechtoml

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestDocsExample: the example in docs/mechanism-format.md reads as the
// document says, once the species it elides are added (from tinyHeader).
func TestDocsExample(t *testing.T) {
	doc, err := os.ReadFile(filepath.Join("..", "..", "docs", "mechanism-format.md"))
	if err != nil {
		t.Skipf("docs not found: %v", err)
	}
	text := string(doc)
	start := strings.Index(text, "```toml\n")
	if start < 0 {
		t.Fatal("no toml example in the docs")
	}
	text = text[start+len("```toml\n"):]
	example := text[:strings.Index(text, "```")]
	const elided = "# ... more [[species]] ...\n"
	if !strings.Contains(example, elided) {
		t.Fatalf("example lacks the line %q", elided)
	}
	var more strings.Builder
	for _, block := range strings.Split(tinyHeader, "[[species]]\n")[1:] {
		if !strings.HasPrefix(block, `name = "H2"`) {
			more.WriteString("[[species]]\n" + block)
		}
	}
	m, problems, err := Read(strings.NewReader(strings.Replace(example, elided, more.String(), 1)), "docs-example.toml")
	if err != nil {
		t.Fatalf("docs example does not read: %v", err)
	}
	for _, p := range problems {
		t.Logf("%s", p)
	}
	if len(m.Reactions) != 3 || m.Name != "h2-fragment" || !strings.Contains(m.Description, "GRI-Mech 3.0") {
		t.Fatalf("read %d reactions, name %q", len(m.Reactions), m.Name)
	}
	if v := m.Validity; v == nil || len(v.Fuels) != 1 || v.Fuels[0] != "H2" || v.Temperature != [2]float64{290, 450} ||
		v.Pressure != [2]float64{0.5 * 101325, 5 * 101325} || v.EquivalenceRatio != [2]float64{0.5, 2} {
		t.Errorf("validity read as %+v", v)
	}
	if f := m.Reactions[0].UncertaintyFactor; f != 1.5 {
		t.Errorf("uncertainty factor %v, want 1.5", f)
	}
	// 2.65e16 cm^3/(mol s) = 2.65e10 m^3/(mol s); 17041 cal/mol * 4.184 J/cal.
	if r := m.Reactions[0].Rate; !close(r.A, 2.65e10, 1e-15) || !close(r.E, 71299.544, 1e-12) {
		t.Errorf("first rate %+v", r)
	}
}
