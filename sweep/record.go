package sweep

import (
	"encoding/gob"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"

	"flame1d/flame"
	"flame1d/output"
	"flame1d/study"
)

// Status is the state of one point of a sweep.
type Status string

const (
	Solved  Status = "solved"
	Failed  Status = "failed"
	Pending Status = "pending" // not committed yet
)

// ColdStart is the ContinuedFrom value of a point solved from the built-in
// initial guess.
const ColdStart = "cold"

// Record is a committed point: point.json. A solved point carries the
// flame's summary values; a failed one the reason, and no numbers.
type Record struct {
	ID                   string  `json:"id"`
	EquivalenceRatio     float64 `json:"equivalence_ratio"`
	UnburnedTemperatureK float64 `json:"unburned_temperature_K"`
	PressurePa           float64 `json:"pressure_Pa"`
	Status               Status  `json:"status"`
	// Reason says why a failed point failed (the last attempt's error).
	Reason string `json:"reason,omitempty"`
	// ContinuedFrom is the id of the neighbour the result continued from,
	// or "cold".
	ContinuedFrom string    `json:"continued_from,omitempty"`
	Attempts      []Attempt `json:"attempts"`

	FlameSpeed           float64 `json:"flame_speed_m_s,omitempty"`
	BurnedTemperature    float64 `json:"burned_temperature_K,omitempty"`
	AdiabaticTemperature float64 `json:"adiabatic_temperature_K,omitempty"`
	ThermalThickness     float64 `json:"thermal_thickness_m,omitempty"`
	PeakHeatReleaseX     float64 `json:"peak_heat_release_position_m,omitempty"`
	GridPoints           int     `json:"grid_points,omitempty"`
	// NewtonIterations are those of the solve that succeeded.
	NewtonIterations int `json:"newton_iterations,omitempty"`
	// WallTimeS is the time of all attempts, s.
	WallTimeS float64 `json:"wall_time_s"`
}

// Attempt is one try at solving a point.
type Attempt struct {
	// Start is the id of the neighbour the attempt continued from, or
	// "cold".
	Start     string  `json:"start"`
	Error     string  `json:"error,omitempty"`
	WallTimeS float64 `json:"wall_time_s"`
}

// Condition returns the record's condition.
func (r *Record) Condition() study.Condition {
	return study.Condition{Phi: r.EquivalenceRatio, T: r.UnburnedTemperatureK, P: r.PressurePa}
}

// fill copies a solved flame's summary into the record; it refuses values
// that are not finite numbers.
func (r *Record) fill(res *study.Result) error {
	s := res.Summary
	for _, v := range []struct {
		name string
		v    float64
	}{
		{"flame speed", s.FlameSpeed}, {"burned temperature", s.BurnedTemperature},
		{"adiabatic temperature", s.AdiabaticTemperature}, {"thermal thickness", s.ThermalThickness},
		{"peak heat-release position", s.PeakHeatReleaseX},
	} {
		if math.IsNaN(v.v) || math.IsInf(v.v, 0) {
			return fmt.Errorf("the solved flame's %s is not a finite number (%g)", v.name, v.v)
		}
	}
	if !(s.FlameSpeed > 0) {
		return fmt.Errorf("the solved flame's speed %g m/s is not positive", s.FlameSpeed)
	}
	r.FlameSpeed, r.BurnedTemperature, r.AdiabaticTemperature = s.FlameSpeed, s.BurnedTemperature, s.AdiabaticTemperature
	r.ThermalThickness, r.PeakHeatReleaseX = s.ThermalThickness, s.PeakHeatReleaseX
	r.GridPoints, r.NewtonIterations = s.GridPoints, s.NewtonIterations
	return nil
}

const (
	pointsDir  = "points"
	recordName = "point.json"
	stateName  = "state.gob"
)

func pointDir(dir, id string) string { return filepath.Join(dir, pointsDir, id) }

func writeRecord(dir string, r *Record) error {
	return output.WriteFileAtomic(filepath.Join(pointDir(dir, r.ID), recordName), func(w io.Writer) error {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(r)
	})
}

// readRecords reads the committed records of the given points; points
// without a point.json are absent from the map. A record whose condition is
// not its point's is an error: the folder was tampered with.
func readRecords(dir string, plan *Plan, points []int) (map[int]*Record, error) {
	out := make(map[int]*Record)
	for _, i := range points {
		pt := plan.Points[i]
		path := filepath.Join(pointDir(dir, pt.ID), recordName)
		b, err := os.ReadFile(path)
		if errors.Is(err, fs.ErrNotExist) {
			continue
		}
		if err != nil {
			return nil, fmt.Errorf("sweep point %s: %w", pt.ID, err)
		}
		var r Record
		if err := json.Unmarshal(b, &r); err != nil {
			return nil, fmt.Errorf("%s: not a readable point record (%v); delete the folder %s to solve the point again", path, err, pointDir(dir, pt.ID))
		}
		if r.ID != pt.ID || r.Condition() != pt.Condition {
			return nil, fmt.Errorf("%s: records %s (%v), expected %s (%v); delete the folder to solve the point again",
				path, r.ID, r.Condition(), pt.ID, pt.Condition)
		}
		if r.Status != Solved && r.Status != Failed {
			return nil, fmt.Errorf("%s: status %q is neither %q nor %q", path, r.Status, Solved, Failed)
		}
		out[i] = &r
	}
	return out, nil
}

// savedState is a converged flame as written to state.gob: exactly the
// numbers continuation starts from, so that a resumed sweep continues from
// the same state as an uninterrupted one.
type savedState struct {
	Format        string
	Species       []string
	Inlet         flame.Inlet
	X, U          []float64
	AnchorX       float64
	AnchorT       float64
	AdiabaticT    float64
	InitialLength float64
}

const stateFormat = "flame1d converged flame state, version 1"

func writeState(dir, id string, sol *flame.Solution) error {
	st := savedState{Format: stateFormat, Inlet: sol.Inlet, X: sol.X, U: sol.U,
		AnchorX: sol.AnchorX, AnchorT: sol.AnchorT, AdiabaticT: sol.AdiabaticT, InitialLength: sol.InitialLength}
	if sol.Mechanism != nil {
		for _, s := range sol.Mechanism.Species {
			st.Species = append(st.Species, s.Name)
		}
	}
	return output.WriteFileAtomic(filepath.Join(pointDir(dir, id), stateName), func(w io.Writer) error {
		return gob.NewEncoder(w).Encode(&st)
	})
}

// readState reads a committed point's converged state. The solution has no
// mechanism; the solver that continues from it binds its own (after checking
// the species list).
func readState(dir, id string) (*flame.Solution, []string, error) {
	path := filepath.Join(pointDir(dir, id), stateName)
	f, err := os.Open(path)
	if err != nil {
		return nil, nil, fmt.Errorf("converged state of %s: %w", id, err)
	}
	defer f.Close()
	var st savedState
	if err := gob.NewDecoder(f).Decode(&st); err != nil {
		return nil, nil, fmt.Errorf("%s: not a readable flame state: %w", path, err)
	}
	if st.Format != stateFormat {
		return nil, nil, fmt.Errorf("%s: format %q, this flame1d reads %q", path, st.Format, stateFormat)
	}
	sol := &flame.Solution{Inlet: st.Inlet, X: st.X, U: st.U, AnchorX: st.AnchorX, AnchorT: st.AnchorT,
		AdiabaticT: st.AdiabaticT, InitialLength: st.InitialLength}
	return sol, st.Species, nil
}
