package plan

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"forelay/scenario"
	"forelay/scenario/data"
)

// keyHistory is an invented history of three series of the dairy
// cooperative, named by the columns family, product and customer, 24
// months each:
//
//	milk/whole-1l/grocer-north, milk/whole-1l/grocer-south, milk/skim-1l/grocer-north
var keyHistory, _ = filepath.Abs("../../testdata/history/long_key_monthly.csv")

// parseAt parses a scenario whose history block is block (with the path of
// keyHistory for FILE), and returns it with the position of the § marker.
func parseAt(t *testing.T, block string) (*scenario.File, int, int) {
	t.Helper()
	src := "plan: p\nhistory: " + strings.Replace(block, "FILE", keyHistory, 1) + "\nhorizon: 3\n"
	line, col := 0, 0
	if i := strings.Index(src, "§"); i >= 0 {
		line = strings.Count(src[:i], "\n") + 1
		col = i - strings.LastIndex(src[:i], "\n")
		src = src[:i] + src[i+len("§"):]
	}
	f, err := scenario.Parse(strings.NewReader(src), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	return f, line, col
}

func TestReadSelection(t *testing.T) {
	const key = "key: [family, product, customer]"
	for _, tc := range []struct {
		block    string
		selected []string
		levels   []string
	}{
		// The selections are read off the three names by hand.
		{"{file: FILE, " + key + ", series: milk/skim-1l/grocer-north}", []string{"milk/skim-1l/grocer-north"},
			[]string{"level1", "level2", "level3"}},
		{"{file: FILE, " + key + ", series: '**/grocer-south'}", []string{"milk/whole-1l/grocer-south"},
			[]string{"level1", "level2", "level3"}},
		{"{file: FILE, " + key + ", series: ['*/*/grocer-north', 'milk/**'], levels: [family, product, customer]}",
			[]string{"milk/whole-1l/grocer-north", "milk/whole-1l/grocer-south", "milk/skim-1l/grocer-north"},
			[]string{"family", "product", "customer"}},
		{"{file: FILE, " + key + ", series: ['milk/skim-1l/*', 'milk/whole-1l/grocer-north']}",
			[]string{"milk/whole-1l/grocer-north", "milk/skim-1l/grocer-north"}, // file order
			[]string{"level1", "level2", "level3"}},
	} {
		f, _, _ := parseAt(t, tc.block)
		in, err := ReadSelection(f)
		if err != nil {
			t.Errorf("%s: %v", tc.block, err)
			continue
		}
		if !slices.Equal(in.Selected, tc.selected) || !slices.Equal(in.Levels, tc.levels) {
			t.Errorf("%s: selected %q levels %q, want %q %q", tc.block, in.Selected, in.Levels, tc.selected, tc.levels)
		}
		if one := len(tc.selected) == 1; one != (in.Series.Name != "") || one && in.Series.Name != tc.selected[0] {
			t.Errorf("%s: Series = %q", tc.block, in.Series.Name)
		}
	}
}

// TestReadSelectionOnePlans: one series selected through a pattern is
// planned as when it is named.
func TestReadSelectionOnePlans(t *testing.T) {
	var horizons []string
	for _, block := range []string{
		"{file: FILE, key: [family, product, customer], series: 'milk/skim-*/*'}",
		"{file: FILE, key: [family, product, customer], series: milk/skim-1l/grocer-north}",
	} {
		f, _, _ := parseAt(t, block)
		p, err := Load(f)
		if err != nil {
			t.Fatalf("%s: %v", block, err)
		}
		horizons = append(horizons, fmt.Sprint(p.History.Name, p.Baseline, p.BaselineVar))
	}
	if horizons[0] != horizons[1] {
		t.Errorf("plan through a pattern\n  %s\ndiffers from the plan of the name\n  %s", horizons[0], horizons[1])
	}
}

func TestReadSelectionErrors(t *testing.T) {
	const key = "key: [family, product, customer]"
	for _, tc := range []struct {
		name, block, want string
		readOnly          bool // the error comes from Read, ReadSelection succeeds
	}{
		{"pattern matches nothing", "{file: FILE, " + key + ", series: §'cream/**'}",
			// Each name is 5 from cream/**: cream -> milk is 4 substitutions and
			// a deletion, and ** takes the rest; the tie keeps file order.
			`the pattern "cream/**" matches no series of ` + keyHistory +
				`; the nearest are "milk/whole-1l/grocer-north", "milk/whole-1l/grocer-south", "milk/skim-1l/grocer-north"`, false},
		{"name in a list matches nothing", "{file: FILE, " + key + ", series: ['milk/**', §milk/whole-1l/grocer-nort]}",
			`history.series[1]: no series is called "milk/whole-1l/grocer-nort" of ` + keyHistory + `; the nearest are "milk/whole-1l/grocer-north"`, false},
		{"several selected", "{file: FILE, " + key + ", series: §'milk/whole-1l/*'}",
			`history.series: 2 series selected ("milk/whole-1l/grocer-north", "milk/whole-1l/grocer-south"): plan, stress, buffer and compare take several series, but this command takes one so far; select one`, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f, line, col := parseAt(t, tc.block)
			_, errSel := ReadSelection(f)
			_, err := Read(f)
			if tc.readOnly && errSel != nil {
				t.Errorf("ReadSelection: %v", errSel)
			}
			var pe *data.ParseError
			if !errors.As(err, &pe) || !errors.Is(err, scenario.ErrValue) {
				t.Fatalf("error %v is no ErrValue *data.ParseError", err)
			}
			if pe.File != "plan.yaml" || pe.Line != line || pe.Column != col || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error\n  %v\nwant plan.yaml:%d:%d and %q", err, line, col, tc.want)
			}
		})
	}
}

// TestReadSelectionLevels: history.levels must name as many levels as
// every selected name has; names of a series column may differ in depth.
func TestReadSelectionLevels(t *testing.T) {
	dir := t.TempDir()
	hist := "series,period,value\nmilk/whole-1l,2026-01,5\nmilk/skim-1l/grocer-north,2026-01,6\n"
	if err := os.WriteFile(filepath.Join(dir, "h.csv"), []byte(hist), 0o644); err != nil {
		t.Fatal(err)
	}
	src := "plan: p\nhistory: {file: h.csv, series: '**', levels: [family, product]}\nhorizon: 3\n"
	f, err := scenario.Parse(strings.NewReader(src), filepath.Join(dir, "plan.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	_, err = ReadSelection(f)
	// The levels list opens at column 46 of line 2: "history: " is 9 bytes,
	// "{file: h.csv, " 14, "series: '**', " 14 and "levels: " 8.
	want := `plan.yaml:2:46: history.levels: names 2 levels (family, product), but series "milk/skim-1l/grocer-north" has 3`
	if err == nil || !strings.HasSuffix(strings.SplitN(err.Error(), "; give", 2)[0], want) {
		t.Errorf("error %v, want it to end %q", err, want)
	}
	f.History.Levels = nil
	in, err := ReadSelection(f)
	if err != nil {
		t.Fatal(err)
	}
	if want := []string{"level1", "level2", "level3"}; !slices.Equal(in.Levels, want) {
		t.Errorf("default levels %q, want %q (the deepest name has 3)", in.Levels, want)
	}
}
