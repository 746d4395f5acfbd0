// Package importers reads and writes the neutral CSV formats of cardinal:
// lens prescriptions, glasses and drawer inventory. Errors carry the file,
// line and column name of what is wrong; every bad row is reported, not just
// the first.
package importers
