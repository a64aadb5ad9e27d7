package main

import (
	"fmt"
	"forelay/scenario/report"
	"io"
	"strconv"
	"strings"

	"forelay/plots"
)

// serviceDefinition is said in every buffer output.
const serviceDefinition = "cycle service level, not fill rate"

// The JSON shape of buffer.json (and "forelay buffer --json"). Field names
// are documented in the README; keep them stable.

type bufferPeriodJSON struct {
	Period        string `json:"period"`
	Demand        num    `json:"demand"`
	Capacity      num    `json:"capacity"`
	Build         num    `json:"build"`
	Stock         num    `json:"stock"`
	RequiredStart num    `json:"required_start"`
}

type bufferOutJSON struct {
	Plan              string             `json:"plan"`
	Units             string             `json:"units,omitempty"`
	Scenario          string             `json:"scenario"`
	Service           num                `json:"service"`
	ServiceDefinition string             `json:"service_definition"`
	DemandSource      string             `json:"demand_source"`
	Paths             int                `json:"paths,omitempty"`
	Seed              *uint64            `json:"seed,omitempty"`
	Errors            string             `json:"errors,omitempty"`
	OpeningStock      num                `json:"opening_stock"`
	Prebuild          num                `json:"prebuild"`
	PrebuildBefore    *string            `json:"prebuild_before"`
	BuildStart        *string            `json:"build_start"`
	OpeningGap        num                `json:"opening_gap"`
	SafetyStock       num                `json:"safety_stock"`
	LeadTime          num                `json:"lead_time"`
	Sigma             num                `json:"sigma"`
	LeadTimeSpread    num                `json:"lead_time_spread"`
	Z                 num                `json:"z"`
	CycleServiceLevel num                `json:"cycle_service_level"`
	Periods           []bufferPeriodJSON `json:"periods"`
	Inputs            map[string]string  `json:"inputs"`
	Notes             []string           `json:"notes"`
	Warnings          []string           `json:"warnings"`
	Caution           string             `json:"caution"`
}

func demandSourceName(r *bufferResult) string {
	if r.Sim == nil {
		return "bands"
	}
	return "monte-carlo"
}

func bufferJSON(r *bufferResult) bufferOutJSON {
	p, b := r.Plan, r.Buffer
	o := bufferOutJSON{Plan: p.File.Plan, Units: p.File.Units, Scenario: p.Scenarios[r.Scenario].Name,
		Service: num(r.Opts.Service), ServiceDefinition: serviceDefinition, DemandSource: demandSourceName(r),
		OpeningStock: num(b.Opening), Prebuild: num(b.Prebuild), PrebuildBefore: report.PeriodOrNull(p, b.PrebuildAt),
		BuildStart: report.PeriodOrNull(p, b.BuildStart), OpeningGap: num(b.Gap), SafetyStock: num(r.Safety),
		LeadTime: num(r.Opts.LeadTime), Sigma: num(r.Sigma), LeadTimeSpread: num(r.Spread), Z: num(r.Z), CycleServiceLevel: num(r.CSL),
		Inputs: p.Digests, Notes: r.Notes, Warnings: warningList(r.Plan.Warnings), Caution: report.Caution}
	if r.Sim != nil {
		seed := r.Sim.Seed
		o.Paths, o.Seed, o.Errors = r.Sim.Paths, &seed, r.Sim.Errors.String()
	}
	for t, per := range p.Periods {
		o.Periods = append(o.Periods, bufferPeriodJSON{Period: per.String(), Demand: num(b.Demand[t]), Capacity: num(b.Capacity[t]),
			Build: num(b.Build[t]), Stock: num(b.Stock[t]), RequiredStart: num(b.Required[t])})
	}
	return o
}

// bufferCSV renders buffer.csv: one row per period.
func bufferCSV(r *bufferResult) *report.Table {
	rows := [][]string{{"period", "demand", "capacity", "build", "stock", "required_start"}}
	b := r.Buffer
	for t, per := range r.Plan.Periods {
		rows = append(rows, []string{per.String(), report.CSVNum(b.Demand[t], 2), report.CSVNum(b.Capacity[t], 2), report.CSVNum(b.Build[t], 2),
			report.CSVNum(b.Stock[t], 2), report.CSVNum(b.Required[t], 2)})
	}
	return csvTable(rows)
}

// writeBufferText writes the human report of a buffer run.
func writeBufferText(w io.Writer, r *bufferResult) {
	p, b := r.Plan, r.Buffer
	f := p.File
	units := ""
	if f.Units != "" {
		units = " " + f.Units
	}
	sc := p.Scenarios[r.Scenario]
	fmt.Fprintf(w, "Buffer for scenario %s of plan %s%s\n", sc.Name, f.Plan, report.InUnits(f.Units))
	svc := report.PctText(r.Opts.Service)
	if r.Sim != nil {
		fmt.Fprintf(w, "Demand: the %s quantile of each period's simulated demand (%s)\n", svc, report.SimText(r.Sim))
	} else {
		fmt.Fprintf(w, "Demand: adjusted plan + %.3f x standard error (the %s normal quantile)\n", r.Z, svc)
	}
	fmt.Fprintf(w, "Capacity: %s\n", report.CapacityText(p))
	fmt.Fprintf(w, "Service: %s %s (%s)\n\n", svc, serviceDefinition, "the chance that a period's demand is met from what is made and held")
	t := newTable("period", "demand", "capacity", "build", "stock (end)", "needed at start")
	for i, per := range p.Periods {
		t.AddRow(per.String(), fmtNum(b.Demand[i], 0), fmtNum(b.Capacity[i], 0), fmtNum(b.Build[i], 0),
			fmtNum(b.Stock[i], 0), fmtNum(b.Required[i], 0))
	}
	writeTable(w, t)
	fmt.Fprintln(w)
	if b.PrebuildAt < 0 {
		fmt.Fprintf(w, "No period's demand at the %s quantile exceeds capacity: nothing needs building ahead.\n", svc)
	} else {
		fmt.Fprintf(w, "Pre-build: hold %s%s at the start of %s, the first period whose demand exceeds capacity.\n",
			fmtNum(b.Prebuild, 0), units, p.Periods[b.PrebuildAt])
		switch {
		case b.Gap > 0:
			fmt.Fprintf(w, "The plan needs %s%s in stock at the start of %s but opens with %s%s: building ahead should have started before the plan; even at full capacity %s of demand go unmet.\n",
				fmtNum(b.Required[0], 0), units, p.Periods[0], fmtNum(b.Opening, 0), units, fmtNum(b.Gap, 0))
		case b.BuildStart >= 0:
			fmt.Fprintf(w, "Building ahead must start in %s (from an opening stock of %s%s, building as late as capacity allows).\n",
				p.Periods[b.BuildStart], fmtNum(b.Opening, 0), units)
		default:
			fmt.Fprintf(w, "The opening stock of %s%s covers it: no building ahead is needed.\n", fmtNum(b.Opening, 0), units)
		}
	}
	lead := strconv.FormatFloat(r.Opts.LeadTime, 'g', -1, 64)
	period := p.History.Freq().String()
	if r.Opts.LeadTime != 1 {
		period += "s"
	}
	fmt.Fprintf(w, "Safety stock for a lead time of %s %s: z %.3f x spread %s = %s%s, a %s %s.\n",
		lead, period, r.Z, fmtNum(r.Spread, 0), fmtNum(r.Safety, 0), units, report.PctText(r.CSL), serviceDefinition)
	fmt.Fprintf(w, "(spread: standard deviation of the summed forecast errors over the lead time, from the baseline's %s band variance\n"+
		"and the model's carry-over of errors from one period to the next; one period alone: %s.)\n", p.From, fmtNum(r.Sigma, 0))
	if len(r.Notes) > 0 {
		fmt.Fprintln(w)
		for _, n := range r.Notes {
			fmt.Fprintf(w, "Note: %s.\n", strings.TrimSuffix(n, "."))
		}
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, report.Caution)
}

// bufferChart is the build plan: demand at the service quantile,
// capacity and the build as bars, with the stock in a panel below.
func bufferChart(r *bufferResult) plots.StockChart {
	p, b := r.Plan, r.Buffer
	labels := make([]string, len(p.Periods))
	for t, per := range p.Periods {
		labels[t] = per.String()
	}
	return plots.StockChart{
		Title:      fmt.Sprintf("Build ahead, %s: %s at %s service", p.File.Plan, p.Scenarios[r.Scenario].Name, report.PctText(r.Opts.Service)),
		Units:      report.UnitsLabel(p.File.Units, p.History.Freq().String()),
		StockUnits: report.StockLabel(p.File.Units),
		Labels:     labels,
		Demand:     b.Demand,
		Capacity:   b.Capacity,
		Build:      b.Build,
		Stock:      b.Stock,
	}
}
