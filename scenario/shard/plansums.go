package shard

import (
	"encoding/json"
	"fmt"
	"strings"

	"forelay/forecast"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/series"
)

// SumsVersion is the version of sums.json.
const SumsVersion = 3

// PlanSums is sums.json of a shard of a portfolio plan (see the package
// documentation).
type PlanSums struct {
	Version int    `json:"version"`
	Kind    string `json:"kind"`
	// Plan, Units, Freq (the period's name), End (the history's last
	// period), Inputs (the digests), Notes and CaseEvents (the events of
	// each scenario) are what plan.json says of the whole portfolio.
	Plan       string            `json:"plan"`
	Units      string            `json:"units"`
	Freq       string            `json:"freq"`
	End        string            `json:"end"`
	Inputs     map[string]string `json:"inputs"`
	Notes      []string          `json:"notes"`
	CaseEvents [][]string        `json:"case_events"`
	Series     int               `json:"series"`
	Depth      int               `json:"depth"`
	Levels     []string          `json:"levels"`
	Periods    []string          `json:"periods"`
	Scenarios  []string          `json:"scenarios"`
	Events     []EventUse        `json:"events"`
	Z          float64           `json:"z"`
	Floor      bool              `json:"floor"`
	Warnings   []string          `json:"warnings"`
	Own        []OwnSeries       `json:"own"`
	Groups     []GroupSums       `json:"groups"`
	Resources  []ResourceSum     `json:"resources"`
	// Tail is the summed history of the shard's series over the last
	// report.ChartHistory periods, each series aligned on its last period
	// (a shorter one adds to the last periods only), and Common the
	// length of the shortest history among them (0 when none has any):
	// the merge charts the total's history from them.
	Tail   Floats `json:"tail"`
	Common int    `json:"common"`
	// ChartCount is the number of most-changed series charted (plan
	// --charts; report.AllCharts for all), and Charts the charts of the
	// shard's own most-changed series, as many.
	ChartCount int           `json:"chart_count"`
	Charts     []SeriesChart `json:"charts"`
}

// An EventUse is an event of the file and whether a series of the shard
// plans it as a future event.
type EventUse struct {
	ID     string `json:"id"`
	Future bool   `json:"future"`
}

// An OwnSeries is a series of the shard: its index in the whole portfolio,
// its own warnings and its plan (its totals over the horizon are summed
// from the periods where they are needed).
type OwnSeries struct {
	Name     string   `json:"name"`
	Index    int      `json:"index"`
	Warnings []string `json:"warnings"`
	// New marks a series a scope creates; MAD and MSE are its in-sample
	// accuracy (0 when New), BaselinePeriods its baseline and
	// AdjustedPeriods its plan in each scenario, per period.
	New             bool     `json:"new"`
	MAD             float64  `json:"mad"`
	MSE             float64  `json:"mse"`
	BaselinePeriods Floats   `json:"baseline_periods"`
	AdjustedPeriods []Floats `json:"adjusted_periods"`
}

// summary returns what the portfolio's report shows of the series.
func (o OwnSeries) summary() report.SeriesSummary {
	ss := report.SeriesSummary{Name: o.Name, New: o.New, MAD: o.MAD, MSE: o.MSE, Baseline: o.BaselinePeriods}
	for _, a := range o.AdjustedPeriods {
		ss.Adjusted = append(ss.Adjusted, a)
	}
	return ss
}

// GroupSums are the partial sums of a group of series over the shard's
// members.
type GroupSums struct {
	Level     string         `json:"level"`
	Depth     int            `json:"depth"`
	Group     string         `json:"group"`
	First     int            `json:"first"`
	Members   int            `json:"members"`
	Floor     float64        `json:"floor"`
	Var       *PartsJSON     `json:"var"`
	Scenarios []ScenarioSums `json:"scenarios"`
}

// ScenarioSums are a group's sums in one scenario.
type ScenarioSums struct {
	Baseline     Floats     `json:"baseline"`
	Adjusted     Floats     `json:"adjusted"`
	RiskWeighted Floats     `json:"risk_weighted"`
	Sigma        []EventSum `json:"sigma"`
}

// An EventSum is the sum, per period, of an event's standard deviations
// over the group's members.
type EventSum struct {
	ID  string `json:"id"`
	Sum Floats `json:"sum"`
}

// A ResourceSum is a resource of the file and the partial sums of its
// series.
type ResourceSum struct {
	ID       string    `json:"id"`
	Units    string    `json:"units"`
	PerUnit  float64   `json:"per_unit"`
	Capacity Floats    `json:"capacity"`
	Sums     GroupSums `json:"sums"`
}

// PartsJSON is forecast.VarianceParts as sums.json holds it.
type PartsJSON struct {
	H     int              `json:"h"`
	N     int              `json:"n"`
	Z     []Floats         `json:"z"`
	Own   map[int][]Floats `json:"own"`
	Indep Floats           `json:"indep"`
}

func partsJSON(p *forecast.VarianceParts) *PartsJSON {
	out := &PartsJSON{H: p.H, N: p.N, Indep: p.Indep, Own: map[int][]Floats{}}
	for _, z := range p.Z {
		out.Z = append(out.Z, z)
	}
	for L, os := range p.Own {
		for _, z := range os {
			out.Own[L] = append(out.Own[L], z)
		}
	}
	return out
}

func (pj *PartsJSON) parts() (*forecast.VarianceParts, error) {
	p := &forecast.VarianceParts{H: pj.H, N: pj.N, Indep: pj.Indep, Own: map[int][][]float64{}}
	for _, z := range pj.Z {
		p.Z = append(p.Z, z)
	}
	for L, os := range pj.Own {
		for _, z := range os {
			p.Own[L] = append(p.Own[L], z)
		}
	}
	return p, p.Check()
}

// NewPlanSums returns the partial sums of the portfolio of one shard
// (plan.ReadShard, then plan.BuildPortfolio), with the charts of its
// charts most-changed series (report.AllCharts for all). It returns an
// error when pf is not a shard's, or that of forecast.SumVarianceParts.
func NewPlanSums(pf *plan.Portfolio, charts int) (*PlanSums, error) {
	sh := pf.Shard
	if sh == nil {
		return nil, fmt.Errorf("shard: the portfolio is not that of a shard")
	}
	f := pf.File
	s := &PlanSums{Version: SumsVersion, Kind: "plan", Series: len(sh.All), Levels: pf.Levels, Z: f.Bands.Z, Floor: f.Bands.Floor != nil,
		Own: []OwnSeries{}, Groups: []GroupSums{}, Resources: []ResourceSum{}}
	for _, n := range sh.All {
		s.Depth = max(s.Depth, strings.Count(n, "/")+1)
	}
	for t := range f.Horizon {
		s.Periods = append(s.Periods, sh.First.Add(t).String())
	}
	for _, c := range f.Cases() {
		s.Scenarios = append(s.Scenarios, c.Name)
		ids := []string{}
		for _, e := range c.Events {
			ids = append(ids, e.ID)
		}
		s.CaseEvents = append(s.CaseEvents, ids)
	}
	s.Plan, s.Units, s.Inputs, s.Notes = f.Plan, f.Units, pf.Shard.Inputs, pf.Notes
	if s.Notes == nil {
		s.Notes = []string{}
	}
	s.Freq, s.End = sh.First.Freq.String(), sh.First.Add(-1).String()
	for _, e := range f.Events {
		use := EventUse{ID: e.ID}
		for _, p := range pf.Plans {
			if _, ok := p.Effects[e.ID]; ok {
				use.Future = true
				break
			}
		}
		s.Events = append(s.Events, use)
	}
	hz := f.Horizon
	mine := map[string]int{}
	var summaries []report.SeriesSummary
	for i, p := range pf.Plans {
		mine[p.History.Name] = i
		ss := report.SeriesSummaryOf(p)
		summaries = append(summaries, ss)
		o := OwnSeries{Name: ss.Name, Index: sh.Index[i], Warnings: []string{},
			New: ss.New, MAD: ss.MAD, MSE: ss.MSE, BaselinePeriods: ss.Baseline}
		for _, adj := range ss.Adjusted {
			o.AdjustedPeriods = append(o.AdjustedPeriods, adj)
		}
		s.Own = append(s.Own, o)
	}
	s.tail(pf)
	s.ChartCount = charts
	s.Charts = shardCharts(pf, summaries, charts)
	s.Warnings = []string{}
	for _, w := range pf.Warnings {
		if n, ok := seriesOf(w, mine); ok {
			s.Own[n].Warnings = append(s.Own[n].Warnings, w)
		} else {
			s.Warnings = append(s.Warnings, w)
		}
	}
	all := make([]int, len(pf.Plans))
	for i := range all {
		all[i] = i
	}
	g, err := groupSums(pf, s, all, s.Depth == 1)
	if err != nil {
		return nil, err
	}
	g.Level, g.Group = plan.TotalGroup, plan.TotalGroup
	s.Groups = append(s.Groups, g)
	for d := 1; d < s.Depth; d++ {
		var order []string
		groups := map[string][]int{}
		for i, n := range pf.Names {
			pre := prefix(n, d)
			if _, ok := groups[pre]; !ok {
				order = append(order, pre)
			}
			groups[pre] = append(groups[pre], i)
		}
		for _, pre := range order {
			g, err := groupSums(pf, s, groups[pre], d == s.Depth-1)
			if err != nil {
				return nil, fmt.Errorf("group %q: %w", pre, err)
			}
			g.Depth, g.Group = d, pre
			g.Level = fmt.Sprintf("level%d", d)
			if d <= len(pf.Levels) {
				g.Level = pf.Levels[d-1]
			}
			s.Groups = append(s.Groups, g)
		}
	}
	for _, r := range f.AllResources() {
		rs := ResourceSum{ID: r.ID, Units: r.Units, PerUnit: r.PerUnit}
		if r.Capacity != nil {
			for t := range hz {
				rs.Capacity = append(rs.Capacity, r.Capacity.At(sh.First.Add(t)))
			}
		}
		var idx []int
		for i, n := range pf.Names {
			if series.Match(r.Series, n) {
				idx = append(idx, i)
			}
		}
		g, err := groupSums(pf, s, idx, true)
		if err != nil {
			return nil, fmt.Errorf("resource %q: %w", r.ID, err)
		}
		rs.Sums = g
		s.Resources = append(s.Resources, rs)
	}
	return s, nil
}

// tail sets the summed history of the shard's series (Tail and Common).
func (s *PlanSums) tail(pf *plan.Portfolio) {
	n := report.ChartHistory(pf.Shard.First.Freq)
	s.Tail = make(Floats, n)
	for _, p := range pf.Plans {
		h := p.History.Values
		if len(h) == 0 {
			continue
		}
		if s.Common == 0 || len(h) < s.Common {
			s.Common = len(h)
		}
		for i := range min(n, len(h)) {
			s.Tail[n-1-i] += h[len(h)-1-i]
		}
	}
}

// seriesOf returns the index of the own series a warning of the portfolio
// is about ("series NAME: ..."), if any.
func seriesOf(w string, mine map[string]int) (int, bool) {
	rest, ok := strings.CutPrefix(w, "series ")
	if !ok {
		return 0, false
	}
	for j := 0; j < len(rest); j++ {
		if rest[j] == ':' {
			if i, ok := mine[rest[:j]]; ok {
				return i, true
			}
		}
	}
	return 0, false
}

// prefix returns the first d levels of name.
func prefix(name string, d int) string {
	parts := strings.SplitN(name, "/", d+1)
	return strings.Join(parts[:min(d, len(parts))], "/")
}

// groupSums returns the partial sums of the plans of members (indices in
// pf.Plans, in order), with the parts of the variance of their sum when
// withVar is set: only the groups of the deepest level (the total when the
// names have one level) and the resources carry them, since every other
// group is a union of groups of the deepest level, whose parts the merge
// adds.
func groupSums(pf *plan.Portfolio, s *PlanSums, members []int, withVar bool) (GroupSums, error) {
	f := pf.File
	hz := len(s.Periods)
	g := GroupSums{First: -1, Members: len(members)}
	if len(members) > 0 {
		g.First = pf.Shard.Index[members[0]]
	}
	var fits []*forecast.Result
	for _, i := range members {
		p := pf.Plans[i]
		if p.Fit != nil {
			fits = append(fits, p.Fit)
		}
		if p.Floor != nil {
			g.Floor += *p.Floor
		}
	}
	if withVar {
		parts, err := forecast.SumVarianceParts(fits, hz, pf.Span, pf.Shard.First, f.Bands.Widen, f.Bands.From)
		if err != nil {
			return GroupSums{}, err
		}
		g.Var = partsJSON(parts)
	}
	for k := range s.Scenarios {
		sc := ScenarioSums{Baseline: make(Floats, hz), Adjusted: make(Floats, hz), RiskWeighted: make(Floats, hz)}
		at := map[string]int{}
		for _, i := range members {
			p := pf.Plans[i]
			sp := &p.Scenarios[k]
			for t := range hz {
				sc.Baseline[t] += p.Baseline[t]
				sc.Adjusted[t] += sp.Adjusted[t]
				sc.RiskWeighted[t] += sp.RiskWeighted[t]
			}
			for _, e := range sp.Events {
				j, ok := at[e.ID]
				if !ok {
					j = len(sc.Sigma)
					at[e.ID] = j
					sc.Sigma = append(sc.Sigma, EventSum{ID: e.ID, Sum: make(Floats, hz)})
				}
				for t, x := range p.Effects[e.ID].Sigma {
					sc.Sigma[j].Sum[t] += x
				}
			}
		}
		if sc.Sigma == nil {
			sc.Sigma = []EventSum{}
		}
		g.Scenarios = append(g.Scenarios, sc)
	}
	return g, nil
}

// PlanFiles returns the files of a shard of a portfolio plan: plan.csv
// (PlanRows) and sums.json (NewPlanSums, with charts of the charts
// most-changed series).
func PlanFiles(pf *plan.Portfolio, charts int) ([]File, error) {
	s, err := NewPlanSums(pf, charts)
	if err != nil {
		return nil, err
	}
	js, err := json.Marshal(s)
	if err != nil {
		return nil, err
	}
	rows, err := PlanRows(pf)
	if err != nil {
		return nil, err
	}
	return []File{{"plan.csv", rows}, {"sums.json", append(js, '\n')}}, nil
}
