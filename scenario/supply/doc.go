// Package supply sets simulated demand against what can be made and held:
// capacity per period and the risk of breaching it, stock under frozen
// production (with overload reported per period), the pre-build backward
// pass before a disruption, safety stock for a cycle service level, and
// the comparison of scenarios.
package supply
