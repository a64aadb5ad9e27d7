// Package forecast holds the numerical engine of forelay: series and their
// periods, baseline methods, fitting, backtests, accuracy measures,
// calibrated error bands, the regression that cleans past events out of a
// history and the maths of tracking forecasts against actuals. It takes
// numbers and periods, never files: reading histories is package
// scenario/data's job.
package forecast
