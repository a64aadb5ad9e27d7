package plots_test

import (
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/plot"

	"forelay/plots"
)

// TestWriteCharts writes every demo chart as PNG and SVG into the directory
// named by $PLOTS_OUT, for looking at them. It is skipped when that is unset.
func TestWriteCharts(t *testing.T) {
	dir := os.Getenv("PLOTS_OUT")
	if dir == "" {
		t.Skip("set PLOTS_OUT to a directory to write the demo charts there")
	}
	for name, mk := range demoCharts() {
		p, err := mk()
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		for _, format := range []string{"png", "svg"} {
			b, err := plots.Render(p, format, plots.DefaultWidth, plots.DefaultHeight)
			if err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			if err := os.WriteFile(filepath.Join(dir, name+"."+format), b, 0o644); err != nil {
				t.Fatal(err)
			}
		}
	}
}

// demoCharts returns a builder for each demo chart, by name.
func demoCharts() map[string]func() (*plot.Plot, error) {
	return map[string]func() (*plot.Plot, error){
		"plan":      demoPlan().Plot,
		"fan":       demoFan().Plot,
		"control":   demoControl().Plot,
		"signal":    demoSignal().Plot,
		"waterfall": demoWaterfall().Plot,
		"stock":     demoStock().Plot,
		"compare":   demoComparison().Plot,
		"load":      demoLoad().Plot,
	}
}
