package search

import (
	"errors"
	"strings"
	"testing"
)

// Each bad requirement file is refused with the key, the line and column
// and what is expected there.
func TestReadSpecErrors(t *testing.T) {
	tests := []struct {
		name, doc string
		want      string // the whole message
	}{
		{"string for a number", "{\n  \"kind\": \"focus\",\n  \"efl_mm\": \"fifty\"\n}",
			`f.json:3:13: "efl_mm": expected a number (0.1 to 100000 mm)`},
		{"unknown kind", `{"kind": "banana", "efl_mm": 50}`,
			`f.json:1:10: "kind": "banana" is not known; expected "focus", "image", "expand" or "match"`},
		{"misspelt key", "{\"kind\": \"focus\",\n \"efl\": 50}",
			`f.json:2:2: "efl": is not a requirement key; expected one of `},
		{"cut short", `{"kind": "focus", "efl_mm": 5`,
			`f.json:1:30: the file ends inside the JSON object: a closing } or " is missing`},
		{"trailing text", "{\"kind\": \"focus\", \"efl_mm\": 50}\nrm -rf",
			`f.json:2:1: unexpected text after the JSON object`},
		{"second object", `{"kind": "focus"} {"kind": "image"}`,
			`f.json:1:19: unexpected text after the JSON object`},
		{"not an object", `[1, 2]`, `f.json:1:1: expected a JSON object`},
		{"empty file", ``, `f.json:1:1: the file ends inside the JSON object`},
		{"bad character", "{\"kind\": focus}", `f.json:1:11: not valid JSON here`},
		{"given twice", `{"kind": "focus", "kind": "image"}`, `f.json:1:19: "kind": is given twice`},
		{"zero wavelength", `{"kind": "focus", "efl_mm": 50, "wavelength_nm": 0}`, `f.json:1:50: "wavelength_nm": expected a wavelength of 150 to 20000 nm`},
		{"number too large for a float", `{"kind": "focus", "efl_mm": 1e400}`, `f.json:1:29: "efl_mm": expected a number`},
		{"bad tolerance", `{"kind": "focus", "efl_mm": 50, "efl_tol": "lots"}`, `f.json:1:44: "efl_tol": expected a string such as "1%"`},
		{"band of words", `{"kind": "focus", "band_nm": ["red"]}`, `f.json:1:30: "band_nm": expected an array of numbers`},
		{"unknown preference in a saved search", "{\"requirement\": {\"kind\": \"focus\",\n\"prefer\": \"fast\"}, \"results\": []}",
			`f.json:2:11: "prefer": "fast" is not known`},
		{"NUL in a supplier", `{"kind": "focus", "efl_mm": 50, "supplier": "A\u0000B"}`, `f.json:1:45: "supplier": holds the control character U+0000 at character 2; write plain text`},
		{"multi-byte characters before", "{\"supplier\": \"Ünïcødé\", \"kind\": 5}", `f.json:1:33: "kind": expected "focus"`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := ReadSpec(strings.NewReader(tt.doc), "f.json")
			var se *SpecError
			if !errors.As(err, &se) {
				t.Fatalf("error %v (%T), want a *SpecError", err, err)
			}
			if !strings.HasPrefix(err.Error(), tt.want) {
				t.Errorf("error\n  %s\nwant it to begin\n  %s", err, tt.want)
			}
		})
	}
}

// A mode-matching requirement, as find writes it in its JSON, reads back
// from a spec file (kind "match").
func TestReadSpecMatch(t *testing.T) {
	doc := `{"kind": "match", "waist_in_mm": 0.5, "waist_out_mm": 0.05, "wavelength_nm": 1064}`
	req, err := ReadSpec(strings.NewReader(doc), "m.json")
	if err != nil {
		t.Fatal(err)
	}
	if req.Kind != Match {
		t.Errorf("kind %q, want match", req.Kind)
	}
	if err := req.Validate(); err != nil {
		t.Errorf("the requirement read does not validate: %v", err)
	}
}
