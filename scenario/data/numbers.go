package data

import (
	"errors"
	"math"
	"strconv"
	"strings"
)

// Errors of ParseDecimal, matched with errors.Is. Both come wrapped
// together with ErrBadNumber, so a caller that only asks whether a cell is
// a number need not know them.
var (
	// ErrNotDecimal: the text is not a plain decimal number (it has digit
	// separators, is hexadecimal, or is not a number at all).
	ErrNotDecimal = errors.New("not a plain decimal number")
	// ErrNotFinite: the text names NaN or an infinity, or is a decimal
	// number too large for a float64.
	ErrNotFinite = errors.New("not a finite number")
)

// ParseDecimal reads s, with leading and trailing spaces trimmed, as a
// plain decimal number:
//
//	number   = [sign] mantissa [exponent]
//	mantissa = digits ["." [digits]] | "." digits
//	exponent = ("e" | "E") [sign] digits
//	sign     = "+" | "-"
//	digits   = one or more of 0 to 9
//
// So 12, -3.5, +.5, 7. and 1.2e3 are numbers; 1_000, 1,000, 0x1p4, NaN,
// Inf and an empty string are not (strconv.ParseFloat accepts the first
// three kinds and the words; this does not). A number whose size is below
// the smallest float64 reads as 0 (or the nearest subnormal), as
// strconv.ParseFloat does.
//
// It returns an error wrapping ErrBadNumber and ErrNotFinite for NaN, an
// infinity (any case, with or without a sign) or a number beyond the range
// of a float64 (about 1.8e308), and one wrapping ErrBadNumber and
// ErrNotDecimal for anything else that does not fit the grammar. The
// message quotes s and says what to write instead, for example
//
//	not a plain decimal number: "1_000"; write the digits without separators, such as 1000
//	not a finite number: "NaN"; leave the cell empty where the value is missing
func ParseDecimal(s string) (float64, error) {
	t := strings.TrimSpace(s)
	if !isDecimal(t) {
		return 0, notDecimal(t)
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || math.IsInf(v, 0) {
		// The grammar rules out every syntax error, so only a value
		// beyond the float64 range gets here.
		return 0, &numberError{kind: ErrNotFinite, text: t,
			fix: "it is out of range (beyond about 1.8e308); check the cell"}
	}
	return v, nil
}

// isDecimal reports whether s fits ParseDecimal's grammar.
func isDecimal(s string) bool {
	i := 0
	digits := func() int {
		j := i
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
		}
		return i - j
	}
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	n := digits()
	if i < len(s) && s[i] == '.' {
		i++
		n += digits()
	}
	if n == 0 {
		return false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			i++
		}
		if digits() == 0 {
			return false
		}
	}
	return i == len(s)
}

// notDecimal builds the error for text that is not a plain decimal
// number, with a fix suited to what was found.
func notDecimal(t string) error {
	word := strings.ToLower(strings.TrimLeft(t, "+-"))
	switch {
	case word == "nan" || word == "inf" || word == "infinity":
		return &numberError{kind: ErrNotFinite, text: t, fix: "leave the cell empty where the value is missing"}
	case strings.Contains(t, "_"):
		return &numberError{kind: ErrNotDecimal, text: t, fix: "write the digits without separators, such as 1000"}
	case strings.HasPrefix(word, "0x"):
		return &numberError{kind: ErrNotDecimal, text: t, fix: "write the value in decimal digits"}
	case strings.Contains(t, ","):
		return &numberError{kind: ErrNotDecimal, text: t, fix: "use a point for decimals and no thousands separators, such as 1234.5"}
	}
	return &numberError{kind: ErrNotDecimal, text: t, fix: "write digits with an optional sign, point and exponent, such as -12.5 or 1.2e3"}
}

// A numberError is an error of ParseDecimal: kind is ErrNotDecimal or
// ErrNotFinite, text the trimmed input and fix what to do.
type numberError struct {
	kind      error
	text, fix string
}

func (e *numberError) Error() string {
	return e.kind.Error() + ": " + strconv.Quote(e.text) + "; " + e.fix
}

// Unwrap returns the kind and ErrBadNumber.
func (e *numberError) Unwrap() []error { return []error{e.kind, ErrBadNumber} }
