package forecast

// periodLabel is a period label taken apart by scanLabel: its form
// (the frequency it suggests), the year and, for a quarter, a month, a
// week or a date, the number after the year (and the day of a date).
type periodLabel struct {
	freq      Frequency
	year, num int
	day       int
}

// scanLabel reads the form of a period label by hand. It accepts exactly
// these forms (d is an ASCII digit):
//
//	dddd               a year
//	dddd-Qn, ddddQn    a quarter, n in 1..4, Q or q
//	dddd-d, dddd-dd    a month (the range is checked by ParsePeriod)
//	dddd-Wd, ddddWdd   an ISO week, with or without the dash, one or two digits
//	dddd-dd-dd         a date
//
// and reports ok = false for anything else.
func scanLabel(s string) (l periodLabel, ok bool) {
	if len(s) < 4 {
		return l, false
	}
	y, ok := digits(s[:4])
	if !ok {
		return l, false
	}
	l.year = y
	rest := s[4:]
	if rest == "" {
		l.freq = Yearly
		return l, true
	}
	dash := rest[0] == '-'
	if dash {
		rest = rest[1:]
	}
	if rest == "" {
		return l, false
	}
	switch rest[0] {
	case 'Q', 'q':
		if len(rest) != 2 || rest[1] < '1' || rest[1] > '4' {
			return l, false
		}
		l.freq, l.num = Quarterly, int(rest[1]-'0')
		return l, true
	case 'W':
		n, ok := digits(rest[1:])
		if !ok || len(rest) > 3 {
			return l, false
		}
		l.freq, l.num = Weekly, n
		return l, true
	}
	if !dash {
		return l, false
	}
	if n, ok := digits(rest); ok && len(rest) <= 2 {
		l.freq, l.num = Monthly, n
		return l, true
	}
	if len(rest) != 5 || rest[2] != '-' {
		return l, false
	}
	mo, ok1 := digits(rest[:2])
	d, ok2 := digits(rest[3:])
	if !ok1 || !ok2 {
		return l, false
	}
	l.freq, l.num, l.day = Daily, mo, d
	return l, true
}

// digits returns the value of s if it is one or more ASCII digits.
func digits(s string) (int, bool) {
	if s == "" {
		return 0, false
	}
	n := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c < '0' || c > '9' {
			return 0, false
		}
		n = 10*n + int(c-'0')
	}
	return n, true
}
