package plots_test

import (
	"bytes"
	"encoding/xml"
	"errors"
	"html"
	"image"
	"image/color"
	"image/png"
	"io"
	"math"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"

	"forelay/plots"
)

// chartNames returns the demo charts' names in a fixed order.
func chartNames() []string {
	var names []string
	for name := range demoCharts() {
		names = append(names, name)
	}
	slices.Sort(names)
	return names
}

// inkStats returns the share of pixels that are not white and the number
// of distinct grey levels (BT.601, via image/color.GrayModel) in img.
func inkStats(img image.Image) (inked float64, greys int) {
	b := img.Bounds()
	seen := map[uint8]bool{}
	n := 0
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			g := color.GrayModel.Convert(img.At(x, y)).(color.Gray).Y
			seen[g] = true
			if g < 250 {
				n++
			}
		}
	}
	return float64(n) / float64(b.Dx()*b.Dy()), len(seen)
}

func TestRenderPNG(t *testing.T) {
	sizes := []struct {
		w, h         vg.Length
		wantW, wantH int
	}{
		// At 192 dots per inch (our DPI, twice gonum's vgimg.DefaultDPI):
		// 8 in * 192 = 1536, 4.5 in * 192 = 864.
		{8 * vg.Inch, 4.5 * vg.Inch, 1536, 864},
		// 5 in * 192 = 960, 3 in * 192 = 576.
		{5 * vg.Inch, 3 * vg.Inch, 960, 576},
		// 400 pt = 400/72 in * 192 = 1066.7 -> 1067; 250 pt -> 666.7 -> 667.
		{400, 250, 1067, 667},
	}
	charts := demoCharts()
	for _, name := range chartNames() {
		for _, sz := range sizes {
			p, err := charts[name]()
			if err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			b, err := plots.Render(p, "png", sz.w, sz.h)
			if err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			img, err := png.Decode(bytes.NewReader(b))
			if err != nil {
				t.Fatalf("%s: decode: %v", name, err)
			}
			if got := img.Bounds(); got.Dx() != sz.wantW || got.Dy() != sz.wantH {
				t.Errorf("%s: %v by %v renders %dx%d, want %dx%d", name, sz.w, sz.h, got.Dx(), got.Dy(), sz.wantW, sz.wantH)
			}
			inked, greys := inkStats(img)
			if inked < 0.05 || greys < 32 {
				t.Errorf("%s at %dx%d looks blank: %.1f%% inked, %d grey levels", name, sz.wantW, sz.wantH, 100*inked, greys)
			}
		}
	}
}

func TestRenderSVG(t *testing.T) {
	charts := demoCharts()
	for _, name := range chartNames() {
		p, err := charts[name]()
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		b, err := plots.Render(p, "SVG", plots.DefaultWidth, plots.DefaultHeight)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if !bytes.Contains(b, []byte(">"+p.Title.Text+"<")) {
			t.Errorf("%s: svg lacks the title %q", name, p.Title.Text)
		}
		checkXML(t, name, b)
	}

	// Markup in a title is escaped and the file stays well-formed.
	c := demoWaterfall()
	c.Title = `Cream & butter <2026>`
	p, err := c.Plot()
	if err != nil {
		t.Fatal(err)
	}
	b, err := plots.Render(p, ".svg", plots.DefaultWidth, plots.DefaultHeight)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(b, []byte(html.EscapeString(c.Title))) {
		t.Errorf("svg lacks the escaped title %q", html.EscapeString(c.Title))
	}
	checkXML(t, "escaped title", b)
}

// checkXML fails t unless b is well-formed XML.
func checkXML(t *testing.T, name string, b []byte) {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(b))
	for {
		_, err := d.Token()
		if err == io.EOF {
			return
		}
		if err != nil {
			t.Errorf("%s: svg is not well-formed: %v", name, err)
			return
		}
	}
}

func TestRenderDeterministic(t *testing.T) {
	charts := demoCharts()
	for _, name := range chartNames() {
		for _, format := range []string{"svg", "png"} {
			render := func(p *plot.Plot, w, h vg.Length) []byte {
				b, err := plots.Render(p, format, w, h)
				if err != nil {
					t.Fatalf("%s: %v", name, err)
				}
				return b
			}
			p1, _ := charts[name]()
			p2, _ := charts[name]()
			a := render(p1, plots.DefaultWidth, plots.DefaultHeight)
			if b := render(p2, plots.DefaultWidth, plots.DefaultHeight); !bytes.Equal(a, b) {
				t.Errorf("%s %s: two builds render differently", name, format)
			}
			// Laying a plot out for another size and back gives the same
			// bytes again.
			render(p1, 5*vg.Inch, 3*vg.Inch)
			if b := render(p1, plots.DefaultWidth, plots.DefaultHeight); !bytes.Equal(a, b) {
				t.Errorf("%s %s: rendering again after another size differs", name, format)
			}
		}
	}
}

func TestRenderErrors(t *testing.T) {
	p, err := demoPlan().Plot()
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name   string
		p      *plot.Plot
		format string
		w, h   vg.Length
		want   error
	}{
		{"pdf", p, "pdf", plots.DefaultWidth, plots.DefaultHeight, plots.ErrFormat},
		{"empty format", p, "", plots.DefaultWidth, plots.DefaultHeight, plots.ErrFormat},
		{"zero width", p, "png", 0, plots.DefaultHeight, plots.ErrSize},
		{"negative height", p, "svg", plots.DefaultWidth, -1, plots.ErrSize},
		{"NaN width", p, "png", vg.Length(math.NaN()), plots.DefaultHeight, plots.ErrSize},
		{"infinite height", p, "png", plots.DefaultWidth, vg.Length(math.Inf(1)), plots.ErrSize},
		{"too wide", p, "png", plots.MaxSide + 1, plots.DefaultHeight, plots.ErrSize},
		{"nil plot", nil, "png", plots.DefaultWidth, plots.DefaultHeight, plots.ErrNoData},
	} {
		b, err := plots.Render(tc.p, tc.format, tc.w, tc.h)
		if !errors.Is(err, tc.want) || b != nil {
			t.Errorf("%s: Render = %d bytes, %v; want error %v", tc.name, len(b), err, tc.want)
		}
		if err != nil && !strings.HasPrefix(err.Error(), "plots: ") {
			t.Errorf("%s: error %q lacks the package prefix", tc.name, err)
		}
	}
}
