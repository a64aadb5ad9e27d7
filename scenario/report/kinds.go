package report

// A Kind says what a column of a Table holds, for a writer that stores
// typed cells (the workbook, Report.XLSX); the text and CSV writers
// ignore it. The cells of a number column hold plain numbers as the CSV
// file has them ("1234.50", "0.1250"); an empty cell is a missing value.
type Kind int

// The kinds of column.
const (
	// Label is text: a name, a period label, a verdict. The zero Kind.
	Label Kind = iota
	// Quantity is an amount in the plan's units (demand, capacity,
	// stock, an error), shown with two decimals.
	Quantity
	// Share is a probability, a utilisation or a share written as a
	// fraction (0.25 is 25%), shown as a percentage.
	Share
	// Percent is a percentage written in points (12.5 is 12.5%), shown
	// as a percentage: the workbook stores it as a fraction (0.125).
	Percent
	// Count is a whole number: a rank, a count of periods or series.
	Count
	// Ratio is a number without a unit (a tracking signal, a number of
	// standard deviations, MASE), shown with four decimals.
	Ratio
)

// Typed sets the kind of each column, in the order of Head, and returns
// t. A column past the end of kinds holds a Label.
func (t *Table) Typed(kinds ...Kind) *Table {
	t.Kinds = kinds
	return t
}

// KindOf returns the kind of column i.
func (t *Table) KindOf(i int) Kind {
	if i < len(t.Kinds) {
		return t.Kinds[i]
	}
	return Label
}

// kindsOf joins lists of kinds into one, for a table whose head is built
// in parts.
func kindsOf(parts ...[]Kind) []Kind {
	var out []Kind
	for _, p := range parts {
		out = append(out, p...)
	}
	return out
}

// repeatKind returns n copies of k: the kinds of the one column per event
// of plan.csv and compare.csv, say.
func repeatKind(k Kind, n int) []Kind {
	out := make([]Kind, n)
	for i := range out {
		out[i] = k
	}
	return out
}
