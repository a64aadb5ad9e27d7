package evaluate

import (
	"fmt"
	"math"
	"reflect"
	"testing"

	"forelay/forecast"
)

func TestSyntheticLayout(t *testing.T) {
	const reps = 3
	cases := Synthetic(7, reps, nil)
	fams := Families()
	if got, want := len(cases), len(fams)*2*reps; got != want {
		t.Fatalf("%d cases, want %d (families x 2 frequencies x reps)", got, want)
	}
	i := 0
	for _, fam := range families {
		for _, freq := range []forecast.Frequency{forecast.Monthly, forecast.Quarterly} {
			m, h := freq.SeasonLength(), freq.DefaultHorizon()
			for r := range reps {
				c := cases[i]
				i++
				if want := fmt.Sprintf("%s-%s-%02d", fam.name, freq, r+1); c.Series.Name != want || c.Group != fam.name ||
					c.Source != SourceSynthetic || c.Series.Freq() != freq {
					t.Errorf("case %d: %s %s %s %v, want %s", i, c.Series.Name, c.Group, c.Source, c.Series.Freq(), want)
				}
				// The length is a whole number of seasons in [lo, hi], plus H.
				n := c.Series.Len() - h
				if n%m != 0 || n/m < fam.lo || n/m > fam.hi {
					t.Errorf("%s: %d values, want %d..%d seasons of %d plus %d", c.Series.Name, c.Series.Len(), fam.lo, fam.hi, m, h)
				}
				for k, v := range c.Series.Values {
					if !(v > 0) || math.IsInf(v, 0) {
						t.Errorf("%s: value %d is %v; the families are meant to stay positive", c.Series.Name, k, v)
						break
					}
				}
			}
		}
	}
}

func TestSyntheticSeeded(t *testing.T) {
	a, b := Synthetic(3, 2, nil), Synthetic(3, 2, nil)
	if !reflect.DeepEqual(a, b) {
		t.Error("the same seed gave different series")
	}
	c := Synthetic(4, 2, nil)
	if reflect.DeepEqual(a[0].Series.Values, c[0].Series.Values) {
		t.Error("seeds 3 and 4 gave the same first series")
	}
	// More replicates add series without changing the first ones: each
	// series has its own stream.
	d := Synthetic(3, 3, nil)
	if !reflect.DeepEqual(a[0], d[0]) || !reflect.DeepEqual(a[1], d[1]) {
		t.Error("adding replicates changed the earlier series")
	}
}
