package supply

// NormalBreach returns P(L > c) and E[(L − c)+] for a load L normal with
// the given mean and standard deviation (the standard normal loss
// function), as PortfolioLoadRisk takes them: for a sd of 0, 1 and
// mean − c when the mean is above c, else 0 and 0. A merge of shards
// (package shard) calls it on loads it has summed itself.
func NormalBreach(mean, sd, c float64) (p, shortfall float64) { return normalBreach(mean, sd, c) }
