package main

import (
	"errors"
	"fmt"
	"io/fs"

	"github.com/spf13/pflag"

	"cardinal/catalog"
	"cardinal/importers"
	"cardinal/search"
	"cardinal/search/plots"
)

// Exit codes, one place for all commands.
const (
	exitOK       = 0
	exitInternal = 1 // a fault of the program itself, never of the user's input
	exitUsage    = 2 // bad flags, arguments, input files or catalog files
	exitNotFound = 3 // a named part, search or file does not exist
	exitNoResult = 4 // nothing met the requirements
)

// cmdError is an error with the exit code it maps to. It keeps the error
// it carries (Unwrap), never its text alone.
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

// A namedError renders a requirement error with the names the user gave
// its fields: --efl for a flag, "efl_mm" in FILE for a spec-file key.
type namedError struct {
	err  *search.RequirementError
	name func(key string) string
}

func (e *namedError) Error() string { return e.err.RenderWith(e.name) }
func (e *namedError) Unwrap() error { return e.err }

// A flagError is cobra's or pflag's complaint about the command line, with
// the command whose help to see.
type flagError struct {
	cmdPath string
	err     error
}

func (e *flagError) Error() string {
	return fmt.Sprintf("%s (see '%s --help')", flagText(e.err), e.cmdPath)
}
func (e *flagError) Unwrap() error { return e.err }

// flagText says in words what is wrong with a flag, from pflag's typed
// errors (never from its message text).
func flagText(err error) string {
	var iv *pflag.InvalidValueError
	var nx *pflag.NotExistError
	var vr *pflag.ValueRequiredError
	switch {
	case errors.As(err, &iv):
		return fmt.Sprintf("--%s %q: want %s", iv.GetFlag().Name, iv.GetValue(), wantOf(iv.GetFlag()))
	case errors.As(err, &nx) && nx.GetSpecifiedShortnames() != "":
		// pflag names the one letter it does not know, from -xyz.
		return fmt.Sprintf("unknown flag -%s", nx.GetSpecifiedName())
	case errors.As(err, &nx):
		return fmt.Sprintf("unknown flag %s", dashed(nx.GetSpecifiedName(), nx.GetSpecifiedShortnames()))
	case errors.As(err, &vr):
		return fmt.Sprintf("flag %s needs a value (%s)", dashed(vr.GetSpecifiedName(), vr.GetSpecifiedShortnames()), wantOf(vr.GetFlag()))
	}
	return err.Error()
}

func dashed(name, short string) string {
	if name != "" {
		return "--" + name
	}
	return "-" + short
}

// wantOf says what kind of value a flag takes.
func wantOf(f *pflag.Flag) string {
	if f == nil {
		return "a value"
	}
	switch f.Value.Type() {
	case "float64":
		return "a finite number such as 2.5"
	case "int", "int64", "uint", "uint64":
		return "a whole number"
	case "intSlice", "uintSlice":
		return "whole numbers separated by commas, such as 1,3"
	case "float64Slice":
		return "finite numbers separated by commas, such as 486.1,587.6"
	case "bool":
		return "true or false"
	case "stringSlice", "stringArray":
		return "words separated by commas"
	}
	return "a value"
}

// describe is the one place where an error becomes a message and an exit
// code: the typed errors of the domain packages map here, and anything
// else is a fault of the program (exit 1) that the message says to report.
func describe(err error) (string, int) {
	var (
		ce *cmdError
		fe *flagError
		ne *namedError
		re *search.RequirementError
		se *search.SpecError
		nf *catalog.NotFoundError
		oe *catalog.OpenError
		ie *catalog.ImportError
		le importers.FileErrors
		be *catalog.BusyError
		rf *catalog.RefError
		pe *fs.PathError
		fd *plots.FieldError
	)
	switch {
	case err == nil:
		return "", exitOK
	case errors.As(err, &ce):
		return ce.Error(), ce.code
	case errors.As(err, &fe):
		return fe.Error(), exitUsage
	case errors.As(err, &ne): // before re: the names the user gave
		return ne.Error(), exitUsage
	case errors.As(err, &re):
		return re.RenderWith(flagName), exitUsage
	case errors.As(err, &se):
		return se.Error(), exitUsage
	case errors.As(err, &nf):
		return nf.Error(), exitNotFound
	case errors.As(err, &oe):
		if oe.Missing {
			return oe.Error(), exitNotFound
		}
		return oe.Error(), exitUsage
	case errors.As(err, &be), errors.As(err, &rf):
		return err.Error(), exitUsage
	case errors.As(err, &ie), errors.As(err, &le):
		return err.Error(), exitUsage
	case errors.As(err, &fd):
		return err.Error(), exitUsage
	case errors.As(err, &pe):
		// The system refused a file operation (a full disk, a closed
		// pipe, a device): the machine's state, not a fault of cardinal.
		return fmt.Sprintf("could not %s %s (%s): check the path, its permissions and the free space, and retry", pe.Op, pe.Path, pe.Err), exitUsage
	}
	return "internal error (a fault of cardinal, not of your input; please report it with the command you ran): " + err.Error(), exitInternal
}

// exitCode maps an error to the process exit code.
func exitCode(err error) int {
	_, code := describe(err)
	return code
}

// flagKeys maps the JSON keys of a requirement to the flags of find that
// set them; a key without a flag of its own is named as it is.
var flagKeys = map[string]string{
	"efl_mm": "--efl", "efl_tol": "--efl-tol", "track_mm": "--track", "magnification": "--mag",
	"mag_tol": "--mag-tol", "object_height_mm": "--object-height", "na": "--na", "working_distance_min_mm": "--working-distance-min",
	"expansion": "--expand", "expand_tol": "--expand-tol", "form": "--galilean or --keplerian",
	"beam_mm": "--beam", "back_clearance_min_mm": "--back-clearance-min", "envelope_max_mm": "--envelope-max",
	"diameter_max_mm": "--diameter-max", "gap_min_mm": "--gap-min", "elements": "--elements",
	"wavelength_nm": "--wavelength", "supplier": "--supplier", "in_drawer": "--in-drawer",
	"top": "--top", "prefer": "--prefer", "field_angle_deg": "--field-angle", "band_nm": "--band",
	"power_w": "--power", "kind": "a kind (--efl, --track with --mag, --expand or --waist-out)",
	"laser": "--laser", "waist_in_mm": "--waist-in", "waist_in_at_mm": "--waist-in-at", "m2": "--m2",
	"waist_out_at_mm": "--waist-out-at", "laser_exit_mm": "--laser-exit", "waist_out_mm": "--waist-out",
	"coupling_min": "--coupling-min",
}

// flagName names a requirement key by its flag.
func flagName(key string) string {
	if f, ok := flagKeys[key]; ok {
		return f
	}
	return fmt.Sprintf("%q", key)
}
