package report

import (
	"fmt"
	"math"
	"strings"

	"forelay/forecast"
	"forelay/scenario/data"
)

// FitText writes the text report of one fitted series: the method and its
// parameters, the members of a combination, the accuracy with its bias
// tests and checks, the candidates of a selection and the forecast for
// horizon periods with the bands b. units names the unit of the values
// ("" for none).
func FitText(w *Text, r *forecast.Result, horizon int, b Bands, units string) {
	s := r.Series
	unit := InUnits(units)
	fmt.Fprintf(w, "Series %s: %d %s periods, %s to %s\n", s.Name, s.Len(), s.Freq(), s.Start, s.Period(s.Len()-1))
	fmt.Fprintf(w, "Method %s (%s)", r.Method, choiceText(r))
	if d := r.Model.Describe(); d != "" {
		fmt.Fprintf(w, ", %s", d)
	}
	fmt.Fprintln(w)
	if p := ParamText(r.Model.Params()); p != "" {
		fmt.Fprintf(w, "Parameters %s (final fit on all %d periods)\n", p, s.Len())
	}
	membersText(w, r)
	fmt.Fprintln(w)
	accuracyText(w, r, unit)
	if len(r.Candidates) > 0 {
		fmt.Fprintln(w)
		candidatesText(w, r)
	}
	fmt.Fprintln(w)
	pts := r.ForecastFrom(horizon, b.Z, b.Mode, b.From)
	_, src := r.VarianceFrom(horizon, b.Mode, b.From)
	fmt.Fprintf(w, "Forecast%s; band = forecast +- %.3g x standard error (%s; %.1f%% if errors are normal)\n",
		unit, b.Z, BandSourceText(src, r.Calibration()), 100*forecast.Coverage(b.Z))
	ft := NewTable("period", "forecast", "lower", "upper")
	for _, p := range pts {
		ft.AddRow(p.Period.String(), num(p.Value, 1), num(p.Lower, 1), num(p.Upper, 1))
	}
	w.Add(ft)
}

// candidatesText writes the table of the candidates a selection scored,
// the chosen one marked, and what the figures rest on.
func candidatesText(w *Text, r *forecast.Result) {
	ct := NewTable("candidate", "settings", "MAD", "MSE", "MAPE %", "MASE", "AICc").Left(1)
	for _, c := range r.Candidates {
		mark := "  "
		if c.Chosen {
			mark = "* "
		}
		if c.Skipped != "" {
			ct.AddRow(mark+c.Method.String(), "skipped: "+c.Skipped)
			continue
		}
		p := ParamText(c.Params)
		if c.Describe != "" {
			p = strings.TrimSpace(p + " " + c.Describe)
		}
		mad, mse, mape, mase := "-", "-", "-", "-"
		if a := c.Backtest; a != nil {
			mad, mse, mape, mase = num(a.MAD, 1), num(a.MSE, 0), num(a.MAPE, 2), num(a.MASE, 3)
		}
		ct.AddRow(mark+c.Method.String(), p, mad, mse, mape, mase, num(c.AICc, 1))
	}
	w.Add(ct)
	metric := strings.ToUpper(r.Metric.String())
	switch {
	case !r.Auto:
		fmt.Fprintf(w, "* = asked for: the mean of the best %d candidates by backtest %s (errors pooled over every origin and lead time).\n",
			len(forecast.Members(r.Model)), metric)
		fmt.Fprintln(w, candidateNote(r))
	case r.Select == forecast.SelectAICc:
		fmt.Fprintln(w, "* = chosen: lowest AICc of the in-sample fit; settings and parameters are those of the fit on all the data.")
	default:
		fmt.Fprintf(w, "* = chosen: lowest backtest %s (errors pooled over every origin and lead time).\n", metric)
		if note := penaltyNote(r); note != "" {
			fmt.Fprintln(w, note)
		}
		fmt.Fprintln(w, candidateNote(r))
	}
}

// accuracyText writes the accuracy table with its bias tests, its notes
// and the checks on the fit ("Check: ..." lines).
func accuracyText(w *Text, r *forecast.Result, unit string) {
	acc := NewTable("accuracy"+unit, "points", "MAD", "MSE (/"+r.Accuracy.Divisor.String()+")", "RMSE", "MAPE %", "MASE", "bias", "one-step bias", "t", "p")
	accuracyRow(acc, "in-sample, one step ahead", r.Accuracy, r.Bias)
	if bt := r.Backtest; bt != nil {
		accuracyRow(acc, fmt.Sprintf("backtest, %d origins", bt.Origins), bt.Accuracy, bt.Bias)
	}
	w.Add(acc)
	fmt.Fprintln(w, "bias: mean error (actual - forecast), over every lead time in the backtest. Bias test: t = one-step bias / its")
	fmt.Fprintln(w, "Newey-West (1987) standard error, p two-sided from Student's t; the backtest's one-step errors, one per origin, do not overlap.")
	if r.Accuracy.MAPESkipped > 0 {
		fmt.Fprintf(w, "MAPE leaves out %d period(s) with zero actuals.\n", r.Accuracy.MAPESkipped)
	}
	writeChecks(w, r)
}

// accuracyRow adds a row of accuracy measures and the bias test of the
// one-step errors: t with a sign and two decimals, p with three ("<0.001"
// below), "-" where they are NaN.
func accuracyRow(t *Table, label string, a forecast.Accuracy, b forecast.BiasTest) {
	p := "-"
	switch {
	case math.IsNaN(b.P):
	case b.P < 0.001:
		p = "<0.001"
	default:
		p = fmt.Sprintf("%.3f", b.P)
	}
	tstat := "-"
	if !math.IsNaN(b.T) {
		tstat = Signed(b.T, 2)
	}
	t.AddRow(label, fmt.Sprint(a.N), num(a.MAD, 1), num(a.MSE, 0),
		num(a.RMSE, 1), num(a.MAPE, 2), num(a.MASE, 3), num(a.Bias, 1), num(b.Mean, 1), tstat, p)
}

// membersText lists the members of a combination with their settings and
// parameters, one line each; nothing for a single method.
func membersText(w *Text, r *forecast.Result) {
	members := forecast.Members(r.Model)
	if len(members) == 0 {
		return
	}
	fmt.Fprintf(w, "Members, averaged with equal weights (each a final fit on all %d periods):\n", r.Series.Len())
	width := 0
	for _, md := range members {
		width = max(width, len(md.Method().String()))
	}
	for _, md := range members {
		settings := strings.TrimSpace(ParamText(md.Params()) + " " + md.Describe())
		fmt.Fprintln(w, strings.TrimRight(fmt.Sprintf("  %-*s  %s", width, md.Method(), settings), " "))
	}
}

// penaltyNote says by how much a single method's backtest error counted
// more than the combination's in the selection; "" when it did not.
func penaltyNote(r *forecast.Result) string {
	bt := r.Backtest
	if bt == nil {
		return ""
	}
	k := forecast.FewOriginsFactor(bt.Origins)
	if k == 1 {
		return ""
	}
	return fmt.Sprintf("With %d origins (fewer than 36) a single method's %s counted %.3f times: it had to beat the combination by that margin.",
		bt.Origins, strings.ToUpper(r.Metric.String()), k)
}

// candidateNote says where the candidates' figures come from, so that
// they do not seem to contradict the final fit shown above the table.
func candidateNote(r *forecast.Result) string {
	n := r.Series.Len()
	if bt := r.Backtest; bt != nil {
		s := r.Series
		return fmt.Sprintf("Candidate settings and parameters are fitted on the backtest's first training window (%s to %s, %d periods) "+
			"and its errors scored over %d origins; the parameters at the top are the final fit on all %d periods.",
			s.Start, s.Period(bt.Train-1), bt.Train, bt.Origins, n)
	}
	return fmt.Sprintf("Candidate settings and parameters are fitted on the backtest's first training window; "+
		"the parameters at the top are the final fit on all %d periods.", n)
}

// FillNote is the note on a history cell filled under the fill mode
// fill: "history.csv:3: series "clips" has no value for 2025-02; filled
// with 0.00 (--fill zero)". file is the history file.
func FillNote(file, fill string, f data.Filled) string {
	at := file
	if f.Line > 0 {
		at = fmt.Sprintf("%s:%d", file, f.Line)
	}
	return fmt.Sprintf("%s: series %q has no value for %s; filled with %s (--fill %s)", at, f.Series, f.Period, num(f.Value, 2), fill)
}
