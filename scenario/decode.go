package scenario

import (
	"bytes"
	"errors"
	"fmt"
	"forelay/scenario/data"
	"io"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"gopkg.in/yaml.v3"

	"forelay/forecast"
)

// Sentinel errors, matched with errors.Is. Every problem in a scenario file
// comes back as a *data.ParseError (or an ErrorList of them) whose Err
// wraps one of these, or forecast.ErrBadPeriod for a label that cannot be
// read.
var (
	// ErrSyntax: the file is not well-formed YAML.
	ErrSyntax = errors.New("not valid YAML")
	// ErrUnknownKey: a key the schema does not have at that place.
	ErrUnknownKey = errors.New("unknown key")
	// ErrMissing: a required key is missing or has no value.
	ErrMissing = errors.New("required")
	// ErrType: a value of the wrong type (text where a number belongs).
	ErrType = errors.New("wrong type")
	// ErrValue: a value of the right type but outside what is allowed.
	ErrValue = errors.New("value not allowed")
	// ErrConflict: two keys that exclude each other are both given.
	ErrConflict = errors.New("conflicting keys")
	// ErrDuplicate: a key, id or name given twice.
	ErrDuplicate = errors.New("duplicate")
	// ErrUnknownEvent: a scenario names an event the file does not have.
	ErrUnknownEvent = errors.New("unknown event")
)

// problem is an error message that wraps a sentinel without repeating it.
type problem struct {
	kind error
	msg  string
}

func (p *problem) Error() string { return p.msg }
func (p *problem) Unwrap() error { return p.kind }

// An ErrorList holds several problems found in one file, sorted by
// position. Parse, Load and Resolve return a single *data.ParseError
// when there is one problem and an ErrorList when there are more; both
// work with errors.As and errors.Is.
type ErrorList []*data.ParseError

// Error prints one problem per line.
func (l ErrorList) Error() string {
	s := make([]string, len(l))
	for i, e := range l {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

// Unwrap returns the problems.
func (l ErrorList) Unwrap() []error {
	errs := make([]error, len(l))
	for i, e := range l {
		errs[i] = e
	}
	return errs
}

// Load reads and validates the scenario file at path (see Parse) under the
// default limits. An error opening or reading the file is returned as is.
func Load(path string) (*File, error) {
	return LoadLimited(path, Limits{})
}

// Parse reads a scenario file from r and validates everything that does
// not depend on the history (see File.Resolve for the rest). path is used
// in error messages and to resolve the relative paths in the file; it need
// not exist.
//
// The decoding is strict: unknown keys, keys given twice, values of the
// wrong type and values out of range are errors. Every problem found is
// reported, sorted by position, as a *data.ParseError naming the file,
// the 1-based line and column (in bytes) and the key path, such as
//
//	plan.yaml:7:5: event "fair-week": ramp.periods: must be at least 1
//
// (one problem) or an ErrorList (several). An error reading r is returned
// as is. The default limits apply (see ParseLimited).
func Parse(r io.Reader, path string) (*File, error) {
	return ParseLimited(r, path, Limits{})
}

// parse is Parse under the limits l, which must be complete.
func parse(r io.Reader, path string, l Limits) (*File, error) {
	src, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	src = bytes.TrimPrefix(src, []byte("\ufeff"))
	d := &decoder{
		reporter: &reporter{file: path, pos: map[string]Pos{}},
		lines:    bytes.Split(src, []byte("\n")),
		seenID:   map[string]int{},
		seenCase: map[string]int{},
		limits:   l,
	}
	root := d.document(src)
	if root == nil {
		return nil, d.err()
	}
	f := &File{
		Path:     path,
		Dir:      filepath.Dir(path),
		Limits:   l,
		Baseline: Baseline{Method: forecast.Auto},
		Bands:    Bands{Floor: new(float64)},
	}
	d.file(root, f)
	d.validate(f)
	if err := d.err(); err != nil {
		return nil, err
	}
	f.pos = d.pos
	return f, nil
}

// The keys allowed at each level, in the order the documentation gives
// them (which is also the order "did you mean" prefers on a tie).
var (
	topKeys        = []string{"plan", "history", "horizon", "baseline", "bands", "units", "events", "events-file", "scenarios", "capacity", "resources", "production"}
	historyKeys    = []string{"file", "series", "key", "levels", "period", "fill", "sheet", "decimal"}
	baselineKeys   = []string{"method", "season", "metric", "select", "alpha", "beta", "gamma", "phi", "window", "weights", "dummies", "damped", "mse_divisor", "refit", "holdout"}
	bandsKeys      = []string{"z", "coverage", "widen", "from", "floor"}
	eventKeys      = []string{"id", "kind", "start", "end", "periods", "effect", "ramp", "probability", "range", "payback", "past", "scope", "note", "owner"}
	effectKeys     = []string{"units", "percent", "from", "split"}
	rampKeys       = []string{"periods", "shape"}
	rangeKeys      = []string{"low", "high"}
	paybackKeys    = []string{"share", "periods"}
	scenarioKeys   = []string{"name", "events"}
	capacityKeys   = []string{"units", "changes"}
	changeKeys     = []string{"from", "units"}
	productionKeys = []string{"mode", "plan"}
)

// The values allowed for the enumerated keys.
var (
	fillValues       = []string{"none", "zero", "interpolate"}
	decimalValues    = []string{"point", "comma"}
	metricValues     = []string{"mad", "mse", "mape", "mase"}
	selectValues     = []string{"backtest", "aicc"}
	divisorValues    = []string{"n-1", "n"}
	widenValues      = []string{"horizon", "flat"}
	bandFromValues   = []string{"calibrated", "model"}
	kindValues       = []string{"step", "pulse"}
	shapeValues      = []string{"immediate", "linear", "s-curve"}
	fromValues       = []string{"past"}
	modeValues       = []string{"follow", "frozen"}
	idPattern        = regexp.MustCompile(`^[a-z0-9][a-z0-9-]*$`)
	yamlErrorPattern = regexp.MustCompile(`^yaml: line (\d+): (.*)$`)
)

// reporter collects problems and remembers where each decoded value
// stands.
type reporter struct {
	file string
	pos  map[string]Pos
	errs []*data.ParseError
}

// fail records a problem at a position.
func (r *reporter) fail(at Pos, field string, kind error, format string, args ...any) {
	r.failErr(at, field, &problem{kind: kind, msg: fmt.Sprintf(format, args...)})
}

// failErr records a problem whose error is already made.
func (r *reporter) failErr(at Pos, field string, err error) {
	r.errs = append(r.errs, at.errorIn(r.file, field, err))
}

// given reports whether the value at a key path was decoded without error.
func (r *reporter) given(field string) bool {
	_, ok := r.pos[field]
	return ok
}

// at returns the position of the value at a key path, or fallback.
func (r *reporter) at(field string, fallback Pos) Pos {
	if p, ok := r.pos[field]; ok {
		return p
	}
	return fallback
}

// err returns nil, the only problem, or all of them sorted by position
// (problems at the same place keep the order they were found in).
func (r *reporter) err() error {
	switch len(r.errs) {
	case 0:
		return nil
	case 1:
		return r.errs[0]
	}
	l := append(ErrorList(nil), r.errs...)
	sort.SliceStable(l, func(i, j int) bool {
		if l[i].Line != l[j].Line {
			return l[i].Line < l[j].Line
		}
		return l[i].Column < l[j].Column
	})
	return l
}

// join appends a key to a key path.
func join(path, key string) string {
	if path == "" || strings.HasSuffix(path, ": ") {
		return path + key
	}
	return path + "." + key
}

// index appends a list index to a key path.
func index(path string, i int) string { return fmt.Sprintf("%s[%d]", path, i) }

// decoder walks the YAML node tree of one file.
type decoder struct {
	*reporter
	lines    [][]byte
	seenID   map[string]int // event id -> line of first use
	seenCase map[string]int // scenario name -> line of first use
	seenRes  map[string]int // resource id -> line of first use
	refs     []caseRefs     // scenario event lists, linked after decoding
	limits   Limits         // complete (see Limits.orDefaults)
	// origin, when set, says that the nodes decoded were built from the
	// cells of an events file: their Line and Column are the cell's, in
	// origin's File and Sheet.
	origin *Pos
}

// caseRefs are the event ids one scenario lists.
type caseRefs struct {
	c      int    // index in File.Scenarios
	prefix string // key path of the scenario
	path   string // key path of its events list
	ids    []string
	pos    []Pos
}

// document parses the YAML text and returns its root node, or nil after
// recording a problem.
func (d *decoder) document(src []byte) *yaml.Node {
	dec := yaml.NewDecoder(bytes.NewReader(src))
	var doc yaml.Node
	if err := dec.Decode(&doc); err != nil {
		if err == io.EOF {
			d.fail(Pos{}, "", ErrMissing, "the file is empty")
		} else {
			d.syntax(err)
		}
		return nil
	}
	var extra yaml.Node
	switch err := dec.Decode(&extra); {
	case err == nil:
		d.fail(d.position(&extra), "", ErrSyntax, "a second YAML document; a scenario file holds one")
		return nil
	case err != io.EOF:
		d.syntax(err)
		return nil
	}
	if len(doc.Content) == 0 {
		d.fail(Pos{}, "", ErrMissing, "the file is empty")
		return nil
	}
	return doc.Content[0]
}

// parserProblems are the messages of yaml.v3's parser (as opposed to its
// scanner). For them yaml.v3 v3.0.1 prints a 0-based line (decode.go,
// parser.fail adds 1 for scanner errors only), so one is added here.
var parserProblems = []string{
	"did not find expected", // ',' or ']', ',' or '}', key, node content, '-' indicator, <document start>
	"found duplicate %",
	"found incompatible YAML document",
	"found undefined tag handle",
}

// scannerProblems are scanner messages that start like parser ones.
var scannerProblems = []string{
	"did not find expected alphabetic", "did not find expected whitespace", "did not find expected comment",
	"did not find expected '!'", "did not find expected tag", "did not find expected hex", "did not find URI",
}

// syntax records a YAML parser error, with its line when the parser gives
// one.
func (d *decoder) syntax(err error) {
	msg := err.Error()
	if m := yamlErrorPattern.FindStringSubmatch(msg); m != nil {
		line, _ := strconv.Atoi(m[1])
		if hasPrefix(m[2], parserProblems) && !hasPrefix(m[2], scannerProblems) {
			line++
		}
		d.fail(Pos{Line: line}, "", ErrSyntax, "%s", m[2])
		return
	}
	d.fail(Pos{}, "", ErrSyntax, "%s", strings.TrimPrefix(msg, "yaml: "))
}

// position returns the 1-based line and byte column of a node. The YAML
// parser counts columns in characters; this converts them to bytes.
func (d *decoder) position(n *yaml.Node) Pos {
	p := Pos{Line: n.Line, Column: n.Column}
	if d.origin != nil {
		p.File, p.Sheet = d.origin.File, d.origin.Sheet
		return p
	}
	if n.Line < 1 || n.Line > len(d.lines) || n.Column < 1 {
		return p
	}
	line := d.lines[n.Line-1]
	off := 0
	for i := 1; i < n.Column && off < len(line); i++ {
		_, size := utf8.DecodeRune(line[off:])
		off += size
	}
	p.Column = off + 1
	return p
}

// deref follows an alias to the node it names.
func deref(n *yaml.Node) *yaml.Node {
	for n != nil && n.Kind == yaml.AliasNode {
		n = n.Alias
	}
	return n
}

// got describes a node for a "want X, got Y" message.
func got(n *yaml.Node) string {
	switch {
	case n.Kind == yaml.MappingNode:
		return "a mapping"
	case n.Kind == yaml.SequenceNode:
		return "a list"
	case n.Tag == "!!null":
		return "nothing"
	}
	return strconv.Quote(n.Value)
}

// mapping is one decoded YAML mapping: its known keys and their values.
type mapping struct {
	d    *decoder
	path string
	node *yaml.Node
	vals map[string]*yaml.Node
}

// mapping checks that n is a mapping with only the given keys, each once,
// and returns it, or nil after recording a problem when n is no mapping.
func (d *decoder) mapping(n *yaml.Node, path string, keys []string) *mapping {
	n = deref(n)
	if n.Kind != yaml.MappingNode {
		d.fail(d.position(n), path, ErrType, "want a mapping of keys, got %s", got(n))
		return nil
	}
	m := &mapping{d: d, path: path, node: n, vals: map[string]*yaml.Node{}}
	first := map[string]int{}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := deref(n.Content[i]), n.Content[i+1]
		at := d.position(k)
		if k.Kind != yaml.ScalarNode {
			d.fail(at, path, ErrType, "want a key, got %s", got(k))
			continue
		}
		field := join(path, k.Value)
		if !slices.Contains(keys, k.Value) {
			d.fail(at, field, ErrUnknownKey, "unknown key%s", didYouMean(k.Value, keys))
			continue
		}
		if line, dup := first[k.Value]; dup {
			d.fail(at, field, ErrDuplicate, "key given twice (first on line %d)", line)
			continue
		}
		first[k.Value] = k.Line
		m.vals[k.Value] = v
	}
	return m
}

// hasPrefix reports whether s starts with one of the prefixes.
func hasPrefix(s string, prefixes []string) bool {
	for _, p := range prefixes {
		if strings.HasPrefix(s, p) {
			return true
		}
	}
	return false
}

// field returns the key path of a key.
func (m *mapping) field(key string) string { return join(m.path, key) }

// require records a problem for each missing key.
func (m *mapping) require(keys ...string) {
	for _, k := range keys {
		if _, ok := m.vals[k]; !ok {
			m.d.fail(m.d.position(m.node), m.field(k), ErrMissing, "required")
		}
	}
}

// sub returns the mapping under key, or nil when the key is absent or its
// value is no mapping.
func (m *mapping) sub(key string, keys []string) *mapping {
	v, ok := m.vals[key]
	if !ok {
		return nil
	}
	s := m.d.mapping(v, m.field(key), keys)
	if s != nil {
		m.d.pos[m.field(key)] = m.d.position(s.node)
	}
	return s
}

// scalar returns the node under key when it is a non-null scalar; it
// records a problem (want what) for any other node and returns nil when
// the key is absent.
func (m *mapping) scalar(key, what string) *yaml.Node {
	v, ok := m.vals[key]
	if !ok {
		return nil
	}
	return m.d.scalar(v, m.field(key), what)
}

// scalar returns n when it is a non-null scalar, or records a problem.
func (d *decoder) scalar(n *yaml.Node, field, what string) *yaml.Node {
	n = deref(n)
	if n.Kind != yaml.ScalarNode || n.Tag == "!!null" {
		d.fail(d.position(n), field, ErrType, "want %s, got %s", what, got(n))
		return nil
	}
	return n
}

// str decodes a text value into dst and reports whether it did.
func (m *mapping) str(key string, dst *string) bool {
	n := m.scalar(key, "text")
	if n == nil {
		return false
	}
	*dst = n.Value
	m.d.pos[m.field(key)] = m.d.position(n)
	return true
}

// num decodes a number into dst and reports whether it did.
func (m *mapping) num(key string, dst *float64) bool {
	v, ok := m.vals[key]
	if !ok {
		return false
	}
	x, ok := m.d.num(v, m.field(key))
	if ok {
		*dst = x
	}
	return ok
}

// num decodes a finite number; YAML integers and floats are accepted,
// quoted text is not.
func (d *decoder) num(v *yaml.Node, field string) (float64, bool) {
	n := d.scalar(v, field, "a number")
	if n == nil {
		return 0, false
	}
	var x float64
	if (n.Tag != "!!int" && n.Tag != "!!float") || n.Decode(&x) != nil {
		d.fail(d.position(n), field, ErrType, "want a number, got %q", n.Value)
		return 0, false
	}
	if x != x || x > 1e300 || x < -1e300 {
		d.fail(d.position(n), field, ErrValue, "want a finite number, got %q", n.Value)
		return 0, false
	}
	d.pos[field] = d.position(n)
	return x, true
}

// integer decodes a whole number into dst and reports whether it did.
func (m *mapping) integer(key string, dst *int) bool {
	n := m.scalar(key, "a whole number")
	if n == nil {
		return false
	}
	var x int
	if n.Tag != "!!int" || n.Decode(&x) != nil {
		m.d.fail(m.d.position(n), m.field(key), ErrType, "want a whole number, got %q", n.Value)
		return false
	}
	*dst = x
	m.d.pos[m.field(key)] = m.d.position(n)
	return true
}

// boolean decodes true or false into dst and reports whether it did.
func (m *mapping) boolean(key string, dst *bool) bool {
	n := m.scalar(key, "true or false")
	if n == nil {
		return false
	}
	var x bool
	if n.Tag != "!!bool" || n.Decode(&x) != nil {
		m.d.fail(m.d.position(n), m.field(key), ErrType, "want true or false, got %q", n.Value)
		return false
	}
	*dst = x
	m.d.pos[m.field(key)] = m.d.position(n)
	return true
}

// typed decodes one of the allowed words with parse into dst, a typed
// value, and reports whether it did; what names the value in the message.
// The allowed words and parse must agree: a word parse refuses is a bug.
func typed[T any](m *mapping, key, what string, allowed []string, parse func(string) (T, error), dst *T) bool {
	var word string
	if !m.enum(key, what, allowed, &word) {
		return false
	}
	v, err := parse(word)
	if err != nil {
		panic("scenario: " + what + " " + word + " allowed but not parsed: " + err.Error())
	}
	*dst = v
	return true
}

// enum decodes one of the allowed words into dst and reports whether it
// did; what names the value in the message ("metric").
func (m *mapping) enum(key, what string, allowed []string, dst *string) bool {
	n := m.scalar(key, "text")
	if n == nil {
		return false
	}
	if !slices.Contains(allowed, n.Value) {
		m.d.fail(m.d.position(n), m.field(key), ErrValue, "unknown %s %q; want %s%s",
			what, n.Value, orList(allowed), didYouMean(n.Value, allowed))
		return false
	}
	*dst = n.Value
	m.d.pos[m.field(key)] = m.d.position(n)
	return true
}

// orList writes "a, b or c".
func orList(words []string) string {
	if len(words) == 1 {
		return words[0]
	}
	return strings.Join(words[:len(words)-1], ", ") + " or " + words[len(words)-1]
}

// when decodes a period label or date into dst and reports whether it did.
func (m *mapping) when(key string, dst *When) bool {
	v, ok := m.vals[key]
	if !ok {
		return false
	}
	w, ok := m.d.when(v, m.field(key))
	if ok {
		*dst = w
	}
	return ok
}

// when decodes a period label or a date.
func (d *decoder) when(v *yaml.Node, field string) (When, bool) {
	n := d.scalar(v, field, "a period label or a date")
	if n == nil {
		return When{}, false
	}
	at := d.position(n)
	w, err := ParseWhen(n.Value)
	if err != nil {
		d.failErr(at, field, err)
		return When{}, false
	}
	w.Pos = at
	d.pos[field] = at
	return w, true
}

// list returns the items of the list under key, or nil (with a problem
// recorded when the value is no list).
func (m *mapping) list(key string) ([]*yaml.Node, bool) {
	v, ok := m.vals[key]
	if !ok {
		return nil, false
	}
	v = deref(v)
	if v.Kind != yaml.SequenceNode {
		m.d.fail(m.d.position(v), m.field(key), ErrType, "want a list, got %s", got(v))
		return nil, false
	}
	m.d.pos[m.field(key)] = m.d.position(v)
	return v.Content, true
}

// resolvePath resolves a path from the file against the file's directory.
func resolvePath(dir, p string) string {
	if p == "" || filepath.IsAbs(p) {
		return p
	}
	return filepath.Join(dir, p)
}

// file decodes the top level.
func (d *decoder) file(root *yaml.Node, f *File) {
	m := d.mapping(root, "", topKeys)
	if m == nil {
		return
	}
	m.require("plan", "history", "horizon")
	m.str("plan", &f.Plan)
	if h := m.sub("history", historyKeys); h != nil {
		d.history(h, f)
	}
	m.integer("horizon", &f.Horizon)
	if b := m.sub("baseline", baselineKeys); b != nil {
		d.baseline(b, &f.Baseline)
	}
	if b := m.sub("bands", bandsKeys); b != nil {
		b.num("z", &f.Bands.Z)
		b.num("coverage", &f.Bands.Coverage)
		typed(b, "widen", "widen", widenValues, forecast.ParseBandMode, &f.Bands.Widen)
		typed(b, "from", "band source", bandFromValues, forecast.ParseBandSource, &f.Bands.From)
		d.floor(b, &f.Bands)
		f.Bands.Pos = d.position(b.node)
	}
	m.str("units", &f.Units)
	if items, ok := m.list("events"); ok {
		for i, n := range items {
			if e := d.event(n, i); e != nil {
				f.Events = append(f.Events, e)
			}
		}
	}
	d.eventsFileKey(m, f)
	if items, ok := m.list("scenarios"); ok {
		for i, n := range items {
			d.scenario(n, i, f)
		}
	}
	if c := m.sub("capacity", capacityKeys); c != nil {
		f.Capacity = d.capacity(c)
	}
	if items, ok := m.list("resources"); ok {
		if len(items) == 0 {
			d.fail(d.at("resources", Pos{}), "resources", ErrValue, "an empty list; give at least one resource, or leave the key out")
		}
		for i, n := range items {
			if res := d.resource(n, i); res != nil {
				f.Resources = append(f.Resources, *res)
			}
		}
	}
	if p := m.sub("production", productionKeys); p != nil {
		pr := &Production{Mode: Follow, Pos: d.position(p.node)}
		typed(p, "mode", "mode", modeValues, ParseProductionMode, &pr.Mode)
		if p.str("plan", &pr.Plan) {
			pr.Plan = resolvePath(f.Dir, pr.Plan)
		}
		f.Production = pr
	}
}

// floor decodes bands.floor: a number, or the word none for no floor.
func (d *decoder) floor(m *mapping, b *Bands) {
	field := m.field("floor")
	n := m.scalar("floor", "a number or none")
	if n == nil {
		return
	}
	if n.Tag == "!!str" {
		if n.Value != "none" {
			d.fail(d.position(n), field, ErrType, "want a number or none, got %q%s", n.Value, didYouMean(strings.ToLower(n.Value), []string{"none"}))
			return
		}
		b.Floor = nil
		d.pos[field] = d.position(n)
		return
	}
	if x, ok := d.num(n, field); ok {
		b.Floor = &x
	}
}

// history decodes the history reference.
func (d *decoder) history(m *mapping, f *File) {
	h := &f.History
	h.Pos = d.position(m.node)
	m.require("file")
	if m.str("file", &h.File) {
		h.File = resolvePath(f.Dir, h.File)
	}
	d.seriesSelection(m, h)
	h.Key = d.names(m, "key", "a column name", true)
	h.Levels = d.names(m, "levels", "a level name", false)
	if h.Key != nil && h.Levels != nil && len(h.Key) != len(h.Levels) {
		d.fail(d.at(m.field("levels"), h.Pos), m.field("levels"), ErrValue,
			"names %s, but the key has %s; give one level per key column", count(len(h.Levels), "level"), count(len(h.Key), "column"))
	}
	if n := m.scalar("period", "a period name"); n != nil {
		fr, err := forecast.ParseFrequency(n.Value)
		if err != nil || fr == forecast.FreqUnknown {
			d.fail(d.position(n), m.field("period"), ErrValue, "unknown period %q; want day, week, month, quarter or year", n.Value)
		} else {
			h.Period = fr
			d.pos[m.field("period")] = d.position(n)
		}
	}
	typed(m, "fill", "fill", fillValues, data.ParseFillMode, &h.Fill)
	m.str("sheet", &h.Sheet)
	typed(m, "decimal", "decimal mark", decimalValues, data.ParseDecimalMark, &h.Decimal)
}

// baseline decodes the baseline settings.
func (d *decoder) baseline(m *mapping, b *Baseline) {
	b.Pos = d.position(m.node)
	if n := m.scalar("method", "a method name"); n != nil {
		meth, err := forecast.ParseMethod(n.Value)
		if err != nil {
			names := forecast.Methods()
			d.fail(d.position(n), m.field("method"), ErrValue, "unknown method %q; want %s%s",
				n.Value, orList(names), didYouMean(n.Value, names))
		} else {
			b.Method = meth
			d.pos[m.field("method")] = d.position(n)
		}
	}
	m.integer("season", &b.Config.Season)
	typed(m, "metric", "metric", metricValues, forecast.ParseMetric, &b.Metric)
	typed(m, "select", "selection", selectValues, forecast.ParseSelection, &b.Select)
	for _, p := range []struct {
		key string
		dst **float64
	}{
		{"alpha", &b.Config.Fixed.Alpha},
		{"beta", &b.Config.Fixed.Beta},
		{"gamma", &b.Config.Fixed.Gamma},
		{"phi", &b.Config.Fixed.Phi},
	} {
		var x float64
		if m.num(p.key, &x) {
			*p.dst = &x
		}
	}
	m.integer("window", &b.Config.Window)
	if items, ok := m.list("weights"); ok {
		ws := make([]float64, 0, len(items))
		good := true
		for i, n := range items {
			x, ok := d.num(n, index(m.field("weights"), i))
			good = good && ok
			ws = append(ws, x)
		}
		if good {
			b.Config.Weights = ws
		} else {
			delete(d.pos, m.field("weights"))
		}
	}
	m.boolean("dummies", &b.Config.Dummies)
	m.boolean("damped", &b.Config.Damped)
	typed(m, "mse_divisor", "divisor", divisorValues, forecast.ParseDivisor, &b.MSEDivisor)
	m.boolean("refit", &b.Refit)
	m.integer("holdout", &b.Holdout)
}

// scalarAt returns the value of key in a mapping node without checks, or
// nil.
func scalarAt(n *yaml.Node, key string) *yaml.Node {
	n = deref(n)
	if n == nil || n.Kind != yaml.MappingNode {
		return nil
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		if k := deref(n.Content[i]); k.Kind == yaml.ScalarNode && k.Value == key {
			if v := deref(n.Content[i+1]); v.Kind == yaml.ScalarNode && v.Tag != "!!null" {
				return v
			}
			return nil
		}
	}
	return nil
}

// event decodes one event. Its errors are named after its id
// (event "fair-week": ...) when it has a well-formed id not used before,
// else after its place in the list (events[2]...).
func (d *decoder) event(n *yaml.Node, i int) *Event {
	e := &Event{Probability: 1, path: index("events", i), Pos: d.position(deref(n))}
	if id := scalarAt(n, "id"); id != nil && idPattern.MatchString(id.Value) {
		if line, dup := d.seenID[id.Value]; dup {
			d.fail(d.position(id), join(e.path, "id"), ErrDuplicate, "event id %q already used on line %d", id.Value, line)
		} else {
			d.seenID[id.Value] = id.Line
			e.path = fmt.Sprintf("event %q: ", id.Value)
		}
	}
	m := d.mapping(n, e.path, eventKeys)
	if m == nil {
		return nil
	}
	m.require("id", "kind", "start")
	m.str("id", &e.ID)
	var kind string
	if m.enum("kind", "kind", kindValues, &kind) {
		e.Kind = Step
		if kind == "pulse" {
			e.Kind = Pulse
		}
	}
	m.when("start", &e.Start)
	e.HasEnd = m.when("end", &e.End)
	m.integer("periods", &e.Periods)
	if ef := m.sub("effect", effectKeys); ef != nil {
		d.effect(ef, &e.Effect)
	}
	if r := m.sub("ramp", rampKeys); r != nil {
		hasP := r.integer("periods", &e.Ramp.Periods)
		var shape string
		if r.enum("shape", "ramp shape", shapeValues, &shape) {
			e.Ramp.Shape = Shape(indexOf(shapeValues, shape))
		} else if hasP {
			e.Ramp.Shape = Linear
		}
	}
	m.num("probability", &e.Probability)
	if r := m.sub("range", rangeKeys); r != nil {
		r.require("low", "high")
		var rg Range
		okLow := r.num("low", &rg.Low)
		okHigh := r.num("high", &rg.High)
		if okLow && okHigh {
			e.Range = &rg
		}
	}
	if p := m.sub("payback", paybackKeys); p != nil {
		p.require("share")
		pb := Payback{Periods: 1}
		p.integer("periods", &pb.Periods)
		if p.num("share", &pb.Share) {
			e.Payback = &pb
		}
	}
	if items, ok := m.list("past"); ok {
		for j, n := range items {
			if w, ok := d.when(n, index(m.field("past"), j)); ok {
				e.Past = append(e.Past, w)
			} else {
				// Later checks go by index: skip them.
				delete(d.pos, m.field("past"))
			}
		}
	}
	if items, ok := m.list("scope"); ok {
		d.scope(items, m, e)
	}
	m.str("note", &e.Note)
	m.str("owner", &e.Owner)
	return e
}

func indexOf(list []string, s string) int {
	for i, x := range list {
		if x == s {
			return i
		}
	}
	return -1
}

// scenario decodes one scenario; its event ids are linked later.
func (d *decoder) scenario(n *yaml.Node, i int, f *File) {
	path := index("scenarios", i)
	if name := scalarAt(n, "name"); name != nil && idPattern.MatchString(name.Value) {
		if line, dup := d.seenCase[name.Value]; dup {
			d.fail(d.position(name), join(path, "name"), ErrDuplicate, "scenario name %q already used on line %d", name.Value, line)
		} else {
			d.seenCase[name.Value] = name.Line
			path = fmt.Sprintf("scenario %q: ", name.Value)
		}
	}
	m := d.mapping(n, path, scenarioKeys)
	if m == nil {
		return
	}
	c := Case{Pos: d.position(m.node)}
	m.require("name", "events")
	m.str("name", &c.Name)
	refs := caseRefs{c: len(f.Scenarios), prefix: path, path: m.field("events")}
	if items, ok := m.list("events"); ok {
		for j, n := range items {
			if s := d.scalar(n, index(refs.path, j), "an event id"); s != nil {
				refs.ids = append(refs.ids, s.Value)
				refs.pos = append(refs.pos, d.position(s))
			}
		}
	}
	d.refs = append(d.refs, refs)
	f.Scenarios = append(f.Scenarios, c)
}

// capacity decodes the capacity block.
func (d *decoder) capacity(m *mapping) *Capacity {
	c := &Capacity{Pos: d.position(m.node)}
	m.require("units")
	m.num("units", &c.Units)
	if items, ok := m.list("changes"); ok {
		for j, n := range items {
			cm := d.mapping(n, index(m.field("changes"), j), changeKeys)
			if cm == nil {
				delete(d.pos, m.field("changes"))
				continue
			}
			cm.require("from", "units")
			ch := CapacityChange{Pos: d.position(cm.node)}
			okFrom := cm.when("from", &ch.From)
			okUnits := cm.num("units", &ch.Units)
			if okFrom && okUnits {
				c.Changes = append(c.Changes, ch)
			} else {
				// Later checks go by index: skip them.
				delete(d.pos, m.field("changes"))
			}
		}
	}
	return c
}
