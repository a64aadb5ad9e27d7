package scenario

import (
	"fmt"

	"forelay/forecast"
	"forelay/scenario/data"
)

// A Pos is a place in a scenario file. Line and Column are 1-based; Column
// counts bytes. The zero Pos means "unknown" (a value built in code).
type Pos struct {
	Line, Column int
	// File is the file the position is in when it is not the scenario
	// file itself: the events file (File.EventsFile) for the events read
	// from it. Empty means the scenario file.
	File string
	// Sheet names the sheet when File is a workbook; Line is then the row
	// and Column the column (1 for A).
	Sheet string
}

// String prints "line:column".
func (p Pos) String() string { return fmt.Sprintf("%d:%d", p.Line, p.Column) }

// errorIn returns err as a *data.ParseError at p, in file unless p names
// its own file (an events file).
func (p Pos) errorIn(file, field string, err error) *data.ParseError {
	if p.File != "" {
		file = p.File
	}
	return &data.ParseError{File: file, Sheet: p.Sheet, Line: p.Line, Column: p.Column, Field: field, Err: err}
}

// A File is a decoded and validated scenario file. Parse and Load fill
// every default, so the zero values described on the fields only matter for
// Files built in code. Once the history is read, File.Resolve makes the
// checks that depend on it.
//
// The history reference, the baseline settings and each event sit in their
// own structs so that a later version can hold several histories and
// events aimed at one series among many without changing these types.
type File struct {
	// Path is the file's path as given to Load or Parse; Dir is its
	// directory, against which relative paths in the file are resolved.
	Path, Dir string

	// Plan is the plan's name, used in outputs: lower-case letters,
	// digits and hyphens.
	Plan string

	// History says where the history comes from.
	History HistoryRef

	// Horizon is the number of periods to plan, at least 1.
	Horizon int

	// Baseline holds the settings of the baseline fit.
	Baseline Baseline

	// Bands holds the settings of the error bands.
	Bands Bands

	// Units is an optional label for the quantity (litres, cases); empty
	// means none.
	Units string

	// Events are the events in file order: those of the events key, then
	// those of the events file.
	Events []*Event

	// EventsFile is the table of events (a CSV file or a workbook) the
	// file names under events-file, resolved against Dir; empty when
	// none. Its events are in Events, their positions (Event.Pos and
	// the positions of their values) in it.
	EventsFile string
	// EventsFormat is how the events file is read: the sheet of a
	// workbook (empty: the first) and the decimal mark of a CSV file
	// (events-file's sheet and decimal keys).
	EventsFormat data.Format

	// Scenarios are the scenarios the file names, in file order; nil
	// when the file names none (see Cases).
	Scenarios []Case

	// Capacity is the optional capacity limit; nil when not given. It is
	// shorthand for one resource over every series with a per-unit of 1
	// (see AllResources), and may not stand together with Resources.
	Capacity *Capacity

	// Resources are the resources the file lists (production lines,
	// storage, crews), in file order; nil when it lists none.
	Resources []Resource

	// Production is the optional production setting; nil when not given.
	Production *Production

	// Limits are the limits the file was read under; they bound the files
	// it names too.
	Limits Limits

	// pos maps each decoded key path (as it appears in error messages) to
	// the position of its value, for checks made after decoding.
	pos map[string]Pos
}

// HistoryRef says where a plan's history comes from.
type HistoryRef struct {
	// File is the history CSV, resolved against the scenario file's
	// directory when relative.
	File string
	// Series names the series to use when history.series is one name
	// without a wildcard; empty means the file's only series (when Select
	// is nil too).
	Series string
	// Select holds the entries of history.series when it is a list, or one
	// text with a "*": series names and patterns (see package
	// scenario/series), each with its position. The series selected are
	// those any entry matches; each entry must match at least one.
	Select []Selector
	// Key names the columns of a long history whose values, joined by
	// "/", name each series (data.ReadOptions.Key); nil reads the series
	// column.
	Key []string
	// Levels names the levels of the series names, widest first; nil
	// means level1, level2, and so on. When given, every selected name
	// has as many levels.
	Levels []string
	// Period is the history's frequency; FreqUnknown means "infer it from
	// the labels" (File.Resolve then sets it to the inferred one).
	Period forecast.Frequency
	// Fill is what to do with gaps: data.FillNone (gaps are errors, the
	// default), FillZero or FillInterpolate.
	Fill data.FillMode
	// Sheet names the sheet to read when the history is a workbook;
	// empty reads the first one.
	Sheet string
	// Decimal is the decimal mark of a CSV history (data.DecimalComma
	// for 12,5); data.DecimalPoint by default.
	Decimal data.Decimal
	// Pos is where the history key stands.
	Pos Pos
}

// A Selector is one entry of history.series: a series name or a pattern,
// and where it stands.
type Selector struct {
	Pattern string
	Pos     Pos
}

// Baseline holds the settings of the baseline fit, the options of the fit
// command.
type Baseline struct {
	// Method is the baseline method; Parse sets Auto when none is given.
	Method forecast.Method
	// Config holds the method's settings (season, fixed parameters,
	// window, weights, dummies, damped).
	Config forecast.Config
	// Metric ranks methods and backtests (MAD by default).
	Metric forecast.Metric
	// Select is how auto picks a method (by backtest by default, or AICc).
	Select forecast.Selection
	// MSEDivisor is the divisor of the mean squared error (n-1 by
	// default, or n).
	MSEDivisor forecast.Divisor
	// Refit refits the model at each backtest origin when true.
	Refit bool
	// Holdout is the number of backtest periods; zero means the fit
	// command's default.
	Holdout int
	// Pos is where the baseline key stands (zero when not given).
	Pos Pos
}

// Bands holds the settings of the error bands around the plan.
type Bands struct {
	// Z is the multiple of the forecast error's standard deviation the
	// bands reach. Parse derives it from Coverage when that is given,
	//     Z = Φ⁻¹((1 + Coverage)/2),
	// and sets 2 when neither is given.
	Z float64
	// Coverage is the share of outcomes the bands should hold under a
	// normal error, in (0, 1); when Z was given Parse sets
	//     Coverage = 2Φ(Z) − 1.
	Coverage float64
	// Widen is forecast.Widening (the default: bands widen with the lead
	// time) or forecast.Flat (one width for every period).
	Widen forecast.BandMode
	// From is forecast.Calibrated (the default: the spread at each lead
	// time is measured on the backtest's out-of-sample errors) or
	// forecast.FromModel (the variance the model class implies from its
	// in-sample errors).
	From forecast.BandSource
	// Floor is the least demand can be: Build clips the adjusted and
	// risk-weighted plans and both bands at it. Parse sets 0 when the
	// file gives none; nil (the file's "floor: none") means no floor, for
	// a quantity that can be negative such as sales net of returns.
	Floor *float64
	// Pos is where the bands key stands (zero when not given).
	Pos Pos
}

// A Case is one scenario: a name and the events it includes.
type Case struct {
	// Name is the scenario's name: lower-case letters, digits and hyphens.
	Name string
	// Events are the events of the scenario, pointing into File.Events,
	// in the order the scenario lists them.
	Events []*Event
	// Pos is where the scenario's list item stands.
	Pos Pos
}

// DefaultCase is the name of the scenario a file without scenarios gets.
const DefaultCase = "plan"

// Cases returns the file's scenarios or, when it names none, one scenario
// called "plan" holding every event. Wholly past events may be in a case:
// they add nothing to the forecast periods (their profile there is zero).
func (f *File) Cases() []Case {
	if len(f.Scenarios) > 0 {
		return append([]Case(nil), f.Scenarios...)
	}
	return []Case{{Name: DefaultCase, Events: append([]*Event(nil), f.Events...)}}
}

// Event returns the event with the given id, or nil.
func (f *File) Event(id string) *Event {
	for _, e := range f.Events {
		if e.ID == id {
			return e
		}
	}
	return nil
}

// Capacity is the most a plant can make per period, with dated changes.
type Capacity struct {
	// Units is the capacity per period before the first change, > 0.
	Units float64
	// Changes are the later capacity levels, sorted by From, none
	// overlapping another.
	Changes []CapacityChange
	// Pos is where the capacity key stands.
	Pos Pos
}

// A CapacityChange sets a new capacity from a period on.
type CapacityChange struct {
	// From is the first period (or the first day of a coarser label) of
	// the new level.
	From When
	// Units is the new capacity per period, > 0.
	Units float64
	// Pos is where the change's list item stands.
	Pos Pos
}

// At returns the capacity in period p: the Units of the last change whose
// From starts on or before p's first day, or c.Units before any change.
// File.Resolve checks that changes fall on period boundaries.
func (c *Capacity) At(p forecast.Period) float64 {
	u := c.Units
	start := p.Start()
	for _, ch := range c.Changes {
		if ch.From.From.After(start) {
			break
		}
		u = ch.Units
	}
	return u
}

// Production says how the production plan treats the demand plan.
type Production struct {
	// Mode is Follow (the default: production follows the plan) or
	// Frozen (production is held at Plan).
	Mode ProductionMode
	// Plan is an optional production plan CSV, resolved against the
	// scenario file's directory when relative; empty when not given.
	Plan string
	// Pos is where the production key stands.
	Pos Pos
}

// Kind is the kind of an event.
type Kind int

// The kinds of event. KindUnknown is the zero value and is never the kind
// of a parsed event.
const (
	KindUnknown Kind = iota
	// Step is a lasting change of level: a new customer, a lost one.
	Step
	// Pulse is a temporary change over a few periods, possibly paid back
	// afterwards: a promotion, a fair, an outage.
	Pulse
)

var kindNames = [...]string{"unknown", "step", "pulse"}

// String returns the kind's name as written in files: step or pulse.
func (k Kind) String() string {
	if k < 0 || int(k) >= len(kindNames) {
		return fmt.Sprintf("Kind(%d)", int(k))
	}
	return kindNames[k]
}

// Shape is the shape of a step's ramp.
type Shape int

// The ramp shapes. Immediate, the zero value, reaches full size in the first
// period.
const (
	Immediate Shape = iota
	// Linear rises by equal amounts: k/P in the k-th of P ramp periods.
	Linear
	// SCurve rises slowly, then fast, then slowly (see Event.Profile).
	SCurve
)

var shapeNames = [...]string{"immediate", "linear", "s-curve"}

// String returns the shape's name as written in files: immediate, linear
// or s-curve.
func (s Shape) String() string {
	if s < 0 || int(s) >= len(shapeNames) {
		return fmt.Sprintf("Shape(%d)", int(s))
	}
	return shapeNames[s]
}

// An Event is a known future (or past) change of demand.
type Event struct {
	// ID names the event: lower-case letters, digits and hyphens,
	// starting with a letter or digit, unique in the file.
	ID string
	// Kind is Step or Pulse.
	Kind Kind
	// Start is the first period or day of the event.
	Start When
	// End is the last period or day (inclusive) the event applies, valid
	// when HasEnd is true. A step without an end lasts for ever; a pulse
	// without an end lasts Periods periods.
	End    When
	HasEnd bool
	// Periods is a pulse's length in periods of the data when it has no
	// End; Parse sets 1 for a pulse given neither, and 0 for steps.
	Periods int
	// Effect is the size of the event at full strength.
	Effect Effect
	// Ramp is how a step reaches full size; the zero Ramp is immediate.
	Ramp Ramp
	// Probability is the chance the event happens, in [0, 1]. Parse sets
	// 1 when the file gives none. Profile, Contribution and Sigma ignore
	// it: the caller weighs or draws it.
	Probability float64
	// Range, when not nil, is a 90% interval for the effect at full size,
	// in the unit of the effect (units or percent).
	Range *Range
	// Payback, when not nil, is the part of a pulse's lift taken back in
	// the periods after it.
	Payback *Payback
	// Past are earlier occurrences of the same event (same kind and
	// length), written in the same form as Start, to clean out of the
	// history and to learn the effect from.
	Past []When
	// Scope lists the series the event moves, each with its own effect or
	// sharing Effect; nil means the plan's only series (a plan of several
	// series refuses an event without a scope, see File.CheckSeries).
	Scope []ScopeEntry
	// Note is free text.
	Note string
	// Owner names who keeps the event (a sales lead, say), for reports;
	// empty when not given.
	Owner string
	// Pos is where the event's list item stands.
	Pos Pos

	// path is the key path the event's errors start with.
	path string
}

// Effect is the size of an event at full strength: a number of units per
// period, or a percentage of each period's baseline. The zero Effect adds
// nothing.
type Effect struct {
	// Units is the change per period in the plan's units (used when
	// IsPercent is false).
	Units float64
	// Percent is the change in percent of the period's baseline (used
	// when IsPercent is true); 8 means +8%.
	Percent   float64
	IsPercent bool
	// FromPast says the effect is to be learnt from the past occurrences.
	// Until the caller sets Units or Percent (and IsPercent) from them,
	// both are zero and the event contributes nothing.
	FromPast bool
	// Split says how an event's units effect is shared among the series of
	// its scope that have no effect of their own: SplitNone (the zero
	// value) gives each series the full effect, SplitBaseline divides it in
	// proportion to each series' baseline over the event's span, and
	// SplitEqual divides it evenly. Percent effects always apply to each
	// series, so Split is SplitNone for them.
	Split Split
}

// Value returns the effect's number in its own unit: Percent for a percent
// effect, Units otherwise.
func (ef Effect) Value() float64 {
	if ef.IsPercent {
		return ef.Percent
	}
	return ef.Units
}

// Ramp is how a step grows to full size.
type Ramp struct {
	// Periods is the ramp's length P in periods of the data; 0 (or an
	// Immediate shape) means full size at once.
	Periods int
	// Shape is the ramp's shape; the zero value is Immediate.
	Shape Shape
}

// Range is a 90% interval for an event's effect at full size.
type Range struct {
	Low, High float64
}

// Payback is the part of a pulse's lift taken back after it.
type Payback struct {
	// Share is the fraction of the pulse's total lift in units taken
	// back, in [0, 1] (see Event.Contribution): for a percent pulse the
	// payback is a number of units, not a percentage of the payback
	// periods' baseline.
	Share float64
	// Periods is the number of periods after the pulse over which the
	// payback is spread evenly, at least 1.
	Periods int
}

// ProductionMode says whether production follows the plan or is held.
type ProductionMode int

// The production modes. Follow is the zero value and the default.
const (
	// Follow: production follows the adjusted plan.
	Follow ProductionMode = iota
	// Frozen: production is held at the previous plan.
	Frozen
)

// String returns follow or frozen, the words the scenario file uses.
func (m ProductionMode) String() string {
	if m == Frozen {
		return "frozen"
	}
	return "follow"
}

// ParseProductionMode reads follow or frozen; "" gives Follow.
func ParseProductionMode(s string) (ProductionMode, error) {
	switch s {
	case "", "follow":
		return Follow, nil
	case "frozen":
		return Frozen, nil
	}
	return Follow, fmt.Errorf("unknown production mode %q (want follow or frozen)", s)
}

// ValueError returns the error of a value found wrong after decoding (by a
// check that needs other files): a *data.ParseError at the position of
// key's value, or at when key was not given, wrapping ErrValue.
func (f *File) ValueError(key string, at Pos, format string, args ...any) error {
	if q, ok := f.pos[key]; ok {
		at = q
	}
	return at.errorIn(f.Path, key, &problem{kind: ErrValue, msg: fmt.Sprintf(format, args...)})
}

// Spec returns the forecast settings of the file's baseline block.
func (f *File) Spec() forecast.Spec {
	b := f.Baseline
	return forecast.Spec{Method: b.Method, Config: b.Config, Holdout: b.Holdout, Refit: b.Refit, Horizon: f.Horizon,
		Metric: b.Metric, Select: b.Select, Divisor: b.MSEDivisor}
}

// ErrorAt returns err as a *data.ParseError at position p of the file,
// naming field.
func (f *File) ErrorAt(p Pos, field string, err error) error {
	return p.errorIn(f.Path, field, err)
}
