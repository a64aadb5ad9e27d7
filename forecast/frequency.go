package forecast

import (
	"fmt"
	"strings"
)

// Frequency is the length of one period of a series.
type Frequency int

// The frequencies a history may have. FreqUnknown is the zero value and means
// "infer from the labels".
const (
	FreqUnknown Frequency = iota
	Daily
	Weekly
	Monthly
	Quarterly
	Yearly
)

var freqNames = [...]string{"unknown", "day", "week", "month", "quarter", "year"}

// String returns the name used in files and flags: day, week, month, quarter
// or year.
func (f Frequency) String() string {
	if f < 0 || int(f) >= len(freqNames) {
		return fmt.Sprintf("Frequency(%d)", int(f))
	}
	return freqNames[f]
}

// ParseFrequency reads a frequency name. It accepts the names String returns
// and the adjectives daily, weekly, monthly, quarterly and yearly (or annual).
// The empty string gives FreqUnknown.
func ParseFrequency(s string) (Frequency, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "":
		return FreqUnknown, nil
	case "day", "daily", "d":
		return Daily, nil
	case "week", "weekly", "w":
		return Weekly, nil
	case "month", "monthly", "m":
		return Monthly, nil
	case "quarter", "quarterly", "q":
		return Quarterly, nil
	case "year", "yearly", "annual", "y":
		return Yearly, nil
	}
	return FreqUnknown, fmt.Errorf("unknown period %q (want day, week, month, quarter or year)", s)
}

// SeasonLength returns the usual number of periods in one seasonal cycle:
// 7 for days, 52 for weeks, 12 for months, 4 for quarters and 1 (no season)
// for years.
func (f Frequency) SeasonLength() int {
	switch f {
	case Daily:
		return 7
	case Weekly:
		return 52
	case Monthly:
		return 12
	case Quarterly:
		return 4
	}
	return 1
}

// DefaultHorizon returns the forecast length used when none is asked for:
// 28 days, 26 weeks, 12 months, 8 quarters or 5 years.
func (f Frequency) DefaultHorizon() int {
	switch f {
	case Daily:
		return 28
	case Weekly:
		return 26
	case Monthly:
		return 12
	case Quarterly:
		return 8
	}
	return 5
}
