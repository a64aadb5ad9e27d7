package scenario

// maxSuggestDistance is the largest edit distance at which a word is offered
// as a correction.
const maxSuggestDistance = 2

// levenshtein returns the Levenshtein distance between a and b: the least
// number of single-character insertions, deletions and substitutions that
// turn a into b. It compares runes. With the usual dynamic programme over
// the prefixes a[:i] and b[:j],
//
//	d(i, 0) = i,  d(0, j) = j,
//	d(i, j) = min(d(i-1, j) + 1, d(i, j-1) + 1, d(i-1, j-1) + [a_i != b_j]).
func levenshtein(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}

// suggest returns the candidate closest to word, for a "did you mean"
// hint, or "" when none is close. A candidate is close when its distance d
// is at most 2 and 2d is at most the length of word, so that short words
// do not match everything ("to" is not offered "id"). Ties go to the
// earlier candidate, so the answer does not depend on anything but the
// order of candidates.
func suggest(word string, candidates []string) string {
	best, bestD := "", maxSuggestDistance+1
	n := len([]rune(word))
	for _, c := range candidates {
		d := levenshtein(word, c)
		if d < bestD && 2*d <= n {
			best, bestD = c, d
		}
	}
	return best
}

// didYouMean returns "; did you mean x?" for the closest candidate, or "".
func didYouMean(word string, candidates []string) string {
	if s := suggest(word, candidates); s != "" {
		return "; did you mean " + s + "?"
	}
	return ""
}
