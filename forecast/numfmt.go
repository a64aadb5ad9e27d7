package forecast

import (
	"math"
	"strconv"
	"strings"
)

// Beyond these sizes FormatNumber writes scientific notation.
const (
	hugeNumber = 1e15
	tinyNumber = 1e-6
)

// FormatNumber formats v for a planner's eyes, with a comma between
// thousands: FormatNumber(-1234567.891, 1) is "-1,234,567.9". decimals is
// the number of decimals; a negative decimals gives the fewest that read
// back as v (FormatNumber(0.25, -1) is "0.25"). NaN prints as "-", the
// infinities as "inf" and "-inf", and a value that rounds to zero has no
// minus sign. A value of 1e15 or more in size, or a non-zero one below
// 1e-6 (with decimals >= 0), is written in scientific notation with four
// decimals (1.4799e+160).
func FormatNumber(v float64, decimals int) string {
	switch {
	case math.IsNaN(v):
		return "-"
	case math.IsInf(v, 1):
		return "inf"
	case math.IsInf(v, -1):
		return "-inf"
	}
	if a := math.Abs(v); a >= hugeNumber || a != 0 && a < tinyNumber && decimals >= 0 {
		return strconv.FormatFloat(v, 'e', 4, 64) // 1.4799e+160: digits by the hundred read as noise
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

// SpreadDecimals picks the decimals for values the size of an error or a
// spread: none from 100 up, one from 10, two below.
func SpreadDecimals(size float64) int {
	switch a := math.Abs(size); {
	case a >= 100:
		return 0
	case a >= 10:
		return 1
	}
	return 2
}
