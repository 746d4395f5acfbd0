package record

import "cardinal/optics"

// An Entry is one row of a prescription file: a part, what its supplier
// states about it, and what a purchase request needs.
type Entry struct {
	Part optics.Part
	// Stated values from the supplier; zero means not stated.
	StatedEFL, StatedBFD, StatedEdge float64
	// StatedWavelength is the wavelength in nm of StatedEFL and StatedBFD;
	// zero means 587.6 nm.
	StatedWavelength float64
	Price            float64 // per piece; zero means not stated
	Currency         string
	URL, Notes       string
	// Tolerances are the part's stated manufacturing tolerances; a zero
	// field is not stated and takes the catalog's default.
	Tolerances optics.Tolerances
	// Line is the line of the source file the entry came from (0 if none).
	Line int
	// Warnings are problems that do not stop the part being used, such as a
	// stated EFL that differs from the computed one by more than 1 %.
	Warnings []string
}

// A DrawerItem is one row of the user's drawer: how many of a part the user
// holds and where.
type DrawerItem struct {
	Supplier, Part string
	Quantity       int
	Location       string // free text, such as "B2" or "cabinet 3, tray 1"
	Line           int    // source line, 0 if none
}

// ID returns SUPPLIER:PART.
func (d DrawerItem) ID() string { return d.Supplier + ":" + d.Part }
