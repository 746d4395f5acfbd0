package main

import (
	"context"
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cardinal/catalog"
	"cardinal/search"
	"cardinal/search/saved"
	"cardinal/search/solution"
)

// Shell completion: cobra's own `completion` command writes the script for
// bash, zsh, fish or PowerShell; these functions give it what only cardinal
// knows: saved search numbers, part names, the ranks of a search for
// --pick, and the values of --format, --prefer and --kind. The root adds
// them once its tree is built (root.go).

// Commands whose arguments are saved searches (all, or the first only)
// and those whose arguments are part names.
var (
	searchArgs     = map[string]bool{"request": true, "draw": true, "report": true, "searches show": true, "searches note": true, "searches remove": false}
	partArgs       = map[string]bool{"inspect": false, "catalog remove": true, "drawer set": true}
	preferValues   = []search.Prefer{search.PreferDraw, search.PreferShort, search.PreferCheap, search.PreferSharp, search.PreferRobust}
	completeNoFile = cobra.ShellCompDirectiveNoFileComp
)

// addCompletions registers the completion functions on every command of
// the tree under root.
func addCompletions(root *cobra.Command, e *env) {
	var walk func(c *cobra.Command)
	walk = func(c *cobra.Command) {
		path := strings.TrimPrefix(c.CommandPath(), root.Name()+" ")
		if firstOnly, ok := searchArgs[path]; ok {
			c.ValidArgsFunction = argsCompletion(firstOnly, func(db string) []string { return searchCompletions(e, db) })
		}
		if firstOnly, ok := partArgs[path]; ok {
			c.ValidArgsFunction = argsCompletion(firstOnly, func(db string) []string { return partCompletions(e, db) })
		}
		flagValues(c, "format", formats)
		flagValues(c, "kind", catalog.KindNames())
		prefs := make([]string, len(preferValues))
		for i, p := range preferValues {
			prefs[i] = string(p)
		}
		flagValues(c, "prefer", prefs)
		if c.Flags().Lookup("pick") != nil {
			c.RegisterFlagCompletionFunc("pick", func(c *cobra.Command, args []string, _ string) ([]string, cobra.ShellCompDirective) {
				if len(args) == 0 {
					return nil, completeNoFile
				}
				return rankCompletions(e, dbFlag(c), args[0]), completeNoFile
			})
		}
		for _, sub := range c.Commands() {
			walk(sub)
		}
	}
	walk(root)
}

// flagValues completes a flag of c, if it has one by that name, with fixed
// values.
func flagValues(c *cobra.Command, name string, values []string) {
	if c.LocalNonPersistentFlags().Lookup(name) == nil {
		return
	}
	c.RegisterFlagCompletionFunc(name, cobra.FixedCompletions(values, completeNoFile))
}

// argsCompletion completes the arguments (or the first only) from a list
// the catalog gives.
func argsCompletion(firstOnly bool, list func(db string) []string) cobra.CompletionFunc {
	return func(c *cobra.Command, args []string, _ string) ([]string, cobra.ShellCompDirective) {
		if firstOnly && len(args) > 0 {
			return nil, completeNoFile
		}
		return list(dbFlag(c)), completeNoFile
	}
}

// quietStore opens, for completion, the catalog a command would read
// without a word on stderr and without building anything: the user's
// catalog, else the kept demo catalog; nil when neither exists. With demo,
// the kept demo catalog only.
func quietStore(e *env, db string, demo bool) *catalog.Store {
	loc, err := locateCatalog(db, e)
	if err != nil {
		return nil
	}
	if ok, _ := loc.exists(); ok && !demo {
		st, err := catalog.Open(loc.Path)
		if err != nil {
			return nil
		}
		return st
	}
	st, _ := openKeptDemo(loc)
	return st
}

// searchCompletions lists "last" and the saved searches, newest first,
// each with its requirement in words; once the user has a catalog, the
// demo searches follow as demo:N.
func searchCompletions(e *env, db string) []string {
	out := []string{"last\tthe latest search"}
	for _, demo := range []bool{false, true} {
		st := quietStore(e, db, demo)
		if st == nil {
			continue
		}
		list, err := saved.New(st).List(context.Background())
		isDemo := isKeptDemo(st.Path())
		st.Close()
		if err != nil {
			continue
		}
		for i := len(list) - 1; i >= 0; i-- {
			s := list[i]
			ref := saved.Ref{Demo: demo, ID: s.ID}
			words := solution.DescribeRequirement(s.Requirement)
			if s.Note != "" {
				words = s.Note + " (" + words + ")"
			}
			out = append(out, fmt.Sprintf("%s\t%s", ref, words))
		}
		if demo || isDemo { // no user catalog: the demo searches were listed already
			break
		}
	}
	return out
}

// partCompletions lists every part name of the catalog a command would
// read (the demo catalog when the user has none).
func partCompletions(e *env, db string) []string {
	st := quietStore(e, db, false)
	if st == nil {
		var err error
		if st, err = catalog.OpenDemo(); err != nil {
			return nil
		}
	}
	defer st.Close()
	names, err := st.PartNames(context.Background())
	if err != nil {
		return nil
	}
	return names
}

// rankCompletions lists the ranks of a saved search with their parts.
func rankCompletions(e *env, db, refText string) []string {
	ref, err := saved.ParseRef(refText)
	if err != nil {
		return nil
	}
	st := quietStore(e, db, ref.Demo)
	if st == nil {
		return nil
	}
	defer st.Close()
	s, err := saved.New(st).Load(context.Background(), ref)
	if err != nil {
		return nil
	}
	var out []string
	for _, r := range s.Results {
		out = append(out, strconv.Itoa(r.Rank)+"\t"+solution.DescribeParts(r.Parts))
	}
	return out
}
