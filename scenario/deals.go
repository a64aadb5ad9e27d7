package scenario

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"forelay/scenario/data"
)

// # Events file
//
// events-file names a table of events kept outside the scenario file (by
// sales, say): a CSV file or a workbook (its first sheet), one row per
// event and per scope entry. Its header names the columns, in any order,
// compared with case ignored and spaces or underscores read as hyphens
// ("Ramp periods" is ramp-periods):
//
//	id            the event's id (required on every row)
//	kind          step or pulse
//	start, end    period labels or dates (or spreadsheet dates)
//	periods       a pulse's length in periods
//	series        the series (or pattern) of one scope entry
//	new           true when the entry creates a series
//	units         effect in units
//	percent       effect in percent of the baseline (8 or 8%)
//	split         baseline or equal
//	ramp-periods  ramp.periods
//	ramp-shape    ramp.shape
//	probability   in [0, 1], or a percentage (70%)
//	low, high     range.low and range.high
//	owner         who keeps the event
//	note          free text
//
// Only id is required; an empty cell is a key left out. Rows with the
// same id are one event. Its first row gives the event: kind, start and
// the other keys of the event, its effect (units or percent), and its
// first scope entry (series, new), which shares the event's effect. Each
// later row is one more scope entry: series (required), new, and units or
// percent as the entry's own effect (left empty, the entry shares the
// event's). On later rows the event's columns are left empty or repeat
// the first row's value. Each event is then decoded and checked as the
// same event under events: would be, and its errors name the file, the
// sheet of a workbook, and the row and column of the cell.
//
// events-file is a path, or a mapping {file, sheet, decimal}: sheet names
// the sheet of a workbook to read, decimal (point or comma) the decimal
// mark of a CSV table, as for a history. A percentage (8%, or a workbook
// cell formatted as one) reads as 8 in the percent column and as 0.08 in
// the probability column.

// dealColumns are the columns of an events file, in the order of the
// documentation.
var dealColumns = []string{"id", "kind", "start", "end", "periods", "series", "new", "units", "percent", "split",
	"ramp-periods", "ramp-shape", "probability", "low", "high", "owner", "note"}

// entryColumns are the columns that belong to a row's scope entry rather
// than to its event.
var entryColumns = map[string]bool{"id": true, "series": true, "new": true, "units": true, "percent": true}

// numberColumns hold numbers.
var numberColumns = map[string]bool{"periods": true, "units": true, "percent": true, "ramp-periods": true, "probability": true, "low": true, "high": true}

// A dealCell is one cell of an events file: its text and where it stands.
type dealCell struct {
	text string
	at   Pos
}

// A dealRow is one row of an events file, by column name; cells left
// empty are absent.
type dealRow struct {
	at    Pos // the row's first cell
	cells map[string]dealCell
}

// eventsFileKeys are the keys of events-file when it is a mapping.
var eventsFileKeys = []string{"file", "sheet", "decimal"}

// eventsFileKey decodes events-file, a path or a mapping of file, sheet
// and decimal, and reads the events of the file it names.
func (d *decoder) eventsFileKey(m *mapping, f *File) {
	v, ok := m.vals["events-file"]
	if !ok {
		return
	}
	if deref(v).Kind == yaml.MappingNode {
		em := m.sub("events-file", eventsFileKeys)
		if em == nil {
			return
		}
		em.require("file")
		em.str("sheet", &f.EventsFormat.Sheet)
		typed(em, "decimal", "decimal mark", decimalValues, data.ParseDecimalMark, &f.EventsFormat.Decimal)
		if !em.str("file", &f.EventsFile) {
			return
		}
		d.pos["events-file"] = d.at(em.field("file"), d.position(em.node))
	} else if !m.str("events-file", &f.EventsFile) {
		return
	}
	if f.EventsFile == "" {
		d.fail(d.at("events-file", Pos{}), "events-file", ErrValue, "must not be empty")
		return
	}
	f.EventsFile = resolvePath(f.Dir, f.EventsFile)
	d.eventsFile(f, d.at("events-file", Pos{}))
}

// eventsFile reads the events file f names and decodes its events into
// f.Events. at is where the events-file key stands.
func (d *decoder) eventsFile(f *File, at Pos) {
	fh, err := os.Open(f.EventsFile)
	if err != nil {
		d.fail(at, "events-file", ErrValue, "%v", err)
		return
	}
	defer fh.Close()
	rows, err := data.OpenRows(data.BoundedReader(fh, f.EventsFile, d.limits.Input), f.EventsFile, data.Format{Sheet: f.EventsFormat.Sheet, Decimal: f.EventsFormat.Decimal, Percent: true})
	if err != nil {
		d.failRead(at, err)
		return
	}
	table, ok := d.dealRows(rows)
	if !ok {
		return
	}
	sub := *d
	sub.origin = &Pos{File: f.EventsFile, Sheet: rows.Sheet}
	order, groups := groupDeals(table)
	for _, id := range order {
		if e := sub.deal(id, groups[id], rows.Decimal, len(f.Events)); e != nil {
			f.Events = append(f.Events, e)
		}
	}
}

// failRead records an error of reading the events file: a
// *data.ParseError as it is, anything else at the events-file key.
func (d *decoder) failRead(at Pos, err error) {
	if pe, ok := err.(*data.ParseError); ok {
		d.errs = append(d.errs, pe)
		return
	}
	d.fail(at, "events-file", ErrValue, "%v", err)
}

// dealRows reads the header and the rows of an events file that are not
// blank. It reports false after recording a problem with the header or
// the file.
func (d *decoder) dealRows(rows *data.Rows) ([]dealRow, bool) {
	pos := func(i int) Pos {
		line, col := rows.FieldPos(i)
		return Pos{Line: line, Column: col, File: rows.File, Sheet: rows.Sheet}
	}
	var header []string
	var out []dealRow
	for {
		rec, err := rows.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			d.failRead(Pos{}, csvProblem(rows, err))
			return nil, false
		}
		if blank(rec) {
			continue
		}
		if header == nil {
			if header = d.dealHeader(rec, pos); header == nil {
				return nil, false
			}
			continue
		}
		r := dealRow{at: pos(0), cells: map[string]dealCell{}}
		for i, text := range rec {
			text = strings.TrimSpace(text)
			if text == "" {
				continue
			}
			if i >= len(header) || header[i] == "" {
				d.fail(pos(i), "", ErrValue, "a cell in column %d, which the header does not name; give the column a name, or empty the cell", i+1)
				return nil, false
			}
			r.cells[header[i]] = dealCell{text: text, at: pos(i)}
		}
		out = append(out, r)
	}
	if header == nil {
		d.fail(Pos{File: rows.File, Sheet: rows.Sheet}, "", ErrMissing, "the events file is empty; give a header row (id, kind, start, ...) and one row per event")
		return nil, false
	}
	return out, true
}

// csvProblem turns an error reading the rows of an events file into a
// *data.ParseError naming the file.
func csvProblem(rows *data.Rows, err error) error {
	var pe *data.ParseError
	if errors.As(err, &pe) {
		return pe
	}
	var ce *csv.ParseError
	if errors.As(err, &ce) {
		return &data.ParseError{File: rows.File, Line: ce.Line, Column: ce.Column, Err: ce.Err}
	}
	return &data.ParseError{File: rows.File, Sheet: rows.Sheet, Err: err}
}

// blank reports whether every cell of rec is empty or spaces.
func blank(rec []string) bool {
	for _, s := range rec {
		if strings.TrimSpace(s) != "" {
			return false
		}
	}
	return true
}

// dealHeader reads the header of an events file: the column name of each
// cell, or nil after recording a problem.
func (d *decoder) dealHeader(rec []string, pos func(int) Pos) []string {
	names := make([]string, len(rec))
	seen := map[string]int{}
	ok := true
	for i, text := range rec {
		name := strings.ToLower(strings.TrimSpace(text))
		name = strings.NewReplacer(" ", "-", "_", "-").Replace(name)
		switch _, dup := seen[name]; {
		case name == "":
			if i+1 < len(rec) && !blank(rec[i+1:]) {
				d.fail(pos(i), "", ErrMissing, "column %d has no name; the columns are %s", i+1, orList(dealColumns))
				ok = false
			}
		case !contains(dealColumns, name):
			d.fail(pos(i), "", ErrUnknownKey, "unknown column %q%s; the columns are %s", strings.TrimSpace(text), didYouMean(name, dealColumns), orList(dealColumns))
			ok = false
		case dup:
			d.fail(pos(i), "", ErrDuplicate, "column %q given twice (first in column %d)", name, seen[name]+1)
			ok = false
		}
		seen[name] = i
		names[i] = name
	}
	if _, has := seen["id"]; !has && ok {
		d.fail(pos(0), "", ErrMissing, "the header has no id column; the columns are %s", orList(dealColumns))
		ok = false
	}
	if !ok {
		return nil
	}
	return names
}

// contains reports whether list holds s.
func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// groupDeals groups the rows by id, in the order of each id's first row.
// A row without an id is a group of its own under the empty id.
func groupDeals(rows []dealRow) (order []string, groups map[string][]dealRow) {
	groups = map[string][]dealRow{}
	for i, r := range rows {
		id := r.cells["id"].text
		if id == "" {
			id = fmt.Sprintf("\x00row %d", i) // reported by deal
		}
		if _, ok := groups[id]; !ok {
			order = append(order, id)
		}
		groups[id] = append(groups[id], r)
	}
	return order, groups
}

// deal decodes the event of the rows of one id: it builds the event's
// YAML node from the cells and decodes it as an item of events.
func (d *decoder) deal(id string, rows []dealRow, dec data.Decimal, i int) *Event {
	first := rows[0]
	idCell, ok := first.cells["id"]
	if !ok {
		d.fail(first.at, "id", ErrMissing, "required: every row of the events file names its event")
		return nil
	}
	if !idPattern.MatchString(id) {
		d.fail(idCell.at, "id", ErrValue, "%q is not a valid event id; use lower-case letters, digits and hyphens", id)
		return nil
	}
	if line, dup := d.seenID[id]; dup {
		d.fail(idCell.at, "id", ErrDuplicate, "event id %q is already an event of the scenario file (line %d); an id names one event, in events or in the events file", id, line)
		return nil
	}
	if !d.sameEventCells(id, rows) || !d.numberCells(id, rows, dec) {
		return nil
	}
	n := mappingNode(first.at)
	for _, col := range dealColumns {
		c, ok := first.cells[col]
		if !ok || entryColumns[col] && col != "id" {
			continue
		}
		switch col {
		case "ramp-periods", "ramp-shape":
			addKey(sub(n, "ramp", c.at), strings.TrimPrefix(col, "ramp-"), scalarNode(col, c, dec))
		case "low", "high":
			addKey(sub(n, "range", c.at), col, scalarNode(col, c, dec))
		case "split":
			addKey(sub(n, "effect", c.at), col, scalarNode(col, c, dec))
		default:
			addKey(n, col, scalarNode(col, c, dec))
		}
	}
	for _, col := range []string{"units", "percent"} {
		if c, ok := first.cells[col]; ok {
			addKey(sub(n, "effect", c.at), col, scalarNode(col, c, dec))
		}
	}
	if scope := d.dealScope(id, rows, dec); scope != nil {
		addKey(n, "scope", scope)
	}
	return d.event(n, i)
}

// sameEventCells checks that the later rows of an event leave its
// columns empty or repeat the first row's values.
func (d *decoder) sameEventCells(id string, rows []dealRow) bool {
	ok := true
	for _, r := range rows[1:] {
		for col, c := range r.cells {
			if entryColumns[col] {
				continue
			}
			if f, has := rows[0].cells[col]; !has || f.text != c.text {
				d.fail(c.at, fmt.Sprintf("event %q: %s", id, col), ErrConflict,
					"differs from the event's first row (row %d), which gives the event's %s; leave it empty on later rows, which only add scope entries", rows[0].at.Line, col)
				ok = false
			}
		}
	}
	return ok
}

// numberCells checks the cells of the number columns, so that a number
// that cannot be read is reported with what to write instead (a thousands
// separator, a decimal comma) rather than as text where a number belongs.
func (d *decoder) numberCells(id string, rows []dealRow, dec data.Decimal) bool {
	ok := true
	for _, r := range rows {
		for _, col := range dealColumns {
			c, has := r.cells[col]
			if !has || !numberColumns[col] {
				continue
			}
			text, _ := percentText(col, c.text)
			if _, err := data.ParseNumberAs(text, dec, "decimal: comma under events-file (events-file: {file: NAME, decimal: comma})"); err != nil {
				d.failErr(c.at, fmt.Sprintf("event %q: %s", id, col), err)
				ok = false
			}
		}
	}
	return ok
}

// percentText strips the percent sign of a cell of the percent or
// probability column, and says whether there was one.
func percentText(col, text string) (string, bool) {
	if col != "percent" && col != "probability" {
		return text, false
	}
	return strings.CutSuffix(strings.TrimSpace(text), "%")
}

// dealScope returns the scope list node of an event's rows, or nil when
// its only row names no series.
func (d *decoder) dealScope(id string, rows []dealRow, dec data.Decimal) *yaml.Node {
	if _, has := rows[0].cells["series"]; !has && len(rows) == 1 {
		return nil
	}
	list := &yaml.Node{Kind: yaml.SequenceNode, Tag: "!!seq", Line: rows[0].at.Line, Column: rows[0].at.Column}
	for k, r := range rows {
		entry := mappingNode(r.at)
		s, has := r.cells["series"]
		if !has {
			d.fail(r.at, fmt.Sprintf("event %q: series", id), ErrMissing,
				"required on row %d: rows with the same id are the scope entries of one event, and each names its series", r.at.Line)
			return nil
		}
		entry.Line, entry.Column = s.at.Line, s.at.Column
		addKey(entry, "series", scalarNode("series", s, dec))
		if c, ok := r.cells["new"]; ok {
			addKey(entry, "new", scalarNode("new", c, dec))
		}
		if k > 0 {
			for _, col := range []string{"units", "percent"} {
				if c, ok := r.cells[col]; ok {
					addKey(sub(entry, "effect", c.at), col, scalarNode(col, c, dec))
				}
			}
		}
		list.Content = append(list.Content, entry)
	}
	return list
}

// mappingNode returns an empty mapping node at a place.
func mappingNode(at Pos) *yaml.Node {
	return &yaml.Node{Kind: yaml.MappingNode, Tag: "!!map", Line: at.Line, Column: at.Column}
}

// addKey adds key: v to the mapping node n.
func addKey(n *yaml.Node, key string, v *yaml.Node) {
	k := &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: key, Line: v.Line, Column: v.Column}
	n.Content = append(n.Content, k, v)
}

// sub returns the mapping under key in n, adding it (at a place) when it
// is not there.
func sub(n *yaml.Node, key string, at Pos) *yaml.Node {
	for i := 0; i+1 < len(n.Content); i += 2 {
		if n.Content[i].Value == key {
			return n.Content[i+1]
		}
	}
	m := mappingNode(at)
	addKey(n, key, m)
	return m
}

// scalarNode returns the YAML scalar of a cell of column col: a number
// for the number columns (read with the decimal mark dec; a whole number
// as an integer), true or false for new, text otherwise. A percentage
// (8%, or a workbook cell formatted as one) is read in percent in the
// percent column and as a share in the probability column (70% is 0.7).
// A cell that does not read as its column's type stays text, for the
// decoder to refuse with its usual message.
func scalarNode(col string, c dealCell, dec data.Decimal) *yaml.Node {
	n := &yaml.Node{Kind: yaml.ScalarNode, Tag: "!!str", Value: c.text, Line: c.at.Line, Column: c.at.Column}
	switch {
	case numberColumns[col]:
		text, scale := c.text, 1.0
		if t, ok := percentText(col, text); ok {
			text = t
			if col == "probability" {
				scale = 100
			}
		}
		x, err := data.ParseNumber(text, dec)
		if err != nil {
			return n
		}
		x /= scale
		if x == math.Trunc(x) && math.Abs(x) < 1e15 {
			n.Tag, n.Value = "!!int", strconv.FormatInt(int64(x), 10)
		} else {
			n.Tag, n.Value = "!!float", strconv.FormatFloat(x, 'g', -1, 64)
		}
	case col == "new":
		switch strings.ToLower(c.text) {
		case "true", "yes":
			n.Tag, n.Value = "!!bool", "true"
		case "false", "no":
			n.Tag, n.Value = "!!bool", "false"
		}
	}
	return n
}
