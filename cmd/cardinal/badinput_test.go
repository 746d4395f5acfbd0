package main

import (
	"crypto/sha256"
	"database/sql"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A badInput is one thing a user (or a hostile one) may type or hand the
// program: a command line, the files it names, and what the catalog file
// looks like. Every case is refused with the exit code of its class (2
// for the user's input or files, 3 for a missing thing, 4 for nothing
// meets; never 1, which means a fault of the program), with a message that
// names the thing at fault and says what to do, with no trace of Go in it,
// and with the catalog file byte for byte as it was.
type badInput struct {
	name string
	// args: "{db}" is the catalog file of the case, "{dir}" its folder.
	args []string
	// files are written into the case's folder before the run.
	files map[string]string
	// catalog changes the case's catalog file before the run (damage, a
	// lock, a missing table); nil leaves the prepared catalog.
	catalog func(t *testing.T, path string)
	code    int
	// want are pieces of the message (stderr, wrapping undone): the thing
	// at fault and what to do.
	want []string
	// vars are environment variables of the run.
	vars map[string]string
	// saves is true for a run that is meant to save itself (a search that
	// met nothing is still a search, kept like any other): the catalog may
	// change, and nothing else is relaxed.
	saves bool
}

// notGo are pieces of text that belong to Go, not to a message for people.
var notGo = []string{"panic", "goroutine ", ".go:", "runtime.", "Go struct", "Go value", "float64", "int64", "uint64",
	"[]string", "map[", "unmarshal", "invalid character", "unexpected EOF", "strconv.", "internal error", "(SQLITE_", "0x0"}

func TestBadInputs(t *testing.T) {
	base := preparedCatalog(t)
	const prescHeader = "supplier,part,diameter,r1,r2,t1,glass1\n"
	cases := []badInput{
		// find: numbers at the edge (issue 10, "Non-numbers and exit codes").
		{name: "find efl 1e-200", args: []string{"find", "--efl", "1e-200"}, code: 2, want: []string{"--efl", "is outside 0.1 to 100000 mm"}},
		{name: "find efl 1e308", args: []string{"find", "--efl", "1e308"}, code: 2, want: []string{"--efl", "is outside 0.1 to 100000 mm"}},
		{name: "find track 1e308 mag -1", args: []string{"find", "--track", "1e308", "--mag", "-1"}, code: 2, want: []string{"--track", "is outside 0.1 to 100000 mm"}},
		{name: "find efl NaN", args: []string{"find", "--efl", "NaN"}, code: 2, want: []string{"--efl", "is outside 0.1 to 100000 mm"}},
		{name: "find efl Inf", args: []string{"find", "--efl", "Inf"}, code: 2, want: []string{"--efl", "is outside 0.1 to 100000 mm"}},
		{name: "find efl -Inf", args: []string{"find", "--efl=-Inf"}, code: 2, want: []string{"--efl", "is outside 0.1 to 100000 mm"}},
		{name: "find efl 0.001 below its range", args: []string{"find", "--efl", "0.001"}, code: 2, want: []string{"--efl", "0.1 to 100000 mm"}},
		{name: "find efl as a word", args: []string{"find", "--efl", "fifty"}, code: 2, want: []string{"--efl", "a finite number such as"}},
		{name: "find wavelength 0", args: []string{"find", "--efl", "50", "--wavelength", "0"}, code: 2, want: []string{"--wavelength", "150 to 20000 nm", "leave --wavelength out"}},
		{name: "find wavelength 1e6", args: []string{"find", "--efl", "50", "--wavelength", "1e6"}, code: 2, want: []string{"--wavelength", "150 to 20000 nm"}},
		{name: "find band with a word", args: []string{"find", "--efl", "50", "--band", "486.1,abc"}, code: 2, want: []string{"--band", "numbers separated by commas"}},
		{name: "find band NaN", args: []string{"find", "--efl", "50", "--band", "486.1,NaN"}, code: 2, want: []string{"--band", "want a finite number"}},
		{name: "find efl-tol as a word", args: []string{"find", "--efl", "50", "--efl-tol", "lots"}, code: 2, want: []string{"--efl-tol", "lots"}},
		{name: "find top -1", args: []string{"find", "--efl", "50", "--top", "-1"}, code: 2, want: []string{"--top", "0 to 10000"}},
		{name: "find top past the ceiling", args: []string{"find", "--efl", "50", "--top", "1000000"}, code: 2, want: []string{"--top", "0 to 10000"}},
		{name: "find na 1.5", args: []string{"find", "--efl", "50", "--na", "1.5"}, code: 2, want: []string{"--na", "0 to 0.999"}},
		{name: "find field-angle 90", args: []string{"find", "--efl", "50", "--field-angle", "90"}, code: 2, want: []string{"--field-angle", "89.9"}},
		{name: "find m2 below 1", args: []string{"find", "--efl", "50", "--beam", "2", "--m2", "0.5"}, code: 2, want: []string{"--m2", "1 to 1000"}},
		{name: "find mag with a focus", args: []string{"find", "--efl", "50", "--mag", "-1"}, code: 2, want: []string{"--mag"}},
		{name: "find no kind", args: []string{"find", "--beam", "5"}, code: 2, want: []string{"--efl"}},
		{name: "find elements 3", args: []string{"find", "--efl", "50", "--elements", "3"}, code: 2, want: []string{"--elements"}},
		{name: "find format xml", args: []string{"find", "--efl", "50", "--format", "xml"}, code: 2, want: []string{`"xml"`, "use one of table, json, csv, md"}},
		{name: "find unknown flag", args: []string{"find", "--efl", "50", "--focal", "3"}, code: 2, want: []string{"--focal", "cardinal find --help"}},
		{name: "unknown letter flag", args: []string{"catalog", "export", "-o", "x.csv"}, code: 2, want: []string{"unknown flag -o ", "cardinal catalog export --help"}},
		{name: "unknown command", args: []string{"fnd", "--efl", "50"}, code: 2, want: []string{"fnd", "did you mean find"}},
		{name: "find nothing meets", args: []string{"find", "--efl", "90000", "--elements", "1"}, code: 4, want: []string{"nothing meets", "loosen"}, saves: true},
		{name: "find supplier nobody has", args: []string{"find", "--efl", "50", "--supplier", "NOSUCH"}, code: 4, want: []string{"other supplier", "loosen"}, saves: true},

		// Saved searches and what is picked from them.
		{name: "request abc", args: []string{"request", "abc", "--pick", "1"}, code: 2, want: []string{`"abc"`, "give a search number"}},
		{name: "request no such search", args: []string{"request", "999", "--pick", "1"}, code: 3, want: []string{"999", "cardinal searches list"}},
		{name: "request pick 0", args: []string{"request", "last", "--pick", "0"}, code: 2, want: []string{"--pick"}},
		{name: "request pick past the results", args: []string{"request", "last", "--pick", "999"}, code: 2, want: []string{"--pick 999", "cardinal searches show"}},
		{name: "request pick a word", args: []string{"request", "last", "--pick", "one"}, code: 2, want: []string{"--pick", "whole number"}},
		{name: "request systems -1", args: []string{"request", "last", "--pick", "1", "--systems", "-1"}, code: 2, want: []string{"--systems", "1 or more"}},
		{name: "draw field NaN", args: []string{"draw", "last", "--pick", "1", "--field-angle", "NaN", "-o", "{dir}/x.svg"}, code: 2, want: []string{"--field-angle", "is outside 0 to 89.9 degrees"}},
		{name: "draw former --field NaN", args: []string{"draw", "last", "--pick", "1", "--field", "NaN", "-o", "{dir}/x.svg"}, code: 2, want: []string{"--field", "want a finite number"}},
		{name: "draw field Inf", args: []string{"draw", "last", "--pick", "1", "--field-angle", "Inf", "-o", "{dir}/x.svg"}, code: 2, want: []string{"--field-angle", "is outside 0 to 89.9 degrees"}},
		{name: "draw field 1e300", args: []string{"draw", "last", "--pick", "1", "--field-angle", "1e300", "-o", "{dir}/x.svg"}, code: 2, want: []string{"--field-angle", "is outside 0 to 89.9 degrees"}},
		{name: "draw field 95 degrees", args: []string{"draw", "last", "--pick", "1", "--field-angle", "95", "-o", "{dir}/x.svg"}, code: 2, want: []string{"--field-angle", "degrees"}},
		{name: "draw into no folder", args: []string{"draw", "last", "--pick", "1", "-o", "{dir}/no/such/x.svg"}, code: 2, want: []string{"x.svg"}},
		{name: "draw unknown extension", args: []string{"draw", "last", "--pick", "1", "-o", "{dir}/x.txt"}, code: 2, want: []string{"x.txt", ".svg"}},
		{name: "tolerance trials 0", args: []string{"tolerance", "last", "--pick", "1", "--trials", "0"}, code: 2, want: []string{"--trials", "10 to 1000000"}},
		{name: "tolerance spacing 1e300", args: []string{"tolerance", "last", "--pick", "1", "--spacing-tol", "1e300"}, code: 2, want: []string{"--spacing-tol", "want a finite number"}},
		{name: "tolerance compensator banana", args: []string{"tolerance", "last", "--pick", "1", "--compensator", "banana"}, code: 2, want: []string{"--compensator", "image, gap or none"}},
		{name: "report pick a word", args: []string{"report", "last", "--pick", "1,x", "-o", "{dir}/r.html"}, code: 2, want: []string{"--pick", "whole number"}},
		{name: "searches show missing", args: []string{"searches", "show", "999"}, code: 3, want: []string{"999", "cardinal searches list"}},
		{name: "searches remove a word", args: []string{"searches", "remove", "abc"}, code: 2, want: []string{`"abc"`, "search number"}},

		// Parts and the catalog's own commands.
		{name: "inspect missing part", args: []string{"inspect", "DEMO:NOPE-1"}, code: 3, want: []string{"DEMO:NOPE-1"}},
		{name: "inspect wavelength -5", args: []string{"inspect", "DEMO:PCX-50", "--wavelength", "-5"}, code: 2, want: []string{"--wavelength", "150 to 20000 nm"}},
		{name: "inspect na 1.5", args: []string{"inspect", "DEMO:PCX-50", "--na", "1.5"}, code: 2, want: []string{"--na 1.5 is outside 0 to 0.999"}},
		{name: "inspect beam 1e8", args: []string{"inspect", "DEMO:PCX-50", "--beam", "1e8"}, code: 2, want: []string{"--beam", "0 to 100000 mm"}},
		{name: "tolerance plot into no folder", args: []string{"tolerance", "last", "--pick", "1", "--plot", "{dir}/no/x.svg"}, code: 2, want: []string{"x.svg", "does not exist", "choose another path"}},
		{name: "inspect missing file", args: []string{"inspect", "--file", "{dir}/none.csv"}, code: 3, want: []string{"none.csv", "no such file"}},
		{name: "list diameter-min NaN", args: []string{"catalog", "list", "--diameter-min", "NaN"}, code: 2, want: []string{"--diameter-min", "want a finite number"}},
		{name: "list efl range upside down", args: []string{"catalog", "list", "--efl", "100:10"}, code: 2, want: []string{"--efl", "MIN 100 is above MAX 10"}},
		{name: "list efl NaN range", args: []string{"catalog", "list", "--efl", "NaN:10"}, code: 2, want: []string{"--efl", "MIN:MAX"}},
		{name: "list efl 1e400 range", args: []string{"catalog", "list", "--efl", "1:1e400"}, code: 2, want: []string{"--efl", "MIN:MAX"}},
		{name: "list kind banana", args: []string{"catalog", "list", "--kind", "banana"}, code: 2, want: []string{"banana", "positive"}},
		{name: "remove missing part", args: []string{"catalog", "remove", "DEMO:NOPE-1"}, code: 3, want: []string{"DEMO:NOPE-1"}},
		{name: "drawer set negative", args: []string{"drawer", "set", "DEMO:PCX-50", "--quantity", "-3"}, code: 2, want: []string{"--quantity", "whole number"}},
		{name: "drawer set missing part", args: []string{"drawer", "set", "DEMO:NOPE-1", "--quantity", "1"}, code: 3, want: []string{"DEMO:NOPE-1"}},
		{name: "drawer set location with NUL", args: []string{"drawer", "set", "DEMO:PCX-50", "--quantity", "1", "--location", "A\x00B"}, code: 2, want: []string{"--location", "control character"}},

		// Prescription CSV files.
		{name: "import missing file", args: []string{"catalog", "import", "{dir}/none.csv"}, code: 3, want: []string{"none.csv", "no such file"}},
		{name: "import a folder", args: []string{"catalog", "import", "{dir}"}, code: 2, want: []string{"cannot be read", "check the path"}},
		{name: "import empty file", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": ""}, code: 2, want: []string{"p.csv", "header"}},
		{name: "import diameter 1e300", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,BIG,1e300,50,-50,5,517642\n"}, code: 2, want: []string{"p.csv:2: diameter", "0.001 to 10000 mm", "import again"}},
		{name: "import every value 1e-300", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,TINY,1e-300,1e-300,-1e-300,1e-300,517642\n"}, code: 2, want: []string{"p.csv:2: diameter", "p.csv:2: r1", "p.csv:2: t1", "import again"}},
		{name: "import thickness 1e300", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,THICK,10,50,-50,1e300,517642\n"}, code: 2, want: []string{"p.csv:2: t1", "0.001 to 10000 mm"}},
		{name: "import radius 1e-300", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,SHARP,10,1e-300,-50,5,517642\n"}, code: 2, want: []string{"p.csv:2: r1", "inf or plano"}},
		{name: "import NUL in a part name", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,NU\x00L,10,50,-50,5,517642\n"}, code: 2, want: []string{"p.csv:2: part", "control character"}},
		{name: "import bell in a description", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": "supplier,part,diameter,r1,r2,t1,glass1,description\nX,B,10,50,-50,5,517642,a\x07b\n"}, code: 2, want: []string{"p.csv:2: description", "control character"}},
		{name: "import escape in a supplier", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X\x1b[31m,E,10,50,-50,5,517642\n"}, code: 2, want: []string{"p.csv:2: supplier", "control character"}},
		{name: "import radius a word", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,W,10,fifty,-50,5,517642\n"}, code: 2, want: []string{"p.csv:2: r1", "not a finite number"}},
		{name: "import unknown glass", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,G,10,50,-50,5,unobtainium\n"}, code: 2, want: []string{"p.csv:2: glass1", "unobtainium"}},
		{name: "import negative diameter", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,N,-10,50,-50,5,517642\n"}, code: 2, want: []string{"p.csv:2: diameter", "positive"}},
		{name: "import price NaN", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": "supplier,part,diameter,r1,r2,t1,glass1,price\nX,P,10,50,-50,5,517642,NaN\n"}, code: 2, want: []string{"p.csv:2: price", "not a finite number"}},
		{name: "import stated wavelength 1e-300", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": "supplier,part,diameter,r1,r2,t1,glass1,efl,stated_wavelength\nX,S,10,50,-50,5,517642,49,1e-300\n"}, code: 2, want: []string{"p.csv:2: stated_wavelength", "150 to 20000 nm"}},
		{name: "import conic 1e300", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": "supplier,part,diameter,r1,r2,t1,glass1,conic1\nX,K,10,50,-50,5,517642,1e300\n"}, code: 2, want: []string{"p.csv:2: conic1"}},
		{name: "import unterminated quote", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,\"Q,10,50,-50,5,517642\n"}, code: 2, want: []string{"p.csv:2", "quote"}},
		{name: "import not UTF-8", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": prescHeader + "X,\xff\xfe,10,50,-50,5,517642\n"}, code: 2, want: []string{"p.csv:2", "UTF-8"}},
		{name: "import missing column", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": "supplier,part,r1,r2,t1,glass1\nX,M,50,-50,5,517642\n"}, code: 2, want: []string{"p.csv:1: diameter", "missing"}},
		{name: "import binary junk", args: []string{"catalog", "import", "{dir}/p.csv"}, files: map[string]string{"p.csv": "\x00\x01\x02\x03\x04SQLite\x00\x00"}, code: 2, want: []string{"p.csv"}},

		// Glass and drawer CSV files.
		{name: "glass import missing file", args: []string{"glass", "import", "{dir}/none.csv"}, code: 3, want: []string{"none.csv", "no such file"}},
		{name: "glass formula banana", args: []string{"glass", "import", "{dir}/g.csv"}, files: map[string]string{"g.csv": "name,formula,coefficients\ng1,banana,1 2\n"}, code: 2, want: []string{"g.csv:2", "banana", "sellmeier"}},
		{name: "glass coefficient NaN", args: []string{"glass", "import", "{dir}/g.csv"}, files: map[string]string{"g.csv": "name,formula,coefficients\ng1,sellmeier,1 0.01 NaN 0.1\n"}, code: 2, want: []string{"g.csv:2: coefficients", "not a finite number"}},
		{name: "glass range 1e-300 to 1e300 nm", args: []string{"glass", "import", "{dir}/g.csv"}, files: map[string]string{"g.csv": "name,formula,coefficients,min_nm,max_nm\ng1,abbe,1.5 60,1e-300,1e300\n"}, code: 2, want: []string{"g.csv:2: min_nm", "150 to 20000 nm"}},
		{name: "glass name with NUL", args: []string{"glass", "import", "{dir}/g.csv"}, files: map[string]string{"g.csv": "name,formula,coefficients\ng\x001,abbe,1.5 60\n"}, code: 2, want: []string{"g.csv:2: name", "control character"}},
		{name: "drawer quantity -1", args: []string{"drawer", "import", "{dir}/d.csv"}, files: map[string]string{"d.csv": "supplier,part,quantity,location\nDEMO,PCX-50,-1,A\n"}, code: 2, want: []string{"d.csv:2: quantity", "whole number"}},
		{name: "drawer quantity 1e300", args: []string{"drawer", "import", "{dir}/d.csv"}, files: map[string]string{"d.csv": "supplier,part,quantity,location\nDEMO,PCX-50,1e300,A\n"}, code: 2, want: []string{"d.csv:2: quantity", "whole number"}},
		{name: "drawer location with NUL", args: []string{"drawer", "import", "{dir}/d.csv"}, files: map[string]string{"d.csv": "supplier,part,quantity,location\nDEMO,PCX-50,1,A\x00B\n"}, code: 2, want: []string{"d.csv:2: location", "control character"}},
		{name: "drawer unknown part", args: []string{"drawer", "import", "{dir}/d.csv"}, files: map[string]string{"d.csv": "supplier,part,quantity,location\nDEMO,NOPE-1,1,A\n"}, code: 2, want: []string{"d.csv:2", "DEMO:NOPE-1", "import again"}},

		// Mappings and spreadsheets.
		{name: "mapping missing", args: []string{"catalog", "import", "{dir}/s.csv", "--map", "{dir}/none.colmap"}, files: map[string]string{"s.csv": "a,b\n1,2\n"}, code: 3, want: []string{"none.colmap", "no such file"}},
		{name: "mapping junk line", args: []string{"catalog", "import", "{dir}/s.csv", "--map", "{dir}/m.colmap"}, files: map[string]string{"s.csv": "a,b\n1,2\n", "m.colmap": "junk line here\n"}, code: 2, want: []string{"m.colmap:1", "not a mapping line"}},
		{name: "mapping column the sheet lacks", args: []string{"catalog", "import", "{dir}/s.csv", "--map", "{dir}/m.colmap"}, files: map[string]string{"s.csv": "a,b\n1,2\n", "m.colmap": "supplier = X\npart <- Item\n"}, code: 2, want: []string{"s.csv", "Item", "m.colmap"}},
		{name: "mapped diameter 1e300", args: []string{"catalog", "import", "{dir}/s.csv", "--map", "{dir}/m.colmap"}, files: map[string]string{
			"s.csv":    "Item,Dia,R1,R2,CT,Glass\nBIG,1e300,50,-50,5,517642\n",
			"m.colmap": "supplier = X\npart <- Item\ndiameter <- Dia\nr1 <- R1\nr2 <- R2\nt1 <- CT\nglass1 <- Glass\n"}, code: 2, want: []string{"s.csv", "diameter", "0.001 to 10000 mm"}},
		{name: "spreadsheet not a zip", args: []string{"catalog", "import", "{dir}/s.xlsx", "--map", "{dir}/m.colmap"}, files: map[string]string{"s.xlsx": "PK\x03\x04 this is no zip at all", "m.colmap": "supplier = X\npart <- Item\n"}, code: 2, want: []string{"s.xlsx"}},
		{name: "spreadsheet guess of junk", args: []string{"catalog", "mapping", "{dir}/s.xlsx"}, files: map[string]string{"s.xlsx": "PK\x03\x04\x14\x00\x00\x00"}, code: 2, want: []string{"s.xlsx"}},

		// Requirement (spec) files.
		{name: "spec trailing text", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": `{"kind":"focus","efl_mm":50} junk`}, code: 2, want: []string{"r.json:1:30", "one object"}},
		{name: "spec kind banana", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": `{"kind":"banana","efl_mm":50}`}, code: 2, want: []string{"r.json:1:", `"kind": "banana"`, `"focus"`}},
		{name: "spec string for a number", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": "{\"kind\":\"focus\",\n \"efl_mm\":\"fifty\"}"}, code: 2, want: []string{"r.json:2:", `"efl_mm"`, "expected a number"}},
		{name: "spec truncated", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": `{"kind":"focus","efl_mm":50`}, code: 2, want: []string{"r.json:1:", "closing }"}},
		{name: "spec empty", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": ""}, code: 2, want: []string{"r.json"}},
		{name: "spec NUL bytes", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": "\x00\x00{}"}, code: 2, want: []string{"r.json:1:"}},
		{name: "spec unknown key", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": `{"kind":"focus","efl_mm":50,"focal":3}`}, code: 2, want: []string{"r.json:1:", `"focal"`}},
		{name: "spec key of another kind", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": `{"kind":"focus","efl_mm":50,"track_mm":200}`}, code: 2, want: []string{`"track_mm"`, "focus"}},
		{name: "spec efl 1e308", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": `{"kind":"focus","efl_mm":1e308}`}, code: 2, want: []string{`"efl_mm"`, "0.1 to 100000 mm"}},
		{name: "spec efl 1e999", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": `{"kind":"focus","efl_mm":1e999}`}, code: 2, want: []string{"r.json:1:", `"efl_mm"`}},
		{name: "spec NUL in a supplier", args: []string{"find", "--spec", "{dir}/r.json"}, files: map[string]string{"r.json": `{"kind":"focus","efl_mm":50,"supplier":"A\u0000B"}`}, code: 2, want: []string{"r.json:1:", `"supplier"`, "control character"}},
		{name: "spec missing", args: []string{"find", "--spec", "{dir}/none.json"}, code: 3, want: []string{"none.json", "no such file"}},

		// Catalog files.
		{name: "db /dev/null", args: []string{"--db", "/dev/null", "find", "--efl", "50"}, code: 2, want: []string{"/dev/null", "give the path of a catalog file"}},
		{name: "db a folder", args: []string{"--db", "{dir}", "catalog", "list"}, code: 2, want: []string{"is a directory", "give the path of a catalog file"}},
		{name: "db in no folder", args: []string{"--db", "{dir}/no/such/cat.db", "find", "--efl", "50"}, code: 3, want: []string{"cat.db", "cardinal catalog import FILE"}},
		{name: "db missing, list", catalog: dbRemoved, args: []string{"catalog", "list"}, code: 3, want: []string{"does not exist", "cardinal catalog import FILE"}},
		{name: "db missing, drawer list", catalog: dbRemoved, args: []string{"drawer", "list"}, code: 3, want: []string{"does not exist", "cardinal catalog import FILE"}},
		{name: "db empty, list", catalog: dbEmptied, args: []string{"catalog", "list"}, code: 3, want: []string{"empty file", "cardinal catalog import FILE"}},
		{name: "db SQLite without tables, list", catalog: dbNoTables, args: []string{"catalog", "list"}, code: 3, want: []string{"without tables", "cardinal catalog import FILE"}},
		{name: "db of another program", catalog: dbForeign, args: []string{"catalog", "list"}, code: 2, want: []string{"another program", "choose another file"}},
		{name: "db of another program, import", catalog: dbForeign, args: []string{"catalog", "import", demoLensesCSV}, code: 2, want: []string{"another program", "choose another file"}},
		{name: "db a text file", catalog: dbText, args: []string{"find", "--efl", "50"}, code: 2, want: []string{"not an SQLite database", "choose another file"}},
		{name: "db damaged mid-file, list", catalog: dbDamaged, args: []string{"catalog", "list"}, code: 2, want: []string{"damaged", "restore it from a backup"}},
		{name: "db damaged mid-file, find", catalog: dbDamaged, args: []string{"find", "--efl", "50"}, code: 2, want: []string{"damaged", "restore it from a backup"}},
		{name: "db lacks a table", catalog: dbDropTable("computed"), args: []string{"catalog", "list"}, code: 2, want: []string{"table computed is missing", "restore it from a backup"}},
		{name: "db lacks the index, find", catalog: dbDropTable("search_index"), args: []string{"find", "--efl", "50"}, code: 2, want: []string{"search_index is missing", "restore it from a backup"}},
		{name: "db locked by another writer, import", catalog: dbLocked, vars: map[string]string{"CARDINAL_LOCK_WAIT": "0.1"},
			args: []string{"catalog", "import", "../../catalog/demo/lenses.csv"}, code: 2, want: []string{"is busy", "nothing was changed", "retry"}},
		{name: "db locked by another writer, drawer set", catalog: dbLocked, vars: map[string]string{"CARDINAL_LOCK_WAIT": "0.1"},
			args: []string{"drawer", "set", "DEMO:PCX-50", "--quantity", "4"}, code: 2, want: []string{"is busy", "nothing was changed", "retry"}},
		{name: "lock wait a word", vars: map[string]string{"CARDINAL_LOCK_WAIT": "soon"}, args: []string{"catalog", "list"}, code: 2, want: []string{"CARDINAL_LOCK_WAIT", "0 to 3600"}},
		{name: "db newer than the program", catalog: dbNewer, args: []string{"catalog", "list"}, code: 2, want: []string{"newer version", "upgrade cardinal"}},
	}
	if _, err := os.Stat("/dev/full"); err == nil { // Linux: every write fails, the disk is full
		cases = append(cases, badInput{name: "request to a full disk", args: []string{"request", "last", "--pick", "1", "-o", "/dev/full", "--force"},
			code: 2, want: []string{"/dev/full", "no space left on device", "free space"}})
	}
	if len(cases) < 60 {
		t.Fatalf("%d cases; issue 10 asks for at least 60", len(cases))
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) { runBadInput(t, base, tc) })
	}
}

// runBadInput runs one case on a copy of the prepared catalog.
func runBadInput(t *testing.T, base string, tc badInput) {
	dir := t.TempDir()
	db := filepath.Join(dir, "cat.db")
	copyFile(t, base, db)
	for name, body := range tc.files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	if tc.catalog != nil {
		tc.catalog(t, db)
	}
	before := fileHash(t, db)
	args := []string{"--db", db}
	if len(tc.args) > 0 && tc.args[0] == "--db" {
		args = nil
	}
	for _, a := range tc.args {
		args = append(args, strings.NewReplacer("{db}", db, "{dir}", dir).Replace(a))
	}
	e, out, errb := storeEnv(t, tc.vars)
	code := runCLI(e, args...)
	msg := unwrap(errb.String())
	if code != tc.code {
		t.Errorf("exit code %d, want %d\nstderr: %s\nstdout: %.300s", code, tc.code, msg, out.String())
	}
	if code == exitInternal {
		t.Errorf("exit 1 is a fault of the program, never of the input")
	}
	if strings.TrimSpace(msg) == "" {
		t.Errorf("no message on stderr")
	}
	for _, w := range tc.want {
		if !strings.Contains(msg, w) {
			t.Errorf("message lacks %q:\n%s", w, msg)
		}
	}
	for _, g := range notGo {
		if strings.Contains(msg, g) || strings.Contains(out.String(), g) {
			t.Errorf("output holds %q, which is Go's, not ours:\nstderr: %s\nstdout: %.300s", g, msg, out.String())
		}
	}
	if tc.saves {
		return
	}
	if after := fileHash(t, db); after != before {
		t.Errorf("the catalog file changed (%s before, %s after)", before, after)
	}
	for _, f := range []string{"x.svg", "r.html"} {
		if _, err := os.Stat(filepath.Join(dir, f)); err == nil {
			t.Errorf("%s was written by a refused command", f)
		}
	}
}

// preparedCatalog builds, once per test, a catalog of the demo lenses with
// one saved search that met its requirement; each case copies the file.
func preparedCatalog(t *testing.T) string {
	t.Helper()
	db := filepath.Join(t.TempDir(), "base.db")
	e, _, errb := storeEnv(t, nil)
	if code := runCLI(e, "--db", db, "catalog", "import", demoLensesCSV); code != 0 {
		t.Fatalf("import: %d %s", code, errb)
	}
	if code := runCLI(e, "--db", db, "find", "--efl", "50", "--efl-tol", "5%", "--beam", "5", "--top", "3"); code != 0 {
		t.Fatalf("find: %d %s", code, errb)
	}
	return db
}

func copyFile(t *testing.T, from, to string) {
	t.Helper()
	b, err := os.ReadFile(from)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(to, b, 0o644); err != nil {
		t.Fatal(err)
	}
}

// fileHash is the SHA-256 of a file, "missing" when there is none.
func fileHash(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if os.IsNotExist(err) {
		return "missing"
	}
	if err != nil {
		t.Fatal(err)
	}
	return fmt.Sprintf("%x", sha256.Sum256(b))
}

// The catalog states of the cases.

func dbRemoved(t *testing.T, path string) {
	if err := os.Remove(path); err != nil {
		t.Fatal(err)
	}
}

func dbEmptied(t *testing.T, path string) {
	if err := os.WriteFile(path, nil, 0o644); err != nil {
		t.Fatal(err)
	}
}

func dbText(t *testing.T, path string) {
	if err := os.WriteFile(path, []byte("supplier,part\nDEMO,PCX-50\n"), 0o644); err != nil {
		t.Fatal(err)
	}
}

// sqlFile replaces the catalog with a fresh SQLite file made by stmts.
func sqlFile(t *testing.T, path string, fresh bool, stmts ...string) {
	t.Helper()
	if fresh {
		dbRemoved(t, path)
	}
	db, err := sql.Open("sqlite", path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	for _, s := range stmts {
		if _, err := db.Exec(s); err != nil {
			t.Fatalf("%s: %v", s, err)
		}
	}
}

func dbNoTables(t *testing.T, path string) {
	sqlFile(t, path, true, "PRAGMA user_version = 0", "VACUUM")
}

func dbForeign(t *testing.T, path string) {
	sqlFile(t, path, true, "CREATE TABLE invoices (id INTEGER PRIMARY KEY, total REAL)", "INSERT INTO invoices VALUES (1, 2.5)")
}

func dbNewer(t *testing.T, path string) {
	sqlFile(t, path, false, "PRAGMA user_version = 999", "PRAGMA journal_mode = DELETE")
}

func dbDropTable(name string) func(*testing.T, string) {
	return func(t *testing.T, path string) {
		sqlFile(t, path, false, "PRAGMA foreign_keys = OFF", "DROP TABLE "+name, "PRAGMA journal_mode = DELETE")
	}
}

// damage overwrites pages in the middle of the file with a pattern, as a
// failing disk or a stray write would: the header stays good, so the
// damage shows only when the pages are read.
func dbDamaged(t *testing.T, path string) {
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	const page = 4096
	for i := len(b) / page / 3 * page; i < len(b)*2/3; i++ {
		b[i] = byte(0xA5 ^ i)
	}
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
}

// dbLocked holds the catalog's write lock from another connection for the
// rest of the case, as a long import in another process does.
func dbLocked(t *testing.T, path string) { holdWriteLock(t, path) }
