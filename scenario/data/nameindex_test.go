package data

import (
	"fmt"
	"testing"
)

// TestNameIndex adds enough names to grow the table several times and
// finds each again, and none that was not added.
func TestNameIndex(t *testing.T) {
	var x nameIndex
	var list Extents
	if x.find([]byte("a"), &list) != -1 {
		t.Fatal("found a name in an empty index")
	}
	const n = 5000
	for i := range n {
		list.push(fmt.Appendf(nil, "milk/%d", i), extent{})
		x.add(i, &list)
	}
	for i := range n {
		if got := x.find([]byte(fmt.Sprintf("milk/%d", i)), &list); got != i {
			t.Fatalf("find(milk/%d) = %d", i, got)
		}
		if got := x.find([]byte(fmt.Sprintf("cream/%d", i)), &list); got != -1 {
			t.Fatalf("find(cream/%d) = %d, want -1", i, got)
		}
	}
	if len(x.slots) < 2*n {
		t.Errorf("%d slots for %d names, want at least twice as many", len(x.slots), n)
	}
}
