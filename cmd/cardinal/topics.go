package main

import (
	"embed"
	"strings"

	"github.com/spf13/cobra"
)

// helpTopics holds the reference pages 'cardinal help TOPIC' prints: what
// the README leaves to the program.
//
//go:embed help/*.txt
var helpTopics embed.FS

// topics lists the help topics: a name, a one-line summary, the file.
var topics = []struct{ name, short string }{
	{"glossary", "One name per idea: flags, columns, JSON and CSV keys"},
	{"figures", "What 'inspect' prints: every cardinal point, real-ray figures, JSON keys"},
	{"csv", "The neutral CSV formats: prescriptions, glasses, drawer"},
	{"sheets", "Spreadsheets and supplier CSVs through a mapping; glass aliases"},
	{"catalog-file", "Where the catalog lives, its tables, reading it with sqlite3"},
	{"finding", "How find solves, checks and ranks (the score and its weights)"},
	{"building", "Will it build? Stock tolerances, adjustment range, yield"},
	{"quality", "The real-ray figures, the diffraction-limited verdict, the sharpness term"},
	{"outputs", "Requests, build sheets, drawings, plots and reports"},
	{"lasers", "Laser beams: Gaussian focus and collimation, mode matching, ghost foci"},
	{"saved", "Saved searches, demo:N references, shell completion"},
}

// topicCommands are the help topics as cobra help-only commands.
func topicCommands() []*cobra.Command {
	var cs []*cobra.Command
	for _, t := range topics {
		b, err := helpTopics.ReadFile("help/" + t.name + ".txt")
		if err != nil {
			panic("cardinal: help topic " + t.name + " not embedded")
		}
		cs = append(cs, &cobra.Command{Use: t.name, Short: t.short, Long: strings.TrimRight(string(b), "\n")})
	}
	return cs
}
