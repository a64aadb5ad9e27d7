package main

import (
	"strings"

	"github.com/spf13/pflag"

	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/supply"
)

// resourceFlags is --resource: the resources of a plan of several series
// a command reports on (every one when not given; the total always).
type resourceFlags struct{ IDs []string }

func (r *resourceFlags) register(fl *pflag.FlagSet) {
	fl.StringSliceVar(&r.IDs, "resource", nil, "in a plan of several series, report only this resource (repeat it, or separate ids by commas, for several; default: every resource); the total is always reported")
}

// file returns the file's resources the flag picks, or a flag error
// naming the ids the file has.
func (r *resourceFlags) file(f *scenario.File) ([]scenario.Resource, error) {
	rs, err := f.PickResources(r.IDs)
	if err != nil {
		return nil, flagErrorf("--resource %v", err)
	}
	return rs, nil
}

// portfolio returns the portfolio's resources the flag picks
// (supply.PortfolioResourcesOf).
func (r *resourceFlags) portfolio(pf *plan.Portfolio) ([]supply.Resource, error) {
	rs, err := r.file(pf.File)
	if err != nil {
		return nil, err
	}
	return supply.PortfolioResourcesOf(pf, rs), nil
}

// single refuses the flag for a plan of one series, whose capacity is
// its only resource.
func (r *resourceFlags) single(path string) error {
	if len(r.IDs) == 0 {
		return nil
	}
	return flagErrorf("--resource %s: %s plans one series, whose capacity is its only resource; --resource picks among the resources of a plan of several series", strings.Join(r.IDs, ","), path)
}

// check refuses, before anything is planned, ids the scenario file at
// path has no resource for; it reads the file only when ids are given.
func (r *resourceFlags) check(path string, shared *sharedFlags) error {
	if len(r.IDs) == 0 {
		return nil
	}
	f, err := loadFile(path, shared)
	if err != nil {
		return err
	}
	_, err = r.file(f)
	return err
}
