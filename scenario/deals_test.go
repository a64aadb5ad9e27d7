package scenario

import (
	"errors"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"forelay/scenario/data"
)

// dealsYAML holds, as YAML events, what dealsCSV holds as a table.
const dealsYAML = `
  - id: school-milk-contract
    kind: step
    start: 2027-02
    effect: {units: 38000, split: baseline}
    ramp: {periods: 3, shape: linear}
    probability: 0.7
    range: {low: 28000, high: 45000}
    scope:
      - {series: "milk/whole-1l/*"}
      - {series: "milk/choc-250ml/schools", new: true, effect: {units: 2000}}
    owner: institutional sales
    note: district schools tender
  - id: grocer-exit
    kind: step
    start: 2027-05
    end: 2028-04
    effect: {percent: -100}
    probability: 0.5
    scope:
      - {series: "*/*/grocer-north"}
    owner: key accounts
  - id: fair-week
    kind: pulse
    start: 2027-08
    periods: 2
    effect: {percent: 12.5}
    scope:
      - {series: "milk/**"}
      - {series: "cream/pot-200ml/grocer-north", effect: {percent: 4}}
`

const dealsCSV = `ID,Kind,Start,End,Periods,Series,New,Units,Percent,Split,Ramp periods,Ramp shape,Probability,Low,High,Owner,Note
school-milk-contract,step,2027-02,,,milk/whole-1l/*,,38000,,baseline,3,linear,0.7,28000,45000,institutional sales,district schools tender
school-milk-contract,,,,,milk/choc-250ml/schools,yes,2000,,,,,,,,,
grocer-exit,step,2027-05,2028-04,,*/*/grocer-north,,,-100,,,,0.5,,,key accounts,
fair-week,pulse,2027-08,,2,milk/**,,,12.5,,,,,,,,
fair-week,pulse,2027-08,,,cream/pot-200ml/grocer-north,,,4,,,,,,,,
`

// scenarioHead starts every scenario file of these tests.
const scenarioHead = "plan: p\nhistory: {file: h.csv, series: 'milk/**'}\nhorizon: 12\n"

// loadIn writes files into a new directory and loads plan.yaml from it.
func loadIn(t *testing.T, files map[string][]byte) (*File, error) {
	t.Helper()
	dir := t.TempDir()
	for name, b := range files {
		if err := os.WriteFile(filepath.Join(dir, name), b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return Load(filepath.Join(dir, "plan.yaml"))
}

// dealsWorkbook writes the rows of a CSV text into a workbook, numbers as
// numbers, in a sheet called deals.
func dealsWorkbook(t *testing.T, csvText string) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	if err := f.SetSheetName("Sheet1", "deals"); err != nil {
		t.Fatal(err)
	}
	for r, line := range strings.Split(strings.TrimSpace(csvText), "\n") {
		for c, text := range strings.Split(line, ",") {
			var v any = text
			if x, err := data.ParseDecimal(text); err == nil {
				v = x
			}
			if text == "" {
				continue
			}
			if err := f.SetCellValue("deals", data.CellName(c+1, r+1), v); err != nil {
				t.Fatal(err)
			}
		}
	}
	b, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// comparable clears what tells where an event was read from.
func comparable(events []*Event) []Event {
	out := make([]Event, len(events))
	for i, e := range events {
		c := *e
		c.Pos, c.Start.Pos, c.End.Pos = Pos{}, Pos{}, Pos{}
		c.Scope = append([]ScopeEntry(nil), e.Scope...)
		for k := range c.Scope {
			c.Scope[k].Pos = Pos{}
		}
		out[i] = c
	}
	return out
}

func TestEventsFileSameAsYAML(t *testing.T) {
	want, err := loadIn(t, map[string][]byte{"plan.yaml": []byte(scenarioHead + "events:" + dealsYAML)})
	if err != nil {
		t.Fatal(err)
	}
	semicolons := strings.NewReplacer(",", ";", ".", ",").Replace(dealsCSV)
	for _, tc := range []struct {
		name  string
		file  []byte
		comma bool
	}{
		{"deals.csv", []byte(dealsCSV), false},
		{"deals.xlsx", dealsWorkbook(t, dealsCSV), false},
		// Semicolons and decimal commas, as a spreadsheet in such a
		// language saves the table.
		{"deals.csv", []byte(semicolons), true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			head := scenarioHead
			if tc.comma {
				head += "events-file: {file: " + tc.name + ", decimal: comma}\n"
			} else {
				head += "events-file: " + tc.name + "\n"
			}
			got, err := loadIn(t, map[string][]byte{"plan.yaml": []byte(head), tc.name: tc.file})
			if err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(comparable(got.Events), comparable(want.Events)) {
				t.Errorf("events from %s:\n%+v\nwant (from YAML)\n%+v", tc.name, comparable(got.Events), comparable(want.Events))
			}
			if got.Events[0].Owner != "institutional sales" {
				t.Errorf("owner %q", got.Events[0].Owner)
			}
			if p := got.Events[1].Pos; p.File == "" || p.Line != 4 {
				t.Errorf("grocer-exit at %+v, want row 4 of the events file", p)
			}
		})
	}
}

// Errors in an events file name its file, sheet, row and column.
func TestEventsFileErrors(t *testing.T) {
	const head = "id,kind,start,units,series,probability\n"
	tests := []struct {
		name, yaml, table string
		xlsx              bool
		want              error
		msg               string
	}{
		{"bad kind", "", head + "a,step,2027-01,5,milk/**,1\nb,steady,2027-01,5,milk/**,1\n", false,
			ErrValue, `deals.csv:3:3: event "b": kind: unknown kind "steady"; want step or pulse`},
		{"bad kind in a workbook", "", head + "a,step,2027-01,5,milk/**,1\nb,steady,2027-01,5,milk/**,1\n", true,
			ErrValue, `deals.xlsx: sheet deals, cell B3: event "b": kind: unknown kind "steady"; want step or pulse`},
		{"probability out of range", "", head + "a,step,2027-01,5,milk/**,70\n", true,
			ErrValue, `deals.xlsx: sheet deals, cell F2: event "a": probability: must be in [0, 1], got 70`},
		{"not a number", "", head + "a,step,2027-01,lots,milk/**,1\n", false,
			data.ErrNotDecimal, `deals.csv:2:16: event "a": units: not a plain decimal number: "lots"`},
		{"decimal comma not asked for", "", strings.ReplaceAll(head, ",", ";") + "a;step;2027-01;5;milk/**;0,5\n", false,
			data.ErrNotDecimal, `deals.csv:2:26: event "a": probability: not a plain decimal number: "0,5"; a decimal comma; read the file with decimal: comma under events-file (events-file: {file: NAME, decimal: comma}), or write a point`},
		{"thousands in a workbook's text cell", "", head + "a,step,2027-01,9 000,milk/**,1\n", true,
			data.ErrNotDecimal, `deals.xlsx: sheet deals, cell D2: event "a": units: not a plain decimal number: "9 000"; thousands separators are not read; write the digits without them, such as 9000`},
		{"id shared with events", "events:\n  - {id: a, kind: pulse, start: 2027-01, scope: [{series: milk/**}], effect: {units: 1}}\n",
			head + "a,step,2027-01,5,milk/**,1\n", false,
			ErrDuplicate, `deals.csv:2:1: id: event id "a" is already an event of the scenario file (line 5)`},
		{"later row changes the event", "", head + "a,step,2027-01,5,milk/x,1\na,step,2027-02,,milk/y,\n", true,
			ErrConflict, `deals.xlsx: sheet deals, cell C3: event "a": start: differs from the event's first row (row 2)`},
		{"later row without series", "", head + "a,step,2027-01,5,milk/x,1\na,,,7,,\n", false,
			ErrMissing, `deals.csv:3:1: event "a": series: required on row 3`},
		{"cell under no column", "", "id,kind,start,units,\na,step,2027-01,5,big\n", false,
			ErrValue, `deals.csv:2:18: a cell in column 5, which the header does not name`},
		{"cell beyond the header", "", "id,kind,start,units\na,step,2027-01,5,big\n", true,
			ErrValue, `deals.xlsx: sheet deals, cell E2: a cell in column 5, which the header does not name`},
		{"unknown column", "", "id,kind,begin\na,step,2027-01\n", false,
			ErrUnknownKey, `deals.csv:1:9: unknown column "begin"`},
		{"no id column", "", "kind,start\nstep,2027-01\n", true,
			ErrMissing, `deals.xlsx: sheet deals, cell A1: the header has no id column`},
		{"bad id", "", head + "Big Deal,step,2027-01,5,milk/**,1\n", false,
			ErrValue, `deals.csv:2:1: id: "Big Deal" is not a valid event id`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			name, file := "deals.csv", []byte(tc.table)
			if tc.xlsx {
				name, file = "deals.xlsx", dealsWorkbook(t, tc.table)
			}
			_, err := loadIn(t, map[string][]byte{"plan.yaml": []byte(scenarioHead + tc.yaml + "events-file: " + name + "\n"), name: file})
			if err == nil {
				t.Fatal("no error")
			}
			if !errors.Is(err, tc.want) {
				t.Errorf("error %q does not wrap %q", err, tc.want)
			}
			got := err.Error()
			if i := strings.Index(got, name); i >= 0 {
				got = got[i:] // drop the temporary directory
			}
			if !strings.HasPrefix(got, tc.msg) {
				t.Errorf("error\n%s\ndoes not start with\n%s", got, tc.msg)
			}
		})
	}
}

// Percentages as a spreadsheet shows them: a cell formatted as 0% that
// holds 0.125 is 12.5 percent in the percent column, and one that holds
// 0.7 a probability of 0.7; typed as text, 12.5% and 70% read the same.
func TestEventsFilePercentages(t *testing.T) {
	const yaml = "events:\n  - {id: fair, kind: pulse, start: 2027-08, effect: {percent: 12.5}, probability: 0.7, scope: [{series: milk/**}]}\n"
	want, err := loadIn(t, map[string][]byte{"plan.yaml": []byte(scenarioHead + yaml)})
	if err != nil {
		t.Fatal(err)
	}
	f := excelize.NewFile()
	defer f.Close()
	for i, v := range []any{"id", "kind", "start", "series", "percent", "probability", "fair", "pulse", "2027-08", "milk/**", 0.125, 0.7} {
		if err := f.SetCellValue("Sheet1", data.CellName(i%6+1, i/6+1), v); err != nil {
			t.Fatal(err)
		}
	}
	pct, err := f.NewStyle(&excelize.Style{NumFmt: 10}) // 0.00%
	if err != nil {
		t.Fatal(err)
	}
	if err := f.SetCellStyle("Sheet1", "E2", "F2", pct); err != nil {
		t.Fatal(err)
	}
	book, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	for name, file := range map[string][]byte{
		"deals.xlsx": book.Bytes(),
		"deals.csv":  []byte("id,kind,start,series,percent,probability\nfair,pulse,2027-08,milk/**,12.5%,70%\n"),
	} {
		got, err := loadIn(t, map[string][]byte{"plan.yaml": []byte(scenarioHead + "events-file: " + name + "\n"), name: file})
		if err != nil {
			t.Fatal(err)
		}
		if !reflect.DeepEqual(comparable(got.Events), comparable(want.Events)) {
			t.Errorf("%s: events\n%+v\nwant\n%+v", name, comparable(got.Events), comparable(want.Events))
		}
	}
}

func TestOwnerInYAML(t *testing.T) {
	f, err := Parse(strings.NewReader(scenarioHead+"events:\n  - {id: a, kind: pulse, start: 2027-01, effect: {units: 1}, scope: [{series: milk/**}], owner: dairy sales}\n"), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	if f.Events[0].Owner != "dairy sales" {
		t.Errorf("Owner = %q", f.Events[0].Owner)
	}
}
