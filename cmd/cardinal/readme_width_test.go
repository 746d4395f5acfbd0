package main

import (
	"bufio"
	"os"
	"strings"
	"testing"

	"github.com/mattn/go-runewidth"
)

// readmeCommands are the cardinal command lines of the README's examples
// (lines of its code blocks that start with "cardinal ", "./cardinal " or
// "go run ./cmd/cardinal ", continued over lines ending in a backslash),
// without comments, in order.
func readmeCommands(t *testing.T) [][]string {
	t.Helper()
	f, err := os.Open("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var cmds [][]string
	in := false
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		for strings.HasSuffix(line, "\\") && sc.Scan() { // a command continued on the next line
			line = strings.TrimSuffix(line, "\\") + " " + strings.TrimSpace(sc.Text())
		}
		if strings.HasPrefix(line, "```") {
			in = !in
			continue
		}
		if !in {
			continue
		}
		line, _, _ = strings.Cut(line, " #")
		var args string
		for _, prefix := range []string{"cardinal ", "./cardinal ", "go run ./cmd/cardinal "} {
			if rest, ok := strings.CutPrefix(line, prefix); ok {
				args = rest
			}
		}
		if args == "" || strings.ContainsAny(args, "|>$<") {
			continue // not a cardinal command, or one that needs a shell
		}
		line = args
		cmds = append(cmds, strings.Fields(line))
	}
	return cmds
}

// Every README example that prints a table fits a 120-column terminal:
// its stdout and stderr, run on the demo catalog with COLUMNS=120.
// Examples that name files of the user's, or that write, are skipped.
func TestREADMEExamplesFit120Columns(t *testing.T) {
	if testing.Short() {
		t.Skip("runs every README example")
	}
	e, out, errb := storeEnv(t, map[string]string{"COLUMNS": "120"})
	ran := 0
	for _, args := range readmeCommands(t) {
		name := strings.Join(args, " ")
		if writes(args) {
			continue
		}
		code := runCLI(e, args...)
		if code != 0 && code != exitNoResult {
			continue // a file of the user's that the demo does not have
		}
		ran++
		for _, stream := range []string{out.String(), errb.String()} {
			for _, l := range strings.Split(stream, "\n") {
				if w := runewidth.StringWidth(l); w > 120 {
					t.Errorf("%s: a line of %d columns:\n%s", name, w, l)
				}
			}
		}
	}
	if ran < 5 {
		t.Errorf("only %d README examples ran; the README's examples should run on the demo catalog", ran)
	}
}

// writes tells whether a command line writes a file or changes a catalog,
// or prints machine output or a markdown document rather than a table.
func writes(args []string) bool {
	for _, a := range args {
		switch a {
		case "import", "remove", "set", "-o", "--output", "json", "csv", "md", "completion", "export":
			return true
		}
	}
	return false
}
