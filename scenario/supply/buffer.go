package supply

import (
	"forelay/scenario/plan"
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// RequiredStock returns, for each period t, the least stock S_t that must
// be on hand at its start so that no period from t on falls short, when at
// most capacity[t] can be made in period t. The backward pass is
//
//	S_{T+1} = 0,   S_t = max(0, demand_t − capacity_t + S_{t+1}),
//
// for t = T, ..., 1: whatever period t cannot make of its own demand and of
// the stock the next period needs has to be there already. It panics if
// the slices differ in length.
func RequiredStock(demand, capacity []float64) []float64 {
	if len(demand) != len(capacity) {
		panic("scenario: RequiredStock with slices of different lengths")
	}
	s := make([]float64, len(demand))
	next := 0.0
	for t := len(demand) - 1; t >= 0; t-- {
		next = math.Max(0, demand[t]-capacity[t]+next)
		s[t] = next
	}
	return s
}

// A Buffer is a build plan that meets a demand with limited capacity by
// building stock ahead of the periods that need more than can be made.
type Buffer struct {
	// Demand and Capacity are per period, as given.
	Demand, Capacity []float64
	// Required is the least stock needed at the start of each period
	// (RequiredStock).
	Required []float64
	// Opening is the stock at the start of the first period.
	Opening float64
	// Build is the quantity made in each period and Stock the stock at
	// its end. Production follows demand and rises above it only when the
	// stock would otherwise be short of what the following periods need,
	// and then as late as capacity allows: with s the stock at the start
	// of period t,
	//
	//	build_t = min(capacity_t, max(demand_t, demand_t + Required_{t+1} − s)),
	//	stock_t = s + build_t − demand_t,
	//
	// (Required_{T+1} = 0). The stock is drawn down only where demand
	// exceeds capacity, and never below what the following periods need,
	// unless the opening stock is already short (see Gap); a negative
	// stock is then demand left unmet.
	Build, Stock []float64
	// PrebuildAt is the first period whose demand exceeds its capacity,
	// -1 when there is none; Prebuild is the stock to hold at its start,
	// Required[PrebuildAt] (0 when there is none).
	PrebuildAt int
	Prebuild   float64
	// BuildStart is the first period in which the plan makes more than
	// that period's demand, to put stock aside: the latest start of
	// building ahead; -1 when the opening stock makes it unnecessary.
	BuildStart int
	// Gap is max(0, Required[0] − Opening): the stock missing at the start,
	// which building ahead within the plan can no longer make up. When it
	// is above zero, building ahead should have started before the first
	// period.
	Gap float64
}

// PlanBuffer finds the stock to build ahead of the periods whose demand
// exceeds capacity (see Buffer). demand would usually be the demand at
// the service quantile in each period. It panics if the slices differ in
// length; capacity values must be finite.
func PlanBuffer(demand, capacity []float64, opening float64) Buffer {
	req := RequiredStock(demand, capacity)
	T := len(demand)
	b := Buffer{Demand: append([]float64(nil), demand...), Capacity: append([]float64(nil), capacity...),
		Required: req, Opening: opening, Build: make([]float64, T), Stock: make([]float64, T),
		PrebuildAt: -1, BuildStart: -1}
	if T > 0 {
		b.Gap = math.Max(0, req[0]-opening)
	}
	for t := range demand {
		if demand[t] > capacity[t] {
			b.PrebuildAt, b.Prebuild = t, req[t]
			break
		}
	}
	s := opening
	for t := range demand {
		next := 0.0
		if t+1 < T {
			next = req[t+1]
		}
		build := math.Min(capacity[t], math.Max(demand[t], demand[t]+next-s))
		b.Build[t] = build
		s += build - demand[t]
		b.Stock[t] = s
		if b.BuildStart < 0 && build > demand[t] {
			b.BuildStart = t
		}
	}
	return b
}

// ServiceZ returns z = Φ⁻¹(service), the one-sided standard normal
// quantile of a cycle service level: 1.644854 for 0.95. It returns NaN for
// service outside (0, 1).
func ServiceZ(service float64) float64 {
	if !(service > 0 && service < 1) {
		return math.NaN()
	}
	return distuv.UnitNormal.Quantile(service)
}

// SafetyStock returns the safety stock that gives a cycle service level of
// service (the probability that demand over a replenishment lead time of
// lead periods does not exceed what is on hand; not a fill rate) when the
// per-period forecast error has standard deviation sigma and errors of
// different periods are independent (Silver, Pyke & Thomas, Inventory and
// Production Management in Supply Chains, 4th ed. 2017, the chapter on
// individual items with probabilistic demand; cited from memory):
//
//	SS = z sigma sqrt(L),   z = Φ⁻¹(service).
//
// It returns NaN for service outside (0, 1), a negative sigma or L < 0.
func SafetyStock(service, sigma, lead float64) float64 {
	if sigma < 0 || lead < 0 {
		return math.NaN()
	}
	return ServiceZ(service) * sigma * math.Sqrt(lead)
}

// CycleServiceLevel returns the cycle service level a safety stock gives
// over a lead time of lead periods with per-period error sigma, the
// inverse of SafetyStock:
//
//	CSL = Φ(SS / (sigma sqrt(L))).
//
// With zero sigma or lead it is 1 for a stock of zero or more (nothing can
// go wrong) and 0 below. It returns NaN for a negative sigma or lead.
func CycleServiceLevel(stock, sigma, lead float64) float64 {
	if sigma < 0 || lead < 0 {
		return math.NaN()
	}
	sd := sigma * math.Sqrt(lead)
	if sd == 0 {
		if stock >= 0 {
			return 1
		}
		return 0
	}
	return distuv.UnitNormal.CDF(stock / sd)
}

// BandDemand returns the demand of scenario sc at the service quantile
// read off the plan's normal error model: Adjusted_t + z sqrt(Var_t) with
// z = Φ⁻¹(service). It panics if sc is out of range.
func BandDemand(p *plan.Plan, sc int, service float64) []float64 {
	sp := p.Scenarios[sc]
	z := ServiceZ(service)
	out := make([]float64, len(sp.Adjusted))
	for t := range out {
		out[t] = sp.Adjusted[t] + z*math.Sqrt(sp.Var[t])
	}
	return out
}
