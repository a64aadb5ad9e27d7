package plots

import (
	"bytes"
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// DPI is the resolution of PNG output in dots per inch, twice the 96 of
// an ordinary screen, so that a PNG stays sharp on a slide, a projector or
// a dense screen: a chart w by h renders as round(w/inch*DPI) by
// round(h/inch*DPI) pixels, so the default 8 by 4.5 inches gives 1536 by
// 864. Lines and text are sized in points, so they keep their size on the
// page.
const DPI = 192

// MaxSide is the largest width or height Render accepts (40 inches).
const MaxSide = 40 * vg.Inch

// Render draws p as "png" or "svg" (any case, a leading dot allowed) of
// width by height and returns the file's bytes; the caller writes them out.
// The same plot, format and size always give the same bytes.
//
// For charts made by this package Render first lays the chart out for the
// size: it thins the period labels to the width and keeps room above the data
// for the key. This changes p, so one plot must not be rendered from two
// goroutines at once. A chart of stacked panels (StockChart,
// ComparisonChart) is drawn whole only by Render: p itself is the top panel.
//
// Render returns an error wrapping ErrFormat for another format, ErrSize
// when width or height is not finite and positive or exceeds MaxSide, and
// ErrNoData for a nil plot.
func Render(p *plot.Plot, format string, width, height vg.Length) ([]byte, error) {
	if p == nil {
		return nil, fmt.Errorf("plots: render: nil plot: %w", ErrNoData)
	}
	for _, side := range []vg.Length{width, height} {
		v := float64(side)
		if math.IsNaN(v) || !(side > 0) || side > MaxSide {
			return nil, fmt.Errorf("plots: render: size %v by %v: %w", width, height, ErrSize)
		}
	}
	lay, ok := p.X.Tick.Marker.(layout)
	if ok {
		lay.fitStack(width, height)
	}
	paint := func(c draw.Canvas) {
		if ok {
			lay.drawStack(c)
		} else {
			p.Draw(c)
		}
	}
	var buf bytes.Buffer
	switch strings.ToLower(strings.TrimPrefix(format, ".")) {
	case "png":
		c := vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseDPI(DPI))
		paint(draw.New(c))
		if _, err := (vgimg.PngCanvas{Canvas: c}).WriteTo(&buf); err != nil {
			return nil, fmt.Errorf("plots: render png: %w", err)
		}
	case "svg":
		c := vgsvg.New(width, height)
		paint(draw.New(c))
		if _, err := c.WriteTo(&buf); err != nil {
			return nil, fmt.Errorf("plots: render svg: %w", err)
		}
	default:
		return nil, fmt.Errorf("plots: render: format %q (want png or svg): %w", format, ErrFormat)
	}
	return buf.Bytes(), nil
}
