package mechtoml

import (
	"fmt"
	"strconv"
	"strings"

	"flame1d/chem"
)

// The [validity] table states the fuels and conditions a mechanism was
// built and validated for (chem.Validity). Each range is [low, high]; a
// bound of 0 means "not stated".
const (
	validityFuels       = "fuels"
	validityTemperature = "unburned_temperature_range_K"
	validityPressure    = "pressure_range"
	validityPhi         = "equivalence_ratio_range"
	validitySource      = "source"
)

func (rd *reader) readValidity(v any) *chem.Validity {
	path := []string{"validity"}
	t, ok := rd.table(v, path, "", "validity")
	if !ok {
		return nil
	}
	rd.checkKeys(t, path, "", validityFuels, validityTemperature, validityPressure, validityPhi, validitySource)
	val := &chem.Validity{}
	if v, ok := t[validityFuels]; ok {
		p := sub(path, validityFuels)
		if a, ok := rd.array(v, p, "", "validity.fuels"); ok {
			seen := make(map[string]bool, len(a))
			for i, e := range a {
				pe := sub(p, strconv.Itoa(i))
				name, ok := rd.str(e, pe, "", fmt.Sprintf("fuel %d", i+1))
				if !ok {
					continue
				}
				switch {
				case rd.speciesIndex(name) < 0:
					rd.errorf(pe, "", "validity fuel %q is not a species of the mechanism", name)
				case seen[name]:
					rd.errorf(pe, "", "validity fuel %q is listed twice", name)
				}
				seen[name] = true
				val.Fuels = append(val.Fuels, name)
			}
		}
	}
	ranges := []struct {
		key string
		k   kind
		dst *[2]float64
	}{
		{validityTemperature, temperature, &val.Temperature},
		{validityPressure, pressure, &val.Pressure},
		{validityPhi, dimensionless, &val.EquivalenceRatio},
	}
	for _, r := range ranges {
		v, ok := t[r.key]
		if !ok {
			continue
		}
		p := sub(path, r.key)
		x, ok := rd.numbers(v, p, "", 2, r.k)
		if !ok {
			continue
		}
		switch {
		case x[0] < 0 || x[1] < 0:
			rd.errorf(p, "", "validity.%s bounds must not be negative (0: not stated)", r.key)
		case x[0] > 0 && x[1] > 0 && x[0] > x[1]:
			rd.errorf(p, "", "validity.%s must be [low, high], low first", r.key)
		}
		r.dst[0], r.dst[1] = x[0], x[1]
	}
	if v, ok := t[validitySource]; ok {
		val.Source, _ = rd.str(v, sub(path, validitySource), "", "validity.source")
	}
	return val
}

// validity writes the [validity] table.
func (w *writer) validity(v *chem.Validity) error {
	for _, f := range v.Fuels {
		if _, ok := w.index[f]; !ok {
			return fmt.Errorf("validity fuel %q is not a species of the mechanism", f)
		}
	}
	for _, x := range [][2]float64{v.Temperature, v.Pressure, v.EquivalenceRatio} {
		if x[0] < 0 || x[1] < 0 || x[0] > 0 && x[1] > 0 && x[0] > x[1] {
			return fmt.Errorf("validity range %v is not [low, high] with bounds >= 0", x)
		}
	}
	b := &w.b
	b.WriteString("\n[validity]\n")
	if len(v.Fuels) > 0 {
		names := make([]string, len(v.Fuels))
		for i, f := range v.Fuels {
			s, err := w.text("validity fuel", f)
			if err != nil {
				return err
			}
			names[i] = s
		}
		fmt.Fprintf(b, "%s = [%s]\n", validityFuels, strings.Join(names, ", "))
	}
	for _, r := range []struct {
		key string
		x   [2]float64
		f   func(float64) string
	}{
		{validityTemperature, v.Temperature, w.num},
		{validityPressure, v.Pressure, w.pressure},
		{validityPhi, v.EquivalenceRatio, w.num},
	} {
		if r.x != [2]float64{} {
			fmt.Fprintf(b, "%s = [%s, %s]\n", r.key, r.f(r.x[0]), r.f(r.x[1]))
		}
	}
	if v.Source != "" {
		s, err := w.text("validity source", v.Source)
		if err != nil {
			return err
		}
		fmt.Fprintf(b, "%s = %s\n", validitySource, s)
	}
	return w.err
}
