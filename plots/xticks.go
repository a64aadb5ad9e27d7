package plots

import (
	"math"
	"strings"
	"time"

	"forelay/forecast"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
)

// periodTicks chooses which period labels the x axis shows. Label i sits at
// x = i. When the labels are periods (2026, 2026-Q1, 2026-03, 2026-W11,
// 2026-03-15) the choice follows the calendar: every period, or the first of
// each week-of-month, half month, month, 2, 3 or 6 months, year, or 2, 5, 10,
// 25, 50 or 100 years, whichever is the finest whose labels do not overlap.
// Every rule finer than a year keeps the first period of each year. Labels
// that are not periods are thinned to every k-th one from the first.
//
// In nominal mode (category axes such as a waterfall's) every label is shown;
// labels too wide for their slot are wrapped at spaces and, failing that,
// turned by 30 degrees.
type periodTicks struct {
	labels []string
	// rules[r][i] says whether rule r shows label i; finest rule first.
	rules [][]bool
	// name is the x axis label: "Month", "Quarter", ...
	name string

	nominal bool
	wrapped []string // nominal labels after wrapping (nil: as given)

	// bare keeps the tick marks but writes no labels, for a panel with
	// another below it that writes them.
	bare bool

	// width is the width of the data area the labels must fit in.
	width vg.Length
	// style is the tick label style the widths are measured in.
	style text.Style
}

// minorGap is the smallest distance between two minor tick marks.
const minorGap = 3 // points

// newPeriodTicks returns the ticks for labels. nominal selects category mode.
func newPeriodTicks(labels []string, nominal bool) *periodTicks {
	t := &periodTicks{labels: labels, nominal: nominal, width: 7 * vg.Inch}
	if nominal {
		t.name = ""
		return t
	}
	t.rules, t.name = periodRules(labels)
	return t
}

// Ticks returns the ticks between min and max. It implements plot.Ticker.
func (t *periodTicks) Ticks(min, max float64) []plot.Tick {
	n := len(t.labels)
	lo := int(math.Max(0, math.Ceil(min)))
	hi := int(math.Min(float64(n-1), math.Floor(max)))
	if hi < lo || !(max > min) {
		return nil
	}
	slot := t.width / vg.Length(max-min)
	if t.nominal {
		ticks := make([]plot.Tick, 0, hi-lo+1)
		for i := lo; i <= hi; i++ {
			ticks = append(ticks, plot.Tick{Value: float64(i), Label: t.nominalLabel(i)})
		}
		return ticks
	}
	shown := t.pick(lo, hi, slot)
	ticks := make([]plot.Tick, 0, len(shown))
	major := make(map[int]bool, len(shown))
	for _, i := range shown {
		major[i] = true
		tk := plot.Tick{Value: float64(i), Label: t.labels[i]}
		if t.bare {
			tk.Label = " " // a long mark, no text
		}
		ticks = append(ticks, tk)
	}
	for _, i := range t.minor(lo, hi, slot) {
		if !major[i] {
			ticks = append(ticks, plot.Tick{Value: float64(i)})
		}
	}
	return ticks
}

// nominalLabel returns label i as drawn in nominal mode.
func (t *periodTicks) nominalLabel(i int) string {
	if t.wrapped != nil {
		return t.wrapped[i]
	}
	return t.labels[i]
}

// pick returns the indexes in [lo, hi] of the labels to show when one
// period is slot wide.
func (t *periodTicks) pick(lo, hi int, slot vg.Length) []int {
	gap := vg.Points(6)
	fits := func(idx []int) bool {
		for k := 1; k < len(idx); k++ {
			a, b := idx[k-1], idx[k]
			need := (t.style.Width(t.labels[a])+t.style.Width(t.labels[b]))/2 + gap
			if vg.Length(b-a)*slot < need {
				return false
			}
		}
		return true
	}
	want := min(2, hi-lo+1)
	for _, rule := range t.rules {
		idx := selected(rule, lo, hi)
		if len(idx) >= want && fits(idx) {
			return idx
		}
	}
	// No calendar rule fits: every k-th visible label, k as small as fits.
	for _, k := range indexSteps(hi - lo + 1) {
		var idx []int
		for i := lo; i <= hi; i += k {
			idx = append(idx, i)
		}
		if fits(idx) {
			return idx
		}
	}
	return []int{lo}
}

// minor returns the indexes of the unlabelled tick marks: every period when
// they are at least minorGap apart, else those of the finest rule that is.
func (t *periodTicks) minor(lo, hi int, slot vg.Length) []int {
	spread := func(idx []int) bool {
		for k := 1; k < len(idx); k++ {
			if vg.Length(idx[k]-idx[k-1])*slot < vg.Points(minorGap) {
				return false
			}
		}
		return true
	}
	all := make([]int, 0, hi-lo+1)
	for i := lo; i <= hi; i++ {
		all = append(all, i)
	}
	if spread(all) {
		return all
	}
	for _, rule := range t.rules {
		if idx := selected(rule, lo, hi); spread(idx) {
			return idx
		}
	}
	return nil
}

// selected returns the indexes in [lo, hi] that rule shows.
func selected(rule []bool, lo, hi int) []int {
	var idx []int
	for i := lo; i <= hi; i++ {
		if rule[i] {
			idx = append(idx, i)
		}
	}
	return idx
}

// indexSteps returns the label steps 1, 2, 3, 4, 5, 6, 8, 10, 12, 15, 20, 25,
// 30, 40, 50, 60, 80, 100, 120, ... up to the first one of at least n.
func indexSteps(n int) []int {
	figures := []float64{1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8}
	var ks []int
	for mag := 1.0; ; mag *= 10 {
		for _, f := range figures {
			k := f * mag
			if k != math.Trunc(k) {
				continue
			}
			ks = append(ks, int(k))
			if int(k) >= n {
				return ks
			}
		}
	}
}

// periodRules returns the thinning rules for labels, finest first, and the
// name of the x axis.
func periodRules(labels []string) ([][]bool, string) {
	n := len(labels)
	ps, freq, iso, ok := parsePeriods(labels)
	if !ok {
		var rules [][]bool
		for _, k := range indexSteps(n) {
			r := make([]bool, n)
			for i := range r {
				r[i] = i%k == 0
			}
			rules = append(rules, r)
		}
		return rules, "Period"
	}
	if iso {
		return isoWeekRules(ps), "Week (ISO)"
	}
	// last[i+1] is the last day of period i; last[0] that of the period
	// before the first label.
	last := make([]time.Time, n+1)
	name := freqName(freq)
	if freq == forecast.Daily {
		// Dates may label days or weeks (or other spans): take the span
		// from the distance between the first two labels.
		span := 1
		if n > 1 {
			if d := int(ps[1].Start().Sub(ps[0].Start()).Hours() / 24); d > 0 {
				span = d
			}
		}
		switch span {
		case 1:
			name = "Day"
		case 7:
			name = "Week"
		default:
			name = "Period"
		}
		last[0] = ps[0].Start().AddDate(0, 0, -1)
		for i, p := range ps {
			last[i+1] = p.Start().AddDate(0, 0, span-1)
		}
	} else {
		last[0] = ps[0].Add(-1).End().AddDate(0, 0, -1)
		for i, p := range ps {
			last[i+1] = p.End().AddDate(0, 0, -1)
		}
	}
	var rules [][]bool
	for _, key := range calendarKeys() {
		r := make([]bool, n)
		for i := range r {
			r[i] = key(last[i+1]) != key(last[i])
		}
		rules = append(rules, r)
	}
	return dedupe(rules), name
}

// calendarKeys returns the bucket functions of the calendar rules, finest
// first. A label is shown when its period's last day falls in another bucket
// than the previous period's last day.
func calendarKeys() []func(time.Time) int {
	keys := []func(time.Time) int{
		func(t time.Time) int { return t.Year()*1000 + t.YearDay() },
		func(t time.Time) int { return t.Year()*10000 + int(t.Month())*100 + min((t.Day()-1)/7, 3) },
		func(t time.Time) int {
			half := 0
			if t.Day() >= 15 {
				half = 1
			}
			return t.Year()*10000 + int(t.Month())*100 + half
		},
	}
	for _, k := range []int{1, 2, 3, 6} {
		keys = append(keys, func(t time.Time) int { return t.Year()*100 + (int(t.Month())-1)/k })
	}
	for _, k := range []int{1, 2, 5, 10, 25, 50, 100} {
		keys = append(keys, func(t time.Time) int { return forecast.FloorDiv(t.Year(), k) })
	}
	return keys
}

// isoWeekRules returns the rules for ISO week labels: every 1, 2, 4, 13 or 26
// weeks counted from week 1 of each ISO year, then every 1, 2, 5, 10, 25, 50
// or 100 ISO years.
func isoWeekRules(ps []forecast.Period) [][]bool {
	n := len(ps)
	yw := make([][2]int, n+1)
	for i := -1; i < n; i++ {
		var p forecast.Period
		if i < 0 {
			p = ps[0].Add(-1)
		} else {
			p = ps[i]
		}
		y, w := p.Start().ISOWeek()
		yw[i+1] = [2]int{y, w}
	}
	var keys []func([2]int) int
	for _, k := range []int{1, 2, 4, 13, 26} {
		// Week 53 joins the last bucket so it is never a lone label.
		keys = append(keys, func(v [2]int) int { return v[0]*100 + min((v[1]-1)/k, 52/k-1) })
	}
	for _, k := range []int{1, 2, 5, 10, 25, 50, 100} {
		keys = append(keys, func(v [2]int) int { return forecast.FloorDiv(v[0], k) })
	}
	var rules [][]bool
	for _, key := range keys {
		r := make([]bool, n)
		for i := range r {
			r[i] = key(yw[i+1]) != key(yw[i])
		}
		rules = append(rules, r)
	}
	return dedupe(rules)
}

// parsePeriods reads every label as a period. ok is false unless all of them
// are periods of one frequency; iso is set for ISO week labels.
func parsePeriods(labels []string) (ps []forecast.Period, freq forecast.Frequency, iso, ok bool) {
	if len(labels) == 0 {
		return nil, 0, false, false
	}
	ps = make([]forecast.Period, len(labels))
	for i, l := range labels {
		p, err := forecast.ParsePeriod(l, forecast.FreqUnknown)
		if err != nil {
			return nil, 0, false, false
		}
		w := strings.ContainsAny(l, "W")
		if i == 0 {
			freq, iso = p.Freq, w
		} else if p.Freq != freq || w != iso {
			return nil, 0, false, false
		}
		ps[i] = p
	}
	return ps, freq, iso, true
}

// freqName returns the x axis name for periods of frequency f.
func freqName(f forecast.Frequency) string {
	switch f {
	case forecast.Daily:
		return "Day"
	case forecast.Weekly:
		return "Week"
	case forecast.Monthly:
		return "Month"
	case forecast.Quarterly:
		return "Quarter"
	case forecast.Yearly:
		return "Year"
	}
	return "Period"
}

// dedupe drops rules that show exactly the labels of the rule before them.
func dedupe(rules [][]bool) [][]bool {
	out := rules[:0:0]
	for _, r := range rules {
		if len(out) > 0 && equalBools(out[len(out)-1], r) {
			continue
		}
		out = append(out, r)
	}
	return out
}

func equalBools(a, b []bool) bool {
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// wrapLabel breaks s at spaces into lines no wider than w in style sty. A
// word wider than w stays on a line of its own.
func wrapLabel(s string, w vg.Length, sty text.Style) string {
	words := strings.Fields(s)
	if len(words) == 0 {
		return s
	}
	var lines []string
	line := words[0]
	for _, word := range words[1:] {
		if sty.Width(line+" "+word) <= w {
			line += " " + word
			continue
		}
		lines = append(lines, line)
		line = word
	}
	lines = append(lines, line)
	return strings.Join(lines, "\n")
}
