package plots

import (
	"math"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// TestStockPanel checks that the stock of a StockChart gets a panel of its
// own, scaled to the stock rather than to the demand, below the build and
// with its data area lined up with the build's.
func TestStockPanel(t *testing.T) {
	// A pre-build of at most 30,000 ahead of a demand of about 600,000: on
	// one axis from 0 to 600,000 the stock would take 5% of the height.
	demand := []float64{580000, 590000, 640000, 660000, 600000, 590000}
	build := []float64{600000, 610000, 620000, 620000, 600000, 590000}
	stock := []float64{20000, 40000, 20000, -20000, -20000, -20000}
	c := StockChart{Labels: monthLabels(2026, 6), Demand: demand, Build: build, Stock: stock,
		Capacity: []float64{620000, 620000, 620000, 620000, 620000, 620000}}
	p, err := c.Plot()
	if err != nil {
		t.Fatal(err)
	}
	f := p.X.Tick.Marker.(*frame)
	if len(f.panels) != 1 {
		t.Fatalf("%d panels below the build, want 1", len(f.panels))
	}
	w, h := 8*vg.Inch, 4.5*vg.Inch
	f.fitStack(w, h)
	g := f.panels[0].f
	// The stock axis covers -20,000 to 40,000 (plus padding and headroom
	// for nothing: the key is above the top panel), so it spans less than
	// 200,000; the build axis reaches past 660,000.
	if g.p.Y.Min > -20000 || g.p.Y.Max < 40000 || g.p.Y.Max-g.p.Y.Min > 200000 {
		t.Errorf("stock axis %v to %v, want about -20,000 to 40,000", g.p.Y.Min, g.p.Y.Max)
	}
	if p.Y.Max < 660000 || p.Y.Min != 0 {
		t.Errorf("build axis %v to %v, want 0 to at least 660,000", p.Y.Min, p.Y.Max)
	}
	// Only the lowest panel writes period labels.
	for _, tk := range p.X.Tick.Marker.Ticks(p.X.Min, p.X.Max) {
		if tk.Label != "" && tk.Label != " " {
			t.Errorf("top panel writes the period label %q", tk.Label)
		}
	}
	if g.p.X.Label.Text != "Month" || p.X.Label.Text != "" {
		t.Errorf("axis names %q (top) and %q (stock), want none and Month", p.X.Label.Text, g.p.X.Label.Text)
	}
	ts := f.tiles(draw.New(vgimg.New(w, h)))
	top, low := p.DataCanvas(ts[0]), g.p.DataCanvas(ts[1])
	const tol = 0.01 // points
	if math.Abs(float64(top.Min.X-low.Min.X)) > tol || math.Abs(float64(top.Max.X-low.Max.X)) > tol {
		t.Errorf("data areas %v to %v and %v to %v do not line up", top.Min.X, top.Max.X, low.Min.X, low.Max.X)
	}
	if low.Max.Y >= top.Min.Y {
		t.Errorf("stock panel (top at %v) reaches into the build panel (bottom at %v)", low.Max.Y, top.Min.Y)
	}
	// The stock panel takes about stockShare of the height.
	if share := float64((ts[1].Max.Y - ts[1].Min.Y) / h); math.Abs(share-stockShare) > 0.05 {
		t.Errorf("stock panel takes %.2f of the height, want about %.2f", share, stockShare)
	}
}
