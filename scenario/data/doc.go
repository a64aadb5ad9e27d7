// Package data reads what a plan is made from: histories, actuals and
// production plans in CSV, wide or long, into forecast.Series.
//
// A wide file has a "period" column and one column per series (the header
// cell is the series name); a long file has the columns "series", "period"
// and "value" in any order. Period labels are months (2026-03), days
// (2026-03-15; weeks when 7 days apart), ISO weeks (2026-W11), quarters
// (2026-Q1) or years (2026). Every value is a plain decimal number
// (ParseDecimal); an empty cell is a missing value, filled only when asked
// (FillMode). Every problem is a *ParseError with the file, the 1-based
// line and column and the column name, wrapping one of the sentinel errors.
// Readers are bounded (BoundedReader) so that a wrong file ends in an error
// rather than a run that exhausts memory.
package data
