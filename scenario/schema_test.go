package scenario

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/rogpeppe/go-internal/txtar"
	"github.com/santhosh-tekuri/jsonschema/v6"
	"gopkg.in/yaml.v3"

	"forelay/forecast"
)

// compiledSchema compiles Schema with the reference validator; the
// compiler also checks the schema against the 2020-12 meta-schema.
func compiledSchema(t *testing.T) *jsonschema.Schema {
	t.Helper()
	doc, err := jsonschema.UnmarshalJSON(bytes.NewReader(Schema()))
	if err != nil {
		t.Fatalf("schema.json is not JSON: %v", err)
	}
	c := jsonschema.NewCompiler()
	if err := c.AddResource("forelay.schema.json", doc); err != nil {
		t.Fatal(err)
	}
	sch, err := c.Compile("forelay.schema.json")
	if err != nil {
		t.Fatalf("schema.json does not compile: %v", err)
	}
	return sch
}

// yamlValue reads a YAML document with yaml.v3 into interface values, as
// an editor's YAML support hands them to a JSON Schema validator: maps
// with text keys, a date (which yaml.v3 reads as a time) back as its
// label.
func yamlValue(src []byte) (any, error) {
	var v any
	if err := yaml.Unmarshal(bytes.TrimPrefix(src, []byte("\ufeff")), &v); err != nil {
		return nil, err
	}
	return jsonLike(v), nil
}

// jsonLike turns what yaml.v3 decodes into the values of JSON.
func jsonLike(v any) any {
	switch x := v.(type) {
	case map[string]any:
		for k, e := range x {
			x[k] = jsonLike(e)
		}
		return x
	case map[any]any:
		m := make(map[string]any, len(x))
		for k, e := range x {
			m[fmt.Sprint(k)] = jsonLike(e)
		}
		return m
	case []any:
		for i, e := range x {
			x[i] = jsonLike(e)
		}
		return x
	case time.Time:
		if x.Equal(x.Truncate(24 * time.Hour)) {
			return x.Format(time.DateOnly)
		}
		return x.Format(time.RFC3339Nano)
	}
	return v
}

// schemaNode returns the object at a path of keys in the schema document.
func schemaNode(t *testing.T, doc map[string]any, path ...string) map[string]any {
	t.Helper()
	var cur any = doc
	for _, k := range path {
		m, ok := cur.(map[string]any)
		if !ok {
			t.Fatalf("schema: %s: not an object", strings.Join(path, "/"))
		}
		cur = m[k]
	}
	m, ok := cur.(map[string]any)
	if !ok {
		t.Fatalf("schema: %s: not an object", strings.Join(path, "/"))
	}
	return m
}

// schemaDoc is the schema as generic JSON.
func schemaDoc(t *testing.T) map[string]any {
	t.Helper()
	var doc map[string]any
	if err := json.Unmarshal(Schema(), &doc); err != nil {
		t.Fatal(err)
	}
	return doc
}

// sortedKeys returns the keys of m, sorted.
func sortedKeys(m map[string]any) []string {
	var out []string
	for k := range m {
		out = append(out, k)
	}
	slices.Sort(out)
	return out
}

// sorted returns a sorted copy of words.
func sorted(words []string) []string {
	out := slices.Clone(words)
	slices.Sort(out)
	return out
}

// TestSchemaKeys checks that every mapping of the schema has the keys the
// decoder accepts at that place, no more and no fewer, and no others.
func TestSchemaKeys(t *testing.T) {
	doc := schemaDoc(t)
	without := func(keys []string, drop string) []string {
		return slices.DeleteFunc(slices.Clone(keys), func(k string) bool { return k == drop })
	}
	for _, tc := range []struct {
		path []string
		keys []string
	}{
		{nil, topKeys},
		{[]string{"$defs", "history"}, historyKeys},
		{[]string{"$defs", "baseline"}, baselineKeys},
		{[]string{"$defs", "bands"}, bandsKeys},
		{[]string{"$defs", "event"}, eventKeys},
		{[]string{"$defs", "effect"}, effectKeys},
		// A scope entry's own effect takes no split (checkEntryEffect).
		{[]string{"$defs", "entryEffect"}, without(effectKeys, "split")},
		{[]string{"$defs", "scopeEntry"}, scopeKeys},
		{[]string{"$defs", "ramp"}, rampKeys},
		{[]string{"$defs", "range"}, rangeKeys},
		{[]string{"$defs", "payback"}, paybackKeys},
		{[]string{"$defs", "scenario"}, scenarioKeys},
		{[]string{"$defs", "capacity"}, capacityKeys},
		{[]string{"$defs", "change"}, changeKeys},
		{[]string{"$defs", "resource"}, resourceKeys},
		{[]string{"$defs", "production"}, productionKeys},
	} {
		name := "/" + strings.Join(tc.path, "/")
		obj := schemaNode(t, doc, tc.path...)
		props := schemaNode(t, obj, "properties")
		if got, want := sortedKeys(props), sorted(tc.keys); !slices.Equal(got, want) {
			t.Errorf("%s: properties %v, the decoder's keys %v", name, got, want)
		}
		if obj["additionalProperties"] != false {
			t.Errorf("%s: additionalProperties is %v, want false (the decoder refuses unknown keys)", name, obj["additionalProperties"])
		}
	}
	// Every mapping of the file is one of those above.
	objects := 0
	for _, def := range schemaNode(t, doc, "$defs") {
		if m, ok := def.(map[string]any); ok && m["type"] == "object" {
			objects++
		}
	}
	if want := 15; objects != want {
		t.Errorf("%d object definitions in $defs, want %d (add the new one to the table above)", objects, want)
	}
}

// enumOf returns the enum at a path of the schema as strings.
func enumOf(t *testing.T, doc map[string]any, path ...string) []string {
	t.Helper()
	raw, ok := schemaNode(t, doc, path...)["enum"].([]any)
	if !ok {
		t.Fatalf("schema: %s has no enum", strings.Join(path, "/"))
	}
	out := make([]string, len(raw))
	for i, w := range raw {
		out[i] = fmt.Sprint(w)
	}
	return out
}

// TestSchemaEnums checks that the words of every enumerated key are the
// decoder's, and the pattern of names is the decoder's.
func TestSchemaEnums(t *testing.T) {
	doc := schemaDoc(t)
	p := func(def, key string) []string { return []string{"$defs", def, "properties", key} }
	for _, tc := range []struct {
		path  []string
		words []string
	}{
		{p("history", "fill"), fillValues},
		{p("baseline", "metric"), metricValues},
		{p("baseline", "select"), selectValues},
		{p("baseline", "mse_divisor"), divisorValues},
		{p("bands", "widen"), widenValues},
		{p("bands", "from"), bandFromValues},
		{p("event", "kind"), kindValues},
		{p("ramp", "shape"), shapeValues},
		{p("effect", "from"), fromValues},
		{p("effect", "split"), splitValues},
		{p("production", "mode"), modeValues},
	} {
		if got := enumOf(t, doc, tc.path...); !slices.Equal(got, tc.words) {
			t.Errorf("/%s: enum %v, the decoder's words %v", strings.Join(tc.path, "/"), got, tc.words)
		}
	}
	// The methods, in any case, as forecast.ParseMethod reads them.
	methods := schemaNode(t, doc, "$defs", "method")["anyOf"].([]any)
	words := enumOf(t, methods[0].(map[string]any))
	if got, want := sorted(words), sorted(forecast.Methods()); !slices.Equal(got, want) {
		t.Errorf("method enum %v, forecast.Methods() %v", got, want)
	}
	if got, want := methods[1].(map[string]any)["pattern"], anyCasePattern(words); got != want {
		t.Errorf("method pattern\n%v\nwant\n%v", got, want)
	}
	// The period words, as forecast.ParseFrequency reads them (it
	// lists them in its switch only).
	periods := schemaNode(t, doc, "$defs", "period")["anyOf"].([]any)
	if got, want := periods[1].(map[string]any)["pattern"], anyCasePattern(periodWords); got != want {
		t.Errorf("period pattern\n%v\nwant\n%v", got, want)
	}
	for _, w := range append(enumOf(t, periods[0].(map[string]any)), periodWords...) {
		if f, err := forecast.ParseFrequency(w); err != nil || f == forecast.FreqUnknown {
			t.Errorf("period %q of the schema: forecast.ParseFrequency refuses it (%v)", w, err)
		}
	}
	name := schemaNode(t, doc, "$defs", "name")["anyOf"].([]any)[0].(map[string]any)["pattern"]
	if name != idPattern.String() {
		t.Errorf("name pattern %v, the decoder's %v", name, idPattern)
	}
}

// periodWords are the words forecast.ParseFrequency reads (ignoring case
// and surrounding spaces), from its switch.
var periodWords = []string{"day", "daily", "d", "week", "weekly", "w", "month", "monthly", "m",
	"quarter", "quarterly", "q", "year", "yearly", "annual", "y"}

// anyCasePattern is the ECMA-262 pattern of words in any case with
// surrounding spaces, as the schema writes it ((?i) is not ECMA-262).
func anyCasePattern(words []string) string {
	alts := make([]string, len(words))
	for i, w := range words {
		var b strings.Builder
		for _, r := range w {
			if u, l := strings.ToUpper(string(r)), strings.ToLower(string(r)); u != l {
				b.WriteString("[" + u + l + "]")
			} else {
				b.WriteRune(r)
			}
		}
		alts[i] = b.String()
	}
	return `^\s*(` + strings.Join(alts, "|") + `)\s*$`
}

// scenarioFiles returns the scenario files of the repository's examples
// and test data, by name: the examples, the starter of forelay init, the
// scenario test data, the catalogue of bad inputs (whose files the decoder
// accepts are wrong in some other way) and the YAML files inside the test
// scripts.
func scenarioFiles(t *testing.T) map[string][]byte {
	t.Helper()
	files := map[string][]byte{}
	var paths []string
	for _, glob := range []string{"../examples/*/*.yaml", "../cmd/forelay/starter/*.yaml", "../testdata/scenario/*.yaml", "../testdata/bad/*/*.yaml"} {
		m, err := filepath.Glob(glob)
		if err != nil {
			t.Fatal(err)
		}
		paths = append(paths, m...)
	}
	for _, p := range paths {
		src, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		files[p] = src
	}
	scripts, err := filepath.Glob("../cmd/forelay/testdata/script/*.txtar")
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range scripts {
		a, err := txtar.ParseFile(s)
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range a.Files {
			if ext := filepath.Ext(f.Name); ext == ".yaml" || ext == ".yml" {
				files[s+":"+f.Name] = f.Data
			}
		}
	}
	if len(files) < 50 {
		t.Fatalf("found %d scenario files; the globs above are stale", len(files))
	}
	return files
}

// TestSchemaAcceptsTheFiles validates every example and test scenario
// that the decoder accepts against the schema.
func TestSchemaAcceptsTheFiles(t *testing.T) {
	sch := compiledSchema(t)
	accepted := 0
	files := scenarioFiles(t)
	for name, src := range files {
		if _, err := Parse(bytes.NewReader(src), filepath.Join(t.TempDir(), "plan.yaml")); err != nil {
			continue // a file the tests expect to fail
		}
		accepted++
		v, err := yamlValue(src)
		if err != nil {
			t.Errorf("%s: yaml.v3: %v", name, err)
			continue
		}
		if err := sch.Validate(v); err != nil {
			t.Errorf("%s: the decoder accepts it, the schema does not:\n%v", name, err)
		}
	}
	// From a count of the files on the day this test was written: 4
	// examples and starters, 3 scenario test files and 40-odd scripts'
	// files, some of them wrong on purpose.
	t.Logf("%d of %d scenario files accepted by the decoder and validated", accepted, len(files))
	if accepted < 30 {
		t.Errorf("only %d scenario files accepted by the decoder; want at least 30", accepted)
	}
}

// schemaHead is the smallest valid start of a file, as head in
// decode_test.go, with a second key so the cases can add to history.
const schemaHead = "plan: p\nhorizon: 12\n"

// TestSchemaForms checks that the forms the decoder reads in several ways
// are allowed by the schema, and that typical mistakes fail both.
func TestSchemaForms(t *testing.T) {
	sch := compiledSchema(t)
	h := schemaHead + "history: {file: h.csv}\n"
	ev := func(body string) string {
		return h + "events:\n  - {id: a, kind: step, start: 2027-02, " + body + "}\n"
	}
	pulse := func(body string) string {
		return h + "events:\n  - {id: a, kind: pulse, start: 2027-02, " + body + "}\n"
	}
	for _, tc := range []struct {
		name string
		src  string
		ok   bool // both accept; else both refuse
	}{
		{"smallest file", h, true},
		{"floor a number", h + "bands: {floor: -5}\n", true},
		{"floor none", h + "bands: {floor: none}\n", true},
		{"series one name", schemaHead + "history: {file: h.csv, series: bottled-l}\n", true},
		{"series a pattern", schemaHead + "history: {file: h.csv, series: \"milk/**\"}\n", true},
		{"series a list", schemaHead + "history: {file: h.csv, series: [milk/whole, \"cream/*\"]}\n", true},
		{"period in capitals", schemaHead + "history: {file: h.csv, period: Monthly}\n", true},
		{"method in capitals", h + "baseline: {method: Holt-Winters-Additive}\n", true},
		{"year as a number", ev("end: 2028, effect: {units: 5}"), true},
		{"month", ev("effect: {units: 5}"), true},
		{"date", h + "events:\n  - {id: a, kind: step, start: 2027-02-14, effect: {units: 5}}\n", true},
		{"quarter", h + "events:\n  - {id: a, kind: step, start: 2027-Q3, effect: {percent: 5}}\n", true},
		{"iso week", h + "events:\n  - {id: a, kind: pulse, start: 2027-W33, effect: {units: 5}}\n", true},
		{"past occurrences", pulse("effect: {from: past}, past: [2025-02, 2026-02]"), true},
		{"note a number", ev("effect: {units: 5}, note: 2027"), true},
		{"plan a number", "plan: 2027\nhorizon: 12\nhistory: {file: h.csv}\n", true},
		{"scope with its own effect", ev("scope: [{series: \"*/x\", effect: {units: 3}}, {series: a/b, new: true, effect: {units: 2}}]"), true},
		{"split", ev("effect: {units: 10, split: equal}, scope: [{series: \"*/x\"}]"), true},
		{"immediate ramp", ev("effect: {units: 5}, ramp: {shape: immediate}"), true},
		{"ramp by periods", ev("effect: {units: 5}, ramp: {periods: 2}"), true},
		{"payback", pulse("effect: {units: 5}, payback: {share: 0.5}"), true},
		{"resources", h + "resources:\n  - {id: line-1, series: \"**\", per-unit: 0.5, capacity: {units: 10, changes: [{from: 2027-06, units: 12}]}}\n", true},
		{"scenarios", ev("effect: {units: 5}") + "scenarios: [{name: none, events: []}, {name: all, events: [a]}]\n", true},
		{"production", h + "production: {mode: frozen, plan: prev.csv}\n", true},
		{"coverage", h + "bands: {coverage: 0.9, widen: flat, from: model}\n", true},

		{"unknown top key", h + "colour: red\n", false},
		{"unknown event key", ev("effect: {units: 5}, probabilty: 0.5"), false},
		{"missing plan", "horizon: 12\nhistory: {file: h.csv}\n", false},
		{"missing history file", schemaHead + "history: {series: a}\n", false},
		{"horizon quoted", "plan: p\nhorizon: \"12\"\nhistory: {file: h.csv}\n", false},
		{"horizon zero", "plan: p\nhorizon: 0\nhistory: {file: h.csv}\n", false},
		{"horizon fraction", "plan: p\nhorizon: 1.5\nhistory: {file: h.csv}\n", false},
		{"plan name with spaces", "plan: North Plant\nhorizon: 12\nhistory: {file: h.csv}\n", false},
		{"probability 1.5", ev("effect: {units: 5}, probability: 1.5"), false},
		{"probability as text", ev("effect: {units: 5}, probability: likely"), false},
		{"per-unit 0", h + "resources: [{id: r, series: \"**\", per-unit: 0}]\n", false},
		{"resource called total", h + "resources: [{id: total, series: \"**\", per-unit: 1}]\n", false},
		{"capacity 0", h + "capacity: {units: 0}\n", false},
		{"capacity beside resources", h + "capacity: {units: 5}\nresources: [{id: r, series: \"**\", per-unit: 1}]\n", false},
		{"percent below -100", ev("effect: {percent: -150}"), false},
		{"unknown kind", h + "events:\n  - {id: a, kind: spike, start: 2027-02, effect: {units: 5}}\n", false},
		{"unknown shape", ev("effect: {units: 5}, ramp: {periods: 2, shape: cubic}"), false},
		{"unknown method", h + "baseline: {method: arima}\n", false},
		{"alpha above 1", h + "baseline: {alpha: 1.2}\n", false},
		{"negative weight", h + "baseline: {weights: [1, -1]}\n", false},
		{"z and coverage", h + "bands: {z: 2, coverage: 0.9}\n", false},
		{"coverage 1", h + "bands: {coverage: 1}\n", false},
		{"floor text", h + "bands: {floor: nothing}\n", false},
		{"two effects", ev("effect: {units: 5, percent: 3}"), false},
		{"no effect size", ev("effect: {split: equal}"), false},
		{"split on an entry", ev("effect: {units: 5}, scope: [{series: a, effect: {units: 1, split: equal}}]"), false},
		{"step with periods", ev("effect: {units: 5}, periods: 2"), false},
		{"pulse with a ramp", pulse("effect: {units: 5}, ramp: {periods: 2}"), false},
		{"pulse with periods and end", pulse("effect: {units: 5}, periods: 2, end: 2027-05"), false},
		{"linear ramp without periods", ev("effect: {units: 5}, ramp: {shape: linear}"), false},
		{"bad date", ev("effect: {units: 5}, end: next-year"), false},
		{"empty scope", ev("effect: {units: 5}, scope: []"), false},
		{"empty resources", h + "resources: []\n", false},
		{"range without high", ev("effect: {units: 5}, range: {low: 1}"), false},
		{"payback share 2", pulse("effect: {units: 5}, payback: {share: 2}"), false},
		{"unknown fill", schemaHead + "history: {file: h.csv, fill: linear}\n", false},
		{"scenario without events", ev("effect: {units: 5}") + "scenarios: [{name: s}]\n", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, decErr := Parse(strings.NewReader(tc.src), "plan.yaml")
			v, err := yamlValue([]byte(tc.src))
			if err != nil {
				t.Fatalf("yaml.v3: %v", err)
			}
			schErr := sch.Validate(v)
			if tc.ok && (decErr != nil || schErr != nil) {
				t.Errorf("want both to accept:\n%s\ndecoder: %v\nschema: %v", tc.src, decErr, schErr)
			}
			if !tc.ok && (decErr == nil || schErr == nil) {
				t.Errorf("want both to refuse:\n%s\ndecoder: %v\nschema: %v", tc.src, decErr, schErr)
			}
		})
	}
}
