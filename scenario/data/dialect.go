package data

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"math"
	"regexp"
	"strings"
)

// # CSV as spreadsheets save it
//
// A CSV file's cells are separated by commas, semicolons or tabs: the
// separator is the one of the three that occurs most often, outside
// double quotes, on the first line that is not blank (the header); a
// header with none of them is read as comma-separated (one column). A
// spreadsheet set to a language that writes decimal commas saves with
// semicolons; with Decimal set to DecimalComma such a file's numbers are
// read with a comma for the decimal point (12,5 is 12.5). A decimal comma
// needs a semicolon or tab separator: with commas it would split a
// number in two, and asking for it is an error. Thousands separators
// (1.234,5, 1,234.5, 1 234) are refused whatever the setting, with a
// message that says how to write the number.

// ErrDialect is returned (wrapped in a *ParseError) when a reading option
// does not fit the file: a decimal comma asked for a file separated by
// commas, or a sheet the workbook does not have.
var ErrDialect = errors.New("cannot read the file this way")

// A Decimal is the mark between the whole and the fractional part of a
// number in a CSV file.
type Decimal int

const (
	// DecimalPoint reads 12.5 (the default).
	DecimalPoint Decimal = iota
	// DecimalComma reads 12,5; the cells must be separated by semicolons
	// or tabs.
	DecimalComma
)

// String returns "point" or "comma".
func (d Decimal) String() string {
	if d == DecimalComma {
		return "comma"
	}
	return "point"
}

// ParseDecimalMark reads "point" or "comma" (any case); an empty text is
// DecimalPoint.
func ParseDecimalMark(s string) (Decimal, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "point":
		return DecimalPoint, nil
	case "comma":
		return DecimalComma, nil
	}
	return 0, fmt.Errorf("unknown decimal mark %q; want point or comma", s)
}

// Format says how to read the cells of a table file besides its layout:
// the sheet of a workbook and the decimal mark of a CSV file. The zero
// value reads the first sheet, or a CSV file with decimal points.
type Format struct {
	// Sheet names the sheet to read from a workbook; empty reads the
	// first one. It is ignored for a CSV file.
	Sheet string
	// Decimal is the decimal mark of the numbers of a CSV file, and of
	// numbers a workbook holds as text.
	Decimal Decimal
	// Percent, when true, gives the numbers a workbook formats as
	// percentages as text with a percent sign: "8%" for the 0.08 the
	// cell holds (the events file reads them so). When false they are
	// read as held.
	Percent bool
}

// separatorName names a separator for messages and notes.
func separatorName(sep rune) string {
	switch sep {
	case ';':
		return "semicolons"
	case '\t':
		return "tabs"
	}
	return "commas"
}

// headerPeek is how much of a CSV file is looked at to find its header
// line and separator.
const headerPeek = 64 << 10

// detectSeparator returns the separator of the first line of br that is
// not blank, without consuming anything; comma when there is none.
func detectSeparator(br *bufio.Reader) rune {
	b, _ := br.Peek(headerPeek) // a short or failed peek gives what there is
	for len(b) > 0 {
		line := b
		if i := bytes.IndexByte(b, '\n'); i >= 0 {
			line, b = b[:i], b[i+1:]
		} else {
			b = nil
		}
		if len(bytes.Trim(line, " \t\r,;")) == 0 {
			continue
		}
		counts := map[rune]int{}
		quoted := false
		for _, c := range string(line) {
			switch {
			case c == '"':
				quoted = !quoted
			case !quoted && (c == ',' || c == ';' || c == '\t'):
				counts[c]++
			}
		}
		best := ','
		for _, c := range []rune{';', '\t'} {
			if counts[c] > counts[best] {
				best = c
			}
		}
		return best
	}
	return ','
}

// thousandsPattern matches digits grouped by three with a separator: a
// comma, point, space, no-break space, narrow no-break space or
// apostrophe, with an optional decimal part.
var thousandsPattern = regexp.MustCompile("^[+-]?[0-9]{1,3}([,. '\u00a0\u202f][0-9]{3})+([.,][0-9]*)?$")

// ParseNumber reads a value cell: ParseDecimal's grammar with the decimal
// mark dec. Thousands separators are refused with a message that says how
// to write the number, and so is a decimal comma when dec is
// DecimalPoint.
func ParseNumber(s string, dec Decimal) (float64, error) {
	return ParseNumberAs(s, dec, HistoryDecimal)
}

// HistoryDecimal names the settings that read decimal commas in a
// history or actuals file, for ParseNumber's messages.
const HistoryDecimal = "--decimal comma (or decimal: comma under history in the scenario file)"

// ParseNumberAs is ParseNumber with how naming, in its messages, the
// setting that reads decimal commas in the file at hand.
func ParseNumberAs(s string, dec Decimal, how string) (float64, error) {
	t := strings.TrimSpace(s)
	if dec == DecimalComma {
		if strings.Contains(t, ".") {
			if thousandsPattern.MatchString(t) {
				return 0, &numberError{kind: ErrNotDecimal, text: t,
					fix: "thousands separators are not read; write the digits without them, such as " + strings.Replace(withoutThousands(t), ".", ",", 1)}
			}
			return 0, &numberError{kind: ErrNotDecimal, text: t,
				fix: "decimal commas were asked for, so a point is not read; write 12,5"}
		}
		u := strings.Replace(t, ",", ".", 1)
		if strings.Contains(t, ",") && !isDecimal(u) {
			if thousandsPattern.MatchString(t) {
				return 0, &numberError{kind: ErrNotDecimal, text: t, fix: "thousands separators are not read; write the digits without them"}
			}
			return 0, &numberError{kind: ErrNotDecimal, text: t, fix: "write digits with an optional sign, comma and exponent, such as -12,5 or 1,2e3"}
		}
		return ParseDecimal(u)
	}
	if isDecimal(t) {
		return ParseDecimal(t)
	}
	return 0, numberHint(t, how)
}

// numberHint builds the error for a cell that is not a plain decimal
// number, naming the separators it may hold.
func numberHint(t, how string) error {
	comma, point := strings.Contains(t, ","), strings.Contains(t, ".")
	switch {
	case thousandsPattern.MatchString(t) && comma && point && strings.LastIndex(t, ",") > strings.LastIndex(t, "."):
		// 1.234,5: points for thousands, a comma for decimals.
		return &numberError{kind: ErrNotDecimal, text: t, fix: fmt.Sprintf(
			"thousands separators are not read; write %s, or %s and read the file with %s",
			withoutThousands(t), strings.ReplaceAll(withoutThousands(t), ".", ","), how)}
	case thousandsPattern.MatchString(t) && (point || !comma):
		// 1,234.5, 1 234 or 1.234 (points for thousands).
		return &numberError{kind: ErrNotDecimal, text: t, fix: fmt.Sprintf(
			"thousands separators are not read; write the digits without them, such as %s", withoutThousands(t))}
	case thousandsPattern.MatchString(t):
		// 1,234: thousands, or a decimal comma.
		return &numberError{kind: ErrNotDecimal, text: t, fix: fmt.Sprintf(
			"if the comma separates thousands, write %s (thousands separators are not read); if it is a decimal comma, read the file with %s",
			withoutThousands(t), how)}
	case comma && !point && isDecimal(strings.Replace(t, ",", ".", 1)):
		return &numberError{kind: ErrNotDecimal, text: t,
			fix: "a decimal comma; read the file with " + how + ", or write a point"}
	}
	return notDecimal(t)
}

// withoutThousands rewrites a number that matched thousandsPattern
// without its group separators and with a point for its decimal mark: the
// group separator is the first separator met, and a last one of another
// kind is the decimal mark (1.234,5 gives 1234.5, 1 234 gives 1234).
func withoutThousands(t string) string {
	var b strings.Builder
	var group rune
	last := strings.LastIndexFunc(t, func(c rune) bool { return !(c >= '0' && c <= '9') && c != '+' && c != '-' })
	for i, c := range t {
		switch {
		case c >= '0' && c <= '9', c == '+', c == '-':
			b.WriteRune(c)
		case group == 0:
			group = c
		case i == last && c != group:
			b.WriteByte('.')
		}
	}
	return b.String()
}

// value reads one value cell of the history reader; an empty cell is a
// missing value and gives NaN.
func (hr *historyReader) value(s string) (float64, error) {
	if s == "" {
		return math.NaN(), nil
	}
	return ParseNumber(s, hr.opt.Decimal)
}
