package scenario

import (
	"time"

	"forelay/forecast"
)

// A When is a stretch of the calendar written in a scenario file: a period
// label (2027, 2027-Q3, 2027-08, 2027-W33) or a date (2027-08-14). It covers
// the days [From, To): 2027-08 runs from 1 August up to, not including,
// 1 September; 2027-08-14 is that one day; 2027-W33 is the ISO week from
// Monday 16 to Sunday 22 August 2027.
//
// The zero When is "not given".
type When struct {
	// Label is the label in its canonical form (2027-08, 2027-Q3,
	// 2027-W33, 2027-08-14, 2027), as period labels are printed.
	Label string
	// Unit is the grain of the label: Daily for a date, Weekly for an ISO
	// week, Monthly, Quarterly or Yearly.
	Unit forecast.Frequency
	// From is the first day covered and To the first day after, both at
	// midnight UTC.
	From, To time.Time
	// Pos is where the label stands in the file (zero if built by hand).
	Pos Pos
}

// ParseWhen reads a period label or a date. It accepts the label forms of
// forecast.ParsePeriod: 2027, 2027-Q3, 2027-08, 2027-W33 and 2027-08-14.
// The error wraps forecast.ErrBadPeriod.
func ParseWhen(label string) (When, error) {
	p, err := forecast.ParsePeriod(label, forecast.FreqUnknown)
	if err != nil {
		return When{}, err
	}
	return whenOf(p), nil
}

// whenOf returns the When covering period p.
func whenOf(p forecast.Period) When {
	return When{Label: p.String(), Unit: p.Freq, From: p.Start(), To: p.End()}
}

// IsZero reports whether w is the zero When (not given).
func (w When) IsZero() bool { return w.Unit == forecast.FreqUnknown }

// String returns the label.
func (w When) String() string { return w.Label }

// Last returns the last day w covers (the day before To).
func (w When) Last() time.Time { return w.To.AddDate(0, 0, -1) }

// Days returns the number of days w covers.
func (w When) Days() int { return daysBetween(w.From, w.To) }

// daysBetween returns the number of whole days from a to b (negative when b
// comes first). Both are midnights UTC.
func daysBetween(a, b time.Time) int {
	return int(b.Sub(a) / (24 * time.Hour))
}

// containing returns the period on grid's grid (same frequency and, for
// weeks and days, the same spacing from grid) that holds the day t.
func containing(grid forecast.Period, t time.Time) forecast.Period {
	switch grid.Freq {
	case forecast.Daily:
		return grid.Add(daysBetween(grid.Start(), t))
	case forecast.Weekly:
		return grid.Add(forecast.FloorDiv(daysBetween(grid.Start(), t), 7))
	}
	return forecast.PeriodOf(grid.Freq, t)
}

// aligned reports whether the day t is the first day of a period on grid's
// grid.
func aligned(grid forecast.Period, t time.Time) bool {
	return containing(grid, t).Start().Equal(t)
}

// overlap returns the share of the days of period p that lie in [from, to).
// A zero to means "no end".
func overlap(p forecast.Period, from, to time.Time) float64 {
	a, b := p.Start(), p.End()
	if from.After(a) {
		a = from
	}
	if !to.IsZero() && to.Before(b) {
		b = to
	}
	d := daysBetween(a, b)
	if d <= 0 {
		return 0
	}
	return float64(d) / float64(p.Days())
}

// finer reports whether grain a is strictly finer than grain b (a day is
// finer than a week, a week than a month, and so on).
func finer(a, b forecast.Frequency) bool { return a < b }
