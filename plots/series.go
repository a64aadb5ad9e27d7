package plots

import (
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// maxMarks is about the most markers a line gets; markers on longer lines
// go on every k-th point only.
const maxMarks = 14

// runs splits the values starting at x position start into runs of finite
// values; NaN ends a run.
func runs(start int, vs []float64) []plotter.XYs {
	var out []plotter.XYs
	var cur plotter.XYs
	for j, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			if len(cur) > 0 {
				out = append(out, cur)
				cur = nil
			}
			continue
		}
		cur = append(cur, plotter.XY{X: float64(start + j), Y: onAxis(v)})
	}
	if len(cur) > 0 {
		out = append(out, cur)
	}
	return out
}

// steps is runs for a level that holds for a whole period: each value is a
// flat segment from x-0.5 to x+0.5, joined to the next by a riser.
func steps(start int, vs []float64) []plotter.XYs {
	var out []plotter.XYs
	for _, r := range runs(start, vs) {
		s := make(plotter.XYs, 0, 2*len(r))
		for _, p := range r {
			s = append(s, plotter.XY{X: p.X - 0.5, Y: p.Y}, plotter.XY{X: p.X + 0.5, Y: p.Y})
		}
		out = append(out, s)
	}
	return out
}

// newLine returns a line through xys drawn in look lk.
func newLine(xys plotter.XYs, lk look) *plotter.Line {
	l := &plotter.Line{XYs: xys, LineStyle: lk.lineStyle()}
	return l
}

// marks returns a scatter of every k-th point of the runs, k chosen so there
// are at most about maxMarks; phase in [0, 1) shifts which points so the
// marks of several lines do not pile up. It returns nil when lk has no
// marker.
func marks(rs []plotter.XYs, lk look, phase float64) *plotter.Scatter {
	if lk.Shape == nil {
		return nil
	}
	n := 0
	for _, r := range rs {
		n += len(r)
	}
	k := max(1, (n+maxMarks-1)/maxMarks)
	off := int(phase * float64(k))
	var pts plotter.XYs
	j := 0
	for _, r := range rs {
		for _, p := range r {
			if (j+off)%k == 0 {
				pts = append(pts, p)
			}
			j++
		}
	}
	return &plotter.Scatter{XYs: pts, GlyphStyle: lk.glyphStyle()}
}

// series draws values from x position start as line(s) in look lk, with
// thinned markers, and returns the thumbnails of its key entry: the given
// under ones (a band's swatch, say; nil ones are skipped), the line and the
// marker. A lone point gets a marker even if lk has none, since a line
// through one point does not show. With no finite values it draws nothing
// and returns nil.
func (f *frame) series(start int, vs []float64, lk look, phase float64, under ...plot.Thumbnailer) []plot.Thumbnailer {
	rs := runs(start, vs)
	if len(rs) == 0 {
		return nil
	}
	var thumbs []plot.Thumbnailer
	for _, t := range under {
		if t != nil {
			thumbs = append(thumbs, t)
		}
	}
	var first *plotter.Line
	for _, r := range rs {
		l := newLine(r, lk)
		if first == nil {
			first = l
		}
		f.add(l)
	}
	thumbs = append(thumbs, first)
	mk := lk
	if mk.Shape == nil && len(vs) == 1 {
		mk.Shape, mk.Radius = draw.CircleGlyph{}, vg.Points(2.5)
	}
	if m := marks(rs, mk, phase); m != nil {
		f.add(m)
		if lk.Shape != nil {
			thumbs = append(thumbs, m)
		}
	}
	f.include(vs)
	return thumbs
}

// band adds c's band, if it has one, as a light tint of lk's colour with
// hairline edges, and returns it for the key (nil without a band). Bands go
// in before any line so no band covers a line.
func (f *frame) band(c Curve, lk look) plot.Thumbnailer {
	if len(c.Values) == 0 || !c.hasBand() {
		return nil
	}
	b := newBand(c.Start, c.Lower, c.Upper, tint(lk.Color, 0x33),
		draw.LineStyle{Color: tint(lk.Color, 0x99), Width: vg.Points(0.5)})
	f.add(b)
	f.include(c.Lower, c.Upper)
	return b
}
