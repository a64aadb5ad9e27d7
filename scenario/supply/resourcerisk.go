package supply

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"

	"forelay/scenario/plan"
)

// A LoadRisk is the planned load of a resource in one scenario of a
// portfolio with its spread, and, against its capacity, the chance of a
// breach and the expected shortfall in each period, under a normal
// approximation of the load.
type LoadRisk struct {
	// Load is PerUnit times the summed plans of the resource's series,
	// and SD the standard deviation of that load: PerUnit times the square
	// root of the variance of the sum (plan.Rollup.Var: the series' joint
	// errors and the events' spread).
	Load, SD []float64
	// PBreach is P(load > capacity) = 1 − Φ(z), z = (capacity − load)/SD,
	// and Shortfall the expected load beyond capacity,
	// E[(L − c)+] = SD (φ(z) − z (1 − Φ(z))) (the standard normal loss
	// function). Both are NaN without capacity; with SD = 0 they are
	// 1 and load − capacity when the load is above capacity, else 0.
	PBreach, Shortfall []float64
}

// PortfolioLoadRisk returns the load risk of resource r in scenario k of
// the portfolio: its load (PortfolioLoad) with the spread of the sum its
// series make (zero when none of them is planned). The events are taken to
// happen as the scenario says (their probability is the stress run's
// business); the approximation is that of a normal load.
func PortfolioLoadRisk(pf *plan.Portfolio, r Resource, k int) (*LoadRisk, error) {
	sum, err := pf.SumOf(k, r.Series)
	if err != nil {
		return nil, err
	}
	load := PortfolioLoad(pf, r, k)
	n := len(load)
	lr := &LoadRisk{Load: load, SD: make([]float64, n), PBreach: make([]float64, n), Shortfall: make([]float64, n)}
	for t := range n {
		if sum != nil {
			lr.SD[t] = r.PerUnit * math.Sqrt(sum.Var[t])
		}
		lr.PBreach[t], lr.Shortfall[t] = math.NaN(), math.NaN()
		if r.Capacity != nil {
			lr.PBreach[t], lr.Shortfall[t] = normalBreach(lr.Load[t], lr.SD[t], r.Capacity[t])
		}
	}
	return lr, nil
}

// normalBreach returns P(L > c) and E[(L − c)+] for L normal with the
// given mean and standard deviation.
func normalBreach(mean, sd, c float64) (p, shortfall float64) {
	if sd <= 0 {
		if mean > c {
			return 1, mean - c
		}
		return 0, 0
	}
	z := (c - mean) / sd
	tail := 1 - distuv.UnitNormal.CDF(z)
	return tail, sd * (distuv.UnitNormal.Prob(z) - z*tail)
}
