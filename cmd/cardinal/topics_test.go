package main

import (
	"fmt"
	"regexp"
	"strings"
	"testing"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"cardinal/importers"
	"cardinal/search"
)

// Every flag the glossary names exists on some command under that name, or
// is a former name that resolves to one: the glossary cannot drift from the
// flags.
func TestGlossaryFlagsExist(t *testing.T) {
	root := newRootCmd(&env{Getenv: func(string) string { return "" }})
	have := map[string]bool{}
	var walk func(c *cobra.Command)
	walk = func(c *cobra.Command) {
		c.Flags().VisitAll(func(f *pflag.Flag) { have[f.Name] = true })
		c.PersistentFlags().VisitAll(func(f *pflag.Flag) { have[f.Name] = true })
		for _, s := range c.Commands() {
			walk(s)
		}
	}
	walk(root)
	b, err := helpTopics.ReadFile("help/glossary.txt")
	if err != nil {
		t.Fatal(err)
	}
	for _, m := range regexp.MustCompile(`--([a-z][a-z-]*[a-z])`).FindAllStringSubmatch(string(b), -1) {
		name := m[1]
		if now, ok := formerNames[name]; ok {
			name = now
		}
		if name == "quantity" || name == "field" { // former names of request, report and draw flags
			continue
		}
		if !have[name] {
			t.Errorf("the glossary names --%s, which no command has", m[1])
		}
	}
	if !strings.Contains(string(b), "back_clearance_mm") {
		t.Errorf("the glossary lacks the back clearance key")
	}
}

// Former flag names still set the new flag.
func TestFormerFlagNames(t *testing.T) {
	var got findOptions
	cmd := newFindCmd(&env{Getenv: func(string) string { return "" }}, func(o *findOptions) error { got = *o; return nil })
	cmd.Flags().SetNormalizeFunc(formerFlagNames)
	cmd.SetArgs([]string{"--efl", "50", "--bfd-min", "12", "--length-max", "90", "--drawer-only"})
	if err := cmd.Execute(); err != nil {
		t.Fatal(err)
	}
	if got.Req.BFDMin != 12 || got.Req.LengthMax != 90 || !got.Req.DrawerOnly {
		t.Errorf("former names: back clearance %g, envelope %g, in drawer %v", got.Req.BFDMin, got.Req.LengthMax, got.Req.DrawerOnly)
	}
}

// The csv topic lists every limit of the input files as the readers check
// it (importers.Limits): the help cannot drift from the readers.
func TestCSVTopicLimits(t *testing.T) {
	b, err := helpTopics.ReadFile("help/csv.txt")
	if err != nil {
		t.Fatal(err)
	}
	for _, l := range importers.Limits() {
		row := "| " + l.What + " | " + l.String() + " |"
		if !strings.Contains(string(b), row) {
			t.Errorf("help/csv.txt lacks the row %q", row)
		}
	}
}

// The finding topic lists the valid range of every requirement number as
// the search checks it (search.Ranges).
func TestFindingTopicRanges(t *testing.T) {
	b, err := helpTopics.ReadFile("help/finding.txt")
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range search.Ranges() {
		row := fmt.Sprintf("| %s | `%s` | %s |", flagName(r.Key), r.Key, r)
		if !strings.Contains(string(b), row) {
			t.Errorf("help/finding.txt lacks the row %q", row)
		}
	}
}
