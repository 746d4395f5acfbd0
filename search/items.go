package search

import (
	"cardinal/catalog/record"
)

// Items pairs catalog entries with their drawer quantities (keyed by
// SUPPLIER:PART, as the catalog's Drawer returns them).
func Items(entries []record.Entry, drawer map[string]record.DrawerItem) []Item {
	out := make([]Item, len(entries))
	for i, e := range entries {
		out[i] = Item{Entry: e, Drawer: drawer[e.Part.ID()].Quantity}
	}
	return out
}
