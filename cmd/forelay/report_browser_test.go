package main

import (
	"bytes"
	"context"
	"image"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"testing"

	"forelay/scenario/report"
	"forelay/scenario/report/browser"
)

// pdfPage matches the dictionary of one page of a PDF (not the /Pages
// tree), and mediaBox a page's size in points.
var (
	pdfPage  = regexp.MustCompile(`/Type\s*/Page[^s]`)
	mediaBox = regexp.MustCompile(`/MediaBox\s*\[\s*0\s+0\s+([0-9.]+)\s+([0-9.]+)\s*\]`)
)

// TestReportInBrowser loads the reports of the dairy (A4) and the
// portfolio (Letter) in a headless Chromium, takes a screenshot and a PDF
// of each, and checks that the page is not blank, that nothing is wider
// than the paper, and that the PDF has a plausible number of pages of the
// right size. Without a browser it is skipped, except in CI (CI=true),
// where .ci/run installs one and a skip would hide a missing install.
func TestReportInBrowser(t *testing.T) {
	exe, err := browser.Find()
	if err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatalf("CI=true and %v", err)
		}
		t.Skip(err)
	}
	ex := examplesDir()
	for _, tc := range []struct {
		name  string
		paper report.Paper
		// width and height of the page in points: A4 is 210 x 297 mm
		// (ISO 216) = 595.3 x 841.9 pt at 72 pt to the inch; Letter is
		// 8.5 x 11 in = 612 x 792 pt.
		width, height float64
	}{
		{"dairy", report.A4, 595.3, 841.9},
		{"portfolio", report.Letter, 612, 792},
	} {
		t.Run(tc.name, func(t *testing.T) {
			page := runReport(t, filepath.Join(t.TempDir(), "out"), filepath.Join(ex, tc.name, "plan.yaml"),
				"--actuals", filepath.Join(ex, tc.name, "actuals.csv"), "--paper", tc.paper.Name, "--paths", "500")
			res, err := browser.Print(context.Background(), exe, page, tc.paper, true)
			if err != nil {
				t.Fatal(err)
			}
			if res.ScrollWidth > res.ViewportWidth {
				t.Errorf("the page is %d px wide in a window of the paper's %d px: something overflows", res.ScrollWidth, res.ViewportWidth)
			}
			checkNotBlank(t, res.PNG)
			// A plausible length: at least the cover and the sections,
			// at most 40 pages (the dairy prints on about 14 A4 pages, the
			// portfolio on about 30).
			if n := len(pdfPage.FindAll(res.PDF, -1)); n < 2 || n > 40 {
				t.Errorf("the PDF has %d pages, want 2 to 40", n)
			}
			m := mediaBox.FindSubmatch(res.PDF)
			if m == nil {
				t.Fatal("no /MediaBox in the PDF")
			}
			w, _ := strconv.ParseFloat(string(m[1]), 64)
			h, _ := strconv.ParseFloat(string(m[2]), 64)
			// The browser rounds the page to whole CSS pixels: within 2 pt.
			if math.Abs(w-tc.width) > 2 || math.Abs(h-tc.height) > 2 {
				t.Errorf("page %.1f x %.1f pt, want %.1f x %.1f", w, h, tc.width, tc.height)
			}
		})
	}
}

// checkNotBlank fails unless the screenshot has text and lines on it: at
// least 2% of its pixels not white, in at least 8 shades.
func checkNotBlank(t *testing.T, shot []byte) {
	t.Helper()
	img, err := png.Decode(bytes.NewReader(shot))
	if err != nil {
		t.Fatalf("screenshot: %v", err)
	}
	b := img.Bounds()
	shades := map[uint32]bool{}
	inked := 0
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			shades[(r>>8)<<16|(g>>8)<<8|bl>>8] = true
			if r < 0xf000 || g < 0xf000 || bl < 0xf000 {
				inked++
			}
		}
	}
	share := float64(inked) / float64(area(b))
	if share < 0.02 || len(shades) < 8 {
		t.Errorf("the screenshot looks blank: %.2f%% of its pixels inked, %d shades", 100*share, len(shades))
	}
}

func area(r image.Rectangle) int { return r.Dx() * r.Dy() }
