package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"io"
	"strings"
	"unicode/utf8"

	"gonum.org/v1/plot"
)

// A Report is everything one command run produces, in a form every
// writer can take: the text a person reads (a list of blocks), the JSON
// document other programs read, the table written as a CSV file, the
// charts to draw and the warnings. A new output format is one more writer
// of Report, never one more function per command.
type Report struct {
	// Name is the base name of the files written into --out: Name.csv,
	// Name.json and the charts' own names.
	Name string
	// Text is the report for a person, block by block.
	Text Text
	// Doc is the JSON document (a struct with documented, stable fields).
	Doc any
	// CSV is the table of Name.csv, in plain numbers; nil for none.
	CSV *Table
	// CSVWrite, when CSV is nil, writes Name.csv: the rows a merge of
	// shards streams from the shards' files, never held in memory whole.
	CSVWrite func(w io.Writer) error
	// MoreCSV are further tables written as their own CSV files with
	// --out (rollup.csv beside plan.csv, say), in order.
	MoreCSV []CSVFile
	// MoreTables are further tables that are not written as CSV files
	// but go into writers that hold several tables, such as the
	// workbook: the events and the accuracy of the baselines, in order.
	MoreTables []CSVFile
	// NoJSONFile leaves Name.json out of --out (the document is still
	// printed with --json).
	NoJSONFile bool
	// Charts are drawn into --out as NAME.png and NAME.svg.
	Charts []Chart
	// Warnings are legal but doubtful input: one sentence each, with the
	// fix.
	Warnings []string
	// Compact writes the JSON document on one line.
	Compact bool
}

// A Chart is a chart to draw and the base name of its files.
type Chart struct {
	Name string
	Plot Plotter
	// Caption says in a sentence what the chart shows, for a document
	// that prints it under the chart and gives it as the chart's text
	// alternative; empty uses the chart's title.
	Caption string
}

// Plotter is anything that lays out a gonum plot: the chart types of
// package plots.
type Plotter interface{ Plot() (*plot.Plot, error) }

// WriteText writes the text report.
func (r *Report) WriteText(w io.Writer) error {
	var b bytes.Buffer
	for _, bl := range r.Text.blocks {
		bl.writeText(&b)
	}
	b.Write(r.Text.partial.Bytes())
	_, err := w.Write(b.Bytes())
	return err
}

// JSON returns the JSON document, indented (on one line when Compact),
// with a final newline.
func (r *Report) JSON() ([]byte, error) {
	if r.Compact {
		b, err := json.Marshal(r.Doc)
		return append(b, '\n'), err
	}
	b, err := json.MarshalIndent(r.Doc, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// A CSVFile is a table written to a CSV file of its own: Name.csv.
type CSVFile struct {
	Name  string
	Table *Table
}

// CSVBytes returns the CSV file of r.CSV (head, then rows), or the first
// error the CSV writer reports.
func (r *Report) CSVBytes() ([]byte, error) { return r.CSV.CSVBytes() }

// CSVBytes returns the table as a CSV file (head, then rows), or the first
// error of the CSV writer.
func (t *Table) CSVBytes() ([]byte, error) {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	if err := w.Write(t.Head); err != nil {
		return nil, err
	}
	for _, row := range t.Rows {
		if err := w.Write(row); err != nil {
			return nil, err
		}
	}
	w.Flush()
	if err := w.Error(); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// Text is a text report under construction: an io.Writer whose lines
// become Line blocks (so fmt.Fprintf works on it), and tables added as
// Table blocks. A writer for another format walks the blocks.
type Text struct {
	blocks  []block
	partial bytes.Buffer // the unfinished last line
}

// block is a part of a text report.
type block interface{ writeText(b *bytes.Buffer) }

// Line is one line of text, without its line break.
type Line string

func (l Line) writeText(b *bytes.Buffer) { b.WriteString(string(l)); b.WriteByte('\n') }

// Write appends p: each finished line becomes a Line block.
func (t *Text) Write(p []byte) (int, error) {
	t.partial.Write(p)
	for {
		s := t.partial.String()
		i := strings.IndexByte(s, '\n')
		if i < 0 {
			break
		}
		t.blocks = append(t.blocks, Line(s[:i]))
		t.partial.Next(i + 1)
	}
	return len(p), nil
}

// Add appends a table.
func (t *Text) Add(tb *Table) { t.blocks = append(t.blocks, tb) }

// Lines returns the text as lines, tables laid out: for tests and for
// writers that need no more structure.
func (t *Text) String() string {
	var b bytes.Buffer
	for _, bl := range t.blocks {
		bl.writeText(&b)
	}
	b.Write(t.partial.Bytes())
	return b.String()
}

// A Table is a table of text cells: in the text report the first column
// is aligned left (labels) and the others right (numbers) unless Left
// says otherwise; columns are separated by two spaces and trailing spaces
// are trimmed. In a CSV file the cells are written as they are.
type Table struct {
	Head []string
	Rows [][]string
	// LeftCols marks columns aligned left besides the first.
	LeftCols map[int]bool
	// Kinds says what each column holds, in the order of Head, for
	// writers that store typed cells (see Kind); nil: all text.
	Kinds []Kind
}

// NewTable returns a table with the given head.
func NewTable(head ...string) *Table {
	return &Table{Head: head, LeftCols: map[int]bool{0: true}}
}

// Left marks columns to align left and returns t.
func (t *Table) Left(cols ...int) *Table {
	for _, c := range cols {
		t.LeftCols[c] = true
	}
	return t
}

// AddRow appends a row of cells.
func (t *Table) AddRow(cells ...string) { t.Rows = append(t.Rows, cells) }

func (t *Table) writeText(b *bytes.Buffer) {
	width := make([]int, len(t.Head))
	all := append([][]string{t.Head}, t.Rows...)
	for _, r := range all {
		for i, c := range r {
			if i < len(width) {
				width[i] = max(width[i], utf8.RuneCountInString(c))
			}
		}
	}
	for _, r := range all {
		var line strings.Builder
		for i := range width {
			c := ""
			if i < len(r) {
				c = r[i]
			}
			pad := strings.Repeat(" ", width[i]-utf8.RuneCountInString(c))
			if i > 0 {
				line.WriteString("  ")
			}
			if t.LeftCols[i] {
				line.WriteString(c + pad)
			} else {
				line.WriteString(pad + c)
			}
		}
		b.WriteString(strings.TrimRight(line.String(), " "))
		b.WriteByte('\n')
	}
}
