package solution

import (
	"fmt"
	"math"
	"strings"

	"cardinal/search/present"
)

// A BuildPart is one part of a build sheet, in light order.
type BuildPart struct {
	Order       int     `json:"order"` // 1 for the part the light meets first
	Part        string  `json:"part"`  // SUPPLIER:PART
	Description string  `json:"description,omitempty"`
	Reversed    bool    `json:"reversed"`
	Orientation string  `json:"orientation"`
	DiameterMM  float64 `json:"diameter_mm"`
	// CentreMM is the part's axial length, first to last vertex.
	CentreMM float64 `json:"centre_thickness_mm"`
	// EdgeMM is the axial distance between its outer faces at the full
	// diameter.
	EdgeMM float64 `json:"edge_thickness_mm"`
}

// A Spacing is the space between two neighbouring parts: at the vertices
// (the optical gap) and between their rims at full diameter (what a
// spacer ring or tube section must be).
type Spacing struct {
	After    int     `json:"after_part"` // the order of the part before it
	VertexMM float64 `json:"vertex_gap_mm"`
	// EdgeMM is from the rim of the first part's last face to the rim of
	// the next part's first face, each at its own full diameter; negative
	// when the rims overlap along the axis (then the parts need cells of
	// their own).
	EdgeMM float64 `json:"edge_spacing_mm"`
}

// A Build is what a technician needs to put a solution together: the
// parts in order with their orientation, the axial distances at the
// vertices, the spacers between the parts' rims and the overall length.
type Build struct {
	Rank  int         `json:"rank"`
	Parts []BuildPart `json:"parts"`
	// ObjectToFirstMM is the object plane to the first vertex; nil for an
	// object at infinity.
	ObjectToFirstMM *float64  `json:"object_to_first_vertex_mm"`
	Spacings        []Spacing `json:"spacings"`
	// LastToImageMM is the last vertex to the image (or focal) plane; nil
	// for an afocal solution.
	LastToImageMM *float64 `json:"last_vertex_to_image_mm"`
	EnvelopeMM    float64  `json:"envelope_mm"`
	// OverallMM is the object plane to the image plane (the track) for a
	// finite object, the first vertex to the focal plane for an object at
	// infinity, the first to the last vertex for an afocal solution.
	OverallMM   float64 `json:"overall_length_mm"`
	OverallText string  `json:"overall_length_is"`
}

// rimZ is the axial position of the rim of a surface at height h, from
// its vertex: the surface's sag there. For a sphere the sag is
// s = R - sqrt(R^2 - h^2) with the radius's sign (optics.Surface.Sag).
func rimZ(s interface{ Sag(float64) (float64, bool) }, h float64) float64 {
	z, ok := s.Sag(h)
	if !ok {
		panic(fmt.Sprintf("solution: a surface that does not reach the %g mm semi-diameter", h))
	}
	return z
}

// Build makes the solution's build sheet.
func (s Solution) Build() Build {
	b := Build{Rank: s.Result.Rank, EnvelopeMM: s.Envelope()}
	facings := s.Facings()
	for i, p := range s.Parts {
		h := p.Diameter / 2
		edge := p.Length() - rimZ(p.Surfaces[0], h) + rimZ(p.Surfaces[len(p.Surfaces)-1], h)
		b.Parts = append(b.Parts, BuildPart{Order: i + 1, Part: facings[i].Part, Description: p.Description,
			Reversed: facings[i].Reversed, Orientation: facings[i].Facing, DiameterMM: p.Diameter, CentreMM: p.Length(), EdgeMM: edge})
	}
	for i, g := range s.Gaps {
		a, c := s.Parts[i], s.Parts[i+1]
		back := rimZ(a.Surfaces[len(a.Surfaces)-1], a.Diameter/2)
		front := rimZ(c.Surfaces[0], c.Diameter/2)
		b.Spacings = append(b.Spacings, Spacing{After: i + 1, VertexMM: g, EdgeMM: g - back + front})
	}
	b.OverallMM, b.OverallText = b.EnvelopeMM, "first to last vertex"
	if !math.IsInf(s.ObjectZ, -1) {
		wd := -s.ObjectZ
		b.ObjectToFirstMM = &wd
		b.OverallMM, b.OverallText = wd+b.EnvelopeMM, "object to last vertex"
	}
	if !s.Afocal() {
		bc := s.ImageZ
		b.LastToImageMM = &bc
		b.OverallMM += bc
		b.OverallText = "first vertex to focal plane"
		if b.ObjectToFirstMM != nil {
			b.OverallText = "object to image"
		}
	}
	return b
}

// Lines are the build sheet as numbered steps in words, in light order:
// what the request's notes, the drawing's legend and a plain-text reader
// show.
func (b Build) Lines(sides Sides) []string {
	var out []string
	if b.ObjectToFirstMM != nil {
		out = append(out, fmt.Sprintf("%s to first vertex %s mm", sides.Before, fmtMM(*b.ObjectToFirstMM)))
	}
	for i, p := range b.Parts {
		out = append(out, fmt.Sprintf("part %d: %s, %s", p.Order, p.Part, p.Orientation))
		if i < len(b.Spacings) {
			sp := b.Spacings[i]
			out = append(out, fmt.Sprintf("gap %s mm at the vertices; %s", fmtMM(sp.VertexMM), sp.edgeWords()))
		}
	}
	if b.LastToImageMM != nil {
		to := "image"
		if b.ObjectToFirstMM == nil {
			to = "focal plane"
		}
		out = append(out, fmt.Sprintf("last vertex to %s %s mm", to, fmtMM(*b.LastToImageMM)))
	}
	out = append(out, fmt.Sprintf("overall length, %s, %s mm", b.OverallText, fmtMM(b.OverallMM)))
	return out
}

// edgeWords says what the space between two parts' rims means for a
// spacer.
func (sp Spacing) edgeWords() string {
	if sp.EdgeMM < 0 {
		return fmt.Sprintf("the rims overlap by %s mm along the axis: mount the parts in separate cells", fmtMM(-sp.EdgeMM))
	}
	return fmt.Sprintf("spacer %s mm between the rims at full diameter", fmtMM(sp.EdgeMM))
}

// Text is the build sheet on one line, steps separated by semicolons.
func (b Build) Text(sides Sides) string { return strings.Join(b.Lines(sides), "; ") }

// fmtMM prints a length in mm to 0.01 mm, with no negative zero.
func fmtMM(v float64) string { return present.Fixed(v, 2) }

// BuildHeader returns the names of the build sheet's columns (Build.Rows).
func BuildHeader() []string {
	return []string{"step", "part or space", "orientation", "at the vertices (mm)", "at the rims (mm)"}
}

// Rows lays the build sheet out as a table, in light order: the object
// distance, each part (its centre and edge thickness) and the space after
// it (the vertex gap and the spacer between the rims), the distance to the
// image, and the overall length.
func (b Build) Rows(sides Sides) [][]string {
	var rows [][]string
	if b.ObjectToFirstMM != nil {
		rows = append(rows, []string{"", sides.Before + " to first vertex", "", fmtMM(*b.ObjectToFirstMM), ""})
	}
	for i, p := range b.Parts {
		rows = append(rows, []string{fmt.Sprint(p.Order), p.Part, p.Orientation, fmtMM(p.CentreMM) + " thick", fmtMM(p.EdgeMM) + " thick"})
		if i < len(b.Spacings) {
			sp := b.Spacings[i]
			rows = append(rows, []string{"", fmt.Sprintf("space between parts %d and %d", p.Order, p.Order+1), "", fmtMM(sp.VertexMM), fmtMM(sp.EdgeMM)})
		}
	}
	if b.LastToImageMM != nil {
		to := sides.After
		if b.ObjectToFirstMM == nil {
			to = "focal plane"
		}
		rows = append(rows, []string{"", "last vertex to " + to, "", fmtMM(*b.LastToImageMM), ""})
	}
	return append(rows, []string{"", "overall length, " + b.OverallText, "", fmtMM(b.OverallMM), ""})
}
