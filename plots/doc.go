// Package plots draws forelay's charts with gonum.org/v1/plot. It renders
// only the data it is given: it never reads files and never fits models.
//
// Each chart is a plain struct of data with a Plot method that checks the
// data and returns a *plot.Plot:
//
//   - PlanChart: history, baseline, one adjusted plan per scenario, their
//     bands, event windows shaded and labelled, and where the forecast starts.
//   - FanChart: Monte Carlo quantiles as nested bands (P5 to P95, P10 to P90)
//     with the median and mean, an optional capacity step line and history.
//   - ControlChart: forecast errors around zero with control limits, optional
//     one and two sigma guides and the points where a rule fired.
//   - SignalChart: a tracking signal with its plus and minus limits.
//   - Waterfall: from a starting total through each event's contribution to
//     the end total.
//   - StockChart: demand, capacity and build per period, with the stock in
//     a panel of its own below.
//   - ComparisonChart: the baseline, each scenario's adjusted plan and the
//     capacity over the plan periods, with each scenario's change from the
//     baseline in a panel of its own below.
//   - LoadChart: the load of each scenario on one shared resource, a band
//     around one of them, the capacity as a step line, and the periods
//     where that load or its band reaches above the capacity shaded and
//     hatched.
//
// Render turns a plot into PNG or SVG bytes of a given size; the caller
// writes the file. The same input gives the same bytes. A chart of stacked
// panels (the stock under the build, the changes under the plans) shares
// one period axis, written under the lowest panel; its panels are drawn
// whole only by Render.
//
// # Positions and labels
//
// The x axis of the period charts is a row of labels: Labels[i] names the
// period at x = i, and every curve says at which x its first value sits. When
// the labels are period labels (2026, 2026-Q1, 2026-03, 2026-W11 or
// 2026-03-15) the axis shows those that fall on calendar boundaries (every
// month, quarter, half year, year, ...), the finest choice whose labels do
// not overlap at the size rendered, always including the first period of each
// year while the choice is finer than a year. Other labels are thinned to
// every k-th. The axis is named after the frequency ("Month", "Week (ISO)").
//
// # Look
//
// The charts are meant to be read in print and in greyscale. Series differ in
// colour, in grey level, in dash pattern and in marker shape at once; bands
// and windows are light translucent tints; decreases in a waterfall are
// darker and hatched, and so are the periods over capacity in a load chart
// (cross-hatched where the load itself is over). The key sits in a box above the data, in as many
// columns as fit, and the value axis is stretched so the key and window
// labels never cover data. Value ticks fall on round steps and carry
// thousands separators (540,000). Text is set in the Liberation Sans faces
// that gonum/plot embeds, so output does not depend on installed fonts.
//
// # Errors
//
// Every chart draws any finite data: negative values, all zeros, flat
// series, bands of no width, a single period, and values up to the ends of
// the float64 range (beyond about ±1e307 they are drawn at the chart's
// edge). In the series of the period charts NaN marks a missing value and
// leaves a gap; a band whose lower edge lies above its upper edge (a lower
// edge raised to a floor above the whole band) is drawn with no width.
//
// Bad data comes back as an error from Plot, never a panic: empty labels or
// series (ErrNoData), infinite values, or NaN where a number is needed
// (ErrNotFinite), slices of the wrong length (ErrLength), positions outside
// the labels (ErrRange), and windows or control limits the wrong way round
// (ErrOrder).
package plots
