package flame

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"flame1d/chem"
)

// A restart file is a CSV of the full solution state: position,
// temperature, every species mass fraction and the mass flux, with the
// anchor and the inlet state in '#' header lines. It is what SolveFrom needs
// to continue from a solved flame in another run, on the same or another
// mechanism (species are matched by name; missing ones start at zero).
const restartMagic = "flame1d restart"

// WriteRestart writes the solution as a restart file.
func (s *Solution) WriteRestart(w io.Writer) error {
	K := s.NumSpecies()
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "# %s\n", restartMagic)
	fmt.Fprintf(bw, "# mechanism %s\n", s.Mechanism.Name)
	fmt.Fprintf(bw, "# anchor_x_m %s\n", ff(s.AnchorX))
	fmt.Fprintf(bw, "# anchor_T_K %s\n", ff(s.AnchorT))
	fmt.Fprintf(bw, "# initial_length_m %s\n", ff(s.InitialLength))
	fmt.Fprintf(bw, "# inlet_T_K %s\n", ff(s.Inlet.T))
	fmt.Fprintf(bw, "# pressure_Pa %s\n", ff(s.Inlet.P))
	cw := csv.NewWriter(bw)
	head := []string{"x [m]", "T [K]", "mass_flux [kg/m2/s]"}
	for k := 0; k < K; k++ {
		head = append(head, "Y_"+s.Mechanism.Species[k].Name+" [-]")
	}
	if err := cw.Write(head); err != nil {
		return err
	}
	rec := make([]string, len(head))
	inlet := make([]string, len(head))
	inlet[0], inlet[1], inlet[2] = "inlet", ff(s.Inlet.T), ""
	for k := 0; k < K; k++ {
		inlet[3+k] = ff(s.Inlet.Y[k])
	}
	if err := cw.Write(inlet); err != nil {
		return err
	}
	for j := range s.X {
		rec[0], rec[1], rec[2] = ff(s.X[j]), ff(s.T(j)), ff(s.MassFlux())
		for k, y := range s.Y(j) {
			if math.IsNaN(y) || math.IsInf(y, 0) {
				return fmt.Errorf("restart: mass fraction at point %d is not finite", j)
			}
			rec[3+k] = ff(y)
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	if err := cw.Error(); err != nil {
		return err
	}
	return bw.Flush()
}

func ff(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// ReadRestart reads a restart file onto mechanism m. file names the source
// in errors.
func ReadRestart(r io.Reader, file string, m *chem.Mechanism) (*Solution, error) {
	br := bufio.NewReader(r)
	meta := map[string]float64{}
	line := 0
	var body strings.Builder
	magic := false
	for {
		s, err := br.ReadString('\n')
		if s == "" && err != nil {
			break
		}
		line++
		if strings.HasPrefix(s, "#") {
			f := strings.Fields(strings.TrimPrefix(s, "#"))
			if strings.Join(f, " ") == restartMagic {
				magic = true
			}
			if len(f) == 2 {
				if v, err := strconv.ParseFloat(f[1], 64); err == nil {
					meta[f[0]] = v
				}
			}
			continue
		}
		body.WriteString(s)
		if err != nil {
			break
		}
	}
	if !magic {
		return nil, fmt.Errorf("%s: not a flame1d restart file (no %q header)", file, restartMagic)
	}
	for _, k := range []string{"anchor_x_m", "anchor_T_K", "inlet_T_K", "pressure_Pa"} {
		if _, ok := meta[k]; !ok {
			return nil, fmt.Errorf("%s: restart header lacks %s", file, k)
		}
	}
	rows, err := csv.NewReader(strings.NewReader(body.String())).ReadAll()
	if err != nil {
		return nil, fmt.Errorf("%s: %w", file, err)
	}
	if len(rows) < 5 {
		return nil, fmt.Errorf("%s: restart file has too few rows", file)
	}
	K := len(m.Species)
	b := blockSize(K)
	col := make([]int, len(rows[0])) // CSV column -> species index, or -1
	for c, h := range rows[0] {
		col[c] = -1
		if c >= 3 {
			name := strings.TrimSuffix(strings.TrimPrefix(h, "Y_"), " [-]")
			col[c] = m.SpeciesIndex(name)
		}
	}
	sol := &Solution{Mechanism: m, AnchorX: meta["anchor_x_m"], AnchorT: meta["anchor_T_K"],
		InitialLength: meta["initial_length_m"], Inlet: Inlet{T: meta["inlet_T_K"], P: meta["pressure_Pa"], Y: make([]float64, K)}}
	num := func(row, c int) (float64, error) {
		v, err := strconv.ParseFloat(rows[row][c], 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, fmt.Errorf("%s: data row %d, column %q: %q is not a finite number", file, row, rows[0][c], rows[row][c])
		}
		return v, nil
	}
	for row := 1; row < len(rows); row++ {
		if len(rows[row]) != len(rows[0]) {
			return nil, fmt.Errorf("%s: data row %d has %d fields, header has %d", file, row, len(rows[row]), len(rows[0]))
		}
		if rows[row][0] == "inlet" {
			for c := 3; c < len(rows[row]); c++ {
				if col[c] >= 0 {
					v, err := num(row, c)
					if err != nil {
						return nil, err
					}
					sol.Inlet.Y[col[c]] = v
				}
			}
			continue
		}
		u := make([]float64, b)
		x, err := num(row, 0)
		if err != nil {
			return nil, err
		}
		if u[compT], err = num(row, 1); err != nil {
			return nil, err
		}
		if u[compM(K)], err = num(row, 2); err != nil {
			return nil, err
		}
		sum := 0.0
		for c := 3; c < len(rows[row]); c++ {
			if col[c] < 0 {
				continue
			}
			v, err := num(row, c)
			if err != nil {
				return nil, err
			}
			u[1+col[c]] = v
			sum += v
		}
		if !(sum > 0) {
			return nil, fmt.Errorf("%s: data row %d has no species of mechanism %s", file, row, m.Name)
		}
		for k := 0; k < K; k++ {
			u[1+k] /= sum
		}
		if n := len(sol.X); n > 0 && !(x > sol.X[n-1]) {
			return nil, fmt.Errorf("%s: data row %d: positions must increase", file, row)
		}
		sol.X = append(sol.X, x)
		sol.U = append(sol.U, u...)
	}
	sumIn := 0.0
	for _, y := range sol.Inlet.Y {
		sumIn += y
	}
	if !(sumIn > 0) {
		return nil, fmt.Errorf("%s: restart inlet row missing or without species of mechanism %s", file, m.Name)
	}
	for k := range sol.Inlet.Y {
		sol.Inlet.Y[k] /= sumIn
	}
	if sol.InitialLength == 0 {
		sol.InitialLength = sol.X[len(sol.X)-1] - sol.X[0]
	}
	return sol, nil
}
