package present

import (
	"fmt"
	"strings"

	"cardinal/search"
)

// A GhostList is the ghost foci of one layout (a part, or a result's
// parts) and its name as a row shows it.
type GhostList struct {
	Name   string
	Ghosts []search.GhostFocus
}

// Ghosts is the one table of ghost foci that inspect --ghosts and the
// report show: one row per ghost, numbered from 1 in the order given, with
// the path of the light (which surfaces reflect, in which order), where it
// focuses, how concentrated it is, where the reflectances come from, the
// peak irradiance with a power, and the flags. named adds a column with
// each list's name (for several parts in one table).
func Ghosts(lists []GhostList, named bool) Table {
	t := Table{Columns: []Column{{Key: "ghost", Label: "#"}}}
	if named {
		t.Columns = append(t.Columns, Column{Key: "part", Label: "part"})
	}
	t.Columns = append(t.Columns,
		Column{Key: "surfaces", Label: "reflections"},
		Column{Key: "direction", Label: "goes"},
		Column{Key: "z_mm", Label: "focus at", Unit: "mm"},
		Column{Key: "radius_um", Label: "radius", Unit: "µm"},
		Column{Key: "reflectance", Label: "reflectance", Unit: "%"},
		Column{Key: "reflectance_from", Label: "from"},
		Column{Key: "concentration", Label: "concentration"},
		Column{Key: "peak_w_per_cm2", Label: "peak", Unit: "W/cm²"},
		Column{Key: "flags", Label: "flags", Note: true})
	for _, l := range lists {
		for _, g := range l.Ghosts {
			row := []Cell{Int(len(t.Rows) + 1)}
			if named {
				row = append(row, Text(l.Name))
			}
			flags := strings.Join(g.Flags, "; ")
			t.Add(append(row, Text(GhostPath(g)), Text(g.Direction), Num(g.Z, 2), Num(g.Radius, 2),
				Num(100*g.Reflectance, 3), Text(g.ReflectanceFrom), Num(g.Concentration, 1),
				OptNum(g.Peak, 0), Cell{Text: flags, Raw: flags})...)
		}
	}
	return t
}

// GhostPath names the surfaces a ghost's light reflects at, in the order
// it meets them: "surface 2", "surface 3, then 1".
func GhostPath(g search.GhostFocus) string {
	s := make([]string, len(g.Surfaces))
	for i, k := range g.Surfaces {
		s[i] = fmt.Sprint(k)
	}
	return "surface " + strings.Join(s, ", then ")
}
