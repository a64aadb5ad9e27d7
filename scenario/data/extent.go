package data

import (
	"fmt"
	"math"

	"forelay/forecast"
)

// add adds a point of a long row to its series: all of them for a series
// kept whole, and for one read for its extent only (ReadOptions.Keep) its
// first and its latest point with a value, and the smallest step between
// its rows (for the frequency of dates). A series read for its extent
// takes a few dozen bytes however long it is, so that a reader of one
// shard of a large file holds the values of its own series only, and
// still learns where every other series starts and ends.
func (hr *historyReader) add(c *column, pt point) {
	if !c.extent {
		c.pts = append(c.pts, pt)
		return
	}
	if c.rows > 0 {
		if d := pt.period.Sub(c.prev); d > 0 && (c.gap == 0 || d < c.gap) {
			c.gap = d
		}
	}
	c.rows++
	c.prev = pt.period
	switch {
	case math.IsNaN(pt.v):
		if len(c.pts) == 0 {
			c.pts = append(c.pts, pt) // where a series with no values is reported
		}
	case len(c.pts) == 0 || math.IsNaN(c.pts[0].v):
		c.pts = append(c.pts[:0], pt)
	case len(c.pts) == 1:
		c.pts = append(c.pts, pt)
	default:
		c.pts[1] = pt
	}
}

// extentSeries returns a series read for its extent only: its name, its
// first period with a value and as many zeros as it has periods to its
// last one, the zeros shared by every such series of the file. Its values
// are not checked for gaps: the reader that keeps the series whole does.
func (hr *historyReader) extentSeries(c *column) (forecast.Series, []Filled, *ParseError) {
	if math.IsNaN(c.pts[0].v) {
		p := c.pts[0].value
		return forecast.Series{}, nil, hr.errAt(cell{line: p.line, col: p.col}, hr.valueField, fmt.Errorf("%w: series %q has no values", ErrEmptyCell, c.name))
	}
	start, end := c.pts[0].period, c.pts[len(c.pts)-1].period
	n := end.Sub(start) + 1
	if len(hr.zeros) < n {
		hr.zeros = make([]float64, n)
	}
	return forecast.Series{Name: c.name, Start: start, Values: hr.zeros[:n:n]}, nil, nil
}
