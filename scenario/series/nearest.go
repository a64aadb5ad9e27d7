package series

import (
	"cmp"
	"slices"
)

// Distance returns how far name is from matching pattern: the least
// number of single-character insertions, deletions and substitutions in
// name that make it match, where a "*" of the pattern matches any run of
// characters other than "/" at no cost and a "**" any run at all. It is
// the Levenshtein distance with wildcards: over the prefixes p[:i] of the
// pattern and s[:j] of the name,
//
//	d(0, j) = j,  d(i, 0) = d(i-1, 0) for a wildcard, i otherwise,
//	d(i, j) = min(d(i-1, j), d(i, j-1))             for ** (and * when s_j != "/"),
//	d(i, j) = min(d(i-1, j), d(i, j-1) + 1)         for * when s_j == "/",
//	d(i, j) = min(d(i-1, j) + 1, d(i, j-1) + 1,
//	              d(i-1, j-1) + [p_i != s_j])       otherwise,
//
// with ** taken as one symbol and the rest compared rune by rune. It ranks
// the names offered when a pattern matches nothing; a "**" level that
// matches no level leaves one "/" over, so a/**/b is at distance 1 from
// a/b although it matches it.
func Distance(pattern, name string) int {
	p, s := symbols(pattern), []rune(name)
	prev := make([]int, len(s)+1)
	cur := make([]int, len(s)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(p); i++ {
		switch c := p[i-1]; c {
		case starStar, star:
			cur[0] = prev[0]
			for j := 1; j <= len(s); j++ {
				cost := 0 // the wildcard takes s_j
				if c == star && s[j-1] == '/' {
					cost = 1 // s_j is deleted
				}
				cur[j] = min(prev[j], cur[j-1]+cost)
			}
		default:
			cur[0] = prev[0] + 1
			for j := 1; j <= len(s); j++ {
				cost := 1
				if c == s[j-1] {
					cost = 0
				}
				cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			}
		}
		prev, cur = cur, prev
	}
	return prev[len(s)]
}

// The wildcard symbols of a pattern, outside the range of runes.
const (
	star     = -1
	starStar = -2
)

// symbols splits a pattern into runes, with "*" and "**" as one symbol
// each.
func symbols(pattern string) []rune {
	var out []rune
	r := []rune(pattern)
	for i := 0; i < len(r); i++ {
		switch {
		case r[i] == '*' && i+1 < len(r) && r[i+1] == '*':
			out = append(out, starStar)
			i++
		case r[i] == '*':
			out = append(out, star)
		default:
			out = append(out, r[i])
		}
	}
	return out
}

// Nearest returns at most k names closest to matching pattern (by
// Distance), nearest first and, at equal distance, in the order of names.
func Nearest(pattern string, names []string, k int) []string {
	type scored struct {
		name string
		d, i int
	}
	all := make([]scored, len(names))
	for i, n := range names {
		all[i] = scored{n, Distance(pattern, n), i}
	}
	slices.SortFunc(all, func(a, b scored) int { return cmp.Or(cmp.Compare(a.d, b.d), cmp.Compare(a.i, b.i)) })
	out := make([]string, 0, min(k, len(all)))
	for _, s := range all[:min(k, len(all))] {
		out = append(out, s.name)
	}
	return out
}
