package report

import (
	"math"

	"forelay/forecast"
)

// The JSON shapes of "forelay fit --json" (FitDoc) and of the baseline in
// plan.json. Field names are part of the
// documented interface (README, "JSON output"); keep them stable.

type accuracyJSON struct {
	N           int `json:"n"`
	MAD         Num `json:"mad"`
	MSE         Num `json:"mse"`
	RMSE        Num `json:"rmse"`
	MAPE        Num `json:"mape"`
	MAPESkipped int `json:"mape_skipped"`
	MASE        Num `json:"mase"`
	Bias        Num `json:"bias"`
	// BiasTest is the test of the one-step errors (in-sample, or one per
	// backtest origin); nil for the candidates. It replaces the tracking
	// signal, which grows with the number of errors and tests nothing.
	BiasTest *biasTestJSON `json:"bias_test,omitempty"`
}

// biasTestJSON is a forecast.BiasTest of the one-step errors.
type biasTestJSON struct {
	N           int  `json:"n"`
	Mean        Num  `json:"mean"`
	SE          Num  `json:"se"`
	Lag         int  `json:"lag"`
	T           Num  `json:"t"`
	P           Num  `json:"p"`
	Significant bool `json:"significant"`
}

func toAccuracyJSON(a forecast.Accuracy) accuracyJSON {
	return accuracyJSON{N: a.N, MAD: Num(a.MAD), MSE: Num(a.MSE), RMSE: Num(a.RMSE), MAPE: Num(a.MAPE),
		MAPESkipped: a.MAPESkipped, MASE: Num(a.MASE), Bias: Num(a.Bias)}
}

func toBiasTestJSON(b forecast.BiasTest) *biasTestJSON {
	return &biasTestJSON{N: b.N, Mean: Num(b.Mean), SE: Num(b.SE), Lag: b.Lag, T: Num(b.T), P: Num(b.P), Significant: b.Significant()}
}

// paramsJSON lists only the parameters that apply to the model.
func paramsJSON(p forecast.Params) map[string]Num {
	m := map[string]Num{}
	for _, kv := range []struct {
		k string
		v float64
	}{{"alpha", p.Alpha}, {"beta", p.Beta}, {"gamma", p.Gamma}, {"phi", p.Phi}} {
		if kv.v == kv.v {
			m[kv.k] = Num(kv.v)
		}
	}
	return m
}

// memberJSON is one member of a combination: its final fit on all the data.
type memberJSON struct {
	Method   string         `json:"method"`
	Params   map[string]Num `json:"params"`
	Settings string         `json:"settings,omitempty"`
}

type candidateJSON struct {
	Method   string         `json:"method"`
	Params   map[string]Num `json:"params"`
	Settings string         `json:"settings,omitempty"`
	Members  []string       `json:"members,omitempty"`
	Backtest *accuracyJSON  `json:"backtest"`
	AICc     Num            `json:"aicc"`
	Chosen   bool           `json:"chosen"`
	Skipped  string         `json:"skipped,omitempty"`
}

type backtestJSON struct {
	Train       int          `json:"train"`
	Origins     int          `json:"origins"`
	Accuracy    accuracyJSON `json:"accuracy"`
	HorizonRMSE []Num        `json:"horizon_rmse"`
}

type pointJSON struct {
	Period string `json:"period"`
	Value  Num    `json:"value"`
	Lower  Num    `json:"lower"`
	Upper  Num    `json:"upper"`
}

type bandsJSON struct {
	Z           Num              `json:"z"`
	Coverage    Num              `json:"coverage"`
	Mode        string           `json:"mode"`
	From        string           `json:"from"`
	Variance    string           `json:"variance"`
	Calibration *calibrationJSON `json:"calibration"`
}

// calibrationJSON says what calibrated bands rest on; null when the bands
// are the model's.
type calibrationJSON struct {
	Errors  int `json:"errors"`
	Origins int `json:"origins"`
	Leads   int `json:"leads"`
	Ratio   Num `json:"ratio"`
	// Selection is true when the errors are those of auto's (or the
	// combination's) own choices origin by origin.
	Selection bool `json:"selection"`
}

// toCalibrationJSON returns the calibration of r when src is calibrated,
// else nil.
func toCalibrationJSON(r *forecast.Result, src forecast.VarianceSource) *calibrationJSON {
	if src != forecast.VarCalibrated && src != forecast.VarFlatCalibrated {
		return nil
	}
	c := r.Calibration()
	ratio := Num(c.Ratio)
	if !c.Shaped {
		ratio = Num(math.NaN()) // no model variance to compare with: null
	}
	return &calibrationJSON{Errors: c.Errors, Origins: c.Origins, Leads: c.Leads, Ratio: ratio, Selection: c.Selection}
}

// FitDoc is one fitted series as JSON.
type FitDoc struct {
	Series     string          `json:"series"`
	Period     string          `json:"period"`
	Start      string          `json:"start"`
	Method     string          `json:"method"`
	Auto       bool            `json:"auto"`
	Selection  string          `json:"selection,omitempty"`
	Metric     string          `json:"metric,omitempty"`
	Settings   string          `json:"settings,omitempty"`
	Season     int             `json:"season"`
	Params     map[string]Num  `json:"params"`
	Members    []memberJSON    `json:"members,omitempty"`
	N          int             `json:"n"`
	SSE        Num             `json:"sse"`
	Accuracy   accuracyJSON    `json:"accuracy"`
	MSEDivisor string          `json:"mse_divisor"`
	Backtest   *backtestJSON   `json:"backtest"`
	Candidates []candidateJSON `json:"candidates,omitempty"`
	Bands      bandsJSON       `json:"bands"`
	Forecast   []pointJSON     `json:"forecast"`
	Flags      []string        `json:"flags"`
	Warnings   []string        `json:"warnings"`
}

// Bands are the band settings a fit is reported with.
type Bands struct {
	Z    float64
	Mode forecast.BandMode
	From forecast.BandSource
}

// Fit returns the document of one fitted series (one line of
// "forelay fit --json") with its forecast for horizon periods.
func Fit(r *forecast.Result, horizon int, b Bands) FitDoc {
	o := FitDoc{
		Series: r.Series.Name, Period: r.Series.Freq().String(), Start: r.Series.Start.String(),
		Method: r.Method.String(), Auto: r.Auto, Settings: r.Model.Describe(), Season: r.Config.Season,
		Params: paramsJSON(r.Model.Params()), N: r.Series.Len(), SSE: Num(r.SSE),
		Accuracy: toAccuracyJSON(r.Accuracy), MSEDivisor: r.Accuracy.Divisor.String(),
		Flags: List(r.Flags()), Warnings: List(r.Warnings()),
	}
	o.Accuracy.BiasTest = toBiasTestJSON(r.Bias)
	for _, md := range forecast.Members(r.Model) {
		o.Members = append(o.Members, memberJSON{Method: md.Method().String(), Params: paramsJSON(md.Params()), Settings: md.Describe()})
	}
	if r.Auto {
		o.Selection, o.Metric = r.Select.String(), r.Metric.String()
	}
	if bt := r.Backtest; bt != nil {
		rm := make([]Num, len(bt.HorizonMSE))
		for i, v := range bt.HorizonMSE {
			rm[i] = Num(math.Sqrt(v))
		}
		o.Backtest = &backtestJSON{Train: bt.Train, Origins: bt.Origins, Accuracy: toAccuracyJSON(bt.Accuracy), HorizonRMSE: rm}
		o.Backtest.Accuracy.BiasTest = toBiasTestJSON(bt.Bias)
	}
	for _, c := range r.Candidates {
		cj := candidateJSON{Method: c.Method.String(), Params: paramsJSON(c.Params), Settings: c.Describe,
			AICc: Num(c.AICc), Chosen: c.Chosen, Skipped: c.Skipped}
		for _, m := range c.Members {
			cj.Members = append(cj.Members, m.String())
		}
		if c.Backtest != nil {
			a := toAccuracyJSON(*c.Backtest)
			cj.Backtest = &a
		}
		o.Candidates = append(o.Candidates, cj)
	}
	_, src := r.VarianceFrom(horizon, b.Mode, b.From)
	o.Bands = bandsJSON{Z: Num(b.Z), Coverage: Num(forecast.Coverage(b.Z)), Mode: b.Mode.String(), From: b.From.String(),
		Variance: string(src), Calibration: toCalibrationJSON(r, src)}
	for _, p := range r.ForecastFrom(horizon, b.Z, b.Mode, b.From) {
		o.Forecast = append(o.Forecast, pointJSON{Period: p.Period.String(), Value: Num(p.Value), Lower: Num(p.Lower), Upper: Num(p.Upper)})
	}
	return o
}
