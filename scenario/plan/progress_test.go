package plan

import (
	"reflect"
	"slices"
	"testing"
)

// TestBuildPortfolioProgress checks that BuildPortfolioProgress tells of
// each series once (the three series of portfolioBody), in order, and
// builds the portfolio BuildPortfolio builds, on one worker or two.
func TestBuildPortfolioProgress(t *testing.T) {
	names := []string{"milk/a", "milk/b", "cream/c"}
	f, in := writePortfolio(t, names, [][]float64{scaled(1), scaled(3), scaled(0.5)}, portfolioBody)
	want, err := BuildPortfolio(f, in, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, workers := range []int{1, 2} {
		var done, total []int
		got, err := BuildPortfolioProgress(f, in, workers, func(d, n int) {
			done, total = append(done, d), append(total, n)
		})
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(done, []int{1, 2, 3}) || !slices.Equal(total, []int{3, 3, 3}) {
			t.Errorf("%d workers: told done %v of %v, want 1, 2, 3 of 3", workers, done, total)
		}
		for i, p := range got.Plans {
			w := want.Plans[i]
			if !reflect.DeepEqual(p.Baseline, w.Baseline) || !reflect.DeepEqual(p.Scenarios, w.Scenarios) {
				t.Errorf("%d workers, %s: the plan differs with Progress", workers, names[i])
			}
		}
	}
}
