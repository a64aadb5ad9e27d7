package plots

import (
	"math"
	"testing"

	"golang.org/x/text/language"
	"golang.org/x/text/message"
	"gonum.org/v1/gonum/floats/scalar"
)

func TestValueTicks(t *testing.T) {
	for _, tc := range []struct {
		name       string
		min, max   float64
		wantValues []float64
		wantLabels []string
		wantMinor  int
		tol        float64
	}{
		{
			// Range 320,000; steps tried from 1,000 up. 20,000 gives
			// floor(790/20) - ceil(470/20) + 1 = 39 - 24 + 1 = 16 ticks,
			// 50,000 gives 15 - 10 + 1 = 6 <= 7, so the step is 50,000.
			// Minor step 50,000/5 = 10,000: 470k..790k has 33 multiples,
			// 6 of them labelled, so 27 minor.
			name: "litres", min: 470000, max: 790000,
			wantValues: []float64{500000, 550000, 600000, 650000, 700000, 750000},
			wantLabels: []string{"500,000", "550,000", "600,000", "650,000", "700,000", "750,000"},
			wantMinor:  27, tol: 1e-9,
		},
		{
			// Range 22: step 2 gives 8 - (-3) + 1 = 12 ticks, step 5 gives
			// 3 - (-1) + 1 = 5, so the step is 5. Minor step 1: -6..16 is
			// 23 values, 5 labelled, 18 minor.
			name: "signal", min: -6, max: 16,
			wantValues: []float64{-5, 0, 5, 10, 15},
			wantLabels: []string{"-5", "0", "5", "10", "15"},
			wantMinor:  18, tol: 1e-12,
		},
		{
			// Range 1: step 0.1 gives 11 ticks, 0.2 gives 6, so 0.2 with
			// one decimal (e = -1). Minor step 0.1: 11 values, 5 minor.
			name: "fractions", min: 0, max: 1,
			wantValues: []float64{0, 0.2, 0.4, 0.6, 0.8, 1},
			wantLabels: []string{"0.0", "0.2", "0.4", "0.6", "0.8", "1.0"},
			wantMinor:  5, tol: 1e-12,
		},
		{
			// Range 900,000: step 100,000 gives 75 - 66 + 1 = 10 ticks,
			// 200,000 gives 37 - 33 + 1 = 5. Minor step 100,000 (f = 2):
			// 6.7, 6.9, 7.1, 7.3 and 7.5 million, 5 minor.
			name: "millions", min: 6.6e6, max: 7.5e6,
			wantValues: []float64{6.6e6, 6.8e6, 7.0e6, 7.2e6, 7.4e6},
			wantLabels: []string{"6,600,000", "6,800,000", "7,000,000", "7,200,000", "7,400,000"},
			wantMinor:  5, tol: 1e-9,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var vals []float64
			var labels []string
			minor := 0
			for _, tk := range (ValueTicks{}).Ticks(tc.min, tc.max) {
				if tk.IsMinor() {
					minor++
					continue
				}
				vals = append(vals, tk.Value)
				labels = append(labels, tk.Label)
			}
			if len(vals) != len(tc.wantValues) {
				t.Fatalf("labelled ticks %v, want %v", labels, tc.wantLabels)
			}
			for i := range vals {
				if !scalar.EqualWithinAbsOrRel(vals[i], tc.wantValues[i], tc.tol, tc.tol) || labels[i] != tc.wantLabels[i] {
					t.Errorf("tick %d = %v %q, want %v %q", i, vals[i], labels[i], tc.wantValues[i], tc.wantLabels[i])
				}
			}
			if minor != tc.wantMinor {
				t.Errorf("%d minor ticks, want %d", minor, tc.wantMinor)
			}
		})
	}
	if got := (ValueTicks{}).Ticks(1, 1); got != nil {
		t.Errorf("empty range: got %v, want none", got)
	}
}

// TestValueTicksExtremes checks ranges at the ends of float64: the step is
// found without overflow, and where consecutive multiples of the step are
// no longer distinct numbers no ticks are made rather than looping.
func TestValueTicksExtremes(t *testing.T) {
	m := math.MaxFloat64 / 8 // 2.247e307
	for _, tc := range []struct {
		name     string
		min, max float64
		want     []float64 // labelled ticks
	}{
		// Range 4.49e307 over at most 7 ticks: 5e306 would give
		// floor(2.247e307/5e306) - ceil(-2.247e307/5e306) + 1 = 4+4+1 = 9,
		// 1e307 gives 2+2+1 = 5, so the step is 1e307 (hand calculation).
		{"widest", -m, m, []float64{-2e307, -1e307, 0, 1e307, 2e307}},
		// Width 32 around 1e17: the step of 5 has multiples near 2e16,
		// beyond 2^53, so k+1 == k: no ticks (hand calculation).
		{"far from zero", 1e17, 1e17 + 32, nil},
		// Range 4e-300: step 1e-300 gives 0..4, five ticks (hand
		// calculation).
		{"tiny", 0, 4e-300, []float64{0, 1e-300, 2e-300, 3e-300, 4e-300}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var got []float64
			for _, tk := range (ValueTicks{}).Ticks(tc.min, tc.max) {
				if !tk.IsMinor() {
					got = append(got, tk.Value)
				}
			}
			if len(got) != len(tc.want) {
				t.Fatalf("ticks %v, want %v", got, tc.want)
			}
			for i := range got {
				// Relative to the tick itself: gonum's EqualWithinRel
				// treats differences below the smallest normal number
				// as absolute, which would fail the tiny range.
				if math.Abs(got[i]-tc.want[i]) > 1e-12*math.Abs(tc.want[i]) {
					t.Errorf("tick %d = %v, want %v", i, got[i], tc.want[i])
				}
			}
		})
	}
}

// TestGroupDigits checks the thousands grouping against the English number
// format of golang.org/x/text/message (CLDR data, x/text v0.28.0).
func TestGroupDigits(t *testing.T) {
	p := message.NewPrinter(language.English)
	for _, tc := range []struct {
		v   float64
		dec int
	}{
		{540000, 0}, {-1234.5, 1}, {999.999, 2}, {0, 0}, {1234567.891, 2},
		{12, 0}, {-987654321, 0}, {100000, 3},
	} {
		want := p.Sprintf("%.*f", tc.dec, tc.v)
		if got := groupDigits(tc.v, tc.dec); got != want {
			t.Errorf("groupDigits(%v, %d) = %q, want %q (x/text)", tc.v, tc.dec, got, want)
		}
	}
	// A value that rounds to zero loses its minus sign (hand check).
	if got := groupDigits(-0.0001, 2); got != "0.00" {
		t.Errorf("groupDigits(-0.0001, 2) = %q, want 0.00", got)
	}
	// Changes carry a plus sign; zero does not (hand check).
	for _, tc := range []struct {
		v    float64
		want string
	}{{40000, "+40,000"}, {-25000, "-25,000"}, {0, "0"}} {
		if got := signedDigits(tc.v, 0); got != tc.want {
			t.Errorf("signedDigits(%v) = %q, want %q", tc.v, got, tc.want)
		}
	}
}

func TestDecimalsFor(t *testing.T) {
	for _, tc := range []struct {
		name string
		vs   []float64
		want int
	}{
		// 4 prints exactly with no decimals.
		{"whole", []float64{4}, 0},
		// 12.75 needs two.
		{"quarters", []float64{12.75, 3}, 2},
		// 0.1+0.2 = 0.30000000000000004 is 0.3 to within a billionth.
		{"binary noise", []float64{0.1 + 0.2}, 1},
		// Four significant figures of 540,000.25 need no decimals.
		{"large", []float64{540000.25}, 0},
		// 1.23456 is cut at three decimals.
		{"cap", []float64{1.23456}, 3},
		{"zero", []float64{0}, 0},
	} {
		if got := decimalsFor(tc.vs...); got != tc.want {
			t.Errorf("%s: decimalsFor(%v) = %d, want %d", tc.name, tc.vs, got, tc.want)
		}
	}
}
