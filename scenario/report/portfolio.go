package report

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"forelay/forecast"
	"forelay/scenario/plan"
	"forelay/scenario/supply"
)

// PortfolioVersion is the version of the portfolio plan.json document;
// it changes only when a field changes meaning or goes away.
const PortfolioVersion = 1

// MostChanged is how many series the text lists per scenario as those the
// events change most.
const MostChanged = 10

// PortfolioDoc is plan.json of a portfolio (kind "portfolio"); the
// merge of shards (package shard) writes the same document.
type PortfolioDoc struct {
	Version   int                    `json:"version"`
	Kind      string                 `json:"kind"`
	Plan      string                 `json:"plan"`
	Units     string                 `json:"units,omitempty"`
	Series    int                    `json:"series"`
	Levels    []string               `json:"levels"`
	History   PortfolioHistoryDoc    `json:"history"`
	Inputs    map[string]string      `json:"inputs"`
	Periods   []string               `json:"periods"`
	Baselines []SeriesBaselineDoc    `json:"series_baselines"`
	Scenarios []PortfolioScenarioDoc `json:"scenarios"`
	Notes     []string               `json:"notes"`
	Caution   string                 `json:"caution"`
	Warnings  []string               `json:"warnings"`
}

// PortfolioHistoryDoc is the length of the history's periods and its
// last period.
type PortfolioHistoryDoc struct {
	Period string `json:"period"`
	End    string `json:"end"`
}

// SeriesBaselineDoc is one series' baseline per period and its in-sample
// MAD and MSE (0 for a series that a scope creates, New), what tracking
// needs of it besides each scenario's plan.
type SeriesBaselineDoc struct {
	Series   string `json:"series"`
	New      bool   `json:"new"`
	MAD      Num    `json:"mad"`
	MSE      Num    `json:"mse"`
	Baseline []Num  `json:"baseline"`
}

// PortfolioScenarioDoc is one scenario of plan.json of a portfolio.
type PortfolioScenarioDoc struct {
	Name      string         `json:"name"`
	Events    []string       `json:"events"`
	Rollups   []RollupDoc    `json:"rollups"`
	Resources []ResourceDoc  `json:"resources,omitempty"`
	Series    []SeriesSumDoc `json:"series"`
}

// RollupDoc is one roll-up of a scenario, per period.
type RollupDoc struct {
	Level        string `json:"level"`
	Group        string `json:"group"`
	Members      int    `json:"members"`
	Baseline     []Num  `json:"baseline"`
	Adjusted     []Num  `json:"adjusted"`
	RiskWeighted []Num  `json:"risk_weighted"`
	Lower        []Num  `json:"lower"`
	Upper        []Num  `json:"upper"`
	Var          []Num  `json:"var"`
}

// ResourceDoc is one resource's load in a scenario.
type ResourceDoc struct {
	ID          string `json:"id"`
	Units       string `json:"units,omitempty"`
	Series      int    `json:"series"`
	Load        []Num  `json:"load"`
	Capacity    []Num  `json:"capacity"`
	Utilisation []Num  `json:"utilisation"`
	LoadSD      []Num  `json:"load_sd"`
	PBreach     []Num  `json:"p_breach"`
	Shortfall   []Num  `json:"expected_shortfall"`
}

// SeriesSumDoc is one series' totals over the horizon in a scenario,
// and its plan per period.
type SeriesSumDoc struct {
	Series          string `json:"series"`
	Baseline        Num    `json:"baseline"`
	Adjusted        Num    `json:"adjusted"`
	Change          Num    `json:"change"`
	AdjustedPeriods []Num  `json:"adjusted_periods"`
}

// A seriesChange is one series' totals over the horizon in a scenario.
type seriesChange struct {
	name               string
	baseline, adjusted float64
}

func (c seriesChange) change() float64 { return c.adjusted - c.baseline }

// ForPortfolio is the report of a portfolio plan: a summary per scenario
// on standard output (totals per group of the widest level, the
// resources' peak loads, and the series the events change most), plan.csv
// (every series and period), rollup.csv (every group of every level and
// period), summary.csv (every series ranked by the change), resources.csv
// (every resource's load per period, when the file has resources),
// plan.json, and the charts: the total, each resource against its
// capacity, and the plans of the opt.Charts series the events change most
// (AllCharts for every series). With
// opt.Detail the text adds every period of each scenario's total, and with
// opt.Event where that event lands; an event that moves no planned series
// in the forecast periods is an error wrapping ErrNoPortfolioEvent. It returns the error of
// Portfolio.Rollups.
func ForPortfolio(pf *plan.Portfolio, opt PortfolioOptions) (*Report, error) {
	s, err := newPortfolioSummary(pf, opt.Charts)
	if err != nil {
		return nil, err
	}
	if opt.Detail {
		s.detail = func(w *Text, k int) { portfolioDetailText(w, pf, s.Rollups[k][0]) }
	}
	r := PortfolioSummaryReport(s)
	r.CSV = portfolioCSV(pf)
	if opt.Event != "" {
		if err := portfolioEventText(&r.Text, pf, opt.Event); err != nil {
			return nil, err
		}
	}
	return r, nil
}

// PortfolioSummaryReport returns the report of a portfolio plan from its
// summary, as ForPortfolio documents it, but for plan.csv: the caller
// sets the report's CSV or CSVData.
func PortfolioSummaryReport(s *PortfolioSummary) *Report {
	r := &Report{Name: "plan", Warnings: s.Warnings,
		MoreCSV: []CSVFile{{"rollup", rollupCSV(s)}, {"summary", summaryCSV(s)}},
		Doc:     portfolioDoc(s), MoreTables: s.MoreTables}
	if len(s.Resources) > 0 {
		r.MoreCSV = append(r.MoreCSV, CSVFile{"resources", resourcesCSV(s)})
	}
	r.Charts = portfolioCharts(s)
	portfolioText(&r.Text, s)
	return r
}

// maxBreach returns the period index of a risk's largest breach chance,
// the first of equals; -1 without capacity (breach chances all NaN).
func maxBreach(risk *supply.LoadRisk) int {
	at := -1
	for t, p := range risk.PBreach {
		if at < 0 && !math.IsNaN(p) || at >= 0 && p > risk.PBreach[at] {
			at = t
		}
	}
	return at
}

// resourcesText writes, for scenario k, each resource's peak load, the
// capacity and utilisation in that period, and the periods the planned
// load exceeds capacity.
func resourcesText(w *Text, s *PortfolioSummary, k int) {
	if len(s.Resources) == 0 {
		return
	}
	t := NewTable("resource", "series", "peak load", "in", "capacity", "utilisation", "periods over capacity", "max breach chance")
	for _, r := range s.Resources {
		load := r.Risk[k].Load
		i, peak := plan.Peak(load)
		d := forecast.Decimals(load)
		capText, utilText := "none", "-"
		over := 0
		if r.Capacity != nil {
			capText = num(r.Capacity[i], d)
			utilText = PctText(r.Utilisation(load)[i])
			for t, l := range load {
				if l > r.Capacity[t] {
					over++
				}
			}
		}
		breach := "-"
		if j := maxBreach(r.Risk[k]); j >= 0 {
			breach = PctText(r.Risk[k].PBreach[j]) + " in " + s.Periods[j].String()
		}
		t.AddRow(r.ID, fmt.Sprint(r.Size), num(peak, d)+unitsSuffix(r.Units), s.Periods[i].String(), capText, utilText, fmt.Sprint(over), breach)
	}
	fmt.Fprintln(w, "Resources (load of the planned demand; breach chance if the scenario's events happen, load taken as normal with the spread of the sums):")
	w.Add(t)
}

// resourcesCSV is resources.csv: one row per scenario, resource and
// period with the columns scenario, resource, period, load, capacity
// (empty without one), utilisation (load / capacity, 4 decimals; empty
// without capacity), load_sd, p_breach (4 decimals) and
// expected_shortfall (supply.LoadRisk; empty without capacity).
func resourcesCSV(s *PortfolioSummary) *Table {
	t := (&Table{Head: []string{"scenario", "resource", "period", "load", "capacity", "utilisation", "load_sd", "p_breach", "expected_shortfall"}}).
		Typed(Label, Label, Label, Quantity, Quantity, Share, Quantity, Share, Quantity)
	for k, name := range s.Scenarios {
		for _, r := range s.Resources {
			risk := r.Risk[k]
			util := r.Utilisation(risk.Load)
			for j, per := range s.Periods {
				capacity := ""
				if r.Capacity != nil {
					capacity = CSV2(r.Capacity[j])
				}
				t.Rows = append(t.Rows, []string{name, r.ID, per.String(), CSV2(risk.Load[j]), capacity, CSVNum(util[j], 4),
					CSVNum(risk.SD[j], 2), CSVNum(risk.PBreach[j], 4), CSVNum(risk.Shortfall[j], 2)})
			}
		}
	}
	return t
}

// changes returns each series' totals in scenario k, in the order of
// the series.
func changes(s *PortfolioSummary, k int) []seriesChange {
	out := make([]seriesChange, len(s.Series))
	for i, ss := range s.Series {
		out[i] = seriesChange{ss.Name, plan.Total(ss.Baseline), plan.Total(ss.Adjusted[k])}
	}
	return out
}

// ranked returns the changes ordered by the size of the change, largest
// first, ties by name.
func ranked(cs []seriesChange) []seriesChange {
	out := slices.Clone(cs)
	slices.SortStableFunc(out, func(a, b seriesChange) int {
		if c := cmp.Compare(math.Abs(b.change()), math.Abs(a.change())); c != 0 {
			return c
		}
		return strings.Compare(a.name, b.name)
	})
	return out
}

// portfolioText writes the summary: what was planned, then per scenario
// the total and the groups of the widest level, and the series the events
// change most.
func portfolioText(w *Text, s *PortfolioSummary) {
	units := unitsSuffix(s.Units)
	last := len(s.Periods) - 1
	fmt.Fprintf(w, "Plan %s: %d series, %d %s periods %s to %s%s\n", s.Plan, len(s.Series), len(s.Periods), s.Periods[0].Freq,
		s.Periods[0], s.Periods[last], InUnits(s.Units))
	fmt.Fprintf(w, "Bands: plan +- %.3g x standard error; bands of sums come from the series' joint errors, not from adding bands\n", s.Z)
	for k, name := range s.Scenarios {
		writeScenarioHeading(w, name, s.CaseEvents[k])
		t := NewTable("group", "series", "baseline"+units, "plan"+units, "vs baseline", "change", fmt.Sprintf("band %s", s.Periods[last]))
		t.Left(0)
		for g, ru := range s.Rollups[k] {
			if ru.Depth > 1 {
				continue
			}
			d := forecast.Decimals(ru.Baseline)
			base, adj := plan.Total(ru.Baseline), plan.Total(ru.Adjusted)
			label := ru.Group
			if ru.Depth == 1 {
				label = ru.Level + " " + ru.Group
			}
			t.AddRow(label, fmt.Sprint(s.GroupSizes[g]), num(base, d), num(adj, d), Signed(adj-base, d), Pct(adj-base, base),
				num(ru.Lower[last], d)+" to "+num(ru.Upper[last], d))
		}
		w.Add(t)
		if s.detail != nil {
			s.detail(w, k)
		}
		resourcesText(w, s, k)
		top := ranked(changes(s, k))
		n := 0
		for _, c := range top {
			if c.change() != 0 && n < MostChanged {
				n++
			}
		}
		if n == 0 {
			continue
		}
		all := "all in summary.csv"
		if s.inPage {
			all = "all in the table of every series"
		}
		fmt.Fprintf(w, "Most changed series (%d of %d changed; %s):\n", countChanged(top), len(top), all)
		mt := NewTable("series", "baseline"+units, "plan"+units, "vs baseline", "change")
		for _, c := range top[:n] {
			d := forecast.Decimals([]float64{c.baseline, c.adjusted})
			mt.AddRow(c.name, num(c.baseline, d), num(c.adjusted, d), Signed(c.change(), d), Pct(c.change(), c.baseline))
		}
		w.Add(mt)
	}
	writeNotesAndCaution(w, s.Notes)
}

// countChanged counts the series whose plan differs from the baseline.
func countChanged(cs []seriesChange) int {
	n := 0
	for _, c := range cs {
		if c.change() != 0 {
			n++
		}
	}
	return n
}

// portfolioCSV is plan.csv of a portfolio: one row per scenario, series
// and period (series in the order of Names), with the columns scenario,
// series, period, baseline, adjusted, risk_weighted, lower, upper and one
// per event of the file, in file order, holding its contribution to the
// series (0 where it does not move the series); two decimals.
func portfolioCSV(pf *plan.Portfolio) *Table {
	t := &Table{Head: []string{"scenario", "series", "period", "baseline", "adjusted", "risk_weighted", "lower", "upper"}}
	var ids []string
	for _, e := range pf.File.Events {
		if !pastOnly(pf, e.ID) {
			ids = append(ids, e.ID)
		}
	}
	t.Head = append(t.Head, ids...)
	t.Typed(kindsOf([]Kind{Label}, planKinds, repeatKind(Quantity, len(ids)))...)
	p0 := pf.Plans[0]
	for k := range p0.Scenarios {
		for _, p := range pf.Plans {
			sp := p.Scenarios[k]
			for j, per := range p.Periods {
				row := []string{sp.Name, p.History.Name, per.String(), CSV2(p.Baseline[j]), CSV2(sp.Adjusted[j]),
					CSV2(sp.RiskWeighted[j]), CSV2(sp.Lower[j]), CSV2(sp.Upper[j])}
				for _, id := range ids {
					c := 0.0
					if v, ok := sp.Contrib[id]; ok {
						c = v[j]
					}
					row = append(row, CSV2(c))
				}
				t.Rows = append(t.Rows, row)
			}
		}
	}
	return t
}

// pastOnly reports whether no series' plan holds event id as a future
// event (it was only cleaned out of histories, or moves no series).
func pastOnly(pf *plan.Portfolio, id string) bool {
	for _, p := range pf.Plans {
		if _, ok := p.Effects[id]; ok {
			return false
		}
	}
	return true
}

// rollupCSV is rollup.csv: one row per scenario, roll-up and period, with
// the columns scenario, level, group, period, baseline, adjusted,
// risk_weighted, lower, upper; two decimals.
func rollupCSV(s *PortfolioSummary) *Table {
	t := (&Table{Head: []string{"scenario", "level", "group", "period", "baseline", "adjusted", "risk_weighted", "lower", "upper"}}).
		Typed(Label, Label, Label, Label, Quantity, Quantity, Quantity, Quantity, Quantity)
	for _, rs := range s.Rollups {
		for _, ru := range rs {
			for k, per := range s.Periods {
				t.Rows = append(t.Rows, []string{ru.Scenario, ru.Level, ru.Group, per.String(), CSV2(ru.Baseline[k]),
					CSV2(ru.Adjusted[k]), CSV2(ru.RiskWeighted[k]), CSV2(ru.Lower[k]), CSV2(ru.Upper[k])})
			}
		}
	}
	return t
}

// summaryCSV is summary.csv: every series in every scenario ranked by the
// size of its change over the horizon (rank 1 the largest; ties by name),
// with the columns scenario, rank, series, baseline, adjusted, change,
// change_pct (empty when the baseline total is 0); two decimals.
func summaryCSV(s *PortfolioSummary) *Table {
	t := (&Table{Head: []string{"scenario", "rank", "series", "baseline", "adjusted", "change", "change_pct"}}).
		Typed(Label, Count, Label, Quantity, Quantity, Quantity, Percent)
	for k, name := range s.Scenarios {
		for i, c := range ranked(changes(s, k)) {
			pct := ""
			if c.baseline != 0 {
				pct = CSV2(100 * c.change() / c.baseline)
			}
			t.Rows = append(t.Rows, []string{name, fmt.Sprint(i + 1), c.name, CSV2(c.baseline), CSV2(c.adjusted), CSV2(c.change()), pct})
		}
	}
	return t
}

// portfolioDoc is plan.json of a portfolio.
func portfolioDoc(s *PortfolioSummary) PortfolioDoc {
	doc := PortfolioDoc{Version: PortfolioVersion, Kind: "portfolio", Plan: s.Plan, Units: s.Units,
		Series: len(s.Series), Levels: List(s.Levels), Notes: List(s.Notes), Caution: Caution, Warnings: List(s.Warnings),
		History: PortfolioHistoryDoc{Period: s.Periods[0].Freq.String(), End: s.HistoryEnd},
		Inputs:  s.Inputs}
	for _, per := range s.Periods {
		doc.Periods = append(doc.Periods, per.String())
	}
	for _, ss := range s.Series {
		doc.Baselines = append(doc.Baselines, SeriesBaselineDoc{Series: ss.Name, New: ss.New, MAD: Num(ss.MAD), MSE: Num(ss.MSE), Baseline: Nums(ss.Baseline)})
	}
	for k, name := range s.Scenarios {
		sj := PortfolioScenarioDoc{Name: name, Events: s.CaseEvents[k]}
		for g, ru := range s.Rollups[k] {
			sj.Rollups = append(sj.Rollups, RollupDoc{Level: ru.Level, Group: ru.Group, Members: s.GroupSizes[g],
				Baseline: Nums(ru.Baseline), Adjusted: Nums(ru.Adjusted), RiskWeighted: Nums(ru.RiskWeighted),
				Lower: Nums(ru.Lower), Upper: Nums(ru.Upper), Var: Nums(ru.Var)})
		}
		for _, r := range s.Resources {
			risk := r.Risk[k]
			rj := ResourceDoc{ID: r.ID, Units: r.Units, Series: r.Size, Load: Nums(risk.Load), Utilisation: Nums(r.Utilisation(risk.Load)),
				LoadSD: Nums(risk.SD), PBreach: Nums(risk.PBreach), Shortfall: Nums(risk.Shortfall)}
			if r.Capacity != nil {
				rj.Capacity = Nums(r.Capacity)
			}
			sj.Resources = append(sj.Resources, rj)
		}
		for i, c := range changes(s, k) {
			sj.Series = append(sj.Series, SeriesSumDoc{Series: c.name, Baseline: Num(c.baseline), Adjusted: Num(c.adjusted), Change: Num(c.change()),
				AdjustedPeriods: Nums(s.Series[i].Adjusted[k])})
		}
		doc.Scenarios = append(doc.Scenarios, sj)
	}
	return doc
}
