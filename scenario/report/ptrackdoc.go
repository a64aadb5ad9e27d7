package report

import "forelay/scenario/plan"

// The JSON shape of "forelay track --json" on a portfolio. Field names are
// documented in the README (section "track", "Portfolios"); keep them
// stable.

// PortfolioTrackVersion is the version of the portfolio-track document;
// it changes only when a field changes meaning or goes away.
const PortfolioTrackVersion = 1

// PortfolioTrackDoc is the JSON document of a portfolio's tracking.
type PortfolioTrackDoc struct {
	Version      int               `json:"version"`
	Kind         string            `json:"kind"`
	Scenario     string            `json:"scenario"`
	Plan         string            `json:"plan"`
	PlanSource   string            `json:"plan_source"`
	Units        string            `json:"units,omitempty"`
	Signal       string            `json:"signal"`
	TSLimit      Num               `json:"ts_limit"`
	Z            Num               `json:"z"`
	MADSmoothing Num               `json:"mad_smoothing"`
	SeriesCount  int               `json:"series_count"`
	Tracked      int               `json:"tracked"`
	NoActuals    int               `json:"no_actuals"`
	Untracked    []string          `json:"untracked"`
	Latest       map[string]int    `json:"latest"`
	Rollups      []rollupTrackJSON `json:"rollups"`
	Series       []seriesTrackJSON `json:"series"`
	Notes        []string          `json:"notes"`
	Warnings     []string          `json:"warnings"`
}

// seriesTrackJSON is one tracked series.
type seriesTrackJSON struct {
	Series  string            `json:"series"`
	MAD     Num               `json:"mad"`
	MSE     Num               `json:"mse"`
	Sigma   Num               `json:"sigma"`
	Verdict string            `json:"verdict"`
	Periods []trackPeriodJSON `json:"periods"`
}

// rollupTrackJSON is one tracked roll-up.
type rollupTrackJSON struct {
	Level   string            `json:"level"`
	Group   string            `json:"group"`
	Members int               `json:"members"`
	MAD     Num               `json:"mad"`
	MSE     Num               `json:"mse"`
	Sigma   Num               `json:"sigma"`
	Verdict string            `json:"verdict"`
	Periods []trackPeriodJSON `json:"periods"`
	FVA     fvaJSON           `json:"fva"`
}

// trackPeriods returns the tracked periods of tr as JSON.
func trackPeriods(tr *plan.Tracking) []trackPeriodJSON {
	out := make([]trackPeriodJSON, len(tr.Points))
	for i, p := range tr.Points {
		out[i] = trackPeriodJSON{Period: tr.Periods[i].String(), Actual: Num(p.Actual), Plan: Num(p.Plan),
			Baseline: Num(tr.Baseline[i]), Error: Num(p.Error), CumError: Num(p.CumError), MAD: Num(p.MAD),
			TrackingSignal: Num(p.TrackingSignal), SignalClean: Num(p.SignalWithoutOutliers), Sigmas: Num(p.Sigmas),
			Verdict: p.Verdict.String(), Rules: ruleNames(p.Rules)}
	}
	return out
}

// portfolioTrackDoc returns the JSON document of t.
func portfolioTrackDoc(t PortfolioTrack) PortfolioTrackDoc {
	pt, tr := t.Plan, t.Tracking
	c := tr.Config
	doc := PortfolioTrackDoc{Version: PortfolioTrackVersion, Kind: "portfolio-track", Scenario: tr.Scenario, Plan: pt.Name,
		PlanSource: t.Source, Units: pt.Units, Signal: c.Signal.String(), TSLimit: Num(c.TSLimit), Z: Num(c.Z),
		MADSmoothing: Num(c.MADSmoothing), SeriesCount: len(pt.Series), Tracked: len(tr.Series), NoActuals: tr.NoActuals,
		Untracked: List(tr.Untracked), Latest: map[string]int{}, Rollups: []rollupTrackJSON{}, Series: []seriesTrackJSON{},
		Notes: List(tr.Notes), Warnings: List(t.Warnings)}
	n := verdictCounts(tr)
	for _, v := range verdictOrder {
		doc.Latest[v.String()] = n[v]
	}
	for _, ru := range tr.Rollups {
		_, p := ru.Latest()
		doc.Rollups = append(doc.Rollups, rollupTrackJSON{Level: ru.Level, Group: ru.Group, Members: len(ru.Members),
			MAD: Num(ru.Config.InitialMAD), MSE: Num(ru.Config.MSE), Sigma: Num(ru.Limits.Sigma), Verdict: p.Verdict.String(),
			Periods: trackPeriods(ru.Tracking), FVA: fvaOf(ru.ValueAdded)})
	}
	for _, s := range tr.Series {
		_, p := s.Latest()
		doc.Series = append(doc.Series, seriesTrackJSON{Series: s.Plan.Series, MAD: Num(s.Config.InitialMAD), MSE: Num(s.Config.MSE),
			Sigma: Num(s.Limits.Sigma), Verdict: p.Verdict.String(), Periods: trackPeriods(s.Tracking)})
	}
	return doc
}
