package builtin

import (
	"strings"

	"flame1d/chem"
)

// Entry describes one built-in mechanism: what it is, its size, whom to
// cite and what it was validated for. It is what "flame1d mech list"
// shows; the JSON keys are those of its --json output.
type Entry struct {
	Name      string `json:"name"`
	Title     string `json:"title"` // what it is, one line
	Species   int    `json:"species"`
	Reactions int    `json:"reactions"`
	Citation  string `json:"citation"` // the publication to cite
	// ValidFor says in words what it was built and validated for
	// (chem.Validity.Summary).
	ValidFor string `json:"validated_for"`
	// The same, as data; a range is omitted when not stated, and a zero
	// bound of a range means "not stated".
	Fuels               []string  `json:"validated_fuels,omitempty"`
	UnburnedTemperature []float64 `json:"unburned_temperature_range_K,omitempty"`
	Pressure            []float64 `json:"pressure_range_Pa,omitempty"`
	EquivalenceRatio    []float64 `json:"equivalence_ratio_range,omitempty"`
	ValiditySource      string    `json:"validity_source,omitempty"`
}

// Catalogue describes every built-in mechanism, in name order. It parses
// each one (a few tens of milliseconds for the largest).
func Catalogue() ([]Entry, error) {
	names := Names()
	out := make([]Entry, 0, len(names))
	for _, name := range names {
		m, err := Mechanism(name)
		if err != nil {
			return nil, err
		}
		out = append(out, entryOf(m))
	}
	return out, nil
}

// entryOf describes a mechanism whose description opens, as every
// built-in's does, with a title line and then a citation paragraph.
func entryOf(m *chem.Mechanism) Entry {
	paragraphs := strings.SplitN(m.Description, "\n\n", 3)
	e := Entry{Name: m.Name, Species: len(m.Species), Reactions: len(m.Reactions), ValidFor: m.Validity.Summary()}
	e.Title = strings.TrimSpace(paragraphs[0])
	if len(paragraphs) > 1 {
		e.Citation = strings.TrimSpace(paragraphs[1])
	}
	if v := m.Validity; v != nil {
		e.Fuels = v.Fuels
		e.UnburnedTemperature = stated(v.Temperature)
		e.Pressure = stated(v.Pressure)
		e.EquivalenceRatio = stated(v.EquivalenceRatio)
		e.ValiditySource = v.Source
	}
	return e
}

// stated is r as a slice, nil when neither bound is stated.
func stated(r [2]float64) []float64 {
	if r == [2]float64{} {
		return nil
	}
	return r[:]
}

// Covering names the built-ins whose validated fuels include every one of
// species, in name order: the better choice to suggest when a flame's fuel
// or pool species lie outside its mechanism's validity. Names are compared
// without regard to case, since mechanisms spell species differently
// (NC7H16, nc7h16).
func Covering(species []string) ([]string, error) {
	entries, err := Catalogue()
	if err != nil {
		return nil, err
	}
	var out []string
	for _, e := range entries {
		if len(e.Fuels) > 0 && coversAll(e.Fuels, species) {
			out = append(out, e.Name)
		}
	}
	return out, nil
}

func coversAll(fuels, species []string) bool {
	for _, s := range species {
		found := false
		for _, f := range fuels {
			if strings.EqualFold(f, s) {
				found = true
				break
			}
		}
		if !found {
			return false
		}
	}
	return true
}
