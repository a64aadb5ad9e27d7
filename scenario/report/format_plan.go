package report

import (
	"fmt"
	"io"
	"strings"

	"forelay/forecast"
)

// The formatters the plan, track and fit reports share.

// choiceText says how a fit's method was chosen: "as asked", "chosen by
// lowest backtest MAD" or "chosen by lowest AICc".
func choiceText(r *forecast.Result) string {
	switch {
	case !r.Auto:
		return "as asked"
	case r.Select == forecast.SelectAICc:
		return "chosen by lowest AICc"
	}
	return "chosen by lowest backtest " + strings.ToUpper(r.Metric.String())
}

// writeChecks writes what may make a fit weak, one "Check:" line each (see
// forecast.Result.Flags).
func writeChecks(w io.Writer, r *forecast.Result) {
	for _, s := range r.Flags() {
		fmt.Fprintf(w, "Check: %s\n", s)
	}
}

// num formats a value for tables: thousands separators, the given
// decimals, "-" for NaN (see forecast.FormatNumber).
func num(v float64, decimals int) string { return forecast.FormatNumber(v, decimals) }
