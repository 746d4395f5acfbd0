package catalog

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io/fs"

	"cardinal"
	"cardinal/importers"
)

// Files of the built-in demo catalog inside cardinal.Demo.
const (
	demoDir      = "testdata/demo"
	demoCatalog  = demoDir + "/catalog.csv"
	demoLenses   = demoDir + "/lenses.csv" // the small first demo, used while catalog.csv is absent
	demoDrawer   = demoDir + "/drawer.csv"
	demoGlassCSV = demoDir + "/glasses.csv"
)

// OpenDemo opens a fresh in-memory catalog loaded with the built-in demo
// data (an invented scenario): its glasses, parts and drawer. Every read
// command uses it until the user has a catalog of their own.
func OpenDemo() (*Store, error) {
	return openDemoFS(cardinal.Demo)
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
