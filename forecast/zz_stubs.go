package forecast

import "io"

// Temporary stand-ins until the method files land.

func fitETS(y []float64, m Method, cfg Config) (Model, error)         { return nil, nil }
func etsMinPoints(m Method, season int) int                           { return 2 }
func fitNaive(y []float64, cfg Config) (Model, error)                 { return nil, nil }
func fitSeasonalNaive(y []float64, cfg Config) (Model, error)         { return nil, nil }
func fitMovingAverage(y []float64, cfg Config) (Model, error)         { return nil, nil }
func fitWeightedMovingAverage(y []float64, cfg Config) (Model, error) { return nil, nil }
func fitLinearTrend(y []float64, cfg Config) (Model, error)           { return nil, nil }
func fitCroston(y []float64, cfg Config, sba bool) (Model, error)     { return nil, nil }
func simpleMinPoints(m Method, cfg Config) int                        { return 2 }

type Divisor int

const (
	DivisorNMinus1 Divisor = iota
	DivisorN
)

func (d Divisor) String() string { return "n-1" }

type Accuracy struct {
	N                                                int
	MAD, MSE, RMSE, MAPE, MASE, Bias, TrackingSignal float64
	MAPESkipped                                      int
	Divisor                                          Divisor
}

func Measure(actual, predicted []float64, scale float64, div Divisor) Accuracy { return Accuracy{} }
func MASEScale(train []float64, season int) float64                            { return 1 }

type FillMode int

const (
	FillNone FillMode = iota
	FillZero
	FillInterpolate
)

func ParseFillMode(s string) (FillMode, error) { return FillNone, nil }
func (m FillMode) String() string              { return "none" }

type ReadOptions struct {
	Freq Frequency
	Fill FillMode
}
type Filled struct {
	Series string
	Period Period
	Value  float64
	Line   int
}
type History struct {
	File   string
	Layout string
	Series []Series
	Filled []Filled
}

func ReadHistory(r io.Reader, name string, opt ReadOptions) (*History, error) { return nil, nil }
func (h *History) Lookup(name string) (Series, error)                         { return Series{}, nil }
func ParseDivisor(s string) (Divisor, error)                                  { return 0, nil }
