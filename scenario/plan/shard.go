package plan

import (
	"slices"

	"forelay/forecast"
	"forelay/scenario"
)

// A ShardOf says what part of a whole portfolio the portfolio of one shard
// plans.
type ShardOf struct {
	// All names every series the whole portfolio plans, in the order of
	// its Names.
	All []string
	// Index gives, for each series of the shard's Names, its index in All.
	Index []int
	// First is the first plan period.
	First forecast.Period
	// Inputs are the digests of the input files (Inputs.Digests).
	Inputs map[string]string
}

// ReadShard reads the inputs of f like ReadSelection for a portfolio that
// plans only the series mine says are the shard's own. The history is
// streamed in full, but the values of a series are kept only when it is
// the shard's own or when it shares an effect split by baseline (every
// shard fits those, to split the effect as the whole portfolio does); of
// every other series only its name, first and last period are kept
// (data.History.Extents), what the facts every shard must agree on need:
// the plan's end (the latest last period of the selected series), the
// periods the Monte Carlo draws over (Portfolio.Span) and the series left
// out as stale. BuildPortfolio then holds no plan, share or map entry for
// them: a series of another shard costs the shard about 100 bytes with
// its name, kept to the end (see TestShardKeepsLittlePerForeignSeries).
// Errors are those of ReadSelection.
func ReadShard(f *scenario.File, mine func(name string) bool) (*Inputs, error) {
	keep := mine
	if slices.ContainsFunc(f.Events, func(e *scenario.Event) bool { return e.Effect.Split == scenario.SplitBaseline }) {
		keep = func(name string) bool { return mine(name) || sharesByBaseline(f, name) }
	}
	in, err := readSelection(f, keep)
	if err != nil {
		return nil, err
	}
	in.shard = mine
	return in, nil
}

// sharesByBaseline reports whether the series called name would take a
// share of an effect split by the series' baselines, were it selected.
func sharesByBaseline(f *scenario.File, name string) bool {
	asked := false
	f.SharesOf([]string{name}, func(*scenario.Event, string) float64 { asked = true; return 1 }, nil)
	return asked
}

// fitted returns, for a shard, whether the series called name is one of
// those BuildPortfolio fits, all[i] for i in fit; nil (every series) for
// a whole portfolio.
func (in *Inputs) fitted(all []string, fit []int) func(name string) bool {
	if in.shard == nil {
		return nil
	}
	set := make(map[string]bool, len(fit))
	for _, i := range fit {
		set[all[i]] = true
	}
	return func(name string) bool { return set[name] }
}

// plans reports whether BuildPortfolio plans the series called name.
func (in *Inputs) plans(name string) bool { return in.shard == nil || in.shard(name) }

// keepShard keeps only the plans of the shard's own series, in order, and
// records where they stand in the whole portfolio.
func (pf *Portfolio) keepShard(mine func(string) bool, first forecast.Period, inputs map[string]string) {
	sh := &ShardOf{All: pf.Names, First: first, Inputs: inputs}
	var names []string
	var plans []*Plan
	index := map[string]int{}
	for i, n := range pf.Names {
		if !mine(n) {
			continue
		}
		index[n] = len(plans)
		names = append(names, n)
		plans = append(plans, pf.Plans[i])
		sh.Index = append(sh.Index, i)
	}
	pf.Names, pf.Plans, pf.index, pf.Shard = names, plans, index, sh
}
