package report

import (
	"fmt"
	"html/template"

	"cardinal/search"
	"cardinal/search/present"
	"cardinal/search/solution"
)

// reportGhosts is a pick's ghost section: every ghost focus of the layout
// (search.ResultGhosts), numbered as the drawing's G labels, in the one
// ghost table (present.Ghosts) that inspect --ghosts prints, flagged rows
// marked, and the notes that go with the figures.
type reportGhosts struct {
	Table template.HTML
	Notes []string
}

// ghostSection makes the ghost section of a pick of a laser requirement;
// nil for any other.
func ghostSection(s solution.Solution) *reportGhosts {
	req := s.Requirement
	if !req.IsLaser() {
		return nil
	}
	gs, virtual := search.ResultGhosts(s.System(), req, s.Result)
	t := present.Ghosts([]present.GhostList{{Name: solution.DescribeParts(s.Result.Parts), Ghosts: gs}}, false)
	g := &reportGhosts{Table: template.HTML(present.HTML(t, "ghosts", func(row int) string {
		if gs[row].Flagged() {
			return "flagged"
		}
		return ""
	}))}
	if len(gs) == 0 {
		g.Table = ""
		g.Notes = append(g.Notes, "No reflected beam comes to a real focus: every one only diverges.")
	} else if virtual > 0 {
		g.Notes = append(g.Notes, fmt.Sprintf("%d more reflected %s only diverge (a virtual focus) and %s not listed.", virtual,
			map[bool]string{true: "beam", false: "beams"}[virtual == 1], map[bool]string{true: "is", false: "are"}[virtual == 1]))
	}
	for _, n := range search.GhostNotes(req) {
		g.Notes = append(g.Notes, capitalise(n)+".")
	}
	return g
}

// capitalise makes a note a sentence.
func capitalise(s string) string {
	if s == "" || s[0] < 'a' || s[0] > 'z' {
		return s
	}
	return string(s[0]-'a'+'A') + s[1:]
}
