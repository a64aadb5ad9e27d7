// Package forecast holds the numerical engine of forelay: series and their
// periods, history files, baseline methods, fitting, backtests, accuracy
// measures, error bands and the maths of tracking forecasts against actuals.
package forecast
