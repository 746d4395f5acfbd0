// Package importers reads and writes the neutral CSV formats of cardinal:
// lens prescriptions, glasses and drawer inventory. Errors carry the file,
// line and column name of what is wrong; every bad row is reported, not just
// the first.
//
// It also reads foreign tables, a supplier's spreadsheet (.xlsx) or CSV with
// its own column names, through a Mapping (cardinal's own column-mapping
// format): ReadMapped converts each row (units, radius signs, flats, glass
// names) into a row of the neutral prescription CSV and parses it with the
// same code, so a mapped file gets exactly the checks of the neutral one;
// its errors name the file, sheet, row and source column. GuessMapping
// writes a first mapping from a table's headers, and Preview compares each
// part's computed EFL with the stated one before anything is stored.
package importers
