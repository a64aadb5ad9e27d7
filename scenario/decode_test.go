package scenario

import (
	"errors"
	"fmt"
	"forelay/scenario/data"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"testing/iotest"

	"forelay/forecast"
)

// marked removes the § marker from src and returns the text with the
// 1-based line and byte column where the marker stood (the encoding/csv
// test trick).
func marked(src string) (text string, line, col int) {
	i := strings.Index(src, "§")
	if i < 0 {
		panic("no § marker in test input")
	}
	before := src[:i]
	line = strings.Count(before, "\n") + 1
	col = i - strings.LastIndex(before, "\n")
	return before + src[i+len("§"):], line, col
}

// head is the smallest valid start of a file; tests append to it.
const head = "plan: p\nhistory: {file: h.csv}\nhorizon: 12\n"

func TestParseErrors(t *testing.T) {
	for _, tc := range []struct {
		name  string
		src   string // § marks the expected position
		noCol bool   // the error has a line but no column
		kind  error
		want  string // fragment of the message, after "file:line:col: "
	}{
		// The file as a whole.
		{"syntax", "plan: p\n§history: [a, b\nhorizon: 3\n", true, ErrSyntax, "did not find expected"},
		{"unclosed flow mapping", "plan: p\n§history: {file: h.csv\nhorizon: 3\n", true, ErrSyntax, "did not find expected ',' or '}'"},
		{"list item out of line", "plan: p\nhorizon: 3\nevents:\n  - a\n§ - b\n", true, ErrSyntax, "did not find expected key"},
		{"tab indent", "plan: p\nhistory:\n§\tfile: h.csv\n", true, ErrSyntax, "found character that cannot start any token"},
		{"not a mapping", "§- plan\n- horizon\n", false, ErrType, "want a mapping of keys, got a list"},
		{"second document", "plan: p\n§---\nplan: q\n", false, ErrSyntax, "a second YAML document"},
		{"missing plan", "§history: {file: h.csv}\nhorizon: 3\n", false, ErrMissing, "plan: required"},
		{"missing horizon", "§plan: p\nhistory: {file: h.csv}\n", false, ErrMissing, "horizon: required"},
		{"unknown key with hint", head + "§unit: litres\n", false, ErrUnknownKey, "unit: unknown key; did you mean units?"},
		{"unknown key no hint", head + "§colour: red\n", false, ErrUnknownKey, "colour: unknown key"},
		{"key twice", head + "§plan: q\n", false, ErrDuplicate, "plan: key given twice (first on line 1)"},
		{"bad plan name", "plan: §North Plant\nhistory: {file: h.csv}\nhorizon: 3\n", false, ErrValue, `plan: "North Plant" is not a valid plan name`},
		{"plan is a list", "plan: §[a]\nhistory: {file: h.csv}\nhorizon: 3\n", false, ErrType, "plan: want text, got a list"},
		{"horizon text", "plan: p\nhistory: {file: h.csv}\nhorizon: §abc\n", false, ErrType, `horizon: want a whole number, got "abc"`},
		{"horizon fraction", "plan: p\nhistory: {file: h.csv}\nhorizon: §1.5\n", false, ErrType, `horizon: want a whole number, got "1.5"`},
		{"horizon zero", "plan: p\nhistory: {file: h.csv}\nhorizon: §0\n", false, ErrValue, "horizon: must be at least 1, got 0"},
		{"horizon huge", "plan: p\nhistory: {file: h.csv}\nhorizon: §1000000\n", false, ErrValue, "horizon: must be at most 100000, got 1000000"},
		{"pulse periods huge", head + "events:\n  - {id: a, kind: pulse, start: 2027-02, periods: §99999999999}\n", false, ErrValue, `event "a": periods: must be at most 100000`},
		{"horizon empty", "plan: p\nhistory: {file: h.csv}\nhorizon:§\n", false, ErrType, "horizon: want a whole number, got nothing"},
		// history
		{"history file missing", "plan: p\nhistory: §{series: x}\nhorizon: 3\n", false, ErrMissing, "history.file: required"},
		{"history file empty", "plan: p\nhistory: {file: §''}\nhorizon: 3\n", false, ErrValue, "history.file: must not be empty"},
		{"history period", "plan: p\nhistory: {file: h.csv, period: §fortnight}\nhorizon: 3\n", false, ErrValue, `history.period: unknown period "fortnight"`},
		{"history fill", "plan: p\nhistory: {file: h.csv, fill: §zeros}\nhorizon: 3\n", false, ErrValue,
			`history.fill: unknown fill "zeros"; want none, zero or interpolate; did you mean zero?`},
		{"history key", "plan: p\nhistory: {file: h.csv, §seires: x}\nhorizon: 3\n", false, ErrUnknownKey, "history.seires: unknown key; did you mean series?"},
		{"history not a mapping", "plan: p\nhistory: §h.csv\nhorizon: 3\n", false, ErrType, `history: want a mapping of keys, got "h.csv"`},
		// baseline
		{"method unknown", head + "baseline: {method: §holtt}\n", false, ErrValue,
			`baseline.method: unknown method "holtt"; want naive, seasonal-naive, moving-average, weighted-moving-average, ses, holt, damped-holt, holt-winters-additive, holt-winters-multiplicative, linear-trend, croston, sba, combination or auto; did you mean holt?`},
		{"metric unknown", head + "baseline: {metric: §rmse}\n", false, ErrValue, `baseline.metric: unknown metric "rmse"; want mad, mse, mape or mase; did you mean mse?`},
		{"select unknown", head + "baseline: {select: §aic}\n", false, ErrValue, `baseline.select: unknown selection "aic"; want backtest or aicc; did you mean aicc?`},
		{"divisor unknown", head + "baseline: {mse_divisor: §n-2}\n", false, ErrValue, `baseline.mse_divisor: unknown divisor "n-2"`},
		{"alpha above 1", head + "baseline: {alpha: §1.5}\n", false, ErrValue, "baseline.alpha: must be in [0, 1], got 1.5"},
		{"phi zero", head + "baseline: {phi: §0}\n", false, ErrValue, "baseline.phi: must be in (0, 1], got 0"},
		{"season zero", head + "baseline: {season: §0}\n", false, ErrValue, "baseline.season: must be at least 1"},
		{"holdout zero", head + "baseline: {holdout: §0}\n", false, ErrValue, "baseline.holdout: must be at least 1"},
		{"window zero", head + "baseline: {window: §0}\n", false, ErrValue, "baseline.window: must be at least 1"},
		{"weight text", head + "baseline: {weights: [0.2, §x]}\n", false, ErrType, `baseline.weights[1]: want a number, got "x"`},
		{"weight negative", head + "baseline: {weights: [0.2, §-0.1]}\n", false, ErrValue, "baseline.weights[1]: must not be negative"},
		{"weights zero", head + "baseline: {weights: §[0, 0]}\n", false, ErrValue, "baseline.weights: must not all be zero"},
		{"weights empty", head + "baseline: {weights: §[]}\n", false, ErrValue, "baseline.weights: must list at least one weight"},
		{"weights and window", head + "baseline: {window: §3, weights: [1, 2]}\n", false, ErrConflict, "baseline.window: window 3 does not match the 2 weights"},
		{"dummies not bool", head + "baseline: {dummies: §maybe}\n", false, ErrType, `baseline.dummies: want true or false, got "maybe"`},
		{"nan", head + "baseline: {alpha: §.nan}\n", false, ErrValue, `baseline.alpha: want a finite number, got ".nan"`},
		// bands
		{"z and coverage", head + "bands: {z: 2, coverage: §0.9}\n", false, ErrConflict, "bands.coverage: give z or coverage, not both"},
		{"coverage percent", head + "bands: {coverage: §95}\n", false, ErrValue, "bands.coverage: must be between 0 and 1 (0.9 means 90%), got 95"},
		{"coverage one", head + "bands: {coverage: §1}\n", false, ErrValue, "bands.coverage: must be between 0 and 1"},
		{"z zero", head + "bands: {z: §0}\n", false, ErrValue, "bands.z: must be above 0"},
		{"widen", head + "bands: {widen: §linear}\n", false, ErrValue, `bands.widen: unknown widen "linear"; want horizon or flat`},
		{"floor text", head + "bands: {floor: §zero}\n", false, ErrType, `bands.floor: want a number or none, got "zero"`},
		{"floor None", head + "bands: {floor: §None}\n", false, ErrType, `bands.floor: want a number or none, got "None"; did you mean none?`},
		{"floor quoted", head + "bands: {floor: §\"0\"}\n", false, ErrType, `bands.floor: want a number or none, got "0"`},
		{"floor empty", head + "bands: {floor: §~}\n", false, ErrType, `bands.floor: want a number or none, got nothing`},
		// events: structure
		{"events not a list", head + "events: §{id: a}\n", false, ErrType, "events: want a list, got a mapping"},
		{"event not a mapping", head + "events:\n  - §a\n", false, ErrType, `events[0]: want a mapping of keys, got "a"`},
		{"event id missing", head + "events:\n  - §kind: step\n    start: 2027-01\n    effect: {units: 1}\n", false, ErrMissing, "events[0].id: required"},
		{"event kind missing", head + "events:\n  - §id: a\n    start: 2027-01\n", false, ErrMissing, `event "a": kind: required`},
		{"event bad id", head + "events:\n  - id: §Fair Week\n    kind: step\n    start: 2027-01\n", false, ErrValue, `events[0].id: "Fair Week" is not a valid id`},
		{"event id twice", head + "events:\n  - {id: a, kind: step, start: 2027-01}\n  - {id: §a, kind: step, start: 2027-02}\n", false, ErrDuplicate,
			`events[1].id: event id "a" already used on line 5`},
		{"event kind unknown", head + "events:\n  - {id: a, kind: §spike, start: 2027-01}\n", false, ErrValue, `event "a": kind: unknown kind "spike"; want step or pulse`},
		{"event key typo", head + "events:\n  - id: a\n    kind: step\n    start: 2027-01\n    §probabilty: 0.5\n", false, ErrUnknownKey,
			`event "a": probabilty: unknown key; did you mean probability?`},
		{"event key typo after non-ascii", head + "events:\n  - {id: a, kind: step, start: 2027-01, note: \"pré-été\", §perods: 2}\n", false, ErrUnknownKey,
			`event "a": perods: unknown key; did you mean periods?`},
		// events: dates
		{"bad month", head + "events:\n  - {id: a, kind: step, start: §2027-13}\n", false, forecast.ErrBadPeriod, `event "a": start: bad period "2027-13"`},
		{"bad day", head + "events:\n  - {id: a, kind: step, start: §2027-02-30}\n", false, forecast.ErrBadPeriod, `event "a": start: bad period "2027-02-30": no such date`},
		{"date is a list", head + "events:\n  - {id: a, kind: step, start: §[2027-02]}\n", false, ErrType, `event "a": start: want a period label or a date, got a list`},
		{"end before start", head + "events:\n  - {id: a, kind: step, start: 2027-02, end: §2027-01}\n", false, ErrValue, `event "a": end: end 2027-01 is before start 2027-02`},
		{"end day before start", head + "events:\n  - {id: a, kind: step, start: 2027-02, end: §2027-01-31}\n", false, ErrValue, `end 2027-01-31 is before start 2027-02`},
		// events: kind-specific keys
		{"pulse periods and end", head + "events:\n  - {id: a, kind: pulse, start: 2027-02, periods: 2, end: §2027-03, effect: {units: 1}}\n", false, ErrConflict,
			`event "a": end: give periods or end, not both`},
		{"periods on a step", head + "events:\n  - {id: a, kind: step, start: 2027-02, periods: §2}\n", false, ErrValue, `event "a": periods: only a pulse has periods`},
		{"pulse periods zero", head + "events:\n  - {id: a, kind: pulse, start: 2027-02, periods: §0}\n", false, ErrValue, `event "a": periods: must be at least 1`},
		{"ramp on a pulse", head + "events:\n  - {id: a, kind: pulse, start: 2027-02, ramp: §{periods: 2}}\n", false, ErrValue, `event "a": ramp: only a step ramps up`},
		{"payback on a step", head + "events:\n  - {id: a, kind: step, start: 2027-02, payback: §{share: 0.5}}\n", false, ErrValue, `event "a": payback: only a pulse can be paid back`},
		// ramp
		{"ramp periods zero", head + "events:\n  - id: fair-week\n    kind: step\n    start: 2027-02\n    ramp: {periods: §0, shape: linear}\n", false, ErrValue,
			`event "fair-week": ramp.periods: must be at least 1, got 0`},
		{"ramp immediate with periods", head + "events:\n  - {id: a, kind: step, start: 2027-02, ramp: {periods: §2, shape: immediate}}\n", false, ErrConflict,
			`event "a": ramp.periods: an immediate ramp has no periods`},
		{"ramp linear without periods", head + "events:\n  - {id: a, kind: step, start: 2027-02, ramp: §{shape: linear}}\n", false, ErrMissing,
			`event "a": ramp.periods: required for a linear ramp`},
		{"ramp shape typo", head + "events:\n  - {id: a, kind: step, start: 2027-02, ramp: {periods: 2, shape: §scurve}}\n", false, ErrValue,
			`event "a": ramp.shape: unknown ramp shape "scurve"; want immediate, linear or s-curve; did you mean s-curve?`},
		// probability
		{"probability above 1", head + "events:\n  - {id: a, kind: step, start: 2027-02, probability: §1.2}\n", false, ErrValue, `event "a": probability: must be in [0, 1], got 1.2`},
		{"probability negative", head + "events:\n  - {id: a, kind: step, start: 2027-02, probability: §-0.1}\n", false, ErrValue, `event "a": probability: must be in [0, 1], got -0.1`},
		// effect and range
		{"units and percent", head + "events:\n  - id: a\n    kind: step\n    start: 2027-02\n    effect:\n      units: 5\n      percent: §3\n", false, ErrConflict,
			`event "a": effect.percent: give one of units, percent or from: past, not several`},
		{"effect empty", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: §{}}\n", false, ErrMissing, `event "a": effect: give units, percent or from: past`},
		{"effect quoted number", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: §\"35000\"}}\n", false, ErrType,
			`event "a": effect.units: want a number, got "35000"`},
		{"effect text", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: §abc}}\n", false, ErrType, `want a number, got "abc"`},
		{"from past without past", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {from: §past}}\n", false, ErrMissing,
			`event "a": effect.from: from: past needs the past occurrences`},
		{"from past with empty past", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {from: §past}, past: []}\n", false, ErrMissing,
			`event "a": effect.from: from: past needs the past occurrences`},
		{"past on an endless step", head + "events:\n  - {id: a, kind: step, start: 2027-08, effect: {units: 5}, past: §[2025-08]}\n", false, ErrValue,
			`event "a": past: a step without end has no past occurrences`},
		{"from unknown", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {from: §history}}\n", false, ErrValue, `event "a": effect.from: unknown source "history"; want past`},
		{"percent below -100", head + "events:\n  - {id: a, kind: step, start: 2027-08, effect: {percent: §-150}}\n", false, ErrValue, `event "a": effect.percent: must be at least -100`},
		{"range low above high", head + "events:\n  - {id: a, kind: step, start: 2027-08, effect: {units: 5}, range: {low: §9, high: 1}}\n", false, ErrValue,
			`event "a": range.low: low 9 is above high 1`},
		{"range misses effect", head + "events:\n  - {id: a, kind: step, start: 2027-08, effect: {units: 45000}, range: §{low: 25000, high: 42000}}\n", false, ErrValue,
			`event "a": range: 25000 to 42000 does not contain the effect 45000`},
		{"range misses percent", head + "events:\n  - {id: a, kind: step, start: 2027-08, effect: {percent: 8}, range: §{low: 9, high: 12}}\n", false, ErrValue,
			`event "a": range: 9 to 12 does not contain the effect 8`},
		{"range with from past", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {from: past}, past: [2026-08], range: §{low: 1, high: 2}}\n", false, ErrValue,
			`event "a": range: a range needs an effect in units or percent`},
		{"range high missing", head + "events:\n  - {id: a, kind: step, start: 2027-08, effect: {units: 5}, range: §{low: 1}}\n", false, ErrMissing, `event "a": range.high: required`},
		// payback
		{"payback share negative", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}, payback: {share: §-0.5}}\n", false, ErrValue,
			`event "a": payback.share: must be in [0, 1], got -0.5`},
		{"payback share above 1", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}, payback: {share: §1.5, periods: 2}}\n", false, ErrValue,
			`event "a": payback.share: must be in [0, 1], got 1.5`},
		{"payback periods zero", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}, payback: {share: 0.5, periods: §0}}\n", false, ErrValue,
			`event "a": payback.periods: must be at least 1`},
		{"payback share missing", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}, payback: §{periods: 2}}\n", false, ErrMissing,
			`event "a": payback.share: required`},
		// past
		{"past form", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}, past: [2025-08, §2024-08-14]}\n", false, ErrValue,
			`event "a": past[1]: 2024-08-14 is a date but start 2027-08 is a month`},
		{"past after start", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}, past: [§2028-08]}\n", false, ErrValue,
			`event "a": past[0]: past occurrence 2028-08 does not come before start 2027-08`},
		{"past twice", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}, past: [2025-08, §2025-08]}\n", false, ErrDuplicate,
			`event "a": past[1]: 2025-08 is listed twice`},
		{"past not a list", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}, past: §2025-08}\n", false, ErrType,
			`event "a": past: want a list, got "2025-08"`},
		// scenarios
		{"unknown event with hint", head + "events:\n  - {id: fair-week, kind: pulse, start: 2027-08, effect: {units: 5}}\nscenarios:\n  - {name: c, events: [fair-week, §fair-weak]}\n", false, ErrUnknownEvent,
			`scenario "c": events[1]: unknown event "fair-weak"; did you mean fair-week?`},
		{"unknown event no hint", head + "events:\n  - {id: fair-week, kind: pulse, start: 2027-08, effect: {units: 5}}\nscenarios:\n  - {name: c, events: [§storm]}\n", false, ErrUnknownEvent,
			`scenario "c": events[0]: unknown event "storm"`},
		{"event listed twice", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}}\nscenarios:\n  - {name: c, events: [a, §a]}\n", false, ErrDuplicate,
			`scenario "c": events[1]: event "a" is listed twice`},
		{"scenario name twice", head + "scenarios:\n  - {name: c, events: []}\n  - {name: §c, events: []}\n", false, ErrDuplicate,
			`scenarios[1].name: scenario name "c" already used on line 5`},
		{"scenario bad name", head + "scenarios:\n  - {name: §Low Case, events: []}\n", false, ErrValue, `scenarios[0].name: "Low Case" is not a valid scenario name`},
		{"scenario events missing", head + "scenarios:\n  - §{name: c}\n", false, ErrMissing, `scenario "c": events: required`},
		{"scenario events not list", head + "scenarios:\n  - {name: c, events: §a}\n", false, ErrType, `scenario "c": events: want a list, got "a"`},
		// capacity and production
		{"capacity units zero", head + "capacity: {units: §0}\n", false, ErrValue, "capacity.units: must be above 0, got 0"},
		{"capacity units missing", head + "capacity: §{changes: []}\n", false, ErrMissing, "capacity.units: required"},
		{"capacity change units", head + "capacity: {units: 5, changes: [{from: 2027-06, units: §-1}]}\n", false, ErrValue, "capacity.changes[0].units: must be above 0, got -1"},
		{"capacity unsorted", head + "capacity: {units: 5, changes: [{from: 2027-06, units: 6}, {from: §2027-03, units: 7}]}\n", false, ErrValue,
			"capacity.changes[1].from: 2027-03 comes before changes[0] (2027-06); sort the changes by from"},
		{"capacity duplicate", head + "capacity: {units: 5, changes: [{from: 2027-06, units: 6}, {from: §2027-06, units: 7}]}\n", false, ErrDuplicate,
			"capacity.changes[1].from: 2027-06 is the same as changes[0]"},
		{"capacity overlap", head + "capacity: {units: 5, changes: [{from: 2027-Q2, units: 6}, {from: §2027-05, units: 7}]}\n", false, ErrValue,
			"capacity.changes[1].from: 2027-05 overlaps changes[0] (2027-Q2)"},
		{"capacity change key", head + "capacity: {units: 5, changes: [{§form: 2027-06, from: 2027-06, units: 6}]}\n", false, ErrUnknownKey,
			"capacity.changes[0].form: unknown key; did you mean from?"},
		{"production mode", head + "production: {mode: §frozn}\n", false, ErrValue, `production.mode: unknown mode "frozn"; want follow or frozen; did you mean frozen?`},
		// scope
		{"scope not a list", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: §milk/*}\n", false, ErrType, `event "a": scope: want a list, got "milk/*"`},
		{"scope empty", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: §[]}\n", false, ErrValue, `event "a": scope: an empty list; give at least one series name or pattern`},
		{"scope entry not a mapping", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: [§milk]}\n", false, ErrType, `event "a": scope[0]: want a mapping of keys, got "milk"`},
		{"scope series missing", head + "events:\n  - {id: a, kind: step, start: 2027-02, scope: [§{effect: {units: 1}}]}\n", false, ErrMissing, `event "a": scope[0].series: required`},
		{"scope key typo", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: [{series: a, §efect: {units: 2}}]}\n", false, ErrUnknownKey, `event "a": scope[0].efect: unknown key; did you mean effect?`},
		{"scope bad pattern", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: [{series: §milk//x}]}\n", false, ErrValue, `event "a": scope[0].series: bad series pattern: "milk//x" has an empty level`},
		{"scope pattern in a level", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: [{series: §milk**}]}\n", false, ErrValue, `scope[0].series: bad series pattern: "milk**": ** stands for whole levels`},
		{"scope series twice", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: [{series: a/b}, {series: §a/b}]}\n", false, ErrDuplicate, `event "a": scope[1].series: "a/b" is already event "a": scope[0]`},
		{"scope new not bool", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: [{series: a/b, new: §yes please}]}\n", false, ErrType, `event "a": scope[0].new: want true or false, got "yes please"`},
		{"scope new on a pattern", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, scope: [{series: \"milk/*\", new: §true}]}\n", false, ErrValue,
			`event "a": scope[0].new: "milk/*" is a pattern, and new: true creates one series; give the new series' full name`},
		{"scope new with the event's percent", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {percent: 5}, scope: [{series: milk/choc, new: §true}]}\n", false, ErrValue,
			`event "a": scope[0].new: a new series has no baseline, so a percent effect adds nothing to it; give the effect in units`},
		{"scope new sharing a split by baseline", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 5, split: baseline}, scope: [{series: \"milk/*\"}, {series: milk/choc, new: §true}]}\n", false, ErrValue,
			`event "a": scope[1].new: a new series has no baseline, so split: baseline gives it nothing; give the entry its own effect ({units: N}), or use split: equal`},
		{"scope new with its own percent", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 5}, scope: [{series: milk/choc, effect: {percent: 3}, new: §true}]}\n", false, ErrValue,
			`scope[0].new: a new series has no baseline`},
		{"scope entry effect empty", head + "events:\n  - {id: a, kind: step, start: 2027-02, scope: [{series: a, effect: §{}}]}\n", false, ErrMissing, `event "a": scope[0].effect: give units, percent or from: past`},
		{"scope entry effect units and percent", head + "events:\n  - {id: a, kind: step, start: 2027-02, scope: [{series: a, effect: {units: 1, percent: §2}}]}\n", false, ErrConflict,
			`event "a": scope[0].effect.percent: give one of units, percent or from: past, not several`},
		{"scope entry effect below -100", head + "events:\n  - {id: a, kind: step, start: 2027-02, scope: [{series: a, effect: {percent: §-120}}]}\n", false, ErrValue,
			`event "a": scope[0].effect.percent: must be at least -100 (a fall to zero), got -120`},
		{"scope entry effect key typo", head + "events:\n  - {id: a, kind: step, start: 2027-02, scope: [{series: a, effect: {§unit: 4}}]}\n", false, ErrUnknownKey, `event "a": scope[0].effect.unit: unknown key; did you mean units?`},
		{"scope entry from past without past", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, scope: [{series: a, effect: {from: §past}}]}\n", false, ErrMissing,
			`event "a": scope[0].effect.from: from: past needs the event's past occurrences`},
		{"scope entry split", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 9}, scope: [{series: a, effect: {units: 3, split: §equal}}]}\n", false, ErrValue,
			`event "a": scope[0].effect.split: a scope entry's own effect applies in full to every series it matches; give split on the event's effect`},
		// effect.split
		{"split unknown", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 9, split: §equally}, scope: [{series: \"a/*\"}]}\n", false, ErrValue,
			`event "a": effect.split: unknown split "equally"; want baseline or equal; did you mean equal?`},
		{"split with percent", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {percent: 9, split: §baseline}, scope: [{series: \"a/*\"}]}\n", false, ErrValue,
			`event "a": effect.split: percent effects apply to each series in full; leave out split, or give the effect in units`},
		{"split with from past", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {from: past, split: §equal}, past: [2026-08], scope: [{series: \"a/*\"}]}\n", false, ErrValue,
			`event "a": effect.split: split divides an effect in units; give units, or leave out split`},
		{"split without scope", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 9, split: §equal}}\n", false, ErrValue,
			`event "a": effect.split: split divides the effect among the series of the scope; give scope, or leave out split`},
		// resources
		{"resources not a list", head + "resources: §{id: r}\n", false, ErrType, "resources: want a list, got a mapping"},
		{"resources empty", head + "resources: §[]\n", false, ErrValue, "resources: an empty list; give at least one resource, or leave the key out"},
		{"resource not a mapping", head + "resources:\n  - §line-1\n", false, ErrType, `resources[0]: want a mapping of keys, got "line-1"`},
		{"resource id missing", head + "resources:\n  - §{series: \"**\", per-unit: 1}\n", false, ErrMissing, "resources[0].id: required"},
		{"resource bad id", head + "resources:\n  - {id: §Line 1, series: \"**\", per-unit: 1}\n", false, ErrValue, `resources[0].id: "Line 1" is not a valid id`},
		{"resource id twice", head + "resources:\n  - {id: r, series: \"**\", per-unit: 1}\n  - {id: §r, series: \"**\", per-unit: 2}\n", false, ErrDuplicate,
			`resources[1].id: resource id "r" already used on line 5`},
		{"resource series missing", head + "resources:\n  - §{id: r, per-unit: 1}\n", false, ErrMissing, `resource "r": series: required`},
		{"resource bad pattern", head + "resources:\n  - {id: r, series: §milk/, per-unit: 1}\n", false, ErrValue, `resource "r": series: bad series pattern: "milk/" has an empty level`},
		{"resource called total", head + "resources:\n  - {id: §total, series: \"**\", per-unit: 1}\n", false, ErrValue, `resource "total": id: "total" names the sum of every series in the stress outputs; give the resource another id`},
		{"resource per-unit missing", head + "resources:\n  - §{id: r, series: \"**\"}\n", false, ErrMissing, `resource "r": per-unit: required`},
		{"resource per-unit zero", head + "resources:\n  - {id: r, series: \"**\", per-unit: §0}\n", false, ErrValue, `resource "r": per-unit: must be above 0 (the load one unit of demand puts on the resource), got 0`},
		{"resource per-unit negative", head + "resources:\n  - {id: r, series: \"**\", per-unit: §-0.5}\n", false, ErrValue, `resource "r": per-unit: must be above 0`},
		{"resource per-unit text", head + "resources:\n  - {id: r, series: \"**\", per-unit: §\"0.0012\"}\n", false, ErrType, `resource "r": per-unit: want a number, got "0.0012"`},
		{"resource key typo", head + "resources:\n  - {id: r, series: \"**\", per-unit: 1, §per_unit: 2}\n", false, ErrUnknownKey, `resource "r": per_unit: unknown key; did you mean per-unit?`},
		{"resource capacity zero", head + "resources:\n  - {id: r, series: \"**\", per-unit: 1, capacity: {units: §0}}\n", false, ErrValue, `resource "r": capacity.units: must be above 0, got 0`},
		{"resource capacity units missing", head + "resources:\n  - {id: r, series: \"**\", per-unit: 1, capacity: §{changes: []}}\n", false, ErrMissing, `resource "r": capacity.units: required`},
		{"resource capacity unsorted", head + "resources:\n  - {id: r, series: \"**\", per-unit: 1, capacity: {units: 5, changes: [{from: 2027-09, units: 6}, {from: §2027-03, units: 7}]}}\n", false, ErrValue,
			`resource "r": capacity.changes[1].from: 2027-03 comes before changes[0] (2027-09); sort the changes by from`},
		{"resource capacity change units", head + "resources:\n  - {id: r, series: \"**\", per-unit: 1, capacity: {units: 5, changes: [{from: 2027-09, units: §0}]}}\n", false, ErrValue,
			`resource "r": capacity.changes[0].units: must be above 0, got 0`},
		{"capacity beside resources", head + "capacity: §{units: 5}\nresources:\n  - {id: r, series: \"**\", per-unit: 1}\n", false, ErrConflict,
			`capacity: capacity is shorthand for one resource over every series; with resources, list it as one of them`},
		// aliases are followed, and positions are those of the anchored value
		{"alias", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: &e {units: 5}, range: {low: 1, high: 9}}\n  - {id: b, kind: pulse, start: 2027-08, effect: *e, probability: §2}\n", false, ErrValue,
			`event "b": probability: must be in [0, 1], got 2; did you mean 0.02?`},
		// a probability written as a percentage gets a hint; one past 100
		// or below 0 does not
		{"probability percent", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, probability: §60}\n", false, ErrValue,
			`event "a": probability: must be in [0, 1], got 60; did you mean 0.6?`},
		{"probability past 100", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, probability: §150}\n", false, ErrValue,
			`event "a": probability: must be in [0, 1], got 150`},
		{"probability negative", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, probability: §-0.5}\n", false, ErrValue,
			`event "a": probability: must be in [0, 1], got -0.5`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src, line, col := marked(tc.src)
			if tc.noCol {
				col = 0
			}
			f, err := Parse(strings.NewReader(src), "plan.yaml")
			if err == nil {
				t.Fatalf("no error; file %+v", f)
			}
			var pe *data.ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %T %v is no *data.ParseError", err, err)
			}
			if _, ok := err.(*data.ParseError); !ok {
				t.Fatalf("want exactly one problem, got:\n%v", err)
			}
			prefix := fmt.Sprintf("plan.yaml:%d:%d: ", line, col)
			if tc.noCol {
				prefix = fmt.Sprintf("plan.yaml:%d: ", line)
			}
			msg := err.Error()
			if !strings.HasPrefix(msg, prefix) || !strings.Contains(msg, tc.want) {
				t.Errorf("error\n  %s\nwant prefix %q and fragment %q", msg, prefix, tc.want)
			}
			noHint := tc.name == "unknown key no hint" || tc.name == "probability past 100" || tc.name == "probability negative"
			if noHint && strings.Contains(msg, "did you mean") {
				t.Errorf("unexpected hint in %q", msg)
			}
			if !errors.Is(err, tc.kind) {
				t.Errorf("error %v does not wrap %v", err, tc.kind)
			}
		})
	}
}

func TestParseEmpty(t *testing.T) {
	for _, src := range []string{"", "# only a comment\n"} {
		_, err := Parse(strings.NewReader(src), "plan.yaml")
		if !errors.Is(err, ErrMissing) || err.Error() != "plan.yaml: the file is empty" {
			t.Errorf("Parse(%q) error = %v", src, err)
		}
	}
}

func TestParseUnknownAnchor(t *testing.T) {
	// yaml.v3 gives no line for this one.
	_, err := Parse(strings.NewReader("plan: p\nhorizon: *h\n"), "plan.yaml")
	if !errors.Is(err, ErrSyntax) || err.Error() != "plan.yaml: unknown anchor 'h' referenced" {
		t.Errorf("error = %v", err)
	}
}

func TestParseReadError(t *testing.T) {
	boom := errors.New("boom")
	if _, err := Parse(iotest.ErrReader(boom), "plan.yaml"); err != boom {
		t.Errorf("error = %v; want the reader's", err)
	}
	if _, err := Load(filepath.Join(t.TempDir(), "none.yaml")); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("Load of a missing file: error = %v", err)
	}
}

func TestParseSeveralErrors(t *testing.T) {
	// Three problems, given out of order through the scenario link (found
	// last, reported by position).
	src := "plan: p\n" +
		"history: {file: h.csv}\n" +
		"horizon: 0\n" +
		"scenarios:\n" +
		"  - {name: c, events: [ghost]}\n" +
		"events:\n" +
		"  - {id: a, kind: step, start: 2027-02, probabilty: 1}\n"
	_, err := Parse(strings.NewReader(src), "plan.yaml")
	var list ErrorList
	if !errors.As(err, &list) {
		t.Fatalf("error %T %v is no ErrorList", err, err)
	}
	want := "plan.yaml:3:10: horizon: must be at least 1, got 0\n" +
		"plan.yaml:5:24: scenario \"c\": events[0]: unknown event \"ghost\"\n" +
		"plan.yaml:7:41: event \"a\": probabilty: unknown key; did you mean probability?"
	if err.Error() != want {
		t.Errorf("error:\n%s\nwant:\n%s", err, want)
	}
	if !errors.Is(err, ErrUnknownEvent) || !errors.Is(err, ErrUnknownKey) || !errors.Is(err, ErrValue) {
		t.Error("errors.Is does not see the problems of the list")
	}
	var pe *data.ParseError
	if !errors.As(err, &pe) || pe.Line != 3 {
		t.Errorf("errors.As gives %v; want the first problem", pe)
	}
}

func TestParseBOMAndDefaults(t *testing.T) {
	src := "\ufeffplan: p\nhistory: {file: data/h.csv}\nhorizon: 6\nevents:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 5}}\n  - {id: b, kind: step, start: 2027-09, effect: {units: 5}}\n"
	f, err := Parse(strings.NewReader(src), filepath.Join("plans", "p.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	b := f.Baseline
	if f.History.File != filepath.Join("plans", "data", "h.csv") || f.History.Fill != data.FillNone || f.History.Period != forecast.FreqUnknown ||
		b.Method != forecast.Auto || b.Metric != forecast.MetricMAD || b.Select != forecast.SelectBacktest || b.MSEDivisor != forecast.DivisorNMinus1 || b.Refit || b.Holdout != 0 ||
		f.Bands.Widen != forecast.Widening || f.Bands.From != forecast.Calibrated || f.Bands.Floor == nil || *f.Bands.Floor != 0 || f.Capacity != nil || f.Production != nil || f.Units != "" {
		t.Errorf("defaults: %+v", f)
	}
	// Z = 2 by default; coverage 2Φ(2) − 1 = 0.9544997361 (standard normal
	// table: Φ(2) = 0.97725; scipy 1.10.1: 2*norm.cdf(2)-1).
	if f.Bands.Z != 2 || !near(f.Bands.Coverage, 0.9544997361036416, 1e-12) {
		t.Errorf("bands %+v", f.Bands)
	}
	if a := f.Events[0]; a.Periods != 1 || a.Probability != 1 || a.HasEnd || a.Ramp.Shape != Immediate {
		t.Errorf("pulse defaults %+v", a)
	}
	if b := f.Events[1]; b.Periods != 0 || b.Probability != 1 {
		t.Errorf("step defaults %+v", b)
	}
	cases := f.Cases()
	if len(cases) != 1 || cases[0].Name != "plan" || len(cases[0].Events) != 2 || cases[0].Events[1] != f.Events[1] {
		t.Errorf("default cases %+v", cases)
	}
	// Ramp periods alone mean a linear ramp.
	f, err = Parse(strings.NewReader(head+"events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 1}, ramp: {periods: 2}}\n"), "p.yaml")
	if err != nil {
		t.Fatal(err)
	}
	if r := f.Events[0].Ramp; r != (Ramp{Periods: 2, Shape: Linear}) {
		t.Errorf("ramp %+v", r)
	}
}

func TestParseFloor(t *testing.T) {
	for _, tc := range []struct {
		bands string
		want  *float64 // nil: no floor
	}{
		{"", new(float64)},                // default 0 (the file gives no bands)
		{"bands: {z: 2}\n", new(float64)}, // default 0 (bands without floor)
		{"bands: {floor: none}\n", nil},   // no floor
		{"bands: {floor: 'none'}\n", nil}, // quoted, still the word
		{"bands: {floor: -250.5}\n", ptr(-250.5)},
		{"bands: {floor: 1000}\n", ptr(1000)},
	} {
		f, err := Parse(strings.NewReader(head+tc.bands), "p.yaml")
		if err != nil {
			t.Fatalf("%q: %v", tc.bands, err)
		}
		got := f.Bands.Floor
		if (got == nil) != (tc.want == nil) || got != nil && *got != *tc.want {
			show := func(x *float64) string {
				if x == nil {
					return "none"
				}
				return fmt.Sprint(*x)
			}
			t.Errorf("%q: floor %s, want %s", tc.bands, show(got), show(tc.want))
		}
	}
}

func ptr(v float64) *float64 { return &v }

func near(a, b, tol float64) bool { return a-b <= tol && b-a <= tol }
