package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// countValue is the pflag.Value of a whole-number flag that also takes the
// scientific notation people type for large counts (1e6).
type countValue struct{ n *int }

func newCountValue(p *int, def int) *countValue {
	*p = def
	return &countValue{n: p}
}

func (c *countValue) Type() string   { return "N" }
func (c *countValue) String() string { return strconv.Itoa(*c.n) }

// Set accepts a whole number written plainly (20000) or in scientific
// notation (2e4). Numbers beyond what an int holds are clamped, so the
// limit check can name them.
func (c *countValue) Set(s string) error {
	if n, err := strconv.Atoi(s); err == nil {
		*c.n = n
		return nil
	}
	f, err := strconv.ParseFloat(s, 64)
	if err != nil || strings.ContainsAny(s, "_xXpP") || f != math.Trunc(f) || math.IsNaN(f) {
		return fmt.Errorf("%q is not a whole number (write 20000 or 2e4)", s)
	}
	*c.n = int(math.Max(math.Min(f, math.MaxInt32), math.MinInt32))
	return nil
}

// givenInt is the pflag.Value of a whole-number flag whose default means
// "decide for me": it records whether the flag was given at all.
type givenInt struct {
	n     *int
	given *bool
}

func (g *givenInt) Type() string { return "N" }

func (g *givenInt) String() string {
	if g.n == nil || !*g.given {
		return ""
	}
	return strconv.Itoa(*g.n)
}

func (g *givenInt) Set(s string) error {
	n, err := strconv.Atoi(s)
	if err != nil {
		return fmt.Errorf("%q is not a whole number", s)
	}
	*g.n, *g.given = n, true
	return nil
}
