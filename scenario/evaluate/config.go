package evaluate

import (
	"math"
	"runtime"

	"gonum.org/v1/gonum/stat/distuv"

	"forelay/forecast"
)

// SafetyStockFunc returns the safety stock that a fitted result carries for
// a lead time of lead periods (1 <= lead <= the horizon) at the cycle
// service level service (0.95 for 95 %). A NaN or infinite stock means the
// result gives none; such an origin is counted apart and left out of the
// realised service.
type SafetyStockFunc func(r *forecast.Result, lead int, service float64) float64

// LeadTimeSpread is the safety stock forelay sizes since its bands are
// calibrated, as the buffer command does: z times the spread of demand
// over the lead time (Result.LeadTimeVariance, calibrated bands).
func LeadTimeSpread(r *forecast.Result, lead int, service float64) float64 {
	z := distuv.UnitNormal.Quantile(service)
	return z * math.Sqrt(r.LeadTimeVariance(float64(lead), forecast.Widening, forecast.Calibrated))
}

// SigmaSqrtL is the safety stock forelay sized before its bands were
// calibrated (Silver, Pyke & Thomas,
// Inventory and Production Management in Supply Chains, 4th ed.), as
// scenario.SafetyStock does:
//
//	SS = z sigma sqrt(L),   z = Phi^-1(service),   sigma = sqrt(in-sample MSE)
//
// with the MSE of the one-step in-sample errors (r.Accuracy.MSE). It is NaN
// when the MSE is.
func SigmaSqrtL(r *forecast.Result, lead int, service float64) float64 {
	z := distuv.UnitNormal.Quantile(service)
	return z * math.Sqrt(r.Accuracy.MSE) * math.Sqrt(float64(lead))
}

// Config says what to evaluate and how. The zero value of every field is a
// usable default, noted on the field.
type Config struct {
	// Spec is the fit specification each method is fitted with; its Method
	// is replaced by the method under test. The zero value fits as
	// `forelay fit --method M` does with no other flag.
	Spec forecast.Spec
	// Methods to evaluate, in the order they are reported. Nil means every
	// method of forecast.Methods(), auto included (auto last, as there).
	Methods []forecast.Method
	// Coverages are the nominal band coverages; nil means 0.8 and 0.95.
	Coverages []float64
	// Bands is the band mode passed to Result.ForecastFrom; the zero value
	// is forecast.Widening, the default of `forelay fit`.
	Bands forecast.BandMode
	// From is what the bands rest on; the zero value is
	// forecast.Calibrated, the default.
	From forecast.BandSource
	// Horizon returns the held-out length H for a frequency; nil means
	// Frequency.DefaultHorizon (12 months, 8 quarters).
	Horizon func(forecast.Frequency) int
	// Step is the number of periods between origins; zero means H.
	Step int
	// MinSeasons is the fewest whole seasons the data before an origin
	// must hold; zero means 3.
	MinSeasons int
	// MaxOrigins caps the origins per series; zero means 5.
	MaxOrigins int
	// Leads are the safety stock lead times in periods; nil means 1 and 3.
	// Lead times longer than H are left out.
	Leads []int
	// Service is the cycle service level of the safety stock; zero means
	// 0.95.
	Service float64
	// SafetyStock sizes the safety stock; nil means LeadTimeSpread.
	SafetyStock SafetyStockFunc
	// Workers is the number of series evaluated at once; zero means
	// runtime.GOMAXPROCS(0). The results do not depend on it.
	Workers int
}

// resolve fills the defaults.
func (c Config) resolve() Config {
	if c.Methods == nil {
		for _, name := range forecast.Methods() {
			m, err := forecast.ParseMethod(name)
			if err == nil {
				c.Methods = append(c.Methods, m)
			}
		}
	}
	if c.Coverages == nil {
		c.Coverages = []float64{0.8, 0.95}
	}
	if c.Horizon == nil {
		c.Horizon = forecast.Frequency.DefaultHorizon
	}
	if c.MinSeasons < 1 {
		c.MinSeasons = 3
	}
	if c.MaxOrigins < 1 {
		c.MaxOrigins = 5
	}
	if c.Leads == nil {
		c.Leads = []int{1, 3}
	}
	if c.Service == 0 {
		c.Service = 0.95
	}
	if c.SafetyStock == nil {
		c.SafetyStock = LeadTimeSpread
	}
	if c.Workers < 1 {
		c.Workers = runtime.GOMAXPROCS(0)
	}
	return c
}
