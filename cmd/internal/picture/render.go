package picture

import (
	"bytes"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgpdf"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Format is a picture file format.
type Format int

// The formats Render writes.
const (
	SVG Format = iota
	PNG
	PDF
)

// String is the format's file extension without the dot.
func (f Format) String() string {
	switch f {
	case SVG:
		return "svg"
	case PNG:
		return "png"
	case PDF:
		return "pdf"
	}
	return "format(" + strconv.Itoa(int(f)) + ")"
}

// FormatOf picks the format from a file name's extension (any letter case).
func FormatOf(path string) (Format, error) {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".svg":
		return SVG, nil
	case ".png":
		return PNG, nil
	case ".pdf":
		return PDF, nil
	}
	return 0, fmt.Errorf("%s: unknown picture type %q: want a name ending .svg, .png or .pdf", path, filepath.Ext(path))
}

// Size is a picture's size in CSS pixels (1/96 inch): a PNG has exactly
// this many pixels, an SVG or PDF is this size at 96 pixels per inch
// (0.75 pt per pixel).
type Size struct {
	Width_px, Height_px int
}

// DefaultSize fits a laptop screen or half a printed page with the text
// at its natural size.
var DefaultSize = Size{Width_px: 960, Height_px: 600}

// Size limits: below the minimum the legend and labels no longer fit.
const (
	MinSide_px = 480
	MaxSide_px = 8000
)

// ParseSize reads "WIDTHxHEIGHT" in pixels, e.g. "1200x800".
func ParseSize(s string) (Size, error) {
	ws, hs, ok := strings.Cut(strings.ToLower(strings.TrimSpace(s)), "x")
	w, errW := strconv.Atoi(strings.TrimSpace(ws))
	h, errH := strconv.Atoi(strings.TrimSpace(hs))
	if !ok || errW != nil || errH != nil {
		return Size{}, fmt.Errorf("%q: want WIDTHxHEIGHT in pixels, e.g. %dx%d", s, DefaultSize.Width_px, DefaultSize.Height_px)
	}
	sz := Size{w, h}
	return sz, sz.Validate()
}

// Validate refuses a size outside MinSide_px..MaxSide_px on either side.
func (s Size) Validate() error {
	if s.Width_px < MinSide_px || s.Width_px > MaxSide_px || s.Height_px < MinSide_px/2 || s.Height_px > MaxSide_px {
		return fmt.Errorf("%dx%d pixels: want a width of %d to %d and a height of %d to %d", s.Width_px, s.Height_px, MinSide_px, MaxSide_px, MinSide_px/2, MaxSide_px)
	}
	return nil
}

// points is a length in pixels as a vg length (0.75 pt per pixel).
func points(px int) vg.Length { return vg.Length(px) * vg.Inch / 96 }

// Chart is a picture's data: a LoadLineChart or a HistogramChart.
type Chart interface {
	// compose returns the plot and its legend, drawn beside it.
	compose() (*plot.Plot, plot.Legend)
}

// Render draws c into w as format f at size s.
func Render(w io.Writer, c Chart, f Format, s Size) error {
	if err := s.Validate(); err != nil {
		return fmt.Errorf("picture size %w", err)
	}
	wd, ht := points(s.Width_px), points(s.Height_px)
	var cw vg.CanvasWriterTo
	switch f {
	case SVG:
		cw = vgsvg.New(wd, ht)
	case PNG:
		cw = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(wd, ht), vgimg.UseDPI(96))}
	case PDF:
		cw = vgpdf.New(wd, ht)
	default:
		return fmt.Errorf("picture: unknown format %v", f)
	}
	p, leg := c.compose()
	dc := draw.New(cw)
	legSize := leg.Rectangle(dc).Size()
	legW := legSize.X + vg.Points(6)
	margin := vg.Points(8)
	if legW <= 0.36*wd { // beside the plot
		p.Draw(draw.Crop(dc, margin, -(legW + 2*margin), margin, -margin))
		top := p.Title.TextStyle.Height(p.Title.Text) + p.Title.Padding + 2*margin
		leg.Draw(draw.Crop(dc, wd-legW-margin, -margin, margin, -top))
	} else { // a long legend goes under the plot
		legH := legSize.Y + vg.Points(6)
		p.Draw(draw.Crop(dc, margin, -margin, legH+2*margin, -margin))
		leg.Draw(draw.Crop(dc, 4*margin, -margin, margin, -(ht - legH - margin)))
	}
	if f == SVG {
		// The SVG names the typeface without embedding it; Arial and
		// Helvetica share Liberation Sans's metrics, so a viewer without it
		// still lays the text out as drawn.
		var buf bytes.Buffer
		if _, err := cw.WriteTo(&buf); err != nil {
			return fmt.Errorf("picture: write %s: %w", f, err)
		}
		_, err := w.Write(bytes.ReplaceAll(buf.Bytes(), []byte("font-family:Liberation Sans;"), []byte(svgFonts)))
		if err != nil {
			return fmt.Errorf("picture: write %s: %w", f, err)
		}
		return nil
	}
	if _, err := cw.WriteTo(w); err != nil {
		return fmt.Errorf("picture: write %s: %w", f, err)
	}
	return nil
}

// svgFonts is the SVG's font list: Liberation Sans, then the faces with
// the same metrics (Arial, Helvetica), then any sans-serif.
const svgFonts = "font-family:'Liberation Sans',Arial,Helvetica,sans-serif;"

// Text sizes: 11 pt and up reads at 100 % on a screen and on paper.
const (
	titleSize  = 14
	labelSize  = 13
	tickSize   = 11
	legendSize = 11
)

// sans is the typeface of every text: a sans-serif reads better in small
// technical labels than the serif gonum starts with.
var sans = font.Font{Typeface: "Liberation", Variant: "Sans"}

// newPlot is a plot with the house style: sans-serif text at readable
// sizes, a light grid, axes from zero.
func newPlot(title, xLabel, yLabel string) (*plot.Plot, plot.Legend) {
	p := plot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font = font.From(sans, titleSize)
	p.Title.Padding = vg.Points(8)
	for _, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Label.TextStyle.Font = font.From(sans, labelSize)
		ax.Tick.Label.Font = font.From(sans, tickSize)
		ax.Padding = vg.Points(2)
		ax.Tick.Marker = niceTicks{}
	}
	p.X.Label.Text, p.Y.Label.Text = xLabel, yLabel
	leg := plot.NewLegend()
	leg.TextStyle = text.Style{Color: black, Font: font.From(sans, legendSize), Handler: p.TextHandler}
	leg.Top, leg.Left = true, true
	leg.ThumbnailWidth = vg.Points(22)
	leg.Padding = vg.Points(3)
	return p, leg
}
