package plan

import (
	"math"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestRollups checks the sums against known answers: two series with
// identical histories (so identical errors) give a sum whose baseline
// standard deviation is twice one series' (forecast.SumVariance's known
// case), and an event moving both adds the square of its summed standard
// deviations, (σ + σ)², since its outcome is the same for both.
func TestRollups(t *testing.T) {
	h := scaled(1)
	body := `events:
  - id: promo
    kind: step
    start: 2026-03
    effect: {units: 100}
    range: {low: 50, high: 150}
    scope: [{series: "milk/*"}]
scenarios:
  - {name: base, events: []}
  - {name: promo, events: [promo]}
`
	f, in := writePortfolio(t, []string{"milk/a", "milk/b", "cream/c"}, [][]float64{h, h, scaled(0.5)}, body)
	pf, err := BuildPortfolio(f, in, 0)
	if err != nil {
		t.Fatal(err)
	}
	a := pf.Plans[0]
	for _, sc := range []string{"base", "promo"} {
		rs, err := pf.Rollups(sc)
		if err != nil {
			t.Fatal(err)
		}
		var groups []string
		for _, r := range rs {
			groups = append(groups, r.Level+":"+r.Group)
		}
		if want := []string{"total:total", "level1:milk", "level1:cream"}; !reflect.DeepEqual(groups, want) {
			t.Fatalf("%s: groups %v; want %v", sc, groups, want)
		}
		milk := rs[1]
		if !reflect.DeepEqual(milk.Members, []string{"milk/a", "milk/b"}) {
			t.Errorf("milk members %v", milk.Members)
		}
		line := a.Line(sc, "milk/a")
		// Range 50 to 150 read as a 90 % interval: σ = 100 / (2 × 1.6449), the
		// standard normal 95 % quantile from the standard table.
		sd := 100 / (2 * 1.6448536269514722)
		for k := range 12 {
			want := 4 * a.BaselineVar[k]
			if sc == "promo" && k >= 2 {
				want += 4 * sd * sd
			}
			if !scalar.EqualWithinRel(milk.Var[k], want, 1e-9) {
				t.Errorf("%s, period %d: milk variance %v; want %v", sc, k, milk.Var[k], want)
			}
			if !scalar.EqualWithinRel(milk.Adjusted[k], 2*line.Adjusted[k], 1e-12) ||
				!scalar.EqualWithinRel(milk.Upper[k]-milk.Adjusted[k], a.Z*math.Sqrt(want), 1e-9) {
				t.Errorf("%s, period %d: milk plan %v, upper %v", sc, k, milk.Adjusted[k], milk.Upper[k])
			}
			total := rs[0].Adjusted[k]
			if want := milk.Adjusted[k] + rs[2].Adjusted[k]; !scalar.EqualWithinRel(total, want, 1e-12) {
				t.Errorf("%s, period %d: total %v; want %v", sc, k, total, want)
			}
		}
	}
	if _, err := pf.Rollups("nope"); err == nil {
		t.Error("Rollups of an unknown scenario: no error")
	}
}
