// Package shard runs a portfolio in slices and merges the slices into the
// answer of one run over every series.
//
// A series belongs to shard K of N when FNV-1a(name) mod N = K, FNV-1a the
// 64-bit Fowler-Noll-Vo hash (offset basis 14695981039346656037, prime
// 1099511628211) of the name's bytes (Hash). The rule needs nothing but the
// name: adding series to a file never moves the others, and every shard
// finds its series alone. K counts from 0.
//
// A shard writes into its directory its own series' rows (plan.csv: every
// scenario, series and period, with a column for each event of the file),
// the partial sums a merge needs (sums.json) and a manifest
// (manifest.json). The merge (MergePlan) checks the manifests (Belong),
// lays the rows of every shard in the order of the whole portfolio, and
// adds the partial sums: roll-ups, resource loads and their variances
// (forecast.VarianceParts) are sums over series, so the merge gives what
// one run gives, up to the order of the additions. It fills the same
// report model as a run over every series (report.PortfolioSummary,
// report.StressSummary), so it writes the same text, files and charts.
//
// # sums.json
//
// A JSON document, version 3 (SumsVersion), whose arrays of numbers are
// strings: the numbers as little-endian IEEE 754 float64, base64 (standard
// alphabet, padded), so that nothing is lost to decimal printing. Fields:
// version, kind ("plan"), plan, units, freq, end (the history's last
// period), inputs (the digests), notes and case_events (the events of each
// scenario), which plan.json repeats, series (the number the whole
// portfolio plans),
// depth (of its deepest name), levels, periods, scenarios, events (every
// event of the file, in file order, and whether a series of the shard
// plans it: future), z, floor (whether the plan has a floor), warnings
// (those of the file, the same in every shard), own (each series of the
// shard: name, index in the whole portfolio, its warnings, new, mad, mse,
// baseline_periods and adjusted_periods, what plan.json holds of it), groups (the total and each group of
// each level over the shard's series: level, depth, group, first (index of
// its first member), members, floor (sum of the members' floors), var (the
// variance parts: h, n, z, own, indep; only on the groups of the deepest
// level, or the total when names have one level, since the merge adds a
// wider group's from its children; null elsewhere) and per scenario baseline,
// adjusted, risk_weighted and the summed standard deviation of each
// event), resources (id, units, per_unit, capacity, and the group of
// its series), tail and common (the shard's summed history over the last
// report.ChartHistory periods, each series aligned on its last period,
// and its shortest history), chart_count (plan --charts; -1 all, -2
// none) and charts (the charts of the shard's own chart_count
// most-changed series: index, size (report.ChangeSize), series and the
// curves of report.PlanChart).
//
// A stress run's sums.json (kind "stress") holds the settings (periods,
// freq, scenarios, paths, seed, breach, chart: the scenario the charts
// band, frozen and opening), the sums (the total, then each resource
// with its capacity and, with frozen production, the shard's baseline
// and planned demand on it) and demand: per scenario, sum and period, the
// shard's part of every path.
//
// # manifest.json
//
// version (1), forelay (the tool's version), command (plan, stress or
// fit), shard {k, n}, inputs (the digests of the scenario and history
// files), seed and paths (stress), and args (the command and the settings
// that change the output; the input files are known by their digests).
// Shards belong together when all of these but k agree and every k from 0
// to n-1 is there once.
package shard
