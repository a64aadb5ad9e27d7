package forecast

import (
	"errors"
	"testing"
	"time"
)

func date(y int, m time.Month, d int) time.Time {
	return time.Date(y, m, d, 0, 0, 0, 0, time.UTC)
}

func mustPeriod(t *testing.T, label string, f Frequency) Period {
	t.Helper()
	p, err := ParsePeriod(label, f)
	if err != nil {
		t.Fatalf("ParsePeriod(%q, %v): %v", label, f, err)
	}
	return p
}

// Unless a comment says otherwise, the expected dates and ISO weeks below
// were computed with Python's datetime module (Debian python3 3.11), e.g.
//
//	/usr/bin/python3 -c 'import datetime; print(datetime.date.fromisocalendar(2026,1,1))'
//	/usr/bin/python3 -c 'import datetime as d; print(d.date(2026,3,15)+d.timedelta(days=20))'
func TestPeriodRoundTrip(t *testing.T) {
	tests := []struct {
		name  string
		label string
		f     Frequency // passed to ParsePeriod
		freq  Frequency // frequency of the result
		start time.Time
		str   string // String() of the parsed period
		h     int
		add   string // String() of p.Add(h)
	}{
		// date(2026,3,15)+timedelta(days=20) = 2026-04-04
		{"day", "2026-03-15", FreqUnknown, Daily, date(2026, 3, 15), "2026-03-15", 20, "2026-04-04"},
		// date(2026,3,15)-timedelta(days=15) = 2026-02-28 (2026 is not a leap year)
		{"day back across February", "2026-03-15", Daily, Daily, date(2026, 3, 15), "2026-03-15", -15, "2026-02-28"},
		// fromisocalendar(2026,11,1) = 2026-03-09; 11 weeks earlier is ISO (2025, 52)
		{"ISO week", "2026-W11", FreqUnknown, Weekly, date(2026, 3, 9), "2026-W11", -11, "2025-W52"},
		// fromisocalendar(2026,1,1) = 2025-12-29: week 1 starts in the year before
		{"ISO week 1 starts in December", "2026-W01", FreqUnknown, Weekly, date(2025, 12, 29), "2026-W01", 52, "2026-W53"},
		// fromisocalendar(2020,53,1) = 2020-12-28; one week on is (2021, 1),
		// which starts on fromisocalendar(2021,1,1) = 2021-01-04
		{"ISO week 53 of 2020", "2020-W53", Weekly, Weekly, date(2020, 12, 28), "2020-W53", 1, "2021-W01"},
		{"ISO week without dash", "2026W11", FreqUnknown, Weekly, date(2026, 3, 9), "2026-W11", 0, "2026-W11"},
		// a date read as weekly starts the week on that day (a Wednesday);
		// seven days on is 2026-03-25 (hand count)
		{"week from a date", "2026-03-18", Weekly, Weekly, date(2026, 3, 18), "2026-03-18", 1, "2026-03-25"},
		// hand count: 2026-03 + 10 months = 2027-01
		{"month", "2026-03", FreqUnknown, Monthly, date(2026, 3, 1), "2026-03", 10, "2027-01"},
		{"month back a year", "2026-03", Monthly, Monthly, date(2026, 3, 1), "2026-03", -15, "2024-12"},
		{"month one digit", "2026-3", FreqUnknown, Monthly, date(2026, 3, 1), "2026-03", 0, "2026-03"},
		// hand count: 2026-Q1 + 5 quarters = 2027-Q2
		{"quarter", "2026-Q1", FreqUnknown, Quarterly, date(2026, 1, 1), "2026-Q1", 5, "2027-Q2"},
		{"quarter back", "2026-q3", FreqUnknown, Quarterly, date(2026, 7, 1), "2026-Q3", -3, "2025-Q4"},
		{"year", "2026", FreqUnknown, Yearly, date(2026, 1, 1), "2026", -30, "1996"},
		// a date read as a month, quarter or year gives the period holding it
		{"date as month", "2026-03-15", Monthly, Monthly, date(2026, 3, 1), "2026-03", 1, "2026-04"},
		{"date as quarter", "2026-08-31", Quarterly, Quarterly, date(2026, 7, 1), "2026-Q3", 2, "2027-Q1"},
		{"month as quarter", "2026-05", Quarterly, Quarterly, date(2026, 4, 1), "2026-Q2", 0, "2026-Q2"},
		{"quarter as year", "2026-Q4", Yearly, Yearly, date(2026, 1, 1), "2026", 1, "2027"},
		// (date(2300,1,1)-date(1970,1,1)).days = 120530, past the ~292 years a
		// time.Duration can hold; the same for 1600-02-29 (-135081 days)
		{"far future day", "2300-01-01", FreqUnknown, Daily, date(2300, 1, 1), "2300-01-01", 1, "2300-01-02"},
		{"far past day", "1600-02-29", FreqUnknown, Daily, date(1600, 2, 29), "1600-02-29", 1, "1600-03-01"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := mustPeriod(t, tc.label, tc.f)
			if p.Freq != tc.freq {
				t.Errorf("Freq = %v, want %v", p.Freq, tc.freq)
			}
			if got := p.Start(); !got.Equal(tc.start) {
				t.Errorf("Start() = %v, want %v", got.Format("2006-01-02"), tc.start.Format("2006-01-02"))
			}
			if got := p.String(); got != tc.str {
				t.Errorf("String() = %q, want %q", got, tc.str)
			}
			q := p.Add(tc.h)
			if got := q.String(); got != tc.add {
				t.Errorf("Add(%d) = %q, want %q", tc.h, got, tc.add)
			}
			if got := q.Sub(p); got != tc.h {
				t.Errorf("Add(%d).Sub(p) = %d", tc.h, got)
			}
			if got := p.Sub(q); got != -tc.h {
				t.Errorf("p.Sub(Add(%d)) = %d, want %d", tc.h, got, -tc.h)
			}
			if got := p.Add(tc.h).Add(-tc.h); got != p {
				t.Errorf("Add(h).Add(-h) = %v, want %v", got, p)
			}
			// The label String prints reads back to the same period.
			if back := mustPeriod(t, q.String(), q.Freq); back != q {
				t.Errorf("ParsePeriod(%q) = %v, want %v", q.String(), back, q)
			}
			if tc.h > 0 && !p.Before(q) || tc.h < 0 && !q.Before(p) {
				t.Errorf("Before disagrees with Add(%d)", tc.h)
			}
		})
	}
}

func TestParsePeriodErrors(t *testing.T) {
	tests := []struct {
		label string
		f     Frequency
	}{
		// Python: datetime.date.fromisocalendar(2021,53,1) raises
		// "Invalid week: 53"; 2021 has 52 ISO weeks.
		{"2021-W53", FreqUnknown},
		{"2026-W00", Weekly},
		{"2026-W54", Weekly},
		{"2026-13", FreqUnknown},
		{"2026-00", Monthly},
		// Gregorian rule (common practice): 2026 is not a leap year and 1900,
		// a century not divisible by 400, is not one either.
		{"2026-02-29", FreqUnknown},
		{"1900-02-29", Daily},
		{"2026-Q5", FreqUnknown},
		{"26-03", FreqUnknown},
		{"March 2026", FreqUnknown},
		{"", FreqUnknown},
		// A label cannot be read at a finer frequency than its own.
		{"2026-03", Daily},
		{"2026-03", Weekly},
		{"2026-Q1", Monthly},
		{"2026", Quarterly},
		{"2026-W11", Monthly},
		{"2026-W11", Daily},
	}
	for _, tc := range tests {
		p, err := ParsePeriod(tc.label, tc.f)
		if !errors.Is(err, ErrBadPeriod) {
			t.Errorf("ParsePeriod(%q, %v) = %v, %v; want ErrBadPeriod", tc.label, tc.f, p, err)
		}
	}
}

// Python: datetime.date(2026,3,22).isocalendar() = (2026, 12, 7), the
// Sunday that ends week 12, which starts on fromisocalendar(2026,12,1) =
// 2026-03-16; datetime.date(2027,1,1).isocalendar() = (2026, 53, 5).
func TestPeriodOfWeekly(t *testing.T) {
	tests := []struct {
		day   time.Time
		label string
		start time.Time
	}{
		{date(2026, 3, 22), "2026-W12", date(2026, 3, 16)},
		{date(2026, 3, 16), "2026-W12", date(2026, 3, 16)},
		{date(2027, 1, 1), "2026-W53", date(2026, 12, 28)},
		{date(2025, 12, 31), "2026-W01", date(2025, 12, 29)},
	}
	for _, tc := range tests {
		p := PeriodOf(Weekly, tc.day.Add(15*time.Hour))
		if p.String() != tc.label || !p.Start().Equal(tc.start) {
			t.Errorf("PeriodOf(Weekly, %s) = %s starting %s, want %s starting %s",
				tc.day.Format("2006-01-02"), p, p.Start().Format("2006-01-02"), tc.label, tc.start.Format("2006-01-02"))
		}
	}
}

func TestPeriodSubWeeklyNegative(t *testing.T) {
	// fromisocalendar(2026,1,1) = 2025-12-29 and fromisocalendar(2026,11,1)
	// = 2026-03-09 are 70 days = 10 weeks apart (Python datetime).
	w1 := mustPeriod(t, "2026-W01", Weekly)
	w11 := mustPeriod(t, "2026-W11", Weekly)
	if got := w1.Sub(w11); got != -10 {
		t.Errorf("2026-W01 - 2026-W11 = %d, want -10", got)
	}
	if got := w11.Sub(w1); got != 10 {
		t.Errorf("2026-W11 - 2026-W01 = %d, want 10", got)
	}
	// Across the year end: 2021-W01 - 2020-W53 = 1 (Python: fromisocalendar
	// gives 2020-12-28 and 2021-01-04, 7 days apart).
	w53 := mustPeriod(t, "2020-W53", Weekly)
	nw1 := mustPeriod(t, "2021-W01", Weekly)
	if got := w53.Sub(nw1); got != -1 {
		t.Errorf("2020-W53 - 2021-W01 = %d, want -1", got)
	}
	// Weeks labelled by their first day: 2026-01-07 to 2026-03-18 is 70 days
	// (Python: (date(2026,3,18)-date(2026,1,7)).days).
	a := mustPeriod(t, "2026-01-07", Weekly)
	b := mustPeriod(t, "2026-03-18", Weekly)
	if got := a.Sub(b); got != -10 {
		t.Errorf("2026-01-07 - 2026-03-18 in weeks = %d, want -10", got)
	}
}

func TestPeriodSubPanicsAcrossFrequencies(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("Sub across frequencies did not panic")
		}
	}()
	mustPeriod(t, "2026-03", Monthly).Sub(mustPeriod(t, "2026-Q1", Quarterly))
}

// The lengths follow the Gregorian leap-year rule (common practice: every
// 4th year, except centuries not divisible by 400), checked with Python:
// (datetime.date(2024,3,1)-datetime.date(2024,2,1)).days = 29, and so on.
func TestPeriodDays(t *testing.T) {
	tests := []struct {
		label string
		f     Frequency
		want  int
	}{
		{"2024-02", Monthly, 29},
		{"2023-02", Monthly, 28},
		{"2000-02", Monthly, 29},
		{"1900-02", Monthly, 28},
		{"1600-02", Monthly, 29},
		{"2026-01", Monthly, 31},
		{"2026-04", Monthly, 30},
		{"2024-Q1", Quarterly, 91}, // date(2024,4,1)-date(2024,1,1)
		{"2025-Q1", Quarterly, 90},
		{"2024", Yearly, 366},
		{"2026", Yearly, 365},
		{"2026-W11", Weekly, 7},
		{"2026-03-18", Weekly, 7},
		{"2026-03-18", Daily, 1},
	}
	for _, tc := range tests {
		if got := mustPeriod(t, tc.label, tc.f).Days(); got != tc.want {
			t.Errorf("%s (%v).Days() = %d, want %d", tc.label, tc.f, got, tc.want)
		}
	}
}

func TestLabelFrequency(t *testing.T) {
	tests := []struct {
		label string
		want  Frequency
	}{
		{"2026", Yearly},
		{"2026-Q1", Quarterly},
		{"2026Q1", Quarterly},
		{"2026-03", Monthly},
		{"2026-W11", Weekly},
		{"2026-03-15", Daily},
	}
	for _, tc := range tests {
		got, err := LabelFrequency(tc.label)
		if err != nil || got != tc.want {
			t.Errorf("LabelFrequency(%q) = %v, %v; want %v", tc.label, got, err, tc.want)
		}
	}
	if _, err := LabelFrequency("2026/03"); !errors.Is(err, ErrBadPeriod) {
		t.Errorf("LabelFrequency(2026/03) error = %v, want ErrBadPeriod", err)
	}
}
