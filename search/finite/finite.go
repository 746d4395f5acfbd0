package finite

import (
	"fmt"
	"math"
	"reflect"
	"strconv"
)

// An Error names a number that is not finite and where it was found.
type Error struct {
	What  string  // the output, such as "the drawing"
	Path  string  // where in it, such as "Rays[2].Points[7].Y"
	Value float64 // NaN or an infinity
}

func (e *Error) Error() string {
	return fmt.Sprintf("%s would hold %v at %s; nothing was written (this is a fault of cardinal: please report it with the command you ran)", e.What, e.Value, e.Path)
}

// Check returns an *Error for the first float in v (followed through
// structs, pointers, slices, arrays, maps and interfaces) that is NaN or
// infinite, nil when there is none. A struct field tagged `finite:"-"`
// is skipped: a documented sentinel such as "NaN when angular" that no
// writer prints. what names the output in the message.
func Check(what string, v any) error {
	c := checker{what: what, seen: map[uintptr]bool{}}
	return c.walk(reflect.ValueOf(v), "")
}

type checker struct {
	what string
	seen map[uintptr]bool // pointers already walked, against cycles
}

func (c *checker) walk(v reflect.Value, path string) error {
	switch v.Kind() {
	case reflect.Float32, reflect.Float64:
		if f := v.Float(); math.IsNaN(f) || math.IsInf(f, 0) {
			return &Error{What: c.what, Path: root(path), Value: f}
		}
	case reflect.Complex64, reflect.Complex128:
		z := v.Complex()
		for _, f := range []float64{real(z), imag(z)} {
			if math.IsNaN(f) || math.IsInf(f, 0) {
				return &Error{What: c.what, Path: root(path), Value: f}
			}
		}
	case reflect.Pointer:
		if v.IsNil() || c.seen[v.Pointer()] {
			return nil
		}
		c.seen[v.Pointer()] = true
		return c.walk(v.Elem(), path)
	case reflect.Interface:
		if !v.IsNil() {
			return c.walk(v.Elem(), path)
		}
	case reflect.Struct:
		t := v.Type()
		for i := range t.NumField() {
			if t.Field(i).Tag.Get("finite") == "-" {
				continue
			}
			if err := c.walk(v.Field(i), path+"."+t.Field(i).Name); err != nil {
				return err
			}
		}
	case reflect.Slice, reflect.Array:
		for i := range v.Len() {
			if err := c.walk(v.Index(i), path+"["+strconv.Itoa(i)+"]"); err != nil {
				return err
			}
		}
	case reflect.Map:
		it := v.MapRange()
		for it.Next() {
			if err := c.walk(it.Value(), fmt.Sprintf("%s[%v]", path, it.Key())); err != nil {
				return err
			}
		}
	}
	return nil
}

func root(path string) string {
	if path == "" {
		return "the value itself"
	}
	if path[0] == '.' {
		return path[1:]
	}
	return path
}
