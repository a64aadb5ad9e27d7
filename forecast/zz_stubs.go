package forecast

// Temporary stand-ins until the method files land.

func fitETS(y []float64, m Method, cfg Config) (Model, error) { return nil, nil }
func etsMinPoints(m Method, season int) int                   { return 2 }
