// Package report writes one self-contained printable HTML page for the
// results picked from a saved search (WriteReport): the requirement, the
// ranked results, and for each pick its drawing (package drawing), its
// spot figures (package plots), its real-ray figures, its build sheet and
// build study, then the purchase request (package purchase) and the
// cautions. The page needs no network and no script.
//
// Units are those of package optics: millimetres and nanometres. Inputs
// are never modified. A wrong argument from the program panics with a
// "report: " message; bad data from a user is an error value.
package report
