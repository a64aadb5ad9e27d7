package evaluate

import (
	"errors"
	"math"
	"testing"
	"time"

	"gonum.org/v1/gonum/floats/scalar"

	"forelay/forecast"
)

// lineCase is y_t = t + 1 for 60 months from 2020-01: a straight line, so
// every error of the naive method is known by hand.
func lineCase() Case {
	y := make([]float64, 60)
	for i := range y {
		y[i] = float64(i + 1)
	}
	start := forecast.PeriodOf(forecast.Monthly, time.Date(2020, 1, 1, 0, 0, 0, 0, time.UTC))
	return Case{Series: forecast.Series{Name: "line", Start: start, Values: y}, Source: SourceSynthetic, Group: "line"}
}

// sliceOf returns the slice of method m over every source and frequency.
func sliceOf(t *testing.T, res *Results, m, source, freq string) Slice {
	t.Helper()
	for _, s := range res.Slices {
		if s.Method == m && s.Source == source && s.Freq == freq {
			return s
		}
	}
	t.Fatalf("no slice %s %s %s", m, source, freq)
	return Slice{}
}

// TestNaiveByHand checks the counting against a hand calculation, on the
// model's bands (from: model) and the textbook safety stock, whose
// arithmetic can be written out.
//
// The line has 60 months: origins 48 and 36 (Origins). Naive predicts each
// value by the one before, so every in-sample error is 1 and, over the o-1
// errors of a history of o values, MSE = (o-1)/(o-2) (n-1 divisor): 47/46
// and 35/34. Its band variance is MSE*h (random walk), and its h-step error
// is h, so a value is inside the band when h <= z sqrt(MSE h), that is
// h <= z^2 MSE:
//
//	80 %: z^2 = 1.2815516^2 = 1.6424; times 47/46 or 35/34: 1.678, 1.691 -> h = 1 only
//	95 %: z^2 = 1.9599640^2 = 3.8415; times 47/46 or 35/34: 3.925, 3.954 -> h = 1, 2, 3
//
// so over 2 origins of 12 values: 80 % holds 2 of 24, 95 % holds 6, every
// miss above. MASE: the seasonal-naive scale of a line is 12, the mean
// absolute error (1 + ... + 12)/12 = 6.5, MASE = 6.5/12 at both origins.
// Safety stock (z = 1.6448536, sigma = sqrt(MSE) = 1.0108 or 1.0146):
// L = 1 needs 1 <= 1.6449*sigma (about 1.66): covered; L = 3 needs
// 1+2+3 = 6 <= 1.6449*sigma*sqrt(3) (about 2.88): not covered.
func TestNaiveByHand(t *testing.T) {
	res, err := Run([]Case{lineCase()}, Config{Methods: []forecast.Method{forecast.Naive}, Workers: 1,
		From: forecast.FromModel, SafetyStock: SigmaSqrtL})
	if err != nil {
		t.Fatal(err)
	}
	s := sliceOf(t, res, "naive", SourceAll, FreqAll)
	if s.Origins != 2 || s.Failed != 0 || s.Series != 1 {
		t.Fatalf("origins %d, failed %d, series %d; want 2, 0, 1", s.Origins, s.Failed, s.Series)
	}
	wantBands := []struct{ inside, above int }{{2, 22}, {6, 18}}
	for i, w := range wantBands {
		b := s.Bands[i]
		if b.N != 24 || b.Inside != w.inside || b.Above != w.above || b.Below != 0 || b.NoBand != 0 {
			t.Errorf("band %g: n %d inside %d above %d below %d none %d; want 24, %d, %d, 0, 0",
				b.Nominal, b.N, b.Inside, b.Above, b.Below, b.NoBand, w.inside, w.above)
		}
		for k, l := range b.ByLead {
			want := 0
			if (i == 0 && k == 0) || (i == 1 && k < 3) {
				want = 2
			}
			if l.Lead != k+1 || l.N != 2 || l.Inside != want {
				t.Errorf("band %g lead %d: %+v, want n 2 inside %d", b.Nominal, k+1, l, want)
			}
		}
	}
	if want := 6.5 / 12; s.MASEOrigins != 2 || !scalar.EqualWithinAbs(s.MASE, want, 1e-12) {
		t.Errorf("MASE %v over %d origins, want %v over 2", s.MASE, s.MASEOrigins, want)
	}
	wantService := []Service{{Lead: 1, Target: 0.95, N: 2, Covered: 2, Share: 1}, {Lead: 3, Target: 0.95, N: 2}}
	for i, w := range wantService {
		if s.Service[i] != w {
			t.Errorf("service %d: %+v, want %+v", i, s.Service[i], w)
		}
	}
}

// TestSafetyStockHook checks that Config.SafetyStock is used, that demand
// equal to forecast plus stock counts as covered, and that a stock that is
// not finite is counted apart. On the line, the demand over 3 months runs
// 1+2+3 = 6 above the naive forecast (see TestNaiveByHand).
func TestSafetyStockHook(t *testing.T) {
	tests := []struct {
		name             string
		stock            float64
		covered, n, none int
	}{
		{"just short", 5.999, 0, 2, 0},
		{"exactly enough", 6, 2, 2, 0},
		{"not a number", math.NaN(), 0, 0, 2},
		{"infinite", math.Inf(1), 0, 0, 2},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			cfg := Config{Methods: []forecast.Method{forecast.Naive}, Leads: []int{3}, Workers: 1,
				SafetyStock: func(*forecast.Result, int, float64) float64 { return tt.stock }}
			res, err := Run([]Case{lineCase()}, cfg)
			if err != nil {
				t.Fatal(err)
			}
			sv := sliceOf(t, res, "naive", SourceAll, FreqAll).Service[0]
			if sv.Covered != tt.covered || sv.N != tt.n || sv.NoStock != tt.none {
				t.Errorf("%+v, want covered %d of %d, %d without stock", sv, tt.covered, tt.n, tt.none)
			}
		})
	}
}

// TestLeadBeyondHorizon: a lead time longer than H is left out.
func TestLeadBeyondHorizon(t *testing.T) {
	cfg := Config{Methods: []forecast.Method{forecast.Naive}, Leads: []int{13}, Workers: 1}
	res, err := Run([]Case{lineCase()}, cfg)
	if err != nil {
		t.Fatal(err)
	}
	if sv := sliceOf(t, res, "naive", SourceAll, FreqAll).Service[0]; sv.N != 0 || sv.NoStock != 0 {
		t.Errorf("%+v, want nothing counted", sv)
	}
}

func TestRunErrors(t *testing.T) {
	one := []Case{lineCase()}
	tests := []struct {
		name  string
		cases []Case
		cfg   Config
	}{
		{"no case", nil, Config{}},
		{"coverage 1", one, Config{Coverages: []float64{1}}},
		{"service 1.5", one, Config{Service: 1.5}},
		{"lead 0", one, Config{Leads: []int{0}}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if _, err := Run(tt.cases, tt.cfg); err == nil {
				t.Error("no error")
			}
		})
	}
	if _, err := Run(nil, Config{}); !errors.Is(err, ErrNoCases) {
		t.Errorf("no case: %v, want ErrNoCases", err)
	}
}

// TestFailureCounted: holt-winters-multiplicative refuses a series with a
// zero; the failure is counted and listed, and the other methods go on.
func TestFailureCounted(t *testing.T) {
	c := lineCase()
	c.Series.Values[0] = 0
	cfg := Config{Methods: []forecast.Method{forecast.Naive, forecast.HoltWintersMultiplicative}, Workers: 1}
	res, err := Run([]Case{c}, cfg)
	if err != nil {
		t.Fatal(err)
	}
	hw := sliceOf(t, res, "holt-winters-multiplicative", SourceAll, FreqAll)
	if hw.Origins != 0 || hw.Failed != 2 || hw.Bands[0].N != 0 || hw.MASE != 0 {
		t.Errorf("holt-winters-multiplicative: %+v, want 2 failed origins and nothing counted", hw)
	}
	if n := sliceOf(t, res, "naive", SourceAll, FreqAll); n.Origins != 2 {
		t.Errorf("naive: %d origins, want 2", n.Origins)
	}
	if len(res.Failures) != 1 || res.Failures[0].Origins != 2 || res.Failures[0].Method != "holt-winters-multiplicative" {
		t.Errorf("failures %+v, want one of 2 origins", res.Failures)
	}
}

// TestNoBands: with no coverage asked for, MASE and service are still
// measured (the figures of TestNaiveByHand).
func TestNoBands(t *testing.T) {
	cfg := Config{Methods: []forecast.Method{forecast.Naive}, Coverages: []float64{}, Workers: 1}
	res, err := Run([]Case{lineCase()}, cfg)
	if err != nil {
		t.Fatal(err)
	}
	s := sliceOf(t, res, "naive", SourceAll, FreqAll)
	if want := 6.5 / 12; len(s.Bands) != 0 || !scalar.EqualWithinAbs(s.MASE, want, 1e-12) || s.Service[0].Covered != 2 {
		t.Errorf("%+v, want no band, MASE %v and lead 1 covered twice", s, want)
	}
}
