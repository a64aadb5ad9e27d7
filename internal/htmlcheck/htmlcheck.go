// Package htmlcheck parses a page that report.Book.HTML wrote and checks,
// for tests, that it stands alone and is accessible: nothing it refers to
// lies outside it, every chart is one inline svg with a title inside a
// figure with a caption, and every table has a header row.
package htmlcheck

import (
	"bytes"
	"fmt"
	"strings"

	"golang.org/x/net/html"
)

// A Summary counts what a page holds.
type Summary struct {
	// Figures, SVGs and Tables count those elements; Sections maps the
	// id of each section element to true.
	Figures, SVGs, Tables int
	Sections              map[string]bool
}

// Check parses page and returns what it holds, with one problem per
// sentence for everything that breaks the rules: a src or href that is
// not a fragment (#id), an element that loads or embeds anything (link,
// script, img, iframe, object, embed, base), a style that imports or
// loads a URL, a figure without exactly one svg and
// a figcaption, an svg without a title and aria-label, a table without a
// head row of th scope="col" cells, and a body row without a th
// scope="row".
func Check(page []byte) (Summary, []string) {
	s := Summary{Sections: map[string]bool{}}
	doc, err := html.Parse(bytes.NewReader(page))
	if err != nil {
		return s, []string{fmt.Sprintf("page does not parse: %v", err)}
	}
	var problems []string
	bad := func(format string, args ...any) { problems = append(problems, fmt.Sprintf(format, args...)) }
	var walk func(n *html.Node)
	walk = func(n *html.Node) {
		if n.Type == html.ElementNode {
			checkElement(n, &s, bad)
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c)
		}
	}
	walk(doc)
	return s, problems
}

// checkElement checks one element and counts it.
func checkElement(n *html.Node, s *Summary, bad func(string, ...any)) {
	for _, a := range n.Attr {
		switch strings.ToLower(a.Key) {
		case "src", "href", "xlink:href", "action", "poster", "srcset":
			if !strings.HasPrefix(a.Val, "#") {
				bad("<%s %s=%q> refers outside the page", n.Data, a.Key, a.Val)
			}
		case "style":
			checkCSS(n.Data+" style", a.Val, bad)
		}
		if a.Namespace == "xlink" && a.Key == "href" && !strings.HasPrefix(a.Val, "#") {
			bad("<%s xlink:href=%q> refers outside the page", n.Data, a.Val)
		}
	}
	switch n.Data {
	case "link", "script", "iframe", "object", "embed", "img", "base":
		bad("a <%s> element: the page must hold everything itself", n.Data)
	case "style":
		checkCSS("style element", text(n), bad)
	case "section":
		s.Sections[attr(n, "id")] = true
	case "figure":
		s.Figures++
		checkFigure(n, bad)
	case "svg":
		s.SVGs++
		checkSVG(n, bad)
	case "table":
		s.Tables++
		checkTable(n, bad)
	}
}

// checkCSS reports a style that loads anything.
func checkCSS(where, css string, bad func(string, ...any)) {
	low := strings.ToLower(css)
	for _, w := range []string{"@import", "url(", "@font-face"} {
		if strings.Contains(low, w) {
			bad("%s uses %s", where, w)
		}
	}
}

func checkFigure(n *html.Node, bad func(string, ...any)) {
	svgs, caps := 0, 0
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		if c.Type != html.ElementNode {
			continue
		}
		switch c.Data {
		case "svg":
			svgs++
		case "figcaption":
			caps++
			if strings.TrimSpace(text(c)) == "" {
				bad("figure %q has an empty caption", attr(n, "id"))
			}
		}
	}
	if svgs != 1 || caps != 1 {
		bad("figure %q holds %d svg and %d figcaption elements, want one of each", attr(n, "id"), svgs, caps)
	}
}

func checkSVG(n *html.Node, bad func(string, ...any)) {
	if attr(n, "role") != "img" || strings.TrimSpace(attr(n, "aria-label")) == "" {
		bad("svg without role=img and an aria-label")
	}
	title := false
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		if c.Type == html.ElementNode && c.Data == "title" && strings.TrimSpace(text(c)) != "" {
			title = true
		}
	}
	if !title {
		bad("svg %q without a title", attr(n, "aria-label"))
	}
	if n.Parent == nil || n.Parent.Data != "figure" {
		bad("svg %q outside a figure", attr(n, "aria-label"))
	}
}

func checkTable(n *html.Node, bad func(string, ...any)) {
	var head, body *html.Node
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		switch c.Data {
		case "thead":
			head = c
		case "tbody":
			body = c
		}
	}
	if head == nil {
		bad("a table without a head")
		return
	}
	rows := children(head, "tr")
	if len(rows) != 1 {
		bad("a table head with %d rows, want 1", len(rows))
		return
	}
	for _, c := range elements(rows[0]) {
		if c.Data != "th" || attr(c, "scope") != "col" {
			bad("a head cell <%s scope=%q> %q, want th scope=col", c.Data, attr(c, "scope"), text(c))
		}
	}
	if body == nil {
		return
	}
	for _, r := range children(body, "tr") {
		cells := elements(r)
		if len(cells) == 0 || cells[0].Data != "th" || attr(cells[0], "scope") != "row" {
			bad("a table row that no th scope=row heads")
		}
	}
}

// attr returns the attribute key of n, or "".
func attr(n *html.Node, key string) string {
	for _, a := range n.Attr {
		if a.Key == key {
			return a.Val
		}
	}
	return ""
}

// text returns the text inside n.
func text(n *html.Node) string {
	var b strings.Builder
	var walk func(*html.Node)
	walk = func(n *html.Node) {
		if n.Type == html.TextNode {
			b.WriteString(n.Data)
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c)
		}
	}
	walk(n)
	return b.String()
}

// elements returns the element children of n.
func elements(n *html.Node) []*html.Node {
	var out []*html.Node
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		if c.Type == html.ElementNode {
			out = append(out, c)
		}
	}
	return out
}

// children returns the element children of n called name.
func children(n *html.Node, name string) []*html.Node {
	var out []*html.Node
	for _, c := range elements(n) {
		if c.Data == name {
			out = append(out, c)
		}
	}
	return out
}
