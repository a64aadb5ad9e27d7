package scenario

import (
	"fmt"
	"forelay/scenario/data"
	"io"
	"os"
	"unicode/utf8"
)

// Limits bound what a scenario file may ask for and the files it names,
// so that a slip (a horizon of 120000 for 12, a history that is really a
// database dump) ends in an error rather than a run that never finishes.
// A zero field takes its default from DefaultLimits.
type Limits struct {
	// Horizon is the most periods a plan may have, at most MaxHorizon.
	Horizon int
	// Events is the most events a file may list.
	Events int
	// NameLength is the most characters in a plan, event, scenario or
	// series name.
	NameLength int
	// Input bounds the scenario file and every file it names (history,
	// production plan).
	Input data.SizeLimits
}

// MaxHorizon is the most periods any plan may have, whatever the limits:
// it keeps period arithmetic far from overflow.
const MaxHorizon = maxCount

// DefaultLimits returns the limits Load and Parse apply.
func DefaultLimits() Limits {
	return Limits{
		Horizon:    10_000,
		Events:     10_000,
		NameLength: 200,
		Input:      data.SizeLimits{Bytes: 1 << 30, LineBytes: 1 << 20},
	}
}

// orDefaults fills the zero fields of l from DefaultLimits.
func (l Limits) orDefaults() Limits {
	d := DefaultLimits()
	if l.Horizon == 0 {
		l.Horizon = d.Horizon
	}
	if l.Events == 0 {
		l.Events = d.Events
	}
	if l.NameLength == 0 {
		l.NameLength = d.NameLength
	}
	if l.Input.Bytes == 0 {
		l.Input.Bytes = d.Input.Bytes
	}
	if l.Input.LineBytes == 0 {
		l.Input.LineBytes = d.Input.LineBytes
	}
	return l
}

// LoadLimited is Load under the given limits.
func LoadLimited(path string, l Limits) (*File, error) {
	fh, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer fh.Close()
	return ParseLimited(fh, path, l)
}

// ParseLimited is Parse under the given limits. The file remembers them
// and applies them to the files it names.
func ParseLimited(r io.Reader, path string, l Limits) (*File, error) {
	l = l.orDefaults()
	return parse(data.BoundedReader(r, path, l.Input), path, l)
}

// limitError is the message of a value above its limit: what the limit
// bounds and the flag that raises it.
func limitError(got, max int, what, name string) string {
	return fmt.Sprintf("%d is above the limit of %d %s; if you mean it, raise the limit with --limit %s=%d", got, max, what, name, got)
}

// checkLimits reports the values of f above d's limits.
func (d *decoder) checkLimits(f *File) {
	l := d.limits
	if d.given("horizon") && f.Horizon > l.Horizon && f.Horizon <= maxCount {
		d.fail(d.at("horizon", Pos{}), "horizon", ErrValue, "%s", limitError(f.Horizon, l.Horizon, "periods", "horizon"))
	}
	if len(f.Events) > l.Events {
		d.fail(d.at("events", Pos{}), "events", ErrValue, "%s",
			limitError(len(f.Events), l.Events, "events", "events"))
	}
	long := func(field string, pos Pos, name string) {
		if n := utf8.RuneCountInString(name); n > l.NameLength {
			d.fail(d.at(field, pos), field, ErrValue, "a name of %s", limitError(n, l.NameLength, "characters", "name-length"))
		}
	}
	long("plan", Pos{}, f.Plan)
	long("history.series", Pos{}, f.History.Series)
	for _, e := range f.Events {
		long(e.field("id"), e.Pos, e.ID)
	}
	for i, c := range f.Scenarios {
		if i < len(d.refs) {
			long(join(d.refs[i].prefix, "name"), c.Pos, c.Name)
		}
	}
}

// EffectiveLimits returns the limits f was read under, with the defaults
// filled in: the limits of the files it names.
func (f *File) EffectiveLimits() Limits { return f.Limits.orDefaults() }
