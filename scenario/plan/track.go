package plan

import (
	"bytes"
	"errors"
	"fmt"
	"forelay/scenario"
	"forelay/scenario/data"
	"io"
	"math"
	"os"
	"slices"
	"strings"

	"forelay/forecast"
)

// Errors of tracking, matched with errors.Is.
var (
	// ErrOffPlan: an actual falls on a period the plan does not cover:
	// inside the history, beyond the horizon, or (for weeks) on a week
	// that starts on another day than the plan's weeks.
	ErrOffPlan = errors.New("not a plan period")
	// ErrScenarioChoice: the scenario asked for is not in the plan, or
	// none was asked for and the plan has several, none called "plan".
	ErrScenarioChoice = errors.New("no such scenario")
	// ErrTrackPlan: a TrackPlan is not usable: lengths that do not match
	// its periods, periods that do not follow each other, or an in-sample
	// MAD or MSE that is not a positive number.
	ErrTrackPlan = errors.New("plan unusable for tracking")
)

// A TrackPlan is what tracking needs of a plan: its periods, the baseline
// and each scenario's adjusted plan on them, and the baseline's in-sample
// error, which sets the starting MAD of the tracking signal and the sigma
// of the control chart. Plan.TrackPlan takes it from a built plan; a
// command may also fill it from a saved plan file.
type TrackPlan struct {
	// Name is the plan's name and Units the unit label (empty: none);
	// both are for display only.
	Name, Units string
	// Series is the name of the planned series; the actuals must hold a
	// series of that name.
	Series string
	// HistoryEnd is the last period of the history the plan was fitted
	// to; Periods follow it, one after the other.
	HistoryEnd forecast.Period
	Periods    []forecast.Period
	// Baseline is the baseline forecast per period.
	Baseline []float64
	// Scenarios are the adjusted plans, in file order.
	Scenarios []PlanLine
	// MAD and MSE are the baseline's one-step in-sample mean absolute and
	// mean squared errors over the (cleaned) history.
	MAD, MSE float64
}

// A PlanLine is one scenario's adjusted plan, one value per period of its
// TrackPlan.
type PlanLine struct {
	Name     string
	Adjusted []float64
}

// TrackPlan returns what tracking needs of p. The slices are shared with
// p, not copied.
func (p *Plan) TrackPlan() TrackPlan {
	tp := TrackPlan{
		Name: p.File.Plan, Units: p.File.Units, Series: p.History.Name,
		HistoryEnd: p.History.Period(p.History.Len() - 1),
		Periods:    p.Periods, Baseline: p.Baseline,
		MAD: p.Fit.Accuracy.MAD, MSE: p.Fit.Accuracy.MSE,
	}
	for _, sp := range p.Scenarios {
		tp.Scenarios = append(tp.Scenarios, PlanLine{Name: sp.Name, Adjusted: sp.Adjusted})
	}
	return tp
}

// Check reports whether tp can be tracked against. It returns an error
// wrapping ErrTrackPlan when there are no periods or no scenarios, when
// the periods do not start right after HistoryEnd and follow each other,
// when the baseline or an adjusted plan has a length other than the
// number of periods or a value that is NaN or infinite, or when MAD or
// MSE is not a positive finite number (a history the baseline fits
// exactly leaves nothing to measure new errors against).
func (tp TrackPlan) Check() error {
	bad := func(format string, a ...any) error {
		return fmt.Errorf("%w: "+format, append([]any{ErrTrackPlan}, a...)...)
	}
	n := len(tp.Periods)
	if n == 0 {
		return bad("the plan has no periods")
	}
	if len(tp.Scenarios) == 0 {
		return bad("the plan has no scenarios")
	}
	for i, p := range tp.Periods {
		want := tp.HistoryEnd.Add(i + 1)
		if !samePeriod(p, want) {
			return bad("period %d is %s; want %s (the periods follow the history, which ends %s)", i+1, p, want, tp.HistoryEnd)
		}
	}
	check := func(what string, v []float64) error {
		if len(v) != n {
			return bad("%s has %d values for %d periods", what, len(v), n)
		}
		for i, x := range v {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return bad("%s for %s is %v", what, tp.Periods[i], x)
			}
		}
		return nil
	}
	if err := check("the baseline", tp.Baseline); err != nil {
		return err
	}
	for _, s := range tp.Scenarios {
		if err := check(fmt.Sprintf("scenario %q", s.Name), s.Adjusted); err != nil {
			return err
		}
	}
	for _, m := range []struct {
		name string
		v    float64
	}{{"MAD", tp.MAD}, {"MSE", tp.MSE}} {
		if !(m.v > 0) || math.IsInf(m.v, 1) {
			return bad("the baseline's in-sample %s is %v; tracking needs a positive number (does the baseline fit the history exactly?)", m.name, m.v)
		}
	}
	return nil
}

// Choose returns the scenario called name. An empty name picks the only
// scenario when there is one, else the scenario called "plan" (DefaultCase)
// when there is one. Otherwise the error wraps ErrScenarioChoice and lists
// the scenario names.
func (tp TrackPlan) Choose(name string) (PlanLine, error) {
	names := make([]string, len(tp.Scenarios))
	for i, s := range tp.Scenarios {
		if s.Name == name || name == "" && len(tp.Scenarios) == 1 {
			return s, nil
		}
		names[i] = s.Name
	}
	list := strings.Join(names, ", ")
	if name != "" {
		return PlanLine{}, fmt.Errorf("%w %q; the plan has %s", ErrScenarioChoice, name, list)
	}
	for _, s := range tp.Scenarios {
		if s.Name == scenario.DefaultCase {
			return s, nil
		}
	}
	return PlanLine{}, fmt.Errorf("%w chosen: the plan has %d scenarios (%s) and none is called %q; name one",
		ErrScenarioChoice, len(tp.Scenarios), list, scenario.DefaultCase)
}

// ReadActuals reads new actuals of the planned series from r, a CSV file
// in one of the history layouts (see data.ReadHistory), and returns
// them aligned with the plan: actual[i] belongs to tp.Periods[i]. The name
// is used in error messages only.
//
// The actuals must start at the first plan period and run without gaps,
// and may stop at any period up to the last one: the periods 1 to n of
// the plan are tracked, n = len(actual). Labels are read in the plan's
// frequency (dates label weeks when the plan is weekly).
//
// Every error about the file's content is a *data.ParseError naming
// the file and, where there is one, the line and column of the row at
// fault, for example
//
//	actuals.csv:3:1: period: not a plan period: 2026-09 is inside the history (which ends 2026-10); track only periods after it
//
// Its Err wraps one of data.ReadHistory's sentinels for a malformed
// file (a value cell is a plain decimal number, see data.ParseDecimal:
// 1_000 wraps data.ErrNotDecimal, NaN or an infinity
// data.ErrNotFinite, never a gap), data.ErrNoSeries when the planned series is missing (the
// message lists the series found), forecast.ErrBadPeriod when the labels
// have another frequency than the plan, ErrOffPlan for a period inside
// the history or beyond the horizon, and data.ErrGap when the actuals
// start after the first plan period or skip a period (an empty cell
// counts as a skipped period). An error from r is returned as it is, and
// one wrapping ErrTrackPlan if tp fails Check.
func (tp TrackPlan) ReadActuals(r io.Reader, name string) ([]float64, error) {
	return tp.readActualsAs(r, name, data.Format{})
}

// readActualsAs is ReadActuals with the file read in format.
func (tp TrackPlan) readActualsAs(r io.Reader, name string, format data.Format) ([]float64, error) {
	if err := tp.Check(); err != nil {
		return nil, err
	}
	src, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	af, err := readActuals(src, name, format, tp.Periods[0].Freq, nil, tp.Series)
	if err != nil {
		return nil, err
	}
	s, ok := af.byName[tp.Series]
	if !ok {
		names := make([]string, len(af.h.Series))
		for i, c := range af.h.Series {
			names[i] = fmt.Sprintf("%q", c.Name)
		}
		return nil, af.finder(tp.Series).errHeader(fmt.Errorf("%w: the plan's series %q is not in the file (it has %s)",
			data.ErrNoSeries, tp.Series, strings.Join(names, ", ")))
	}
	return af.align(tp, s)
}

// An actualsFile is a file of actuals read once, in the plan's frequency,
// with what aligning each of its series needs.
type actualsFile struct {
	name   string
	format data.Format
	src    []byte
	key    []string
	h      *data.History
	// byName indexes the series of h by name; filled lists the values the
	// reader filled in, by series.
	byName map[string]forecast.Series
	filled map[string][]data.Filled
}

// readActuals reads src, a history file named name, with gaps filled (so
// that they can be named per series) and key naming the series of a long
// file when its header has the key's columns (otherwise the file is read
// without it: wide, or long with a series column). The labels are read in the frequency they
// give; dates are read again as weeks when freq is weekly. An error about
// the frequency points at the first row of series ("" for any series).
func readActuals(src []byte, name string, format data.Format, freq forecast.Frequency, key []string, series string) (*actualsFile, error) {
	opt := data.ReadOptions{Fill: data.FillZero, Format: format}
	if hasColumns(src, name, format, key) {
		opt.Key = key
	}
	h, err := data.ReadHistory(bytes.NewReader(src), name, opt)
	if err != nil && opt.Key == nil && len(key) > 0 && errors.Is(err, data.ErrMissingColumn) {
		// Neither wide nor long with a series column: say what a file
		// with the key needs.
		if _, kerr := data.ReadHistory(bytes.NewReader(src), name, data.ReadOptions{Fill: data.FillZero, Key: key, Format: format}); kerr != nil {
			err = kerr
		}
	}
	if err != nil {
		return nil, err
	}
	if got := h.Series[0].Freq(); got != freq {
		if (got == forecast.Daily || got == forecast.Weekly) && (freq == forecast.Daily || freq == forecast.Weekly) {
			opt.Freq = freq
			if h, err = data.ReadHistory(bytes.NewReader(src), name, opt); err != nil {
				return nil, err
			}
		} else {
			loc := newRowFinder(src, name, format, series, key)
			return nil, loc.errAtFirst(fmt.Errorf("%w: the actuals are by %s but the plan is by %s", forecast.ErrBadPeriod, got, freq))
		}
	}
	af := &actualsFile{name: name, format: format, src: src, key: key, h: h,
		byName: make(map[string]forecast.Series, len(h.Series)), filled: map[string][]data.Filled{}}
	for _, s := range h.Series {
		af.byName[s.Name] = s
	}
	for _, fl := range h.Filled {
		af.filled[fl.Series] = append(af.filled[fl.Series], fl)
	}
	return af, nil
}

// hasColumns reports whether the header of src, its first row that is not
// blank, names every column of key (compared as data.ReadHistory does).
// An empty key is always there.
func hasColumns(src []byte, name string, format data.Format, key []string) bool {
	if len(key) == 0 {
		return true
	}
	cr, err := data.OpenRows(bytes.NewReader(src), name, format)
	if err != nil {
		return false
	}
	for {
		rec, err := cr.Read()
		if err != nil {
			return false
		}
		if strings.TrimSpace(strings.Join(rec, "")) == "" {
			continue
		}
		for _, k := range key {
			if !slices.ContainsFunc(rec, func(c string) bool { return strings.EqualFold(strings.TrimSpace(c), strings.TrimSpace(k)) }) {
				return false
			}
		}
		return true
	}
}

// finder returns the rows of series in the file, for error messages.
func (af *actualsFile) finder(series string) *rowFinder {
	return newRowFinder(af.src, af.name, af.format, series, af.key)
}

// align returns the values of s, a series of the file, aligned with the
// periods of tp (only its HistoryEnd and Periods are read), or the errors
// ReadActuals documents.
func (af *actualsFile) align(tp TrackPlan, s forecast.Series) ([]float64, error) {
	first, last := tp.Periods[0], tp.Periods[len(tp.Periods)-1]
	start := s.Start
	loc := func() *rowFinder { return af.finder(s.Name) }
	switch {
	case !start.Start().After(tp.HistoryEnd.Start()):
		return nil, loc().errAt(start, fmt.Errorf("%w: %s is inside the history (which ends %s); track only periods after it",
			ErrOffPlan, start, tp.HistoryEnd))
	case start.Start().Before(first.Start()):
		// Only weeks starting on another weekday get here.
		return nil, loc().errAt(start, fmt.Errorf("%w: the week %s does not start on the day the plan's weeks start (the first is %s)",
			ErrOffPlan, start, first))
	case !samePeriod(start, first):
		k := start.Sub(first)
		if !samePeriod(first.Add(k), start) {
			return nil, loc().errAt(start, fmt.Errorf("%w: the week %s does not start on the day the plan's weeks start (the first is %s)",
				ErrOffPlan, start, first))
		}
		return nil, loc().errAt(start, fmt.Errorf("%w: the actuals start at %s but the plan at %s; actuals must start at the first plan period and run without gaps",
			data.ErrGap, start, first))
	}
	if fills := af.filled[s.Name]; len(fills) > 0 {
		fl, rows := fills[0], loc()
		if fl.Line > 0 {
			return nil, rows.errAt(fl.Period, fmt.Errorf("%w: no actual for %s (its cell is empty); actuals must run without gaps from the first plan period",
				data.ErrGap, fl.Period))
		}
		next := fl.Period.Add(1)
		for k := s.Index(next); k < s.Len(); k++ {
			if rows.line(s.Period(k)) > 0 {
				next = s.Period(k)
				break
			}
		}
		return nil, rows.errAt(next, fmt.Errorf("%w: no actual for %s (no row before %s); actuals must run without gaps from the first plan period",
			data.ErrGap, fl.Period, next))
	}
	if n := s.Len(); n > len(tp.Periods) {
		beyond := first.Add(len(tp.Periods))
		return nil, loc().errAt(beyond, fmt.Errorf("%w: %s is beyond the plan's horizon (the plan ends %s)", ErrOffPlan, beyond, last))
	}
	return append([]float64(nil), s.Values...), nil
}

// samePeriod reports whether a and b are the same period, whatever their
// label form (an ISO week and the date of its Monday are the same week).
func samePeriod(a, b forecast.Period) bool {
	return a.Freq == b.Freq && a.Start().Equal(b.Start())
}

// A rowFinder finds the line of a period's row in a history file that
// data.ReadHistory has already accepted, for error messages.
type rowFinder struct {
	file       string
	sheet      string
	headerLine int
	firstLine  int
	rows       []foundRow
}

type foundRow struct {
	label     string
	line, col int
}

// newRowFinder finds the rows of series ("" for every series) in src; key
// names the columns that make a series' name in a long file (nil: the
// series column).
func newRowFinder(src []byte, file string, format data.Format, series string, key []string) *rowFinder {
	rf := &rowFinder{file: file}
	cr, err := data.OpenRows(bytes.NewReader(src), file, format)
	if err != nil {
		return rf // not reached: the file was read before
	}
	rf.sheet = cr.Sheet
	periodCol := 0
	var seriesCols []int
	for {
		rec, err := cr.Read()
		if err != nil {
			break
		}
		if strings.TrimSpace(strings.Join(rec, "")) == "" {
			continue
		}
		if rf.headerLine == 0 {
			rf.headerLine, _ = cr.FieldPos(0)
			periodCol, seriesCols = rowColumns(rec, key)
			continue
		}
		if periodCol >= len(rec) || slices.ContainsFunc(seriesCols, func(c int) bool { return c >= len(rec) }) {
			continue
		}
		if series != "" && seriesCols != nil && rowSeries(rec, seriesCols) != series {
			continue
		}
		line, col := cr.FieldPos(periodCol)
		if rf.firstLine == 0 {
			rf.firstLine = line
		}
		rf.rows = append(rf.rows, foundRow{label: strings.TrimSpace(rec[periodCol]), line: line, col: col})
	}
	return rf
}

// rowColumns returns, by the layout rule of data.ReadHistory, the period
// column of a header and the columns that name a row's series: the key
// columns, or the series column of a long file, or none for a wide file.
func rowColumns(head, key []string) (period int, series []int) {
	at := map[string]int{}
	for i, c := range head {
		k := strings.ToLower(strings.TrimSpace(c))
		if _, ok := at[k]; !ok {
			at[k] = i
		}
	}
	_, hasValue := at["value"]
	pc, hasPeriod := at["period"]
	if len(key) > 0 {
		for _, k := range key {
			series = append(series, at[strings.ToLower(strings.TrimSpace(k))])
		}
		return pc, series
	}
	if sc, hasSeries := at["series"]; hasSeries && hasPeriod && hasValue {
		return pc, []int{sc}
	}
	return 0, nil
}

// rowSeries is the name of a row's series: its cells in cols, trimmed and
// joined by "/".
func rowSeries(rec []string, cols []int) string {
	parts := make([]string, len(cols))
	for i, c := range cols {
		parts[i] = strings.TrimSpace(rec[c])
	}
	return strings.Join(parts, "/")
}

// line returns the line of p's row, or 0 when there is none.
func (rf *rowFinder) line(p forecast.Period) int {
	l, _ := rf.pos(p)
	return l
}

func (rf *rowFinder) pos(p forecast.Period) (line, col int) {
	for _, r := range rf.rows {
		q, err := forecast.ParsePeriod(r.label, p.Freq)
		if err == nil && samePeriod(p, q) {
			return r.line, r.col
		}
	}
	return 0, 0
}

// errAt returns a ParseError at the row of p (no line when it has none).
func (rf *rowFinder) errAt(p forecast.Period, err error) error {
	line, col := rf.pos(p)
	return &data.ParseError{File: rf.file, Sheet: rf.sheet, Line: line, Column: col, Field: "period", Err: err}
}

// errHeader returns a ParseError at the header row.
func (rf *rowFinder) errHeader(err error) error {
	return &data.ParseError{File: rf.file, Sheet: rf.sheet, Line: rf.headerLine, Column: 1, Err: err}
}

// errAtFirst returns a ParseError at the first data row.
func (rf *rowFinder) errAtFirst(err error) error {
	col := 0
	if rf.firstLine > 0 {
		col = rf.rows[0].col
	}
	return &data.ParseError{File: rf.file, Sheet: rf.sheet, Line: rf.firstLine, Column: col, Field: "period", Err: err}
}

// Tracking is the result of following actuals against one scenario of a
// plan.
type Tracking struct {
	// Scenario is the scenario tracked.
	Scenario string
	// Periods are the tracked periods, the first len(Points) of the plan.
	Periods []forecast.Period
	// Baseline is the baseline forecast on the tracked periods.
	Baseline []float64
	// Config is the tracking configuration in force, defaults filled in.
	Config forecast.TrackConfig
	// Limits are the control chart's lines.
	Limits forecast.Limits
	// Points holds one tracked period each (see forecast.Track).
	Points []forecast.TrackPoint
	// ValueAdded compares the adjusted plan with the baseline on the
	// tracked periods (see forecast.ForecastValueAdded).
	ValueAdded forecast.ValueAdded
}

// Track follows actual, the actuals of the first len(actual) plan periods
// (as ReadActuals returns them), against the scenario called name (chosen
// as Choose does). It fills cfg.InitialMAD and cfg.MSE from tp.MAD and
// tp.MSE when they are zero, runs forecast.Track on the actuals and the
// scenario's adjusted plan, and forecast.ForecastValueAdded on the
// actuals, the adjusted plan and the baseline.
//
// It returns an error wrapping ErrTrackPlan if tp fails Check, one
// wrapping ErrScenarioChoice from Choose, one wrapping forecast.ErrTooShort
// for no actuals, one wrapping ErrOffPlan for more actuals than periods,
// one wrapping forecast.ErrEmptyCell for a NaN or infinite actual, and one
// wrapping forecast.ErrBadSetting for a cfg out of range (see
// forecast.TrackConfig.Resolved).
func (tp TrackPlan) Track(name string, actual []float64, cfg forecast.TrackConfig) (*Tracking, error) {
	if err := tp.Check(); err != nil {
		return nil, err
	}
	line, err := tp.Choose(name)
	if err != nil {
		return nil, err
	}
	n := len(actual)
	if n == 0 {
		return nil, fmt.Errorf("%w: no actuals to track", forecast.ErrTooShort)
	}
	if n > len(tp.Periods) {
		return nil, fmt.Errorf("%w: %d actuals for a plan of %d periods", ErrOffPlan, n, len(tp.Periods))
	}
	if cfg.InitialMAD == 0 {
		cfg.InitialMAD = tp.MAD
	}
	if cfg.MSE == 0 {
		cfg.MSE = tp.MSE
	}
	rc, err := cfg.Resolved()
	if err != nil {
		return nil, err
	}
	plan := line.Adjusted[:n]
	pts, err := forecast.Track(actual, plan, rc)
	if err != nil {
		return nil, err
	}
	va, err := forecast.ForecastValueAdded(actual, plan, tp.Baseline[:n])
	if err != nil {
		return nil, err
	}
	return &Tracking{
		Scenario: line.Name, Periods: append([]forecast.Period(nil), tp.Periods[:n]...),
		Baseline: append([]float64(nil), tp.Baseline[:n]...),
		Config:   rc, Limits: forecast.ControlLimits(rc.MSE, rc.Z),
		Points: pts, ValueAdded: va,
	}, nil
}

// Unchanged reports whether the scenario's adjusted plan is the baseline
// on every tracked period (its events change nothing there).
func (t *Tracking) Unchanged() bool {
	for i, p := range t.Points {
		if p.Plan != t.Baseline[i] {
			return false
		}
	}
	return true
}

// Latest returns the last tracked period and its point.
func (t *Tracking) Latest() (forecast.Period, forecast.TrackPoint) {
	n := len(t.Points) - 1
	return t.Periods[n], t.Points[n]
}

// ReadActualsFile is ReadActuals of the file at path, a CSV file or a
// workbook read in format, under the size limits.
func (tp TrackPlan) ReadActualsFile(path string, format data.Format, limits data.SizeLimits) ([]float64, error) {
	fh, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer fh.Close()
	return tp.readActualsAs(data.BoundedReader(fh, path, limits), path, format)
}
