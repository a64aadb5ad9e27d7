package report

import (
	"fmt"
	"html"
	"html/template"
	"regexp"
	"strings"

	"forelay/plots"
)

// svgSize matches the fixed width and height of a drawn chart's svg
// element, which the page replaces by the width of the column.
var svgSize = regexp.MustCompile(`\s(width|height)="[^"]*"`)

// inlineSVG draws c as SVG for a page: without the XML prologue and
// comments, scaled to the width of its column, with role img, the caption
// as its title and aria-label, and id as the figure's anchor.
func inlineSVG(c Chart, id string) (htmlFigure, error) {
	p, err := c.Plot.Plot()
	if err != nil {
		return htmlFigure{}, err
	}
	svg, err := plots.Render(p, "svg", plots.DefaultWidth, plots.DefaultHeight)
	if err != nil {
		return htmlFigure{}, err
	}
	caption := c.Caption
	if caption == "" {
		caption = strings.TrimSpace(p.Title.Text)
	}
	if caption == "" {
		caption = "Chart " + c.Name
	}
	s := string(svg)
	start := strings.Index(s, "<svg")
	end := strings.Index(s[max(start, 0):], ">")
	if start < 0 || end < 0 {
		return htmlFigure{}, fmt.Errorf("no svg element in the drawing")
	}
	end += start
	open := svgSize.ReplaceAllString(s[start:end], "")
	alt := html.EscapeString(caption)
	var b strings.Builder
	fmt.Fprintf(&b, "%s role=\"img\" aria-label=\"%s\" aria-labelledby=\"%s-title\">\n", open, alt, id)
	fmt.Fprintf(&b, "<title id=\"%s-title\">%s</title>\n", id, alt)
	b.WriteString(strings.TrimSpace(stripComments(s[end+1:])))
	return htmlFigure{ID: id, Caption: caption, SVG: template.HTML(b.String())}, nil
}

// stripComments removes the XML comments of a drawing.
func stripComments(s string) string {
	for {
		i := strings.Index(s, "<!--")
		if i < 0 {
			return s
		}
		j := strings.Index(s[i:], "-->")
		if j < 0 {
			return s[:i]
		}
		s = s[:i] + s[i+j+3:]
	}
}
