package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"cardinal/importers"
	"cardinal/search"
)

// commands builds the top-level commands, in the order help lists them.
func commands(e *env) []*cobra.Command {
	return []*cobra.Command{
		newFindCmd(e, runFind),
		newInspectCmd(e, runInspect),
		newRequestCmd(e, runRequest),
		newDrawCmd(e, runDraw),
		newToleranceCmd(e, runTolerance),
		newReportCmd(e, runReport),
		newSearchesCmd(e),
		newCatalogCmd(e),
		newGlassCmd(e),
		newDrawerCmd(e),
		newVersionCmd(e),
	}
}

func newRootCmd(e *env) *cobra.Command {
	root := &cobra.Command{
		Use:   "cardinal",
		Short: "Find stock lenses that meet first-order optical requirements",
		Long: `cardinal keeps a catalog of lens prescriptions, computes every part's cardinal
points (focal, principal, nodal and anti-principal points of the thick lens),
and searches singlets and pairs of parts that meet a focal length, a
conjugate (track and magnification) or a beam-expansion requirement.

Lengths are in mm, wavelengths in nm; light travels left to right (+z).
Paraxial figures hold near the axis; check real-ray figures before you build.`,
		SilenceUsage:  true,
		SilenceErrors: true,
		// cobra's own default; SuggestionsFor reads the field as it is.
		SuggestionsMinimumDistance: 2,
	}
	root.SetOut(e.Out)
	root.SetErr(e.Err)
	root.SetIn(e.In)
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		if !c.HasParent() && c.Flags().NArg() > 0 {
			// "cardinal fnd --efl 50": the unknown word is the fault, not
			// the flag after it.
			return root.Args(c, c.Flags().Args())
		}
		return &flagError{c.CommandPath(), err}
	})
	// A word that is no command is our error, with cobra's suggestions.
	root.Args = func(c *cobra.Command, args []string) error {
		if len(args) == 0 {
			return nil
		}
		hint := ""
		if s := c.SuggestionsFor(args[0]); len(s) > 0 {
			hint = "; did you mean " + strings.Join(s, " or ") + "?"
		}
		return usageErrorf("unknown command %q%s (see 'cardinal --help')", args[0], hint)
	}
	root.RunE = func(c *cobra.Command, _ []string) error { return c.Help() }
	root.AddCommand(commands(e)...)
	root.AddCommand(topicCommands()...)
	root.SetGlobalNormalizationFunc(formerFlagNames)
	wrapHelp(root, e)
	addDBFlag(root)
	addCompletions(root, e)
	typedArgs(root)
	root.PersistentPreRunE = func(c *cobra.Command, args []string) error {
		if err := checkNumbers(c, args); err != nil {
			return err
		}
		return checkText(c, args)
	}
	return root
}

// typedArgs wraps every command's argument check so that a wrong number of
// arguments is a usage error naming the command's help.
func typedArgs(c *cobra.Command) {
	if c.Args != nil && c.HasParent() {
		check := c.Args
		c.Args = func(cmd *cobra.Command, args []string) error {
			if err := check(cmd, args); err != nil {
				return &flagError{cmd.CommandPath(), err}
			}
			return nil
		}
	}
	for _, sub := range c.Commands() {
		typedArgs(sub)
	}
}

// checkNumbers refuses, for every command, a number flag given as NaN,
// an infinity or a magnitude past 1e9 or below 1e-9 (zero aside): no
// figure of a lens bench needs them, and each would turn into a NaN or
// Inf downstream. Each command checks its own narrower ranges after this.
func checkNumbers(c *cobra.Command, _ []string) error {
	var bad error
	c.Flags().Visit(func(f *pflag.Flag) {
		if bad != nil {
			return
		}
		var vs []float64
		switch v := f.Value.(type) {
		case pflag.SliceValue:
			if f.Value.Type() != "float64Slice" {
				return
			}
			for _, s := range v.GetSlice() {
				x, _ := strconv.ParseFloat(s, 64)
				vs = append(vs, x)
			}
		default:
			if f.Value.Type() != "float64" {
				return
			}
			x, _ := strconv.ParseFloat(f.Value.String(), 64)
			vs = append(vs, x)
		}
		r, ranged := flagRange(f.Name)
		for _, x := range vs {
			if a := math.Abs(x); ranged && (math.IsNaN(x) || a > r.Max || a != 0 && a < r.Min) {
				bad = &flagError{c.CommandPath(), fmt.Errorf("--%s %g is outside %s; give a number in that range", f.Name, x, r)}
			} else if math.IsNaN(x) || math.IsInf(x, 0) || a > 1e9 || a != 0 && a < 1e-9 {
				bad = &flagError{c.CommandPath(), fmt.Errorf("--%s %g: want a finite number between 1e-9 and 1e9 in size (or 0)", f.Name, x)}
			} else if (f.Name == "wavelength" || f.Name == "band") && !(x >= 150 && x <= 20000) {
				bad = &flagError{c.CommandPath(), fmt.Errorf("--%s %g: want a wavelength of 150 to 20000 nm (leave --wavelength out for the d line, 587.5618 nm)", f.Name, x)}
			}
		}
	})
	return bad
}

// checkText refuses, for every command, a word of the command line (an
// argument or the value of a text flag) that holds a control character
// (NUL, escape, ...): no part name, supplier, location, note or file name
// needs one, and stored in the catalog it would break every table.
func checkText(c *cobra.Command, args []string) error {
	var bad error
	c.Flags().Visit(func(f *pflag.Flag) {
		var vs []string
		switch v := f.Value.(type) {
		case pflag.SliceValue:
			vs = v.GetSlice()
		default:
			if f.Value.Type() == "string" {
				vs = []string{f.Value.String()}
			}
		}
		for _, s := range vs {
			if bad == nil {
				bad = controlError(c, "--"+f.Name, s)
			}
		}
	})
	if bad != nil {
		return bad
	}
	for i, a := range args {
		if err := controlError(c, fmt.Sprintf("argument %d", i+1), a); err != nil {
			return err
		}
	}
	return nil
}

// controlError says where s holds a control character, nil if nowhere.
func controlError(c *cobra.Command, what, s string) error {
	at, name, ok := importers.HasControl(s)
	if !ok {
		return nil
	}
	switch r := []rune(s)[at-1]; {
	case r == '\n' || r == '\r':
		return &flagError{c.CommandPath(), fmt.Errorf("%s holds a line break at character %d; give it on one line", what, at)}
	}
	return &flagError{c.CommandPath(), fmt.Errorf("%s holds the control character %s at character %d; type plain text", what, name, at)}
}

// flagRange is the valid range of a number flag named as one of find's
// (search.Ranges): --na, --beam, --field-angle and the others keep one
// range in every command that takes them (find, inspect, draw, report).
// Zero passes, for each command to read as it documents.
func flagRange(name string) (search.Range, bool) {
	if name == "wavelength" || name == "band" {
		return search.Range{}, false // their own message below
	}
	for _, r := range search.Ranges() {
		if flagKeys[r.Key] == "--"+name {
			return r, true
		}
	}
	return search.Range{}, false
}

// execute runs the command line and returns the exit code; every message
// printed is ours.
func execute(args []string, e *env) int {
	root := newRootCmd(e)
	root.SetArgs(args)
	err := setLockWait(e)
	if err == nil {
		err = root.Execute()
	}
	msg, code := describe(err)
	if err != nil {
		notef(e, "cardinal: %s\n", msg)
	}
	return code
}

// formerNames maps the flag names of earlier versions to the glossary's
// ('cardinal help glossary'), so that scripts written for them still run;
// help shows only the new names.
var formerNames = map[string]string{
	"bfd-min":     "back-clearance-min",
	"wd-min":      "working-distance-min",
	"length-max":  "envelope-max",
	"drawer-only": "in-drawer",
}

func formerFlagNames(f *pflag.FlagSet, name string) pflag.NormalizedName {
	if name == "quantity" && (f.Name() == "request" || f.Name() == "report") {
		return "systems" // pieces keep --quantity in 'drawer set'
	}
	if now, ok := formerNames[name]; ok {
		return pflag.NormalizedName(now)
	}
	return pflag.NormalizedName(name)
}

// wrapHelp fits the flag lists of every help page to the width tables use
// (output.go): the terminal's, else COLUMNS, else 100.
func wrapHelp(root *cobra.Command, e *env) {
	cobra.AddTemplateFunc("wrappedFlags", func(f *pflag.FlagSet) string { return f.FlagUsagesWrapped(e.width()) })
	t := root.UsageTemplate()
	for _, set := range []string{".LocalFlags", ".InheritedFlags"} {
		t = strings.ReplaceAll(t, "{{"+set+".FlagUsages | trimTrailingWhitespaces}}", "{{wrappedFlags "+set+" | trimTrailingWhitespaces}}")
	}
	root.SetUsageTemplate(t)
}
