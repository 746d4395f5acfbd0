package catalog

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// The child side of TestReaderProcess: read the catalog over and over
// until the stop file appears, print each state seen as "version count",
// and exit 1 on a catalog that mixes versions.
func readerChild(path, stop string) {
	s, err := Open(path)
	if err != nil {
		fmt.Println("open:", err)
		os.Exit(2)
	}
	defer s.Close()
	seen := map[string]int{}
	for {
		_, statErr := os.Stat(stop)
		rows, err := s.Computed(ctx, Filter{})
		if err != nil {
			fmt.Println("read:", err)
			os.Exit(2)
		}
		versions := map[string]int{}
		for _, r := range rows {
			versions[r.Description]++
		}
		if len(versions) != 1 {
			fmt.Println("mixed:", versions)
			os.Exit(1)
		}
		for v, n := range versions {
			seen[v] = n
		}
		os.WriteFile(stop+".ready", nil, 0o644)
		if !errors.Is(statErr, fs.ErrNotExist) {
			break // one more read after the last import, then stop
		}
	}
	for v, n := range seen {
		fmt.Println(v, n)
	}
	os.Exit(0)
}

func TestReaderProcess(t *testing.T) {
	if path := os.Getenv("CARDINAL_TEST_READER_DB"); path != "" {
		readerChild(path, os.Getenv("CARDINAL_TEST_READER_STOP"))
		return
	}
	dir := t.TempDir()
	path, stop := filepath.Join(dir, "catalog.db"), filepath.Join(dir, "stop")
	writer, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer writer.Close()
	n, m := 60, 20
	mustImport(t, writer, versioned(t, n, "v1"))
	// A second process lists the catalog while this one imports.
	child := exec.Command(os.Args[0], "-test.run=^TestReaderProcess$")
	child.Env = append(os.Environ(), "CARDINAL_TEST_READER_DB="+path, "CARDINAL_TEST_READER_STOP="+stop)
	var out strings.Builder
	child.Stdout, child.Stderr = &out, &out
	if err := child.Start(); err != nil {
		t.Fatal(err)
	}
	for i := 0; ; i++ { // wait for the reader's first read
		if _, err := os.Stat(stop + ".ready"); err == nil {
			break
		}
		if i == 1000 {
			child.Process.Kill()
			t.Fatalf("the reader process did not start:\n%s", out.String())
		}
		time.Sleep(10 * time.Millisecond)
	}
	want := map[string]int{"v1": n}
	for i := 2; i <= 6; i++ {
		v := fmt.Sprintf("v%d", i)
		mustImport(t, writer, versioned(t, n+m, v))
		want[v] = n + m
	}
	os.WriteFile(stop, nil, 0o644)
	if err := child.Wait(); err != nil {
		t.Fatalf("reader process: %v\n%s", err, out.String())
	}
	states := 0
	for _, line := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		var v string
		var count int
		if _, err := fmt.Sscan(line, &v, &count); err != nil {
			continue // the test framework's own lines
		}
		states++
		if want[v] != count {
			t.Errorf("reader process saw %s with %d parts, want %d", v, count, want[v])
		}
	}
	if states < 2 {
		t.Errorf("the reader process saw %d state(s); it must overlap the imports:\n%s", states, out.String())
	}
}
