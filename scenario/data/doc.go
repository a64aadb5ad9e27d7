// Package data reads what a plan is made from: histories, actuals and
// production plans in CSV or in a workbook's sheet (.xlsx), wide or long,
// into forecast.Series. OpenRows reads the rows of either kind of table
// (the separator of a CSV file found from its header, decimal commas when
// asked), so that every reader shares one set of rules; see "Workbooks"
// and "CSV as spreadsheets save it".
//
// A wide file has a "period" column and one column per series (the header
// cell is the series name); a long file has the columns "series", "period"
// and "value" in any order. Period labels are months (2026-03), days
// (2026-03-15; weeks when 7 days apart), ISO weeks (2026-W11), quarters
// (2026-Q1) or years (2026). Every value is a plain decimal number
// (ParseDecimal); an empty cell is a missing value, filled only when asked
// (FillMode). Every problem is a *ParseError with the file, the 1-based
// line and column (in a workbook: the sheet, row and column, printed as a
// cell name such as C14) and the column name, wrapping one of the sentinel
// errors.
// Readers are bounded (BoundedReader) so that a wrong file ends in an error
// rather than a run that exhausts memory.
package data
