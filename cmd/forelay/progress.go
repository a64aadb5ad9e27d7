package main

import (
	"io"
	"os"
	"time"

	"github.com/schollz/progressbar/v3"
	"golang.org/x/term"

	"forelay/forecast"
)

// progressDelay is how long a step runs before its bar appears, so that
// a short run draws none.
const progressDelay = 400 * time.Millisecond

// terminals says where forelay may draw progress bars and use colour,
// isTerm telling which streams are terminals: bars go to ErrOut when it is
// a terminal, and use colour when NO_COLOR is unset (or empty) and Out is
// a terminal too.
func terminals(ios *IOStreams, getenv func(string) string, isTerm func(io.Writer) bool) (bars io.Writer, colour bool) {
	if !isTerm(ios.ErrOut) {
		return nil, false
	}
	return ios.ErrOut, getenv("NO_COLOR") == "" && isTerm(ios.Out)
}

// isTerminal reports whether w is a file open on a terminal.
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	return ok && term.IsTerminal(int(f.Fd()))
}

// progress returns the hook that draws the bar of one long step (label
// says what is counted) on the terminal, or nil, which draws nothing,
// under --quiet or when standard error is no terminal. A nil s (a command
// built in a test without a root) draws nothing.
func (s *sharedFlags) progress(label string) forecast.Progress {
	if s.quiet() || s == nil || s.bars == nil {
		return nil
	}
	return newProgressBar(s.bars, label, s.colour, progressDelay, time.Now).update
}

// A progressBar draws one step's bar on w once the step has run for
// delay (by now), and clears it when the step is done.
type progressBar struct {
	w      io.Writer
	label  string
	colour bool
	delay  time.Duration
	now    func() time.Time
	start  time.Time
	// throttle is the least time between two drawings.
	throttle time.Duration
	bar      *progressbar.ProgressBar
}

// newProgressBar starts the clock of a step's bar.
func newProgressBar(w io.Writer, label string, colour bool, delay time.Duration, now func() time.Time) *progressBar {
	return &progressBar{w: w, label: label, colour: colour, delay: delay, now: now, start: now(), throttle: 100 * time.Millisecond}
}

// update is a forecast.Progress: done units of total are done.
func (p *progressBar) update(done, total int) {
	if p.bar == nil {
		if done >= total || p.now().Sub(p.start) < p.delay {
			return
		}
		p.bar = progressbar.NewOptions(total, p.options()...)
	}
	_ = p.bar.Set(done) // a bar that cannot be drawn is no reason to stop
}

// options are the bar's settings: its label and count, plain ASCII, one
// colour only when colour is allowed, and no trace once done.
func (p *progressBar) options() []progressbar.Option {
	theme := progressbar.Theme{Saucer: "=", SaucerHead: ">", SaucerPadding: " ", BarStart: "[", BarEnd: "]"}
	if p.colour {
		theme.Saucer, theme.SaucerHead = "[cyan]=[reset]", "[cyan]>[reset]"
	}
	return []progressbar.Option{
		progressbar.OptionSetWriter(p.w),
		progressbar.OptionSetDescription(p.label),
		progressbar.OptionSetWidth(30),
		progressbar.OptionShowCount(),
		progressbar.OptionSetTheme(theme),
		progressbar.OptionEnableColorCodes(p.colour),
		progressbar.OptionThrottle(p.throttle),
		progressbar.OptionSetRenderBlankState(true),
		progressbar.OptionClearOnFinish(),
	}
}

// quiet reports whether --quiet is set; a nil s is not quiet.
func (s *sharedFlags) quiet() bool { return s != nil && s.Quiet }
