// Package series names and selects the series of a history file.
//
// # Paths
//
// A series name may be a path of levels separated by "/", from the widest
// level to the narrowest, such as milk/whole-1l/grocer-north (a family, a
// product and a customer). Its depth is its number of levels. A name
// without "/" is a path of one level.
//
// # Patterns
//
// A pattern selects series by their paths. It is split at "/" into levels
// like a name, and matched level by level:
//
//	**      a level that is exactly ** matches any number of whole levels
//	        of the name, none included: milk/** matches milk, milk/whole-1l
//	        and milk/whole-1l/grocer-north
//	*       inside a level, matches any run of characters of one level
//	        (never a "/"), the empty run included: whole-* matches
//	        whole-1l, and */*/grocer-north matches every series of depth 3
//	        whose last level is grocer-north
//	other   every other character, "?", "[" and "\" included, matches
//	        itself only
//
// There are no escapes: a "*" in a pattern is always a wildcard, so a
// series whose name holds a "*" is selected by a pattern that matches it
// either way. A name without "*" is a pattern that matches that name only.
// Check says what is not a pattern: an empty pattern or level (a/, /a,
// a//b), and a "**" that is not a whole level (a**, **b).
package series
