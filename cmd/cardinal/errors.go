package main

import (
	"errors"
	"fmt"
)

// Exit codes, one place for all commands.
const (
	exitOK       = 0
	exitInternal = 1 // anything unexpected
	exitUsage    = 2 // bad flags, arguments or input files
	exitNotFound = 3 // a named part, search or file does not exist
	exitNoResult = 4 // nothing met the requirements
)

// cmdError is an error with the exit code it maps to.
type cmdError struct {
	code int
	err  error
}

func (e *cmdError) Error() string { return e.err.Error() }
func (e *cmdError) Unwrap() error { return e.err }

func usageErrorf(format string, a ...any) error {
	return &cmdError{exitUsage, fmt.Errorf(format, a...)}
}

func notFoundErrorf(format string, a ...any) error {
	return &cmdError{exitNotFound, fmt.Errorf(format, a...)}
}

func noResultErrorf(format string, a ...any) error {
	return &cmdError{exitNoResult, fmt.Errorf(format, a...)}
}

// exitCode maps an error to the process exit code.
func exitCode(err error) int {
	if err == nil {
		return exitOK
	}
	var ce *cmdError
	if errors.As(err, &ce) {
		return ce.code
	}
	return exitInternal
}
