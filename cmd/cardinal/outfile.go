package main

import (
	"errors"
	"io"
	"io/fs"
	"os"
	"path/filepath"
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
	case errors.Is(err, fs.ErrNotExist):
		return nil, usageErrorf("cannot write %s: the folder %s does not exist; create it or choose another path", path, filepath.Dir(path))
	case errors.Is(err, fs.ErrPermission):
		return nil, usageErrorf("cannot write %s: no permission to write there; choose another path", path)
	case err != nil:
		return nil, usageErrorf("cannot write %s (%s); choose another path", path, osReason(err))
	}
	return f, nil
}

// osReason is the system's reason for a failed file operation, without
// the operation and path Go puts before it.
func osReason(err error) string {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}

// closeOutput closes the output and, for a file, says what was written.
func closeOutput(e *env, w io.WriteCloser, path, what string) error {
	if err := w.Close(); err != nil {
		discardOutput(w, path)
		return usageErrorf("could not finish writing %s (%s): the disk may be full or gone; free space, or choose another path, and retry", path, osReason(err))
	}
	if path != "" && path != "-" {
		notef(e, "wrote %s to %s\n", what, path)
	}
	return nil
}

type nopCloser struct{ io.Writer }

func (nopCloser) Close() error { return nil }

// discardOutput closes an output whose writing failed and removes the
// file, so that no half-written file is left to be taken for a whole one.
// Only a regular file is removed, never a device such as /dev/full.
func discardOutput(w io.WriteCloser, path string) {
	w.Close()
	if st, err := os.Lstat(path); path != "" && path != "-" && err == nil && st.Mode().IsRegular() {
		os.Remove(path)
	}
}
