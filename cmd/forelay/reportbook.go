package main

import (
	"context"
	"errors"
	"fmt"

	"forelay/forecast"
	"forelay/scenario/data"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/report/browser"
	"forelay/scenario/supply"
)

// The runs behind "forelay report": the same library calls as plan,
// compare, stress, buffer and track, on one Monte Carlo, their reports
// bound into a report.Book.

// findBrowser returns the browser to print with when pdf is set; without
// one it is an input error (exit code 2) that says how to install it,
// found before any work.
func findBrowser(pdf bool) (string, error) {
	if !pdf {
		return "", nil
	}
	exe, err := browser.Find()
	if err != nil {
		return "", &inputError{err: fmt.Errorf("--pdf: %w", err)}
	}
	return exe, nil
}

// reportTrackConfig is the tracking of a report: the defaults of
// "forelay track".
func reportTrackConfig() (forecast.TrackConfig, error) {
	cfg, _, err := trackSettings(&TrackOptions{Signal: "cumulative", Z: 3, MADSmoothing: 0.1})
	return cfg, err
}

// planBook runs everything on a plan of one series.
func planBook(opts *ReportOptions, p *plan.Plan) (*report.Book, error) {
	sc, err := pickScenario(p, opts.Scenario)
	if err != nil {
		return nil, err
	}
	prod, err := plan.ReadProduction(p)
	if err != nil {
		return nil, &inputError{err: err}
	}
	mc, err := simulate(p, &opts.Sim, opts.Shared)
	if err != nil {
		return nil, err
	}
	h := report.Handover{Plan: p, Chart: sc, Compare: supply.CompareScenarios(mc, opts.Service)}
	if h.Stress, err = supply.Stress(mc, supply.StressSettings{Breach: opts.Breach, Production: prod}); err != nil {
		return nil, &inputError{err: err}
	}
	h.Buffer, err = supply.SizeBuffer(p, mc, supply.BufferSettings{Scenario: sc, Service: opts.Service, LeadTime: 1})
	switch {
	case errors.Is(err, supply.ErrNoCapacity):
		h.Left = append(h.Left, "the scenario file sets no capacity, so the report has no pre-build; add a capacity block to size one.")
	case err != nil:
		return nil, &inputError{err: err}
	}
	if opts.Actuals != "" {
		if h.Track, err = planTracking(opts, p, p.Scenarios[sc].Name); err != nil {
			return nil, err
		}
		h.More = []report.InputFile{actualsFile(opts.Actuals)}
	}
	return report.ForHandover(h), nil
}

// planTracking tracks the actuals against scenario name of p.
func planTracking(opts *ReportOptions, p *plan.Plan, name string) (*report.Track, error) {
	cfg, err := reportTrackConfig()
	if err != nil {
		return nil, err
	}
	tp := p.TrackPlan()
	if opts.Scenario != "" {
		name = opts.Scenario
	}
	line, err := tp.Choose(name)
	if err != nil {
		return nil, flagErrorf("--scenario: %v", err)
	}
	actual, err := tp.ReadActualsFile(opts.Actuals, opts.Format.format(p.File.History.Decimal), opts.Shared.limits().Input())
	if err != nil {
		return nil, &inputError{err: err}
	}
	tr, err := tp.Track(line.Name, actual, cfg)
	if err != nil {
		return nil, &inputError{err: err}
	}
	return &report.Track{Plan: tp, Tracking: tr, Source: "recomputed from " + opts.File, DefaultLimit: true}, nil
}

// portfolioBook runs everything on a portfolio.
func portfolioBook(opts *ReportOptions, pf *plan.Portfolio) (*report.Book, error) {
	sc, err := pickScenario(pf.Plans[0], opts.Scenario)
	if err != nil {
		return nil, err
	}
	if err := supply.CheckPortfolioProduction(pf); err != nil {
		return nil, &inputError{err: err}
	}
	res := supply.PortfolioResources(pf)
	mc, err := simulatePortfolio(pf, supply.PortfolioSums(pf, res), &opts.Sim, opts.Shared)
	if err != nil {
		return nil, err
	}
	h := report.PortfolioHandover{Portfolio: pf, Charts: opts.Charts, Chart: sc,
		Compare: supply.ComparePortfolio(mc, res, opts.Service)}
	if h.Stress, err = supply.PortfolioStress(mc, res, supply.StressSettings{Breach: opts.Breach}); err != nil {
		return nil, &inputError{err: err}
	}
	h.Buffer, err = supply.SizePortfolioBuffers(pf, res, mc, supply.BufferSettings{Scenario: sc, Service: opts.Service, LeadTime: 1})
	switch {
	case errors.Is(err, supply.ErrNoCapacity):
		h.Left = append(h.Left, "no resource has a capacity, so the report has no pre-build; give the resources a capacity to size one.")
	case err != nil:
		return nil, &inputError{err: err}
	}
	if opts.Actuals != "" {
		if h.Track, err = portfolioTracking(opts, pf, pf.Plans[0].Scenarios[sc].Name); err != nil {
			return nil, err
		}
		h.More = []report.InputFile{actualsFile(opts.Actuals)}
	}
	book, err := report.ForPortfolioHandover(h)
	if err != nil {
		return nil, &inputError{err: err}
	}
	return book, nil
}

// portfolioTracking tracks the actuals against scenario name of pf.
func portfolioTracking(opts *ReportOptions, pf *plan.Portfolio, name string) (*report.PortfolioTrack, error) {
	cfg, err := reportTrackConfig()
	if err != nil {
		return nil, err
	}
	pt, err := pf.TrackPlan()
	if err != nil {
		return nil, &inputError{err: err}
	}
	acts, err := pt.ReadActualsFile(opts.Actuals, pf.File.History.Key, opts.Format.format(pf.File.History.Decimal), opts.Shared.limits().Input())
	if err != nil {
		return nil, &inputError{err: err}
	}
	if opts.Scenario != "" {
		name = opts.Scenario
	}
	tr, err := pt.Track(name, acts, cfg)
	if errors.Is(err, plan.ErrScenarioChoice) {
		return nil, flagErrorf("--scenario: %v", err)
	}
	if err != nil {
		return nil, &inputError{err: err}
	}
	return &report.PortfolioTrack{Plan: pt, Tracking: tr, Source: "recomputed from " + opts.File,
		DefaultLimit: true, Warnings: acts.Warnings}, nil
}

// actualsFile is the actuals file with its digest.
func actualsFile(path string) report.InputFile {
	d, _ := data.Digest(path)
	return report.InputFile{Role: "actuals", Path: path, Digest: d}
}

// writeBook writes DIR/report.html and, when exe is set, DIR/report.pdf
// printed by the browser at exe, all or nothing.
func writeBook(ios *IOStreams, dir string, book *report.Book, paper report.Paper, exe string) error {
	page, err := book.HTML(paper)
	if err != nil {
		return err
	}
	set := report.NewFiles(dir)
	defer set.Discard()
	set.Add("report.html", page)
	if exe != "" {
		res, err := browser.Print(context.Background(), exe, page, paper, false)
		if err != nil {
			return fmt.Errorf("--pdf: %s: %w", exe, err)
		}
		set.Add("report.pdf", res.PDF)
	}
	paths, err := set.Commit()
	if err != nil {
		return err
	}
	for _, p := range paths {
		fmt.Fprintf(ios.ErrOut, "wrote %s\n", p)
	}
	return nil
}
