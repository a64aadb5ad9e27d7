// Package supply sets simulated demand against what can be made and held:
// capacity per period and the risk of breaching it, stock under frozen
// production (with overload reported per period), the pre-build backward
// pass before a disruption, safety stock for a cycle service level, and
// the comparison of scenarios.
//
// Stress, SizeBuffer and CompareScenarios are the runs of the stress,
// buffer and compare commands: each takes a plan or its simulation and a
// plain settings struct and returns everything the run computes (a
// StressRun, BufferRun or CompareRun), which package report turns into
// text, JSON, CSV and charts. The package draws no random numbers and
// formats no reports; its only sentences are the warnings and notes of a
// run.
package supply
