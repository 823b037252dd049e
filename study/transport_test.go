package study

import (
	"strings"
	"testing"

	"flame1d/builtin"
	"flame1d/casefile"
)

// A mechanism without transport data (imported without its transport
// file) is refused when the study is set up, with one message that says
// how to import it again, not "transport: transport: ..." (issue 11,
// item 8).
func TestMechanismWithoutTransportSaysHowToReimport(t *testing.T) {
	m, err := builtin.Load("burke2012-hydrogen")
	if err != nil {
		t.Fatal(err)
	}
	for i := range m.Species {
		if m.Species[i].Name != "N2" {
			m.Species[i].Transport = nil
		}
	}
	c, err := casefile.Parse([]byte("mechanism = \"h2.toml\"\n[mixture]\nfuel = { H2 = 1 }\nequivalence_ratio = 1\n"), "case.toml")
	if err != nil {
		t.Fatal(err)
	}
	_, err = NewForFuel(c, m, c.Fuel, nil)
	if err == nil {
		t.Fatal("accepted")
	}
	msg := err.Error()
	for _, want := range []string{"case.toml: mechanism h2.toml:", "species have no transport data", "--transport"} {
		if !strings.Contains(msg, want) {
			t.Errorf("%q does not say %q", msg, want)
		}
	}
	if strings.Contains(msg, "transport: transport") {
		t.Errorf("doubled prefix: %q", msg)
	}
}
