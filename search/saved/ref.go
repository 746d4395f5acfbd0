package saved

import (
	"strconv"
	"strings"
)

// DemoPrefix marks a reference to a search run on the built-in demo
// catalog ("demo:3", "demo:last"), which stays reachable after the user
// imports a catalog of their own.
const DemoPrefix = "demo:"

// A Ref names a saved search: a number or the latest ("last"), in the
// user's catalog or, with Demo, in the kept demo catalog.
type Ref struct {
	Demo bool
	ID   int64 // 0 for the latest
}

// ParseRef reads a reference as people type it: "7", "last", "demo:7",
// "demo:last" (case and spaces around it do not matter).
func ParseRef(s string) (Ref, error) {
	t := strings.TrimSpace(s)
	var r Ref
	if len(t) >= len(DemoPrefix) && strings.EqualFold(t[:len(DemoPrefix)], DemoPrefix) {
		r.Demo, t = true, strings.TrimSpace(t[len(DemoPrefix):])
	}
	if strings.EqualFold(t, "last") {
		return r, nil
	}
	id, err := strconv.ParseInt(t, 10, 64)
	if err != nil || id < 1 {
		return Ref{}, &RefError{Ref: s}
	}
	r.ID = id
	return r, nil
}

// String is the reference as people type it.
func (r Ref) String() string {
	s := "last"
	if r.ID > 0 {
		s = strconv.FormatInt(r.ID, 10)
	}
	if r.Demo {
		return DemoPrefix + s
	}
	return s
}

// Number is the reference within its catalog: the number, or "last".
func (r Ref) Number() string {
	if r.ID > 0 {
		return strconv.FormatInt(r.ID, 10)
	}
	return "last"
}
