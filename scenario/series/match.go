package series

import (
	"errors"
	"fmt"
	"strings"
)

// ErrBadPattern is returned (wrapped) by Check for a text that is not a
// pattern.
var ErrBadPattern = errors.New("bad series pattern")

// Depth returns the number of levels of a series name: one more than its
// number of "/".
func Depth(name string) int { return strings.Count(name, "/") + 1 }

// IsPattern reports whether s holds a wildcard, so that it may select
// other series than the one it names.
func IsPattern(s string) bool { return strings.Contains(s, "*") }

// Check returns an error wrapping ErrBadPattern when pattern is empty, has
// an empty level or a "**" that is not a whole level, and nil otherwise.
func Check(pattern string) error {
	if pattern == "" {
		return fmt.Errorf("%w: empty", ErrBadPattern)
	}
	rest := pattern
	for i := 0; ; i++ {
		lv, tail, more := strings.Cut(rest, "/")
		switch {
		case lv == "":
			return fmt.Errorf("%w: %q has an empty level (level %d); levels are separated by one /", ErrBadPattern, pattern, i+1)
		case lv != "**" && strings.Contains(lv, "**"):
			return fmt.Errorf("%w: %q: ** stands for whole levels and must be a level of its own (a/**/b); use * within a level", ErrBadPattern, pattern)
		}
		if !more {
			return nil
		}
		rest = tail
	}
}

// stackLevels is the depth of pattern and name up to which Match
// allocates nothing: it is called for every series of a file and every
// entry of a scope.
const stackLevels = 8

// Match reports whether name matches pattern (see the package
// documentation). A pattern that Check refuses matches nothing.
func Match(pattern, name string) bool {
	if Check(pattern) != nil {
		return false
	}
	var pat, levels [stackLevels]string
	return matchLevels(appendLevels(pat[:0], pattern), appendLevels(levels[:0], name))
}

// appendLevels appends the levels of s, split at "/", to dst.
func appendLevels(dst []string, s string) []string {
	for {
		lv, rest, more := strings.Cut(s, "/")
		dst = append(dst, lv)
		if !more {
			return dst
		}
		s = rest
	}
}

// matchLevels matches the levels of a pattern against those of a name. The
// table ok[i][j] says whether pat[i:] matches name[j:]; it is filled from
// the end, row by row (row i needs row i+1 only), so the time is
// len(pat)*len(name) level matches at most.
func matchLevels(pat, name []string) bool {
	n := len(name) + 1
	var buf [2 * (stackLevels + 1)]bool
	rows := buf[:]
	if 2*n > len(rows) {
		rows = make([]bool, 2*n)
	}
	next, row := rows[:n], rows[n:2*n] // rows i+1 and i
	next[len(name)] = true             // the row below the last: only the empty rest matches
	for i := len(pat) - 1; i >= 0; i-- {
		for j := len(name); j >= 0; j-- {
			if pat[i] == "**" {
				// none of the levels left, or name[j] and then more
				row[j] = next[j] || j < len(name) && row[j+1]
				continue
			}
			row[j] = j < len(name) && next[j+1] && matchLevel(pat[i], name[j])
		}
		next, row = row, next
	}
	return next[0]
}

// matchLevel matches one level, in which "*" matches any run of
// characters. It is the usual greedy match with one point of return: on a
// mismatch the last "*" takes one more character. Bytes are compared,
// which is exact for UTF-8 since "*" is one byte.
func matchLevel(pat, s string) bool {
	p, i := 0, 0
	star, mark := -1, 0
	for i < len(s) {
		switch {
		case p < len(pat) && pat[p] == '*':
			star, mark = p, i
			p++
		case p < len(pat) && pat[p] == s[i]:
			p++
			i++
		case star >= 0:
			mark++
			p, i = star+1, mark
		default:
			return false
		}
	}
	for p < len(pat) && pat[p] == '*' {
		p++
	}
	return p == len(pat)
}

// Select returns the names that match at least one of the patterns, in
// the order of names, and the patterns that match no name, in their own
// order. names are distinct, as the series of a file are, so that each
// is selected once. Names are compared as they are (trimmed by the
// reader of the file).
func Select(patterns []string, names []string) (selected []string, unmatched []string) {
	hit := make([]bool, len(patterns))
	for _, n := range names {
		chosen := false
		for k, p := range patterns {
			if Match(p, n) {
				hit[k] = true
				chosen = true
			}
		}
		if chosen {
			selected = append(selected, n)
		}
	}
	for k, p := range patterns {
		if !hit[k] {
			unmatched = append(unmatched, p)
		}
	}
	return selected, unmatched
}
