// Package plan builds the adjusted plan of a scenario file: Read reads
// the history the file names (and the digests of the inputs), Build takes
// the known past events out of the history, fits the baseline to what is
// left, learns effects from past occurrences and lays each scenario's
// future events on the baseline, with bands and the floor. Build is pure:
// it reads no file and changes neither the file nor the inputs. TrackPlan
// and Tracking follow new actuals against a plan.
package plan
