package plots

import (
	"math"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// TestLabelsDoNotOverlap lays charts out for several sizes and measures the
// x labels where gonum/plot really draws them: no two may touch.
func TestLabelsDoNotOverlap(t *testing.T) {
	vals := make([]float64, 60)
	for i := range vals {
		vals[i] = 500000 + 40000*math.Sin(float64(i))
	}
	plan := PlanChart{Title: "t", Units: "litres", Labels: monthLabels(2022, 60), History: Curve{Values: vals}}
	steps := make([]Step, 9)
	for k := range steps {
		steps[k] = Step{Label: "A fairly long event name", Value: float64(k - 4)}
	}
	fall := Waterfall{Start: 100, Steps: steps}
	for _, tc := range []struct {
		name string
		mk   func() (*plot.Plot, error)
	}{{"plan", plan.Plot}, {"waterfall", fall.Plot}} {
		for _, w := range []vg.Length{3 * vg.Inch, 5 * vg.Inch, 8 * vg.Inch, 14 * vg.Inch} {
			p, err := tc.mk()
			if err != nil {
				t.Fatal(err)
			}
			h := 4 * vg.Inch
			p.X.Tick.Marker.(layout).fitStack(w, h)
			dc := p.DataCanvas(draw.New(vgimg.New(w, h)))
			sty := p.X.Tick.Label
			var prev vg.Rectangle
			var prevX vg.Length
			first := true
			for _, tk := range p.X.Tick.Marker.Ticks(p.X.Min, p.X.Max) {
				if tk.IsMinor() {
					continue
				}
				x := dc.X(p.X.Norm(tk.Value))
				r := sty.Rectangle(tk.Label)
				r.Min.X += x
				r.Max.X += x
				if !first && r.Min.X < prev.Max.X && sty.Rotation == 0 {
					t.Errorf("%s at %v: label %q overlaps the one before", tc.name, w, tk.Label)
				}
				if sty.Rotation != 0 {
					// Turned labels are parallel; they must be a line
					// height apart across their slant.
					d := (x - prevX) * vg.Length(math.Sin(sty.Rotation))
					if !first && d < sty.Height("M") {
						t.Errorf("%s at %v: turned label %q is %.1f points from the one before", tc.name, w, tk.Label, d.Points())
					}
				}
				if tk.Label != "" {
					prev, prevX, first = r, x, false
				}
			}
		}
	}
}

// TestHeadroomKeepsDataClear checks that after layout the highest value sits
// below the key and window labels: the y range above the data is at least
// the height they reserve.
func TestHeadroomKeepsDataClear(t *testing.T) {
	c := PlanChart{
		Title: "t", Labels: monthLabels(2025, 12),
		History: Curve{Values: []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12}},
		Windows: []Window{{Label: "first long window label", From: 2, To: 4}, {Label: "second", From: 3, To: 5}},
	}
	p, err := c.Plot()
	if err != nil {
		t.Fatal(err)
	}
	w, h := 6*vg.Inch, 4*vg.Inch
	f := p.X.Tick.Marker.(*frame)
	f.fit(w, h)
	var room vg.Length
	for _, tb := range f.tops {
		room += tb.reserve(f.x.width, room, p.X.Min, p.X.Max)
	}
	dc := p.DataCanvas(draw.New(vgimg.New(w, h)))
	top := dc.Y(p.Y.Norm(12))
	if free := dc.Max.Y - top; free < room {
		t.Errorf("%.1f points free above the data, want at least %.1f", free.Points(), room.Points())
	}
	// The first label runs past the start of the second, so they take two
	// rows.
	if _, n := f.tops[1].(*spans).assign(func(x float64) vg.Length { return vg.Length(x) * vg.Inch / 2 }, 0, 6*vg.Inch, 0); n != 2 {
		t.Errorf("overlapping window labels take %d rows, want 2", n)
	}
}

// TestWindowLabelsApart draws plan charts whose event windows sit in
// neighbouring periods, share a period, or run to the right edge, with past
// events too, at several sizes, and measures the labels where they are
// drawn: no two may overlap, each starts at its window (or, pushed in from
// the right edge, still overlaps it), and all sit above the data.
func TestWindowLabelsApart(t *testing.T) {
	n := 36
	vals := make([]float64, n)
	for i := range vals {
		vals[i] = 100 + 10*math.Sin(float64(i))
	}
	c := PlanChart{
		Title: "t", Labels: monthLabels(2024, n),
		History:       Curve{Values: vals[:24]},
		Baseline:      Curve{Start: 24, Values: vals[24:]},
		ForecastStart: 24,
		Windows: []Window{
			{Label: "grocer-exit", From: 27.5, To: 28.5},
			{Label: "harvest-fair", From: 28.5, To: 29.5}, // the next period
			{Label: "school-milk-contract", From: 28.5, To: 35.5},
			{Label: "price-rise", From: 34.5, To: 35.5}, // at the right edge
		},
		Past: []Window{
			{Label: "storm-outage", From: 9.5, To: 11.5},
			{Label: "harvest-fair", From: 10.5, To: 11.5}, // inside the storm
		},
	}
	for _, w := range []vg.Length{4 * vg.Inch, 6 * vg.Inch, 8 * vg.Inch, 12 * vg.Inch} {
		p, err := c.Plot()
		if err != nil {
			t.Fatal(err)
		}
		h := 4.5 * vg.Inch
		f := p.X.Tick.Marker.(*frame)
		f.fitStack(w, h)
		dc := draw.New(vgimg.New(w, h))
		f.drawStack(dc)
		s := f.tops[1].(*spans)
		if len(s.placed) != len(c.Windows)+len(c.Past) {
			t.Fatalf("width %v: %d labels drawn, want %d", w, len(s.placed), len(c.Windows)+len(c.Past))
		}
		data := p.DataCanvas(dc)
		tr := func(x float64) vg.Length { return data.X(p.X.Norm(x)) }
		all := append(append([]Window(nil), c.Windows...), c.Past...)
		for i, a := range s.placed {
			for j := i + 1; j < len(s.placed); j++ {
				b := s.placed[j]
				if a.Min.X < b.Max.X && b.Min.X < a.Max.X && a.Min.Y < b.Max.Y && b.Min.Y < a.Max.Y {
					t.Errorf("width %v: labels %q and %q overlap", w, all[i].Label, all[j].Label)
				}
			}
			x0, x1 := tr(all[i].From), tr(all[i].To)
			atEdge := math.Abs(float64(a.Min.X-(x0+vg.Points(3)))) < 0.01
			if !atEdge && !(a.Max.X > data.Max.X-vg.Points(3) && a.Min.X < x1) {
				t.Errorf("width %v: label %q starts at %v, away from its window %v to %v", w, all[i].Label, a.Min.X, x0, x1)
			}
			if top := data.Y(p.Y.Norm(f.hi)); a.Min.Y < top {
				t.Errorf("width %v: label %q reaches down to %v, into the data (top %v)", w, all[i].Label, a.Min.Y, top)
			}
		}
	}
}
