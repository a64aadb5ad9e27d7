package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/plot"

	"forelay/plots"
)

// writeFileAtomic writes data to path through a temporary file in the same
// directory and a rename, so a reader never sees a half-written file and a
// failed run leaves any earlier file in place.
func writeFileAtomic(path string, data []byte) error {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return err
	}
	name := tmp.Name()
	if _, err := tmp.Write(data); err != nil {
		tmp.Close()
		os.Remove(name)
		return err
	}
	if err := tmp.Close(); err != nil {
		os.Remove(name)
		return err
	}
	if err := os.Chmod(name, 0o644); err != nil {
		os.Remove(name)
		return err
	}
	if err := os.Rename(name, path); err != nil {
		os.Remove(name)
		return err
	}
	return nil
}

// outputSet collects a run's output files in memory and writes them all at
// the end, each atomically, so a run that fails part-way writes nothing.
type outputSet struct {
	dir   string
	names []string
	data  map[string][]byte
}

func newOutputSet(dir string) *outputSet {
	return &outputSet{dir: dir, data: map[string][]byte{}}
}

func (o *outputSet) add(name string, data []byte) {
	if _, ok := o.data[name]; !ok {
		o.names = append(o.names, name)
	}
	o.data[name] = data
}

// commit creates the directory and writes every file; it returns the
// paths written, in the order they were added.
func (o *outputSet) commit() ([]string, error) {
	if err := os.MkdirAll(o.dir, 0o755); err != nil {
		return nil, err
	}
	var paths []string
	for _, n := range o.names {
		p := filepath.Join(o.dir, n)
		if err := writeFileAtomic(p, o.data[n]); err != nil {
			return paths, fmt.Errorf("writing %s: %w", p, err)
		}
		paths = append(paths, p)
	}
	return paths, nil
}

// num is a float64 that marshals NaN and infinities as JSON null and
// rounds to 10 significant digits, so JSON output is stable across
// platforms and never fails on a missing value.
type num float64

func (n num) MarshalJSON() ([]byte, error) {
	f := float64(n)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return []byte("null"), nil
	}
	return []byte(strconv.FormatFloat(f, 'g', 10, 64)), nil
}

func nums(v []float64) []num {
	out := make([]num, len(v))
	for i, x := range v {
		out[i] = num(x)
	}
	return out
}

// marshalLine encodes v as one line of JSON.
func marshalLine(v any) ([]byte, error) {
	b, err := json.Marshal(v)
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// fmtNum formats a value for tables: thousands separators, the given
// decimals, "-" for NaN.
func fmtNum(v float64, decimals int) string {
	if math.IsNaN(v) {
		return "-"
	}
	if math.IsInf(v, 0) {
		if v > 0 {
			return "inf"
		}
		return "-inf"
	}
	s := strconv.FormatFloat(math.Abs(v), 'f', decimals, 64)
	intPart, frac := s, ""
	if i := strings.IndexByte(s, '.'); i >= 0 {
		intPart, frac = s[:i], s[i:]
	}
	var b strings.Builder
	if v < 0 && strings.Trim(s, "0.") != "" {
		b.WriteByte('-')
	}
	for i, c := range intPart {
		if i > 0 && (len(intPart)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(c)
	}
	return b.String() + frac
}

// fmtParam formats a smoothing parameter, "-" when it does not apply.
func fmtParam(v float64) string {
	if math.IsNaN(v) {
		return "-"
	}
	return strconv.FormatFloat(v, 'f', 4, 64)
}

// chart is anything that builds a gonum plot: the chart types of package
// plots.
type chart interface{ Plot() (*plot.Plot, error) }

// renderBoth draws c as PNG and SVG at the default size.
func renderBoth(c chart) (png, svg []byte, err error) {
	p, err := c.Plot()
	if err != nil {
		return nil, nil, err
	}
	if png, err = plots.Render(p, "png", plots.DefaultWidth, plots.DefaultHeight); err != nil {
		return nil, nil, err
	}
	if svg, err = plots.Render(p, "svg", plots.DefaultWidth, plots.DefaultHeight); err != nil {
		return nil, nil, err
	}
	return png, svg, nil
}

// addChart renders c and adds base.png and base.svg to the set.
func (o *outputSet) addChart(base string, c chart) error {
	png, svg, err := renderBoth(c)
	if err != nil {
		return err
	}
	o.add(base+".png", png)
	o.add(base+".svg", svg)
	return nil
}

// finish ends a command run: it writes the output set (nil when no --out
// was given) and lists the files on ErrOut, then prints the JSON document
// or the text report on Out.
func finish(ios *IOStreams, set *outputSet, js []byte, asJSON bool, text func(io.Writer)) error {
	if set != nil {
		paths, err := set.commit()
		if err != nil {
			return err
		}
		for _, p := range paths {
			fmt.Fprintf(ios.ErrOut, "wrote %s\n", p)
		}
	}
	if asJSON {
		_, err := ios.Out.Write(js)
		return err
	}
	var b bytes.Buffer
	text(&b)
	_, err := ios.Out.Write(b.Bytes())
	return err
}
