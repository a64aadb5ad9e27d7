package scenario

import (
	"math"
	"strconv"
	"strings"
)

// FormatNumber formats v for a planner's eyes, with a comma between
// thousands: FormatNumber(-1234567.891, 1) is "-1,234,567.9". decimals is
// the number of decimals; a negative decimals gives the fewest that read
// back as v (FormatNumber(0.25, -1) is "0.25"). NaN prints as "-", the
// infinities as "inf" and "-inf", and a value that rounds to zero has no
// minus sign.
func FormatNumber(v float64, decimals int) string {
	switch {
	case math.IsNaN(v):
		return "-"
	case math.IsInf(v, 1):
		return "inf"
	case math.IsInf(v, -1):
		return "-inf"
	}
	s := strconv.FormatFloat(math.Abs(v), 'f', decimals, 64)
	whole, frac := s, ""
	if i := strings.IndexByte(s, '.'); i >= 0 {
		whole, frac = s[:i], s[i:]
	}
	var b strings.Builder
	if v < 0 && strings.Trim(s, "0.") != "" {
		b.WriteByte('-')
	}
	for i, c := range whole {
		if i > 0 && (len(whole)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(c)
	}
	return b.String() + frac
}

// Decimals picks the decimals for a table of numbers like v, by the
// largest magnitude m among them: none when m >= 1000, one when
// m >= 100, two below (NaNs are skipped).
func Decimals(v []float64) int {
	m := 0.0
	for _, x := range v {
		if !math.IsNaN(x) {
			m = math.Max(m, math.Abs(x))
		}
	}
	switch {
	case m >= 1000:
		return 0
	case m >= 100:
		return 1
	}
	return 2
}
