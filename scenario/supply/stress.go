package supply

import (
	"math"
	"slices"

	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
)

// CapacityPerPeriod returns the capacity in each of the plan's periods
// (Capacity.At) of the resource "capacity", or nil when the file sets no
// capacity: the shorthand of a plan with one resource over every series.
func CapacityPerPeriod(p *plan.Plan) []float64 {
	if r := ResourceOf(p, CapacityResource); r != nil {
		return r.Capacity
	}
	return nil
}

// PeriodRisk is the simulated demand of one period set against capacity.
type PeriodRisk struct {
	// Spread holds the mean and quantiles of the demand.
	sim.Spread
	// Capacity is the period's capacity, NaN when there is none; the
	// fields below are then NaN too.
	Capacity float64
	// PBreach is the share of paths whose demand D exceeds the capacity
	// C, an estimate of P(D > C).
	PBreach float64
	// ExpectedShortfall is the mean excess of demand over capacity, taken
	// over all paths (zero where there is none):
	//
	//	ES = (1/N) sum_i max(D_i − C, 0) = E[(D − C)+],
	//
	// so that it adds up over periods to the expected total shortfall.
	ExpectedShortfall float64
	// ShortfallIfBreach is the mean excess over the breaching paths only,
	// E[D − C | D > C] = ES / PBreach; NaN when no path breaches.
	ShortfallIfBreach float64
	// UtilP50 and UtilP90 are the P50 and P90 of demand as shares of the
	// capacity (1 = fully used).
	UtilP50, UtilP90 float64
}

// Risk is one scenario's capacity risk over the plan.
type Risk struct {
	// Name is the scenario's name.
	Name string
	// Periods holds one entry per plan period.
	Periods []PeriodRisk
	// FirstBreach is the index of the first period whose PBreach is above
	// the threshold, -1 when there is none (or no capacity).
	FirstBreach int
	// TotalExpectedShortfall is the sum of ExpectedShortfall over the
	// periods; NaN without capacity.
	TotalExpectedShortfall float64
	// PAnyBreach is the share of paths on which demand exceeds capacity
	// in at least one period; NaN without capacity.
	PAnyBreach float64
}

// CapacityRisk sets the simulated demand ps against the capacity per
// period (nil or NaN entries: no limit) and finds the first period whose
// breach probability is above threshold. It panics if capacity is neither
// nil nor as long as the plan.
func CapacityRisk(ps *sim.PathSet, capacity []float64, threshold float64) Risk {
	H := len(ps.Demand)
	if capacity != nil && len(capacity) != H {
		panic("scenario: CapacityRisk with capacity of the wrong length")
	}
	r := Risk{Name: ps.Name, Periods: make([]PeriodRisk, H), FirstBreach: -1,
		TotalExpectedShortfall: math.NaN(), PAnyBreach: math.NaN()}
	capAt := func(t int) float64 {
		if capacity == nil {
			return math.NaN()
		}
		return capacity[t]
	}
	limited := false
	for t := range r.Periods {
		c := capAt(t)
		pr := PeriodRisk{Spread: ps.Spread[t], Capacity: c}
		if math.IsNaN(c) {
			pr.PBreach, pr.ExpectedShortfall, pr.ShortfallIfBreach = math.NaN(), math.NaN(), math.NaN()
			pr.UtilP50, pr.UtilP90 = math.NaN(), math.NaN()
			r.Periods[t] = pr
			continue
		}
		limited = true
		// In path order, so that the sums do not depend on sorting.
		row := ps.Demand[t]
		n, above, ex := len(row), 0, 0.0
		for _, d := range row {
			if d > c {
				above++
				ex += d - c
			}
		}
		pr.PBreach = float64(above) / float64(n)
		pr.ExpectedShortfall = ex / float64(n)
		pr.ShortfallIfBreach = math.NaN()
		if above > 0 {
			pr.ShortfallIfBreach = ex / float64(above)
		}
		pr.UtilP50, pr.UtilP90 = pr.P50/c, pr.P90/c
		if r.FirstBreach < 0 && pr.PBreach > threshold {
			r.FirstBreach = t
		}
		r.Periods[t] = pr
	}
	if !limited {
		return r
	}
	r.TotalExpectedShortfall = 0
	for _, pr := range r.Periods {
		if !math.IsNaN(pr.ExpectedShortfall) {
			r.TotalExpectedShortfall += pr.ExpectedShortfall
		}
	}
	if H > 0 {
		n := len(ps.Demand[0])
		breached := make([]bool, n)
		count := 0
		for t, row := range ps.Demand {
			c := capAt(t)
			if math.IsNaN(c) {
				continue
			}
			for i, d := range row {
				if d > c && !breached[i] {
					breached[i] = true
					count++
				}
			}
		}
		r.PAnyBreach = float64(count) / float64(n)
	}
	return r
}

// FrozenProduction returns the production held at the previous plan for
// each plan period, and where it came from: the values of prod (read by
// plan.ReadProduction) in the plan's periods when prod is not nil, else
// the baseline forecast ("baseline").
//
// It returns a *data.ParseError naming the scenario file's
// production.plan key when prod does not cover every plan period, or
// when the file names a frozen production plan that prod does not carry.
func FrozenProduction(p *plan.Plan, prod *plan.Production) (values []float64, source string, err error) {
	pr := p.File.Production
	fail := func(format string, args ...any) error {
		return p.File.ValueError("production.plan", pr.Pos, format, args...)
	}
	if prod == nil {
		if pr != nil && pr.Mode == scenario.Frozen && pr.Plan != "" {
			return nil, "", fail("%s was not read; read it with plan.ReadProduction before the stress run", pr.Plan)
		}
		return slices.Clone(p.Baseline), "baseline", nil
	}
	ser := prod.Series
	first, last := p.Periods[0], p.Periods[len(p.Periods)-1]
	i0, i1 := ser.Index(first), ser.Index(last)
	if i0 < 0 || i1 >= ser.Len() {
		return nil, "", fail("%s covers %s to %s, but the plan runs from %s to %s; the production plan must cover every plan period",
			prod.Path, ser.Start, ser.Period(ser.Len()-1), first, last)
	}
	return slices.Clone(ser.Values[i0 : i1+1]), prod.Path, nil
}

// StockProjection is the stock that builds up or runs down when
// production is held at a frozen plan while demand follows a scenario.
type StockProjection struct {
	// Opening is the stock before the first period.
	Opening float64
	// Production, Demand and Capacity are per period; Capacity is NaN
	// where there is no limit.
	Production, Demand, Capacity []float64
	// Idle is the capacity left unused, max(0, Capacity − Production),
	// and Overload what the frozen plan asks beyond capacity,
	// max(0, Production − Capacity); both NaN without capacity. A period
	// over capacity has zero idle capacity: its overload never offsets
	// the idle capacity of other periods (see OverloadWarnings).
	Idle, Overload []float64
	// Stock is the stock at the end of each period when demand follows
	// Demand:
	//
	//	stock_t = stock_{t−1} + production_t − demand_t,  stock_0 = Opening;
	//
	// a negative stock is a shortfall (demand not met).
	Stock []float64
	// StockP50 and StockP90 are the end-of-period stocks when the
	// cumulative simulated demand up to the period is at its P50 and at
	// its P90 (the median stock and the stock that nine paths in ten stay
	// above); NaN without a simulation.
	StockP50, StockP90 []float64
	// PShort is the share of simulated paths whose stock is below zero at
	// the end of the period; NaN without a simulation.
	PShort []float64
	// FirstShortfall is the first period whose Stock is below zero, -1
	// when none is.
	FirstShortfall int
	// Low and High are the periods of the lowest and the highest Stock
	// (the first when tied).
	Low, High int
}

// ProjectStock projects the stock under production held at prod while
// demand follows demand (a scenario's adjusted plan), from the opening
// stock. capacity may be nil (no limit). With ps (the scenario's simulated
// paths; may be nil) it also gives the stock at the P50 and P90 of the
// cumulative demand and the share of paths short. The stock counts the
// production as planned, also where the plan asks for more than the
// capacity (Overload; OverloadWarnings says so to the planner). It panics
// if the slices differ in length from prod.
func ProjectStock(prod, demand, capacity []float64, opening float64, ps *sim.PathSet) StockProjection {
	H := len(prod)
	if len(demand) != H || (capacity != nil && len(capacity) != H) || (ps != nil && len(ps.Demand) != H) {
		panic("scenario: ProjectStock with slices of different lengths")
	}
	sp := StockProjection{Opening: opening, Production: slices.Clone(prod), Demand: slices.Clone(demand),
		Capacity: make([]float64, H), Idle: make([]float64, H), Overload: make([]float64, H), Stock: make([]float64, H),
		StockP50: make([]float64, H), StockP90: make([]float64, H), PShort: make([]float64, H), FirstShortfall: -1}
	stock := opening
	for t := range prod {
		sp.Capacity[t] = math.NaN()
		if capacity != nil {
			sp.Capacity[t] = capacity[t]
		}
		sp.Idle[t], sp.Overload[t] = splitCapacity(sp.Capacity[t], prod[t])
		stock += prod[t] - demand[t]
		sp.Stock[t] = stock
		if stock < 0 && sp.FirstShortfall < 0 {
			sp.FirstShortfall = t
		}
	}
	sp.Low, sp.High = 0, 0
	for t, v := range sp.Stock {
		if v < sp.Stock[sp.Low] {
			sp.Low = t
		}
		if v > sp.Stock[sp.High] {
			sp.High = t
		}
	}
	if ps == nil {
		for t := range prod {
			sp.StockP50[t], sp.StockP90[t], sp.PShort[t] = math.NaN(), math.NaN(), math.NaN()
		}
		return sp
	}
	n := len(ps.Demand[0])
	cum := make([]float64, n)
	col := make([]float64, n)
	made := opening
	for t, row := range ps.Demand {
		made += prod[t]
		short := 0
		for i, d := range row {
			cum[i] += d
			if cum[i] > made {
				short++
			}
		}
		copy(col, cum)
		sp.StockP50[t] = made - sim.QuantileOf(col, 0.5)
		sp.StockP90[t] = made - sim.QuantileOf(col, 0.9)
		sp.PShort[t] = float64(short) / float64(n)
	}
	return sp
}
