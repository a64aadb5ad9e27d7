package shard

import (
	"bufio"
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
// report of one run over every series (report.PortfolioSummaryReport):
// plan.csv, rollup.csv, summary.csv, resources.csv (when the file has
// resources), plan.json, the charts and the text. The per-series rows are
// those of the shards, streamed in the order of the whole portfolio when
// the report's CSV is written; roll-ups and resources are the added
// partial sums. The shards are read one at a time, each folded into the
// sums before the next, so the merge holds one shard's partial sums at a
// time besides the series of every shard. Errors wrap ErrApart when the
// shards do not belong together.
func MergePlan(dirs []string) (*Merged, error) {
	dirs, ms, err := readShards(dirs, "plan")
	if err != nil {
		return nil, err
	}
	pm := &planMerge{dirs: dirs, groups: map[groupKey]*mergedGroup{}}
	for i, d := range dirs {
		var s PlanSums
		if err := readJSON(d, "sums.json", &s); err != nil {
			return nil, err
		}
		if s.Version != SumsVersion || s.Kind != "plan" {
			return nil, fmt.Errorf("%s: sums.json of version %d, kind %q; this forelay merges version %d of a plan", d, s.Version, s.Kind, SumsVersion)
		}
		if err := pm.add(i, &s); err != nil {
			return nil, err
		}
	}
	own, err := pm.series()
	if err != nil {
		return nil, err
	}
	sum, err := pm.summary(own)
	if err != nil {
		return nil, err
	}
	rep := report.PortfolioSummaryReport(sum)
	rep.CSVWrite = pm.writeRows
	return &Merged{Report: rep, Shards: ms[0].Shard.N, NoChart: pm.head.ChartCount == NoCharts}, nil
}

// A planMerge adds up the shards of a plan, one at a time.
type planMerge struct {
	dirs []string
	// head is the first shard's sums without its series, groups, charts
	// and resources' sums: what every shard says of the whole portfolio.
	head *PlanSums
	// own holds each shard's series; future, per event of the file,
	// whether some shard plans it.
	own    [][]OwnSeries
	future []bool
	// groups and order are the merged roll-ups, resources the merged
	// resources in file order.
	groups    map[groupKey]*mergedGroup
	order     []*mergedGroup
	resources []*mergedGroup
	// charts are the shards' most-changed series; tail and common the
	// added history tails and the shortest history.
	charts []SeriesChart
	tail   []float64
	common int
	// derived is set once the groups above the deepest level have their
	// variance parts (deriveParts).
	derived bool
}

// A groupKey names a roll-up: its depth and group.
type groupKey struct {
	depth int
	group string
}

// add folds shard i's sums into the merge, after checking that they
// describe the same portfolio as the first shard's.
func (pm *planMerge) add(i int, s *PlanSums) error {
	if pm.head == nil {
		h := *s
		h.Own, h.Groups, h.Charts = nil, nil, nil
		h.Resources = slices.Clone(s.Resources)
		for j := range h.Resources {
			h.Resources[j].Sums = GroupSums{}
		}
		pm.head = &h
		pm.future = make([]bool, len(s.Events))
		pm.tail = make([]float64, len(s.Tail))
		for range s.Resources {
			m := &mergedGroup{}
			m.First = -1
			pm.resources = append(pm.resources, m)
		}
	} else if err := agree(pm.dirs[0], pm.dirs[i], pm.head, s); err != nil {
		return err
	}
	for j, e := range s.Events {
		pm.future[j] = pm.future[j] || e.Future
	}
	for _, g := range s.Groups {
		k := groupKey{g.Depth, g.Group}
		m, ok := pm.groups[k]
		if !ok {
			m = &mergedGroup{GroupSums: GroupSums{Level: g.Level, Depth: g.Depth, Group: g.Group, First: -1}}
			pm.groups[k] = m
			pm.order = append(pm.order, m)
		}
		if err := m.add(g); err != nil {
			return fmt.Errorf("%s: group %q: %w", pm.dirs[i], g.Group, err)
		}
	}
	for j, r := range s.Resources {
		if err := pm.resources[j].add(r.Sums); err != nil {
			return fmt.Errorf("%s: resource %q: %w", pm.dirs[i], r.ID, err)
		}
	}
	pm.own = append(pm.own, s.Own)
	pm.charts = append(pm.charts, s.Charts...)
	if s.Common > 0 && (pm.common == 0 || s.Common < pm.common) {
		pm.common = s.Common
	}
	addTo(pm.tail, s.Tail)
	return nil
}

// agree checks that the sums s of shard dir describe the same portfolio
// as a, those of shard first.
func agree(first, dir string, a, s *PlanSums) error {
	what := ""
	switch {
	case s.Series != a.Series:
		what = fmt.Sprintf("%d and %d series", a.Series, s.Series)
	case !slices.Equal(s.Periods, a.Periods):
		what = "periods"
	case !slices.Equal(s.Scenarios, a.Scenarios):
		what = "scenarios"
	case !slices.EqualFunc(s.Events, a.Events, func(x, y EventUse) bool { return x.ID == y.ID }), s.Depth != a.Depth,
		!slices.Equal(s.Levels, a.Levels), s.Z != a.Z, s.Floor != a.Floor:
		what = "the scenario file"
	case !slices.Equal(s.Warnings, a.Warnings):
		what = "the file's warnings"
	case !slices.EqualFunc(s.Resources, a.Resources, func(x, y ResourceSum) bool { return x.ID == y.ID }):
		what = "resources"
	case len(s.Tail) != len(a.Tail), s.ChartCount != a.ChartCount:
		what = "charts"
	}
	if what != "" {
		return fmt.Errorf("%w: %s and %s differ in %s", ErrApart, first, dir, what)
	}
	return nil
}

// series returns every shard's series, in the order of the whole
// portfolio, checking that each index is there once.
func (pm *planMerge) series() ([]OwnSeries, error) {
	all := make([]OwnSeries, pm.head.Series)
	from := make([]int, len(all))
	for i := range from {
		from[i] = -1
	}
	for i, own := range pm.own {
		for _, o := range own {
			if o.Index < 0 || o.Index >= len(all) {
				return nil, fmt.Errorf("%w: %s plans series %q at index %d of %d", ErrApart, pm.dirs[i], o.Name, o.Index, len(all))
			}
			if j := from[o.Index]; j >= 0 {
				return nil, fmt.Errorf("%w: %s and %s both plan series %q", ErrApart, pm.dirs[j], pm.dirs[i], o.Name)
			}
			if len(o.AdjustedPeriods) != len(pm.head.Scenarios) {
				return nil, fmt.Errorf("%s: series %q has plans for %d scenarios, not %d", pm.dirs[i], o.Name, len(o.AdjustedPeriods), len(pm.head.Scenarios))
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

// summary returns the summary of the whole portfolio from the added sums
// and every series (series).
func (pm *planMerge) summary(own []OwnSeries) (*report.PortfolioSummary, error) {
	s0 := pm.head
	sum := &report.PortfolioSummary{Plan: s0.Plan, Units: s0.Units, Levels: s0.Levels, HistoryEnd: s0.End, Inputs: s0.Inputs,
		Z: s0.Z, Scenarios: s0.Scenarios, CaseEvents: s0.CaseEvents, Notes: s0.Notes, Warnings: mergedWarnings(s0.Warnings, own)}
	var err error
	if sum.Periods, err = parsePeriods(s0.Freq, s0.Periods); err != nil {
		return nil, err
	}
	groups, err := pm.rollupGroups()
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
	if sum.Resources, err = pm.resourceLoads(); err != nil {
		return nil, err
	}
	for _, o := range own {
		sum.Series = append(sum.Series, o.summary())
	}
	sum.HistoryTail = pm.tail[len(pm.tail)-min(pm.common, len(pm.tail)):]
	sum.SeriesCharts = mergedCharts(pm.charts, s0.ChartCount)
	return sum, nil
}

// rollupGroups returns the merged roll-ups: the total, then the groups of
// each level from the widest, each level's groups in the order of their
// first member in the whole portfolio. The variance parts of a group
// above the deepest level are the sum of its children's, added from the
// deepest level up, children in that order.
func (pm *planMerge) rollupGroups() ([]*mergedGroup, error) {
	order := slices.Clone(pm.order)
	slices.SortStableFunc(order, func(a, b *mergedGroup) int {
		if c := cmp.Compare(a.Depth, b.Depth); c != 0 {
			return c
		}
		return cmp.Compare(a.First, b.First)
	})
	if err := pm.deriveParts(order); err != nil {
		return nil, err
	}
	var out []*mergedGroup
	for _, g := range order {
		if g.Members > 0 || g.Depth == 0 {
			out = append(out, g)
		}
	}
	return out, nil
}

// deriveParts gives each group above the deepest level, once, the sum of
// its children's variance parts, from the deepest level up, children in
// order.
func (pm *planMerge) deriveParts(order []*mergedGroup) error {
	if pm.derived {
		return nil
	}
	pm.derived = true
	deepest := max(pm.head.Depth-1, 0)
	for _, g := range order {
		if g.Depth != deepest && g.parts != nil {
			return fmt.Errorf("sums.json: group %q carries variance parts; only the groups of the deepest level do", g.Group)
		}
	}
	for d := deepest; d >= 1; d-- {
		for _, g := range order {
			if g.Depth != d || g.parts == nil {
				continue
			}
			k := groupKey{0, plan.TotalGroup}
			if d > 1 {
				k = groupKey{d - 1, prefix(g.Group, d-1)}
			}
			parent, ok := pm.groups[k]
			if !ok {
				return fmt.Errorf("sums.json: group %q has no group %q above it", g.Group, k.group)
			}
			if err := parent.addParts(g.parts); err != nil {
				return fmt.Errorf("group %q: %w", k.group, err)
			}
		}
	}
	return nil
}

// mergedWarnings returns the file's warnings, then each series', in order.
func mergedWarnings(file []string, own []OwnSeries) []string {
	out := slices.Clone(file)
	for _, o := range own {
		out = append(out, o.Warnings...)
	}
	return out
}

// writeRows writes plan.csv of the whole portfolio to out: the shards'
// rows streamed in the order of the whole portfolio, keeping the columns
// of the events some shard plans. A shard's plan.csv that does not hold
// the rows its sums.json says is an error wrapping ErrCorrupt.
func (pm *planMerge) writeRows(out io.Writer) error {
	s0 := pm.head
	head := slices.Clone(planHead)
	keep := make([]int, len(planHead))
	for i := range keep {
		keep[i] = i
	}
	for j, e := range s0.Events {
		if pm.future[j] {
			head = append(head, e.ID)
			keep = append(keep, len(planHead)+j)
		}
	}
	readers := make([]*csv.Reader, len(pm.dirs))
	for i, d := range pm.dirs {
		path := filepath.Join(d, "plan.csv")
		fh, err := os.Open(path)
		if err != nil {
			return fmt.Errorf("%w: %w", ErrCorrupt, err)
		}
		defer fh.Close()
		readers[i] = csv.NewReader(bufio.NewReaderSize(fh, 1<<16))
		readers[i].ReuseRecord = true
		h, err := readers[i].Read()
		if err != nil {
			return fmt.Errorf("%w: %s: %w", ErrCorrupt, path, err)
		}
		if len(h) != len(planHead)+len(s0.Events) {
			return fmt.Errorf("%w: %s: %d columns, want %d", ErrCorrupt, path, len(h), len(planHead)+len(s0.Events))
		}
	}
	w := csv.NewWriter(out)
	if err := w.Write(head); err != nil {
		return err
	}
	row := make([]string, len(keep))
	for _, name := range s0.Scenarios {
		at := make([]int, len(pm.own))
		for {
			best := -1
			for i, own := range pm.own {
				if at[i] < len(own) && (best < 0 || own[at[i]].Index < pm.own[best][at[best]].Index) {
					best = i
				}
			}
			if best < 0 {
				break
			}
			o := pm.own[best][at[best]]
			at[best]++
			for range s0.Periods {
				rec, err := readers[best].Read()
				if err == io.EOF {
					err = errors.New("ends early")
				}
				path := filepath.Join(pm.dirs[best], "plan.csv")
				if err != nil {
					return fmt.Errorf("%w: %s: %w", ErrCorrupt, path, err)
				}
				if rec[0] != name || rec[1] != o.Name {
					return fmt.Errorf("%w: %s: row of %s, %s where %s, %s was due", ErrCorrupt, path, rec[0], rec[1], name, o.Name)
				}
				for c, j := range keep {
					row[c] = rec[j]
				}
				if err := w.Write(row); err != nil {
					return err
				}
			}
		}
	}
	w.Flush()
	return w.Error()
}

// A mergedGroup is a roll-up added up over the shards.
type mergedGroup struct {
	GroupSums
	parts *forecast.VarianceParts
	// sigma holds each scenario's summed standard deviations by event,
	// events in the order first met.
	sigma [][]EventSum
}

// add adds the sums of one shard's members of the group.
func (m *mergedGroup) add(g GroupSums) error {
	if g.Members > 0 && (m.First < 0 || g.First < m.First) {
		m.First = g.First
	}
	m.Members += g.Members
	m.Floor += g.Floor
	if g.Var != nil {
		p, err := g.Var.parts()
		if err != nil {
			return err
		}
		if err := m.addParts(p); err != nil {
			return err
		}
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

// addParts adds the variance parts p to the group's.
func (m *mergedGroup) addParts(p *forecast.VarianceParts) error {
	if m.parts == nil {
		m.parts = &forecast.VarianceParts{H: p.H, N: p.N, Own: map[int][][]float64{}, Indep: make([]float64, len(p.Indep))}
		for range p.Z {
			m.parts.Z = append(m.parts.Z, make([]float64, p.N))
		}
	}
	return m.parts.Add(p)
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
func (pm *planMerge) resourceLoads() ([]report.ResourceLoad, error) {
	s0 := pm.head
	var out []report.ResourceLoad
	for j, res := range s0.Resources {
		m := pm.resources[j]
		rl := report.ResourceLoad{Resource: supply.Resource{ID: res.ID, Units: res.Units, PerUnit: res.PerUnit, Capacity: res.Capacity.orNil()}, Size: m.Members}
		for k := range s0.Scenarios {
			ru, err := m.rollup(s0, k)
			if err != nil {
				return nil, fmt.Errorf("resource %q: %w", res.ID, err)
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
