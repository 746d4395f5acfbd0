package catalog

import (
	"context"
	"database/sql"
	"encoding/json"
	"errors"
	"fmt"
	"strings"

	"cardinal/importers"
	"cardinal/optics"
)

// Glasses returns the glass table parts are resolved in: the built-in
// glasses, then the user's glasses (which take precedence over a built-in
// of the same name), then the user's glass aliases, each under its own
// name as the medium it stands for. Air and six-digit glass codes resolve
// as always.
func (s *Store) Glasses(ctx context.Context) (_ optics.GlassTable, err error) {
	defer s.classify(&err)
	t, err := readGlassTable(ctx, s.db)
	if err != nil {
		return nil, err
	}
	return t, addAliases(ctx, s.db, t)
}

// UserGlasses returns the user's glasses as imported, ordered by name.
func (s *Store) UserGlasses(ctx context.Context) (_ []importers.Glass, err error) {
	defer s.classify(&err)
	return readUserGlasses(ctx, s.db)
}

// readGlassTable is the glass table without the aliases: enough to read
// stored parts, which hold the glass itself, never an alias.
func readGlassTable(ctx context.Context, q querier) (optics.GlassTable, error) {
	user, err := readUserGlasses(ctx, q)
	if err != nil {
		return nil, err
	}
	t := optics.BuiltinGlasses()
	for _, g := range user {
		t.Add(g.Medium())
	}
	return t, nil
}

func readUserGlasses(ctx context.Context, q querier) ([]importers.Glass, error) {
	rows, err := q.QueryContext(ctx, "SELECT name, formula, coefficients, min_nm, max_nm, source FROM glasses ORDER BY name")
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var out []importers.Glass
	for rows.Next() {
		var r glassRow
		if err := rows.Scan(&r.name, &r.formula, &r.coefficients, &r.min, &r.max, &r.source); err != nil {
			return nil, err
		}
		g, err := r.glass()
		if err != nil {
			return nil, err
		}
		out = append(out, g)
	}
	return out, rows.Err()
}

// glassRow is a row of the glasses table.
type glassRow struct {
	name, formula, coefficients string
	min, max                    float64
	source                      string
}

func encodeGlass(g importers.Glass) (glassRow, error) {
	c := g.Coefficients
	if c == nil {
		c = []float64{}
	}
	b, err := json.Marshal(c)
	if err != nil {
		return glassRow{}, err
	}
	return glassRow{name: g.Name, formula: g.Formula, coefficients: string(b), min: g.MinNm, max: g.MaxNm, source: g.Source}, nil
}

// glass rebuilds the stored glass and checks it, so that a file edited by
// hand cannot make the program panic.
func (r glassRow) glass() (importers.Glass, error) {
	g := importers.Glass{Name: r.name, Formula: r.formula, MinNm: r.min, MaxNm: r.max, Source: r.source}
	if err := json.Unmarshal([]byte(r.coefficients), &g.Coefficients); err != nil {
		return g, fmt.Errorf("glass %s in the catalog: coefficients %q: %w", r.name, r.coefficients, err)
	}
	if err := g.Validate(); err != nil {
		return g, fmt.Errorf("glass %s in the catalog: %w", r.name, err)
	}
	return g, nil
}

// checkGlasses lists every problem with the glasses, including a name given
// twice, each with its line.
func checkGlasses(glasses []importers.Glass) []RowError {
	var bad []RowError
	seen := map[string]int{}
	for _, g := range glasses {
		if err := g.Validate(); err != nil {
			var ps optics.Problems
			if !errors.As(err, &ps) {
				ps = optics.Problems{{Field: "name", Reason: err.Error()}}
			}
			for _, p := range ps {
				bad = append(bad, RowError{Line: g.Line, ID: g.Name, Field: p.Field, Reason: p.Reason})
			}
		}
		if strings.TrimSpace(g.Name) != g.Name {
			bad = append(bad, RowError{Line: g.Line, ID: g.Name, Field: "name", Reason: "has spaces around it"})
		}
		key := strings.ToLower(g.Name)
		if first, ok := seen[key]; ok && key != "" {
			bad = append(bad, RowError{Line: g.Line, ID: g.Name, Field: "name", Reason: givenTwice(first)})
		}
		seen[key] = g.Line
	}
	return bad
}

// storedGlass returns the stored row of a glass name (case-insensitive).
func storedGlass(ctx context.Context, q querier, name string) (glassRow, bool, error) {
	var r glassRow
	err := q.QueryRowContext(ctx, "SELECT name, formula, coefficients, min_nm, max_nm, source FROM glasses WHERE name = ?", name).
		Scan(&r.name, &r.formula, &r.coefficients, &r.min, &r.max, &r.source)
	if errors.Is(err, sql.ErrNoRows) {
		return r, false, nil
	}
	return r, err == nil, err
}
