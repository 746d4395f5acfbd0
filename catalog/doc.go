// Package catalog is the user's lens catalog: an SQLite file (through the
// pure-Go modernc.org/sqlite) holding lens prescriptions, the user's
// glasses, the drawer of parts at hand and saved searches, with each part's
// first-order properties computed once and indexed so that a search by focal
// length or diameter does not scan.
//
// # The file
//
// The schema is a list of numbered migrations (migrations/0001_init.sql,
// ...), embedded in the program; each runs in its own transaction when a
// file is opened and sets PRAGMA user_version to its number. PRAGMA
// application_id is 0x43415244 ("CARD"): the program refuses a file that
// is another program's, or that a newer version of cardinal wrote, and
// changes nothing in it. Files use write-ahead logging, so a reader sees
// the catalog as it was before or after an import, never half of it. The
// import that creates a catalog builds it beside its place and puts it
// there when done (OpenNew, staged.go).
//
// Tables (lengths in mm, wavelengths in nm):
//
//	parts      one row per part: supplier, part (unique together),
//	           description, diameter_mm, clear_aperture_mm (as stated, 0 if
//	           not), kind (singlet, cemented, air-spaced), the supplier's
//	           stated_efl_mm, stated_bfd_mm, stated_edge_mm,
//	           stated_wavelength_nm, price, currency, url, notes, and a
//	           fingerprint of the row that tells an unchanged re-import
//	surfaces   the prescription: part_id, idx (1 = first surface in light
//	           order), radius_mm (NULL for a plane), conic, a4 ... a16,
//	           thickness_mm and glass to the next surface (NULL on the last)
//	glasses    the user's glasses: name, formula (sellmeier, cauchy,
//	           constant, abbe), coefficients (JSON array), min_nm, max_nm,
//	           source; built-in glasses and six-digit codes are not stored
//	computed   per part and orientation (reversed 0 or 1) at the d line:
//	           wavelength_nm, power_per_mm, efl_mm, bfd_mm, ffd_mm, p_mm,
//	           p_prime_mm (NULL focal values for an afocal part), length_mm,
//	           diameter_mm, clear_aperture_mm (as used); indexed on efl_mm,
//	           power_per_mm and diameter_mm
//	warnings   part_id, seq, message, computed (1 when it compares stated
//	           with computed values, worked out again when a glass changes)
//	drawer     part_id, quantity, location
//	searches   id, kind, requirement and results (JSON), created_at (RFC 3339)
//	search_index
//	           derived data: the packed records of what the first-order
//	           search needs, one row per chunk of 4,096 part ids (chunk =
//	           part id / 4096, parts = records in it, records), read in one
//	           sequential pass by SearchIndex (index.go documents the
//	           record and the chunk; RebuildIndex writes it anew)
//
// The view part_summary shows one readable row per part with its forward
// computed columns, power in dioptres, drawer quantity and warning count.
// Foreign keys are on: removing a part removes its rows in every table.
//
// # Consistency
//
// Every write is one transaction: an import with any bad row changes
// nothing and lists every problem with its line; importing the same rows
// again changes nothing; a changed row is updated and recomputed; a changed
// glass recomputes every part that uses it. The computed columns come from
// package optics, the same code that inspect and search use. The search
// index is written in the same transactions as the rows it is derived
// from (and built by the migration that adds it), so it is never stale.
package catalog
