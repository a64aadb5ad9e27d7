package main

import (
	"fmt"
	"math"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"forelay/forecast"
	"forelay/scenario/report"
)

// baselineFlags are the model settings shared by the commands that fit a
// baseline from flags.
type baselineFlags struct {
	Method     string
	Season     int
	Alpha      float64
	Beta       float64
	Gamma      float64
	Phi        float64
	Window     int
	Weights    []float64
	Dummies    bool
	Damped     bool
	Metric     string
	Select     string
	Holdout    int
	Refit      bool
	MSEDivisor string
	Horizon    int
	Z          float64
	Coverage   float64
	Bands      string
	BandsFrom  string

	// set records which of alpha, beta, gamma, phi, z and coverage were
	// given on the command line.
	set map[string]bool
}

func (b *baselineFlags) register(fs *pflag.FlagSet) {
	fs.StringVar(&b.Method, "method", "auto", "baseline method: "+strings.Join(forecast.Methods(), ", "))
	fs.IntVar(&b.Season, "season", 0, "periods per seasonal cycle (0: 12 for months, 4 for quarters, 52 for weeks, 7 for days)")
	fs.Float64Var(&b.Alpha, "alpha", 0, "hold the level smoothing parameter at this value (0-1)")
	fs.Float64Var(&b.Beta, "beta", 0, "hold the trend smoothing parameter at this value (0-1)")
	fs.Float64Var(&b.Gamma, "gamma", 0, "hold the seasonal smoothing parameter at this value (0-1)")
	fs.Float64Var(&b.Phi, "phi", 0, "hold the trend damping factor at this value")
	fs.IntVar(&b.Window, "window", 0, "moving-average window in periods (0: 3)")
	fs.Float64SliceVar(&b.Weights, "weights", nil, "weighted-moving-average weights `w1,w2,...`, oldest first (default: fitted)")
	fs.Lookup("weights").DefValue = "" // "fitted", said in the usage
	fs.BoolVar(&b.Dummies, "dummies", false, "linear-trend: add seasonal dummy variables")
	fs.BoolVar(&b.Damped, "damped", false, "holt-winters-*: damp the trend")
	fs.StringVar(&b.Metric, "metric", "mad", "auto: backtest error to minimise: mad, mse, mape or mase")
	fs.StringVar(&b.Select, "select", "backtest", "auto: rank candidates by backtest error or by aicc")
	fs.IntVar(&b.Holdout, "holdout", 0, "backtest origins (0: a fifth of the history, at most 36)")
	fs.BoolVar(&b.Refit, "refit", false, "backtest: refit the parameters at every origin")
	fs.StringVar(&b.MSEDivisor, "mse-divisor", "n-1", "divide the sum of squared errors by n-1 or n")
	fs.IntVar(&b.Horizon, "horizon", 0, "periods to forecast (0: 12 months, 8 quarters, 26 weeks, 28 days or 5 years)")
	fs.Float64Var(&b.Z, "z", 2, "band half-width in standard errors")
	fs.Float64Var(&b.Coverage, "coverage", 0, "band coverage instead of --z, e.g. 0.9 for a central 90% band")
	fs.StringVar(&b.Bands, "bands", "horizon", "band width: horizon (widens with lead time) or flat (one width)")
	fs.StringVar(&b.BandsFrom, "bands-from", "calibrated", "band spread: calibrated (errors of forecasts from earlier origins) or model (the model's own variance)")
}

func (b *baselineFlags) record(cmd *cobra.Command) {
	b.set = map[string]bool{}
	for _, n := range []string{"alpha", "beta", "gamma", "phi", "z", "coverage"} {
		b.set[n] = cmd.Flags().Changed(n)
	}
}

// spec turns the flags into a forecast.Spec and the band settings; every
// error is a flag error.
func (b *baselineFlags) spec() (forecast.Spec, report.Bands, error) {
	var s forecast.Spec
	var bs report.Bands
	var err error
	if s.Method, err = forecast.ParseMethod(b.Method); err != nil {
		return s, bs, &flagError{err: fmt.Errorf("--method: %w", err)}
	}
	if b.Season < 0 {
		return s, bs, flagErrorf("--season must be 0 (the usual season) or more, got %d", b.Season)
	}
	s.Config.Season = b.Season
	fixed := []struct {
		name string
		v    float64
		dst  **float64
	}{{"alpha", b.Alpha, &s.Config.Fixed.Alpha}, {"beta", b.Beta, &s.Config.Fixed.Beta},
		{"gamma", b.Gamma, &s.Config.Fixed.Gamma}, {"phi", b.Phi, &s.Config.Fixed.Phi}}
	for _, f := range fixed {
		if !b.set[f.name] {
			continue
		}
		if !(f.v >= 0 && f.v <= 1) {
			return s, bs, flagErrorf("--%s must lie between 0 and 1, got %v", f.name, f.v)
		}
		v := f.v
		*f.dst = &v
	}
	if b.Window < 0 {
		return s, bs, flagErrorf("--window must be at least 1, got %d", b.Window)
	}
	s.Config.Window = b.Window
	s.Config.Weights = b.Weights
	s.Config.Dummies = b.Dummies
	s.Config.Damped = b.Damped
	if s.Metric, err = forecast.ParseMetric(b.Metric); err != nil {
		return s, bs, &flagError{err: fmt.Errorf("--metric: %w", err)}
	}
	if s.Select, err = forecast.ParseSelection(b.Select); err != nil {
		return s, bs, &flagError{err: fmt.Errorf("--select: %w", err)}
	}
	if b.Holdout < 0 {
		return s, bs, flagErrorf("--holdout must be at least 1, got %d", b.Holdout)
	}
	s.Holdout = b.Holdout
	s.Refit = b.Refit
	if s.Divisor, err = forecast.ParseDivisor(b.MSEDivisor); err != nil {
		return s, bs, &flagError{err: fmt.Errorf("--mse-divisor: %w", err)}
	}
	if b.Horizon < 0 {
		return s, bs, flagErrorf("--horizon must be at least 1, got %d", b.Horizon)
	}
	s.Horizon = b.Horizon
	if b.set["z"] && b.set["coverage"] {
		return s, bs, flagErrorf("give --z or --coverage, not both")
	}
	bs.Z = b.Z
	if b.set["coverage"] {
		if bs.Z, err = forecast.ZForCoverage(b.Coverage); err != nil {
			return s, bs, &flagError{err: fmt.Errorf("--coverage: %w", err)}
		}
	}
	if !(bs.Z > 0) || math.IsInf(bs.Z, 0) {
		return s, bs, flagErrorf("--z must be positive, got %v", b.Z)
	}
	if bs.Mode, err = forecast.ParseBandMode(b.Bands); err != nil {
		return s, bs, &flagError{err: fmt.Errorf("--bands: %w", err)}
	}
	if bs.From, err = forecast.ParseBandSource(b.BandsFrom); err != nil {
		return s, bs, &flagError{err: fmt.Errorf("--bands-from: %w", err)}
	}
	return s, bs, nil
}
