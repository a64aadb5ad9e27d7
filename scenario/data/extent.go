package data

import (
	"fmt"
	"math"

	"forelay/forecast"
)

// maxSeries is the most series a long file may hold: the index of a
// series must fit the 32 bits of an extent.
const maxSeries = math.MaxInt32 - 1

// seriesOf returns the index in hr.ext of the series called name, adding
// it after the others when it is new: with a column for its points when
// its values are kept, or for its extent only (ReadOptions.Keep). Rows of
// one series usually follow each other, so the series of the last row is
// tried first. at is the row's label cell, where too many series are
// reported.
func (hr *historyReader) seriesOf(name []byte, at pos) (int, error) {
	if hr.last >= 0 && hr.ext.named(hr.last, name) {
		return hr.last, nil
	}
	i := hr.index.find(name, &hr.ext)
	if i < 0 {
		i = hr.ext.Len()
		if err := hr.pushExtent(name, at, hr.newExtent); err != nil {
			return 0, err
		}
		hr.index.add(i, &hr.ext)
	}
	hr.last = i
	return i, nil
}

// pushExtent adds the series called name after the others, with the
// extent that start returns, unless the file has too many series or
// names too long for Extents (an error at the cell at).
func (hr *historyReader) pushExtent(name []byte, at pos, start func(name []byte) extent) error {
	if hr.ext.Len() >= maxSeries {
		return hr.errPos(at, "", fmt.Errorf("%w: more than %d series", ErrTooLarge, maxSeries))
	}
	if !hr.ext.roomFor(len(name)) {
		return hr.errPos(at, "", fmt.Errorf("%w: the names of %d series take more than %d bytes", ErrTooLarge, extentChunk, math.MaxUint32))
	}
	hr.ext.push(name, start(name))
	return nil
}

// newExtent starts the extent of a new series of a long file, with a
// column when its values are kept.
func (hr *historyReader) newExtent(name []byte) extent {
	if hr.opt.Keep != nil && !hr.opt.Keep(string(name)) {
		return extent{first: noValue, last: noValue, series: -1}
	}
	c := &column{name: string(name), field: hr.valueField}
	if n := len(hr.cols); n > 0 {
		// Series tend to have the same length.
		c.pts = make([]point, 0, len(hr.cols[n-1].pts))
	}
	hr.cols = append(hr.cols, c)
	return extent{series: int32(len(hr.cols) - 1)}
}

// wideExtent starts the extent of the series of the next column of a
// wide file, whose values are kept.
func (hr *historyReader) wideExtent([]byte) extent { return extent{series: int32(len(hr.cols))} }

// offset returns the number of periods from the first label of the file
// to p, in the frequency of the labels' form. Labels have four-digit
// years, so it fits in 32 bits even for days.
func (hr *historyReader) offset(p forecast.Period) int32 { return int32(p.Sub(hr.anchor)) }

// add adds the point of a row to series i: to its column when its values
// are kept, and otherwise to its extent. A series read for its extent only
// keeps its first and last period with a value, and the period and line
// of its latest row, so that it takes the same few bytes however long it
// is. Its rows are checked for order, as a column's are (checkOrder), and
// the steps between them count towards the frequency of dates; the
// earliest row out of order is reported after the file is read.
func (hr *historyReader) add(i int, pt point) {
	e := hr.ext.at(i)
	if e.series >= 0 {
		c := hr.cols[e.series]
		c.pts = append(c.pts, pt)
		return
	}
	off := hr.offset(pt.period)
	started := e.line > 0 // a row of the series was read before
	if started {
		switch d := int(off - e.prev); {
		case d <= 0 && hr.order == nil:
			hr.order = hr.extentOrder(i, pt)
		case d > 0 && (hr.extentGap == 0 || d < hr.extentGap):
			hr.extentGap = d
		}
	}
	e.prev, e.line = off, pt.label.line
	switch {
	case !math.IsNaN(pt.v):
		if e.first == noValue {
			e.first = off
			delete(hr.blank, i)
		}
		e.last = off
	case !started:
		if hr.blank == nil {
			hr.blank = map[int]pos{}
		}
		hr.blank[i] = pt.value // where a series with no values is reported
	}
}

// extentOrder returns the error of checkOrder for the row of pt, which
// does not come after the latest row of series i. A period that repeats
// one before the latest row is reported as out of order, since the rows
// before the latest are not kept.
func (hr *historyReader) extentOrder(i int, pt point) *ParseError {
	e := hr.ext.at(i)
	prev := hr.anchor.Add(int(e.prev))
	if prev == pt.period {
		return hr.errPos(pt.label, hr.periodField, fmt.Errorf("%w %s of series %q (first on line %d)",
			ErrDuplicatePeriod, pt.period, hr.ext.Name(i), e.line))
	}
	return hr.errPos(pt.label, hr.periodField, fmt.Errorf("%w: %s of series %q comes after %s (line %d)",
		ErrUnsorted, pt.period, hr.ext.Name(i), prev, e.line))
}

// emptyExtent returns the error of the earliest series read for its
// extent only that has no value, or nil.
func (hr *historyReader) emptyExtent() *ParseError {
	var first *ParseError
	for i := range hr.ext.Len() {
		if e := hr.ext.at(i); e.series < 0 && e.first == noValue {
			first = earliest(first, hr.errPos(hr.blank[i], hr.valueField, fmt.Errorf("%w: series %q has no values", ErrEmptyCell, hr.ext.Name(i))))
		}
	}
	return first
}

// extents returns the Extents of the file, the series kept whole given
// their periods; series are the series of the columns.
func (hr *historyReader) extents(series []forecast.Series) Extents {
	hr.ext.freeze()
	for i := range hr.ext.Len() {
		if e := hr.ext.at(i); e.series >= 0 {
			s := series[e.series]
			e.first = hr.offset(s.Start)
			e.last = e.first + int32(s.Len()) - 1
		}
	}
	hr.ext.origin = hr.anchor
	return hr.ext
}

// weekExtents turns the periods of the series read for their extent only
// from days into weeks (see parsePeriods): every date falls on the
// weekday of the first one, so each step of 7 days is one week.
func (hr *historyReader) weekExtents() {
	for i := range hr.ext.Len() {
		if e := hr.ext.at(i); e.series < 0 && e.first != noValue {
			e.first, e.last = e.first/7, e.last/7
		}
	}
}
