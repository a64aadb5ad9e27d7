package series

import (
	"errors"
	"slices"
	"testing"
)

// The rules are this package's own (see doc.go); every expected value below
// is read off the pattern and the name by hand, level by level.
func TestMatch(t *testing.T) {
	cases := []struct {
		pattern, name string
		want          bool
	}{
		// exact names
		{"milk", "milk", true},
		{"milk", "milks", false},
		{"milk/whole-1l/grocer-north", "milk/whole-1l/grocer-north", true},
		{"milk/whole-1l/grocer-north", "milk/whole-1l/grocer-south", false},
		{"milk/whole-1l", "milk/whole-1l/grocer-north", false}, // a prefix of levels is not the name
		// * within a level
		{"*", "milk", true},
		{"*", "milk/whole-1l", false}, // * never crosses a /
		{"whole-*", "whole-1l", true},
		{"whole-*", "whole-", true}, // * matches the empty run
		{"*-1l", "skim-1l", true},
		{"w*l*", "whole-1l", true},
		{"w*x", "whole-1l", false},
		{"milk/*", "milk/whole-1l", true},
		{"milk/*", "milk", false}, // * is one level, not zero
		{"*/*/grocer-north", "milk/whole-1l/grocer-north", true},
		{"*/*/grocer-north", "butter/salted-250g/grocer-north", true},
		{"*/*/grocer-north", "milk/grocer-north", false}, // depth 2, the pattern wants 3
		{"*/*/x", "a/b/x", true},
		{"*/*/x", "a/b/c/x", false},
		{"*/*/x", "a/b/y", false},
		// ** at the start
		{"**/grocer-north", "grocer-north", true}, // zero levels
		{"**/grocer-north", "milk/whole-1l/grocer-north", true},
		{"**/grocer-north", "milk/whole-1l/grocer-south", false},
		// ** in the middle
		{"milk/**/grocer-north", "milk/grocer-north", true},
		{"milk/**/grocer-north", "milk/whole-1l/grocer-north", true},
		{"milk/**/grocer-north", "milk/whole-1l/crate/grocer-north", true},
		{"milk/**/grocer-north", "cream/whole-1l/grocer-north", false},
		// ** at the end
		{"milk/**", "milk", true},
		{"milk/**", "milk/whole-1l/grocer-north", true},
		{"milk/**", "milky/whole-1l", false},
		{"**", "milk/whole-1l/grocer-north", true},
		{"**", "milk", true},
		// ** and * together, two **
		{"**/*-1l/**", "milk/whole-1l/grocer-north", true},
		{"**/*-1l/**", "milk/whole-2l/grocer-north", false},
		{"**/a/**/b/**", "x/a/y/z/b", true},
		{"**/a/**/b/**", "b/a", false},
		// no other special characters
		{"milk?", "milkA", false},
		{"milk[1]", "milk[1]", true},
		{`a\*`, `a\b`, true}, // no escapes: \ is literal and * a wildcard
		// not patterns: match nothing
		{"", "", false},
		{"milk/", "milk/", false},
		{"a**", "abc", false},
	}
	for _, c := range cases {
		if got := Match(c.pattern, c.name); got != c.want {
			t.Errorf("Match(%q, %q) = %v, want %v", c.pattern, c.name, got, c.want)
		}
	}
}

func TestCheck(t *testing.T) {
	good := []string{"milk", "milk/whole-1l", "**", "**/x", "a/**/b", "*/*/x", "whole-*"}
	for _, p := range good {
		if err := Check(p); err != nil {
			t.Errorf("Check(%q) = %v, want nil", p, err)
		}
	}
	bad := []string{"", "/milk", "milk/", "milk//x", "a**", "**b", "a/***/b"}
	for _, p := range bad {
		if err := Check(p); !errors.Is(err, ErrBadPattern) {
			t.Errorf("Check(%q) = %v, want ErrBadPattern", p, err)
		}
	}
}

func TestSelect(t *testing.T) {
	names := []string{
		"milk/whole-1l/grocer-north",
		"milk/whole-1l/grocer-south",
		"milk/skim-1l/grocer-north",
		"butter/salted-250g/grocer-north",
	}
	cases := []struct {
		name          string
		patterns      []string
		want, unmatch []string
	}{
		{"one exact name", []string{"milk/skim-1l/grocer-north"}, []string{"milk/skim-1l/grocer-north"}, nil},
		// file order, not pattern order; each name once although two patterns match it
		{"file order and no duplicates", []string{"*/*/grocer-north", "milk/**"},
			[]string{names[0], names[1], names[2], names[3]}, nil},
		{"last level", []string{"**/grocer-south"}, []string{names[1]}, nil},
		{"one unmatched", []string{"milk/**", "cheese/**", "yogurt"},
			[]string{names[0], names[1], names[2]}, []string{"cheese/**", "yogurt"}},
		{"no patterns", nil, nil, nil},
	}
	for _, c := range cases {
		got, un := Select(c.patterns, names)
		if !slices.Equal(got, c.want) || !slices.Equal(un, c.unmatch) {
			t.Errorf("%s: Select = %q, %q; want %q, %q", c.name, got, un, c.want, c.unmatch)
		}
	}
}

func TestDepth(t *testing.T) {
	for name, want := range map[string]int{"milk": 1, "milk/whole-1l": 2, "milk/whole-1l/grocer-north": 3} {
		if got := Depth(name); got != want {
			t.Errorf("Depth(%q) = %d, want %d", name, got, want)
		}
	}
}

// TestMatchAllocs guards that Match allocates nothing for patterns and
// names of up to stackLevels levels: it runs for every series of a file
// against every scope entry and selector, in every shard.
func TestMatchAllocs(t *testing.T) {
	if n := testing.AllocsPerRun(100, func() { Match("milk/**/grocer-*", "milk/whole-1l/grocer-north") }); n != 0 {
		t.Errorf("Match allocates %v times, want 0", n)
	}
	deep := "a/b/c/d/e/f/g/h/i/j"
	if !Match("**/j", deep) || Match("**/x", deep) || !Match(deep, deep) {
		t.Errorf("Match is wrong past %d levels", stackLevels)
	}
}
