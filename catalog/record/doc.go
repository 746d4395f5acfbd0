// Package record holds the catalog's part record: a stock part with what
// its supplier states about it and what a purchase request needs (Entry),
// and a row of the user's drawer (DrawerItem). The readers in package
// importers produce these records, the store in package catalog keeps them
// and the search ranks them; none of them needs another's code to share
// the record.
//
// Units are those of package optics: millimetres and nanometres.
package record
