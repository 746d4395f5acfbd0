package main

import (
	"io"
	"os"
	"time"

	"github.com/mattn/go-isatty"

	"cardinal/catalog"
)

// env carries the streams, the clock, the environment and the store, so
// that tests can run commands against buffers, read both streams back and
// hand a command a store of their own.
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
	// Stores opens the catalog a command reads or changes; nil opens the
	// file that --db, CARDINAL_DB or the default location names (db.go).
	Stores Stores
}

// Stores opens the catalog for the commands. Read opens it to read: the
// user's catalog, else the built-in demo one (openForRead). Write opens it
// to change it; with create, a missing catalog is created (openForWrite).
// flag is the --db flag, "" when not given. The command closes the store
// it gets.
type Stores interface {
	Read(flag string) (*catalog.Store, error)
	Write(flag string, create bool) (*catalog.Store, error)
}

// catalogFiles opens the catalog file the flag, the environment or the
// default location names.
type catalogFiles struct{ e *env }

func (c catalogFiles) Read(flag string) (*catalog.Store, error) { return openForRead(flag, c.e) }

func (c catalogFiles) Write(flag string, create bool) (*catalog.Store, error) {
	return openForWrite(flag, c.e, create)
}

// A creator is Stores that can also create the catalog for the import
// of parts that makes it (openForCreate).
type creator interface {
	Create(flag string) (*catalog.Store, error)
}

func (c catalogFiles) Create(flag string) (*catalog.Store, error) { return openForCreate(flag, c.e) }

// stores is the env's Stores, the catalog files when none is set.
func (e *env) stores() Stores {
	if e.Stores == nil {
		return catalogFiles{e}
	}
	return e.Stores
}

func newEnv() *env {
	e := &env{
		In: os.Stdin, Out: os.Stdout, Err: os.Stderr,
		Terminal:    isatty.IsTerminal(os.Stdout.Fd()),
		TermWidth:   terminalWidth(os.Stdout.Fd()),
		Now:         time.Now,
		Getenv:      os.Getenv,
		ErrTerminal: isatty.IsTerminal(os.Stderr.Fd()),
	}
	e.Stores = catalogFiles{e}
	return e
}
