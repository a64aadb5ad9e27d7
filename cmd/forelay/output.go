package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"forelay/forecast"
	"io"
	"io/fs"
	"os"
	"path/filepath"

	"gonum.org/v1/plot"

	"forelay/plots"
	"forelay/scenario/report"
)

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

// commit writes every file into the directory, all or nothing. The files
// are first written into a staging directory beside it; only when all are
// written are they moved into place. When a move fails, the files already
// moved are put back as they were, so a failed run leaves the directory as
// it found it. It returns the paths written, in the order they were added.
func (o *outputSet) commit() ([]string, error) {
	parent := filepath.Dir(filepath.Clean(o.dir))
	if err := os.MkdirAll(parent, 0o755); err != nil {
		return nil, err
	}
	stage, err := os.MkdirTemp(parent, "."+filepath.Base(filepath.Clean(o.dir))+".stage-*")
	if err != nil {
		return nil, err
	}
	defer os.RemoveAll(stage)
	for _, n := range o.names {
		if err := os.WriteFile(filepath.Join(stage, n), o.data[n], 0o644); err != nil {
			return nil, fmt.Errorf("writing %s: %w", filepath.Join(o.dir, n), err)
		}
	}
	if err := o.checkTargets(); err != nil {
		return nil, err
	}
	if _, err := os.Stat(o.dir); errors.Is(err, fs.ErrNotExist) {
		// A new directory: the staged one becomes it in one rename.
		if err := os.Chmod(stage, 0o755); err != nil {
			return nil, err
		}
		if err := os.Rename(stage, o.dir); err != nil {
			return nil, fmt.Errorf("writing %s: %w", o.dir, err)
		}
		return o.paths(), nil
	}
	if err := o.swapIn(stage); err != nil {
		return nil, err
	}
	return o.paths(), nil
}

// checkTargets refuses, before anything moves, a target that is not a
// regular file or an output directory that is not a directory.
func (o *outputSet) checkTargets() error {
	if fi, err := os.Stat(o.dir); err == nil && !fi.IsDir() {
		return fmt.Errorf("--out %s: not a directory; name a directory (it is created when missing)", o.dir)
	}
	for _, n := range o.names {
		p := filepath.Join(o.dir, n)
		if fi, err := os.Lstat(p); err == nil && !fi.Mode().IsRegular() {
			return fmt.Errorf("writing %s: a %s is in the way; move it aside and run again (nothing was written)", p, kindOf(fi))
		}
	}
	return nil
}

func kindOf(fi fs.FileInfo) string {
	switch {
	case fi.IsDir():
		return "directory"
	case fi.Mode()&fs.ModeSymlink != 0:
		return "symbolic link"
	}
	return "special file"
}

// swapIn moves the staged files into the existing output directory. Each
// file it replaces is first moved into the staging directory, so that a
// failure part-way can put every earlier file back.
func (o *outputSet) swapIn(stage string) error {
	type moved struct{ target, backup string }
	var done []moved
	undo := func() {
		for i := len(done) - 1; i >= 0; i-- {
			m := done[i]
			os.Remove(m.target)
			if m.backup != "" {
				os.Rename(m.backup, m.target)
			}
		}
	}
	for _, n := range o.names {
		target := filepath.Join(o.dir, n)
		m := moved{target: target}
		if _, err := os.Lstat(target); err == nil {
			m.backup = filepath.Join(stage, ".old-"+n)
			if err := os.Rename(target, m.backup); err != nil {
				undo()
				return fmt.Errorf("writing %s: %w (nothing was written)", target, err)
			}
		}
		if err := os.Rename(filepath.Join(stage, n), target); err != nil {
			if m.backup != "" {
				os.Rename(m.backup, target)
			}
			undo()
			return fmt.Errorf("writing %s: %w (nothing was written)", target, err)
		}
		done = append(done, m)
	}
	return nil
}

// paths returns the output paths in the order they were added.
func (o *outputSet) paths() []string {
	out := make([]string, len(o.names))
	for i, n := range o.names {
		out[i] = filepath.Join(o.dir, n)
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
// decimals, "-" for NaN (see scenario.FormatNumber).
func fmtNum(v float64, decimals int) string { return forecast.FormatNumber(v, decimals) }

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

// warnings prints each warning of a run on ErrOut, one "warning:" line
// each. Under --strict it then returns an input error (exit code 2), so
// the caller stops before anything is written. Call it before finish.
func warnings(ios *IOStreams, shared *sharedFlags, list []string) error {
	for _, w := range list {
		fmt.Fprintf(ios.ErrOut, "warning: %s\n", w)
	}
	if len(list) > 0 && shared.strict() {
		n := "1 warning"
		if len(list) > 1 {
			n = fmt.Sprintf("%d warnings", len(list))
		}
		return &inputError{err: fmt.Errorf("%s and --strict is set: nothing was written; fix the input or run without --strict", n)}
	}
	return nil
}

// warningList returns list, or an empty list for nil, so that the
// "warnings" field of a JSON document is always a list.
func warningList(list []string) []string { return report.List(list) }

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

// emit ends a command run the same way for every command: the warnings
// first (under --strict they stop the run before anything is written),
// then, with --out, the CSV, the JSON document and the charts, written all
// together, then the JSON document or the text report on standard output.
func emit(ios *IOStreams, shared *sharedFlags, out string, asJSON, noChart bool, r *report.Report) error {
	if err := warnings(ios, shared, r.Warnings); err != nil {
		return err
	}
	js, err := r.JSON()
	if err != nil {
		return err
	}
	var set *outputSet
	if out != "" {
		set = newOutputSet(out)
		if r.CSV != nil {
			csv, err := r.CSVBytes()
			if err != nil {
				return err
			}
			set.add(r.Name+".csv", csv)
		}
		if !r.NoJSONFile {
			set.add(r.Name+".json", js)
		}
		if !noChart {
			for _, c := range r.Charts {
				if err := set.addChart(c.Name, c.Plot); err != nil {
					return err
				}
			}
		}
	}
	return finish(ios, set, js, asJSON, func(w io.Writer) { r.WriteText(w) })
}
