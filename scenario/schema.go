package scenario

import _ "embed"

// schemaJSON is the JSON Schema of the scenario file, written by hand
// beside the decoder; schema_test.go keeps the two in step.
//
//go:embed schema.json
var schemaJSON []byte

// Schema returns a JSON Schema (draft 2020-12) of the scenario file, for
// editors that complete and check YAML files against one. It describes
// what Parse accepts: the keys at each level, their types, the words of
// the enumerated keys and the ranges of the numbers, with the values that
// Parse reads in several forms (a number or none, a name or a list, a
// year written as a number). Rules that need the history, or that tie
// values of several keys together (low at most high, the scenarios' event
// ids, past occurrences before start), are checked by Parse and Resolve
// only. The caller may change the returned bytes.
func Schema() []byte { return append([]byte(nil), schemaJSON...) }
