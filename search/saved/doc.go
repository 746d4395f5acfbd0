// Package saved keeps the searches that find runs, in the catalog they ran
// on: every run is saved with a number, so that later commands (request,
// draw, report, searches) can list it, show it again exactly as it was
// printed without searching, and rebuild chosen results into optical
// systems from the catalog's prescriptions.
//
// A Book is the saved searches of one catalog file. Save stores a Search,
// Load reads one back by reference (its number, or "last"), Search.Pick
// chooses results by the ranks find printed, Book.Pick reads the picked
// parts and the drawer from the catalog, and Picked.Rebuild turns them into
// solutions and says what the catalog has changed since. Searches run on
// the built-in demo catalog are kept with it; a reference "demo:N" (Ref)
// names one of them once the user has a catalog of their own.
//
// The catalog stores the bytes (package catalog, table searches); this
// package alone gives them their meaning: the requirement and results as
// package search encodes them in JSON, and an outcome object holding why
// nothing met the requirement, the nearest misses and the solver's notes.
package saved
