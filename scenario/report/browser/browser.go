// Package browser prints a page that package report wrote (Book.HTML) with
// a headless Chromium, driven through the DevTools protocol: Find locates
// the browser, Print lays the page out on a paper size and returns the
// PDF, and, for tests, a screenshot and the width the page takes. The page
// is handed to the browser as it is, so it must refer to nothing outside
// itself; no file is read or written here.
package browser

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"

	"forelay/scenario/report"
)

// EnvPath is the environment variable that names the browser's program,
// ahead of the places Find looks in.
const EnvPath = "FORELAY_CHROMIUM"

// ErrNoBrowser is returned by Find when no Chromium is found.
var ErrNoBrowser = errors.New("no Chromium found (looked at $" + EnvPath + ", /usr/bin/chromium and chromium, chromium-browser, google-chrome on the PATH); " +
	"install it (Debian, Ubuntu: apt-get install chromium) or set " + EnvPath + " to its program; the HTML report does not need it")

// programs are the names Find looks for on the PATH, in order.
var programs = []string{"chromium", "chromium-browser", "google-chrome", "google-chrome-stable"}

// Find returns the path of the Chromium to use: $FORELAY_CHROMIUM when it
// is set (an error when that is no program), else /usr/bin/chromium, else
// the first of the common names found on the PATH. It returns an error
// wrapping ErrNoBrowser when there is none.
func Find() (string, error) {
	if p := os.Getenv(EnvPath); p != "" {
		if isProgram(p) {
			return p, nil
		}
		return "", fmt.Errorf("$%s=%s: not a program: %w", EnvPath, p, ErrNoBrowser)
	}
	if isProgram("/usr/bin/chromium") {
		return "/usr/bin/chromium", nil
	}
	for _, name := range programs {
		if p, err := exec.LookPath(name); err == nil {
			return p, nil
		}
	}
	return "", ErrNoBrowser
}

// isProgram reports whether p is a regular file that may be run.
func isProgram(p string) bool {
	fi, err := os.Stat(p)
	return err == nil && fi.Mode().IsRegular() && fi.Mode()&0o111 != 0
}

// Timeout bounds one run of the browser: starting it, laying out the page
// and printing it.
const Timeout = 90 * time.Second

// A Result is what the browser made of a page.
type Result struct {
	// PDF is the page printed on the paper.
	PDF []byte
	// PNG is a screenshot of the first screen of the page, laid out at
	// the paper's width; nil unless asked for.
	PNG []byte
	// ScrollWidth is the width in CSS pixels that the page takes when laid
	// out in a window as wide as the paper (ViewportWidth); wider means
	// something overflows the page.
	ScrollWidth, ViewportWidth int
}

// Print starts the browser at exe, loads html in a window as wide as the
// paper, and prints it on paper (the page's own @page size and margins
// rule). With shot it also takes a screenshot. The browser runs without
// its sandbox when forelay runs as root, which the browser refuses
// otherwise.
func Print(ctx context.Context, exe string, html []byte, paper report.Paper, shot bool) (*Result, error) {
	ctx, cancel := context.WithTimeout(ctx, Timeout)
	defer cancel()
	w := paper.CSSPixels()
	opts := append(chromedp.DefaultExecAllocatorOptions[:], chromedp.ExecPath(exe), chromedp.WindowSize(w, 1123),
		chromedp.Flag("disable-gpu", true))
	if os.Geteuid() == 0 {
		opts = append(opts, chromedp.NoSandbox)
	}
	actx, acancel := chromedp.NewExecAllocator(ctx, opts...)
	defer acancel()
	// The browser's own log lines are dropped: every failure comes back
	// as an error, and standard error is forelay's.
	quiet := func(string, ...any) {}
	bctx, bcancel := chromedp.NewContext(actx, chromedp.WithLogf(quiet), chromedp.WithErrorf(quiet))
	defer bcancel()

	res := &Result{ViewportWidth: w}
	if _, err := chromedp.Run(bctx, chromedp.EmulateViewport(int64(w), 1123, chromedp.EmulatePortrait)); err != nil {
		return nil, fmt.Errorf("starting %s: %w", exe, err)
	}
	if err := load(bctx, html); err != nil {
		return nil, err
	}
	sw, err := chromedp.Run(bctx, chromedp.Evaluate[int]("document.documentElement.scrollWidth"))
	if err != nil {
		return nil, fmt.Errorf("measuring the page: %w", err)
	}
	res.ScrollWidth = sw
	if shot {
		if res.PNG, err = chromedp.Run(bctx, chromedp.CaptureScreenshot()); err != nil {
			return nil, fmt.Errorf("taking a screenshot: %w", err)
		}
	}
	pw, ph := paper.Inches()
	res.PDF, err = chromedp.Run(bctx, chromedp.PrintToPDF(chromedp.PDFPaper(chromedp.PaperSize{Width: pw, Height: ph}),
		chromedp.PDFPreferCSSPageSize(), chromedp.PDFPrintBackground()))
	if err != nil {
		return nil, fmt.Errorf("printing the page: %w", err)
	}
	return res, nil
}

// load opens a blank page and sets html as its document.
func load(ctx context.Context, html []byte) error {
	if _, err := chromedp.Run(ctx, chromedp.Navigate("about:blank")); err != nil {
		return fmt.Errorf("opening a page: %w", err)
	}
	tree, err := chromedp.Call(ctx, page.GetFrameTree, cdp.Empty{})
	if err != nil {
		return fmt.Errorf("opening a page: %w", err)
	}
	_, err = chromedp.Call(ctx, page.SetDocumentContent, page.SetDocumentContentParams{FrameID: tree.FrameTree.Frame.ID, HTML: string(html)})
	if err != nil {
		return fmt.Errorf("loading the report: %w", err)
	}
	return nil
}
