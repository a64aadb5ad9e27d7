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
	for i, lv := range strings.Split(pattern, "/") {
		switch {
		case lv == "":
			return fmt.Errorf("%w: %q has an empty level (level %d); levels are separated by one /", ErrBadPattern, pattern, i+1)
		case lv != "**" && strings.Contains(lv, "**"):
			return fmt.Errorf("%w: %q: ** stands for whole levels and must be a level of its own (a/**/b); use * within a level", ErrBadPattern, pattern)
		}
	}
	return nil
}

// Match reports whether name matches pattern (see the package
// documentation). A pattern that Check refuses matches nothing.
func Match(pattern, name string) bool {
	if Check(pattern) != nil {
		return false
	}
	return matchLevels(strings.Split(pattern, "/"), strings.Split(name, "/"))
}

// matchLevels matches the levels of a pattern against those of a name. The
// table ok[i][j] says whether pat[i:] matches name[j:]; it is filled from
// the end, so the time is len(pat)*len(name) level matches at most.
func matchLevels(pat, name []string) bool {
	ok := make([][]bool, len(pat)+1)
	for i := range ok {
		ok[i] = make([]bool, len(name)+1)
	}
	ok[len(pat)][len(name)] = true
	for i := len(pat) - 1; i >= 0; i-- {
		for j := len(name); j >= 0; j-- {
			if pat[i] == "**" {
				// none of the levels left, or name[j] and then more
				ok[i][j] = ok[i+1][j] || j < len(name) && ok[i][j+1]
				continue
			}
			ok[i][j] = j < len(name) && ok[i+1][j+1] && matchLevel(pat[i], name[j])
		}
	}
	return ok[0][0]
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
// the order of names and each once, and the patterns that match no name,
// in their own order. Names are compared as they are (trimmed by the
// reader of the file).
func Select(patterns []string, names []string) (selected []string, unmatched []string) {
	hit := make([]bool, len(patterns))
	seen := make(map[string]bool)
	for _, n := range names {
		chosen := false
		for k, p := range patterns {
			if Match(p, n) {
				hit[k] = true
				chosen = true
			}
		}
		if chosen && !seen[n] {
			seen[n] = true
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
