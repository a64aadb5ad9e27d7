package main

import (
	"bufio"
	"cmp"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"slices"
	"strconv"

	"forelay/forecast"
)

// The portfolio history ends in the same month as the demo history, the
// last month before the plans of the examples start.
var portfolioEnd = dairyEnd

// Defaults of -kind portfolio: a few hundred series, 2019-01 through 2026-10
// like the demo history.
const (
	portfolioSeries = 300
	portfolioPoints = 94
)

// Random streams of the portfolio: customer c decides what it buys and how
// big it is from stream streamCustomerOff + c, and the series of customer c
// and product p draws its shape and noise from stream
// streamPortfolioOff + c<<8 + p.
const (
	streamCustomerOff  = 2 << 32
	streamPortfolioOff = 3 << 32
)

// A family is a group of products with one seasonal pattern. Its factors,
// January first, average 1.
type family struct {
	name   string
	season [12]float64
}

// families of the cooperative, in output order. Milk, yoghurt and cream
// share the patterns of the demo history; cheese and butter rise toward
// Christmas (each table sums to 12.00).
var families = []family{
	{"milk", bottledSeason},
	{"yoghurt", yoghurtSeason},
	{"cream", creamSeason},
	{"cheese", [12]float64{0.97, 0.96, 0.98, 0.99, 1.00, 1.00, 0.98, 0.97, 0.99, 1.00, 1.04, 1.12}},
	{"butter", [12]float64{1.00, 0.97, 0.97, 1.02, 0.98, 0.95, 0.93, 0.94, 0.98, 1.03, 1.08, 1.15}},
}

// schoolSeason replaces the family's pattern for the schools contract: the
// summer holidays empty July and August (sums to 12.00).
var schoolSeason = [12]float64{1.10, 1.15, 1.15, 1.10, 1.15, 1.05, 0.45, 0.20, 1.15, 1.20, 1.20, 1.10}

// A product is one item of a family; base is its monthly sales in packs to
// a customer of size 1 at the start of the history.
type product struct {
	family int // index in families
	name   string
	base   float64
}

// products in output order, grouped by family.
var products = []product{
	{0, "whole-1l", 60000}, {0, "semi-1l", 80000}, {0, "skimmed-1l", 20000},
	{0, "whole-2l", 30000}, {0, "choc-250ml", 8000}, {0, "strawberry-250ml", 5000},
	{1, "plain-500g", 9000}, {1, "strawberry-125g", 15000}, {1, "vanilla-125g", 12000},
	{1, "greek-500g", 6000}, {1, "drink-250ml", 7000},
	{2, "single-250ml", 7000}, {2, "double-250ml", 6000}, {2, "whipping-500ml", 3000},
	{2, "sour-200ml", 2000},
	{3, "mild-200g", 5000}, {3, "mature-200g", 4000}, {3, "curd-250g", 2000},
	{3, "grated-150g", 3000},
	{4, "salted-250g", 6000}, {4, "unsalted-250g", 3000},
}

// A customerKind sets what a customer buys (the chance of taking each
// product, by family), how noisy its orders are and whether small orders
// come in some months only.
type customerKind struct {
	word          string     // name prefix of generated customers
	buy           [5]float64 // chance of buying each product of a family
	noiseLo       float64    // relative noise sd, uniform on [noiseLo, noiseHi]
	noiseHi       float64
	intermittent  float64 // chance that one of its series is intermittent
	sizeLo        float64 // size of a generated customer, uniform on [sizeLo, sizeHi]
	sizeHi        float64
	schoolHoliday bool // the school season replaces the family's
}

var (
	grocer = customerKind{word: "grocer", buy: [5]float64{0.95, 0.9, 0.85, 0.8, 0.85}, noiseLo: 0.04, noiseHi: 0.10, sizeLo: 0.1, sizeHi: 0.5}
	school = customerKind{word: "school", buy: [5]float64{0.7, 0.6, 0, 0, 0}, noiseLo: 0.04, noiseHi: 0.08, sizeLo: 0.05, sizeHi: 0.2, schoolHoliday: true}
	cafe   = customerKind{word: "cafe", buy: [5]float64{0.7, 0.2, 0.7, 0.3, 0.5}, noiseLo: 0.10, noiseHi: 0.25, intermittent: 0.5, sizeLo: 0.005, sizeHi: 0.04}
	shop   = customerKind{word: "shop", buy: [5]float64{0.6, 0.4, 0.4, 0.5, 0.5}, noiseLo: 0.10, noiseHi: 0.25, intermittent: 0.4, sizeLo: 0.01, sizeHi: 0.08}
)

// A customer of the cooperative.
type customer struct {
	name string
	kind *customerKind
	size float64 // multiplies every product's base
}

// namedCustomers come first, biggest first; every name is invented.
var namedCustomers = []customer{
	{"grocer-north", &grocer, 1.0},
	{"grocer-valley", &grocer, 0.8},
	{"grocer-east", &grocer, 0.6},
	{"schools", &school, 0.7},
	{"grocer-hill", &grocer, 0.3},
	{"cafe-row", &cafe, 0.04},
	{"cafe-square", &cafe, 0.03},
	{"farm-shop", &shop, 0.05},
	{"deli-corner", &shop, 0.03},
	{"cafe-mill", &cafe, 0.02},
}

// generatedKinds cycle over the customers after the named ones.
var generatedKinds = []*customerKind{&shop, &cafe, &grocer, &shop, &cafe, &school}

// portfolioCustomer returns customer c (0-based): a named one, or else a
// generated one named after its kind and number (shop-0011), its size drawn
// from rng.
func portfolioCustomer(c int, rng *rand.Rand) customer {
	if c < len(namedCustomers) {
		return namedCustomers[c]
	}
	k := generatedKinds[(c-len(namedCustomers))%len(generatedKinds)]
	size := k.sizeLo + (k.sizeHi-k.sizeLo)*rng.Float64()
	return customer{name: fmt.Sprintf("%s-%04d", k.word, c+1), kind: k, size: size}
}

// A longSeries is one series of a long history: its key cells (family,
// product, customer), its first period and its values.
type longSeries struct {
	keys   [3]string
	start  forecast.Period
	values []float64
}

// A longTable is a history in the long layout with the key columns
// family, product and customer.
type longTable struct {
	series []longSeries
}

// portfolio returns series series of an invented portfolio, each of at
// most points months ending at portfolioEnd. Customers are taken in turn
// (the named ones first); each buys every product with its kind's chance
// for the family, drawn from its own stream, until there are series series.
// They are then ordered by product (so by family) and customer. Series of
// customer c and product p:
//
//	level  base[p] * size[c] * exp(0.3 z), z standard normal
//	trend  uniform on [-0.004, 0.006] per month, compounded
//	season s[m] = 1 + g (f[m] - 1), f the family's factors (the school
//	       factors for schools), g uniform on [0.6, 1.4] (1 for schools)
//	noise  relative sd uniform on the kind's range
//	mu[t]  = level * (1+trend)^t * s[m]
//	y[t]   = max(0, round(mu[t] * (1 + noise z[t])))
//
// An intermittent series (small customers only, with the kind's chance)
// has no order in a month with chance q, uniform on [0.2, 0.6], and orders
// mu[t]/(1-q) (1 + noise z[t]) otherwise, keeping its mean. One series in
// twenty (when points >= 36) is short: it starts between 24 and points-1
// months before the end. The values are whole numbers of packs.
func portfolio(seed uint64, series, points int) longTable {
	type pick struct{ c, p int }
	var picks []pick
	var custs []customer
	for c := 0; len(picks) < series; c++ {
		rng := rand.New(rand.NewPCG(seed, streamCustomerOff+uint64(c)))
		cu := portfolioCustomer(c, rng)
		custs = append(custs, cu)
		for p, pr := range products {
			if rng.Float64() < cu.kind.buy[pr.family] && len(picks) < series {
				picks = append(picks, pick{c, p})
			}
		}
	}
	slices.SortFunc(picks, func(a, b pick) int {
		return cmp.Or(cmp.Compare(a.p, b.p), cmp.Compare(a.c, b.c))
	})
	first := portfolioEnd.Add(1 - points)
	t := longTable{series: make([]longSeries, len(picks))}
	for i, pk := range picks {
		rng := rand.New(rand.NewPCG(seed, streamPortfolioOff+uint64(pk.c)<<8+uint64(pk.p)))
		pr := products[pk.p]
		y := portfolioValues(rng, custs[pk.c], pr, points, first)
		off := points - len(y)
		t.series[i] = longSeries{
			keys:   [3]string{families[pr.family].name, pr.name, custs[pk.c].name},
			start:  first.Add(off),
			values: y,
		}
	}
	return t
}

// portfolioValues draws one series as documented on portfolio: points
// values from first, or fewer for a short series (the last ones).
func portfolioValues(rng *rand.Rand, cu customer, pr product, points int, first forecast.Period) []float64 {
	k := cu.kind
	level := pr.base * cu.size * math.Exp(0.3*rng.NormFloat64())
	trend := -0.004 + 0.010*rng.Float64()
	f, g := families[pr.family].season, 0.6+0.8*rng.Float64()
	if k.schoolHoliday {
		f, g = schoolSeason, 1
	}
	noise := k.noiseLo + (k.noiseHi-k.noiseLo)*rng.Float64()
	q := 0.0
	if rng.Float64() < k.intermittent {
		q = 0.2 + 0.4*rng.Float64()
	}
	off := 0
	if rng.Float64() < 0.05 && points >= 36 {
		off = 1 + rng.IntN(points-24) // length points-off in [24, points-1]
	}
	month0 := int(first.Start().Month()) - 1
	y := make([]float64, 0, points-off)
	grow := 1.0
	for i := range points {
		mu := level * grow * (1 + g*(f[(month0+i)%12]-1))
		grow *= 1 + trend
		z := rng.NormFloat64()
		if q > 0 {
			if rng.Float64() < q {
				mu = 0
			} else {
				mu /= 1 - q
			}
		}
		if i >= off {
			y = append(y, max(0, math.Round(mu*(1+noise*z))))
		}
	}
	return y
}

// writeCSV writes t in the long layout: the header
// "family,product,customer,period,value" and one row per value, series
// after series, periods in order. The cells never need quoting (the names
// are plain words), so the rows are written directly.
func (t longTable) writeCSV(w io.Writer) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	bw.WriteString("family,product,customer,period,value\n")
	var buf []byte
	for _, s := range t.series {
		prefix := s.keys[0] + "," + s.keys[1] + "," + s.keys[2] + ","
		for i, v := range s.values {
			buf = append(buf[:0], prefix...)
			buf = append(buf, s.start.Add(i).String()...)
			buf = append(buf, ',')
			buf = strconv.AppendFloat(buf, v, 'f', -1, 64)
			buf = append(buf, '\n')
			bw.Write(buf)
		}
	}
	return bw.Flush()
}
