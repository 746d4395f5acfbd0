// Package cardinal holds what the whole program shares at the top of the
// module: the built-in demo data, embedded so that every command works before
// the user has a catalog of their own.
package cardinal

import "embed"

// Demo holds testdata/demo: an invented scenario (invented suppliers, part
// numbers and prices; realistic prescriptions), never real catalog data.
//
//go:embed testdata/demo
var Demo embed.FS
