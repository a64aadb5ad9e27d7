package shard

import (
	"bytes"
	"cmp"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"slices"

	"forelay/forecast"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/supply"
)

// A Merged is what a merge writes: the report of the whole run (plan and
// stress), or its files and a line of text (fit).
type Merged struct {
	Report *report.Report
	Files  []File
	Text   string
	Shards int
	// NoChart is set when the shards were run without charts (plan
	// --charts none).
	NoChart bool
}

// MergePlan merges the shards of a portfolio plan in dirs (the --out
// directories of "forelay plan --shard K/N", given in any order) into the
// files of one run over every series: plan.csv, rollup.csv, summary.csv
// and, when the file has resources, resources.csv. The per-series rows are
// those of the shards, laid in the order of the whole portfolio; roll-ups
// and resources are the added partial sums. Errors wrap ErrApart when the
// shards do not belong together.
func MergePlan(dirs []string) (*Merged, error) {
	dirs, ms, err := readShards(dirs, "plan")
	if err != nil {
		return nil, err
	}
	sums := make([]*PlanSums, len(dirs))
	for i, d := range dirs {
		var s PlanSums
		if err := readJSON(d, "sums.json", &s); err != nil {
			return nil, err
		}
		if s.Version != SumsVersion || s.Kind != "plan" {
			return nil, fmt.Errorf("%s: sums.json of version %d, kind %q; this forelay merges version %d of a plan", d, s.Version, s.Kind, SumsVersion)
		}
		sums[i] = &s
	}
	if err := agree(dirs, sums); err != nil {
		return nil, err
	}
	own, err := ownSeries(dirs, sums)
	if err != nil {
		return nil, err
	}
	rows, err := mergeRows(dirs, sums)
	if err != nil {
		return nil, err
	}
	sum, err := mergedSummary(sums, own)
	if err != nil {
		return nil, err
	}
	rep := report.PortfolioSummaryReport(sum)
	rep.CSVData = rows
	return &Merged{Report: rep, Shards: ms[0].Shard.N, NoChart: sums[0].ChartCount == NoCharts}, nil
}

// mergedSummary returns the summary of the whole portfolio from the
// shards' sums and series (ownSeries).
func mergedSummary(sums []*PlanSums, own []OwnSeries) (*report.PortfolioSummary, error) {
	s0 := sums[0]
	sum := &report.PortfolioSummary{Plan: s0.Plan, Units: s0.Units, Levels: s0.Levels, HistoryEnd: s0.End, Inputs: s0.Inputs,
		Z: s0.Z, Scenarios: s0.Scenarios, CaseEvents: s0.CaseEvents, Notes: s0.Notes, Warnings: mergedWarnings(s0.Warnings, own)}
	freq, err := forecast.ParseFrequency(s0.Freq)
	if err != nil {
		return nil, fmt.Errorf("sums.json: %w", err)
	}
	for _, label := range s0.Periods {
		per, err := forecast.ParsePeriod(label, freq)
		if err != nil {
			return nil, fmt.Errorf("sums.json: %w", err)
		}
		sum.Periods = append(sum.Periods, per)
	}
	groups, err := mergeGroups(sums)
	if err != nil {
		return nil, err
	}
	for k := range s0.Scenarios {
		var rs []plan.Rollup
		for _, g := range groups {
			ru, err := g.rollup(s0, k)
			if err != nil {
				return nil, fmt.Errorf("group %q: %w", g.Group, err)
			}
			rs = append(rs, ru)
		}
		sum.Rollups = append(sum.Rollups, rs)
	}
	for _, g := range groups {
		sum.GroupSizes = append(sum.GroupSizes, g.Members)
	}
	if sum.Resources, err = resourceLoads(sums); err != nil {
		return nil, err
	}
	for _, o := range own {
		ss := report.SeriesSummary{Name: o.Name, New: o.New, MAD: o.MAD, MSE: o.MSE, Baseline: o.BaselinePeriods}
		for _, a := range o.AdjustedPeriods {
			ss.Adjusted = append(ss.Adjusted, a)
		}
		sum.Series = append(sum.Series, ss)
	}
	sum.HistoryTail = mergedTail(sums)
	sum.SeriesCharts = mergedCharts(sums, s0.ChartCount)
	return sum, nil
}

// mergedTail returns the summed history of the whole portfolio over the
// last periods every series with history covers, at most
// report.ChartHistory: the shards' tails added, cut to the shortest
// history.
func mergedTail(sums []*PlanSums) []float64 {
	common := 0
	tail := make([]float64, len(sums[0].Tail))
	for _, s := range sums {
		if s.Common > 0 && (common == 0 || s.Common < common) {
			common = s.Common
		}
		addTo(tail, s.Tail)
	}
	return tail[len(tail)-min(common, len(tail)):]
}

// agree checks that the shards' sums describe the same portfolio.
func agree(dirs []string, sums []*PlanSums) error {
	a := sums[0]
	for i, s := range sums[1:] {
		what := ""
		switch {
		case s.Series != a.Series:
			what = fmt.Sprintf("%d and %d series", a.Series, s.Series)
		case !slices.Equal(s.Periods, a.Periods):
			what = "periods"
		case !slices.Equal(s.Scenarios, a.Scenarios):
			what = "scenarios"
		case len(s.Events) != len(a.Events), s.Depth != a.Depth, !slices.Equal(s.Levels, a.Levels), s.Z != a.Z, s.Floor != a.Floor:
			what = "the scenario file"
		case !slices.Equal(s.Warnings, a.Warnings):
			what = "the file's warnings"
		case len(s.Resources) != len(a.Resources):
			what = "resources"
		case len(s.Tail) != len(a.Tail), s.ChartCount != a.ChartCount:
			what = "charts"
		}
		if what != "" {
			return fmt.Errorf("%w: %s and %s differ in %s", ErrApart, dirs[0], dirs[i+1], what)
		}
	}
	return nil
}

// ownSeries returns every shard's series, in the order of the whole
// portfolio, checking that each index is there once.
func ownSeries(dirs []string, sums []*PlanSums) ([]OwnSeries, error) {
	all := make([]OwnSeries, sums[0].Series)
	from := make([]int, len(all))
	for i := range from {
		from[i] = -1
	}
	for i, s := range sums {
		for _, o := range s.Own {
			if o.Index < 0 || o.Index >= len(all) {
				return nil, fmt.Errorf("%w: %s plans series %q at index %d of %d", ErrApart, dirs[i], o.Name, o.Index, len(all))
			}
			if j := from[o.Index]; j >= 0 {
				return nil, fmt.Errorf("%w: %s and %s both plan series %q", ErrApart, dirs[j], dirs[i], o.Name)
			}
			if len(o.Adjusted) != len(s.Scenarios) {
				return nil, fmt.Errorf("%s: series %q has %d totals for %d scenarios", dirs[i], o.Name, len(o.Adjusted), len(s.Scenarios))
			}
			from[o.Index] = i
			all[o.Index] = o
		}
	}
	for i, j := range from {
		if j < 0 {
			return nil, fmt.Errorf("%w: no shard plans series %d of %d", ErrApart, i+1, len(all))
		}
	}
	return all, nil
}

// mergedWarnings returns the file's warnings, then each series', in order.
func mergedWarnings(file []string, own []OwnSeries) []string {
	out := slices.Clone(file)
	for _, o := range own {
		out = append(out, o.Warnings...)
	}
	return out
}

// mergeRows lays the shards' plan.csv rows in the order of the whole
// portfolio, keeping the columns of the events some shard plans.
func mergeRows(dirs []string, sums []*PlanSums) ([]byte, error) {
	s0 := sums[0]
	head := slices.Clone(planHead)
	keep := make([]int, len(planHead))
	for i := range keep {
		keep[i] = i
	}
	for j, e := range s0.Events {
		for _, s := range sums {
			if s.Events[j].ID != e.ID {
				return nil, fmt.Errorf("%w: the shards' events differ", ErrApart)
			}
		}
		if slices.ContainsFunc(sums, func(s *PlanSums) bool { return s.Events[j].Future }) {
			head = append(head, e.ID)
			keep = append(keep, len(planHead)+j)
		}
	}
	readers := make([]*csv.Reader, len(dirs))
	for i, d := range dirs {
		fh, err := os.Open(filepath.Join(d, "plan.csv"))
		if err != nil {
			return nil, err
		}
		defer fh.Close()
		readers[i] = csv.NewReader(fh)
		h, err := readers[i].Read()
		if err != nil {
			return nil, fmt.Errorf("%s: %w", filepath.Join(d, "plan.csv"), err)
		}
		if len(h) != len(planHead)+len(s0.Events) {
			return nil, fmt.Errorf("%s: %d columns, want %d", filepath.Join(d, "plan.csv"), len(h), len(planHead)+len(s0.Events))
		}
	}
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	if err := w.Write(head); err != nil {
		return nil, err
	}
	out := make([]string, len(keep))
	for _, name := range s0.Scenarios {
		at := make([]int, len(sums))
		for {
			best := -1
			for i, s := range sums {
				if at[i] < len(s.Own) && (best < 0 || s.Own[at[i]].Index < sums[best].Own[at[best]].Index) {
					best = i
				}
			}
			if best < 0 {
				break
			}
			o := sums[best].Own[at[best]]
			at[best]++
			for range s0.Periods {
				rec, err := readers[best].Read()
				if err == io.EOF {
					err = errors.New("ends early")
				}
				if err != nil {
					return nil, fmt.Errorf("%s: %w", filepath.Join(dirs[best], "plan.csv"), err)
				}
				if rec[0] != name || rec[1] != o.Name {
					return nil, fmt.Errorf("%s: row of %s, %s where %s, %s was due", filepath.Join(dirs[best], "plan.csv"), rec[0], rec[1], name, o.Name)
				}
				for c, j := range keep {
					out[c] = rec[j]
				}
				if err := w.Write(out); err != nil {
					return nil, err
				}
			}
		}
	}
	w.Flush()
	return b.Bytes(), w.Error()
}

// A mergedGroup is a roll-up added up over the shards.
type mergedGroup struct {
	GroupSums
	parts *forecast.VarianceParts
	// sigma holds each scenario's summed standard deviations by event,
	// events in the order first met.
	sigma [][]EventSum
}

// mergeGroups adds up the shards' groups: the total, then the groups of
// each level from the widest, each level's groups in the order of their
// first member in the whole portfolio.
func mergeGroups(sums []*PlanSums) ([]*mergedGroup, error) {
	type key struct {
		depth int
		group string
	}
	byKey := map[key]*mergedGroup{}
	var order []*mergedGroup
	for _, s := range sums {
		for _, g := range s.Groups {
			k := key{g.Depth, g.Group}
			m, ok := byKey[k]
			if !ok {
				m = &mergedGroup{GroupSums: GroupSums{Level: g.Level, Depth: g.Depth, Group: g.Group, First: -1}}
				byKey[k] = m
				order = append(order, m)
			}
			if err := m.add(g); err != nil {
				return nil, fmt.Errorf("group %q: %w", g.Group, err)
			}
		}
	}
	slices.SortStableFunc(order, func(a, b *mergedGroup) int {
		if c := cmp.Compare(a.Depth, b.Depth); c != 0 {
			return c
		}
		return cmp.Compare(a.First, b.First)
	})
	var out []*mergedGroup
	for _, g := range order {
		if g.Members > 0 || g.Depth == 0 {
			out = append(out, g)
		}
	}
	return out, nil
}

// add adds the sums of one shard's members of the group.
func (m *mergedGroup) add(g GroupSums) error {
	if g.Members > 0 && (m.First < 0 || g.First < m.First) {
		m.First = g.First
	}
	m.Members += g.Members
	m.Floor += g.Floor
	if g.Var == nil {
		return errors.New("no variance parts")
	}
	p, err := g.Var.parts()
	if err != nil {
		return err
	}
	if m.parts == nil {
		m.parts = p
	} else if err := m.parts.Add(p); err != nil {
		return err
	}
	if m.Scenarios == nil {
		for _, sc := range g.Scenarios {
			n := len(sc.Baseline)
			m.Scenarios = append(m.Scenarios, ScenarioSums{Baseline: make(Floats, n), Adjusted: make(Floats, n), RiskWeighted: make(Floats, n)})
		}
		m.sigma = make([][]EventSum, len(g.Scenarios))
	}
	if len(g.Scenarios) != len(m.Scenarios) {
		return errors.New("scenarios differ")
	}
	for k, sc := range g.Scenarios {
		n := len(m.Scenarios[k].Baseline)
		if len(sc.Baseline) != n || len(sc.Adjusted) != n || len(sc.RiskWeighted) != n {
			return errors.New("periods differ")
		}
		addTo(m.Scenarios[k].Baseline, sc.Baseline)
		addTo(m.Scenarios[k].Adjusted, sc.Adjusted)
		addTo(m.Scenarios[k].RiskWeighted, sc.RiskWeighted)
		for _, e := range sc.Sigma {
			if len(e.Sum) != n {
				return errors.New("periods differ")
			}
			j := slices.IndexFunc(m.sigma[k], func(x EventSum) bool { return x.ID == e.ID })
			if j < 0 {
				m.sigma[k] = append(m.sigma[k], EventSum{ID: e.ID, Sum: slices.Clone(e.Sum)})
				continue
			}
			addTo(m.sigma[k][j].Sum, e.Sum)
		}
	}
	return nil
}

func addTo(dst, src []float64) {
	for i, x := range src {
		dst[i] += x
	}
}

// rollup returns the group's roll-up in scenario k, as plan.Rollup gives
// it for the whole portfolio (Members left empty).
func (m *mergedGroup) rollup(s0 *PlanSums, k int) (plan.Rollup, error) {
	sc := m.Scenarios[k]
	r := plan.Rollup{Scenario: s0.Scenarios[k], Level: m.Level, Depth: m.Depth, Group: m.Group,
		Baseline: sc.Baseline, Adjusted: sc.Adjusted, RiskWeighted: sc.RiskWeighted}
	if m.parts == nil || len(m.Scenarios) <= k {
		return r, errors.New("no sums")
	}
	v := m.parts.Variance()
	for _, e := range m.sigma[k] {
		for t, x := range e.Sum {
			v[t] += x * x
		}
	}
	r.Var = v
	hz := len(v)
	r.Lower, r.Upper = make([]float64, hz), make([]float64, hz)
	for t := range hz {
		w := s0.Z * math.Sqrt(v[t])
		r.Lower[t], r.Upper[t] = r.Adjusted[t]-w, r.Adjusted[t]+w
		if s0.Floor {
			r.Lower[t] = max(r.Lower[t], m.Floor)
		}
	}
	return r, nil
}

// resourceLoads returns the merged resources with their loads in each
// scenario, their spread and normal breach risk (as
// supply.PortfolioLoadRisk gives them for the whole portfolio).
func resourceLoads(sums []*PlanSums) ([]report.ResourceLoad, error) {
	s0 := sums[0]
	var out []report.ResourceLoad
	for j, res := range s0.Resources {
		m := &mergedGroup{}
		m.First = -1
		for _, s := range sums {
			if err := m.add(s.Resources[j].Sums); err != nil {
				return nil, fmt.Errorf("resource %q: %w", res.ID, err)
			}
		}
		rl := report.ResourceLoad{Resource: supply.Resource{ID: res.ID, Units: res.Units, PerUnit: res.PerUnit}, Size: m.Members}
		if len(res.Capacity) > 0 {
			rl.Capacity = res.Capacity
		}
		for k := range s0.Scenarios {
			ru, err := m.rollup(s0, k)
			if err != nil {
				return nil, err
			}
			n := len(s0.Periods)
			l := &supply.LoadRisk{Load: make([]float64, n), SD: make([]float64, n), PBreach: make([]float64, n), Shortfall: make([]float64, n)}
			for i := range n {
				l.Load[i] = ru.Adjusted[i] * res.PerUnit
				if m.Members > 0 {
					l.SD[i] = res.PerUnit * math.Sqrt(ru.Var[i])
				}
				l.PBreach[i], l.Shortfall[i] = math.NaN(), math.NaN()
				if rl.Capacity != nil {
					l.PBreach[i], l.Shortfall[i] = supply.NormalBreach(l.Load[i], l.SD[i], rl.Capacity[i])
				}
			}
			rl.Risk = append(rl.Risk, l)
		}
		out = append(out, rl)
	}
	return out, nil
}
