package sweep

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"path/filepath"

	"flame1d/internal/infile"
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

	FlameSpeed float64 `json:"flame_speed_m_s,omitempty"`
	// FlameSpeedSigma is the 1σ rate-constant band of S_L, m/s; 0 without
	// sensitivities.
	FlameSpeedSigma      float64 `json:"flame_speed_sigma_m_s,omitempty"`
	BurnedTemperature    float64 `json:"burned_temperature_K,omitempty"`
	AdiabaticTemperature float64 `json:"adiabatic_temperature_K,omitempty"`
	ThermalThickness     float64 `json:"thermal_thickness_m,omitempty"`
	PeakHeatReleaseX     float64 `json:"peak_heat_release_position_m,omitempty"`
	GridPoints           int     `json:"grid_points,omitempty"`
	// NewtonIterations are those of the attempt that succeeded, its
	// intermediate steps included.
	NewtonIterations int `json:"newton_iterations,omitempty"`
	// WallTimeS is the time of all attempts, s.
	WallTimeS float64 `json:"wall_time_s"`
}

// Attempt is one try at solving a point.
type Attempt struct {
	// Start is the id of the neighbour the attempt continued from, or
	// "cold".
	Start string `json:"start"`
	// Intermediate are the values of the chain variable solved on the way
	// from the start (see steps.go); they are not reported as points.
	Intermediate     []float64 `json:"intermediate,omitempty"`
	NewtonIterations int       `json:"newton_iterations,omitempty"`
	Error            string    `json:"error,omitempty"`
	WallTimeS        float64   `json:"wall_time_s"`
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
		{"peak heat-release position", s.PeakHeatReleaseX}, {"flame-speed band", s.FlameSpeedSigma},
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
	r.GridPoints = s.GridPoints
	r.FlameSpeedSigma = s.FlameSpeedSigma
	return nil
}

const (
	pointsDir  = "points"
	recordName = "point.json"
)

func pointDir(dir, id string) string { return filepath.Join(dir, pointsDir, id) }

// commitPoint writes a point's folder, points/<id>/ (the flame files of a
// solved point, and point.json), as one output.Set: a point is committed
// whole or not at all, and committing it costs the same whatever the size
// of the sweep. res is nil for a failed point.
func commitPoint(dir string, r *Record, res *study.Result) error {
	set, err := output.NewOwnedSet(pointDir(dir, r.ID))
	if err != nil {
		return err
	}
	defer set.Abort()
	if res != nil {
		if err := study.WriteFlameTables(set.Dir(), res); err != nil {
			return err
		}
	}
	err = set.WriteFile(recordName, func(w io.Writer) error {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(r)
	})
	if err != nil {
		return err
	}
	return set.Commit()
}

// readRecords reads the committed records of the given points; points
// without a point.json are absent from the map. A record whose condition is
// not its point's is an error: the folder was tampered with.
func readRecords(dir string, plan *Plan, points []int) (map[int]*Record, error) {
	out := make(map[int]*Record)
	for _, i := range points {
		pt := plan.Points[i]
		path := filepath.Join(pointDir(dir, pt.ID), recordName)
		b, err := infile.ReadFile(path, infile.Record)
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
