package scenario

import (
	"fmt"
	"slices"
	"strings"
	"unicode/utf8"

	"gopkg.in/yaml.v3"
)

// A Resource is something the plan's demand loads: a production line,
// a store, a crew. Its load in a period is the sum, over the series its
// pattern matches, of PerUnit times the series' demand.
type Resource struct {
	// ID names the resource: lower-case letters, digits and hyphens,
	// starting with a letter or digit, unique among the resources.
	ID string
	// Series is a series name or a pattern (see package scenario/series)
	// naming the series that load the resource; it must match at least one
	// series of the plan.
	Series string
	// PerUnit is the load one unit of demand puts on the resource (line
	// hours per litre, say), above 0.
	PerUnit float64
	// Units is an optional label for the load (line-hours); empty means
	// none.
	Units string
	// Capacity, when not nil, is the most load the resource takes per
	// period, with dated changes, in the resource's units; nil means the
	// load is reported without a limit.
	Capacity *Capacity
	// Pos is where the resource's list item stands.
	Pos Pos

	// path is the key path the resource's errors start with.
	path string
}

// CapacityResource is the id of the resource that a top-level capacity
// stands for (see File.AllResources).
const CapacityResource = "capacity"

// TotalResource is the word the stress outputs of a portfolio use for the
// sum of every series, beside the resources' ids: no resource takes it.
const TotalResource = "total"

// The keys of a resource.
var resourceKeys = []string{"id", "series", "per-unit", "units", "capacity"}

// prefix returns the start of the key paths of the resource's errors.
func (res *Resource) prefix() string {
	if res.path != "" {
		return res.path
	}
	return fmt.Sprintf("resource %q: ", res.ID)
}

// field returns the key path of one of the resource's keys.
func (res *Resource) field(key string) string { return join(res.prefix(), key) }

// AllResources returns the file's resources or, when it lists none, the
// resource its top-level capacity stands for: id "capacity", every series
// ("**"), a per-unit of 1, the file's units and its capacity. It returns
// nil when the file has neither. Parse refuses a file with both.
func (f *File) AllResources() []Resource {
	if len(f.Resources) > 0 {
		return append([]Resource(nil), f.Resources...)
	}
	if f.Capacity == nil {
		return nil
	}
	return []Resource{{ID: CapacityResource, Series: "**", PerUnit: 1, Units: f.Units, Capacity: f.Capacity, Pos: f.Capacity.Pos}}
}

// PickResources returns the resources of AllResources whose ids are in
// ids, in file order, or all of them when ids is empty. An id the file
// has no resource for is an error that names the ids there are.
func (f *File) PickResources(ids []string) ([]Resource, error) {
	all := f.AllResources()
	if len(ids) == 0 {
		return all, nil
	}
	have := make([]string, len(all))
	for i, r := range all {
		have[i] = r.ID
	}
	for _, id := range ids {
		if !slices.Contains(have, id) {
			if len(have) == 0 {
				return nil, fmt.Errorf("%q: %s has no resources and no capacity", id, f.Path)
			}
			return nil, fmt.Errorf("%q: %s has no such resource (it has %s)", id, f.Path, strings.Join(have, ", "))
		}
	}
	var out []Resource
	for _, r := range all {
		if slices.Contains(ids, r.ID) {
			out = append(out, r)
		}
	}
	return out, nil
}

// resource decodes one resource. Its errors are named after its id
// (resource "bottling-1": ...) when it has a well-formed id not used
// before, else after its place in the list (resources[2]...).
func (d *decoder) resource(n *yaml.Node, i int) *Resource {
	res := &Resource{path: index("resources", i), Pos: d.position(deref(n))}
	if id := scalarAt(n, "id"); id != nil && idPattern.MatchString(id.Value) {
		if d.seenRes == nil {
			d.seenRes = map[string]int{}
		}
		if line, dup := d.seenRes[id.Value]; dup {
			d.fail(d.position(id), join(res.path, "id"), ErrDuplicate, "resource id %q already used on line %d", id.Value, line)
		} else {
			d.seenRes[id.Value] = id.Line
			res.path = fmt.Sprintf("resource %q: ", id.Value)
		}
	}
	m := d.mapping(n, res.path, resourceKeys)
	if m == nil {
		return nil
	}
	m.require("id", "series", "per-unit")
	m.str("id", &res.ID)
	if v, ok := m.vals["series"]; ok {
		if sel, ok := d.selector(v, m.field("series")); ok {
			res.Series = sel.Pattern
		}
	}
	m.num("per-unit", &res.PerUnit)
	m.str("units", &res.Units)
	if c := m.sub("capacity", capacityKeys); c != nil {
		res.Capacity = d.capacity(c)
	}
	return res
}

// checkResources checks the resources: valid ids, a per-unit above 0, the
// capacity blocks, and no top-level capacity beside them.
func (d *decoder) checkResources(f *File) {
	for _, res := range f.Resources {
		idf := res.field("id")
		if d.given(idf) && !idPattern.MatchString(res.ID) {
			d.fail(d.at(idf, res.Pos), idf, ErrValue,
				"%q is not a valid id; use lower-case letters, digits and hyphens, starting with a letter or digit", res.ID)
		} else if c := utf8.RuneCountInString(res.ID); c > d.limits.NameLength {
			d.fail(d.at(idf, res.Pos), idf, ErrValue, "a name of %s", limitError(c, d.limits.NameLength, "characters", "name-length"))
		}
		if res.ID == TotalResource {
			d.fail(d.at(idf, res.Pos), idf, ErrValue,
				"%q names the sum of every series in the stress outputs; give the resource another id", res.ID)
		}
		if pf := res.field("per-unit"); d.given(pf) && res.PerUnit <= 0 {
			d.fail(d.at(pf, res.Pos), pf, ErrValue, "must be above 0 (the load one unit of demand puts on the resource), got %g", res.PerUnit)
		}
		if res.Capacity != nil {
			d.checkCapacity(res.Capacity, res.field("capacity"))
		}
	}
	if f.Capacity != nil && len(f.Resources) > 0 {
		d.fail(d.at("capacity", f.Capacity.Pos), "capacity", ErrConflict,
			"capacity is shorthand for one resource over every series; with resources, list it as one of them "+
				"({id: capacity, series: \"**\", per-unit: 1, capacity: {...}}) and leave out the top-level key")
	}
}
