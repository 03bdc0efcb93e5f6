package picture

import (
	"image/color"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// The Okabe–Ito colours (Okabe & Ito, "Color Universal Design", 2008).
var (
	black         = color.RGBA{0x00, 0x00, 0x00, 0xff}
	orange        = color.RGBA{0xe6, 0x9f, 0x00, 0xff}
	skyBlue       = color.RGBA{0x56, 0xb4, 0xe9, 0xff}
	bluishGreen   = color.RGBA{0x00, 0x9e, 0x73, 0xff}
	blue          = color.RGBA{0x00, 0x72, 0xb2, 0xff}
	vermillion    = color.RGBA{0xd5, 0x5e, 0x00, 0xff}
	reddishPurple = color.RGBA{0xcc, 0x79, 0xa7, 0xff}
	yellow        = color.RGBA{0xf0, 0xe4, 0x42, 0xff}
	regionGrey    = color.RGBA{0xd9, 0xd9, 0xd9, 0xff}
)

// withAlpha returns c at opacity a (0..1), premultiplied as image/color wants.
func withAlpha(c color.RGBA, a float64) color.RGBA {
	m := func(v uint8) uint8 { return uint8(float64(v)*a + 0.5) }
	return color.RGBA{m(c.R), m(c.G), m(c.B), uint8(255*a + 0.5)}
}

// traceStyle is how one build is told apart when several share the axes:
// a colour, a marker shape and a line dash, each enough on its own.
type traceStyle struct {
	color  color.RGBA
	filled draw.GlyphDrawer // the hot end and the nominal point
	open   draw.GlyphDrawer // the cold end
	dashes []vg.Length
}

// traceStyles are the styles of up to MaxCompare builds, in order.
var traceStyles = [MaxCompare]traceStyle{
	{blue, draw.CircleGlyph{}, draw.RingGlyph{}, nil},
	{vermillion, draw.PyramidGlyph{}, triangleRing{}, []vg.Length{vg.Points(6), vg.Points(3)}},
	{bluishGreen, draw.BoxGlyph{}, draw.SquareGlyph{}, []vg.Length{vg.Points(2), vg.Points(2)}},
	{reddishPurple, draw.CrossGlyph{}, draw.PlusGlyph{}, []vg.Length{vg.Points(8), vg.Points(2), vg.Points(2), vg.Points(2)}},
}

// triangleRing is an open upward triangle: the outline PyramidGlyph fills.
type triangleRing struct{}

// DrawGlyph implements draw.GlyphDrawer.
func (triangleRing) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	c.SetLineStyle(draw.LineStyle{Color: sty.Color, Width: vg.Points(0.8)})
	r := sty.Radius
	var p vg.Path
	p.Move(vg.Point{X: pt.X, Y: pt.Y + r})
	p.Line(vg.Point{X: pt.X - r*0.866, Y: pt.Y - r/2})
	p.Line(vg.Point{X: pt.X + r*0.866, Y: pt.Y - r/2})
	p.Close()
	c.Stroke(p)
}
