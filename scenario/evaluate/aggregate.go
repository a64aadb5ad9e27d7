package evaluate

import (
	"maps"
	"math"
	"slices"
	"strconv"

	"forelay/forecast"
)

// accum gathers the trials of one slice.
type accum struct {
	s        *Slice
	lastCase int
	maseSum  float64
	chosen   map[forecast.Method]int
}

// aggregator holds the accumulators of every slice and group.
type aggregator struct {
	cfg    Config
	maxH   int
	slices []*accum
	index  map[string]*accum
	groups []*accum
}

func sliceKey(method int, source, freq, group string) string {
	return strconv.Itoa(method) + "\x00" + source + "\x00" + freq + "\x00" + group
}

// aggregate turns the runs into Results.
func aggregate(cases []Case, runs []caseRun, cfg Config) *Results {
	res := &Results{Settings: settingsOf(cfg), Failures: []Failure{}}
	sources, freqs, groups := layout(cases, runs)
	ag := &aggregator{cfg: cfg, index: map[string]*accum{}}
	for _, r := range runs {
		ag.maxH = max(ag.maxH, r.info.Horizon)
		res.Cases = append(res.Cases, r.info)
	}
	for mi, m := range cfg.Methods {
		for _, src := range sources {
			for _, fr := range freqs[src] {
				ag.add(mi, m, src, fr, "")
			}
		}
	}
	for _, g := range groups {
		for mi, m := range cfg.Methods {
			ag.groups = append(ag.groups, ag.add(mi, m, g.source, g.freq, g.name))
		}
	}
	for ci, r := range runs {
		ag.addCase(ci, r, res)
	}
	for _, a := range ag.slices {
		a.finish()
	}
	for _, a := range ag.slices {
		if a.s.Group == "" {
			res.Slices = append(res.Slices, *a.s)
		}
	}
	for _, a := range ag.groups {
		res.Groups = append(res.Groups, *a.s)
	}
	res.Accuracy = summarise(res.Slices, sources, freqs)
	return res
}

// settingsOf records the resolved configuration.
func settingsOf(cfg Config) Settings {
	st := Settings{Coverages: cfg.Coverages, Bands: cfg.Bands.String(), Step: "H",
		MinSeasons: cfg.MinSeasons, MaxOrigins: cfg.MaxOrigins, Leads: cfg.Leads, Service: cfg.Service}
	if cfg.Step > 0 {
		st.Step = strconv.Itoa(cfg.Step)
	}
	for _, m := range cfg.Methods {
		st.Methods = append(st.Methods, m.String())
	}
	return st
}

type groupInfo struct{ name, source, freq string }

// layout returns the sources (first appearance, then SourceAll), the
// frequencies present in each (month before quarter, then FreqAll) and the
// groups (group and frequency) in order of first appearance.
func layout(cases []Case, runs []caseRun) ([]string, map[string][]string, []groupInfo) {
	var sources []string
	present := map[string][]forecast.Frequency{}
	var groups []groupInfo
	seen := map[groupInfo]bool{}
	for i, c := range cases {
		f := c.Series.Freq()
		if _, ok := present[c.Source]; !ok {
			sources = append(sources, c.Source)
		}
		for _, s := range []string{c.Source, SourceAll} {
			if !slices.Contains(present[s], f) {
				present[s] = append(present[s], f)
			}
		}
		g := groupInfo{c.Group, c.Source, runs[i].info.Freq}
		if !seen[g] {
			seen[g] = true
			groups = append(groups, g)
		}
	}
	sources = append(sources, SourceAll)
	freqs := map[string][]string{}
	for _, s := range sources {
		fs := present[s]
		slices.Sort(fs)
		for _, f := range fs {
			freqs[s] = append(freqs[s], f.String())
		}
		freqs[s] = append(freqs[s], FreqAll)
	}
	return sources, freqs, groups
}

// add creates the accumulator of one slice.
func (ag *aggregator) add(mi int, m forecast.Method, source, freq, group string) *accum {
	s := &Slice{Method: m.String(), Source: source, Freq: freq, Group: group}
	for _, c := range ag.cfg.Coverages {
		b := Band{Nominal: c, ByLead: make([]Lead, ag.maxH)}
		for k := range b.ByLead {
			b.ByLead[k].Lead = k + 1
		}
		s.Bands = append(s.Bands, b)
	}
	for _, l := range ag.cfg.Leads {
		s.Service = append(s.Service, Service{Lead: l, Target: ag.cfg.Service})
	}
	a := &accum{s: s, lastCase: -1, chosen: map[forecast.Method]int{}}
	ag.slices = append(ag.slices, a)
	ag.index[sliceKey(mi, source, freq, group)] = a
	return a
}

// addCase adds every trial of one case to the slices it belongs to.
func (ag *aggregator) addCase(ci int, r caseRun, res *Results) {
	c := r.info
	for mi, m := range ag.cfg.Methods {
		keys := []string{
			sliceKey(mi, c.Source, c.Freq, ""), sliceKey(mi, c.Source, FreqAll, ""),
			sliceKey(mi, SourceAll, c.Freq, ""), sliceKey(mi, SourceAll, FreqAll, ""),
		}
		var targets []*accum
		for _, k := range keys {
			targets = append(targets, ag.index[k])
		}
		for _, g := range ag.groups {
			if g.s.Group == c.Group && g.s.Source == c.Source && g.s.Freq == c.Freq && g.s.Method == m.String() {
				targets = append(targets, g)
			}
		}
		var fail *Failure
		for _, row := range r.trials {
			t := row[mi]
			for _, a := range targets {
				a.addTrial(ci, t)
			}
			if t.err == "" {
				continue
			}
			if fail == nil {
				fail = &Failure{Series: c.Name, Method: m.String(), Error: t.err}
			}
			fail.Origins++
		}
		if fail != nil {
			res.Failures = append(res.Failures, *fail)
		}
	}
}

// addTrial adds one method at one origin of case ci.
func (a *accum) addTrial(ci int, t trial) {
	s := a.s
	if t.err != "" {
		s.Failed++
		return
	}
	s.Origins++
	if a.lastCase != ci {
		a.lastCase = ci
		s.Series++
	}
	if finite(t.mase) {
		a.maseSum += t.mase
		s.MASEOrigins++
	}
	a.chosen[t.chosen]++
	for i, codes := range t.band {
		b := &s.Bands[i]
		for k, code := range codes {
			switch code {
			case noValue:
				continue
			case noBand:
				b.NoBand++
				continue
			case below:
				b.Below++
			case above:
				b.Above++
			case inside:
				b.Inside++
				b.ByLead[k].Inside++
			}
			b.N++
			b.ByLead[k].N++
		}
	}
	for i, code := range t.stock {
		sv := &s.Service[i]
		switch code {
		case covered:
			sv.Covered++
			sv.N++
		case uncovered:
			sv.N++
		case noStock:
			sv.NoStock++
		}
	}
}

// finish computes the shares and means.
func (a *accum) finish() {
	s := a.s
	s.MASE = ratio(a.maseSum, s.MASEOrigins)
	for i := range s.Bands {
		b := &s.Bands[i]
		b.Share = ratio(float64(b.Inside), b.N)
		for k := range b.ByLead {
			b.ByLead[k].Share = ratio(float64(b.ByLead[k].Inside), b.ByLead[k].N)
		}
		if s.Group != "" {
			b.ByLead = nil
		}
	}
	for i := range s.Service {
		s.Service[i].Share = ratio(float64(s.Service[i].Covered), s.Service[i].N)
	}
	if s.Method != forecast.Auto.String() {
		return
	}
	s.Chosen = []Choice{}
	for _, m := range slices.Sorted(maps.Keys(a.chosen)) {
		s.Chosen = append(s.Chosen, Choice{Method: m.String(), Count: a.chosen[m]})
	}
}

// ratio returns x/n, or 0 when n is 0.
func ratio(x float64, n int) float64 {
	if n == 0 {
		return 0
	}
	return x / float64(n)
}

// summarise compares auto with seasonal-naive and the best single method
// (the combination is not one) for each source and frequency.
func summarise(all []Slice, sources []string, freqs map[string][]string) []MASESummary {
	var out []MASESummary
	for _, src := range sources {
		for _, fr := range freqs[src] {
			sum := MASESummary{Source: src, Freq: fr, BestMASE: math.Inf(1)}
			for _, s := range all {
				if s.Source != src || s.Freq != fr {
					continue
				}
				sum.Origins = max(sum.Origins, s.Origins+s.Failed)
				switch {
				case s.Method == forecast.Auto.String():
					sum.Auto = s.MASE
					continue
				case s.Method == forecast.Combination.String():
					continue // not a single method
				case s.Method == forecast.SeasonalNaive.String():
					sum.SeasonalNaive = s.MASE
				}
				if s.Failed > 0 || s.Origins == 0 || s.MASEOrigins != s.Origins {
					continue
				}
				sum.Candidates++
				if s.MASE < sum.BestMASE {
					sum.Best, sum.BestMASE = s.Method, s.MASE
				}
			}
			if sum.Candidates == 0 {
				sum.BestMASE = 0
			}
			out = append(out, sum)
		}
	}
	return out
}
