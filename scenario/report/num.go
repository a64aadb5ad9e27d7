package report

import (
	"math"
	"strconv"
)

// Num is a float64 that marshals NaN and infinities as JSON null and
// rounds to 10 significant digits, so JSON output is stable across
// platforms and never fails on a missing value.
type Num float64

// MarshalJSON writes n with 10 significant digits, or null for NaN and
// the infinities.
func (n Num) MarshalJSON() ([]byte, error) {
	f := float64(n)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return []byte("null"), nil
	}
	return []byte(strconv.FormatFloat(f, 'g', 10, 64)), nil
}

// Nums converts v to Nums.
func Nums(v []float64) []Num {
	out := make([]Num, len(v))
	for i, x := range v {
		out[i] = Num(x)
	}
	return out
}

// List returns list, or an empty list for nil, so that a list field of a
// JSON document is always a list, never null.
func List(list []string) []string {
	if list == nil {
		return []string{}
	}
	return list
}

// Caution is printed under every plan and written into every JSON report.
const Caution = "Caution: this plan is a statistical estimate. Where supply is safety-critical (utilities, medical supply),\n" +
	"defer to the applicable reliability standards, local codes and licensed practice."
