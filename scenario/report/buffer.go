package report

import (
	"fmt"
	"forelay/forecast"
	"forelay/scenario/supply"
	"strconv"
)

// The JSON shape of buffer.json (and "forelay buffer --json"). Field names
// are documented in the README; keep them stable.

type bufferPeriodJSON struct {
	Period        string `json:"period"`
	Demand        Num    `json:"demand"`
	Capacity      Num    `json:"capacity"`
	Build         Num    `json:"build"`
	Stock         Num    `json:"stock"`
	RequiredStart Num    `json:"required_start"`
}

// BufferDoc is the document of buffer.json.
type BufferDoc struct {
	Plan              string             `json:"plan"`
	Units             string             `json:"units,omitempty"`
	Scenario          string             `json:"scenario"`
	Service           Num                `json:"service"`
	ServiceDefinition string             `json:"service_definition"`
	DemandSource      string             `json:"demand_source"`
	Paths             int                `json:"paths,omitempty"`
	Seed              *uint64            `json:"seed,omitempty"`
	Errors            string             `json:"errors,omitempty"`
	OpeningStock      Num                `json:"opening_stock"`
	Prebuild          Num                `json:"prebuild"`
	PrebuildBefore    *string            `json:"prebuild_before"`
	BuildStart        *string            `json:"build_start"`
	OpeningGap        Num                `json:"opening_gap"`
	SafetyStock       Num                `json:"safety_stock"`
	LeadTime          Num                `json:"lead_time"`
	Sigma             Num                `json:"sigma"`
	LeadTimeSpread    Num                `json:"lead_time_spread"`
	Z                 Num                `json:"z"`
	CycleServiceLevel Num                `json:"cycle_service_level"`
	Periods           []bufferPeriodJSON `json:"periods"`
	Inputs            map[string]string  `json:"inputs"`
	Notes             []string           `json:"notes"`
	Warnings          []string           `json:"warnings"`
	Caution           string             `json:"caution"`
}

// Buffer returns the report of a buffer run: the text, buffer.json,
// buffer.csv and the chart of the build plan.
func Buffer(r *supply.BufferRun) *Report {
	notes := append([]string{}, r.Plan.Notes...)
	if r.Sim != nil {
		notes = SimNotes(r.Plan)
	}
	rep := &Report{Name: "buffer", Warnings: r.Plan.Warnings, Doc: bufferDoc(r, notes), CSV: bufferCSV(r),
		Charts: []Chart{{Name: "buffer", Plot: bufferChart(r)}}, MoreTables: planTables(r.Plan)}
	writeBufferText(&rep.Text, r, notes)
	return rep
}

func bufferDoc(r *supply.BufferRun, notes []string) BufferDoc {
	p, b := r.Plan, r.Buffer
	o := BufferDoc{Plan: p.File.Plan, Units: p.File.Units, Scenario: p.Scenarios[r.Settings.Scenario].Name,
		Service: Num(r.Settings.Service), ServiceDefinition: serviceDefinition, DemandSource: "bands",
		OpeningStock: Num(b.Opening), Prebuild: Num(b.Prebuild), PrebuildBefore: PeriodOrNull(p, b.PrebuildAt),
		BuildStart: PeriodOrNull(p, b.BuildStart), OpeningGap: Num(b.Gap), SafetyStock: Num(r.Safety),
		LeadTime: Num(r.Settings.LeadTime), Sigma: Num(r.Sigma), LeadTimeSpread: Num(r.Spread), Z: Num(r.Z), CycleServiceLevel: Num(r.CSL),
		Inputs: p.Digests, Notes: notes, Warnings: List(p.Warnings), Caution: Caution}
	if r.Sim != nil {
		seed := r.Sim.Seed
		o.DemandSource = "monte-carlo"
		o.Paths, o.Seed, o.Errors = r.Sim.Paths, &seed, r.Sim.Errors.String()
	}
	for t, per := range p.Periods {
		o.Periods = append(o.Periods, bufferPeriodJSON{Period: per.String(), Demand: Num(b.Demand[t]), Capacity: Num(b.Capacity[t]),
			Build: Num(b.Build[t]), Stock: Num(b.Stock[t]), RequiredStart: Num(b.Required[t])})
	}
	return o
}

// bufferCSV renders buffer.csv: one row per period.
func bufferCSV(r *supply.BufferRun) *Table {
	tb := (&Table{Head: []string{"period", "demand", "capacity", "build", "stock", "required_start"}}).
		Typed(Label, Quantity, Quantity, Quantity, Quantity, Quantity)
	b := r.Buffer
	for t, per := range r.Plan.Periods {
		tb.AddRow(per.String(), CSVNum(b.Demand[t], 2), CSVNum(b.Capacity[t], 2), CSVNum(b.Build[t], 2),
			CSVNum(b.Stock[t], 2), CSVNum(b.Required[t], 2))
	}
	return tb
}

// writeBufferText writes the text report of a buffer run.
func writeBufferText(w *Text, r *supply.BufferRun, notes []string) {
	p, b := r.Plan, r.Buffer
	f := p.File
	fmt.Fprintf(w, "Buffer for scenario %s of plan %s%s\n", p.Scenarios[r.Settings.Scenario].Name, f.Plan, InUnits(f.Units))
	svc := PctText(r.Settings.Service)
	if r.Sim != nil {
		fmt.Fprintf(w, "Demand: the %s quantile of each period's simulated demand (%s)\n", svc, SimText(r.Sim))
	} else {
		fmt.Fprintf(w, "Demand: adjusted plan + %.3f x standard error (the %s normal quantile)\n", r.Z, svc)
	}
	fmt.Fprintf(w, "Capacity: %s\n", CapacityText(p))
	fmt.Fprintf(w, "Service: %s %s (%s)\n\n", svc, serviceDefinition, "the chance that a period's demand is met from what is made and held")
	t := NewTable("period", "demand", "capacity", "build", "stock (end)", "needed at start")
	for i, per := range p.Periods {
		t.AddRow(per.String(), wholeNum(b.Demand[i]), wholeNum(b.Capacity[i]), wholeNum(b.Build[i]),
			wholeNum(b.Stock[i]), wholeNum(b.Required[i]))
	}
	w.Add(t)
	fmt.Fprintln(w)
	writePrebuildText(w, r)
	writeSafetyText(w, r)
	writeNotesAndCaution(w, notes)
}

// writePrebuildText says how much to build ahead, and from when.
func writePrebuildText(w *Text, r *supply.BufferRun) {
	prebuildText(w, r.Plan.Periods, r.Plan.File.Units, r.Buffer, r.Settings.Service)
}

// prebuildText says how much of build plan b to build ahead over
// periods, in units, and from when, for the demand at the service
// quantile.
func prebuildText(w *Text, periods []forecast.Period, unitName string, b supply.Buffer, service float64) {
	units := unitsSuffix(unitName)
	if b.PrebuildAt < 0 {
		fmt.Fprintf(w, "No period's demand at the %s quantile exceeds capacity: nothing needs building ahead.\n", PctText(service))
		return
	}
	fmt.Fprintf(w, "Pre-build: hold %s%s at the start of %s, the first period whose demand exceeds capacity.\n",
		wholeNum(b.Prebuild), units, periods[b.PrebuildAt])
	switch {
	case b.Gap > 0:
		fmt.Fprintf(w, "The plan needs %s%s in stock at the start of %s but opens with %s%s: building ahead should have started before the plan; even at full capacity %s of demand go unmet.\n",
			wholeNum(b.Required[0]), units, periods[0], wholeNum(b.Opening), units, wholeNum(b.Gap))
	case b.BuildStart >= 0:
		fmt.Fprintf(w, "Building ahead must start in %s (from an opening stock of %s%s, building as late as capacity allows).\n",
			periods[b.BuildStart], wholeNum(b.Opening), units)
	default:
		fmt.Fprintf(w, "The opening stock of %s%s covers it: no building ahead is needed.\n", wholeNum(b.Opening), units)
	}
}

// writeSafetyText gives the safety stock for the lead time and where its
// spread comes from.
func writeSafetyText(w *Text, r *supply.BufferRun) {
	p := r.Plan
	lead := strconv.FormatFloat(r.Settings.LeadTime, 'g', -1, 64)
	period := p.History.Freq().String()
	if r.Settings.LeadTime != 1 {
		period += "s"
	}
	fmt.Fprintf(w, "Safety stock for a lead time of %s %s: z %.3f x spread %s = %s%s, a %s %s.\n",
		lead, period, r.Z, wholeNum(r.Spread), wholeNum(r.Safety), unitsSuffix(p.File.Units), PctText(r.CSL), serviceDefinition)
	fmt.Fprintf(w, "(spread: standard deviation of the summed forecast errors over the lead time, from the baseline's %s band variance\n"+
		"and the model's carry-over of errors from one period to the next; one period alone: %s.)\n", p.From, wholeNum(r.Sigma))
}
