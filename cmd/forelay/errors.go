package main

import (
	"errors"
	"fmt"
	"forelay/scenario/data"
	"strings"

	"forelay/forecast"
)

// flagError is a mistake on the command line; it prints a usage hint and
// exits with code 2.
type flagError struct{ err error }

func (e *flagError) Error() string { return e.err.Error() }
func (e *flagError) Unwrap() error { return e.err }

func flagErrorf(format string, a ...any) error {
	return &flagError{err: fmt.Errorf(format, a...)}
}

// inputError marks an error caused by the user's input files; exit code 2.
type inputError struct{ err error }

func (e *inputError) Error() string { return e.err.Error() }
func (e *inputError) Unwrap() error { return e.err }

// alertError is a deliberate non-zero exit asked for with --fail-on.
type alertError struct{ msg string }

func (e *alertError) Error() string { return e.msg }

func exitCode(err error) int {
	var (
		fe *flagError
		ie *inputError
		pe *data.ParseError
		ts *forecast.TooShortError
		ae *alertError
	)
	switch {
	case errors.As(err, &ae):
		return exitAlert
	case errors.As(err, &fe), errors.As(err, &ie), errors.As(err, &pe), errors.As(err, &ts):
		return exitInput
	case strings.HasPrefix(err.Error(), "unknown command"), strings.HasPrefix(err.Error(), "accepts "),
		strings.HasPrefix(err.Error(), "requires "):
		return exitInput
	}
	return exitInternal
}
