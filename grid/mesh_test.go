package grid

import (
	"math"
	"testing"
)

func TestUniform(t *testing.T) {
	tests := []struct {
		x0, x1 float64
		n      int
		ok     bool
	}{
		{0, 1, 2, true}, {0, 0.02, 31, true}, {-3, 5, 1001, true},
		{0, 1, 1, false}, {1, 0, 5, false}, {0, 0, 5, false},
		{0, math.Inf(1), 5, false}, {math.NaN(), 1, 5, false},
		{1, 1 + 1e-15, 100, false}, // points not distinct in float64
	}
	for _, tt := range tests {
		x := Uniform(tt.x0, tt.x1, tt.n)
		if !tt.ok {
			if x != nil {
				t.Errorf("Uniform(%g, %g, %d) = %d points, want nil", tt.x0, tt.x1, tt.n, len(x))
			}
			continue
		}
		if len(x) != tt.n || x[0] != tt.x0 || x[tt.n-1] != tt.x1 {
			t.Fatalf("Uniform(%g, %g, %d): %d points from %g to %g", tt.x0, tt.x1, tt.n, len(x), x[0], x[len(x)-1])
		}
		h := (tt.x1 - tt.x0) / float64(tt.n-1)
		for j := 1; j < tt.n; j++ {
			if math.Abs(x[j]-x[j-1]-h) > 1e-12*h {
				t.Errorf("Uniform(%g, %g, %d): spacing %g at %d, want %g", tt.x0, tt.x1, tt.n, x[j]-x[j-1], j, h)
			}
		}
	}
}

// TestClustered checks the start-up grid against its closed form: strictly
// increasing with exact ends, a uniform spacing hf inside the zone, a
// neighbour ratio of at most exp(0.2) (the spacing h = hf + 0.2 d grows by
// exp(0.2 Δ) per interval for an equidistributed step Δ = 1 of ∫dx/h), a
// spacing of at most 4 times the uniform one, and finer in the zone than
// anywhere outside it.
func TestClustered(t *testing.T) {
	tests := []struct {
		name                 string
		x0, x1, xc, width    float64
		n                    int
		minDensityGainInZone float64 // uniform spacing / spacing in the zone
	}{
		{"flame start-up", 0, 0.02, 0.006, 0.002, 30, 2},
		{"many points", 0, 0.02, 0.006, 0.002, 400, 5},
		{"zone at the inlet", 0, 1, 0, 0.1, 60, 2},
		{"zone beyond the outlet", 0, 1, 1.2, 0.1, 60, 2},
		{"single position", -1, 1, 0.3, 0, 50, 2},
		{"negative coordinates", -0.05, -0.01, -0.03, 0.004, 80, 3},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			x := Clustered(tt.x0, tt.x1, tt.xc, tt.width, tt.n)
			if len(x) != tt.n || x[0] != tt.x0 || x[tt.n-1] != tt.x1 {
				t.Fatalf("%d points from %v to %v, want %d from %g to %g", len(x), first(x), last(x), tt.n, tt.x0, tt.x1)
			}
			checkStrict(t, x)
			if r := maxNeighbourRatio(x); r > math.Exp(clusterGrowth)*(1+1e-9) {
				t.Errorf("neighbour ratio %.6f, want <= exp(0.2) = %.6f", r, math.Exp(clusterGrowth))
			}
			uniform := (tt.x1 - tt.x0) / float64(tt.n-1)
			hIn, hOut := 0.0, math.Inf(1)
			for j := 0; j+1 < tt.n; j++ {
				h := x[j+1] - x[j]
				if h > clusterCap*uniform*(1+1e-9) {
					t.Errorf("interval %d: %g exceeds the cap 4*%g", j, h, uniform)
				}
				lo, hi := zoneOf(tt.x0, tt.x1, tt.xc, tt.width)
				switch {
				case x[j] >= lo && x[j+1] <= hi:
					hIn = math.Max(hIn, h)
				case x[j+1] < lo || x[j] > hi:
					hOut = math.Min(hOut, h)
				}
			}
			// The finest interval must touch the zone (or xc's nearest end).
			jmin := 0
			for j := 0; j+1 < tt.n; j++ {
				if x[j+1]-x[j] < x[jmin+1]-x[jmin] {
					jmin = j
				}
			}
			hmin := x[jmin+1] - x[jmin]
			lo, hi := zoneOf(tt.x0, tt.x1, tt.xc, tt.width)
			dist := math.Max(0, math.Max(x[jmin]-hi, lo-x[jmin+1]))
			t.Logf("finest %.3g at distance %.3g from the zone; widest in zone %.3g, finest outside %.3g, uniform %.3g",
				hmin, dist, hIn, hOut, uniform)
			if dist > 1e-12*(tt.x1-tt.x0) {
				t.Errorf("finest interval %.3g lies %.3g away from the zone", hmin, dist)
			}
			if uniform/hmin < tt.minDensityGainInZone {
				t.Errorf("finest spacing %.3g only %.2f times finer than uniform %.3g", hmin, uniform/hmin, uniform)
			}
			if hIn > 0 && hIn > hOut*(1+1e-9) {
				t.Errorf("zone spacing %.3g wider than spacing outside %.3g", hIn, hOut)
			}
		})
	}
}

// TestClusteredDegenerate: a zone covering the domain gives the uniform
// grid; invalid arguments give nil.
func TestClusteredDegenerate(t *testing.T) {
	x, u := Clustered(0, 1, 0.5, 2, 11), Uniform(0, 1, 11)
	for j := range u {
		if math.Abs(x[j]-u[j]) > 1e-12 {
			t.Errorf("zone over the whole domain: x[%d] = %.15g, uniform %.15g", j, x[j], u[j])
		}
	}
	if x := Clustered(0, 1, 0.5, 0.1, 2); len(x) != 2 || x[0] != 0 || x[1] != 1 {
		t.Errorf("n = 2: %v", x)
	}
	for _, bad := range [][5]float64{
		{0, 1, 0.5, 0.1, 1}, {1, 0, 0.5, 0.1, 10}, {0, 1, 0.5, -0.1, 10},
		{0, 1, math.NaN(), 0.1, 10}, {0, 1, 0.5, math.Inf(1), 10},
	} {
		if x := Clustered(bad[0], bad[1], bad[2], bad[3], int(bad[4])); x != nil {
			t.Errorf("Clustered%v = %d points, want nil", bad, len(x))
		}
	}
}

// zoneOf is the clustered zone of Clustered, moved inside the domain if it
// lies wholly outside.
func zoneOf(x0, x1, xc, width float64) (lo, hi float64) {
	if xc+width/2 < x0 {
		xc = x0 + width/2
	} else if xc-width/2 > x1 {
		xc = x1 - width/2
	}
	return xc - width/2, xc + width/2
}

func first(x []float64) any {
	if len(x) == 0 {
		return nil
	}
	return x[0]
}

func last(x []float64) any {
	if len(x) == 0 {
		return nil
	}
	return x[len(x)-1]
}
