package main

import (
	"embed"
	"strings"
)

// helpFiles holds the long help of each command, kept as text beside the
// code so that it reads and changes as prose.
//
//go:embed help/*.txt
var helpFiles embed.FS

// helpText returns the long help of the command called name; a missing
// file is a programmer error.
func helpText(name string) string {
	b, err := helpFiles.ReadFile("help/" + name + ".txt")
	if err != nil {
		panic("forelay: no help for " + name)
	}
	return strings.TrimSuffix(string(b), "\n")
}
