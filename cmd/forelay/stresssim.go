package main

import (
	"errors"
	"fmt"
	"forelay/scenario/bounds"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"math"
	"strconv"

	"github.com/spf13/pflag"
)

// simFlags are the Monte Carlo flags shared by stress, buffer and compare.
type simFlags struct {
	Paths   int
	Seed    uint64
	Errors  string
	Workers int // goroutines of the Monte Carlo; 0: one per core
	// WorkersGiven is true when --workers was given.
	WorkersGiven bool
}

// defaultSeed is the seed used when --seed is not given, so that runs are
// reproducible by default.
const defaultSeed = 1

func (s *simFlags) register(fl *pflag.FlagSet) { s.registerWith(fl, sim.DefaultPaths) }

// registerWith registers the flags with paths as the default of --paths.
func (s *simFlags) registerWith(fl *pflag.FlagSet, paths int) {
	fl.Var(newCountValue(&s.Paths, paths), "paths", fmt.Sprintf("number of Monte Carlo sample paths, at least %d; 2e5 is read as 200000", sim.MinPaths))
	fl.Uint64Var(&s.Seed, "seed", defaultSeed, "seed of the random streams; the same seed gives the same results")
	fl.StringVar(&s.Errors, "errors", "bootstrap", "forecast errors: bootstrap (resample the in-sample one-step errors) or normal")
	fl.Var(&givenInt{n: &s.Workers, given: &s.WorkersGiven}, "workers", "Monte Carlo blocks drawn at once, at least 1 (default: one per core); the results are the same for any number")
}

// check validates the flags against the limits; every problem is a flag
// error (exit code 2), found before anything is allocated.
func (s *simFlags) check(l bounds.Set) error {
	if int64(s.Paths) > l.Get("paths") {
		return &flagError{err: l.Exceeded("--paths", "paths", int64(s.Paths))}
	}
	if s.Paths < sim.MinPaths {
		return flagErrorf("--paths %d: at least %d paths are needed (with fewer, P5 and P95 rest on a handful of paths)", s.Paths, sim.MinPaths)
	}
	if _, err := sim.ParseErrorModel(s.Errors); err != nil {
		return &flagError{err: fmt.Errorf("--errors: %w", err)}
	}
	if s.WorkersGiven && s.Workers < 1 {
		return flagErrorf("--workers %d: must be at least 1 (leave it out for one worker per core)", s.Workers)
	}
	return nil
}

// options returns the settings for sim.Simulate, with the progress bar
// of shared; check must have passed.
func (s *simFlags) options(shared *sharedFlags) sim.SimOptions {
	em, _ := sim.ParseErrorModel(s.Errors)
	return sim.SimOptions{Paths: s.Paths, Seed: s.Seed, Errors: em, Workers: s.Workers, Progress: shared.progress("drawing paths")}
}

// simulate runs the Monte Carlo; a plan whose errors cannot be drawn is
// an input error.
func simulate(p *plan.Plan, s *simFlags, shared *sharedFlags) (*sim.Simulation, error) {
	mc, err := sim.Simulate(p, s.options(shared))
	if err != nil {
		if errors.Is(err, sim.ErrTooFewPaths) {
			return nil, &flagError{err: err}
		}
		return nil, &inputError{err: fmt.Errorf("%s: %w", p.File.Path, err)}
	}
	return mc, nil
}

// simulatePortfolio runs the Monte Carlo of a portfolio's sums; normal
// errors are a flag error, errors that cannot be drawn an input error.
func simulatePortfolio(pf *plan.Portfolio, sums []sim.Sum, s *simFlags, shared *sharedFlags) (*sim.PortfolioSimulation, error) {
	mc, err := sim.SimulatePortfolio(pf, sums, s.options(shared))
	if err != nil {
		if errors.Is(err, sim.ErrPortfolioNormal) {
			return nil, &flagError{err: fmt.Errorf("--errors %s: %w", s.Errors, err)}
		}
		if errors.Is(err, sim.ErrTooFewPaths) {
			return nil, &flagError{err: err}
		}
		return nil, &inputError{err: fmt.Errorf("%s: %w", pf.File.Path, err)}
	}
	return mc, nil
}

// checkUnit reports a flag value outside the open interval (0, 1).
func checkUnit(flag string, v float64) error {
	if !(v > 0 && v < 1) {
		return flagErrorf("--%s %s: must be between 0 and 1, both excluded (0.95 means 95%%)", flag, strconv.FormatFloat(v, 'g', -1, 64))
	}
	return nil
}

// checkStock reports a negative or non-finite stock flag.
func checkStock(flag string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
		return flagErrorf("--%s %v: must be a number of at least 0", flag, v)
	}
	return nil
}

// pickScenario is Plan.ScenarioIndex, its error a flag error.
func pickScenario(p *plan.Plan, name string) (int, error) {
	i, err := p.ScenarioIndex(name)
	if err != nil {
		return 0, flagErrorf("--scenario %v", err)
	}
	return i, nil
}
