package main

import (
	"fmt"
	"time"

	"cardinal/catalog"
)

// lockNoticeAfter is how long a write may wait for the catalog's lock
// before a terminal is told that it waits.
const lockNoticeAfter = time.Second

// waitNotice runs a write to the catalog at path; when it has not
// finished after lockNoticeAfter and stderr is a terminal, it says once
// that it waits for another writer and for how long at most
// (catalog.LockWait), so that a wait is never silent.
func waitNotice(e *env, path string, write func() error) error {
	if !e.ErrTerminal {
		return write()
	}
	done := make(chan struct{})
	go func() {
		select {
		case <-done:
		case <-time.After(lockNoticeAfter):
			fmt.Fprintf(e.Err, "waiting for another cardinal command to finish writing %s (at most %s; Ctrl-C stops, changing nothing)...\n", path, catalog.LockWait)
		}
	}()
	err := write()
	close(done)
	return err
}
