package scenario_test

import (
	"fmt"
	"strings"

	"forelay/forecast"
	"forelay/scenario"
)

func ExampleEvent_Profile() {
	src := `plan: example
history: {file: history.csv}
horizon: 6
events:
  - id: new-account
    kind: step
    start: 2027-02
    effect: {units: 3000}
    ramp: {periods: 3, shape: linear}
  - id: spring-fair
    kind: pulse
    start: 2027-03
    effect: {percent: 10}
    payback: {share: 0.5, periods: 2}
`
	f, err := scenario.Parse(strings.NewReader(src), "example.yaml")
	if err != nil {
		fmt.Println(err)
		return
	}
	next, _ := forecast.ParsePeriod("2027-01", forecast.Monthly)
	if err := f.Resolve(next); err != nil {
		fmt.Println(err)
		return
	}
	baseline := []float64{1000, 1000, 1200, 1000, 800, 1000}
	for _, e := range f.Events {
		fmt.Printf("%-12s profile %.3f\n", e.ID, e.Profile(next, 6))
		fmt.Printf("%-12s change  %.0f\n", "", e.Contribution(next, baseline))
	}
	// Output:
	// new-account  profile [0.000 0.333 0.667 1.000 1.000 1.000]
	//              change  [0 1000 2000 3000 3000 3000]
	// spring-fair  profile [0.000 0.000 1.000 -0.250 -0.250 0.000]
	//              change  [0 0 120 -30 -30 0]
}

func ExampleParse_error() {
	src := `plan: example
history: {file: history.csv}
horizon: 6
events:
  - id: fair-week
    kind: pulse
    start: 2027-08
    probabilty: 0.5
`
	_, err := scenario.Parse(strings.NewReader(src), "plan.yaml")
	fmt.Println(err)
	// Output:
	// plan.yaml:8:5: event "fair-week": probabilty: unknown key; did you mean probability?
}
