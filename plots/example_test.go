package plots_test

import (
	"bytes"
	"fmt"
	"image/png"
	"log"
	"os"
	"path/filepath"

	"forelay/plots"
)

// The examples write their charts into a temporary directory, never into the
// repository.

func ExamplePlanChart() {
	dir, err := os.MkdirTemp("", "forelay-plots-")
	if err != nil {
		log.Fatal(err)
	}
	defer os.RemoveAll(dir)

	c := plots.PlanChart{
		Title:  "Milk intake plan (invented data)",
		Units:  "Litres per month",
		Labels: []string{"2025-09", "2025-10", "2025-11", "2025-12", "2026-01", "2026-02", "2026-03"},
		History: plots.Curve{
			Values: []float64{512000, 498000, 505000, 521000},
		},
		Baseline: plots.Curve{
			Name:   "Baseline (80% band)",
			Start:  4,
			Values: []float64{530000, 541000, 556000},
			Lower:  []float64{518000, 526000, 538000},
			Upper:  []float64{542000, 556000, 574000},
		},
		Scenarios: []plots.Curve{
			{Name: "With new account", Start: 4, Values: []float64{530000, 561000, 576000}},
		},
		Windows:       []plots.Window{{Label: "new account", From: 4.5, To: 6.5}},
		ForecastStart: 4,
	}
	p, err := c.Plot()
	if err != nil {
		log.Fatal(err)
	}
	b, err := plots.Render(p, "png", plots.DefaultWidth, plots.DefaultHeight)
	if err != nil {
		log.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "plan.png"), b, 0o644); err != nil {
		log.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(b))
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println(img.Bounds().Dx(), "x", img.Bounds().Dy(), "pixels")
	// Output: 1536 x 864 pixels
}

func ExampleWaterfall() {
	dir, err := os.MkdirTemp("", "forelay-plots-")
	if err != nil {
		log.Fatal(err)
	}
	defer os.RemoveAll(dir)

	// 540,000 + 40,000 - 25,000 + 12,500 = 567,500 litres.
	c := plots.Waterfall{
		Title:      "From baseline to plan (invented data)",
		Units:      "Litres",
		StartLabel: "Baseline",
		Start:      540000,
		Steps: []plots.Step{
			{Label: "New account", Value: 40000},
			{Label: "Customer leaving", Value: -25000},
			{Label: "Promotion", Value: 12500},
		},
		EndLabel: "Plan",
	}
	p, err := c.Plot()
	if err != nil {
		log.Fatal(err)
	}
	b, err := plots.Render(p, "svg", plots.DefaultWidth, plots.DefaultHeight)
	if err != nil {
		log.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "waterfall.svg"), b, 0o644); err != nil {
		log.Fatal(err)
	}
	for _, s := range []string{">540,000<", ">+40,000<", ">-25,000<", ">+12,500<", ">567,500<"} {
		fmt.Println(s[1:len(s)-1], bytes.Contains(b, []byte(s)))
	}
	// Output:
	// 540,000 true
	// +40,000 true
	// -25,000 true
	// +12,500 true
	// 567,500 true
}

func ExampleControlChart() {
	dir, err := os.MkdirTemp("", "forelay-plots-")
	if err != nil {
		log.Fatal(err)
	}
	defer os.RemoveAll(dir)

	c := plots.ControlChart{
		Title:  "Forecast errors (invented data)",
		Units:  "litres",
		Labels: []string{"2026-01", "2026-02", "2026-03", "2026-04", "2026-05", "2026-06"},
		Errors: []float64{4000, -7000, 2500, 31000, -1500, 6000},
		UCL:    27000,
		LCL:    -27000,
		Sigma:  9000,
		Hits:   []plots.Hit{{Index: 3, Label: "1"}},
	}
	p, err := c.Plot()
	if err != nil {
		log.Fatal(err)
	}
	b, err := plots.Render(p, "png", 6*72, 3.5*72)
	if err != nil {
		log.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "control.png"), b, 0o644); err != nil {
		log.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(b))
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println(img.Bounds().Dx(), "x", img.Bounds().Dy(), "pixels")
	// Output: 1152 x 672 pixels
}

func ExampleLoadChart() {
	// A filler's load in hours, the plan's load ± 2 standard deviations
	// of 10 hours as its band (clipped at 0 by the caller), against a
	// capacity of 420 hours that rises to 500 in 2026-04. In 2026-02 only
	// the band's upper edge (410 + 20 = 430) is above 420; in 2026-03 the
	// load itself (435) is.
	c := plots.LoadChart{
		Title:  "Cup filler against its capacity (invented data)",
		Units:  "Hours per month",
		Labels: []string{"2026-01", "2026-02", "2026-03", "2026-04", "2026-05"},
		Scenarios: []plots.Curve{{
			Name:   "Plan, ± 2 SD",
			Values: []float64{380, 410, 435, 450, 440},
			Lower:  []float64{360, 390, 415, 430, 420},
			Upper:  []float64{400, 430, 455, 470, 460},
		}},
		Capacity: []float64{420, 420, 420, 500, 500},
	}
	p, err := c.Plot()
	if err != nil {
		log.Fatal(err)
	}
	b, err := plots.Render(p, "svg", plots.DefaultWidth, plots.DefaultHeight)
	if err != nil {
		log.Fatal(err)
	}
	for _, s := range []string{">Capacity<", ">Band above capacity<", ">Load above capacity<"} {
		fmt.Println(s[1:len(s)-1], bytes.Contains(b, []byte(s)))
	}
	// Output:
	// Capacity true
	// Band above capacity true
	// Load above capacity true
}

func ExampleValueTicks() {
	for _, t := range (plots.ValueTicks{}).Ticks(470000, 790000) {
		if !t.IsMinor() {
			fmt.Println(t.Label)
		}
	}
	// Output:
	// 500,000
	// 550,000
	// 600,000
	// 650,000
	// 700,000
	// 750,000
}
