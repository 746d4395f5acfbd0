package catalog

import (
	"context"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

// DemoVersion is a short hash of the embedded demo files: a kept demo
// catalog carries it in its file name, so that a program with other demo
// data builds a fresh one instead of showing stale parts.
func DemoVersion() string {
	h := sha256.New()
	err := fs.WalkDir(demoFiles, demoDir, func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		b, err := fs.ReadFile(demoFiles, p)
		fmt.Fprintf(h, "%s\x00%d\x00", p, len(b))
		h.Write(b)
		return err
	})
	if err != nil {
		panic("catalog: reading the embedded demo: " + err.Error())
	}
	return hex.EncodeToString(h.Sum(nil))[:12]
}

// OpenDemoAt opens the demo catalog kept in the file at path, building it
// from the embedded demo data first when the file does not exist. It is
// built in a temporary file beside it and renamed into place, so that an
// interrupted build leaves no half-filled demo. Saved searches run on the
// demo catalog are kept there, so that later commands can use them.
func OpenDemoAt(path string) (*Store, error) {
	if _, err := os.Stat(path); errors.Is(err, fs.ErrNotExist) {
		if err := buildDemoFile(path); err != nil {
			return nil, err
		}
	}
	return Open(path)
}

func buildDemoFile(path string) error {
	tmp, err := os.CreateTemp(filepath.Dir(path), ".demo-*.db")
	if err != nil {
		return err
	}
	name := tmp.Name()
	tmp.Close()
	os.Remove(name) // Open wants to create the file itself
	defer func() {
		for _, suffix := range []string{"", "-wal", "-shm"} {
			os.Remove(name + suffix)
		}
	}()
	s, err := Open(name)
	if err != nil {
		return err
	}
	if err := s.loadDemo(context.Background(), demoFiles); err != nil {
		s.Close()
		return fmt.Errorf("built-in demo catalog: %w", err)
	}
	if err := s.Close(); err != nil {
		return err
	}
	return os.Rename(name, path)
}
