package report

import (
	"math"
	"strings"
	"testing"

	"forelay/forecast"
	"forelay/scenario/data"
)

// TestFillNote checks the note on a filled history cell, with the line of
// an empty cell and without one for a period that had no row.
func TestFillNote(t *testing.T) {
	per, err := forecast.ParsePeriod("2025-02", forecast.Monthly)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		line int
		want string
	}{
		{3, `h.csv:3: series "clips" has no value for 2025-02; filled with 1,234.50 (--fill interpolate)`},
		{0, `h.csv: series "clips" has no value for 2025-02; filled with 1,234.50 (--fill interpolate)`},
	} {
		got := FillNote("h.csv", "interpolate", data.Filled{Series: "clips", Period: per, Value: 1234.5, Line: c.line})
		if got != c.want {
			t.Errorf("line %d: %q, want %q", c.line, got, c.want)
		}
	}
}

// TestAccuracyRow checks the cells of the bias test: t signed with two
// decimals, p with three and "<0.001" below, "-" for NaN.
func TestAccuracyRow(t *testing.T) {
	a := forecast.Accuracy{N: 12, MAD: 1.26, MSE: 2, RMSE: 1.41, MAPE: 3.5, MASE: 0.8, Bias: -0.25}
	for _, c := range []struct {
		b        forecast.BiasTest
		wantT, p string
	}{
		{forecast.BiasTest{Mean: 0.5, T: 2.345, P: 0.0213}, "+2.35", "0.021"},
		{forecast.BiasTest{Mean: -0.5, T: -4, P: 0.0004}, "-4.00", "<0.001"},
		{forecast.BiasTest{Mean: math.NaN(), T: math.NaN(), P: math.NaN()}, "-", "-"},
	} {
		tb := NewTable()
		accuracyRow(tb, "in-sample", a, c.b)
		row := tb.Rows[0]
		if row[1] != "12" || row[2] != "1.3" || row[9] != c.wantT || row[10] != c.p {
			t.Errorf("row %q, want n 12, MAD 1.3, t %s, p %s", row, c.wantT, c.p)
		}
	}
}

// TestFitText fits a simple exponential smoothing to a short invented
// series and checks the parts of its text report.
func TestFitText(t *testing.T) {
	start, err := forecast.ParsePeriod("2024-01", forecast.Monthly)
	if err != nil {
		t.Fatal(err)
	}
	y := []float64{100, 104, 98, 101, 107, 103, 99, 102, 106, 100, 103, 105, 101, 98, 104, 102}
	r, err := forecast.Fit(forecast.Series{Name: "bolts", Start: start, Values: y}, forecast.Spec{Method: forecast.SES})
	if err != nil {
		t.Fatal(err)
	}
	var text Text
	FitText(&text, r, 3, Bands{Z: 2}, "boxes")
	got := text.String()
	for _, want := range []string{
		"Series bolts: 16 month periods, 2024-01 to 2025-04\n",
		"Method ses (as asked)",
		"Parameters alpha ",
		"accuracy (boxes)",
		"Forecast (boxes); band = forecast +- 2 x standard error (",
		"95.4% if errors are normal)\n", // 2 Phi(2) - 1 = 0.9545, standard normal table
		"period   forecast",
		"2025-07",
	} {
		if !strings.Contains(got, want) {
			t.Errorf("text lacks %q\n%s", want, got)
		}
	}
}
