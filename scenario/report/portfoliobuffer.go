package report

import (
	"fmt"
	"strconv"

	"forelay/scenario/supply"
)

// The JSON shape of buffer.json for a portfolio (kind "portfolio"). Field
// names are documented in the README; keep them stable.

type resourceBufferJSON struct {
	Resource          string             `json:"resource"`
	Units             string             `json:"units,omitempty"`
	Prebuild          Num                `json:"prebuild"`
	PrebuildBefore    *string            `json:"prebuild_before"`
	BuildStart        *string            `json:"build_start"`
	OpeningGap        Num                `json:"opening_gap"`
	SafetyStock       Num                `json:"safety_stock"`
	Sigma             Num                `json:"sigma"`
	LeadTimeSpread    Num                `json:"lead_time_spread"`
	CycleServiceLevel Num                `json:"cycle_service_level"`
	Periods           []bufferPeriodJSON `json:"periods"`
}

// PortfolioBufferDoc is the document of buffer.json for a portfolio.
type PortfolioBufferDoc struct {
	Plan              string               `json:"plan"`
	Kind              string               `json:"kind"`
	Scenario          string               `json:"scenario"`
	Service           Num                  `json:"service"`
	ServiceDefinition string               `json:"service_definition"`
	DemandSource      string               `json:"demand_source"`
	Paths             int                  `json:"paths,omitempty"`
	Seed              *uint64              `json:"seed,omitempty"`
	OpeningStock      Num                  `json:"opening_stock"`
	LeadTime          Num                  `json:"lead_time"`
	Z                 Num                  `json:"z"`
	Resources         []resourceBufferJSON `json:"resources"`
	Unlimited         []string             `json:"unlimited"`
	Inputs            map[string]string    `json:"inputs"`
	Notes             []string             `json:"notes"`
	Warnings          []string             `json:"warnings"`
	Caution           string               `json:"caution"`
}

// PortfolioBuffer returns the report of a portfolio's buffer run: per
// resource with a capacity, the build plan of its load at the service
// quantile and its safety stock; buffer.json and buffer.csv (a resource
// column, then the columns of a single series' buffer.csv).
func PortfolioBuffer(r *supply.PortfolioBufferRun) *Report {
	notes := []string{"Pre-builds and safety stocks of a resource are in its units: the load of the goods built ahead or held"}
	if r.Sim != nil {
		notes = append(notes, "The spread over the lead time is that of the simulated load, events included")
	} else {
		notes = append(notes, "From the bands, the spread over the lead time is one period's times the square root of the lead time (independent errors)")
	}
	rep := &Report{Name: "buffer", Warnings: r.Portfolio.Warnings, Doc: portfolioBufferDoc(r, notes), CSV: portfolioBufferCSV(r),
		MoreTables: portfolioTables(r.Portfolio)}
	writePortfolioBufferText(&rep.Text, r, notes)
	return rep
}

func portfolioBufferDoc(r *supply.PortfolioBufferRun, notes []string) PortfolioBufferDoc {
	pf := r.Portfolio
	p0 := pf.Plans[0]
	o := PortfolioBufferDoc{Plan: pf.File.Plan, Kind: "portfolio", Scenario: p0.Scenarios[r.Settings.Scenario].Name,
		Service: Num(r.Settings.Service), ServiceDefinition: serviceDefinition, DemandSource: "bands",
		OpeningStock: Num(r.Settings.Opening), LeadTime: Num(r.Settings.LeadTime), Z: Num(r.Z),
		Resources: []resourceBufferJSON{}, Unlimited: List(r.Unlimited), Inputs: p0.Digests, Notes: notes,
		Warnings: List(pf.Warnings), Caution: Caution}
	if r.Sim != nil {
		seed := r.Sim.Seed
		o.DemandSource, o.Paths, o.Seed = "monte-carlo", r.Sim.Paths, &seed
	}
	for _, rb := range r.Resources {
		b := rb.Buffer
		rj := resourceBufferJSON{Resource: rb.Resource.ID, Units: rb.Resource.Units, Prebuild: Num(b.Prebuild),
			PrebuildBefore: periodOrNull(p0.Periods, b.PrebuildAt), BuildStart: periodOrNull(p0.Periods, b.BuildStart),
			OpeningGap: Num(b.Gap), SafetyStock: Num(rb.Safety), Sigma: Num(rb.Sigma), LeadTimeSpread: Num(rb.Spread),
			CycleServiceLevel: Num(rb.CSL)}
		for t, per := range p0.Periods {
			rj.Periods = append(rj.Periods, bufferPeriodJSON{Period: per.String(), Demand: Num(b.Demand[t]), Capacity: Num(b.Capacity[t]),
				Build: Num(b.Build[t]), Stock: Num(b.Stock[t]), RequiredStart: Num(b.Required[t])})
		}
		o.Resources = append(o.Resources, rj)
	}
	return o
}

// portfolioBufferCSV renders buffer.csv of a portfolio: one row per
// resource with a capacity and period; demand is the resource's load.
func portfolioBufferCSV(r *supply.PortfolioBufferRun) *Table {
	tb := (&Table{Head: []string{"resource", "period", "demand", "capacity", "build", "stock", "required_start"}}).
		Typed(Label, Label, Quantity, Quantity, Quantity, Quantity, Quantity)
	for _, rb := range r.Resources {
		b := rb.Buffer
		for t, per := range r.Portfolio.Plans[0].Periods {
			tb.AddRow(rb.Resource.ID, per.String(), CSVNum(b.Demand[t], 2), CSVNum(b.Capacity[t], 2), CSVNum(b.Build[t], 2),
				CSVNum(b.Stock[t], 2), CSVNum(b.Required[t], 2))
		}
	}
	return tb
}

// writePortfolioBufferText writes the text report of a portfolio's
// buffer run.
func writePortfolioBufferText(w *Text, r *supply.PortfolioBufferRun, notes []string) {
	pf := r.Portfolio
	p0 := pf.Plans[0]
	svc := PctText(r.Settings.Service)
	fmt.Fprintf(w, "Buffers for scenario %s of plan %s: %s series, %d %s with a capacity\n",
		p0.Scenarios[r.Settings.Scenario].Name, pf.File.Plan, countText(len(pf.Plans)), len(r.Resources),
		Plural(len(r.Resources), "resource", "resources"))
	if r.Sim != nil {
		fmt.Fprintf(w, "Load: the %s quantile of each period's simulated load (%s paths, seed %d, whole historical periods)\n",
			svc, countText(r.Sim.Paths), r.Sim.Seed)
	} else {
		fmt.Fprintf(w, "Load: planned load + %.3f x its standard error (the %s normal quantile)\n", r.Z, svc)
	}
	fmt.Fprintf(w, "Service: %s %s\n", svc, serviceDefinition)
	if len(r.Unlimited) > 0 {
		fmt.Fprintf(w, "No capacity, so no buffer: %s\n", OrNone(r.Unlimited))
	}
	lead := strconv.FormatFloat(r.Settings.LeadTime, 'g', -1, 64)
	for _, rb := range r.Resources {
		b, units := rb.Buffer, rb.Resource.Units
		fmt.Fprintf(w, "\nResource %s%s\n", rb.Resource.ID, InUnits(units))
		t := NewTable("period", "load", "capacity", "build", "stock (end)", "needed at start")
		for i, per := range p0.Periods {
			t.AddRow(per.String(), wholeNum(b.Demand[i]), wholeNum(b.Capacity[i]), wholeNum(b.Build[i]),
				wholeNum(b.Stock[i]), wholeNum(b.Required[i]))
		}
		w.Add(t)
		prebuildText(w, p0.Periods, units, b, r.Settings.Service)
		fmt.Fprintf(w, "Safety stock for a lead time of %s: z %.3f x spread %s = %s%s (one period alone: spread %s).\n",
			lead, r.Z, wholeNum(rb.Spread), wholeNum(rb.Safety), unitsSuffix(units), wholeNum(rb.Sigma))
	}
	writeNotesAndCaution(w, notes)
}
