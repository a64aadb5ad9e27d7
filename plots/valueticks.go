package plots

import (
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
)

// ValueTicks is a plot.Ticker for value axes. It labels the multiples of a
// round step, 1, 2 or 5 times a power of ten, writing them with a comma
// between groups of three digits (540,000; 12,345.5). The step is the
// smallest such number that gives at most Max labelled ticks in the range:
//
//	step = min { f * 10^e : f in {1, 2, 5}, e an integer,
//	             floor(max/step) - ceil(min/step) + 1 <= Max }
//
// Labels carry max(0, -e) decimals. Unlabelled minor ticks split each step
// in five (f = 1 or 5) or in two (f = 2).
//
// The zero value is ready to use. Ticks returns no ticks when min or max is
// not finite or max <= min.
type ValueTicks struct {
	// Max is the most labelled ticks; values below 2 mean the default, 7.
	// The charts lower it on short axes so labels keep their distance.
	Max int
}

var _ plot.Ticker = ValueTicks{}

// maxValueTicks is the default most labelled ticks of ValueTicks.
const maxValueTicks = 7

// Ticks returns the ticks in [min, max].
func (vt ValueTicks) Ticks(min, max float64) []plot.Tick {
	if !(max > min) || math.IsInf(min, 0) || math.IsInf(max, 0) {
		return nil
	}
	n := vt.Max
	if n < 2 {
		n = maxValueTicks
	}
	d, frac, e := niceStep(min, max, n)
	decimals := max0(-e)
	minor := d / 5
	if frac == 2 {
		minor = d / 2
	}
	var ticks []plot.Tick
	for _, v := range multiples(min, max, d) {
		ticks = append(ticks, plot.Tick{Value: v, Label: groupDigits(v, decimals)})
	}
	per := math.Round(d / minor)
	for _, v := range multiples(min, max, minor) {
		if k := math.Round(v / minor); math.Mod(math.Abs(k), per) == 0 {
			continue // a labelled tick is there
		}
		ticks = append(ticks, plot.Tick{Value: v})
	}
	return ticks
}

// maxMultiples bounds the ticks multiples returns.
const maxMultiples = 1000

// multiples returns the multiples of step in [min, max], at most
// maxMultiples of them. Far from zero, where consecutive multiples are no
// longer distinct float64 values (|min|/step beyond 2^53), it returns none.
func multiples(min, max, step float64) []float64 {
	if !(step > 0) || math.IsInf(step, 0) {
		return nil
	}
	first, last := math.Ceil(min/step-1e-9), math.Floor(max/step+1e-9)
	if !(last >= first) || last-first >= maxMultiples || first+1 == first || last-1 == last {
		return nil
	}
	vs := make([]float64, 0, int(last-first)+1)
	for k := first; k <= last; k++ {
		vs = append(vs, k*step)
	}
	return vs
}

// niceStep returns the smallest step f*10^e (f = 1, 2 or 5) that puts at
// most n of its multiples in [lo, hi], with f and e. The range may be as
// wide as float64 allows: its width is measured in halves so it does not
// overflow, and e stays within the exponents float64 can hold.
func niceStep(lo, hi float64, n int) (step, f float64, e int) {
	w := math.Log10(hi/2-lo/2) + math.Log10(2) - math.Log10(float64(n))
	e = -330
	if w > -330 { // false for NaN too
		e = int(math.Floor(math.Min(w, 308))) - 1
	}
	for ; ; e++ {
		for _, f = range []float64{1, 2, 5} {
			step = f * math.Pow(10, float64(e))
			count := math.Floor(hi/step+1e-9) - math.Ceil(lo/step-1e-9) + 1
			if count <= float64(n) || e >= 308 {
				return step, f, e
			}
		}
	}
}

func max0(n int) int { return max(n, 0) }

// groupDigits writes v with the given number of decimals and a comma between
// groups of three digits of the whole part: 540000 -> "540,000",
// -1234.5 (1 decimal) -> "-1,234.5". A value that rounds to zero prints
// without a minus sign.
func groupDigits(v float64, decimals int) string {
	s := strconv.FormatFloat(v, 'f', decimals, 64)
	neg := strings.HasPrefix(s, "-")
	s = strings.TrimPrefix(s, "-")
	whole, frac, hasFrac := strings.Cut(s, ".")
	var b strings.Builder
	if neg && strings.Trim(s, "0.") != "" {
		b.WriteByte('-')
	}
	for i, r := range whole {
		if i > 0 && (len(whole)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(r)
	}
	if hasFrac {
		b.WriteByte('.')
		b.WriteString(frac)
	}
	return b.String()
}

// signedDigits is groupDigits with a leading "+" on positive values, for
// amounts that are changes.
func signedDigits(v float64, decimals int) string {
	s := groupDigits(v, decimals)
	if v > 0 && strings.Trim(s, "0.,") != "" {
		return "+" + s
	}
	return s
}

// decimalsFor returns the fewest decimals (at most 3) that print every value
// of vs exactly to within a billionth, but no more than four significant
// figures of the largest need: 4 -> 0, 12.75 -> 2, 540000.25 -> 0,
// 0.1+0.2 -> 1.
func decimalsFor(vs ...float64) int {
	m, need := 0.0, 0
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			continue
		}
		m = math.Max(m, math.Abs(v))
		d := 0
		for ; d < 3; d++ {
			p := math.Pow(10, float64(d))
			if math.Abs(math.Round(v*p)/p-v) <= 1e-9*math.Max(1, math.Abs(v)) {
				break
			}
		}
		need = max(need, d)
	}
	if m == 0 {
		return 0
	}
	return min(need, max0(3-int(math.Floor(math.Log10(m)))))
}
