package scenario

import "testing"

func TestLevenshtein(t *testing.T) {
	for _, tc := range []struct {
		a, b string
		want int
	}{
		// Wikipedia, "Levenshtein distance": kitten -> sitting is 3
		// (k->s, e->i, insert g); flaw -> lawn is 2.
		{"kitten", "sitting", 3},
		{"sitting", "kitten", 3},
		{"flaw", "lawn", 2},
		// Hand counts: one deletion; one substitution; a swap of two
		// letters is two edits; from or to the empty string, the length.
		{"probability", "probabilty", 1},
		{"perods", "periods", 1},
		{"unti", "units", 2},
		{"", "abc", 3},
		{"abc", "", 3},
		{"same", "same", 0},
		// Runes, not bytes: one substitution of a two-byte letter.
		{"héllo", "hello", 1},
	} {
		if got := levenshtein(tc.a, tc.b); got != tc.want {
			t.Errorf("levenshtein(%q, %q) = %d; want %d", tc.a, tc.b, got, tc.want)
		}
	}
}

func TestSuggest(t *testing.T) {
	for _, tc := range []struct {
		word string
		want string
	}{
		{"probabilty", "probability"},
		{"perods", "periods"},
		{"stat", "start"},
		{"effects", "effect"},
		{"to", ""},     // distance 2 to id, but the word is too short
		{"colour", ""}, // nothing close
		{"ed", "id"},   // id and end are both 1 away: ties go to the earlier key
	} {
		if got := suggest(tc.word, eventKeys); got != tc.want {
			t.Errorf("suggest(%q) = %q; want %q", tc.word, got, tc.want)
		}
	}
}
