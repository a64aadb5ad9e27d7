// Command generate writes forelay's invented example data as CSV files.
//
// Usage:
//
//	go run ./examples/generate [-kind dairy|bench|portfolio] [-seed N] [-out FILE]
//	go run ./examples/generate -kind bench [-series N] [-points N] [-start 2016-01] [-out FILE]
//	go run ./examples/generate -kind portfolio [-series N] [-points N] [-out FILE]
//
// The dairy and bench kinds write a wide history file: a header
// "period,<series>,..." and one row per month, labelled 2026-03, with one
// whole number per series. The portfolio kind writes a long history file:
// a header "family,product,customer,period,value" and one row per value.
// The same flags always give byte-identical output (on the same Go release,
// since the numbers come from math/rand/v2's PCG generator).
//
// Kinds:
//
//   - dairy (the default) writes the demo history of an invented dairy
//     cooperative, 2019-01 through 2026-10, with the columns bottled-l,
//     yoghurt-kg and cream-l. examples/dairy/history.csv is this output with
//     the default seed; examples/dairy/README.md lists the injected effects.
//   - bench writes -series monthly series of -points values each, starting
//     at -start, named s0001, s0002, ... with varied level, trend, season
//     strength and noise. It feeds the throughput benchmark of
//     "forelay fit --method auto" and is not committed.
//   - portfolio writes -series series (default 300) of the invented
//     cooperative's portfolio: families (milk, yoghurt, cream, cheese,
//     butter), their products and the customers who buy them, each series
//     at most -points months (default 94) ending 2026-10, in the long
//     layout. examples/portfolio/history.csv is this output with the
//     defaults; the function portfolio documents the design.
//
// Flags:
//
//	-kind    dairy, bench or portfolio (default dairy)
//	-seed    seed of the random numbers (default 1)
//	-out     file to write; "-" or empty is standard output (default "-")
//	-series  bench and portfolio: number of series, 1..100000 (default 1000 or 300)
//	-points  bench and portfolio: values per series, 1..100000 (default 120 or 94)
//	-start   bench only: first month (default 2016-01)
//
// The exit status is 0 on success, 2 for bad flags and 1 when the output
// cannot be written.
package main

import (
	"encoding/csv"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"strconv"

	"forelay/forecast"
)

func main() { os.Exit(run(os.Args[1:], os.Stdout, os.Stderr)) }

// Exit statuses of the command.
const (
	exitOK    = 0
	exitWrite = 1
	exitUsage = 2
)

// options are the command-line settings after parsing.
type options struct {
	kind   string
	seed   uint64
	out    string
	series int
	points int
	start  forecast.Period
}

// Limits on the bench size, so that a typo cannot ask for gigabytes.
const (
	maxSeries = 100000
	maxPoints = 100000
	maxCells  = 50_000_000
)

// parseFlags reads the command line. Errors are usage errors; flag's own
// messages go to errOut.
func parseFlags(args []string, errOut io.Writer) (options, error) {
	fs := flag.NewFlagSet("generate", flag.ContinueOnError)
	fs.SetOutput(errOut)
	var o options
	var start string
	fs.StringVar(&o.kind, "kind", "dairy", "data to write: dairy, bench or portfolio")
	fs.Uint64Var(&o.seed, "seed", 1, "seed of the random numbers")
	fs.StringVar(&o.out, "out", "-", `file to write ("-" is standard output)`)
	fs.IntVar(&o.series, "series", 1000, "bench and portfolio: number of series (portfolio default 300)")
	fs.IntVar(&o.points, "points", 120, "bench and portfolio: values per series (portfolio default 94)")
	fs.StringVar(&start, "start", "2016-01", "bench: first month")
	if err := fs.Parse(args); err != nil {
		return o, err
	}
	if fs.NArg() > 0 {
		return o, fmt.Errorf("unexpected argument %q", fs.Arg(0))
	}
	set := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { set[f.Name] = true })
	switch o.kind {
	case "dairy":
		for _, name := range []string{"series", "points"} {
			if set[name] {
				return o, fmt.Errorf("-%s applies to -kind bench or portfolio only", name)
			}
		}
		if set["start"] {
			return o, errors.New("-start applies to -kind bench only")
		}
	case "bench":
		if err := checkSize(o); err != nil {
			return o, err
		}
		p, err := forecast.ParsePeriod(start, forecast.Monthly)
		if err != nil {
			return o, fmt.Errorf("-start: %w", err)
		}
		o.start = p
	case "portfolio":
		if set["start"] {
			return o, errors.New("-start applies to -kind bench only (the portfolio ends in 2026-10)")
		}
		if !set["series"] {
			o.series = portfolioSeries
		}
		if !set["points"] {
			o.points = portfolioPoints
		}
		if err := checkSize(o); err != nil {
			return o, err
		}
	default:
		return o, fmt.Errorf("-kind %q: want dairy, bench or portfolio", o.kind)
	}
	return o, nil
}

// checkSize checks -series and -points against the limits.
func checkSize(o options) error {
	if o.series < 1 || o.series > maxSeries {
		return fmt.Errorf("-series %d: want 1..%d", o.series, maxSeries)
	}
	if o.points < 1 || o.points > maxPoints {
		return fmt.Errorf("-points %d: want 1..%d", o.points, maxPoints)
	}
	if o.series*o.points > maxCells {
		return fmt.Errorf("-series %d -points %d: more than %d values", o.series, o.points, maxCells)
	}
	return nil
}

// run is the whole command; it returns the exit status.
func run(args []string, stdout, stderr io.Writer) int {
	o, err := parseFlags(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return exitOK
	}
	if err != nil {
		fmt.Fprintln(stderr, "generate:", err)
		return exitUsage
	}
	var t csvWriter
	switch o.kind {
	case "bench":
		t = bench(o.seed, o.series, o.points, o.start)
	case "portfolio":
		t = portfolio(o.seed, o.series, o.points)
	default:
		t = dairy(o.seed, true)
	}
	if err := writeOut(o.out, stdout, t); err != nil {
		fmt.Fprintln(stderr, "generate:", err)
		return exitWrite
	}
	return exitOK
}

// A csvWriter is a history that writes itself as CSV: a wide table or a
// long one.
type csvWriter interface {
	writeCSV(w io.Writer) error
}

// writeOut writes t to the named file, or to stdout for "-" or "".
func writeOut(name string, stdout io.Writer, t csvWriter) error {
	if name == "" || name == "-" {
		return t.writeCSV(stdout)
	}
	f, err := os.Create(name)
	if err != nil {
		return err
	}
	if err := t.writeCSV(f); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// A table is a wide history: column j holds the values of series names[j],
// row i belongs to period start.Add(i). All columns have the same length.
type table struct {
	names  []string
	start  forecast.Period
	values [][]float64
}

// rows returns the number of periods in t.
func (t table) rows() int {
	if len(t.values) == 0 {
		return 0
	}
	return len(t.values[0])
}

// writeCSV writes t with encoding/csv: the header "period,<names>" and one
// row per period. Values are printed in the shortest form that reads back
// exactly (whole numbers have no decimal point).
func (t table) writeCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	rec := make([]string, 1+len(t.names))
	rec[0] = "period"
	copy(rec[1:], t.names)
	if err := cw.Write(rec); err != nil {
		return err
	}
	for i := range t.rows() {
		rec[0] = t.start.Add(i).String()
		for j, col := range t.values {
			rec[1+j] = strconv.FormatFloat(col[i], 'f', -1, 64)
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// Random streams: each series draws from its own PCG stream, so that one
// series does not change when another one is added or lengthened.
const (
	streamBottled  = 1
	streamYoghurt  = 2
	streamCream    = 3
	streamBenchOff = 1 << 32 // bench series k uses stream streamBenchOff + k
)

// The demo history covers 2019-01 through 2026-10.
var (
	dairyStart = mustMonth("2019-01")
	dairyEnd   = mustMonth("2026-10")
)

func mustMonth(label string) forecast.Period {
	p, err := forecast.ParsePeriod(label, forecast.Monthly)
	if err != nil {
		panic(err)
	}
	return p
}

// bottledSeason holds the multiplicative monthly factors of bottled milk,
// January first. They average 1 (sum 12.00): a school-year pattern, high in
// spring (March to May) and autumn (September to November), low in July and
// August; peak 1.05 in October, trough 0.90 in August, so the trough is about
// 15% below the peak ((1.05-0.90)/1.05 = 14.3%).
var bottledSeason = [12]float64{1.00, 1.01, 1.03, 1.04, 1.03, 0.98, 0.91, 0.90, 1.04, 1.05, 1.03, 0.98}

// yoghurtSeason is a weaker pattern with a summer high: factors 1.05 in June
// and July down to 0.95 in December and January (trough about 10% below the
// peak); they average 1.
var yoghurtSeason = [12]float64{0.95, 0.97, 0.99, 1.01, 1.03, 1.05, 1.05, 1.03, 1.01, 0.99, 0.97, 0.95}

// creamSeason is flat but for the Christmas peak (December +35%, November
// +8%) and a January lull; the factors average 1.
var creamSeason = [12]float64{0.93, 0.96, 0.96, 0.96, 0.96, 0.96, 0.96, 0.96, 0.96, 0.96, 1.08, 1.35}

// Size of the bottled milk history before season and noise.
const (
	bottledLevel = 430000 // litres in 2019-01
	bottledTrend = 0.003  // growth per month, compounded
	bottledNoise = 0.015  // standard deviation of the relative noise
	yoghurtLevel = 38000  // kg in 2019-01
	yoghurtTrend = 0.001
	yoghurtNoise = 0.03
	creamLevel   = 21000 // litres in 2019-01
	creamTrend   = 0.0
	creamNoise   = 0.03
)

// An effect is a known event injected into bottled milk: litres added (or
// taken away when negative) in one month.
type effect struct {
	label  string // month, 2025-07
	what   string // festival or outage
	litres float64
}

// bottledEffects are the events in the bottled milk history, in time order:
// the harvest fair once a year 2019..2026 (mean 24,000 litres, about 5% of
// an August's sales) and the storm-related outage of July and August 2025.
// The fair is a movable feast: it falls in August in 2019, 2021, 2024 and
// 2026 and in September in 2020, 2022, 2023 and 2025, so it is not tied to
// one calendar month and can be told apart from the season. Keep
// examples/dairy/README.md in step with this list.
var bottledEffects = []effect{
	{"2019-08", "festival", 22500},
	{"2020-09", "festival", 23800},
	{"2021-08", "festival", 24600},
	{"2022-09", "festival", 23100},
	{"2023-09", "festival", 25200},
	{"2024-08", "festival", 24000},
	{"2025-07", "outage", -60000},
	{"2025-08", "outage", -35000},
	{"2025-09", "festival", 24400},
	{"2026-08", "festival", 24400},
}

// dairy returns the demo history: bottled-l, yoghurt-kg and cream-l, monthly
// from 2019-01 through 2026-10 (94 rows). For month t (0 in 2019-01) with
// calendar month m each series is
//
//	y[t] = round(level * (1+trend)^t * season[m] * (1 + noise*z[t]) + effects[t])
//
// with z[t] standard normal draws from the series' own PCG stream. Only
// bottled-l has effects, and only when withEffects is set (false gives the
// history the dairy would have had without fair and outage).
func dairy(seed uint64, withEffects bool) table {
	n := dairyEnd.Sub(dairyStart) + 1
	var add []float64
	if withEffects {
		add = make([]float64, n)
		for _, e := range bottledEffects {
			add[mustMonth(e.label).Sub(dairyStart)] += e.litres
		}
	}
	return table{
		names: []string{"bottled-l", "yoghurt-kg", "cream-l"},
		start: dairyStart,
		values: [][]float64{
			seasonal(seed, streamBottled, n, bottledLevel, bottledTrend, bottledNoise, bottledSeason, add),
			seasonal(seed, streamYoghurt, n, yoghurtLevel, yoghurtTrend, yoghurtNoise, yoghurtSeason, nil),
			seasonal(seed, streamCream, n, creamLevel, creamTrend, creamNoise, creamSeason, nil),
		},
	}
}

// seasonal returns n whole-number values of a series starting at dairyStart
// (January, so t mod 12 is the calendar month), as documented on dairy. add
// may be nil.
func seasonal(seed, stream uint64, n int, level, trend, noise float64, season [12]float64, add []float64) []float64 {
	rng := rand.New(rand.NewPCG(seed, stream))
	y := make([]float64, n)
	for t := range y {
		v := level * math.Pow(1+trend, float64(t)) * season[t%12] * (1 + noise*rng.NormFloat64())
		if add != nil {
			v += add[t]
		}
		y[t] = math.Round(v)
	}
	return y
}

// bench returns series monthly series of points values from start. Series k
// (1-based, named s0001.., wider names when series > 9999) draws from PCG
// stream 1<<32 + k:
//
//	level  log-uniform on [200, 200000]
//	trend  uniform on [-0.004, 0.008] per month, compounded
//	season none for one series in five; else amplitudes a ~ U(0.02, 0.30),
//	       b ~ U(0, a/2) and phases uniform on [0, 2π):
//	       s[m] = 1 + a*cos(2πm/12 - φ1) + b*cos(4πm/12 - φ2)
//	noise  relative standard deviation uniform on [0.01, 0.15]
//	y[t] = max(0, round(level * (1+trend)^t * s[m] * (1 + noise*z[t])))
//
// with m the calendar month (0 = January) and z[t] standard normal. The
// parameters are drawn before the noise, so a series is the same whatever
// the number of series and its first values the same whatever the length.
func bench(seed uint64, series, points int, start forecast.Period) table {
	width := max(4, len(strconv.Itoa(series)))
	month0 := int(start.Start().Month()) - 1
	t := table{start: start, names: make([]string, series), values: make([][]float64, series)}
	for k := 1; k <= series; k++ {
		rng := rand.New(rand.NewPCG(seed, streamBenchOff+uint64(k)))
		level := math.Exp(math.Log(200) + rng.Float64()*(math.Log(200000)-math.Log(200)))
		trend := -0.004 + 0.012*rng.Float64()
		var a, b, phi1, phi2 float64
		if rng.Float64() >= 0.2 {
			a = 0.02 + 0.28*rng.Float64()
			b = a / 2 * rng.Float64()
			phi1 = 2 * math.Pi * rng.Float64()
			phi2 = 2 * math.Pi * rng.Float64()
		}
		noise := 0.01 + 0.14*rng.Float64()
		y := make([]float64, points)
		for i := range y {
			m := float64((month0 + i) % 12)
			s := 1 + a*math.Cos(2*math.Pi*m/12-phi1) + b*math.Cos(4*math.Pi*m/12-phi2)
			v := level * math.Pow(1+trend, float64(i)) * s * (1 + noise*rng.NormFloat64())
			y[i] = max(0, math.Round(v))
		}
		t.names[k-1] = fmt.Sprintf("s%0*d", width, k)
		t.values[k-1] = y
	}
	return t
}
