// Package sim is forelay's Monte Carlo: Simulate draws sample paths of
// each scenario of a plan (the baseline, an error path run through the
// model's own recursion and rescaled to the band variance, and every
// event drawn with its probability and size), in blocks of 1,024 paths
// with streams of their own, so that any part of a run can be computed
// apart and the result never depends on the number of workers.
package sim
