package main

import (
	"fmt"
	"strconv"
	"strings"
	"time"

	"cardinal/catalog"
)

// lockNoticeAfter is how long a write may wait for the catalog's lock
// before a terminal is told that it waits.
const lockNoticeAfter = time.Second

// waitNotice runs a write to the catalog at path; when it has not
// finished after lockNoticeAfter and stderr is a terminal, it says once
// that it waits for another writer and for how long at most
// (catalog.LockWait, CARDINAL_LOCK_WAIT), so that a wait is never silent.
func waitNotice(e *env, path string, write func() error) error {
	if !e.ErrTerminal {
		return write()
	}
	done := make(chan struct{})
	go func() {
		select {
		case <-done:
		case <-time.After(lockNoticeAfter):
			fmt.Fprintf(e.Err, "waiting for another cardinal command to finish writing %s (at most %s; Ctrl-C stops, changing nothing)...\n", path, catalog.LockWait())
		}
	}()
	err := write()
	close(done)
	return err
}

// setLockWait reads CARDINAL_LOCK_WAIT, the seconds a write waits for
// another cardinal command that writes the same catalog (0 to 3600; unset,
// catalog.DefaultLockWait): a script that would rather fail at once sets
// 0, and tests set a short wait.
func setLockWait(e *env) error {
	v := ""
	if e.Getenv != nil {
		v = strings.TrimSpace(e.Getenv("CARDINAL_LOCK_WAIT"))
	}
	if v == "" {
		catalog.SetLockWait(catalog.DefaultLockWait)
		return nil
	}
	s, err := strconv.ParseFloat(strings.TrimSuffix(v, "s"), 64)
	if err != nil || !(s >= 0 && s <= 3600) {
		return usageErrorf("CARDINAL_LOCK_WAIT=%q: give the seconds a write may wait for another cardinal command, from 0 to 3600 (unset, %s)", v, catalog.DefaultLockWait)
	}
	catalog.SetLockWait(time.Duration(s * float64(time.Second)))
	return nil
}
