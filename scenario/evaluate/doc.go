// Package evaluate measures how forelay's baselines do out of sample: how
// often their bands hold the values that came later, how accurate their
// forecasts are, and how often a safety stock sized from them covers the
// demand of a lead time.
//
// It is the measuring instrument of the project, run the way a planner lives
// with a plan: fit on the history up to an origin, forecast, then compare
// with what happened next. For each series (a Case) it chooses rolling
// origins (Origins): the last H periods are held out first (H from the
// frequency, 12 months or 8 quarters), then the origin steps back by H while
// the data before it still hold at least three seasons, up to five origins
// per series. At every origin each method is fitted with forecast.Fit on the
// data before the origin alone, as `forelay fit --method M` would fit them,
// and forecasts H periods with bands at each nominal coverage
// (forecast.ZForCoverage and Result.Forecast). Run records, pooled over
// origins and lead times and per lead time:
//
//   - the share of held-out values inside each band, and the counts below
//     and above it;
//
//   - the MASE of the H-step forecasts, the mean absolute error divided by
//     the in-sample seasonal-naive mean absolute difference of the training
//     part (forecast.MASEScale), averaged over origins;
//
//   - the realised service of a safety stock: for a lead time of L periods
//     the held-out demand of the first L periods is covered when
//
//     sum(actual[0:L]) <= sum(forecast[0:L]) + SS,
//
//     with SS from Config.SafetyStock (by default z sigma sqrt(L), sigma the
//     square root of the in-sample MSE and z the one-sided normal quantile of
//     the service level).
//
// The results are aggregated per method, source (open data or synthetic)
// and frequency, and per series (open data) or family (synthetic data) and
// frequency. The order of every list is fixed, so the same cases give
// byte-identical output.
//
// The cases come from two places: the open monthly and quarterly series
// that statsmodels ships (testdata/open, read with ReadOpen) and seeded
// synthetic series whose truth is known (Synthetic).
package evaluate
