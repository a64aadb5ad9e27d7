package supply

import (
	"math"
	"testing"

	"forelay/scenario/internal/plantest"
)

// TestResourceLoad: a resource's load is PerUnit times the summed demand
// of its series, by hand; a series without demand adds nothing.
func TestResourceLoad(t *testing.T) {
	r := Resource{ID: "bottling-1", Series: []string{"milk/a", "milk/b", "milk/new"}, PerUnit: 0.0012, Capacity: []float64{600, 600, 680}}
	demand := map[string][]float64{
		"milk/a": {200000, 250000, 300000},
		"milk/b": {100000, 150000, 250000},
	}
	load := r.Load(3, func(s string) []float64 { return demand[s] })
	// 0.0012 × 300,000 = 360; × 400,000 = 480; × 550,000 = 660 line hours.
	plantest.EqualSlices(t, "load", load, []float64{360, 480, 660}, 1e-12)
	// 360/600 = 0.6, 480/600 = 0.8, 660/680 = 0.97058823529...
	plantest.EqualSlices(t, "utilisation", r.Utilisation(load), []float64{0.6, 0.8, 660.0 / 680}, 1e-12)
	open := Resource{ID: "store", Series: []string{"milk/a"}, PerUnit: 1}
	u := open.Utilisation(open.Load(3, func(s string) []float64 { return demand[s] }))
	if len(u) != 3 || !math.IsNaN(u[0]) || !math.IsNaN(u[2]) {
		t.Errorf("utilisation without capacity %v; want NaN", u)
	}
}
