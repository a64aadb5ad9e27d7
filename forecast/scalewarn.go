package forecast

import (
	"fmt"
	"math"
)

// Magnitudes beyond which squared errors leave float64's range: a square
// above about 1.8e308 overflows, one below about 2.2e-308 loses its
// precision and, further down, becomes 0.
const (
	hugeValue = 1e150
	tinyValue = 1e-150
)

// Warnings returns what makes the fit's reported numbers unreliable for
// reasons of the data rather than the model, each a sentence with the
// fix; nil when there is nothing to say. Today: values so large (above
// 1e150) or so small (every one below 1e-150 in size) that their squared
// errors leave float64's range. The fit itself runs on a scaled copy and
// is sound, but MSE, RMSE and the bands, which rest on squares, overflow
// to infinity or lose their precision.
func (r *Result) Warnings() []string {
	big := 0.0
	for _, v := range r.Series.Values {
		if !math.IsNaN(v) {
			big = math.Max(big, math.Abs(v))
		}
	}
	switch {
	case big > hugeValue:
		return []string{fmt.Sprintf("series %q: values reach %.3g, so their squared errors overflow: MSE, RMSE and the bands "+
			"cannot be computed (shown as - or null). Rescale the data, for example to millions, and say so in the units.", r.Series.Name, big)}
	case big > 0 && big < tinyValue:
		return []string{fmt.Sprintf("series %q: values are at most %.3g, so their squared errors vanish: MSE, RMSE and the bands "+
			"lose their precision or come out as 0. Rescale the data, for example to millionths, and say so in the units.", r.Series.Name, big)}
	}
	return nil
}
