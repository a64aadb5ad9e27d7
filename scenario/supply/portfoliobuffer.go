package supply

import (
	"fmt"
	"math"

	"forelay/scenario/plan"
	"forelay/scenario/sim"
)

// A ResourceBuffer is the stock to build ahead of the periods whose load
// at the service quantile exceeds a resource's capacity, with the safety
// stock of its load for a lead time, all in the resource's units (the load
// of the goods built ahead).
type ResourceBuffer struct {
	Resource Resource
	// Buffer is the build plan (PlanBuffer) for the load at the service
	// quantile.
	Buffer Buffer
	// Sigma is the standard deviation of the first period's load and
	// Spread that of the load summed over the lead time.
	Sigma, Spread float64
	// Safety is the safety stock Z × Spread and CSL the cycle service
	// level it gives.
	Safety, CSL float64
}

// A PortfolioBufferRun is the build plan and safety stock of every
// resource of a portfolio that has a capacity, for one scenario.
type PortfolioBufferRun struct {
	// Portfolio is the portfolio and Sim its simulation (made with the
	// sums of PortfolioSums); Sim is nil when the load at the service
	// quantile was read off the normal bands of the sums.
	Portfolio *plan.Portfolio
	Sim       *sim.PortfolioSimulation
	// Settings are those the run was made with.
	Settings BufferSettings
	// Z is Φ⁻¹(Service).
	Z float64
	// Resources holds the buffer of each resource with a capacity, in
	// file order, and Unlimited the ids of those without one.
	Resources []ResourceBuffer
	Unlimited []string
}

// SizePortfolioBuffers plans the stock to build ahead for scenario
// s.Scenario of each resource res with a capacity: PlanBuffer of its load
// at the s.Service quantile against its capacity from the Opening stock.
// The load at the quantile is that of the simulated paths of mc
// (simulated with PortfolioSums(pf, res)), or, when mc is nil, of a normal
// load with the spread of the sum (PortfolioLoadRisk): load + z SD.
//
// The safety stock for a lead time of L periods is z × spread_L. With a
// simulation, spread_L is the standard deviation over the paths of the
// load summed over the first L periods (a fraction of a period counting
// that share of the next one's load), events included; from the bands it
// is the first period's standard deviation times sqrt(L), the form for
// independent errors (Silver, Pyke & Thomas; see SafetyStock).
//
// It returns an error wrapping ErrNoCapacity, naming the scenario file,
// when no resource has a capacity, and that of PortfolioLoadRisk.
func SizePortfolioBuffers(pf *plan.Portfolio, res []Resource, mc *sim.PortfolioSimulation, s BufferSettings) (*PortfolioBufferRun, error) {
	if err := PortfolioBufferCapacity(pf, res); err != nil {
		return nil, err
	}
	r := &PortfolioBufferRun{Portfolio: pf, Sim: mc, Settings: s, Z: ServiceZ(s.Service)}
	for j, rs := range res {
		if rs.Capacity == nil {
			r.Unlimited = append(r.Unlimited, rs.ID)
			continue
		}
		rb := ResourceBuffer{Resource: rs}
		var load []float64
		if mc != nil {
			ps := mc.Scenarios[s.Scenario][j+1]
			load = ps.QuantileDemand(s.Service)
			rb.Sigma, rb.Spread = pathSpread(ps, 1), pathSpread(ps, s.LeadTime)
		} else {
			risk, err := PortfolioLoadRisk(pf, rs, s.Scenario)
			if err != nil {
				return nil, err
			}
			load = make([]float64, len(risk.Load))
			for t := range load {
				load[t] = risk.Load[t] + r.Z*risk.SD[t]
			}
			rb.Sigma = risk.SD[0]
			rb.Spread = rb.Sigma * math.Sqrt(s.LeadTime)
		}
		rb.Buffer = PlanBuffer(load, rs.Capacity, s.Opening)
		rb.Safety = SafetyStock(s.Service, rb.Spread, 1)
		rb.CSL = CycleServiceLevel(rb.Safety, rb.Spread, 1)
		r.Resources = append(r.Resources, rb)
	}
	return r, nil
}

// PortfolioBufferCapacity returns an error wrapping ErrNoCapacity, naming
// the scenario file, when none of the resources has a capacity. Call it
// before drawing paths, to fail before the work.
func PortfolioBufferCapacity(pf *plan.Portfolio, res []Resource) error {
	for _, r := range res {
		if r.Capacity != nil {
			return nil
		}
	}
	return fmt.Errorf("%s: %w (or resources with a capacity)", pf.File.Path, ErrNoCapacity)
}

// pathSpread returns the standard deviation (over the n paths, divided by
// n) of the paths' demand summed over the first lead periods, a fraction
// of a period counting that share of the next period's demand; lead is
// capped at the number of periods.
func pathSpread(ps *sim.PathSet, lead float64) float64 {
	H := len(ps.Demand)
	lead = math.Min(lead, float64(H))
	whole := int(lead)
	frac := lead - float64(whole)
	n := len(ps.Demand[0])
	sum := make([]float64, n)
	for t := range whole {
		for i, v := range ps.Demand[t] {
			sum[i] += v
		}
	}
	if frac > 0 && whole < H {
		for i, v := range ps.Demand[whole] {
			sum[i] += frac * v
		}
	}
	m := 0.0
	for _, v := range sum {
		m += v
	}
	m /= float64(n)
	ss := 0.0
	for _, v := range sum {
		ss += (v - m) * (v - m)
	}
	return math.Sqrt(ss / float64(n))
}
