package forecast

import "io"

// Temporary stand-ins until the method files land.

func fitETS(y []float64, m Method, cfg Config) (Model, error)         { return nil, nil }
func etsMinPoints(m Method, season int) int                           { return 2 }





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
