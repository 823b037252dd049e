package mechtoml

import (
	"bytes"
	"strings"
	"testing"
)

// FuzzRead: Read never panics, every problem it reports has the file name,
// and whatever it accepts survives Write -> Read unchanged.
//
//	go test ./chem/mechtoml -run XXX -fuzz FuzzRead -fuzztime 60s
func FuzzRead(f *testing.F) {
	var hand bytes.Buffer
	if err := Write(&hand, handBuilt()); err != nil {
		f.Fatal(err)
	}
	f.Add(hand.String())
	f.Add(tinyHeader + tinyReactions)
	f.Add(locateSample)
	f.Add(tinyHeader + "\n[[reaction]]\nequation = \"H + O2 <=> O + OH\"\npressure_table = [{pressure = \"1 bar\", pre_exponential = 2, temperature_exponent = 0, activation_energy = 0}]\n")
	f.Add(tinyHeader + "\n[[reaction]]\nequation = \"H + O2 <=> O + OH\"\n[reaction.chebyshev]\nT_range_K = [300, 2000]\npressure_range = [\"0.1 atm\", \"10 atm\"]\ncoefficients = [[1, 2], [3, 4]]\nrate_constant_unit = \"cm^3/molecule/s\"\n")
	f.Add("format_version = 1\nelements = [\"H\"]\n[[species]]\nname = \"H\"\natoms = {H = 1}\nnasa7 = {T_range_K = [300, 1000, 3000], low_T_coefficients = [2.5, 0, 0, 0, 0, 0, 0], high_T_coefficients = [2.5, 0, 0, 0, 0, 0, 0]}\n")
	f.Add(tinyHeader + "\n[validity]\nfuels = [\"H2\"]\npressure_range = [\"10 Torr\", 10]\nequivalence_ratio_range = [0.5, 0]\n\n[[reaction]]\nequation = \"H + O2 <=> O + OH\"\nrate_uncertainty_factor = 2\narrhenius = {pre_exponential = 1, temperature_exponent = 0, activation_energy = 0}\n")
	f.Add("")
	f.Add("[[reaction]]\nequation = \"(+M)\"\n")
	f.Add("species = [{name = 1}]\nreaction = 3\n")
	f.Add("a = '''\n[[x]]'''\n[[x]]\n[x.y]\nz = {a.b = [1, {c = 2}]}\n")
	f.Fuzz(func(t *testing.T, text string) {
		m, problems, err := Read(strings.NewReader(text), "fuzz.toml")
		for _, p := range problems {
			if p.Pos.File != "fuzz.toml" && p.Pos.File != "" {
				t.Fatalf("problem without the file name: %+v", p)
			}
		}
		if (m == nil) == (err == nil) {
			t.Fatalf("mechanism %v and error %v: exactly one must be set", m != nil, err)
		}
		if m == nil {
			return
		}
		var buf bytes.Buffer
		if err := Write(&buf, m); err != nil {
			t.Fatalf("Write of an accepted mechanism: %v", err)
		}
		back, _, err := Read(bytes.NewReader(buf.Bytes()), "again.toml")
		if err != nil {
			t.Fatalf("written file does not read back: %v\n%s", err, buf.String())
		}
		for i := range m.Reactions {
			if m.Reactions[i].Equation == "" {
				t.Fatal("an accepted reaction has no equation text")
			}
		}
		if d := Diff(m, back); d != "" {
			t.Fatalf("round trip changed %s\n%s", d, buf.String())
		}
	})
}
