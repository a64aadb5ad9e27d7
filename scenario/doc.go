// Package scenario reads a planner's scenario file and turns its events into
// period-by-period changes of demand.
//
// A scenario file is one YAML document, a mapping with these keys (a key
// marked required must be given; every other key may be left out and gets
// the default shown):
//
//	plan: north-plant-2027     # required; the plan's name in outputs: a-z, 0-9 and '-', starting with a letter or digit
//	history:                   # required; where the history comes from
//	  file: history.csv        #   required; a history CSV or workbook (.xlsx), relative to the scenario file's directory
//	  series: bottled-l        #   the series to use; may be left out when the file holds one series
//	  period: month            #   day, week, month, quarter or year; default: inferred from the labels
//	  fill: none               #   gaps: none (gaps are errors), zero or interpolate; default none
//	  sheet: demand            #   the sheet of a workbook; default the first
//	  decimal: point           #   a CSV file's decimal mark: point or comma (12,5); default point
//	horizon: 18                # required; periods to plan, at least 1
//	baseline:                  # how the baseline is fitted (the options of the fit command)
//	  method: auto             #   a method name (auto, naive, seasonal-naive, moving-average,
//	                           #   weighted-moving-average, ses, holt, damped-holt,
//	                           #   holt-winters-additive, holt-winters-multiplicative, linear-trend,
//	                           #   croston, sba); default auto
//	  season: 12               #   periods per seasonal cycle, at least 1; default: the frequency's usual one
//	  metric: mad              #   mad, mse, mape or mase; default mad
//	  select: backtest         #   how auto chooses: backtest or aicc; default backtest
//	  alpha: 0.3               #   alpha, beta, gamma in [0, 1] and phi in (0, 1] hold a smoothing
//	                           #   parameter fixed; default: estimated
//	  window: 3                #   moving-average window, at least 1; default 3
//	  weights: [0.2, 0.3, 0.5] #   weighted-moving-average weights, oldest first, not negative, not all 0
//	  dummies: false           #   seasonal dummies for linear-trend
//	  damped: false            #   damped trend for holt-winters-multiplicative
//	  mse_divisor: n-1         #   n-1 or n; default n-1
//	  refit: false             #   refit at every backtest origin
//	  holdout: 12              #   backtest periods, at least 1; default: the fit command's
//	bands:                     # the error bands
//	  z: 2                     #   band half-width in standard deviations, above 0; default 2
//	  coverage: 0.95           #   or the share of outcomes inside, in (0, 1); not both
//	  widen: horizon           #   horizon (bands widen with the lead time) or flat; default horizon
//	  floor: 0                 #   the least demand can be: plans and bands are clipped here;
//	                           #   a number, or none for no floor; default 0
//	units: litres              # a label for tables and charts; default none
//	events: [...]              # the events (see below)
//	events-file: deals.xlsx    # more events from a table, CSV or workbook (see deals.go);
//	                           # or {file: deals.csv, sheet: NAME, decimal: comma}
//	scenarios: [...]           # named sets of events (see below)
//	capacity:                  # a capacity limit per period
//	  units: 540000            #   required; above 0
//	  changes:                 #   later levels, sorted by from, no two in one period
//	    - {from: 2027-06, units: 600000}   # from: a label; units above 0
//	resources: [...]           # what demand loads (see below); not with capacity
//	production:
//	  mode: follow             #   follow (production follows the plan) or frozen; default follow
//	  plan: previous-plan.csv  #   a production plan CSV, relative to the scenario file's directory
//
// Counts of periods (horizon, window, season, holdout, and the periods of
// pulses, ramps and paybacks) may not exceed 100000.
//
// # Dates and labels
//
// Wherever a date goes, a period label or a date may stand: 2027 (a year),
// 2027-Q3 (a quarter), 2027-08 (a month), 2027-W33 (an ISO week, Monday to
// Sunday) or 2027-08-14 (a day). A label stands for all its days; see When.
// A start means the label's first day, an end its last day (ends are
// inclusive). Labels need not match the history's frequency: on monthly
// data an event from 2027-08-14 to 2027-08-23 covers 10 of August's 31
// days and gets 10/31 of its size in August (it is "prorated"). Labels
// coarser than the data are fine for steps and for ends (2028 ends with
// December on monthly data).
//
// # Events
//
// Each item of events is a mapping:
//
//	events:
//	  - id: school-contract       # required; unique; a-z, 0-9 and '-', starting with a letter or digit
//	    kind: step                # required; step (a lasting change) or pulse (a temporary one)
//	    start: 2027-02            # required; a label or a date
//	    end: 2028-01              # the last period or day it applies (steps: default none, for ever)
//	    periods: 1                # pulses only: length in periods of the data; default 1; not with end
//	    effect: {units: 35000}    # size at full strength: {units: N} per period,
//	                              # {percent: P} of each period's baseline (at least -100),
//	                              # or {from: past} (learnt from the past occurrences); exactly one;
//	                              # with units and a scope, split: baseline or equal shares it out
//	    ramp: {periods: 3, shape: linear}  # steps only: shape immediate (default), linear or s-curve;
//	                              # periods (at least 1) is required for linear and s-curve, and
//	                              # alone means linear
//	    probability: 0.7          # in [0, 1] (0.6, not 60); default 1
//	    range: {low: 25000, high: 42000}   # a 90% interval for the effect at full size, in the
//	                              # effect's unit; both required; must contain the effect
//	    payback: {share: 0.5, periods: 2}  # pulses only: the share in [0, 1] (required) of the
//	                              # pulse's total lift in units taken back, spread evenly over
//	                              # the next periods (at least 1; default 1)
//	    past: [2024-08, 2025-08]  # earlier occurrences of the same kind and length, written in
//	                              # the form of start and before it: cleaned out of the history
//	                              # and used to learn the effect (a step needs an end for this)
//	    scope:                    # the series it moves (see below); default: the plan's only one
//	      - {series: "milk/whole-1l/*"}
//	    note: free text
//	    owner: dairy sales        # who keeps the event, for reports
//
// An event needs an effect unless it lies wholly in the past (it is then
// only cleaned out of the history) or it says from: past and lists past
// occurrences. A pulse given by periods covers whole periods of the data,
// so its start (and its past occurrences) must be a label no coarser than
// the data that begins a period; give end instead to prorate a pulse by
// days. A ramp may not be longer than its step. These checks need the
// history and are made by File.Resolve; Parse makes all the others.
//
// Event.Profile and Event.Contribution give the exact arithmetic of steps,
// ramps, pulses and paybacks. A payback takes back a share of the pulse's
// lift in units, also for a percent pulse.
//
// # Scope
//
// In a plan of several series each event lists, under scope, the series
// it moves. An entry is a mapping {series, effect, new}: series (required)
// is a name or a pattern as in history.series and must match a series of
// the plan; effect, when given, is the entry's own effect (units, percent
// or from: past), applied in full to every series the entry matches;
// new: true creates a series without history (one name, not a pattern,
// not a series of the history file, moved by units), whose baseline is zero.
// Entries without an effect share the event's: effect.split: baseline
// divides a units total in proportion to each series' baseline over the
// event's span, split: equal divides it evenly, and without split every
// series gets the full effect. Percent effects always apply per series,
// so split goes with units only, and only on an event with a scope. An
// event reaching the forecast needs an effect unless every scope entry
// has one. In a plan of more than one series an event without a scope is
// an error. The checks against the plan's series are File.CheckSeries'.
//
// # Resources
//
// Each item of resources is a mapping:
//
//	resources:
//	  - id: bottling-1            # required; unique; a-z, 0-9 and '-', starting with a letter or digit
//	    series: "milk/**"         # required; a name or pattern matching series of the plan
//	    per-unit: 0.0012          # required; the load of one unit of demand, above 0
//	    units: line-hours         # a label for the load; default none
//	    capacity: {units: 600, changes: [{from: 2027-09, units: 680}]}  # as the top-level capacity; default none
//
// A resource's load is the sum over its series of per-unit times demand.
// The top-level capacity is shorthand for one resource "capacity" over
// every series with per-unit 1 (File.AllResources); a file gives one or
// the other.
//
// # Scenarios
//
// Each item of scenarios is a mapping {name: committed, events: [fair-week]}
// with a unique name (a-z, 0-9 and '-') and a list of event ids, each
// listed once. Without scenarios the file has one scenario, "plan", with
// every event.
//
// # Errors
//
// Decoding is strict. An unknown key is an error, with a suggestion when a
// known key is close ("probabilty: unknown key; did you mean
// probability?"); so are a key given twice, a value of the wrong type
// (numbers must be YAML numbers, not quoted text) and a value out of range.
// Each problem is a *data.ParseError printed as
//
//	plan.yaml:7:5: event "fair-week": ramp.periods: must be at least 1
//
// with the 1-based line and byte column of the offending value (or key, for
// unknown and missing keys: a missing key is reported where its mapping
// starts) and the key path; an event's path starts with its id, a
// scenario's with its name. All problems found are returned, sorted by
// position: one as a *data.ParseError, several as an ErrorList. The
// errors wrap the sentinels of this package (ErrUnknownKey, ErrType, ...)
// or forecast.ErrBadPeriod.
//
// # Warnings
//
// Input that is legal but almost certainly not meant gives warnings, full
// sentences printed like errors and ending with the fix: an event wholly
// outside the history and the horizon (or a past occurrence wholly before
// the history: Build leaves it out), an event with an effect that
// starts inside the history and is therefore treated as past (with the
// date one year later when that lies in the horizon), and a percent effect
// below 1 in absolute value (File.Lint). Plan.Warnings holds them, then
// those of the floor: demand never goes below bands.floor (0 unless the
// file says otherwise, or none), and an event that pushes a scenario's
// plan below it is named with the periods, the baseline and its effect in
// units.
package scenario
