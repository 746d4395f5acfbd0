package search

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
)

// ReadSpec reads a requirement file: a JSON object with the keys of
// Requirement (the "requirement" object a search prints, so a saved
// search can be run again), over the command-line defaults. Unknown keys
// are an error, so that a misspelt limit is not silently ignored. The
// requirement is not validated here: flags may still change it.
func ReadSpec(r io.Reader, name string) (Requirement, error) {
	b, err := io.ReadAll(r)
	if err != nil {
		return Requirement{}, fmt.Errorf("%s: %w", name, err)
	}
	var wrapped struct {
		Requirement json.RawMessage `json:"requirement"`
	}
	if json.Unmarshal(b, &wrapped) == nil && len(wrapped.Requirement) > 0 {
		b = wrapped.Requirement
	}
	req := Defaults()
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&req); err != nil {
		return Requirement{}, fmt.Errorf("%s: %w", name, err)
	}
	return req, nil
}
