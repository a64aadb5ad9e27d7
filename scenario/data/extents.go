package data

import "forelay/forecast"

// Extents lists every series of a history file in file order (as
// History.Series does) by its name and the periods it runs over, whether
// its values were kept (in History.Series) or not (ReadOptions.Keep). A
// series takes 40 bytes here besides its name, whatever its length, so
// that the reader of one shard of a large file knows where every series
// starts and ends while it holds the values of its own series only.
//
// The series are numbered from 0 to Len()-1. The zero Extents lists no
// series; that is what a History built by hand has.
type Extents struct {
	// origin is the period from which first and last are counted.
	origin forecast.Period
	list   []extent
}

// An extent is one series of Extents. While the file is read, prev and
// line are the period and the line of the series' latest row, when its
// values are not kept (see extent.go).
type extent struct {
	name string
	// first and last are the series' first and last period with a value,
	// counted from the origin; noValue before the reader meets one.
	first, last int32
	prev        int32
	// series is the index of the series in History.Series, or of its
	// column while the file is read; -1 when its values are not kept.
	series int32
	line   int
}

// noValue marks the first and last period of a series with no value read
// yet.
const noValue = -1 << 31

// Len returns the number of series.
func (x *Extents) Len() int { return len(x.list) }

// Name returns the name of series i. It panics if i is out of range, as
// do the other methods.
func (x *Extents) Name(i int) string { return x.list[i].name }

// Start returns the first period of series i.
func (x *Extents) Start(i int) forecast.Period { return x.origin.Add(int(x.list[i].first)) }

// Next returns the period after the last one of series i: where a plan
// of it would start.
func (x *Extents) Next(i int) forecast.Period { return x.origin.Add(int(x.list[i].last) + 1) }

// Periods returns the number of periods series i runs over.
func (x *Extents) Periods(i int) int { return int(x.list[i].last-x.list[i].first) + 1 }

// Series returns the index in History.Series of series i, or -1 when its
// values were not kept.
func (x *Extents) Series(i int) int { return int(x.list[i].series) }

// Names returns the names of the series, in order.
func (x *Extents) Names() []string {
	out := make([]string, len(x.list))
	for i, e := range x.list {
		out[i] = e.name
	}
	return out
}
