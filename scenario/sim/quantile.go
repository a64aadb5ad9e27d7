package sim

import (
	"forelay/scenario/plan"
	"math"
	"math/bits"
	"slices"
)

// Quantile returns the p-quantile of the sample x, which must be sorted in
// increasing order, by definition 7 of Hyndman & Fan (1996, "Sample
// quantiles in statistical packages", The American Statistician 50(4),
// 361-365), the default of R's quantile and of numpy.quantile (method
// "linear"). With n values x_1 <= ... <= x_n (1-based),
//
//	h = (n − 1) p + 1
//	Q(p) = x_⌊h⌋ + (h − ⌊h⌋) (x_⌊h⌋+1 − x_⌊h⌋),
//
// so Q(0) is the smallest value, Q(1) the largest and Q(0.5) the usual
// median. The estimate is monotone in p and interpolates linearly between
// order statistics. It returns NaN for an empty x or a NaN p, and panics if
// p is outside [0, 1] (a programmer error: callers pass fixed levels).
func Quantile(x []float64, p float64) float64 {
	if p < 0 || p > 1 {
		panic("scenario: Quantile with p outside [0, 1]")
	}
	n := len(x)
	if n == 0 || math.IsNaN(p) {
		return math.NaN()
	}
	h := float64(n-1) * p // 0-based position
	lo := int(math.Floor(h))
	if lo >= n-1 {
		return x[n-1]
	}
	frac := h - float64(lo)
	if frac == 0 {
		return x[lo]
	}
	return x[lo] + frac*(x[lo+1]-x[lo])
}

// Quantiles returns the quantiles of x at each level of ps (see Quantile).
// x need not be sorted: Quantiles sorts a copy and leaves x as it is.
func Quantiles(x []float64, ps ...float64) []float64 {
	s := slices.Clone(x)
	slices.Sort(s)
	out := make([]float64, len(ps))
	for i, p := range ps {
		out[i] = Quantile(s, p)
	}
	return out
}

// QuantileOf returns the p-quantile of x (Quantile, definition 7) without
// sorting x: it rearranges x in place, moving the two order statistics it
// needs into position by selection (see orderStats), in O(len(x))
// operations on average. The result equals Quantile on a sorted copy
// (the same order statistics and the same arithmetic). It returns NaN for an empty x or a NaN p, and panics if
// p is outside [0, 1].
func QuantileOf(x []float64, p float64) float64 {
	o := orderStats{x: x}
	return o.quantile(p)
}

// Levels are the quantile levels reported for every simulated period.
var Levels = [5]float64{0.05, 0.10, 0.50, 0.90, 0.95}

// Spread summarises a simulated quantity in one period: its mean over the
// paths and its P5, P10, P50, P90 and P95 quantiles (Quantile, definition
// 7).
type Spread struct {
	// Mean is the arithmetic mean over the paths.
	Mean float64
	// P5, P10, P50, P90 and P95 are the quantiles at Levels.
	P5, P10, P50, P90, P95 float64
}

// spreadOf returns the Spread of the values in col, rearranging col. The
// mean is summed first, in the given order, so it does not depend on the
// selection. The order statistics the five quantiles read are selected
// together (selectAll), then read by Quantile.
func spreadOf(col []float64) Spread {
	s := Spread{Mean: mean(col)}
	n := len(col)
	var buf [2 * len(Levels)]int
	ks := buf[:0]
	for _, p := range Levels {
		h := float64(n-1) * p
		lo := int(math.Floor(h))
		switch {
		case n == 0:
		case lo >= n-1:
			ks = append(ks, n-1)
		case h > float64(lo):
			ks = append(ks, lo, lo+1)
		default:
			ks = append(ks, lo)
		}
	}
	selectAll(col, slices.Compact(ks))
	s.P5 = Quantile(col, Levels[0])
	s.P10 = Quantile(col, Levels[1])
	s.P50 = Quantile(col, Levels[2])
	s.P90 = Quantile(col, Levels[3])
	s.P95 = Quantile(col, Levels[4])
	return s
}

// selectAll rearranges x so that every position in ks (0-based, in
// increasing order, no repeats) holds its order statistic, as selectK
// does for one: a partition by lomutoPartition, then the same on each side
// that holds wanted positions (quicksort's recursion, kept to the parts
// that matter), so that the positions share the first partitions instead
// of each scanning the whole of x. A part that shrinks too slowly is
// sorted instead, which bounds the worst case at O(n log n).
func selectAll(x []float64, ks []int) {
	selectIn(x, 0, len(x)-1, ks, 2*bits.Len(uint(len(x)))+8)
}

// selectIn is selectAll on x[lo:hi+1], every position of ks in [lo, hi],
// with depth partitions left before it sorts.
func selectIn(x []float64, lo, hi int, ks []int, depth int) {
	for len(ks) > 0 && hi > lo {
		switch {
		case len(ks) == 1:
			selectK(x[lo:hi+1], ks[0]-lo)
			return
		case hi-lo < 16 || depth == 0:
			slices.Sort(x[lo : hi+1])
			return
		}
		depth--
		i, j := lomutoPartition(x, lo, hi)
		// x[lo:j+1] <= pivot, x[j+1:i] equal to it, x[i:hi+1] >= pivot.
		left, _ := slices.BinarySearch(ks, j+1)
		right, _ := slices.BinarySearch(ks, i)
		selectIn(x, lo, j, ks[:left], depth)
		lo, ks = i, ks[right:]
	}
}

// orderStats finds order statistics of x one after another, in increasing
// position, rearranging x as it goes: x[:from] holds the from smallest
// values, and every position asked for so far holds its order statistic.
type orderStats struct {
	x    []float64
	from int
}

// at returns the q-th smallest value of x (0-based). q must not be below
// a position asked for before, except positions already asked for.
func (o *orderStats) at(q int) float64 {
	if q >= o.from {
		selectK(o.x[o.from:], q-o.from)
		o.from = q + 1
	}
	return o.x[q]
}

// quantile returns the p-quantile of x by definition 7 (see Quantile);
// successive calls must come with increasing p. It panics if p is outside
// [0, 1].
func (o *orderStats) quantile(p float64) float64 {
	if p < 0 || p > 1 {
		panic("scenario: Quantile with p outside [0, 1]")
	}
	n := len(o.x)
	if n == 0 || math.IsNaN(p) {
		return math.NaN()
	}
	h := float64(n-1) * p // 0-based position
	lo := int(math.Floor(h))
	if lo >= n-1 {
		return o.at(n - 1)
	}
	frac := h - float64(lo)
	xl := o.at(lo)
	if frac == 0 {
		return xl
	}
	return xl + frac*(o.at(lo+1)-xl)
}

// selectK rearranges x so that x[k] is its k-th smallest value (0-based),
// with x[:k] <= x[k] <= x[k+1:]: Hoare's selection (C. A. R. Hoare, 1961,
// "Algorithm 65: Find", Communications of the ACM 4(7)), with the median
// of three as pivot and a branch-free partition (lomutoPartition), in
// O(len(x)) operations on average. A range that
// shrinks too slowly is sorted instead, which bounds the worst case at
// O(n log n). k = 0 and k = len(x) − 1 are a single scan. It panics if k is
// out of range.
func selectK(x []float64, k int) {
	lo, hi := 0, len(x)-1
	if k < 0 || k > hi {
		panic("scenario: selectK with k out of range")
	}
	for rounds := 0; hi > lo; rounds++ {
		switch {
		case k == lo:
			moveMin(x[lo : hi+1])
			return
		case k == hi:
			moveMax(x[lo : hi+1])
			return
		case hi-lo < 16 || rounds > 2*bits.Len(uint(len(x)))+8:
			slices.Sort(x[lo : hi+1])
			return
		}
		i, j := lomutoPartition(x, lo, hi)
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return // x[j+1:i] all equal the pivot
		}
	}
}

// moveMin swaps the smallest value of x (the first of equals) into x[0].
func moveMin(x []float64) {
	best := 0
	for i := 1; i < len(x); i++ {
		if x[i] < x[best] {
			best = i
		}
	}
	x[0], x[best] = x[best], x[0]
}

// moveMax swaps the largest value of x (the first of equals) into the
// last place.
func moveMax(x []float64) {
	best := 0
	for i := 1; i < len(x); i++ {
		if x[i] > x[best] {
			best = i
		}
	}
	x[len(x)-1], x[best] = x[best], x[len(x)-1]
}

// mean returns the arithmetic mean of x, NaN when x is empty.
func mean(x []float64) float64 {
	if len(x) == 0 {
		return math.NaN()
	}
	return plan.Total(x) / float64(len(x))
}

// lomutoPartition splits x[lo:hi+1] (hi > lo) around the median of x[lo],
// its middle and x[hi], and returns j < i with x[lo:j+1] <= pivot,
// x[j+1:i] equal to the pivot and x[i:hi+1] >= pivot. It is Lomuto's
// scheme written without a branch on the comparison (every value is
// swapped, and the boundary moves by the comparison's outcome, 0 or 1),
// which spares the processor the mispredicted jumps of random data. When
// no value is below the pivot, a second pass gathers the values equal to
// it, so that a run of ties costs one pass.
func lomutoPartition(x []float64, lo, hi int) (i, j int) {
	mid := lo + (hi-lo)/2
	if x[mid] < x[lo] {
		x[mid], x[lo] = x[lo], x[mid]
	}
	if x[hi] < x[lo] {
		x[hi], x[lo] = x[lo], x[hi]
	}
	if x[hi] < x[mid] {
		x[hi], x[mid] = x[mid], x[hi]
	}
	x[lo], x[mid] = x[mid], x[lo]
	pivot := x[lo]
	b := lo + 1
	for k := lo + 1; k <= hi; k++ {
		v := x[k]
		x[k] = x[b]
		x[b] = v
		b += b2i(v < pivot)
	}
	// x[lo+1:b] < pivot, x[b:hi+1] >= pivot.
	if b > lo+1 {
		x[lo], x[b-1] = x[b-1], x[lo]
		return b, b - 2
	}
	for k := lo + 1; k <= hi; k++ {
		v := x[k]
		x[k] = x[b]
		x[b] = v
		b += b2i(v <= pivot)
	}
	// x[lo:b] equal the pivot, x[b:hi+1] > pivot.
	return b, lo - 1
}

// b2i returns 1 for true and 0 for false; the compiler turns it into a
// flag read, not a jump.
func b2i(c bool) int {
	if c {
		return 1
	}
	return 0
}
