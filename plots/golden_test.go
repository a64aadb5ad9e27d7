package plots_test

import (
	"bytes"
	"flag"
	"image"
	"image/png"
	"os"
	"path/filepath"
	"testing"

	"forelay/plots"
)

var update = flag.Bool("update", false, "rewrite the golden images in testdata")

// TestGolden compares five demo charts with reviewed reference images in
// testdata. Anti-aliasing may differ a little between machines, so a pixel
// counts as changed only when a channel moves by more than 32 of 255, and up
// to 0.5% of pixels may change. Run with -update to accept new images after
// looking at them.
func TestGolden(t *testing.T) {
	charts := demoCharts()
	for _, name := range []string{"plan", "waterfall", "stock", "compare", "load"} {
		p, err := charts[name]()
		if err != nil {
			t.Fatal(err)
		}
		got, err := plots.Render(p, "png", plots.DefaultWidth, plots.DefaultHeight)
		if err != nil {
			t.Fatal(err)
		}
		path := filepath.Join("testdata", name+"_golden.png")
		if *update {
			if err := os.WriteFile(path, got, 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		want, err := os.ReadFile(path)
		if err != nil {
			t.Fatalf("%v (run go test -update to create it)", err)
		}
		if share := changedShare(t, got, want); share > 0.005 {
			t.Errorf("%s: %.2f%% of pixels differ from %s", name, 100*share, path)
		}
	}
}

// changedShare returns the share of pixels that differ clearly between two
// PNG images of the same size.
func changedShare(t *testing.T, a, b []byte) float64 {
	t.Helper()
	ia, err := png.Decode(bytes.NewReader(a))
	if err != nil {
		t.Fatal(err)
	}
	ib, err := png.Decode(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	if ia.Bounds() != ib.Bounds() {
		t.Fatalf("sizes differ: %v and %v", ia.Bounds(), ib.Bounds())
	}
	return diffShare(ia, ib)
}

func diffShare(a, b image.Image) float64 {
	r := a.Bounds()
	n := 0
	for y := r.Min.Y; y < r.Max.Y; y++ {
		for x := r.Min.X; x < r.Max.X; x++ {
			r1, g1, b1, _ := a.At(x, y).RGBA()
			r2, g2, b2, _ := b.At(x, y).RGBA()
			if far(r1, r2) || far(g1, g2) || far(b1, b2) {
				n++
			}
		}
	}
	return float64(n) / float64(r.Dx()*r.Dy())
}

// far reports whether two 16-bit channel values differ by more than 32/255.
func far(u, v uint32) bool {
	d := int(u) - int(v)
	return d > 32*257 || d < -32*257
}
