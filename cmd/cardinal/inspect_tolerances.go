package main

import (
	"context"
	"strconv"

	"cardinal/catalog"
	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/present"
)

// inspectTolerances are the tolerances a part that states none takes, and
// what they are called: the catalog's own (set with 'catalog tolerances'),
// as the build study gives them to its parts and to a file's parts once
// imported. For a prescription file a catalog that cannot be read leaves
// the program's defaults; for catalog parts it is an error.
func (o *inspectOptions) inspectTolerances() (optics.Tolerances, string, error) {
	t, word, err := o.catalogTolerances()
	if err != nil && len(o.CatalogParts) == 0 {
		return optics.DefaultTolerances, "default", nil
	}
	return t, word, err
}

func (o *inspectOptions) catalogTolerances() (optics.Tolerances, string, error) {
	loc, err := locateCatalog(o.db, o.env)
	if err != nil {
		return optics.Tolerances{}, "", err
	}
	ok, err := loc.exists()
	if err != nil || !ok {
		// The demo catalog, used until there is one, sets none.
		return optics.DefaultTolerances, "catalog default", err
	}
	s, err := catalog.OpenRead(loc.Path)
	if err != nil {
		return optics.Tolerances{}, "", catalogError(err)
	}
	defer s.Close()
	t, err := s.PartTolerances(context.Background())
	if err != nil {
		return optics.Tolerances{}, "", catalogError(err)
	}
	return t, "catalog default", nil
}

// toleranceRows are the figure table's rows of the tolerances the build
// study gives the part, each with where it comes from.
func toleranceRows(r search.Inspection) [][]string {
	t, from := r.Tolerances, r.TolerancesFrom
	rows := [][]string{
		{"EFL tolerance (build study)", "+-" + present.Fixed(t.EFLPct, 2), "% (" + from["efl_pct"] + ")"},
		{"thickness tolerance", "+-" + present.Fixed(t.Thickness, 3), "mm (" + from["thickness_mm"] + ")"},
		{"index tolerance", "+-" + strconv.FormatFloat(t.Index, 'g', -1, 64), "(" + from["index"] + ")"},
	}
	if t.RadiusPct > 0 {
		rows = append(rows, []string{"radius tolerance, each", "+-" + present.Fixed(t.RadiusPct, 2), "% (" + from["radius_pct"] + ")"})
	}
	return rows
}
