package main

import (
	"github.com/spf13/pflag"

	"forelay/scenario/data"
)

// formatFlags are --sheet and --decimal, on the commands that read a
// history or actuals file themselves (fit, track).
type formatFlags struct {
	// Sheet names the sheet of a workbook; empty reads the first one.
	Sheet string
	// Decimal is "point", "comma", or empty for the default.
	Decimal string
}

// register adds the flags; what names the file they apply to.
func (ff *formatFlags) register(fl *pflag.FlagSet, what string) {
	fl.StringVar(&ff.Sheet, "sheet", "", "sheet to read when the "+what+" is a workbook (.xlsx) (default: the first)")
	fl.StringVar(&ff.Decimal, "decimal", "", "decimal mark of a CSV "+what+": point or comma (comma needs cells separated by semicolons or tabs)")
}

// check reports a --decimal that is neither point nor comma.
func (ff *formatFlags) check() error {
	if _, err := data.ParseDecimalMark(ff.Decimal); err != nil {
		return flagErrorf("--decimal: %v", err)
	}
	return nil
}

// format returns the reading format the flags ask for; without --decimal
// the decimal mark is dec (the scenario file's history.decimal, say).
func (ff *formatFlags) format(dec data.Decimal) data.Format {
	if ff.Decimal != "" {
		dec, _ = data.ParseDecimalMark(ff.Decimal) // checked by check
	}
	return data.Format{Sheet: ff.Sheet, Decimal: dec}
}
