package sweep

import (
	"reflect"
	"strings"
	"testing"

	"flame1d/study"
)

func TestPlanChainAlongEquivalenceRatio(t *testing.T) {
	// 0.6, 0.7, ..., 1.8: the head is the point nearest the middle of the
	// range (1.2), which lies inside the cold-start window [0.9, 1.25].
	d := Definition{EquivalenceRatios: []float64{0.6, 0.7, 0.8, 0.9, 1.0, 1.1, 1.2, 1.3, 1.4, 1.5, 1.6, 1.7, 1.8},
		TemperaturesK: []float64{298}, PressuresPa: []float64{101325}}
	p, err := NewPlan(d)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Chains) != 1 || p.Along != EquivalenceRatio {
		t.Fatalf("%d chains along %v, want 1 along the equivalence ratio", len(p.Chains), p.Along)
	}
	head := p.Chains[0][0]
	if got := p.Points[head].Condition.Phi; got != 1.2 {
		t.Errorf("head at phi %g, want 1.2", got)
	}
	// Each point continues from its neighbour towards the head.
	for i, pt := range p.Points {
		want := -1
		switch {
		case i < head:
			want = i + 1
		case i > head:
			want = i - 1
		}
		if pt.Parent != want {
			t.Errorf("point %s: parent %d, want %d", pt.ID, pt.Parent, want)
		}
	}
	// Members alternate between the two branches after the head.
	wantOrder := []int{6, 7, 5, 8, 4, 9, 3, 10, 2, 11, 1, 12, 0}
	if !reflect.DeepEqual(p.Chains[0], wantOrder) {
		t.Errorf("chain order %v, want %v", p.Chains[0], wantOrder)
	}
	// Both branches below the head are 6 points long.
	if d := p.depths()[head]; d != 6 {
		t.Errorf("depth below the head %d, want 6", d)
	}
	if a := p.Ancestors(0); !reflect.DeepEqual(a, []int{1, 2, 3, 4, 5, 6}) {
		t.Errorf("ancestors of phi 0.6: %v, want [1 2 3 4 5 6]", a)
	}
}

func TestPlanSeveralChains(t *testing.T) {
	d := Definition{EquivalenceRatios: []float64{0.8, 1.0, 1.2}, TemperaturesK: []float64{300, 400},
		PressuresPa: []float64{1e5, 5e5, 1e6}}
	p, err := NewPlan(d)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Points) != 18 || len(p.Chains) != 6 {
		t.Fatalf("%d points in %d chains, want 18 in 6", len(p.Points), len(p.Chains))
	}
	// Table order: pressure outermost, then temperature, then phi.
	if c := p.Points[4].Condition; c != (study.Condition{Phi: 1.0, T: 400, P: 1e5}) {
		t.Errorf("point 4 is %v", c)
	}
	for ci, chain := range p.Chains {
		c0 := p.Points[chain[0]].Condition
		if c0.Phi != 1.0 {
			t.Errorf("chain %d starts at phi %g, want 1.0", ci, c0.Phi)
		}
		for _, i := range chain {
			c := p.Points[i].Condition
			if c.T != c0.T || c.P != c0.P || p.Points[i].Chain != ci {
				t.Errorf("chain %d mixes %v and %v", ci, c0, c)
			}
		}
	}

	d.ContinueAlong = "pressure"
	p, err = NewPlan(d)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Chains) != 6 || p.Along != Pressure {
		t.Fatalf("%d chains along %v, want 6 along pressure", len(p.Chains), p.Along)
	}
	// Along pressure the head is the middle value.
	for _, chain := range p.Chains {
		if P := p.Points[chain[0]].Condition.P; P != 5e5 {
			t.Errorf("pressure chain starts at %g Pa, want 5e5", P)
		}
	}
}

func TestPlanChoosesAlong(t *testing.T) {
	d := Definition{EquivalenceRatios: []float64{1.0}, TemperaturesK: []float64{300, 350, 400, 450}, PressuresPa: []float64{1e5, 2e5}}
	p, err := NewPlan(d)
	if err != nil {
		t.Fatal(err)
	}
	if p.Along != Temperature || len(p.Chains) != 2 {
		t.Errorf("along %v with %d chains, want temperature with 2", p.Along, len(p.Chains))
	}
	if T := p.Points[p.Chains[0][0]].Condition.T; T != 350 {
		t.Errorf("temperature chain starts at %g K, want the lower middle value 350 K", T)
	}
}

func TestPointID(t *testing.T) {
	for _, tc := range []struct {
		c    study.Condition
		want string
	}{
		{study.Condition{Phi: 0.8, T: 298, P: 101325}, "phi0.800_T298.0_P101325"},
		{study.Condition{Phi: 1.05, T: 298.15, P: 5e5}, "phi1.050_T298.15_P500000"},
		{study.Condition{Phi: 0.8125, T: 300, P: 101325.5}, "phi0.8125_T300.0_P101325.5"},
	} {
		if got := PointID(tc.c); got != tc.want {
			t.Errorf("PointID(%v) = %s, want %s", tc.c, got, tc.want)
		}
	}
}

func TestShards(t *testing.T) {
	d := Definition{EquivalenceRatios: []float64{0.8, 0.9, 1.0, 1.1}, TemperaturesK: []float64{300, 350, 400},
		PressuresPa: []float64{1e5, 1e6}}
	p, err := NewPlan(d)
	if err != nil {
		t.Fatal(err)
	}
	for _, n := range []int{1, 2, 4, 6} {
		seen := make(map[int]int)
		for i := 0; i < n; i++ {
			pts, err := p.ShardPoints(Shard{Index: i, Count: n})
			if err != nil {
				t.Fatal(err)
			}
			for _, k := range pts {
				if prev, dup := seen[k]; dup {
					t.Errorf("%d shards: point %d in shards %d and %d", n, k, prev, i)
				}
				seen[k] = i
			}
		}
		if len(seen) != len(p.Points) {
			t.Errorf("%d shards cover %d of %d points", n, len(seen), len(p.Points))
		}
		// Chains stay whole: a point and its parent are in the same shard.
		for k, pt := range p.Points {
			if pt.Parent >= 0 && seen[pt.Parent] != seen[k] {
				t.Errorf("%d shards: %s and its parent are in different shards", n, pt.ID)
			}
		}
	}
	if _, err := p.ShardPoints(Shard{Index: 0, Count: 7}); err == nil || !strings.Contains(err.Error(), "6 continuation chain") {
		t.Errorf("7 shards of 6 chains: error %v", err)
	}
}

func TestParseShard(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Shard
		bad  string
	}{
		{in: "0/4", want: Shard{0, 4}},
		{in: " 3 / 4 ", want: Shard{3, 4}},
		{in: "4/4", bad: "counts from 0"},
		{in: "-1/4", bad: "counts from 0"},
		{in: "1", bad: "I/N"},
		{in: "a/b", bad: "I/N"},
		{in: "0/0", bad: "counts from 0"},
	} {
		got, err := ParseShard(tc.in)
		if tc.bad != "" {
			if err == nil || !strings.Contains(err.Error(), tc.bad) {
				t.Errorf("ParseShard(%q): error %v, want one saying %q", tc.in, err, tc.bad)
			}
			continue
		}
		if err != nil || got != tc.want {
			t.Errorf("ParseShard(%q) = %v, %v; want %v", tc.in, got, err, tc.want)
		}
	}
}
