package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"forelay/scenario/report"
)

// chartSize is the value of --chart-size: the width and height of the
// charts in inches, written WxH (10x5.6); zero until the flag is given.
type chartSize struct {
	W, H float64
}

func (c *chartSize) String() string {
	if c.W == 0 {
		return "8x4.5"
	}
	return strconv.FormatFloat(c.W, 'g', -1, 64) + "x" + strconv.FormatFloat(c.H, 'g', -1, 64)
}

func (c *chartSize) Type() string { return "WxH" }

// Set reads WxH in inches, each side within the report's bounds.
func (c *chartSize) Set(s string) error {
	ws, hs, ok := strings.Cut(strings.ToLower(strings.TrimSpace(s)), "x")
	w, errW := strconv.ParseFloat(ws, 64)
	h, errH := strconv.ParseFloat(hs, 64)
	if !ok || errW != nil || errH != nil {
		return fmt.Errorf("want WIDTHxHEIGHT in inches, such as 10x5.6")
	}
	for _, v := range []float64{w, h} {
		if math.IsNaN(v) || v < report.MinChartSide || v > report.MaxChartSide {
			return fmt.Errorf("each side must be between %d and %d inches", report.MinChartSide, report.MaxChartSide)
		}
	}
	c.W, c.H = w, h
	return nil
}

// registerChartSize adds --chart-size to a command that writes charts;
// the value lands in the shared flags, where emit reads it.
func registerChartSize(fl *pflag.FlagSet, shared *sharedFlags) {
	if shared == nil {
		return
	}
	fl.Var(&shared.ChartSize, "chart-size", "with --out, the size of the charts in inches, WIDTHxHEIGHT; PNGs are drawn at 192 dots per inch")
}
