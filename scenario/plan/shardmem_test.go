package plan

import (
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"runtime/debug"
	"runtime/metrics"
	"strings"
	"sync/atomic"
	"testing"

	"forelay/scenario"
)

// shardFile writes a long history of n invented series of 24 months
// (families, products and customers of a dairy) and returns the scenario
// file that plans every series with simple exponential smoothing, under an
// event that moves them all.
func shardFile(tb testing.TB, n int) *scenario.File {
	tb.Helper()
	dir := tb.TempDir()
	var b strings.Builder
	b.WriteString("family,product,customer,period,value\n")
	for i := range n {
		for m := range 24 {
			fmt.Fprintf(&b, "fam%d,prod%d,cust%05d,%d-%02d,%d\n", i%5, i%21, i, 2025+m/12, m%12+1, 100+(i*7+m*13)%50)
		}
	}
	if err := os.WriteFile(filepath.Join(dir, "h.csv"), []byte(b.String()), 0o644); err != nil {
		tb.Fatal(err)
	}
	src := `plan: shard-memory
history:
  file: h.csv
  key: [family, product, customer]
  levels: [family, product, customer]
  series: "**"
  period: month
horizon: 12
baseline: {method: ses}
events:
  - id: price-rise
    kind: step
    start: 2027-03
    effect: {percent: -3}
    scope: [{series: "**"}]
`
	f, err := scenario.Parse(strings.NewReader(src), filepath.Join(dir, "plan.yaml"))
	if err != nil {
		tb.Fatal(err)
	}
	return f
}

// shardKept reads and plans, as the shard that owns one series only, the
// file of shardFile, and returns the heap, per series of the other
// shards, that the inputs and the portfolio keep (measured after a
// collection before and after) and the largest live heap while they are
// read and built (peakLive).
func shardKept(tb testing.TB, f *scenario.File, n int) (kept, peak float64) {
	tb.Helper()
	own := "fam0/prod0/cust00000"
	var in *Inputs
	var pf *Portfolio
	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	top := peakLive(func() {
		var err error
		if in, err = ReadShard(f, func(name string) bool { return name == own }); err != nil {
			tb.Fatal(err)
		}
		if pf, err = BuildPortfolio(f, in, 1); err != nil {
			tb.Fatal(err)
		}
	})
	runtime.GC()
	runtime.ReadMemStats(&after)
	if len(pf.Names) != 1 || pf.Names[0] != own || len(pf.Shard.All) != n {
		tb.Fatalf("the shard plans %q of %d series", pf.Names, len(pf.Shard.All))
	}
	runtime.KeepAlive(in)
	runtime.KeepAlive(pf)
	foreign := float64(n - 1)
	return (float64(after.HeapAlloc) - float64(before.HeapAlloc)) / foreign, (float64(top) - float64(before.HeapAlloc)) / foreign
}

// peakLive runs run and returns the largest live heap that a garbage
// collection found while it ran. Collections are made frequent (GOGC=10),
// so that they follow the heap closely; each one that ends runs a cleanup
// that reads the live heap and arms the next.
func peakLive(run func()) uint64 {
	defer debug.SetGCPercent(debug.SetGCPercent(10))
	var peak atomic.Uint64
	var stop atomic.Bool
	var arm func(int)
	arm = func(int) {
		s := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
		metrics.Read(s)
		if v := s[0].Value.Uint64(); v > peak.Load() {
			peak.Store(v)
		}
		if !stop.Load() {
			runtime.AddCleanup(new([64]byte), arm, 0)
		}
	}
	runtime.AddCleanup(new([64]byte), arm, 0)
	run()
	stop.Store(true)
	runtime.GC() // the live heap at the end
	s := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
	metrics.Read(s)
	return max(peak.Load(), s[0].Value.Uint64())
}

// TestShardKeepsLittlePerForeignSeries guards what a shard holds of the
// series of other shards, of which ReadShard reads the name and the
// periods only: near 100 bytes per such series, the name's 20 bytes
// included (data.Extents, the selected names and the portfolio's list of
// every name), never the series' values, a plan, a map entry or an
// event's shares per series, neither kept nor for a while as the file is
// read and the portfolio built. The bounds leave room for the runtime's
// rounding and the timing of collections; before the extents, a shard
// held about 1,300 bytes per series of another shard at the peak of this
// test, and 125 after it.
func TestShardKeepsLittlePerForeignSeries(t *testing.T) {
	const n = 5000
	kept, peak := shardKept(t, shardFile(t, n), n)
	t.Logf("per series of another shard: %.0f bytes kept, %.0f at the peak", kept, peak)
	if kept > 200 || peak > 300 {
		t.Errorf("a shard holds %.0f bytes per series of another shard, and %.0f at the peak; want at most 200 and 300", kept, peak)
	}
}

// BenchmarkShardForeign reads and plans, as a shard owning one series, a
// long history of 20,000 series, and reports the heap kept and the peak
// of the live heap per series of the other shards (see
// TestShardKeepsLittlePerForeignSeries).
func BenchmarkShardForeign(b *testing.B) {
	const n = 20000
	f := shardFile(b, n)
	kept, peak := 0.0, 0.0
	for b.Loop() {
		kept, peak = shardKept(b, f, n)
	}
	b.ReportMetric(kept, "kept-B/foreign")
	b.ReportMetric(peak, "peak-B/foreign")
}
