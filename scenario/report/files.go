package report

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"

	"forelay/plots"

	"gonum.org/v1/plot/vg"
)

// Files writes a run's output files as they are produced into a staging
// directory beside the output directory, and moves them all into place at
// the end (Commit), so a run that fails part-way writes nothing: the bytes
// of a file are not kept once it is written. A run that does not commit
// must Discard the set.
type Files struct {
	dir   string
	names []string
	seen  map[string]bool
	// stage is the staging directory, made at the first Add; err is the
	// first failure to write into it, returned by Commit.
	stage string
	err   error
	// width and height are the size charts are drawn at (zero: the
	// plots package's default).
	width, height vg.Length
}

// ChartSize sets the size AddChart draws charts at, in inches; it
// returns an error when a side is not finite or not within MinChartSide
// and MaxChartSide.
func (o *Files) ChartSize(width, height float64) error {
	for _, v := range []float64{width, height} {
		if math.IsNaN(v) || v < MinChartSide || v > MaxChartSide {
			return fmt.Errorf("chart size %gx%g inches: each side must be between %g and %g inches", width, height, float64(MinChartSide), float64(MaxChartSide))
		}
	}
	o.width, o.height = vg.Length(width)*vg.Inch, vg.Length(height)*vg.Inch
	return nil
}

// The least and the most a chart's side may be, in inches: below 3 inches
// the period labels and the key no longer fit; 40 is plots.MaxSide.
const (
	MinChartSide = 3
	MaxChartSide = 40
)

// NewFiles returns an empty set of files to write into dir. Nothing is
// made on disk until the first Add.
func NewFiles(dir string) *Files {
	return &Files{dir: dir, seen: map[string]bool{}}
}

// Add writes a file into the staging directory (made beside dir at the
// first Add); a second file of the same name replaces the first. A failure
// to write is kept and returned by Commit, and the files after it are not
// written.
func (o *Files) Add(name string, data []byte) {
	if o.err != nil {
		return
	}
	if o.err = o.makeStage(); o.err != nil {
		return
	}
	if err := os.WriteFile(filepath.Join(o.stage, name), data, 0o644); err != nil {
		o.err = fmt.Errorf("writing %s: %w", filepath.Join(o.dir, name), err)
		return
	}
	if !o.seen[name] {
		o.seen[name] = true
		o.names = append(o.names, name)
	}
}

// AddFrom writes a file into the staging directory as Add does, its
// bytes written by write through a buffer, so that a large file is never
// held in memory whole. An error of write is kept and returned by Commit,
// as a failure to write is.
func (o *Files) AddFrom(name string, write func(w io.Writer) error) {
	if o.err != nil {
		return
	}
	if o.err = o.makeStage(); o.err != nil {
		return
	}
	fh, err := os.Create(filepath.Join(o.stage, name))
	if err != nil {
		o.err = fmt.Errorf("writing %s: %w", filepath.Join(o.dir, name), err)
		return
	}
	bw := bufio.NewWriterSize(fh, 1<<16)
	err = write(bw)
	if err == nil {
		err = bw.Flush()
	}
	if cerr := fh.Close(); err == nil && cerr != nil {
		err = fmt.Errorf("writing %s: %w", filepath.Join(o.dir, name), cerr)
	}
	if err != nil {
		o.err = err
		return
	}
	if !o.seen[name] {
		o.seen[name] = true
		o.names = append(o.names, name)
	}
}

// makeStage makes the staging directory, beside the output directory,
// unless it is made already.
func (o *Files) makeStage() error {
	if o.stage != "" {
		return nil
	}
	parent := filepath.Dir(filepath.Clean(o.dir))
	if err := os.MkdirAll(parent, 0o755); err != nil {
		return err
	}
	stage, err := os.MkdirTemp(parent, "."+filepath.Base(filepath.Clean(o.dir))+".stage-*")
	if err != nil {
		return err
	}
	o.stage = stage
	return nil
}

// Discard removes the staging directory and what was written into it; the
// output directory is left as it was. It does nothing after Commit, and
// may be deferred.
func (o *Files) Discard() {
	if o.stage != "" {
		os.RemoveAll(o.stage)
		o.stage = ""
	}
}

// Commit moves every file written into place, all or nothing: only when
// all were written are they moved. When a move fails, the files already
// moved are put back as they were, so a failed run leaves the directory as
// it found it. It returns the paths written, in the order they were added,
// or the first failure of Add.
func (o *Files) Commit() ([]string, error) {
	defer o.Discard()
	if o.err != nil {
		return nil, o.err
	}
	if err := o.makeStage(); err != nil {
		return nil, err
	}
	stage := o.stage
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
func (o *Files) checkTargets() error {
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
func (o *Files) swapIn(stage string) error {
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
func (o *Files) paths() []string {
	out := make([]string, len(o.names))
	for i, n := range o.names {
		out[i] = filepath.Join(o.dir, n)
	}
	return out
}

// renderBoth draws c as PNG and SVG, width by height (zero: the default
// size).
func renderBoth(c Plotter, width, height vg.Length) (png, svg []byte, err error) {
	if width == 0 || height == 0 {
		width, height = plots.DefaultWidth, plots.DefaultHeight
	}
	p, err := c.Plot()
	if err != nil {
		return nil, nil, err
	}
	if png, err = plots.Render(p, "png", width, height); err != nil {
		return nil, nil, err
	}
	if svg, err = plots.Render(p, "svg", width, height); err != nil {
		return nil, nil, err
	}
	return png, svg, nil
}

// AddChart renders c and adds base.png and base.svg to the set.
func (o *Files) AddChart(base string, c Plotter) error {
	png, svg, err := renderBoth(c, o.width, o.height)
	if err != nil {
		return err
	}
	o.Add(base+".png", png)
	o.Add(base+".svg", svg)
	return nil
}
