// Package report holds the documents forelay writes for other programs:
// the JSON of a fitted series (Fit) and plan.json (Plan), with the reader
// of plan.json (ReadPlan) beside its writer, so that the two cannot drift
// apart. plan.json carries a version (PlanVersion); ReadPlan refuses a
// newer one. Numbers are written with 10 significant digits, and NaN and
// the infinities as null (Num).
//
// It is the first part of the report model every command will share;
// the commands' other documents still live in cmd/forelay.
package report
