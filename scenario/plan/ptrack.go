package plan

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strings"

	"forelay/forecast"
	"forelay/scenario/data"
)

// ErrNoPlannedSeries: an actuals file holds none of a portfolio's series.
var ErrNoPlannedSeries = errors.New("no planned series in the actuals")

// A PortfolioTrackPlan is what tracking a portfolio needs: the plan of
// each series as a TrackPlan, and the roll-ups that are tracked as one
// series each (the total and the groups of the widest level) with the
// variance of their sums. Portfolio.TrackPlan takes it from a built
// portfolio; a command may also fill it from a saved plan file.
type PortfolioTrackPlan struct {
	// Name is the plan's name and Units the unit label (empty: none).
	Name, Units string
	// HistoryEnd is the last period of the history; Periods follow it.
	HistoryEnd forecast.Period
	Periods    []forecast.Period
	// Series holds each series' plan in the portfolio's order
	// (Portfolio.Names); their HistoryEnd, Periods and scenario names are
	// those above.
	Series []SeriesTrackPlan
	// Rollups holds, for each scenario in the order of Series[0].Scenarios,
	// the total and then the groups of the widest level.
	Rollups [][]RollupScale
}

// A SeriesTrackPlan is one series' plan in a PortfolioTrackPlan.
type SeriesTrackPlan struct {
	TrackPlan
	// New is true for a series that a scope creates (new: true): it has
	// no history, hence no fit, and its MAD and MSE are 0.
	New bool
}

// A RollupScale is a roll-up to track: its members and the variance of
// the error of their sum.
type RollupScale struct {
	// Level, Depth and Group are those of the Rollup (depth 0 for the
	// total, 1 for the widest level).
	Level string
	Depth int
	Group string
	// Members are the series summed, in the portfolio's order.
	Members []string
	// Var is the variance of the sum's error at the first plan period,
	// Rollup.Var[0]: the members' joint baseline error at lead one plus
	// the spread of the scenario's events in that period.
	Var float64
}

// Label names the roll-up in reports: "total", or the level and the
// group ("family milk").
func (r RollupScale) Label() string {
	if r.Depth == 0 {
		return r.Group
	}
	return r.Level + " " + r.Group
}

// GroupDepth returns the depth of a roll-up's group as Rollups sets it
// (0 for the total, 1 for the widest level, ...), from its level and
// group names.
func GroupDepth(level, group string) int {
	if level == TotalGroup && group == TotalGroup {
		return 0
	}
	return strings.Count(group, "/") + 1
}

// GroupMembers returns the names among names (in their order) that are
// members of group at depth, as Rollups groups them: every name for the
// total (depth 0), else those whose first depth levels are group.
func GroupMembers(names []string, depth int, group string) []string {
	var out []string
	for _, n := range names {
		if depth == 0 || prefix(n, depth) == group {
			out = append(out, n)
		}
	}
	return out
}

// TrackPlan returns what tracking pf needs, or the error of
// Portfolio.Rollups. The slices of the plans are shared, not copied.
func (pf *Portfolio) TrackPlan() (*PortfolioTrackPlan, error) {
	p0 := pf.Plans[0]
	pt := &PortfolioTrackPlan{Name: pf.File.Plan, Units: pf.File.Units,
		HistoryEnd: p0.History.Period(p0.History.Len() - 1), Periods: p0.Periods}
	for _, p := range pf.Plans {
		var s SeriesTrackPlan
		if p.Fit != nil {
			s.TrackPlan = p.TrackPlan()
		} else {
			s.New = true
			s.TrackPlan = TrackPlan{Name: p.File.Plan, Units: p.File.Units, Series: p.History.Name,
				HistoryEnd: pt.HistoryEnd, Periods: p.Periods, Baseline: p.Baseline}
			for _, sp := range p.Scenarios {
				s.Scenarios = append(s.Scenarios, PlanLine{Name: sp.Name, Adjusted: sp.Adjusted})
			}
		}
		pt.Series = append(pt.Series, s)
	}
	for _, sp := range p0.Scenarios {
		rs, err := pf.Rollups(sp.Name)
		if err != nil {
			return nil, err
		}
		var scales []RollupScale
		for _, r := range rs {
			if r.Depth <= 1 {
				scales = append(scales, RollupScale{Level: r.Level, Depth: r.Depth, Group: r.Group, Members: r.Members, Var: r.Var[0]})
			}
		}
		pt.Rollups = append(pt.Rollups, scales)
	}
	return pt, nil
}

// PortfolioActuals are the actuals of a portfolio's series, aligned with
// its periods.
type PortfolioActuals struct {
	// Values holds each series' actuals in the order of
	// PortfolioTrackPlan.Series, the first len(Values[i]) plan periods;
	// nil for a series the file lacks.
	Values [][]float64
	// Warnings name the series of the file that the plan lacks.
	Warnings []string
}

// ReadActuals reads the actuals of pt's series from r, a CSV file in one
// of the history layouts, named name in messages. key names the columns
// that make a series' name in a long file (history.key); a file whose
// header lacks them is read without it, as a wide file (a column per
// series, named as the plan names it) or a long one with a series column. Each series is aligned with the plan as TrackPlan.ReadActuals
// aligns one, with the same errors. A series of the file that the plan
// lacks gives a warning naming it; a planned series the file lacks gets
// no actuals. A file with none of the planned series is an error wrapping
// ErrNoPlannedSeries.
func (pt *PortfolioTrackPlan) ReadActuals(r io.Reader, name string, key []string) (*PortfolioActuals, error) {
	return pt.readActualsAs(r, name, key, data.Format{})
}

// readActualsAs is ReadActuals with the file read in format.
func (pt *PortfolioTrackPlan) readActualsAs(r io.Reader, name string, key []string, format data.Format) (*PortfolioActuals, error) {
	if len(pt.Series) == 0 || len(pt.Periods) == 0 {
		return nil, fmt.Errorf("%w: the plan has no series or no periods", ErrTrackPlan)
	}
	src, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	af, err := readActuals(src, name, format, pt.Periods[0].Freq, key, "")
	if err != nil {
		return nil, err
	}
	out := &PortfolioActuals{Values: make([][]float64, len(pt.Series))}
	planned := make(map[string]bool, len(pt.Series))
	found := 0
	for i, s := range pt.Series {
		planned[s.Series] = true
		ser, ok := af.byName[s.Series]
		if !ok {
			continue
		}
		if out.Values[i], err = af.align(s.TrackPlan, ser); err != nil {
			return nil, err
		}
		found++
	}
	var unknown []string
	for _, s := range af.h.Series {
		if !planned[s.Name] {
			unknown = append(unknown, fmt.Sprintf("%q", s.Name))
		}
	}
	if found == 0 {
		return nil, af.finder("").errHeader(fmt.Errorf("%w: none of the file's %d series is planned (the first is %s); name the series as the plan does (history.key joined by \"/\", such as %q)",
			ErrNoPlannedSeries, len(af.h.Series), unknown[0], pt.Series[0].Series))
	}
	if len(unknown) > 0 {
		const shown = 3
		list := strings.Join(unknown[:min(shown, len(unknown))], ", ")
		if len(unknown) > shown {
			list += ", ..."
		}
		out.Warnings = append(out.Warnings, fmt.Sprintf("%s: %d series %s not in the plan and not tracked: %s; check their names against the plan's, or leave them out of the actuals",
			name, len(unknown), isAre(len(unknown)), list))
	}
	return out, nil
}

// ReadActualsFile is ReadActuals of the file at path, a CSV file or a
// workbook read in format, under the size limits.
func (pt *PortfolioTrackPlan) ReadActualsFile(path string, key []string, format data.Format, limits data.SizeLimits) (*PortfolioActuals, error) {
	fh, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer fh.Close()
	return pt.readActualsAs(data.BoundedReader(fh, path, limits), path, key, format)
}

// PortfolioTracking is the result of following a portfolio's actuals
// against one scenario.
type PortfolioTracking struct {
	// Scenario is the scenario tracked.
	Scenario string
	// Config is the tracking configuration in force, defaults filled in,
	// without a MAD and MSE (each series has its own).
	Config forecast.TrackConfig
	// Series are the series tracked, in the portfolio's order.
	Series []SeriesTracking
	// Rollups are the roll-ups tracked: the total, then the groups of
	// the widest level.
	Rollups []RollupTracking
	// NoActuals counts the planned series the actuals lack.
	NoActuals int
	// Untracked names the series with actuals that are not tracked on
	// their own: those a scope creates (no history, so no error scale) and
	// those whose baseline fits the history exactly (MAD or MSE 0).
	Untracked []string
	// Notes are remarks on what was left out, one sentence each.
	Notes []string
}

// A SeriesTracking is the tracking of one series of a portfolio.
type SeriesTracking struct {
	// Plan is the series' plan, tracked as one series.
	Plan TrackPlan
	*Tracking
}

// A RollupTracking is the tracking of a roll-up as one series.
type RollupTracking struct {
	RollupScale
	// Plan is the roll-up as a plan of one series: the sums of the
	// members' baselines and plans, with MSE = Var and MAD =
	// sqrt(2/pi) sqrt(Var) (see PortfolioTrackPlan.Track).
	Plan TrackPlan
	*Tracking
}

// Track follows the actuals of pt's series (as ReadActuals returns them)
// against the scenario called name (chosen as TrackPlan.Choose does).
//
// Every series with actuals and an error scale is tracked on its own
// with TrackPlan.Track, its in-sample MAD and MSE setting the starting
// MAD and the control limits. A series that a scope creates has no
// history and no error scale: it is not tracked on its own, but its
// actuals and plan count in the roll-ups, whose variance holds its
// events' spread. So is a series whose baseline fits its history exactly.
//
// Each roll-up of the scenario (the total, then the groups of the widest
// level) is tracked as one series too, with TrackPlan.Track on the sums
// of its members' actuals and plans over the periods every member with
// actuals has; its error is thus the sum of the members' errors. Its
// control limits come from the variance of the sum at lead one, MSE =
// RollupScale.Var, and its starting MAD is that of a normal error with
// that variance, MAD = sqrt(2/pi) sqrt(Var) (about 0.8 sigma; common
// practice). A roll-up is tracked only when each of its members has
// actuals, or has a plan of zero on those periods (a new series not yet
// sold); otherwise its sum would miss members that its variance holds,
// and a note says so.
//
// It returns the errors of TrackPlan.Track, naming the series, and one
// wrapping ErrScenarioChoice for an unknown scenario.
func (pt *PortfolioTrackPlan) Track(name string, acts *PortfolioActuals, cfg forecast.TrackConfig) (*PortfolioTracking, error) {
	if len(pt.Series) == 0 {
		return nil, fmt.Errorf("%w: the plan has no series", ErrTrackPlan)
	}
	line, err := pt.Series[0].Choose(name)
	if err != nil {
		return nil, err
	}
	k := 0
	for k < len(pt.Series[0].Scenarios) && pt.Series[0].Scenarios[k].Name != line.Name {
		k++
	}
	out := &PortfolioTracking{Scenario: line.Name}
	probe := cfg
	probe.InitialMAD, probe.MSE = 1, 1
	if out.Config, err = probe.Resolved(); err != nil {
		return nil, err
	}
	out.Config.InitialMAD, out.Config.MSE = 0, 0
	for i, s := range pt.Series {
		v := acts.Values[i]
		switch {
		case v == nil:
			out.NoActuals++
			continue
		case s.New || s.Check() != nil:
			out.Untracked = append(out.Untracked, s.Series)
			continue
		}
		tr, err := s.Track(line.Name, v, cfg)
		if err != nil {
			return nil, fmt.Errorf("series %s: %w", s.Series, err)
		}
		out.Series = append(out.Series, SeriesTracking{Plan: s.TrackPlan, Tracking: tr})
	}
	if out.NoActuals > 0 {
		out.Notes = append(out.Notes, fmt.Sprintf("%d of %d planned series %s no actuals and %s not tracked", out.NoActuals, len(pt.Series), hasHave(out.NoActuals), isAre(out.NoActuals)))
	}
	if len(out.Untracked) > 0 {
		out.Notes = append(out.Notes, fmt.Sprintf("%d series with actuals are not tracked on their own, for want of an error scale (created by an event, so without history, or fitted exactly): %s; they count in the roll-ups",
			len(out.Untracked), shortList(out.Untracked)))
	}
	if k < len(pt.Rollups) {
		index := make(map[string]int, len(pt.Series))
		for i, s := range pt.Series {
			index[s.Series] = i
		}
		for _, rs := range pt.Rollups[k] {
			rt, note, err := pt.trackRollup(rs, index, k, acts, cfg)
			if err != nil {
				return nil, fmt.Errorf("%s: %w", rs.Label(), err)
			}
			if note != "" {
				out.Notes = append(out.Notes, note)
				continue
			}
			out.Rollups = append(out.Rollups, *rt)
		}
	}
	return out, nil
}

// trackRollup tracks one roll-up of scenario k, or says in a note why it
// is not tracked.
func (pt *PortfolioTrackPlan) trackRollup(rs RollupScale, index map[string]int, k int, acts *PortfolioActuals, cfg forecast.TrackConfig) (*RollupTracking, string, error) {
	n := -1
	for _, m := range rs.Members {
		if v := acts.Values[index[m]]; v != nil && (n < 0 || len(v) < n) {
			n = len(v)
		}
	}
	if n < 0 {
		return nil, fmt.Sprintf("%s is not tracked: none of its %d series has actuals", rs.Label(), len(rs.Members)), nil
	}
	scen := pt.Series[0].Scenarios[k].Name
	tp := TrackPlan{Name: pt.Name, Units: pt.Units, Series: rs.Label(), HistoryEnd: pt.HistoryEnd, Periods: pt.Periods,
		Baseline: make([]float64, len(pt.Periods)), MSE: rs.Var, MAD: math.Sqrt(2/math.Pi) * math.Sqrt(rs.Var)}
	adjusted := make([]float64, len(pt.Periods))
	actual := make([]float64, n)
	missing := 0
	for _, m := range rs.Members {
		s := pt.Series[index[m]]
		plan := s.Scenarios[k].Adjusted
		v := acts.Values[index[m]]
		if v == nil && !allZero(plan[:n]) {
			missing++
		}
		for t := range pt.Periods {
			tp.Baseline[t] += s.Baseline[t]
			adjusted[t] += plan[t]
		}
		for t := range actual {
			if v != nil {
				actual[t] += v[t]
			}
		}
	}
	if missing > 0 {
		return nil, fmt.Sprintf("%s is not tracked: %d of its %d series %s no actuals (and a plan other than zero); its variance is that of all of them", rs.Label(), missing, len(rs.Members), hasHave(missing)), nil
	}
	tp.Scenarios = []PlanLine{{Name: scen, Adjusted: adjusted}}
	if !(rs.Var > 0) {
		return nil, fmt.Sprintf("%s is not tracked: the variance of its sum is %v, so there is no error scale", rs.Label(), rs.Var), nil
	}
	tr, err := tp.Track(scen, actual, cfg)
	if err != nil {
		return nil, "", err
	}
	return &RollupTracking{RollupScale: rs, Plan: tp, Tracking: tr}, "", nil
}

// isAre and hasHave are the verbs for a count of series.
func isAre(n int) string {
	if n == 1 {
		return "is"
	}
	return "are"
}

func hasHave(n int) string {
	if n == 1 {
		return "has"
	}
	return "have"
}

// allZero reports whether every value of v is 0.
func allZero(v []float64) bool {
	for _, x := range v {
		if x != 0 {
			return false
		}
	}
	return true
}

// shortList joins the first three names, with "..." after them when there
// are more.
func shortList(names []string) string {
	const shown = 3
	s := strings.Join(names[:min(shown, len(names))], ", ")
	if len(names) > shown {
		s += ", ..."
	}
	return s
}

// Matching returns the names of the series, then the labels of the
// roll-ups, whose latest verdict is one of verdicts.
func (t *PortfolioTracking) Matching(verdicts []forecast.Verdict) []string {
	var out []string
	hit := func(tr *Tracking) bool {
		_, p := tr.Latest()
		for _, v := range verdicts {
			if p.Verdict == v {
				return true
			}
		}
		return false
	}
	for _, s := range t.Series {
		if hit(s.Tracking) {
			out = append(out, s.Plan.Series)
		}
	}
	for _, r := range t.Rollups {
		if hit(r.Tracking) {
			out = append(out, r.Label())
		}
	}
	return out
}
