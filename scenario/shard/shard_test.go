package shard

import (
	"encoding/json"
	"errors"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"forelay/scenario"
	"forelay/scenario/plan"
)

// TestHash checks Hash against the published FNV-1a 64-bit test vectors
// (the FNV reference test suite, from memory): "" gives the offset basis.
func TestHash(t *testing.T) {
	for _, c := range []struct {
		in   string
		want uint64
	}{
		{"", 0xcbf29ce484222325},
		{"a", 0xaf63dc4c8601ec8c},
		{"foobar", 0x85944171f73967e8},
	} {
		if got := Hash(c.in); got != c.want {
			t.Errorf("Hash(%q) = %#x, want %#x", c.in, got, c.want)
		}
	}
	// 0xaf63dc4c8601ec8c = 12638187200555641996 = 3 * 4212729066851880665 + 1.
	if got := Of("a", 3); got != 1 {
		t.Errorf("Of(a, 3) = %d, want 1", got)
	}
}

func TestParse(t *testing.T) {
	for _, c := range []struct {
		in   string
		want Spec
		err  string
	}{
		{"0/1", Spec{0, 1}, ""},
		{"6/7", Spec{6, 7}, ""},
		{" 2 / 8 ", Spec{2, 8}, ""},
		{"7/7", Spec{}, "K must be from 0 to 6"},
		{"-1/3", Spec{}, "K must be from 0 to 2"},
		{"0/0", Spec{}, "N must be at least 1"},
		{"3", Spec{}, "want K/N"},
		{"a/b", Spec{}, "whole numbers"},
	} {
		got, err := Parse(c.in)
		if c.err != "" {
			if err == nil || !strings.Contains(err.Error(), c.err) {
				t.Errorf("Parse(%q): error %v, want one holding %q", c.in, err, c.err)
			}
			continue
		}
		if err != nil || got != c.want {
			t.Errorf("Parse(%q) = %v, %v; want %v", c.in, got, err, c.want)
		}
	}
}

// TestBelong checks each way shards fail to belong together.
func TestBelong(t *testing.T) {
	mk := func(k, n int, history string, seed uint64) *Manifest {
		m := NewManifest("v", "stress", Spec{k, n}, map[string]string{"history": history, "scenario": "s"}, []string{"stress", "p.yaml"})
		m.Seed, m.Paths = seed, 1000
		return m
	}
	dirs := []string{"a", "b", "c"}
	for _, c := range []struct {
		name string
		ms   []*Manifest
		want string
	}{
		{"together", []*Manifest{mk(1, 2, "h", 1), mk(0, 2, "h", 1)}, ""},
		{"inputs", []*Manifest{mk(0, 2, "h", 1), mk(1, 2, "h2", 1)}, "the history file"},
		{"n", []*Manifest{mk(0, 2, "h", 1), mk(1, 3, "h", 1)}, "N = 2 and N = 3"},
		{"seed", []*Manifest{mk(0, 2, "h", 1), mk(1, 2, "h", 2)}, "seed 1 and 2"},
		{"missing", []*Manifest{mk(0, 3, "h", 1), mk(2, 3, "h", 1)}, "shard 1/3 is missing"},
		{"twice", []*Manifest{mk(0, 2, "h", 1), mk(0, 2, "h", 1)}, "a and b are both shard 0/2"},
	} {
		err := Belong(dirs[:len(c.ms)], c.ms)
		switch {
		case c.want == "" && err != nil:
			t.Errorf("%s: %v", c.name, err)
		case c.want != "" && (err == nil || !errors.Is(err, ErrApart) || !strings.Contains(err.Error(), c.want)):
			t.Errorf("%s: error %v, want ErrApart holding %q", c.name, err, c.want)
		}
	}
}

// TestMergedRollupsEqualWhole plans the generated portfolio
// (examples/portfolio) whole and in 3 shards, and checks every merged
// roll-up against Portfolio.Rollups of the whole plan at full precision:
// sums, variances and bands within 1e-9 relative (the same sums added in
// another order).
func TestMergedRollupsEqualWhole(t *testing.T) {
	if testing.Short() {
		t.Skip("plans 301 series twice")
	}
	path := filepath.Join("..", "..", "examples", "portfolio", "plan.yaml")
	f, err := scenario.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	in, err := plan.ReadSelection(f)
	if err != nil {
		t.Fatal(err)
	}
	whole, err := plan.BuildPortfolio(f, in, 0)
	if err != nil {
		t.Fatal(err)
	}
	const n = 3
	var sums []*PlanSums
	for k := range n {
		in, err := plan.ReadShard(f, Spec{k, n}.Owns)
		if err != nil {
			t.Fatal(err)
		}
		pf, err := plan.BuildPortfolio(f, in, 0)
		if err != nil {
			t.Fatal(err)
		}
		s, err := NewPlanSums(pf, 0)
		if err != nil {
			t.Fatal(err)
		}
		b, err := json.Marshal(s) // through the file format
		if err != nil {
			t.Fatal(err)
		}
		var back PlanSums
		if err := json.Unmarshal(b, &back); err != nil {
			t.Fatal(err)
		}
		sums = append(sums, &back)
	}
	pm := &planMerge{dirs: []string{"s0", "s1", "s2"}, groups: map[groupKey]*mergedGroup{}}
	for i, s := range sums {
		if err := pm.add(i, s); err != nil {
			t.Fatal(err)
		}
	}
	groups, err := pm.rollupGroups()
	if err != nil {
		t.Fatal(err)
	}
	for k, name := range sums[0].Scenarios {
		want, err := whole.Rollups(name)
		if err != nil {
			t.Fatal(err)
		}
		if len(want) != len(groups) {
			t.Fatalf("%d merged groups, want %d", len(groups), len(want))
		}
		for i, g := range groups {
			got, err := g.rollup(sums[0], k)
			if err != nil {
				t.Fatal(err)
			}
			w := want[i]
			if got.Group != w.Group || got.Level != w.Level || g.Members != len(w.Members) {
				t.Fatalf("group %d: %s %s (%d), want %s %s (%d)", i, got.Level, got.Group, g.Members, w.Level, w.Group, len(w.Members))
			}
			for _, c := range []struct {
				what      string
				got, want []float64
			}{{"baseline", got.Baseline, w.Baseline}, {"adjusted", got.Adjusted, w.Adjusted}, {"var", got.Var, w.Var},
				{"lower", got.Lower, w.Lower}, {"upper", got.Upper, w.Upper}} {
				for t2 := range c.want {
					if d := math.Abs(c.got[t2] - c.want[t2]); d > 1e-9*math.Abs(c.want[t2]) && d > 1e-9 {
						t.Errorf("%s %s %s period %d: %v, want %v", name, w.Group, c.what, t2, c.got[t2], c.want[t2])
					}
				}
			}
		}
	}
}
