// Package report holds the documents forelay writes for other programs:
// the JSON of a fitted series (Fit) and plan.json (Plan), with the reader
// of plan.json (ReadPlan) beside its writer, so that the two cannot drift
// apart. plan.json carries a version (PlanVersion); ReadPlan refuses a
// newer one. Numbers are written with 10 significant digits, and NaN and
// the infinities as null (Num).
//
// Report is the one model every command's run produces: the text for a
// person as blocks (lines and tables), the JSON document, the CSV table,
// the charts and the warnings; WriteText, JSON, CSVBytes and XLSX (the
// workbook, its cells typed by each table's column Kinds) are its
// writers, and a new output format (HTML) is one more writer of Report. ForPlan, Stress, Buffer, Compare, ForTrack, Fits and Check
// build the reports of the commands.
//
// A Book binds the reports of one plan (ForHandover, ForPortfolioHandover)
// into one document for "forelay report", and Book.HTML writes it as one
// self-contained HTML page laid out for A4 or Letter.
package report
