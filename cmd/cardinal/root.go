package main

import (
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
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
	}
	root.SetOut(e.Out)
	root.SetErr(e.Err)
	root.SetIn(e.In)
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return usageErrorf("%v (see '%s --help')", err, c.CommandPath())
	})
	root.AddCommand(commands(e)...)
	root.AddCommand(topicCommands()...)
	root.SetGlobalNormalizationFunc(formerFlagNames)
	wrapHelp(root, e)
	addDBFlag(root)
	addCompletions(root, e)
	return root
}

// execute runs the command line and returns the exit code; every message
// printed is ours.
func execute(args []string, e *env) int {
	root := newRootCmd(e)
	root.SetArgs(args)
	err := root.Execute()
	if err != nil {
		msg := err.Error()
		if strings.HasPrefix(msg, "unknown command") || strings.HasPrefix(msg, "unknown flag") ||
			strings.Contains(msg, "accepts") && strings.Contains(msg, "arg(s)") {
			err = usageErrorf("%s (see 'cardinal --help')", msg)
		}
		notef(e, "cardinal: %v\n", err)
	}
	return exitCode(err)
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
