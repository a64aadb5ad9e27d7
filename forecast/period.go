package forecast

import (
	"errors"
	"fmt"
	"time"
)

// A Period is one step of a series: a day, a week, a month, a quarter or a
// year. Periods are comparable with == and ordered by Before.
//
// Internally a period is a whole number n whose meaning depends on the
// frequency: days since 1970-01-01 for days and weeks (the week's first day),
// 12*year+month-1 for months, 4*year+quarter-1 for quarters and the year
// itself for years.
type Period struct {
	Freq Frequency
	n    int
	// iso marks a weekly period whose label is an ISO week (2026-W11)
	// rather than the date of its first day.
	iso bool
}

var epoch = time.Date(1970, 1, 1, 0, 0, 0, 0, time.UTC)

// PeriodOf returns the period of frequency f that contains the day t. Weekly
// periods from PeriodOf start on Monday and carry ISO week labels.
func PeriodOf(f Frequency, t time.Time) Period {
	t = time.Date(t.Year(), t.Month(), t.Day(), 0, 0, 0, 0, time.UTC)
	switch f {
	case Daily:
		return Period{Freq: f, n: dayNumber(t)}
	case Weekly:
		wd := (int(t.Weekday()) + 6) % 7 // Monday = 0
		return Period{Freq: f, n: dayNumber(t) - wd, iso: true}
	case Monthly:
		return Period{Freq: f, n: t.Year()*12 + int(t.Month()) - 1}
	case Quarterly:
		return Period{Freq: f, n: t.Year()*4 + (int(t.Month())-1)/3}
	case Yearly:
		return Period{Freq: f, n: t.Year()}
	}
	panic("forecast: PeriodOf with unknown frequency")
}

// dayNumber returns the number of days from 1970-01-01 to the day of t (a
// midnight UTC). It works from Unix seconds rather than a time.Duration,
// which saturates about 292 years from the epoch.
func dayNumber(t time.Time) int { return FloorDiv(int(t.Unix()), 86400) }

// Add returns the period h steps after p (before it when h < 0).
func (p Period) Add(h int) Period {
	if p.Freq == Weekly {
		p.n += 7 * h
	} else {
		p.n += h
	}
	return p
}

// Sub returns the number of periods from q to p, so that q.Add(p.Sub(q)) == p.
// It panics if the frequencies differ.
func (p Period) Sub(q Period) int {
	if p.Freq != q.Freq {
		panic("forecast: Period.Sub across frequencies")
	}
	if p.Freq == Weekly {
		d := p.n - q.n
		if d >= 0 {
			return d / 7
		}
		return -((-d + 6) / 7)
	}
	return p.n - q.n
}

// Before reports whether p comes before q.
func (p Period) Before(q Period) bool { return p.n < q.n }

// IsZero reports whether p is the zero Period.
func (p Period) IsZero() bool { return p.Freq == FreqUnknown }

// Start returns the first day of the period, at midnight UTC.
func (p Period) Start() time.Time {
	switch p.Freq {
	case Daily, Weekly:
		return epoch.AddDate(0, 0, p.n)
	case Monthly:
		return time.Date(FloorDiv(p.n, 12), time.Month(mod(p.n, 12)+1), 1, 0, 0, 0, 0, time.UTC)
	case Quarterly:
		return time.Date(FloorDiv(p.n, 4), time.Month(3*mod(p.n, 4)+1), 1, 0, 0, 0, 0, time.UTC)
	case Yearly:
		return time.Date(p.n, 1, 1, 0, 0, 0, 0, time.UTC)
	}
	return time.Time{}
}

// End returns the first day after the period (an exclusive end).
func (p Period) End() time.Time { return p.Add(1).Start() }

// Days returns the number of days in the period.
func (p Period) Days() int { return dayNumber(p.End()) - dayNumber(p.Start()) }

// String returns the period's label: 2026-03-15 for a day (and for a week
// given by its first day), 2026-W11 for an ISO week, 2026-03 for a month,
// 2026-Q1 for a quarter and 2026 for a year.
func (p Period) String() string {
	switch p.Freq {
	case Daily:
		return p.Start().Format("2006-01-02")
	case Weekly:
		if p.iso {
			y, w := p.Start().ISOWeek()
			return fmt.Sprintf("%04d-W%02d", y, w)
		}
		return p.Start().Format("2006-01-02")
	case Monthly:
		return fmt.Sprintf("%04d-%02d", FloorDiv(p.n, 12), mod(p.n, 12)+1)
	case Quarterly:
		return fmt.Sprintf("%04d-Q%d", FloorDiv(p.n, 4), mod(p.n, 4)+1)
	case Yearly:
		return fmt.Sprintf("%04d", p.n)
	}
	return "?"
}

// MarshalText writes the period's label.
func (p Period) MarshalText() ([]byte, error) { return []byte(p.String()), nil }

// ErrBadPeriod is returned (wrapped) for a period label that cannot be read.
var ErrBadPeriod = errors.New("bad period")

// LabelFrequency returns the frequency a label's form suggests: Yearly for
// 2026, Quarterly for 2026-Q1, Monthly for 2026-03, Weekly for 2026-W11 and
// Daily for 2026-03-15 (a date may also label a week; only the spacing of the
// dates in a file tells).
func LabelFrequency(label string) (Frequency, error) {
	l, err := readLabel(label)
	return l.freq, err
}

// readLabel takes a label apart (scanLabel) or returns the error of
// LabelFrequency.
func readLabel(label string) (periodLabel, error) {
	l, ok := scanLabel(label)
	if !ok {
		return periodLabel{}, fmt.Errorf("%w %q (want 2026, 2026-Q1, 2026-03, 2026-W11 or 2026-03-15)", ErrBadPeriod, label)
	}
	return l, nil
}

// ParsePeriod reads a period label in frequency f. With f == FreqUnknown the
// frequency is taken from the label's form (see LabelFrequency). A date label
// is accepted for any frequency and gives the period that contains that day,
// except that a date read as Weekly starts the week on that very day.
func ParsePeriod(label string, f Frequency) (Period, error) {
	l, err := readLabel(label)
	if err != nil {
		return Period{}, err
	}
	lf := l.freq
	if f == FreqUnknown {
		f = lf
	}
	bad := func() (Period, error) {
		return Period{}, fmt.Errorf("%w %q for %s data", ErrBadPeriod, label, f)
	}
	switch lf {
	case Daily:
		t, ok := dateOf(l)
		if !ok {
			return Period{}, fmt.Errorf("%w %q: no such date", ErrBadPeriod, label)
		}
		if f == Weekly {
			return Period{Freq: Weekly, n: dayNumber(t)}, nil
		}
		return PeriodOf(f, t), nil
	case Weekly:
		if f != Weekly {
			return bad()
		}
		y, w := l.year, l.num
		// ISO week 1 is the week holding 4 January.
		jan4 := time.Date(y, 1, 4, 0, 0, 0, 0, time.UTC)
		p := PeriodOf(Weekly, jan4).Add(w - 1)
		if yy, ww := p.Start().ISOWeek(); w < 1 || yy != y || ww != w {
			return Period{}, fmt.Errorf("%w %q: year %d has no week %d", ErrBadPeriod, label, y, w)
		}
		return p, nil
	case Monthly:
		y, mo := l.year, l.num
		if mo < 1 || mo > 12 {
			return Period{}, fmt.Errorf("%w %q: month %d", ErrBadPeriod, label, mo)
		}
		if f == Daily || f == Weekly {
			return bad()
		}
		if f == Monthly {
			return Period{Freq: Monthly, n: y*12 + mo - 1}, nil // as PeriodOf gives it
		}
		return PeriodOf(f, time.Date(y, time.Month(mo), 1, 0, 0, 0, 0, time.UTC)), nil
	case Quarterly:
		if f != Quarterly && f != Yearly {
			return bad()
		}
		return PeriodOf(f, time.Date(l.year, time.Month(3*l.num-2), 1, 0, 0, 0, 0, time.UTC)), nil
	default: // Yearly
		if f != Yearly {
			return bad()
		}
		return Period{Freq: Yearly, n: l.year}, nil
	}
}

// dateOf returns the day of a date label, and ok = false if the month or
// the day does not exist (as time.Parse with the layout 2006-01-02 would
// refuse it: months 1 to 12, days 1 to the month's length in the
// proleptic Gregorian calendar).
func dateOf(l periodLabel) (time.Time, bool) {
	if l.num < 1 || l.num > 12 || l.day < 1 {
		return time.Time{}, false
	}
	// Day 0 of the next month is the last day of this one.
	if l.day > time.Date(l.year, time.Month(l.num)+1, 0, 0, 0, 0, 0, time.UTC).Day() {
		return time.Time{}, false
	}
	return time.Date(l.year, time.Month(l.num), l.day, 0, 0, 0, 0, time.UTC), true
}

// FloorDiv returns floor(a / b), rounding toward minus infinity where Go's
// division truncates toward zero: FloorDiv(-7, 2) is -4. It panics if b
// is 0.
func FloorDiv(a, b int) int {
	q := a / b
	if (a%b != 0) && ((a < 0) != (b < 0)) {
		q--
	}
	return q
}

func mod(a, b int) int { return a - b*FloorDiv(a, b) }
