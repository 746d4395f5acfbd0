package main

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
)

// openOutput opens the -o file, refusing to replace one that exists
// unless forced; no file means standard output.
func openOutput(e *env, path string, force bool) (io.WriteCloser, error) {
	if path == "" || path == "-" {
		return nopCloser{e.Out}, nil
	}
	flags := os.O_WRONLY | os.O_CREATE | os.O_EXCL
	if force {
		flags = os.O_WRONLY | os.O_CREATE | os.O_TRUNC
	}
	f, err := os.OpenFile(path, flags, 0o644)
	switch {
	case errors.Is(err, fs.ErrExist):
		return nil, usageErrorf("%s exists: add --force to replace it, or choose another name", path)
	case err != nil:
		return nil, usageErrorf("cannot write %s: %v", path, err)
	}
	return f, nil
}

// closeOutput closes the output and, for a file, says what was written.
func closeOutput(e *env, w io.WriteCloser, path, what string) error {
	if err := w.Close(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if path != "" && path != "-" {
		notef(e, "wrote %s to %s\n", what, path)
	}
	return nil
}

type nopCloser struct{ io.Writer }

func (nopCloser) Close() error { return nil }
