package forecast

import (
	"errors"
	"testing"
)

// FuzzParsePeriod checks that no label makes ParsePeriod panic, that every
// refusal wraps ErrBadPeriod, and that an accepted period prints as a
// label that reads back as the same period (in its own frequency, except
// for weeks, whose label is that of their first day's week).
func FuzzParsePeriod(f *testing.F) {
	for _, s := range []string{"2026", "2026-Q1", "2026-03", "2026-W11", "2026-03-15", "2024-02-29", "2023-02-29",
		"2026-W53", "9999-12-31", "0001-01", "2026-13", "2026-Q5", "-2026", "2026-3", " 2026-03", "２０２６-03", ""} {
		for fr := range uint8(6) {
			f.Add(s, fr)
		}
	}
	f.Fuzz(func(t *testing.T, label string, fr uint8) {
		freq := Frequency(fr % 6)
		p, err := ParsePeriod(label, freq)
		if err != nil {
			if !errors.Is(err, ErrBadPeriod) {
				t.Fatalf("ParsePeriod(%q, %v): error %v does not wrap ErrBadPeriod", label, freq, err)
			}
			return
		}
		if freq != FreqUnknown && p.Freq != freq {
			t.Fatalf("ParsePeriod(%q, %v) gave a %v period", label, freq, p.Freq)
		}
		back, err := ParsePeriod(p.String(), p.Freq)
		if err != nil {
			t.Fatalf("ParsePeriod(%q, %v) = %v, whose label %q does not read back: %v", label, freq, p, p.String(), err)
		}
		if p.Freq != Weekly && back != p {
			t.Fatalf("ParsePeriod(%q, %v) = %v; its label %q reads back as %v", label, freq, p, p.String(), back)
		}
	})
}
