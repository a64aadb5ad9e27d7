package main

import (
	"github.com/spf13/pflag"
)

// addXLSXFlag registers --xlsx on a command whose --out files are
// name.csv and the like.
func addXLSXFlag(fl *pflag.FlagSet, on *bool, name string) {
	fl.BoolVar(on, "xlsx", false, "with --out, also write "+name+".xlsx: every table of the run as a sheet of one workbook")
}

// checkXLSX refuses --xlsx without --out: the workbook is written beside
// the other output files, never to standard output.
func checkXLSX(on bool, out, name string) error {
	if on && out == "" {
		return flagErrorf("--xlsx writes DIR/%s.xlsx beside the other output files: add --out DIR", name)
	}
	return nil
}
