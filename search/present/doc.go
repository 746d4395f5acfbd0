// Package present is the one presentation model of cardinal's results: a
// table describes each column once (a key, a label, a unit) and each cell
// twice (the text a person reads, the raw value a program reads), and that
// one description is rendered as a terminal table that fits the terminal's
// width, as markdown, as CSV (one plain value per cell, the unit in the
// header, every cell through the injection-safe writer), as JSON and as an
// HTML table.
//
// Keys are snake_case with the unit in the name (efl_mm, price,
// error_pct): they are the CSV headers and the JSON keys, so one idea has
// one name in every format. Labels are what a terminal shows, with the
// unit after them ("EFL mm").
package present
