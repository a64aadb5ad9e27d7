package forecast

import (
	"fmt"
	"regexp"
	"strings"
	"testing"
	"time"
)

// The regular expressions LabelFrequency used before the hand parser; the
// hand parser must accept exactly what they accept, with the same form.
var (
	oldReYear    = regexp.MustCompile(`^(\d{4})$`)
	oldReQuarter = regexp.MustCompile(`^(\d{4})-?[Qq]([1-4])$`)
	oldReMonth   = regexp.MustCompile(`^(\d{4})-(\d{1,2})$`)
	oldReWeek    = regexp.MustCompile(`^(\d{4})-?W(\d{1,2})$`)
	oldReDay     = regexp.MustCompile(`^(\d{4})-(\d{2})-(\d{2})$`)
)

func oldLabelFrequency(s string) Frequency {
	switch {
	case oldReYear.MatchString(s):
		return Yearly
	case oldReQuarter.MatchString(s):
		return Quarterly
	case oldReMonth.MatchString(s):
		return Monthly
	case oldReWeek.MatchString(s):
		return Weekly
	case oldReDay.MatchString(s):
		return Daily
	}
	return FreqUnknown
}

// TestScanLabelMatchesRegexps compares the hand parser with the regular
// expressions on every string of up to 5 characters over an alphabet that
// holds each character the forms use and a few they do not, after the
// four-digit year 2026 (and on the same strings without it, and with
// other prefixes).
func TestScanLabelMatchesRegexps(t *testing.T) {
	alphabet := []byte("0139-QqWwx \n")
	var tails []string
	var gen func(prefix []byte, left int)
	gen = func(prefix []byte, left int) {
		tails = append(tails, string(prefix))
		if left == 0 {
			return
		}
		for _, c := range alphabet {
			gen(append(prefix, c), left-1)
		}
	}
	gen(nil, 5)
	prefixes := []string{"2026", "", "202", "20x6", "٢٠٢٦", " 2026"}
	checked := 0
	for _, p := range prefixes {
		for _, tail := range tails {
			s := p + tail
			want := oldLabelFrequency(s)
			got, err := LabelFrequency(s)
			if got != want || (err != nil) != (want == FreqUnknown) {
				t.Fatalf("LabelFrequency(%q) = %v, %v; the regular expressions give %v", s, got, err, want)
			}
			checked++
		}
	}
	t.Logf("%d labels checked", checked)
}

// TestDateLabelsMatchTimeParse checks that a date label is refused as "no
// such date" exactly when time.Parse with the layout 2006-01-02 refuses
// it (Go's time package is the reference), over months 00 to 13 and days
// 00 to 32 of common and leap years and the century rules (1600 and 2000
// leap, 1900 not).
func TestDateLabelsMatchTimeParse(t *testing.T) {
	for _, y := range []int{1600, 1900, 2000, 2024, 2026} {
		for mo := 0; mo <= 13; mo++ {
			for d := 0; d <= 32; d++ {
				s := fmt.Sprintf("%04d-%02d-%02d", y, mo, d)
				want, werr := time.Parse("2006-01-02", s)
				p, err := ParsePeriod(s, Daily)
				if (err != nil) != (werr != nil) {
					t.Fatalf("ParsePeriod(%q) error %v; time.Parse error %v", s, err, werr)
				}
				if err != nil {
					if !strings.Contains(err.Error(), "no such date") {
						t.Errorf("ParsePeriod(%q) error %q, want no such date", s, err)
					}
				} else if !p.Start().Equal(want) {
					t.Errorf("ParsePeriod(%q) = %v, want %v", s, p.Start(), want)
				}
			}
		}
	}
}

// BenchmarkParsePeriodMonthly reads 120 monthly labels.
func BenchmarkParsePeriodMonthly(b *testing.B) {
	labels := make([]string, 120)
	p, _ := ParsePeriod("2016-01", Monthly)
	for i := range labels {
		labels[i] = p.Add(i).String()
	}
	b.ReportAllocs()
	for b.Loop() {
		for _, l := range labels {
			if _, err := ParsePeriod(l, FreqUnknown); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// BenchmarkParsePeriodDaily reads 120 daily labels.
func BenchmarkParsePeriodDaily(b *testing.B) {
	labels := make([]string, 120)
	p, _ := ParsePeriod("2016-01-01", Daily)
	for i := range labels {
		labels[i] = p.Add(i).String()
	}
	b.ReportAllocs()
	for b.Loop() {
		for _, l := range labels {
			if _, err := ParsePeriod(l, FreqUnknown); err != nil {
				b.Fatal(err)
			}
		}
	}
}
