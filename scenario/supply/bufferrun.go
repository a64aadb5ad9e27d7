package supply

import (
	"errors"
	"fmt"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"math"
)

// ErrNoCapacity is returned by BufferCapacity and SizeBuffer for a plan
// whose scenario file sets no capacity: without one nothing needs
// building ahead.
var ErrNoCapacity = errors.New("capacity: buffer sizing needs a capacity block (capacity: {units: ...})")

// BufferSettings are the settings of a buffer run.
type BufferSettings struct {
	// Scenario is the index of the scenario to plan for.
	Scenario int
	// Service is the cycle service level, in (0, 1): the quantile of
	// demand planned for and the service the safety stock gives.
	Service float64
	// LeadTime is the replenishment lead time in periods, at least 1, of
	// the safety stock.
	LeadTime float64
	// Opening is the stock at the start of the first period.
	Opening float64
}

// A BufferRun is the stock to build ahead of the periods whose demand at
// the service quantile exceeds capacity, for one scenario, with the
// safety stock for a replenishment lead time.
type BufferRun struct {
	// Plan is the plan and Sim its simulation; Sim is nil when demand at
	// the service quantile was read off the plan's normal bands.
	Plan *plan.Plan
	Sim  *sim.Simulation
	// Settings are those the run was made with.
	Settings BufferSettings
	// Buffer is the build plan (PlanBuffer) for the demand at the service
	// quantile.
	Buffer Buffer
	// Sigma is the standard deviation of one period's forecast error,
	// sqrt(BaselineVar_1).
	Sigma float64
	// Spread is the standard deviation of demand summed over the lead
	// time (forecast.Result.LeadTimeVariance).
	Spread float64
	// Z is Φ⁻¹(Service) (ServiceZ).
	Z float64
	// Safety is the safety stock Z × Spread and CSL the cycle service
	// level it gives (SafetyStock and CycleServiceLevel over one spread).
	Safety, CSL float64
}

// BufferCapacity returns the capacity per period of the plan, or an error
// wrapping ErrNoCapacity and naming the scenario file when it sets none.
// Call it before drawing paths, to fail before the work.
func BufferCapacity(p *plan.Plan) ([]float64, error) {
	capacity := CapacityPerPeriod(p)
	if capacity == nil {
		return nil, fmt.Errorf("%s: %w", p.File.Path, ErrNoCapacity)
	}
	return capacity, nil
}

// SizeBuffer plans the stock to build ahead for scenario s.Scenario of p.
// Demand in each period is taken at the s.Service quantile: of the
// simulated paths of mc, or, when mc is nil, of the plan's normal bands,
//
//	demand_t = Adjusted_t + z sqrt(Var_t),   z = Φ⁻¹(service)
//
// (BandDemand). The build plan is PlanBuffer of that demand against the
// capacity from the Opening stock. The safety stock for a lead time of L
// periods is
//
//	SS = z × spread_L,
//
// spread_L the standard deviation of the forecast errors summed over L
// periods (the baseline's band variance and the model's carry-over of
// errors from one period to the next); with independent errors spread_L
// = sigma sqrt(L) (Silver, Pyke & Thomas; see SafetyStock).
//
// It returns an error wrapping ErrNoCapacity when the file sets no
// capacity, and panics if s.Scenario is out of range or mc is not a
// simulation of p.
func SizeBuffer(p *plan.Plan, mc *sim.Simulation, s BufferSettings) (*BufferRun, error) {
	if mc != nil && mc.Plan != p {
		panic("supply: SizeBuffer with a simulation of another plan")
	}
	capacity, err := BufferCapacity(p)
	if err != nil {
		return nil, err
	}
	var demand []float64
	if mc == nil {
		demand = BandDemand(p, s.Scenario, s.Service)
	} else {
		demand = mc.Scenarios[s.Scenario].QuantileDemand(s.Service)
	}
	r := &BufferRun{Plan: p, Sim: mc, Settings: s, Buffer: PlanBuffer(demand, capacity, s.Opening)}
	r.Sigma = math.Sqrt(p.BaselineVar[0])
	r.Spread = math.Sqrt(p.Fit.LeadTimeVariance(s.LeadTime, p.Mode, p.From))
	r.Z = ServiceZ(s.Service)
	r.Safety = SafetyStock(s.Service, r.Spread, 1)
	r.CSL = CycleServiceLevel(r.Safety, r.Spread, 1)
	return r, nil
}
