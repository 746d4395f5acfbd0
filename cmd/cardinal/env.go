package main

import (
	"io"
	"os"
	"time"

	"github.com/mattn/go-isatty"
)

// env carries the streams, the clock and the store location, so that tests
// can run commands against buffers and read both streams back.
type env struct {
	In       io.Reader
	Out, Err io.Writer
	// Terminal is true when Out is a terminal (tables read by people);
	// false for pipes.
	Terminal bool
	// TermWidth is the terminal's width in characters, 0 when Out is not
	// a terminal (then COLUMNS, else a default, is used: output.go).
	TermWidth int
	// ErrTerminal is true when Err is a terminal (progress is shown there).
	ErrTerminal bool
	Now         func() time.Time
	// Getenv reads the environment (CARDINAL_DB, XDG_DATA_HOME, HOME).
	Getenv func(string) string
}

func newEnv() *env {
	return &env{
		In: os.Stdin, Out: os.Stdout, Err: os.Stderr,
		Terminal:    isatty.IsTerminal(os.Stdout.Fd()),
		TermWidth:   terminalWidth(os.Stdout.Fd()),
		Now:         time.Now,
		Getenv:      os.Getenv,
		ErrTerminal: isatty.IsTerminal(os.Stderr.Fd()),
	}
}
