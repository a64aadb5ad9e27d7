package series

import (
	"slices"
	"testing"
)

func TestDistance(t *testing.T) {
	cases := []struct {
		pattern, name string
		want          int
	}{
		{"milk", "milk", 0},
		{"milk", "milc", 1},                                 // one substitution
		{"milk", "mlk", 1},                                  // one insertion of i
		{"milk/*", "milk/whole-1l", 0},                      // matches
		{"milk/*", "milk/whole-1l/north", 1},                // * stops at /: delete the second / and milk/whole-1lnorth matches
		{"milk/**", "milk/whole-1l/north", 0},               // matches
		{"*/*/grocer-nort", "milk/skim-1l/grocer-north", 1}, // insert the last h
		{"a/**/b", "a/b", 1},                                // the / left over by an empty ** (see Distance)
		{"", "ab", 2},                                       // two insertions
		{"ab", "", 2},                                       // two deletions
	}
	for _, c := range cases {
		if got := Distance(c.pattern, c.name); got != c.want {
			t.Errorf("Distance(%q, %q) = %d, want %d", c.pattern, c.name, got, c.want)
		}
	}
}

func TestNearest(t *testing.T) {
	names := []string{"milk/whole-1l/grocer-north", "milk/skim-1l/grocer-north", "butter/salted-250g/grocer-south"}
	// Distances by hand: "milk/whole-1l/grocer-nort" is 1 from names[0]
	// (insert h); 6 from names[1] (whole -> skim share no letter: 4
	// substitutions and 1 deletion, then insert h); names[2] is far off
	// (milk and butter share no letter, so that level alone costs 6).
	got := Nearest("milk/whole-1l/grocer-nort", names, 2)
	if want := names[:2]; !slices.Equal(got, want) {
		t.Errorf("Nearest = %q, want %q", got, want)
	}
	// Ties keep the order of names: "*" of depth 1 is 2 levels away from each...
	if got := Nearest("x", []string{"a", "b"}, 5); !slices.Equal(got, []string{"a", "b"}) {
		t.Errorf("Nearest on a tie = %q, want [a b]", got)
	}
}
