package main

import (
	"bytes"
	"encoding/json"
	"math"
	"path/filepath"
	"strings"
	"testing"
)

func runCmd(t *testing.T, args ...string) (string, error) {
	t.Helper()
	cmd := newRootCmd()
	var out bytes.Buffer
	cmd.SetOut(&out)
	cmd.SetErr(&out)
	cmd.SetArgs(args)
	err := cmd.Execute()
	return out.String(), err
}

var keroseneExample = filepath.Join("..", "..", "examples", "fuels", "kerosenes.toml")

func TestPoolCommandText(t *testing.T) {
	out, err := runCmd(t, "pool", keroseneExample)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{
		"fuel ref-kerosene (cracked pool)", "fuel syn-kerosene (cracked pool)", "fuel heptane (neat/surrogate)",
		"LHV 43.2000 MJ/kg", "closure residuals", "all given yields scaled by", "balance species",
		"KERO => ", "cracking time 0.1 ms at 1300 K", "Tee, Gotoh & Stewart",
		"not possible: pre-cracked inlet", "model predictions",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("pool output lacks %q", want)
		}
	}
}

func TestPoolCommandJSON(t *testing.T) {
	out, err := runCmd(t, "pool", keroseneExample, "--fuel", "syn-kerosene-precracked", "--temperature", "650 K", "--phi", "0.8", "--json")
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Mechanism string `json:"mechanism"`
		Fuels     []struct {
			Fuel   string `json:"fuel"`
			Report struct {
				Mode             string  `json:"mode"`
				LHV              float64 `json:"lower_heating_value_J_kg"`
				CrackingEnthalpy float64 `json:"cracking_enthalpy_J_kg"`
				Pool             []struct {
					Mass float64 `json:"kg_per_kg_fuel"`
				} `json:"pool"`
			} `json:"report"`
			Inlet struct {
				T     float64 `json:"inlet_temperature_K"`
				Shift float64 `json:"temperature_shift_K"`
				Err   string  `json:"error"`
			} `json:"inlet"`
		} `json:"fuels"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	if doc.Mechanism != "lu2009-heptane" || len(doc.Fuels) != 1 {
		t.Fatalf("mechanism %q, %d fuels", doc.Mechanism, len(doc.Fuels))
	}
	f := doc.Fuels[0]
	if f.Report.Mode != "pre-cracked" || f.Report.LHV != 43.9e6 {
		t.Errorf("mode %q, LHV %g", f.Report.Mode, f.Report.LHV)
	}
	// The pool's masses add up to the fuel's (element closure).
	sum := 0.0
	for _, p := range f.Report.Pool {
		sum += p.Mass
	}
	if math.Abs(sum-1) > 1e-12 {
		t.Errorf("pool mass %.15g kg per kg of fuel, want 1", sum)
	}
	// Endothermic cracking: the pool enters colder than 650 K.
	if f.Inlet.Err != "" || !(f.Inlet.Shift < 0) || math.Abs(f.Inlet.T-650-f.Inlet.Shift) > 1e-9 {
		t.Errorf("inlet %+v: want a temperature below 650 K", f.Inlet)
	}
}

func TestPoolCommandErrors(t *testing.T) {
	if _, err := runCmd(t, "pool", keroseneExample, "--fuel", "jet-z"); err == nil || !strings.Contains(err.Error(), "the file defines") {
		t.Errorf("unknown fuel: err = %v", err)
	}
	if _, err := runCmd(t, "pool", keroseneExample, "--temperature", "hot"); err == nil || !strings.Contains(err.Error(), "--temperature") {
		t.Errorf("bad temperature: err = %v", err)
	}
	if out, err := runCmd(t, "pool", "--help"); err != nil || !strings.Contains(out, "Examples:") {
		t.Errorf("help: %v\n%s", err, out)
	}
}

// A case file's [mixture] sets the inlet shown unless a flag overrides it:
// examples/kerosene-compare.toml is at 450 K.
func TestPoolCommandUsesCaseConditions(t *testing.T) {
	example := filepath.Join("..", "..", "examples", "kerosene-compare.toml")
	inlet := func(args ...string) (T, phi float64) {
		t.Helper()
		out, err := runCmd(t, append([]string{"pool", example, "--fuel", "surrogate", "--json"}, args...)...)
		if err != nil {
			t.Fatal(err)
		}
		var doc struct {
			Fuels []struct {
				Inlet struct {
					T   float64 `json:"unburned_temperature_K"`
					Phi float64 `json:"equivalence_ratio"`
				} `json:"inlet"`
			} `json:"fuels"`
		}
		if err := json.Unmarshal([]byte(out), &doc); err != nil || len(doc.Fuels) != 1 {
			t.Fatalf("%v\n%s", err, out)
		}
		return doc.Fuels[0].Inlet.T, doc.Fuels[0].Inlet.Phi
	}
	if T, phi := inlet(); T != 450 || phi != 1 {
		t.Errorf("case conditions: %g K, phi %g; want 450 K, 1", T, phi)
	}
	if T, phi := inlet("--temperature", "500 K", "--phi", "0.7"); T != 500 || phi != 0.7 {
		t.Errorf("flags: %g K, phi %g; want 500 K, 0.7", T, phi)
	}
	// A fuel file without [mixture]: 298.15 K.
	out, err := runCmd(t, "pool", keroseneExample, "--fuel", "heptane")
	if err != nil || !strings.Contains(out, "at 298.15 K") {
		t.Errorf("fuel file default: %v\n%s", err, out)
	}
}
