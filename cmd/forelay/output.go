package main

import (
	"fmt"

	"forelay/scenario/report"
)

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

// emit ends a command run the same way for every command: the warnings
// first (under --strict they stop the run before anything is written),
// then, with --out, the CSV, the JSON document, the workbook (with xlsx)
// and the charts, written all together, then the JSON document or the
// text report on standard output.
func emit(ios *IOStreams, shared *sharedFlags, out string, asJSON, noChart, xlsx bool, r *report.Report) error {
	if err := warnings(ios, shared, r.Warnings); err != nil {
		return err
	}
	js, err := r.JSON()
	if err != nil {
		return err
	}
	var set *report.Files
	if out != "" {
		set = report.NewFiles(out)
		defer set.Discard()
		if shared != nil && shared.ChartSize.W > 0 {
			if err := set.ChartSize(shared.ChartSize.W, shared.ChartSize.H); err != nil {
				return &flagError{err: fmt.Errorf("--chart-size: %w", err)}
			}
		}
		if r.CSV != nil {
			csv, err := r.CSVBytes()
			if err != nil {
				return err
			}
			set.Add(r.Name+".csv", csv)
		} else if r.CSVWrite != nil {
			set.AddFrom(r.Name+".csv", r.CSVWrite)
		}
		for _, more := range r.MoreCSV {
			csv, err := more.Table.CSVBytes()
			if err != nil {
				return err
			}
			set.Add(more.Name+".csv", csv)
		}
		if !r.NoJSONFile {
			set.Add(r.Name+".json", js)
		}
		if xlsx {
			book, err := r.XLSX()
			if err != nil {
				return err
			}
			set.Add(r.Name+".xlsx", book)
		}
		if !noChart {
			for _, c := range r.Charts {
				if err := set.AddChart(c.Name, c.Plot); err != nil {
					return err
				}
			}
		}
	}
	if set != nil {
		paths, err := set.Commit()
		if err != nil {
			return err
		}
		for _, p := range paths {
			if !shared.quiet() {
				fmt.Fprintf(ios.ErrOut, "wrote %s\n", p)
			}
		}
	}
	if asJSON {
		_, err := ios.Out.Write(js)
		return err
	}
	return r.WriteText(ios.Out)
}
