package scenario

import (
	"errors"
	"testing"
	"time"

	"forelay/forecast"
)

func day(s string) time.Time {
	t, err := time.Parse("2006-01-02", s)
	if err != nil {
		panic(err)
	}
	return t
}

func TestParseWhen(t *testing.T) {
	// Days covered by each label, from the Gregorian calendar (common
	// practice); ISO week dates checked with Python 3.11's datetime:
	// date.fromisocalendar(2027, 33, 1) = 2027-08-16.
	for _, tc := range []struct {
		label    string
		wantLbl  string
		wantUnit forecast.Frequency
		from, to string
		days     int
	}{
		{"2027", "2027", forecast.Yearly, "2027-01-01", "2028-01-01", 365},
		{"2028", "2028", forecast.Yearly, "2028-01-01", "2029-01-01", 366},
		{"2027-Q3", "2027-Q3", forecast.Quarterly, "2027-07-01", "2027-10-01", 92},
		{"2027q3", "2027-Q3", forecast.Quarterly, "2027-07-01", "2027-10-01", 92},
		{"2027-08", "2027-08", forecast.Monthly, "2027-08-01", "2027-09-01", 31},
		{"2027-8", "2027-08", forecast.Monthly, "2027-08-01", "2027-09-01", 31},
		// February 2028 has 29 days: 2028 is divisible by 4 and not by 100.
		{"2028-02", "2028-02", forecast.Monthly, "2028-02-01", "2028-03-01", 29},
		{"2027-02", "2027-02", forecast.Monthly, "2027-02-01", "2027-03-01", 28},
		{"2027-W33", "2027-W33", forecast.Weekly, "2027-08-16", "2027-08-23", 7},
		{"2027-08-14", "2027-08-14", forecast.Daily, "2027-08-14", "2027-08-15", 1},
	} {
		t.Run(tc.label, func(t *testing.T) {
			w, err := ParseWhen(tc.label)
			if err != nil {
				t.Fatal(err)
			}
			if w.Label != tc.wantLbl || w.Unit != tc.wantUnit || !w.From.Equal(day(tc.from)) || !w.To.Equal(day(tc.to)) || w.Days() != tc.days {
				t.Errorf("ParseWhen(%q) = %s %s [%s, %s) %d days; want %s %s [%s, %s) %d days", tc.label,
					w.Label, w.Unit, w.From.Format(time.DateOnly), w.To.Format(time.DateOnly), w.Days(),
					tc.wantLbl, tc.wantUnit, tc.from, tc.to, tc.days)
			}
			if got := w.Last(); !got.Equal(day(tc.to).AddDate(0, 0, -1)) {
				t.Errorf("Last() = %s", got)
			}
		})
	}
	for _, bad := range []string{"", "2027-13", "2027-02-30", "27-08", "August", "2027-W54", "2027-Q5"} {
		if _, err := ParseWhen(bad); !errors.Is(err, forecast.ErrBadPeriod) {
			t.Errorf("ParseWhen(%q) error = %v; want ErrBadPeriod", bad, err)
		}
	}
	if !(When{}).IsZero() {
		t.Error("zero When is not IsZero")
	}
}

func TestContaining(t *testing.T) {
	// A weekly grid whose weeks start on Sunday: 2027-08-01 is a Sunday
	// (Python 3.11: date(2027, 8, 1).strftime("%A") = "Sunday").
	sunday, err := forecast.ParsePeriod("2027-08-01", forecast.Weekly)
	if err != nil {
		t.Fatal(err)
	}
	month, _ := forecast.ParsePeriod("2027-01", forecast.Monthly)
	daily, _ := forecast.ParsePeriod("2027-01-01", forecast.Daily)
	for _, tc := range []struct {
		name    string
		grid    forecast.Period
		t       string
		want    string // start of the containing period
		aligned bool
	}{
		{"week same day", sunday, "2027-08-01", "2027-08-01", true},
		{"week mid", sunday, "2027-08-11", "2027-08-08", false},
		{"week before grid", sunday, "2027-07-31", "2027-07-25", false},
		{"week far before", sunday, "2026-12-27", "2026-12-27", true},
		{"month", month, "2028-02-29", "2028-02-01", false},
		{"month start", month, "2028-02-01", "2028-02-01", true},
		{"day", daily, "2026-12-31", "2026-12-31", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := containing(tc.grid, day(tc.t))
			if !p.Start().Equal(day(tc.want)) || p.Freq != tc.grid.Freq {
				t.Errorf("containing = %s starting %s; want start %s", p, p.Start().Format(time.DateOnly), tc.want)
			}
			if got := aligned(tc.grid, day(tc.t)); got != tc.aligned {
				t.Errorf("aligned = %v; want %v", got, tc.aligned)
			}
		})
	}
}
