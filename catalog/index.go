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
// format is rebuilt (see IndexPart). The records are stored in chunks
// (chunkFormat).
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

// An indexDecoder takes records apart into IndexParts without an
// allocation per part: the floats, glass numbers and names of every part
// share a few large arrays, and the suppliers, currencies and glass names,
// few and repeated, are kept once each.
type indexDecoder struct {
	floats  []float64 // radii and thicknesses
	glass   []uint16
	names   []byte  // the names of the parts of the current chunk
	nameEnd []int32 // where each kept part's name ends in names
	glassNo map[string]uint16
	glasses []string // glass names, numbered as IndexPart.Glass numbers them
	words   map[string]string
}

// newIndexDecoder sizes the shared arrays for about n parts.
func newIndexDecoder(n int) *indexDecoder {
	return &indexDecoder{floats: make([]float64, 0, 5*n), glass: make([]uint16, 0, 2*n),
		glassNo: map[string]uint16{}, words: map[string]string{}}
}

func (d *indexDecoder) intern(b []byte) uint16 {
	if k, ok := d.glassNo[string(b)]; ok {
		return k
	}
	k := uint16(len(d.glasses))
	d.glasses = append(d.glasses, string(b))
	d.glassNo[string(b)] = k
	return k
}

func (d *indexDecoder) word(b []byte) string {
	if s, ok := d.words[string(b)]; ok {
		return s
	}
	s := string(b)
	d.words[s] = s
	return s
}

// decodeRecord takes apart a stored record into p, all but its name,
// which it returns (a slice of b).
func (d *indexDecoder) decodeRecord(b []byte, p *IndexPart) ([]byte, error) {
	if len(b) < 3 || b[0] != recordFormat {
		format := -1
		if len(b) > 0 {
			format = int(b[0])
		}
		return nil, fmt.Errorf("%w (format %d, this program reads %d)", errRecord, format, recordFormat)
	}
	flags, n := b[1], int(b[2])
	r := recordReader{b: b[3:]}
	p.ID = int64(r.uvarint())
	p.Supplier = d.word(r.bytes())
	name := r.bytes()
	p.Currency = d.word(r.bytes())
	if n < 2 || r.bad {
		return nil, errRecord
	}
	start := len(d.glass)
	for range n - 1 {
		d.glass = append(d.glass, d.intern(r.bytes()))
	}
	p.Glass = d.glass[start : start+n-1 : start+n-1]
	p.Diameter, p.Aperture, p.Price = r.float(), r.float(), r.float()
	p.Matrix = optics.Mat2{A: r.float(), B: r.float(), C: r.float(), D: r.float()}
	start = len(d.floats)
	for range 2*n - 1 {
		d.floats = append(d.floats, r.float())
	}
	p.Radii = d.floats[start : start+n : start+n]
	p.Thickness = d.floats[start+n : start+2*n-1 : start+2*n-1]
	p.Symmetric = flags&flagSymmetric != 0
	p.Conics = nil
	if flags&(flagFirstAsph|flagLastAsph) != 0 {
		p.Conics = &[2]optics.Surface{{Radius: p.Radii[0]}, {Radius: p.Radii[n-1]}}
		for k := range p.Conics {
			if s := &p.Conics[k]; flags&(flagFirstAsph<<k) != 0 {
				s.Conic = r.float()
				for i := range s.Asph {
					s.Asph[i] = r.float()
				}
			}
		}
	}
	if r.bad || len(r.b) != 0 {
		return nil, errRecord
	}
	return name, nil
}

// Chunks: the stored index is one row per chunk of part ids (chunkOf), each
// holding the records of its parts in the order of their ids: a chunk
// format byte, the number of records, then each record after its length.
// A change to a part rewrites the one chunk its id falls in.
const chunkFormat = 1

// chunkShift sets the size of a chunk: 4,096 part ids (a variable for the
// tests, which use chunks of a few parts).
var chunkShift = 12

// chunkOf is the chunk that holds the record of part id.
func chunkOf(id int64) int64 { return id >> chunkShift }

// encodeChunk packs records, each a stored record, in the order given.
func encodeChunk(records [][]byte) []byte {
	size := 1 + binary.MaxVarintLen64
	for _, r := range records {
		size += binary.MaxVarintLen64 + len(r)
	}
	buf := make([]byte, 0, size)
	buf = append(buf, chunkFormat)
	buf = binary.AppendUvarint(buf, uint64(len(records)))
	for _, r := range records {
		buf = binary.AppendUvarint(buf, uint64(len(r)))
		buf = append(buf, r...)
	}
	return buf
}

// openChunk checks a stored chunk's format and returns a reader at its
// first record and the number of records it says it holds.
func openChunk(b []byte) (recordReader, uint64, error) {
	if len(b) < 1 || b[0] != chunkFormat {
		return recordReader{}, 0, errRecord
	}
	r := recordReader{b: b[1:]}
	n := r.uvarint()
	if n > uint64(len(r.b)) {
		return recordReader{}, 0, errRecord
	}
	return r, n, nil
}

// splitChunk returns the records of a stored chunk (slices of b).
func splitChunk(b []byte) ([][]byte, error) {
	r, n, err := openChunk(b)
	if err != nil {
		return nil, err
	}
	out := make([][]byte, 0, n)
	for range n {
		out = append(out, r.bytes())
	}
	if r.bad || len(r.b) != 0 {
		return nil, errRecord
	}
	return out, nil
}

// recordID is the part id a stored record carries.
func recordID(b []byte) (int64, error) {
	if len(b) < 3 || b[0] != recordFormat {
		return 0, errRecord
	}
	r := recordReader{b: b[3:]}
	id := r.uvarint()
	if r.bad {
		return 0, errRecord
	}
	return int64(id), nil
}

// decodeChunk appends to parts the parts of a stored chunk that keep
// accepts, their names sharing one string.
func (d *indexDecoder) decodeChunk(b []byte, parts []IndexPart, keep func(*IndexPart) bool) ([]IndexPart, error) {
	r, n, err := openChunk(b)
	if err != nil {
		return parts, err
	}
	start := len(parts)
	d.names, d.nameEnd = d.names[:0], d.nameEnd[:0]
	for range n {
		rec := r.bytes()
		if r.bad {
			return parts, errRecord
		}
		parts = append(parts, IndexPart{})
		p := &parts[len(parts)-1]
		name, err := d.decodeRecord(rec, p)
		if err != nil {
			return parts, err
		}
		if !keep(p) {
			parts = parts[:len(parts)-1]
			continue
		}
		d.names = append(d.names, name...)
		d.nameEnd = append(d.nameEnd, int32(len(d.names)))
	}
	if len(r.b) != 0 {
		return parts, errRecord
	}
	names, from := string(d.names), int32(0)
	for i, end := range d.nameEnd {
		parts[start+i].Name = names[from:end]
		from = end
	}
	return parts, nil
}
