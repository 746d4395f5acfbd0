package catalog

import (
	"encoding/binary"
	"errors"
	"fmt"
	"math"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// An IndexPart is what the search index holds of one part: exactly what
// the first-order search needs, and nothing a person reads but the name.
// The index is derived data, kept in step with parts, surfaces and glasses
// inside every transaction that changes them (see index.go's writers);
// the readable tables stay the record of the catalog.
//
// To carry a new per-part field: add it here, to encodeRecord and
// decodeRecord (after the last field), raise recordFormat, and add a
// migration named *_search_index*.sql that empties the table: Open then
// rebuilds every record (migrate.go, migrationHooks).
type IndexPart struct {
	ID             int64  // parts.id
	Supplier, Name string // together SUPPLIER:PART
	Diameter       float64
	Aperture       float64 // clear aperture as used: stated, or 90 % of the diameter
	Price          float64 // 0 when not stated
	Currency       string
	Symmetric      bool // the part is the same turned around
	// Matrix is the reduced matrix from the first to the last vertex at
	// the reference wavelength (the d line), in air, as package optics
	// computes it from the prescription: the stored cardinal points.
	Matrix optics.Mat2
	// Radii, Thickness and Glass are the paraxial prescription: all that
	// the cardinal points at another wavelength need. Glass[i] indexes
	// Index.Glasses (the medium after surface i).
	Radii, Thickness []float64
	Glass            []uint16
	// Conics holds the outer surfaces in full when either has conic or
	// asphere terms (nil for spheres, whose radius is all there is): see
	// First and Last.
	Conics   *[2]optics.Surface
	Quantity int // pieces in the drawer, from the drawer table when loaded
}

// First is the first surface in full, for the edge clearance between two
// parts.
func (p *IndexPart) First() optics.Surface {
	if p.Conics != nil {
		return p.Conics[0]
	}
	return optics.Surface{Radius: p.Radii[0]}
}

// Last is the last surface in full.
func (p *IndexPart) Last() optics.Surface {
	if p.Conics != nil {
		return p.Conics[1]
	}
	return optics.Surface{Radius: p.Radii[len(p.Radii)-1]}
}

// PartID returns SUPPLIER:PART.
func (p *IndexPart) PartID() string { return p.Supplier + ":" + p.Name }

// Length is the axial distance from the first to the last vertex, summed
// in the order optics.Part.Length sums it.
func (p *IndexPart) Length() float64 {
	l := 0.0
	for _, t := range p.Thickness {
		l += t
	}
	return l
}

// MatrixAt is the reduced matrix from the first to the last vertex in air,
// given n, the index at the wavelength of each of the index's glasses, and
// the index of air: the same products, in the same order, as
// optics.System.Matrix, so that the figures agree to the last bit.
func (p *IndexPart) MatrixAt(n []float64, air float64) optics.Mat2 {
	m := optics.Identity
	prev := air
	for i, r := range p.Radii {
		next := air
		if i < len(p.Glass) {
			next = n[p.Glass[i]]
		}
		m = m.Then(optics.Refraction((next - prev) * optics.Surface{Radius: r}.Curvature()))
		if i < len(p.Thickness) {
			m = m.Then(optics.Transfer(p.Thickness[i], next))
		}
		prev = next
	}
	return m
}

// recordFormat is the layout of the stored records; a record of another
// format is rebuilt (see IndexPart).
const recordFormat = 1

// record flags
const (
	flagSymmetric = 1 << iota
	flagFirstAsph // the first surface has conic or asphere terms
	flagLastAsph
)

// indexRecord is a part's record as stored, before its glass names are
// interned by the reader.
type indexRecord struct {
	IndexPart
	glasses []string
}

// newIndexRecord builds the record of a part whose media are those the
// catalog's glass table gives (so that the stored matrix is the one a
// search on the full prescription computes).
func newIndexRecord(id int64, e record.Entry) indexRecord {
	p := e.Part
	r := indexRecord{IndexPart: IndexPart{ID: id, Supplier: p.Supplier, Name: p.Name,
		Diameter: p.Diameter, Aperture: p.Aperture(), Price: e.Price, Currency: e.Currency,
		Symmetric: p.Symmetric(), Matrix: p.System(nil, nil).Matrix(Wavelength),
		Thickness: p.Thickness}}
	if first, last := p.Surfaces[0], p.Surfaces[len(p.Surfaces)-1]; isAsph(first) || isAsph(last) {
		r.Conics = &[2]optics.Surface{first, last}
	}
	r.Radii = make([]float64, len(p.Surfaces))
	for i, s := range p.Surfaces {
		r.Radii[i] = s.Radius
	}
	r.glasses = make([]string, len(p.Media))
	for i, m := range p.Media {
		r.glasses[i] = mediumName(m)
	}
	return r
}

// encode packs the record: format, flags, surface count, the strings with
// their lengths, then little-endian float64s.
func (r *indexRecord) encode(buf []byte) []byte {
	flags := byte(0)
	if r.Symmetric {
		flags |= flagSymmetric
	}
	if isAsph(r.First()) {
		flags |= flagFirstAsph
	}
	if isAsph(r.Last()) {
		flags |= flagLastAsph
	}
	buf = append(buf, recordFormat, flags, byte(len(r.Radii)))
	buf = binary.AppendUvarint(buf, uint64(r.ID))
	for _, s := range append([]string{r.Supplier, r.Name, r.Currency}, r.glasses...) {
		buf = binary.AppendUvarint(buf, uint64(len(s)))
		buf = append(buf, s...)
	}
	f := func(v float64) { buf = binary.LittleEndian.AppendUint64(buf, math.Float64bits(v)) }
	for _, v := range []float64{r.Diameter, r.Aperture, r.Price, r.Matrix.A, r.Matrix.B, r.Matrix.C, r.Matrix.D} {
		f(v)
	}
	for _, v := range r.Radii {
		f(v)
	}
	for _, v := range r.Thickness {
		f(v)
	}
	for _, s := range []optics.Surface{r.First(), r.Last()} {
		if isAsph(s) {
			f(s.Conic)
			for _, a := range s.Asph {
				f(a)
			}
		}
	}
	return buf
}

func isAsph(s optics.Surface) bool { return s.Conic != 0 || s.Asph != [7]float64{} }

// errRecord reports a record the reader cannot take apart.
var errRecord = errors.New("catalog: damaged search index record; restore the catalog from a backup or an export")

// recordReader takes a record apart.
type recordReader struct {
	b   []byte
	bad bool
}

func (d *recordReader) uvarint() uint64 {
	v, n := binary.Uvarint(d.b)
	if n <= 0 {
		d.bad, d.b = true, nil
		return 0
	}
	d.b = d.b[n:]
	return v
}

func (d *recordReader) bytes() []byte {
	n := d.uvarint()
	if n > uint64(len(d.b)) {
		d.bad, d.b = true, nil
		return nil
	}
	s := d.b[:n]
	d.b = d.b[n:]
	return s
}

func (d *recordReader) float() float64 {
	if len(d.b) < 8 {
		d.bad, d.b = true, nil
		return 0
	}
	v := math.Float64frombits(binary.LittleEndian.Uint64(d.b))
	d.b = d.b[8:]
	return v
}

// decodeRecord takes apart a stored record. intern turns a glass name
// into its number in the index and str the supplier and currency into
// strings (both may keep one copy of each); floats are taken from arena,
// which it returns grown.
func decodeRecord(b []byte, p *IndexPart, intern func([]byte) uint16, str func([]byte) string, arena []float64) ([]float64, error) {
	if len(b) < 3 || b[0] != recordFormat {
		return arena, fmt.Errorf("%w (format %d, this program reads %d)", errRecord, b[0], recordFormat)
	}
	flags, n := b[1], int(b[2])
	d := recordReader{b: b[3:]}
	p.ID = int64(d.uvarint())
	p.Supplier = str(d.bytes())
	p.Name = string(d.bytes())
	p.Currency = str(d.bytes())
	if n < 2 {
		return arena, errRecord
	}
	start := len(arena)
	glass := make([]uint16, n-1)
	for i := range glass {
		glass[i] = intern(d.bytes())
	}
	p.Diameter, p.Aperture, p.Price = d.float(), d.float(), d.float()
	p.Matrix = optics.Mat2{A: d.float(), B: d.float(), C: d.float(), D: d.float()}
	for i := 0; i < 2*n-1; i++ {
		arena = append(arena, d.float())
	}
	p.Radii = arena[start : start+n : start+n]
	p.Thickness = arena[start+n : start+2*n-1 : start+2*n-1]
	p.Glass = glass
	p.Symmetric = flags&flagSymmetric != 0
	p.Conics = nil
	if flags&(flagFirstAsph|flagLastAsph) != 0 {
		p.Conics = &[2]optics.Surface{{Radius: p.Radii[0]}, {Radius: p.Radii[n-1]}}
		for k := range p.Conics {
			if s := &p.Conics[k]; flags&(flagFirstAsph<<k) != 0 {
				s.Conic = d.float()
				for i := range s.Asph {
					s.Asph[i] = d.float()
				}
			}
		}
	}
	if d.bad || len(d.b) != 0 {
		return arena, errRecord
	}
	return arena, nil
}
