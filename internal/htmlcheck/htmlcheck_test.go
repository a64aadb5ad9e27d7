package htmlcheck

import (
	"strings"
	"testing"
)

// TestCheckFinds: each page breaks one rule, and Check names it; the good
// page breaks none.
func TestCheckFinds(t *testing.T) {
	const fig = `<figure id="f"><svg role="img" aria-label="a chart"><title>a chart</title></svg><figcaption>A chart.</figcaption></figure>`
	const table = `<table><thead><tr><th scope="col">a</th><th scope="col">b</th></tr></thead><tbody><tr><th scope="row">x</th><td>1</td></tr></tbody></table>`
	for _, tc := range []struct {
		name, body, want string
	}{
		{"good", `<a href="#f">to the chart</a>` + fig + table, ""},
		{"link", `<link rel="stylesheet" href="x.css">`, "refers outside the page"},
		{"script", `<script src="https://example.invalid/x.js"></script>`, "a <script> element"},
		{"image", `<img src="data:image/png;base64,AAAA">`, "refers outside the page"},
		{"http", `<a href="http://example.invalid/">out</a>`, "refers outside the page"},
		{"css url", `<style>body { background: url(x.png) }</style>`, "uses url("},
		{"import", `<style>@import "x.css";</style>`, "uses @import"},
		{"no svg", `<figure id="f"><figcaption>A chart.</figcaption></figure>`, "holds 0 svg and 1 figcaption"},
		{"no title", `<figure id="f"><svg role="img" aria-label="c"></svg><figcaption>c</figcaption></figure>`, "without a title"},
		{"no head", `<table><tbody><tr><th scope="row">x</th></tr></tbody></table>`, "a table without a head"},
		{"td head", `<table><thead><tr><td>a</td></tr></thead></table>`, "want th scope=col"},
		{"no row head", `<table><thead><tr><th scope="col">a</th></tr></thead><tbody><tr><td>1</td></tr></tbody></table>`, "no th scope=row heads"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sum, problems := Check([]byte("<!DOCTYPE html><html><head><title>t</title></head><body>" + tc.body + "</body></html>"))
			got := strings.Join(problems, "; ")
			if tc.want == "" {
				if got != "" {
					t.Errorf("problems %q in a good page", got)
				}
				if sum.Figures != 1 || sum.SVGs != 1 || sum.Tables != 1 {
					t.Errorf("counted %+v, want one figure, svg and table", sum)
				}
				return
			}
			if !strings.Contains(got, tc.want) {
				t.Errorf("problems %q, want one with %q", got, tc.want)
			}
		})
	}
}
