package scenario

import (
	"os"
	"path/filepath"
	"testing"

	"forelay/forecast"
)

// FuzzEventsFile checks that no events table makes the decoder panic, and
// that the events of a table it accepts lay on a baseline without
// panicking. Each input is written as deals.csv beside a scenario file
// that names it.
func FuzzEventsFile(f *testing.F) {
	starter, err := os.ReadFile(filepath.Join("..", "cmd", "forelay", "starter", "deals.csv"))
	if err != nil {
		f.Fatal(err)
	}
	f.Add(string(starter))
	f.Add("id,kind,start,series,units\nd,step,2027-03,a,5\nd,,,b,7\n")
	f.Add("id;kind;start;series;percent;probability\nd;pulse;2027-08;a;12,5%;70%\n")
	f.Add("ID,Kind,Start,Series,Units,Low,High\nx,step,2027-05,a,-100,-150,-50\n")
	f.Add("id,kind\n")
	f.Add("\ufeffid,kind,start,series,units,ramp periods,ramp shape\ns,step,2027-01,a,10,3,s-curve\n")
	dir := f.TempDir()
	plan := filepath.Join(dir, "plan.yaml")
	body := "plan: p\nhistory: {file: h.csv, series: a}\nhorizon: 12\nevents-file: deals.csv\n"
	if err := os.WriteFile(plan, []byte(body), 0o644); err != nil {
		f.Fatal(err)
	}
	f.Fuzz(func(t *testing.T, table string) {
		if err := os.WriteFile(filepath.Join(dir, "deals.csv"), []byte(table), 0o644); err != nil {
			t.Fatal(err)
		}
		file, err := Load(plan)
		if err != nil {
			return
		}
		next := period("2027-01", forecast.Monthly)
		if file.Resolve(next) != nil {
			return
		}
		for _, e := range file.Events {
			e.Contribution(next, make([]float64, 12))
			e.Sigma(next, make([]float64, 12))
		}
	})
}
