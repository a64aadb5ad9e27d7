package evaluate

// Origins returns the forecast origins of a series of n values with the
// given season length, latest first. An origin o means the first o values
// are the history and values o..o+h-1 are held out. The first origin is
// n-h; each next one is step periods earlier, while the history still holds
// at least minSeasons*season values (and at least 2), up to maxOrigins
// origins. It returns nil when the series is too short for one origin, or
// when h or step is below 1.
func Origins(n, season, h, step, minSeasons, maxOrigins int) []int {
	if h < 1 || step < 1 {
		return nil
	}
	least := max(minSeasons*max(season, 1), 2)
	var out []int
	for o := n - h; o >= least && len(out) < maxOrigins; o -= step {
		out = append(out, o)
	}
	return out
}
