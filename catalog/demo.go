package catalog

import (
	"bytes"
	"context"
	"embed"
	"errors"
	"fmt"
	"io/fs"

	"cardinal/importers"
)

// demoFiles holds the folder demo beside this file: the built-in demo
// catalog, an invented scenario (invented suppliers, part numbers and
// prices; realistic prescriptions), never real catalog data. It is
// embedded so that every command works before the user has a catalog of
// their own.
//
//go:embed demo
var demoFiles embed.FS

// Files of the built-in demo catalog inside demoFiles.
const (
	demoDir      = "demo"
	demoCatalog  = demoDir + "/catalog.csv"
	demoLenses   = demoDir + "/lenses.csv" // the small first demo, used while catalog.csv is absent
	demoDrawer   = demoDir + "/drawer.csv"
	demoGlassCSV = demoDir + "/glasses.csv"
)

// OpenDemo opens a fresh in-memory catalog loaded with the built-in demo
// data (an invented scenario): its glasses, parts and drawer. Every read
// command uses it until the user has a catalog of their own.
func OpenDemo() (*Store, error) {
	return openDemoFS(demoFiles)
}

// DemoLenses returns the small demo prescription file (lenses.csv: the
// DEMO parts, invented) that inspect reads when given no file.
func DemoLenses() []byte {
	b, err := fs.ReadFile(demoFiles, demoLenses)
	if err != nil {
		panic("catalog: reading the embedded demo: " + err.Error())
	}
	return b
}

func openDemoFS(demo fs.FS) (*Store, error) {
	s, err := Open(Memory)
	if err != nil {
		return nil, err
	}
	if err := s.loadDemo(context.Background(), demo); err != nil {
		s.Close()
		return nil, fmt.Errorf("built-in demo catalog: %w", err)
	}
	return s, nil
}

func (s *Store) loadDemo(ctx context.Context, demo fs.FS) error {
	if b, err := fs.ReadFile(demo, demoGlassCSV); err == nil {
		glasses, err := importers.ReadGlasses(bytes.NewReader(b), demoGlassCSV)
		if err != nil {
			return err
		}
		if _, err := s.ImportGlasses(ctx, glasses, false); err != nil {
			return err
		}
	} else if !errors.Is(err, fs.ErrNotExist) {
		return err
	}
	b, err := fs.ReadFile(demo, demoCatalog)
	name := demoCatalog
	if errors.Is(err, fs.ErrNotExist) {
		b, err = fs.ReadFile(demo, demoLenses)
		name = demoLenses
	}
	if err != nil {
		return err
	}
	table, err := s.Glasses(ctx)
	if err != nil {
		return err
	}
	entries, err := importers.ReadPrescriptions(bytes.NewReader(b), name, table)
	if err != nil {
		return err
	}
	if _, err := s.Import(ctx, entries, false); err != nil {
		return err
	}
	b, err = fs.ReadFile(demo, demoDrawer)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return err
	}
	items, err := importers.ReadDrawer(bytes.NewReader(b), demoDrawer)
	if err != nil {
		return err
	}
	_, err = s.ImportDrawer(ctx, items, false)
	return err
}
