package main

import (
	"bytes"
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"forelay/scenario/data"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat"
)

// csvOf writes t and returns the bytes.
func csvOf(t *testing.T, tab csvWriter) []byte {
	t.Helper()
	var b bytes.Buffer
	if err := tab.writeCSV(&b); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// runOK runs the command and fails the test unless it exits 0.
func runOK(t *testing.T, args ...string) []byte {
	t.Helper()
	var out, errOut bytes.Buffer
	if code := run(args, &out, &errOut); code != exitOK {
		t.Fatalf("run(%q) = %d, stderr %q", args, code, errOut.String())
	}
	return out.Bytes()
}

// readWide parses a wide CSV and returns the header and the data rows.
func readWide(t *testing.T, data []byte) (header []string, rows [][]string) {
	t.Helper()
	recs, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) == 0 {
		t.Fatal("empty CSV")
	}
	return recs[0], recs[1:]
}

func TestDeterministic(t *testing.T) {
	tests := []struct {
		name string
		args []string
	}{
		{"dairy default", nil},
		{"dairy seed 7", []string{"-seed", "7"}},
		{"bench small", []string{"-kind", "bench", "-series", "20", "-points", "30"}},
		{"bench default", []string{"-kind", "bench"}},
		{"portfolio default", []string{"-kind", "portfolio"}},
		{"portfolio small", []string{"-kind", "portfolio", "-series", "40", "-points", "30", "-seed", "3"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			a := runOK(t, tc.args...)
			b := runOK(t, tc.args...)
			if !bytes.Equal(a, b) {
				t.Error("two runs with the same flags differ")
			}
		})
	}
	if bytes.Equal(csvOf(t, dairy(1, true)), csvOf(t, dairy(2, true))) {
		t.Error("seeds 1 and 2 give the same dairy data")
	}
	if bytes.Equal(csvOf(t, portfolio(1, 50, 60)), csvOf(t, portfolio(2, 50, 60))) {
		t.Error("seeds 1 and 2 give the same portfolio data")
	}
}

// TestDairyFileUpToDate checks that the committed demo file is the
// generator's default output. Regenerate it with
//
//	go run ./examples/generate -out examples/dairy/history.csv
func TestDairyFileUpToDate(t *testing.T) {
	committed, err := os.ReadFile(filepath.Join("..", "dairy", "history.csv"))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(committed, runOK(t)) {
		t.Error("examples/dairy/history.csv differs from the generator's output; regenerate it")
	}
}

func TestDairyShape(t *testing.T) {
	header, rows := readWide(t, runOK(t))
	// The layout asked for: three series, bottled-l first.
	wantHeader := []string{"period", "bottled-l", "yoghurt-kg", "cream-l"}
	if strings.Join(header, ",") != strings.Join(wantHeader, ",") {
		t.Errorf("header %q, want %q", header, wantHeader)
	}
	// 2019-01..2026-10: 7 whole years (84 months) plus 10 months = 94 rows.
	if len(rows) != 94 {
		t.Fatalf("%d rows, want 94", len(rows))
	}
	if rows[0][0] != "2019-01" || rows[93][0] != "2026-10" {
		t.Errorf("periods %s..%s, want 2019-01..2026-10", rows[0][0], rows[93][0])
	}
	for i, r := range rows {
		if len(r) != 4 {
			t.Fatalf("row %d has %d fields", i+2, len(r))
		}
		for j, cell := range r[1:] {
			v, err := strconv.ParseInt(cell, 10, 64)
			if err != nil || v <= 0 {
				t.Errorf("row %d, %s: %q is not a positive whole number", i+2, header[j+1], cell)
			}
		}
	}
}

// TestDairyEffects checks that the effects injected into bottled milk are
// exactly the ones documented in examples/dairy/README.md: the history with
// effects minus the one without is the table below in those months and 0
// elsewhere. (All sizes are whole litres, so rounding cannot blur them.)
func TestDairyEffects(t *testing.T) {
	// Source: examples/dairy/README.md, "Injected effects" (the task's
	// sizes: fair about +24,000 litres once a year 2019..2026, varying by
	// year, in August or September; outage -60,000 and -35,000 litres in
	// July and August 2025).
	want := map[string]float64{
		"2019-08": 22500,
		"2020-09": 23800,
		"2021-08": 24600,
		"2022-09": 23100,
		"2023-09": 25200,
		"2024-08": 24000,
		"2025-07": -60000,
		"2025-08": -35000, // outage only: the 2025 fair is in September
		"2025-09": 24400,
		"2026-08": 24400,
	}
	with, without := dairy(1, true), dairy(1, false)
	for i := range with.rows() {
		p := with.start.Add(i).String()
		for j, name := range with.names {
			got := with.values[j][i] - without.values[j][i]
			w := 0.0
			if j == 0 {
				w = want[p]
			}
			if got != w {
				t.Errorf("%s %s: effect %v, want %v", p, name, got, w)
			}
		}
	}
	// The fair averages 24,000 litres over its 8 years:
	// (22500+23800+24600+23100+25200+24000+24400+24400)/8 = 192000/8 = 24000.
	var sum float64
	var n int
	for _, e := range bottledEffects {
		if e.what == "festival" {
			sum += e.litres
			n++
		}
	}
	if n != 8 || sum/float64(n) != 24000 {
		t.Errorf("%d fairs averaging %v, want 8 averaging 24000", n, sum/float64(n))
	}
	// The fair moves between August and September (four years each), so
	// it is not confounded with one month's seasonal factor:
	// August 2019, 2021, 2024, 2026; September 2020, 2022, 2023, 2025.
	months := map[int]int{}
	for _, e := range bottledEffects {
		if e.what == "festival" {
			months[int(mustMonth(e.label).Start().Month())]++
		}
	}
	if len(months) != 2 || months[8] != 4 || months[9] != 4 {
		t.Errorf("fair months %v, want 4 in August (8) and 4 in September (9)", months)
	}
	// Each fair stands out of the noise of its own month: the noise sd is
	// bottledNoise * level*(1+trend)^t * season[m]. Hand calculations:
	// largest ratio 2021-08 (t = 31): 0.015 * 430000*1.003^31*0.90 =
	// 0.015*424659 = 6370 litres, 24600/6370 = 3.86 sd; smallest 2025-09
	// (t = 80): 0.015 * 430000*1.003^80*1.04 = 0.015*568298 = 8524 litres,
	// 24400/8524 = 2.86 sd. Want > 2.5 sd for every fair.
	for _, e := range bottledEffects {
		if e.what != "festival" {
			continue
		}
		i := mustMonth(e.label).Sub(dairyStart)
		sd := bottledNoise * bottledLevel * math.Pow(1+bottledTrend, float64(i)) * bottledSeason[i%12]
		if e.litres < 2.5*sd {
			t.Errorf("%s fair %v litres is under 2.5 noise sd (%.0f)", e.label, e.litres, sd)
		}
	}
}

// TestSeasonFactors checks the design tables: each averages 1, and the
// bottled milk trough sits about 15% below its peak.
func TestSeasonFactors(t *testing.T) {
	tests := []struct {
		name   string
		season [12]float64
		// Design values from the task: multiplicative factors averaging 1.
		wantMean float64
		// (max-min)/max, hand calculation from the tables in main.go.
		wantDrop float64
		tol      float64
	}{
		// (1.05-0.90)/1.05 = 0.142857
		{"bottled", bottledSeason, 1, 0.142857, 1e-6},
		// (1.05-0.95)/1.05 = 0.095238
		{"yoghurt", yoghurtSeason, 1, 0.095238, 1e-6},
		// (1.35-0.93)/1.35 = 0.311111
		{"cream", creamSeason, 1, 0.311111, 1e-6},
	}
	for _, tc := range tests {
		s := tc.season[:]
		mean := stat.Mean(s, nil)
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, v := range s {
			lo, hi = min(lo, v), max(hi, v)
		}
		if !scalar.EqualWithinAbsOrRel(mean, tc.wantMean, tc.tol, tc.tol) {
			t.Errorf("%s: mean factor %v, want %v", tc.name, mean, tc.wantMean)
		}
		if drop := (hi - lo) / hi; !scalar.EqualWithinAbsOrRel(drop, tc.wantDrop, tc.tol, tc.tol) {
			t.Errorf("%s: peak-to-trough %v, want %v", tc.name, drop, tc.wantDrop)
		}
	}
	// School-year pattern: July and August are the two lowest months of
	// bottled milk; October is the highest.
	for m, v := range bottledSeason {
		if m != 6 && m != 7 && v <= bottledSeason[6] {
			t.Errorf("bottled factor of month %d (%v) not above July's", m+1, v)
		}
		if v > bottledSeason[9] {
			t.Errorf("bottled factor of month %d (%v) above October's", m+1, v)
		}
	}
	if creamSeason[11] != slices.Max(creamSeason[:]) {
		t.Error("cream does not peak in December")
	}
}

// TestDairyStatistics checks that the generated numbers have the sizes the
// task asked for, within what the noise allows.
func TestDairyStatistics(t *testing.T) {
	tab := dairy(1, false)
	tests := []struct {
		name         string
		col          int
		level, trend float64
		season       [12]float64
		// Relative noise of the design; the sample standard deviation of
		// y / (level*(1+trend)^t*season) - 1 over 94 months should be near
		// it (a sample sd of 94 normal draws is within 20% of sigma with
		// overwhelming probability: its relative sd is about 1/sqrt(2*93)
		// = 0.073, common practice).
		wantNoise float64
		tol       float64
	}{
		{"bottled-l", 0, bottledLevel, bottledTrend, bottledSeason, bottledNoise, 0.2},
		{"yoghurt-kg", 1, yoghurtLevel, yoghurtTrend, yoghurtSeason, yoghurtNoise, 0.2},
		{"cream-l", 2, creamLevel, creamTrend, creamSeason, creamNoise, 0.2},
	}
	for _, tc := range tests {
		y := tab.values[tc.col]
		rel := make([]float64, len(y))
		for i, v := range y {
			rel[i] = v/(tc.level*math.Pow(1+tc.trend, float64(i))*tc.season[i%12]) - 1
		}
		mean, sd := stat.MeanStdDev(rel, nil)
		if !scalar.EqualWithinAbsOrRel(sd, tc.wantNoise, 0, tc.tol) {
			t.Errorf("%s: relative noise sd %v, want %v", tc.name, sd, tc.wantNoise)
		}
		// The mean of 94 draws has sd sigma/sqrt(94), 0.015/9.70 = 0.0015 for
		// bottled-l and 0.03/9.70 = 0.0031 for the others; allow 4 of them.
		if math.Abs(mean) > 4*tc.wantNoise/math.Sqrt(float64(len(y))) {
			t.Errorf("%s: relative noise mean %v, want about 0", tc.name, mean)
		}
	}
	// bottled-l: mean level of 2019 is 430000 * mean(1.003^t, t=0..11) =
	// 430000 * (1.003^12-1)/(12*0.003) = 430000 * 1.016649 = 437159 litres
	// (geometric sum, hand calculation); allow 2% for the noise.
	got := stat.Mean(tab.values[0][:12], nil)
	if !scalar.EqualWithinAbsOrRel(got, 437159, 0, 0.02) {
		t.Errorf("bottled-l 2019 mean %v, want about 437159", got)
	}
}

func TestBenchShape(t *testing.T) {
	tests := []struct {
		name              string
		args              []string
		series, points    int
		first, last       string
		firstCol, lastCol string
	}{
		// The defaults the task asks for: 1000 series, 120 months from
		// 2016-01 (2016-01 + 119 months = 2025-12).
		{"defaults", []string{"-kind", "bench"}, 1000, 120, "2016-01", "2025-12", "s0001", "s1000"},
		// 2020-05 + 12 months = 2021-05.
		{"small", []string{"-kind", "bench", "-series", "7", "-points", "13", "-start", "2020-05"}, 7, 13, "2020-05", "2021-05", "s0001", "s0007"},
		// Five digits are needed past 9999 series.
		{"wide names", []string{"-kind", "bench", "-series", "10000", "-points", "2"}, 10000, 2, "2016-01", "2016-02", "s00001", "s10000"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			header, rows := readWide(t, runOK(t, tc.args...))
			if len(header) != tc.series+1 || header[0] != "period" {
				t.Fatalf("header has %d fields starting %q, want period + %d series", len(header), header[0], tc.series)
			}
			if header[1] != tc.firstCol || header[tc.series] != tc.lastCol {
				t.Errorf("series %s..%s, want %s..%s", header[1], header[tc.series], tc.firstCol, tc.lastCol)
			}
			if len(rows) != tc.points {
				t.Fatalf("%d rows, want %d", len(rows), tc.points)
			}
			if rows[0][0] != tc.first || rows[len(rows)-1][0] != tc.last {
				t.Errorf("periods %s..%s, want %s..%s", rows[0][0], rows[len(rows)-1][0], tc.first, tc.last)
			}
			for i, r := range rows {
				for j, cell := range r[1:] {
					v, err := strconv.ParseFloat(cell, 64)
					if err != nil || v < 0 || v != math.Trunc(v) {
						t.Fatalf("row %d, %s: %q is not a whole number >= 0", i+2, header[j+1], cell)
					}
				}
			}
		})
	}
}

// TestBenchVaried checks that the bench series differ in level, season and
// noise over the ranges documented on bench.
func TestBenchVaried(t *testing.T) {
	tab := bench(1, 1000, 120, mustMonth("2016-01"))
	var means []float64
	flat := 0
	for _, y := range tab.values {
		means = append(means, stat.Mean(y, nil))
		if y[0] == 0 && y[1] == 0 {
			flat++
		}
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, m := range means {
		lo, hi = min(lo, m), max(hi, m)
	}
	// Levels are log-uniform on [200, 200000]; trends up to +0.8%/month
	// multiply them by up to 1.008^119 = 2.58 by the end. Over 1000 series the
	// extreme means should come near both ends.
	if lo > 400 || hi < 100000 {
		t.Errorf("series means span %v..%v, want about 200..200000", lo, hi)
	}
	if flat > 0 {
		t.Errorf("%d series start with zeros", flat)
	}
	// Series k is the same however many series are asked for, and its first
	// values do not depend on the length.
	small := bench(1, 5, 24, mustMonth("2016-01"))
	for k := range small.values {
		for i, v := range small.values[k] {
			if tab.values[k][i] != v {
				t.Fatalf("series %s differs at %d when 5 of 24 points are asked for", small.names[k], i)
			}
		}
	}
}

func TestOutFile(t *testing.T) {
	name := filepath.Join(t.TempDir(), "h.csv")
	runOK(t, "-out", name)
	got, err := os.ReadFile(name)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, runOK(t)) {
		t.Error("-out file differs from standard output")
	}
}

func TestBadFlags(t *testing.T) {
	tests := []struct {
		name string
		args []string
		code int
		want string // part of stderr
	}{
		{"unknown kind", []string{"-kind", "weekly"}, exitUsage, `-kind "weekly": want dairy, bench or portfolio`},
		{"series for dairy", []string{"-series", "5"}, exitUsage, "-series applies to -kind bench or portfolio only"},
		{"points for dairy", []string{"-points", "5"}, exitUsage, "-points applies to -kind bench or portfolio only"},
		{"start for portfolio", []string{"-kind", "portfolio", "-start", "2020-01"}, exitUsage, "-start applies to -kind bench only"},
		{"zero portfolio series", []string{"-kind", "portfolio", "-series", "0"}, exitUsage, "-series 0: want 1..100000"},
		{"portfolio too many cells", []string{"-kind", "portfolio", "-series", "100000", "-points", "501"}, exitUsage, "more than 50000000 values"},
		{"start for dairy", []string{"-start", "2020-01"}, exitUsage, "-start applies to -kind bench only"},
		{"zero series", []string{"-kind", "bench", "-series", "0"}, exitUsage, "-series 0: want 1..100000"},
		{"zero points", []string{"-kind", "bench", "-points", "0"}, exitUsage, "-points 0: want 1..100000"},
		{"too many cells", []string{"-kind", "bench", "-series", "100000", "-points", "1000"}, exitUsage, "more than 50000000 values"},
		{"bad start", []string{"-kind", "bench", "-start", "2020-13"}, exitUsage, "-start: bad period"},
		{"stray argument", []string{"extra"}, exitUsage, `unexpected argument "extra"`},
		{"unknown flag", []string{"-size", "3"}, exitUsage, "flag provided but not defined: -size"},
		{"unwritable", []string{"-out", filepath.Join(t.TempDir(), "no", "such", "dir.csv")}, exitWrite, "no such file or directory"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var out, errOut bytes.Buffer
			code := run(tc.args, &out, &errOut)
			if code != tc.code {
				t.Errorf("exit %d, want %d", code, tc.code)
			}
			if !strings.Contains(errOut.String(), tc.want) {
				t.Errorf("stderr %q, want it to contain %q", errOut.String(), tc.want)
			}
			if out.Len() != 0 {
				t.Errorf("wrote %d bytes to stdout on error", out.Len())
			}
		})
	}
}

// readLong parses a long portfolio CSV, checks its header and returns the
// data rows.
func readLong(t *testing.T, b []byte) [][]string {
	t.Helper()
	recs, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	// The layout asked for: three key columns, widest level first.
	want := "family,product,customer,period,value"
	if len(recs) == 0 || strings.Join(recs[0], ",") != want {
		t.Fatalf("header %q, want %q", recs[0], want)
	}
	return recs[1:]
}

// TestPortfolioShape checks the long portfolio file: the asked number of
// series, each named by three non-empty levels without "/", appearing once
// (its rows together, months in order, ending 2026-10, at most -points of
// them), every value a finite whole number >= 0, and the file read back by
// scenario/data with the key family, product, customer.
func TestPortfolioShape(t *testing.T) {
	tests := []struct {
		name           string
		args           []string
		series, points int
	}{
		// The defaults: 300 series, 2019-01 through 2026-10 (94 months).
		{"defaults", []string{"-kind", "portfolio"}, 300, 94},
		{"small", []string{"-kind", "portfolio", "-series", "7", "-points", "13"}, 7, 13},
		{"one point", []string{"-kind", "portfolio", "-series", "3", "-points", "1", "-seed", "9"}, 3, 1},
		{"many customers", []string{"-kind", "portfolio", "-series", "2000", "-points", "40"}, 2000, 40},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			out := runOK(t, tc.args...)
			rows := readLong(t, out)
			done := map[string]bool{}
			var name, last string
			count := 0
			for i, r := range rows {
				for _, c := range r[:3] {
					if c == "" || strings.ContainsAny(c, "/, \"") {
						t.Fatalf("line %d: key cell %q is empty or holds / , space or quote", i+2, c)
					}
				}
				v, err := strconv.ParseFloat(r[4], 64)
				if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || v < 0 || v != math.Trunc(v) {
					t.Fatalf("line %d: value %q is not a finite whole number >= 0", i+2, r[4])
				}
				n := strings.Join(r[:3], "/")
				if n != name {
					if done[n] {
						t.Fatalf("line %d: series %s appears twice", i+2, n)
					}
					if name != "" && last != "2026-10" {
						t.Errorf("series %s ends in %s, want 2026-10", name, last)
					}
					name, count = n, 0
					done[n] = true
				} else if r[3] <= last {
					t.Fatalf("line %d: %s after %s", i+2, r[3], last)
				}
				last = r[3]
				if count++; count > tc.points {
					t.Fatalf("line %d: series %s has more than %d values", i+2, n, tc.points)
				}
			}
			if last != "2026-10" {
				t.Errorf("last series ends in %s, want 2026-10", last)
			}
			if len(done) != tc.series {
				t.Errorf("%d series, want %d", len(done), tc.series)
			}
			h, err := data.ReadHistory(bytes.NewReader(out), "history.csv", data.ReadOptions{Key: []string{"family", "product", "customer"}})
			if err != nil {
				t.Fatal(err)
			}
			if len(h.Series) != tc.series || h.Layout != "long" {
				t.Errorf("ReadHistory: %d series in the %s layout, want %d in the long one", len(h.Series), h.Layout, tc.series)
			}
			for _, s := range h.Series {
				if strings.Count(s.Name, "/") != 2 {
					t.Errorf("series %q has not 3 levels", s.Name)
				}
			}
		})
	}
}

// TestPortfolioVaried checks the design documented on portfolio: intermittent
// series with months of no orders, a few short histories, every kind of
// customer, and series that do not change when more series or other seeds
// are asked for.
func TestPortfolioVaried(t *testing.T) {
	tab := portfolio(1, 300, 94)
	short, zeros, kinds := 0, 0, map[string]bool{}
	for _, s := range tab.series {
		if len(s.values) < 94 {
			short++
			if len(s.values) < 24 {
				t.Errorf("%v has %d values, want at least 24", s.keys, len(s.values))
			}
		}
		if slices.Contains(s.values, 0) {
			zeros++
		}
		kinds[strings.TrimRight(s.keys[2], "-0123456789")] = true
	}
	// One series in twenty is short: 15 expected of 300, binomial sd
	// sqrt(300*0.05*0.95) = 3.8 (hand calculation); accept 5..30.
	if short < 5 || short > 30 {
		t.Errorf("%d short series, want about 15", short)
	}
	// Cafes and shops (about half the series) are intermittent with chance
	// 0.5 and 0.4; want at least 20 series with a month of no orders.
	if zeros < 20 {
		t.Errorf("%d series with zeros, want at least 20", zeros)
	}
	for _, k := range []string{"grocer-north", "schools", "cafe-row", "farm-shop", "grocer", "cafe", "shop", "school"} {
		if !kinds[k] {
			t.Errorf("no customer %q in the default portfolio", k)
		}
	}
	// Each series draws from its own stream: the 50 series of a smaller
	// portfolio are among the 300, with the same values.
	all := map[[3]string][]float64{}
	for _, s := range tab.series {
		all[s.keys] = s.values
	}
	for _, s := range portfolio(1, 50, 94).series {
		if !slices.Equal(all[s.keys], s.values) {
			t.Errorf("%v differs between 50 and 300 series", s.keys)
		}
	}
}

// TestPortfolioFileUpToDate checks that the committed example is the
// generator's default output. Regenerate it with
//
//	go run ./examples/generate -kind portfolio -out examples/portfolio/history.csv
func TestPortfolioFileUpToDate(t *testing.T) {
	committed, err := os.ReadFile(filepath.Join("..", "portfolio", "history.csv"))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(committed, runOK(t, "-kind", "portfolio")) {
		t.Error("examples/portfolio/history.csv differs from the generator's output; regenerate it")
	}
	// The plan draft (examples/portfolio/plan.yaml) counts on these series:
	// grocer-hill never bought whole milk in litre bottles (the account adds
	// it as a new series), and grocer-east, which leaves, buys some of all
	// five families.
	names := map[string]bool{}
	for _, s := range portfolio(1, portfolioSeries, portfolioPoints).series {
		names[strings.Join(s.keys[:], "/")] = true
	}
	if names["milk/whole-1l/grocer-hill"] {
		t.Error("grocer-hill buys milk/whole-1l; plan.yaml adds it as a new series")
	}
	for _, n := range []string{"milk/semi-1l/grocer-hill", "milk/whole-2l/grocer-hill", "yoghurt/strawberry-125g/grocer-hill"} {
		if !names[n] {
			t.Errorf("no series %s; plan.yaml scopes the account over it", n)
		}
	}
	for _, f := range []string{"milk", "yoghurt", "cream", "cheese", "butter"} {
		found := false
		for n := range names {
			found = found || strings.HasPrefix(n, f+"/") && strings.HasSuffix(n, "/grocer-east")
		}
		if !found {
			t.Errorf("grocer-east buys no %s", f)
		}
	}
}
