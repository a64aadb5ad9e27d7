package main

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"forelay/scenario/evaluate"
)

// report looks slices up by method, source, frequency and group.
type report struct {
	res   *evaluate.Results
	o     options
	by    map[[4]string]*evaluate.Slice
	srcs  []string            // sources in result order, SourceAll last
	freqs map[string][]string // frequencies per source, FreqAll last
}

func newReport(res *evaluate.Results, o options) *report {
	r := &report{res: res, o: o, by: map[[4]string]*evaluate.Slice{}, freqs: map[string][]string{}}
	for i := range res.Slices {
		s := &res.Slices[i]
		r.by[[4]string{s.Method, s.Source, s.Freq, ""}] = s
		if !slices.Contains(r.srcs, s.Source) {
			r.srcs = append(r.srcs, s.Source)
		}
		if !slices.Contains(r.freqs[s.Source], s.Freq) {
			r.freqs[s.Source] = append(r.freqs[s.Source], s.Freq)
		}
	}
	for i := range res.Groups {
		g := &res.Groups[i]
		r.by[[4]string{g.Method, g.Source, g.Freq, g.Group}] = g
	}
	return r
}

func (r *report) slice(method, source, freq string) *evaluate.Slice {
	return r.by[[4]string{method, source, freq, ""}]
}

// writeReport prints every table of the report.
func writeReport(w io.Writer, res *evaluate.Results, o options) error {
	r := newReport(res, o)
	var b bytes.Buffer
	r.header(&b)
	for _, src := range r.srcs {
		r.coverage(&b, src)
	}
	r.byLead(&b, "auto")
	r.mase(&b)
	r.service(&b)
	r.chosen(&b)
	r.groups(&b)
	r.failures(&b)
	_, err := w.Write(b.Bytes())
	return err
}

// section prints a title and a table, then a blank line.
func section(b *bytes.Buffer, title string, t *textTable) {
	fmt.Fprintf(b, "%s\n\n", title)
	t.write(b)
	b.WriteString("\n")
}

func (r *report) header(b *bytes.Buffer) {
	st := r.res.Settings
	fmt.Fprintln(b, "forelay out-of-sample evaluation")
	fmt.Fprintln(b)
	cov := make([]string, len(st.Coverages))
	for i, c := range st.Coverages {
		cov[i] = fmt.Sprintf("%g %%", 100*c)
	}
	leads := make([]string, len(st.Leads))
	for i, l := range st.Leads {
		leads[i] = fmt.Sprint(l)
	}
	fmt.Fprintf(b, "Bands %s at %s; origins every %s periods (H = 12 months, 8 quarters held out),\n",
		st.Bands, strings.Join(cov, " and "), st.Step)
	fmt.Fprintf(b, "at most %d per series, each with at least %d seasons of history; safety stock for\n",
		st.MaxOrigins, st.MinSeasons)
	fmt.Fprintf(b, "a %g %% cycle service level over lead times of %s periods. Synthetic seed %d, %d series\n",
		100*st.Service, strings.Join(leads, " and "), r.o.seed, r.o.reps)
	fmt.Fprintln(b, "per family and frequency.")
	fmt.Fprintln(b)
	t := &textTable{}
	t.add("source", "series", "monthly", "quarterly", "origins", "held-out values")
	for _, src := range r.srcs {
		if src == evaluate.SourceAll {
			continue
		}
		n, mon, qtr, org, vals := 0, 0, 0, 0, 0
		for _, c := range r.res.Cases {
			if c.Source != src {
				continue
			}
			n++
			switch c.Freq {
			case "month":
				mon++
			case "quarter":
				qtr++
			}
			org += len(c.Origins)
			vals += len(c.Origins) * c.Horizon
		}
		t.add(src, fmt.Sprint(n), fmt.Sprint(mon), fmt.Sprint(qtr), fmt.Sprint(org), fmt.Sprint(vals))
	}
	t.write(b)
	b.WriteString("\n")
}

// coverage prints the coverage table of one source.
func (r *report) coverage(b *bytes.Buffer, src string) {
	t := &textTable{}
	head := []string{"method", "origins", "failed"}
	freqs := r.freqs[src]
	for _, nb := range r.res.Settings.Coverages {
		for _, f := range freqs {
			head = append(head, fmt.Sprintf("%g%% %s", 100*nb, abbrev(f)))
		}
		head = append(head, "below/above")
	}
	t.add(head...)
	for _, m := range r.res.Settings.Methods {
		all := r.slice(m, src, evaluate.FreqAll)
		row := []string{m, fmt.Sprint(all.Origins), fmt.Sprint(all.Failed)}
		for i := range r.res.Settings.Coverages {
			for _, f := range freqs {
				bd := r.slice(m, src, f).Bands[i]
				row = append(row, pct(bd.Share, bd.N))
			}
			bd := all.Bands[i]
			row = append(row, pct(ratio(bd.Below, bd.N), bd.N)+"/"+pct(ratio(bd.Above, bd.N), bd.N))
		}
		t.add(row...)
	}
	section(b, fmt.Sprintf("Band coverage, %s data: held-out values inside the band, %% (below/above: outside it, %%, all frequencies)", src), t)
}

func abbrev(freq string) string {
	switch freq {
	case "month":
		return "mon"
	case "quarter":
		return "qtr"
	}
	return freq
}

func ratio(x, n int) float64 {
	if n == 0 {
		return 0
	}
	return float64(x) / float64(n)
}

// byLead prints the coverage of one method per lead time, per source and
// frequency.
func (r *report) byLead(b *bytes.Buffer, method string) {
	var cols []*evaluate.Slice
	head := []string{"lead"}
	maxH := 0
	for _, src := range r.srcs {
		if src == evaluate.SourceAll {
			continue
		}
		for _, f := range r.freqs[src] {
			if f == evaluate.FreqAll {
				continue
			}
			s := r.slice(method, src, f)
			cols = append(cols, s)
			for _, nb := range r.res.Settings.Coverages {
				head = append(head, fmt.Sprintf("%s %s %g%%", src, abbrev(f), 100*nb))
			}
			for _, l := range s.Bands[0].ByLead {
				if l.N > 0 {
					maxH = max(maxH, l.Lead)
				}
			}
		}
	}
	t := &textTable{}
	t.add(head...)
	for k := range maxH {
		row := []string{fmt.Sprint(k + 1)}
		for _, s := range cols {
			for _, bd := range s.Bands {
				l := bd.ByLead[k]
				row = append(row, pct(l.Share, l.N))
			}
		}
		t.add(row...)
	}
	section(b, fmt.Sprintf("Band coverage of %s by lead time, %%", method), t)
}

// mase prints mean MASE per method, source and frequency, then the
// comparison of auto with seasonal-naive and the best single method.
func (r *report) mase(b *bytes.Buffer) {
	t := &textTable{}
	head := []string{"method"}
	type col struct{ src, freq string }
	var cols []col
	for _, src := range r.srcs {
		for _, f := range r.freqs[src] {
			cols = append(cols, col{src, f})
			head = append(head, src+" "+abbrev(f))
		}
	}
	t.add(head...)
	for _, m := range r.res.Settings.Methods {
		row := []string{m}
		for _, c := range cols {
			s := r.slice(m, c.src, c.freq)
			cell := num3(s.MASE, s.MASEOrigins)
			if s.Failed > 0 && s.MASEOrigins > 0 {
				cell = "*" + cell
			}
			row = append(row, cell)
		}
		t.add(row...)
	}
	section(b, "Mean MASE of the H-step forecasts over origins (* the method could not be fitted at some origins)", t)

	t = &textTable{}
	t.add("source", "freq", "origins", "auto", "seasonal-naive", "best single method", "its MASE", "auto/snaive", "auto/best")
	for _, a := range r.res.Accuracy {
		best, rel := "-", "-"
		if a.Candidates > 0 {
			best = a.Best
			rel = fmt.Sprintf("%.3f", a.Auto/a.BestMASE)
		}
		t.add(a.Source, a.Freq, fmt.Sprint(a.Origins), fmt.Sprintf("%.3f", a.Auto), fmt.Sprintf("%.3f", a.SeasonalNaive),
			best, num3(a.BestMASE, a.Candidates), fmt.Sprintf("%.3f", a.Auto/a.SeasonalNaive), rel)
	}
	section(b, "Mean MASE: auto against seasonal-naive and the best single method (lowest mean MASE among the methods fitted at every origin)", t)
}

// service prints the realised service of the safety stock.
func (r *report) service(b *bytes.Buffer) {
	t := &textTable{}
	head := []string{"method"}
	for _, src := range r.srcs {
		for _, l := range r.res.Settings.Leads {
			head = append(head, fmt.Sprintf("%s L=%d", src, l))
		}
	}
	t.add(head...)
	for _, m := range r.res.Settings.Methods {
		row := []string{m}
		for _, src := range r.srcs {
			for _, sv := range r.slice(m, src, evaluate.FreqAll).Service {
				row = append(row, pct(sv.Share, sv.N))
			}
		}
		t.add(row...)
	}
	section(b, fmt.Sprintf("Realised service of a %g %% safety stock: origins whose demand over the first L held-out periods was covered, %%",
		100*r.res.Settings.Service), t)
}

// chosen prints how often auto chose each method.
func (r *report) chosen(b *bytes.Buffer) {
	var cols []*evaluate.Slice
	head := []string{"method"}
	for _, src := range r.srcs {
		for _, f := range r.freqs[src] {
			if f == evaluate.FreqAll && src != evaluate.SourceAll {
				continue
			}
			head = append(head, src+" "+abbrev(f))
			cols = append(cols, r.slice("auto", src, f))
		}
	}
	t := &textTable{}
	t.add(head...)
	for _, m := range r.res.Settings.Methods {
		row, any := []string{m}, false
		for _, s := range cols {
			n := 0
			for _, c := range s.Chosen {
				if c.Method == m {
					n = c.Count
				}
			}
			any = any || n > 0
			row = append(row, fmt.Sprint(n))
		}
		if any {
			t.add(row...)
		}
	}
	section(b, "Methods auto chose (origins)", t)
}

// groups prints auto against seasonal-naive and the best method per open
// series and synthetic family.
func (r *report) groups(b *bytes.Buffer) {
	t := &textTable{}
	cov := r.res.Settings.Coverages
	head := []string{"series or family", "source", "freq", "origins"}
	for _, nb := range cov {
		head = append(head, fmt.Sprintf("auto %g%%", 100*nb))
	}
	head = append(head, "auto MASE", "snaive MASE", "best method", "its MASE")
	t.add(head...)
	for _, auto := range r.res.Groups {
		if auto.Method != "auto" {
			continue
		}
		key := func(m string) *evaluate.Slice { return r.by[[4]string{m, auto.Source, auto.Freq, auto.Group}] }
		sn := key("seasonal-naive")
		best, bestMASE := "-", math.Inf(1)
		for _, m := range r.res.Settings.Methods {
			g := key(m)
			if m == "auto" || g.Failed > 0 || g.Origins == 0 || g.MASEOrigins != g.Origins {
				continue
			}
			if g.MASE < bestMASE {
				best, bestMASE = m, g.MASE
			}
		}
		row := []string{auto.Group, auto.Source, auto.Freq, fmt.Sprint(auto.Origins + auto.Failed)}
		for _, bd := range auto.Bands {
			row = append(row, pct(bd.Share, bd.N))
		}
		bm := "-"
		if best != "-" {
			bm = fmt.Sprintf("%.3f", bestMASE)
		}
		row = append(row, num3(auto.MASE, auto.MASEOrigins), num3(sn.MASE, sn.MASEOrigins), best, bm)
		t.add(row...)
	}
	section(b, "Per open series and synthetic family: auto's coverage and MASE, seasonal-naive and the best method there", t)
}

// failures prints, per method, how many fits failed and one reason.
func (r *report) failures(b *bytes.Buffer) {
	t := &textTable{}
	t.add("method", "series", "origins", "first error")
	for _, m := range r.res.Settings.Methods {
		series, origins, first := 0, 0, ""
		for _, f := range r.res.Failures {
			if f.Method != m {
				continue
			}
			if first == "" {
				first = f.Error
			}
			series++
			origins += f.Origins
		}
		if series > 0 {
			t.add(m, fmt.Sprint(series), fmt.Sprint(origins), first)
		}
	}
	if len(t.rows) == 1 {
		b.WriteString("Every method was fitted at every origin.\n")
		return
	}
	section(b, "Fits that failed", t)
}
