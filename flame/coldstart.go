package flame

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"time"

	"flame1d/grid"
	"flame1d/newton"
	"flame1d/thermo"
)

// Solve computes the flame for the inlet, starting from a built-in initial
// guess (unburned gas joined to adiabatic equilibrium products) whose mass
// flux comes from a flame-speed estimate (startSpeed). If that start fails,
// it is retried up to coldStartRetries times with the guess four times lower
// or higher, the side read from each failure: a mass flux that fell during
// the failed attempt asks for a slower start, one that rose for a faster one
// (the estimate can be off by more than a factor of ten: lean hydrogen at
// high pressure). A side whose neighbour was already tried is approached by
// a factor of two instead. Only if all fail is the estimate tried once more,
// allowed to halve every interval of the grid when a solve fails.
func (s *Solver) Solve(in Inlet, set Settings) (*Solution, error) {
	start := time.Now()
	set, err := s.prepare(in, set)
	if err != nil {
		return nil, err
	}
	eq, err := adiabaticEquilibrium(s.ph, in)
	if err != nil {
		return nil, fmt.Errorf("adiabatic equilibrium of the inlet mixture: %w", err)
	}
	var stats Stats
	speed := startSpeed(in, eq.T)
	tried := []float64{speed}
	sol, err := s.coldStart(in, eq, set, speed, firstStart, &stats)
	first := err
	for r := 0; r < coldStartRetries && err != nil && errors.Is(err, ErrNotConverged); r++ {
		prev := tried[len(tried)-1]
		next := nextStartSpeed(prev, sol == nil || sol.MassFlux() < sol.startFlux, tried)
		s.report(set, "restart", 0, fmt.Sprintf("start-up with a %.2g m/s flame-speed guess failed; retrying with %.2g m/s", prev, next))
		tried = append(tried, next)
		sol, err = s.coldStart(in, eq, set, next, retry, &stats)
	}
	if err != nil && errors.Is(err, ErrNotConverged) {
		// Last resort: the estimate again, or the 0.4 m/s it is calibrated
		// to when that is more than twice away, now allowed to halve every
		// interval of the grid (twice) when a solve fails: thin flames can
		// be lost between the points of a coarse grid.
		last := speed
		if speed > 2*referenceSpeed || speed < referenceSpeed/2 {
			last = referenceSpeed
		}
		s.report(set, "restart", 0, fmt.Sprintf("retrying with %.2g m/s, refining the whole grid on failure", last))
		sol, err = s.coldStart(in, eq, set, last, lastResort, &stats)
		if err != nil && errors.Is(err, ErrNotConverged) {
			guesses := make([]string, len(tried))
			for i, v := range tried {
				guesses[i] = fmt.Sprintf("%.2g", v)
			}
			err = fmt.Errorf("%w (the start-up was tried with flame-speed guesses of %s m/s, and %.2g m/s with whole-grid refinement)",
				first, strings.Join(guesses, ", "), last)
			if note := crossoverNote(s.ph, in, eq); note != "" {
				err = fmt.Errorf("%w; %s", err, note)
			}
			return nil, err
		}
	}
	if err != nil {
		return nil, err
	}
	stats.WallTime = time.Since(start)
	sol.Stats = stats
	return sol, nil
}

// coldStartRetries is the number of start-up retries with other flame-speed
// guesses before the last resort.
const coldStartRetries = 3

// nextStartSpeed returns the flame-speed guess after a failed start from
// prev: coldStartRetryFactor times lower when slower is true, else higher;
// when a guess within a factor 1.5 of that was already tried, the square
// root of the factor (between the two), and when that too was tried, the
// other side.
func nextStartSpeed(prev float64, slower bool, tried []float64) float64 {
	near := func(v float64) bool {
		for _, t := range tried {
			if v < 1.5*t && t < 1.5*v {
				return true
			}
		}
		return false
	}
	f := float64(coldStartRetryFactor)
	if slower {
		f = 1 / f
	}
	for _, g := range []float64{f, math.Sqrt(f), 1 / f, 1 / math.Sqrt(f)} {
		if v := prev * g; !near(v) {
			return v
		}
	}
	return prev * f * f
}

// startKind says which attempt of a cold start this is.
type startKind int

const (
	firstStart startKind = iota // the estimated guess, steady Newton first
	retry                       // another guess, pseudo-time steps first
	lastResort                  // as retry, and whole-grid halving allowed
)

// coldStartRetryFactor is the ratio between the first flame-speed guess of a
// cold start and the retries.
const coldStartRetryFactor = 4

// referenceSpeed is the start-up flame speed (m/s) startSpeed gives
// stoichiometric methane/air at 298 K and 1 atm.
const referenceSpeed = 0.4

// startSpeed estimates the flame speed of the inlet (m/s) for the start-up
// profiles from its adiabatic temperature Tad (K): 0.4 m/s at the adiabatic
// temperature of stoichiometric methane/air at 298 K and 1 atm (2226 K,
// GRI-Mech 3.0 with this solver; S_L there is 0.36 m/s), scaled by the
// Zeldovich factor exp(-E/(2 R Tad)) with the overall activation energy of
// adaptGuess and by P^-1/2 (common practice, no source), and held within
// 0.005-3 m/s. Only the start depends on it; lean and rich mixtures, whose
// lower adiabatic temperatures make them slower, start nearer their answer
// (lean CH4/air at 40 atm burns at well under 0.05 m/s).
func startSpeed(in Inlet, Tad float64) float64 {
	const refTad = 2226.0 // K
	v := referenceSpeed * math.Exp(-overallActivation/(2*thermo.GasConstant)*(1/Tad-1/refTad)) * math.Sqrt(thermo.OneAtmosphere/in.P)
	return math.Min(math.Max(v, 0.005), 3)
}

// coldStart builds the start-up profiles for a flame-speed guess, solves the
// species on the fixed temperature profile, then runs the full refinement
// loop. A retry (after a failed start) begins the first full solve with
// pseudo-time steps instead of a steady Newton attempt, which from a poor
// start can wander into a state time stepping cannot leave; only the last
// resort may halve the whole grid after a failed solve (dear, and rarely
// what a failed start needs). On failure the returned solution, if any, is
// the last state reached.
func (s *Solver) coldStart(in Inlet, eq equilibriumState, set Settings, speed float64, kind startKind, stats *Stats) (*Solution, error) {
	guess, err := s.initialGuess(in, eq, set, speed)
	if err != nil {
		return nil, err
	}
	// Stage 1: species with the guessed temperature profile and mass flux.
	pr := s.problemFor(guess, set)
	pr.mode = equationMode{energy: false, freeFlux: false}
	copy(pr.fixedT, temperatures(guess))
	pr.fixedFlux = guess.MassFlux()
	s.report(set, "fixed-temperature", len(guess.X), "species with the guessed temperature profile")
	st := &stage{set: set, stats: stats, startUp: true}
	err = s.newtonSolve(st, pr, guess.U, true)
	st.startUp = false
	// The stage only seeds the full solve: if it has not converged after
	// its few pseudo-time attempts, the state its time steps reached
	// (sound, if not a root) seeds the full solve, which then starts with
	// time steps. Rich CH4/air at 500 K and 40 atm spent 40 s in a stage
	// that failed after 20 attempts, then three more starts (7958
	// iterations in all); seeded from a failed stage it converges on the
	// first guess (1217 iterations).
	seedUnconverged := false
	if err != nil {
		if !errors.Is(err, newton.ErrNotConverged) {
			return nil, fmt.Errorf("%w: fixed-temperature start-up stage: %v", ErrNotConverged, err)
		}
		s.report(set, "fixed-temperature", len(guess.X), "not converged; its last state seeds the full equations")
		seedUnconverged = true
	}
	// The energy equation changes the problem's time scales: its
	// pseudo-time steps start afresh.
	st.timeStep = 0
	st.timeStepsFirst = kind != firstStart || seedUnconverged
	if kind == lastResort {
		st.regrids = 2
	}
	return s.refineLoop(guess, st)
}

// minFlameRise is the smallest adiabatic temperature rise (K) for which a
// flame is sought. The leanest flammable hydrocarbon/air and hydrogen/air
// mixtures still burn some 1000 K and 300-400 K above their inlet
// (Zabetakis 1965, US Bureau of Mines Bull. 627; from memory): below 150 K no
// self-sustaining premixed flame exists.
const minFlameRise = 150

// anchorFraction caps the anchor's share of the temperature rise.
const anchorFraction = 0.25

// anchorRise is the temperature rise above the inlet (K) at which the flame
// is pinned: Settings.AnchorRise, but at most a quarter of the adiabatic
// rise Tad - Tin, so that weak flames (very lean or rich, strongly diluted)
// are anchored inside their own temperature rise instead of being refused.
// For flames rising more than 1600 K the default 400 K applies unchanged.
func anchorRise(set Settings, Tin, Tad float64) float64 {
	return math.Min(set.AnchorRise, anchorFraction*(Tad-Tin))
}

// initialGuess builds the start-up profiles: a smooth temperature rise from
// the inlet to the adiabatic equilibrium temperature, compositions blended
// between inlet and equilibrium products, and the mass flux of a flame
// moving at speed (m/s).
func (s *Solver) initialGuess(in Inlet, eq equilibriumState, set Settings, speed float64) (*Solution, error) {
	K := s.ph.nSpecies
	if eq.T-in.T < minFlameRise {
		return nil, fmt.Errorf("mixture is not flammable: complete combustion raises its temperature only %.0f K (adiabatic equilibrium %.0f K), "+
			"less than the %.0f K a self-sustaining premixed flame needs; check the equivalence ratio and the fuel/oxidizer composition",
			eq.T-in.T, eq.T, float64(minFlameRise))
	}
	L := set.DomainLength
	if L == 0 {
		// The flame thickness scales roughly as P^-0.5 to P^-1; 2 cm at 1 atm
		// holds a hydrocarbon flame and its post-flame zone.
		L = 0.04 * math.Pow(in.P/thermo.OneAtmosphere, -0.6)
		L = math.Min(math.Max(L, 4e-3), 0.1)
	}
	xc := 0.15 * L
	width := 0.05 * L
	x := grid.Clustered(0, L, xc, width, set.InitialPoints)
	b := blockSize(K)
	u := make([]float64, len(x)*b)
	anchorT := in.T + anchorRise(set, in.T, eq.T)
	// Smooth profile: fraction 0 -> 1 across the clustered zone.
	frac := func(xv float64) float64 { return 0.5 * (1 + math.Tanh((xv-xc)/(0.25*width))) }
	rhoU := in.P * meanMolarMassY(s.ph, in.Y) / (thermo.GasConstant * in.T)
	mGuess := rhoU * speed
	for j, xv := range x {
		f := frac(xv)
		if j == 0 {
			f = 0
		}
		base := j * b
		u[base+compT] = in.T + f*(eq.T-in.T)
		for k := 0; k < K; k++ {
			u[base+1+k] = (1-f)*in.Y[k] + f*eq.Y[k]
		}
		u[base+compM(K)] = mGuess
	}
	// Place the anchor at the grid point nearest the anchor temperature and
	// make the guess pass through it exactly.
	ja := nearestTemperature(u, b, len(x), anchorT)
	u[ja*b+compT] = anchorT
	return &Solution{Mechanism: s.ph.mech, Inlet: in, X: x, U: u, AnchorX: x[ja], AnchorT: anchorT, AdiabaticT: eq.T, InitialLength: L,
		startFlux: mGuess}, nil
}

// nearestTemperature returns the interior point whose temperature is
// closest to T.
func nearestTemperature(u []float64, b, n int, T float64) int {
	ja := 1
	for j := 1; j < n-1; j++ {
		if math.Abs(u[j*b+compT]-T) < math.Abs(u[ja*b+compT]-T) {
			ja = j
		}
	}
	return ja
}
