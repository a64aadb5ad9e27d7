package forecast

import (
	"encoding/json"
	"math"
	"math/rand/v2"
	"os"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestInterventionNileOLS checks the cleaning of a step against ordinary
// least squares: with the linear-trend baseline, the joint estimate of a
// step must equal the OLS coefficient of a step dummy next to intercept and
// trend, standard error included. Reference: statsmodels 0.13.5 OLS on the
// Nile annual flow with the 1899 level shift
// (testdata/reference/gen_intervention.py).
func TestInterventionNileOLS(t *testing.T) {
	var g struct {
		Y         []float64 `json:"y"`
		FirstYear int       `json:"first_year"`
		StepYear  int       `json:"step_year"`
		Effect    float64   `json:"effect"`
		StdError  float64   `json:"std_error"`
	}
	b, err := os.ReadFile("testdata/reference/intervention_golden.json")
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(b, &g); err != nil {
		t.Fatal(err)
	}
	start, _ := ParsePeriod("1871", Yearly)
	s := Series{Name: "nile", Start: start, Values: g.Y}
	// Shape of an ongoing step as the plan builds it: -1 before the step,
	// 0 from it on (the history before is lifted to today's level).
	shape := make([]float64, len(g.Y))
	for i := range shape {
		if g.FirstYear+i < g.StepYear {
			shape[i] = -1
		}
	}
	r, err := FitInterventions(s, Spec{Method: LinearTrend}, []Intervention{{Name: "dam", Shape: shape}}, 0)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(r.Effect[0], g.Effect, 1e-6, 1e-9) {
		t.Errorf("effect %v, want %v (statsmodels OLS)", r.Effect[0], g.Effect)
	}
	if !scalar.EqualWithinAbsOrRel(r.StdErr[0], g.StdError, 1e-6, 1e-9) {
		t.Errorf("standard error %v, want %v (statsmodels OLS)", r.StdErr[0], g.StdError)
	}
	// The cleaned series lifts the years before 1899 by the (negative)
	// effect: cleaned = y - effect * shape = y + effect there.
	if d := r.Cleaned[0] - (g.Y[0] + g.Effect); math.Abs(d) > 1e-6 {
		t.Errorf("cleaned[0] off by %v", d)
	}
}

// TestInterventionRecovery injects a pulse and a ramped step of known size
// into seeded synthetic monthly data (trend + additive season + normal noise
// of standard deviation 10) and checks that the cleaning recovers each
// within 10% with Holt-Winters additive and with linear-trend. The sizes
// (300 = 30 sigma for the one-period pulse, 200 = 20 sigma for the step) make
// 10% several standard errors wide, so the check is not a coin toss.
func TestInterventionRecovery(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	const n = 96
	y := make([]float64, n)
	pulse := make([]float64, n)
	step := make([]float64, n)
	for i := range y {
		y[i] = 1000 + 2*float64(i) + 60*math.Sin(2*math.Pi*float64(i%12)/12) + 10*rng.NormFloat64()
	}
	pulse[40] = 1
	for i := 70; i < n; i++ {
		step[i] = math.Min(1, float64(i-69)/3) // linear ramp over 3 periods
	}
	for i := range y {
		y[i] += 300*pulse[i] + 200*step[i]
	}
	shapeStep := make([]float64, n)
	for i := range shapeStep {
		shapeStep[i] = step[i] - 1 // ongoing step: lift the earlier history
	}
	start, _ := ParsePeriod("2018-01", Monthly)
	s := Series{Name: "synthetic", Start: start, Values: y}
	for _, m := range []Method{HoltWintersAdditive, LinearTrend} {
		spec := Spec{Method: m, Config: Config{Dummies: true}}
		r, err := FitInterventions(s, spec, []Intervention{{Name: "pulse", Shape: pulse}, {Name: "step", Shape: shapeStep}}, 0)
		if err != nil {
			t.Fatalf("%v: %v", m, err)
		}
		for j, want := range []float64{300, 200} {
			if got := r.Effect[j]; math.Abs(got-want) > 0.1*want {
				t.Errorf("%v: effect %d = %.1f (se %.1f), want %v within 10%%", m, j, got, r.StdErr[j], want)
			}
		}
	}
}

// BenchmarkFitInterventions cleans two events out of a monthly series of
// 120 points under method auto.
func BenchmarkFitInterventions(b *testing.B) {
	s := benchPortfolio(1, 120)[0]
	pulse, step := make([]float64, 120), make([]float64, 120)
	for t := 60; t < 63; t++ {
		pulse[t] = 1
		s.Values[t] += 400
	}
	for t := 90; t < 120; t++ {
		step[t] = 1
		s.Values[t] += 250
	}
	ivs := []Intervention{{Name: "promotion", Shape: pulse}, {Name: "listing", Shape: step}}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := FitInterventions(s, Spec{}, ivs, 0); err != nil {
			b.Fatal(err)
		}
	}
}
