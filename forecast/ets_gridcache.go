package forecast

import (
	"math"
	"slices"
	"sync"
)

// The starting grid of a Holt-Winters fit is evaluated on the additive
// season model (see etsFitter.grid), so the additive and the
// multiplicative fits of the same data, which method auto runs one after
// the other on every training window, evaluate the same grid. etsGrids
// keeps the last few grids so that the second fit reads the first's. A
// grid is a pure function of the data, the trend and season structure and
// the held parameters (the additive fitter starts from initialStates
// either way), so a cached grid is the grid the fit would compute, and a
// miss costs only the evaluation: results never depend on the cache.
var etsGrids etsGridCache

// etsGridSlots is the number of grids kept: enough for the fits running
// at once on a few cores to find each other's.
const etsGridSlots = 16

// etsGridKey identifies a grid: the structure of the model (the season
// kind aside), the held parameters (as bits, so that NaN equals NaN) and
// the data.
type etsGridKey struct {
	trend, damped bool
	season        int
	fixed         [4]uint64
}

type etsGridEntry struct {
	key etsGridKey
	y   []float64
	pts []gridPoint
}

// etsGridCache is a small ring of grids, safe for concurrent use.
type etsGridCache struct {
	mu   sync.Mutex
	ring [etsGridSlots]etsGridEntry
	next int
	hits int // grids read, for tests
}

func etsGridKeyOf(f *etsFitter) etsGridKey {
	k := etsGridKey{trend: f.sh.trend, damped: f.sh.damped, season: f.sh.season}
	for i, v := range f.fixed {
		k.fixed[i] = math.Float64bits(v)
	}
	return k
}

// get returns a copy of the grid stored for key and y, or nil.
func (c *etsGridCache) get(key etsGridKey, y []float64) []gridPoint {
	c.mu.Lock()
	defer c.mu.Unlock()
	for i := range c.ring {
		e := &c.ring[i]
		if e.pts != nil && e.key == key && slices.Equal(e.y, y) {
			c.hits++
			return cloneGrid(e.pts)
		}
	}
	return nil
}

// put stores a copy of the grid for key and y, replacing the oldest.
func (c *etsGridCache) put(key etsGridKey, y []float64, pts []gridPoint) {
	if len(pts) == 0 {
		return
	}
	e := etsGridEntry{key: key, y: slices.Clone(y), pts: cloneGrid(pts)}
	c.mu.Lock()
	defer c.mu.Unlock()
	c.ring[c.next] = e
	c.next = (c.next + 1) % etsGridSlots
}

// cloneGrid returns a deep copy of pts.
func cloneGrid(pts []gridPoint) []gridPoint {
	out := slices.Clone(pts)
	for i := range out {
		out[i].u = slices.Clone(out[i].u)
	}
	return out
}
