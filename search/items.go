package search

import "cardinal/importers"

// Items pairs catalog entries with their drawer quantities (keyed by
// SUPPLIER:PART, as the catalog's Drawer returns them).
func Items(entries []importers.Entry, drawer map[string]importers.DrawerItem) []Item {
	out := make([]Item, len(entries))
	for i, e := range entries {
		out[i] = Item{Entry: e, Drawer: drawer[e.Part.ID()].Quantity}
	}
	return out
}
