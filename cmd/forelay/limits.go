package main

import (
	"errors"
	"fmt"
	"forelay/scenario/data"
	"math"
	"slices"
	"strconv"
	"strings"

	"forelay/scenario"
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

// limits holds the limits in force for a run, keyed by name.
type limits map[string]int64

// defaultLimits returns the limits with their defaults.
func defaultLimits() limits {
	l := limits{}
	for _, d := range limitTable {
		l[d.name] = d.def
	}
	return l
}

// get returns the limit called name; it panics on a name not in
// limitTable, which is a programmer error.
func (l limits) get(name string) int64 {
	v, ok := l[name]
	if !ok {
		panic("forelay: unknown limit " + name)
	}
	return v
}

// exceeded returns the flag error for a value over the limit called name:
// what was asked, the limit, and how to raise it.
func (l limits) exceeded(flag string, name string, got int64) error {
	return flagErrorf("%s %s: above the limit of %s %s; if you mean it, raise the limit with --limit %s=%d",
		flag, fmtNum(float64(got), 0), fmtNum(float64(l.get(name)), 0), limitWhat(name), name, got)
}

func limitWhat(name string) string {
	for _, d := range limitTable {
		if d.name == name {
			return d.what
		}
	}
	return name
}

// scenario returns the limits of a scenario file and the files it names.
func (l limits) scenario() scenario.Limits {
	return scenario.Limits{
		Horizon:    int(l.get("horizon")),
		Events:     int(l.get("events")),
		NameLength: int(l.get("name-length")),
		Input:      l.input(),
	}
}

// input returns the size limits of an input file.
func (l limits) input() data.SizeLimits {
	return data.SizeLimits{Bytes: l.get("history-bytes"), LineBytes: l.get("line-bytes")}
}

// limitHint names the flag that raises the size limit an input file broke,
// or returns "" for any other error.
func limitHint(err error) string {
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

// limitsValue is the pflag.Value of --limit: repeated NAME=N pairs.
type limitsValue struct{ l limits }

func (v *limitsValue) Type() string { return "NAME=N" }

func (v *limitsValue) String() string {
	var parts []string
	for _, d := range limitTable {
		if v.l[d.name] != d.def {
			parts = append(parts, d.name+"="+strconv.FormatInt(v.l[d.name], 10))
		}
	}
	return strings.Join(parts, ",")
}

// Set takes one or more comma-separated NAME=N pairs.
func (v *limitsValue) Set(s string) error {
	for _, pair := range strings.Split(s, ",") {
		name, num, ok := strings.Cut(strings.TrimSpace(pair), "=")
		if !ok {
			return fmt.Errorf("%q: want NAME=N, for example paths=5000000", pair)
		}
		if _, known := v.l[name]; !known {
			return fmt.Errorf("%q: unknown limit %q; the limits are %s", pair, name, strings.Join(limitNames(), ", "))
		}
		n, err := strconv.ParseInt(num, 10, 64)
		if err != nil || n < 1 {
			return fmt.Errorf("%q: the limit must be a whole number of at least 1", pair)
		}
		if name == "horizon" && n > scenario.MaxHorizon {
			return fmt.Errorf("%q: a horizon can be at most %d periods", pair, scenario.MaxHorizon)
		}
		v.l[name] = n
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

// limitsHelp describes the limits for the root command's help.
func limitsHelp() string {
	var b strings.Builder
	for _, d := range limitTable {
		fmt.Fprintf(&b, "\n  %-14s %14s  %s", d.name, fmtNum(float64(d.def), 0), d.what)
	}
	return b.String()
}

// countValue is the pflag.Value of a whole-number flag that also takes the
// scientific notation people type for large counts (1e6).
type countValue struct{ n *int }

func newCountValue(p *int, def int) *countValue {
	*p = def
	return &countValue{n: p}
}

func (c *countValue) Type() string   { return "N" }
func (c *countValue) String() string { return strconv.Itoa(*c.n) }

// Set accepts a whole number written plainly (20000) or in scientific
// notation (2e4). Numbers beyond what an int holds are clamped, so the
// limit check can name them.
func (c *countValue) Set(s string) error {
	if n, err := strconv.Atoi(s); err == nil {
		*c.n = n
		return nil
	}
	f, err := strconv.ParseFloat(s, 64)
	if err != nil || strings.ContainsAny(s, "_xXpP") || f != math.Trunc(f) || math.IsNaN(f) {
		return fmt.Errorf("%q is not a whole number (write 20000 or 2e4)", s)
	}
	*c.n = int(math.Max(math.Min(f, math.MaxInt32), math.MinInt32))
	return nil
}

// givenInt is the pflag.Value of a whole-number flag whose default means
// "decide for me": it records whether the flag was given at all.
type givenInt struct {
	n     *int
	given *bool
}

func (g *givenInt) Type() string { return "N" }

func (g *givenInt) String() string {
	if g.n == nil || !*g.given {
		return ""
	}
	return strconv.Itoa(*g.n)
}

func (g *givenInt) Set(s string) error {
	n, err := strconv.Atoi(s)
	if err != nil {
		return fmt.Errorf("%q is not a whole number", s)
	}
	*g.n, *g.given = n, true
	return nil
}
