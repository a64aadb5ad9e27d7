// Package bounds holds the limits of a run: Monte Carlo paths, horizon,
// input file sizes, name lengths, number of events. A limit is checked
// before the work it bounds, and its error names the flag that raises it
// (--limit NAME=N), so that a slip of the keyboard ends in a clear error
// rather than a run that never finishes or fills the memory.
package bounds

import (
	"errors"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/data"
)

// A limit bounds one dimension of a run, so that a typing slip (a horizon
// of 120000 for 12, a billion paths) ends in a clear error instead of a
// run that never finishes or exhausts memory. Every limit can be raised
// with --limit NAME=N.
type limit struct {
	name string
	def  int64
	what string // what the number counts, for help and errors
}

// The limits and their defaults, in the order the help lists them.
var limitTable = []limit{
	{"paths", 1_000_000, "Monte Carlo sample paths"},
	{"horizon", 10_000, "periods to forecast or plan (at most 100,000)"},
	{"history-bytes", 1 << 30, "bytes in a history, actuals or production file"},
	{"line-bytes", 1 << 20, "bytes in one line of such a file"},
	{"name-length", 200, "characters in a series, event or scenario name"},
	{"events", 10_000, "events in a scenario file"},
}

// Set holds the limits in force for a run, keyed by name.
type Set map[string]int64

// Defaults returns the limits with their defaults.
func Defaults() Set {
	l := Set{}
	for _, d := range limitTable {
		l[d.name] = d.def
	}
	return l
}

// Get returns the limit called name; it panics on a name not in
// limitTable, which is a programmer error.
func (l Set) Get(name string) int64 {
	v, ok := l[name]
	if !ok {
		panic("forelay: unknown limit " + name)
	}
	return v
}

// Exceeded returns the error of a value of flag over the limit called
// name: what was asked, the limit, and how to raise it.
func (l Set) Exceeded(flag string, name string, got int64) error {
	return fmt.Errorf("%s %s: above the limit of %s %s; if you mean it, raise the limit with --limit %s=%d",
		flag, forecast.FormatNumber(float64(got), 0), forecast.FormatNumber(float64(l.Get(name)), 0), limitWhat(name), name, got)
}

func limitWhat(name string) string {
	for _, d := range limitTable {
		if d.name == name {
			return d.what
		}
	}
	return name
}

// Scenario returns the limits of a scenario file and the files it names.
func (l Set) Scenario() scenario.Limits {
	return scenario.Limits{
		Horizon:    int(l.Get("horizon")),
		Events:     int(l.Get("events")),
		NameLength: int(l.Get("name-length")),
		Input:      l.Input(),
	}
}

// Input returns the size limits of an input file.
func (l Set) Input() data.SizeLimits {
	return data.SizeLimits{Bytes: l.Get("history-bytes"), LineBytes: l.Get("line-bytes")}
}

// Hint names the flag that raises the size limit an input file broke, or
// returns "" for any other error.
func Hint(err error) string {
	var se *data.SizeError
	if !errors.As(err, &se) {
		return ""
	}
	name := se.Limit
	if name == "bytes" {
		name = "history-bytes"
	}
	return fmt.Sprintf(" If it is, raise the limit with --limit %s=N.", name)
}

// Value is the flag value of --limit: repeated NAME=N pairs that change
// the limits of L.
type Value struct{ L Set }

// Type names the flag's value in help.
func (v *Value) Type() string { return "NAME=N" }

// String lists the limits changed from their defaults.
func (v *Value) String() string {
	var parts []string
	for _, d := range limitTable {
		if v.L[d.name] != d.def {
			parts = append(parts, d.name+"="+strconv.FormatInt(v.L[d.name], 10))
		}
	}
	return strings.Join(parts, ",")
}

// Set takes one or more comma-separated NAME=N pairs.
func (v *Value) Set(s string) error {
	for _, pair := range strings.Split(s, ",") {
		name, num, ok := strings.Cut(strings.TrimSpace(pair), "=")
		if !ok {
			return fmt.Errorf("%q: want NAME=N, for example paths=5000000", pair)
		}
		if _, known := v.L[name]; !known {
			return fmt.Errorf("%q: unknown limit %q; the limits are %s", pair, name, strings.Join(limitNames(), ", "))
		}
		n, err := strconv.ParseInt(num, 10, 64)
		if err != nil || n < 1 {
			return fmt.Errorf("%q: the limit must be a whole number of at least 1", pair)
		}
		if name == "horizon" && n > scenario.MaxHorizon {
			return fmt.Errorf("%q: a horizon can be at most %d periods", pair, scenario.MaxHorizon)
		}
		v.L[name] = n
	}
	return nil
}

func limitNames() []string {
	var names []string
	for _, d := range limitTable {
		names = append(names, d.name)
	}
	return slices.Clip(names)
}

// Help describes the limits, one a line, for the help of the command line.
func Help() string {
	var b strings.Builder
	for _, d := range limitTable {
		fmt.Fprintf(&b, "\n  %-14s %14s  %s", d.name, forecast.FormatNumber(float64(d.def), 0), d.what)
	}
	return b.String()
}
