package data

import (
	"hash/maphash"
	"math"

	"forelay/forecast"
)

// Extents lists every series of a history file in file order (as
// History.Series does) by its name and the periods it runs over, whether
// its values were kept (in History.Series) or not (ReadOptions.Keep). A
// series takes 32 bytes here besides the bytes of its name, whatever its
// length, so that the reader of one shard of a large file knows where
// every series starts and ends while it holds the values of its own
// series only.
//
// The series are numbered from 0 to Len()-1. The zero Extents lists no
// series; that is what a History built by hand has.
type Extents struct {
	// origin is the period from which first and last are counted.
	origin forecast.Period
	// chunks hold the series, extentChunk in each but the last, so that
	// a long list grows without being copied.
	chunks []chunk
	n      int
}

// extentChunk is the number of series in a chunk of Extents.
const extentChunk = 1 << 12

// A chunk is a part of Extents: its series, and their names one after
// the other, in one string once the chunk is full (or the file read) and
// in a byte slice while it fills. A name so costs its bytes and no
// allocation of its own.
type chunk struct {
	list  []extent
	names string
	buf   []byte
}

// An extent is one series of Extents. While the file is read, prev and
// line are the period and the line of the series' latest row, when its
// values are not kept (see extent.go).
type extent struct {
	// the series' name is names[off:off+size] of its chunk
	off, size uint32
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

// at returns series i.
func (x *Extents) at(i int) *extent { return &x.chunks[i/extentChunk].list[i%extentChunk] }

// push adds a series called name after the others, with e's periods.
func (x *Extents) push(name []byte, e extent) {
	if x.n%extentChunk == 0 {
		x.freeze()
		c := chunk{}
		if x.n > 0 {
			c.list = make([]extent, 0, extentChunk) // the first grows as it fills
		}
		x.chunks = append(x.chunks, c)
	}
	c := &x.chunks[len(x.chunks)-1]
	e.off, e.size = uint32(len(c.buf)), uint32(len(name))
	c.buf = append(c.buf, name...)
	c.list = append(c.list, e)
	x.n++
}

// roomFor reports whether the chunk that the next series goes into has
// room for a name of n bytes: the offsets of the names in a chunk have 32
// bits.
func (x *Extents) roomFor(n int) bool {
	used := 0
	if x.n%extentChunk != 0 {
		used = len(x.chunks[len(x.chunks)-1].buf)
	}
	return uint64(used)+uint64(n) <= math.MaxUint32
}

// freeze turns the names of the last chunk into a string, once it is full
// or the file read.
func (x *Extents) freeze() {
	if len(x.chunks) > 0 {
		c := &x.chunks[len(x.chunks)-1]
		if c.buf != nil {
			c.names, c.buf = string(c.buf), nil
		}
	}
}

// named reports whether series i is called name.
func (x *Extents) named(i int, name []byte) bool {
	c := &x.chunks[i/extentChunk]
	e := &c.list[i%extentChunk]
	if c.buf != nil {
		return string(c.buf[e.off:e.off+e.size]) == string(name)
	}
	return c.names[e.off:e.off+e.size] == string(name)
}

// hash returns the hash of the name of series i with seed.
func (x *Extents) hash(seed maphash.Seed, i int) uint64 {
	c := &x.chunks[i/extentChunk]
	e := &c.list[i%extentChunk]
	if c.buf != nil {
		return maphash.Bytes(seed, c.buf[e.off:e.off+e.size])
	}
	return maphash.String(seed, c.names[e.off:e.off+e.size])
}

// Len returns the number of series.
func (x *Extents) Len() int { return x.n }

// Name returns the name of series i. It panics if i is out of range, as
// do the other methods.
func (x *Extents) Name(i int) string {
	c := &x.chunks[i/extentChunk]
	e := &c.list[i%extentChunk]
	if c.buf != nil { // not reached once the file is read
		return string(c.buf[e.off : e.off+e.size])
	}
	return c.names[e.off : e.off+e.size]
}

// Start returns the first period of series i.
func (x *Extents) Start(i int) forecast.Period { return x.origin.Add(int(x.at(i).first)) }

// Next returns the period after the last one of series i: where a plan
// of it would start.
func (x *Extents) Next(i int) forecast.Period { return x.origin.Add(int(x.at(i).last) + 1) }

// Periods returns the number of periods series i runs over.
func (x *Extents) Periods(i int) int {
	e := x.at(i)
	return int(e.last-e.first) + 1
}

// Series returns the index in History.Series of series i, or -1 when its
// values were not kept.
func (x *Extents) Series(i int) int { return int(x.at(i).series) }

// Names returns the names of the series, in order.
func (x *Extents) Names() []string {
	out := make([]string, x.n)
	for i := range out {
		out[i] = x.Name(i)
	}
	return out
}

// extents returns h.Extents, or for a History built by hand, which has
// none, extents listing h.Series.
func (h *History) extents() *Extents {
	if h.Extents.Len() > 0 || len(h.Series) == 0 {
		return &h.Extents
	}
	x := &Extents{}
	for i, s := range h.Series {
		x.push([]byte(s.Name), extent{series: int32(i)})
	}
	x.freeze()
	return x
}
