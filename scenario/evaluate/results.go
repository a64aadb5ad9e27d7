package evaluate

// Results holds everything Run measured. Every list has a fixed order, so
// the same cases and settings give the same Results (and the same JSON).
// A share or mean over nothing is 0, with its count 0.
type Results struct {
	Settings Settings `json:"settings"`
	// Cases lists the series in input order with their origins.
	Cases []CaseInfo `json:"cases"`
	// Slices are the aggregates per method, source and frequency: for each
	// method in Settings.Methods order, each source (in order of first
	// appearance, then SourceAll) and each frequency (month before quarter,
	// then FreqAll).
	Slices []Slice `json:"slices"`
	// Groups are the aggregates per method, group (a series of the open
	// data, a family of the synthetic ones), source and frequency: for each
	// group, source and frequency in order of first appearance, each
	// method. They leave out the record by lead time.
	Groups []Slice `json:"groups"`
	// Accuracy compares, per source and frequency, the mean MASE of auto
	// with seasonal-naive and with the best single method.
	Accuracy []MASESummary `json:"accuracy"`
	// Failures lists the fits that failed, per series and method.
	Failures []Failure `json:"failures"`
}

// Settings records the resolved configuration.
type Settings struct {
	Methods    []string  `json:"methods"`
	Coverages  []float64 `json:"coverages"`
	Bands      string    `json:"bands"`
	Step       string    `json:"step"`
	MinSeasons int       `json:"min_seasons"`
	MaxOrigins int       `json:"max_origins"`
	Leads      []int     `json:"leads"`
	Service    float64   `json:"service"`
}

// CaseInfo describes one evaluated series.
type CaseInfo struct {
	Name    string `json:"name"`
	Source  string `json:"source"`
	Group   string `json:"group"`
	Freq    string `json:"freq"`
	Length  int    `json:"length"`
	Horizon int    `json:"horizon"`
	// Origins are the first held-out periods, latest first.
	Origins []string `json:"origins"`
}

// Slice aggregates one method over a set of origins.
type Slice struct {
	Method string `json:"method"`
	Source string `json:"source"`
	Freq   string `json:"freq"`
	// Group is the series or family of a per-group row; empty in Slices.
	Group string `json:"group,omitempty"`
	// Series counts the series with at least one fitted origin.
	Series int `json:"series"`
	// Origins counts the fitted origins and Failed the origins where the
	// method could not be fitted.
	Origins int `json:"origins"`
	Failed  int `json:"failed"`
	// Bands has one entry per nominal coverage, in Settings order.
	Bands []Band `json:"bands"`
	// MASE is the mean over origins of the MASE of the H-step forecasts;
	// MASEOrigins counts the origins with a finite MASE.
	MASE        float64 `json:"mase"`
	MASEOrigins int     `json:"mase_origins"`
	// Service has one entry per lead time, in Settings order.
	Service []Service `json:"service"`
	// Chosen counts the methods auto chose, in method order (auto only).
	Chosen []Choice `json:"chosen,omitempty"`
}

// Band is the out-of-sample record of the bands at one nominal coverage.
type Band struct {
	Nominal float64 `json:"nominal"`
	// N counts the held-out values with a band; Inside, Below and Above
	// split them (a value on a bound is inside); NoBand counts the values
	// whose band was not finite.
	N      int `json:"n"`
	Inside int `json:"inside"`
	Below  int `json:"below"`
	Above  int `json:"above"`
	NoBand int `json:"no_band"`
	// Share is Inside/N.
	Share float64 `json:"share"`
	// ByLead[k] is the record at lead time k+1, up to the longest H of
	// the cases (nil in Results.Groups).
	ByLead []Lead `json:"by_lead,omitempty"`
}

// Lead is the band record at one lead time.
type Lead struct {
	Lead   int     `json:"lead"`
	N      int     `json:"n"`
	Inside int     `json:"inside"`
	Share  float64 `json:"share"`
}

// Service is the realised service of the safety stock at one lead time:
// the share of origins whose demand over the lead time was covered.
type Service struct {
	Lead    int     `json:"lead"`
	Target  float64 `json:"target"`
	N       int     `json:"n"`
	Covered int     `json:"covered"`
	Share   float64 `json:"share"`
	// NoStock counts the origins whose safety stock was not finite.
	NoStock int `json:"no_stock"`
}

// Choice counts how often auto chose a method.
type Choice struct {
	Method string `json:"method"`
	Count  int    `json:"count"`
}

// MASESummary compares mean MASE over one source and frequency. The best
// single method is the method other than auto with the lowest mean MASE
// among those fitted at every origin of the slice (so that every mean in
// the comparison covers the same origins); Candidates counts them.
type MASESummary struct {
	Source        string  `json:"source"`
	Freq          string  `json:"freq"`
	Origins       int     `json:"origins"`
	Auto          float64 `json:"auto"`
	SeasonalNaive float64 `json:"seasonal_naive"`
	Best          string  `json:"best"`
	BestMASE      float64 `json:"best_mase"`
	Candidates    int     `json:"candidates"`
}

// Failure records the origins of one series where one method could not be
// fitted, with the first error.
type Failure struct {
	Series  string `json:"series"`
	Method  string `json:"method"`
	Origins int    `json:"origins"`
	Error   string `json:"error"`
}
