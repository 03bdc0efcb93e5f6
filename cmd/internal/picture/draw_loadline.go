package picture

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"biasbin/solver/notation"
)

// Plot units: the axes are in volts and milliamperes.
const mA = 1e3

// xy is a point in plot units.
func xy(p Point) plotter.XY { return plotter.XY{X: p.VCE_V, Y: p.IC_A * mA} }

// xys converts points to plot units.
func xys(pts []Point) plotter.XYs {
	out := make(plotter.XYs, len(pts))
	for i, p := range pts {
		out[i] = xy(p)
	}
	return out
}

// clamp keeps an open box side at the axis end.
func (c *LoadLineChart) clamp(b Box) Box {
	b.VCEMax_V = math.Min(b.VCEMax_V, c.VCEAxis_V)
	b.ICMax_A = math.Min(b.ICMax_A, c.ICAxis_A)
	return b
}

// corners lists a box's corners counter-clockwise, in plot units.
func (b Box) corners() plotter.XYs {
	return xys([]Point{{b.VCEMin_V, b.ICMin_A}, {b.VCEMax_V, b.ICMin_A}, {b.VCEMax_V, b.ICMax_A}, {b.VCEMin_V, b.ICMax_A}})
}

// compose implements Chart.
func (c LoadLineChart) compose() (*plot.Plot, plot.Legend) {
	x, y := "VCE (V)", "IC (mA)"
	if c.PNP {
		x, y = "|VCE| (V)", "|IC| (mA)"
	}
	p, leg := newPlot(c.Title, x, y)
	p.Add(plotter.NewGrid())
	region := func(b Box) *plotter.Polygon {
		poly, _ := plotter.NewPolygon(b.corners())
		poly.Color = regionGrey
		poly.LineStyle.Width = 0
		return poly
	}
	sat, cut := region(c.Saturation), region(c.Cutoff)
	p.Add(sat, cut)
	if len(c.Traces) == 1 {
		c.composeOne(p, &leg)
	} else {
		c.composeMany(p, &leg)
	}
	if len(c.Traces) == 1 {
		leg.Add(fmt.Sprintf("saturation, VCE < %s", notation.FormatVoltage(c.Saturation.VCEMax_V)), sat)
		leg.Add("cut-off, IC ≈ 0", cut)
	} else if c.VCEAxisMin_V < c.Saturation.VCEMax_V || c.ICAxisMin_A < c.Cutoff.ICMax_A {
		leg.Add(fmt.Sprintf("grey: saturation (VCE < %s), cut-off (IC ≈ 0)", notation.FormatVoltage(c.Saturation.VCEMax_V)), sat)
	}
	if c.Zoomed {
		leg.Add("(axes zoomed on the spread)")
	}
	p.X.Min, p.X.Max = c.VCEAxisMin_V, c.VCEAxis_V
	p.Y.Min, p.Y.Max = c.ICAxisMin_A*mA, c.ICAxis_A*mA
	return p, leg
}

// Line widths.
var (
	thin   = vg.Points(1)
	medium = vg.Points(1.6)
	thick  = vg.Points(2.2)
)

// windowDashes is the dash-dot of the yield window's box.
var windowDashes = []vg.Length{vg.Points(7), vg.Points(3), vg.Points(2), vg.Points(3)}

// acDashes is the dash of the AC load line.
var acDashes = []vg.Length{vg.Points(5), vg.Points(3)}

// composeOne draws a single build: colours tell the parts of the picture
// apart (the ambient ends, the hull, the window).
func (c *LoadLineChart) composeOne(p *plot.Plot, leg *plot.Legend) {
	t := c.Traces[0]
	win := c.windowLine(t.Window, bluishGreen)
	hull := c.hull(t, withAlpha(yellow, 0.45), orange)
	if hull != nil {
		p.Add(hull)
	}
	between := scatter(t.Cloud.Between, draw.CircleGlyph{}, withAlpha(color.RGBA{0x60, 0x60, 0x60, 0xff}, 0.5), 1.3)
	cold := scatter(t.Cloud.Cold, draw.RingGlyph{}, withAlpha(blue, 0.55), 1.8)
	hot := scatter(t.Cloud.Hot, draw.PyramidGlyph{}, withAlpha(vermillion, 0.45), 1.8)
	p.Add(between, hot, cold, win) // open rings over the filled markers
	dc := line(t.DC[:], black, medium, nil)
	p.Add(dc)
	var ac *plotter.Line
	if t.AC != nil {
		ac = line(t.AC, black, medium, acDashes)
		p.Add(ac)
	}
	corners := scatter(t.Corners, draw.CrossGlyph{}, color.RGBA{0x80, 0x50, 0x00, 0xff}, 2)
	nominal := scatter([]Point{t.Nominal}, draw.BoxGlyph{}, black, 4.5)
	p.Add(corners, nominal)

	leg.Add("DC load line", dc)
	if ac != nil {
		leg.Add("AC load line, slope −1/r_ac", ac)
	}
	leg.Add(fmt.Sprintf("nominal Q-point, %s at %s", notation.FormatCurrent(t.Nominal.IC_A), notation.FormatVoltage(t.Nominal.VCE_V)), nominal)
	if len(t.Corners) > 0 {
		leg.Add(fmt.Sprintf("worst case: %d corners and hull", len(t.Corners)), hullThumb(hull), corners)
	}
	// Larger, opaque copies of the markers for the legend.
	c.cloudLegend(leg, t, scatter(nil, draw.RingGlyph{}, blue, 3.5), scatter(nil, draw.PyramidGlyph{}, vermillion, 3.5),
		scatter(nil, draw.CircleGlyph{}, color.RGBA{0x60, 0x60, 0x60, 0xff}, 3))
	leg.Add("yield window", win)
	if t.Cloud.Boards > 0 {
		leg.Add(fmt.Sprintf("%s of %s boards pass", count(t.Cloud.Passed), count(t.Cloud.Boards)))
	}
}

// cloudLegend names the Monte Carlo markers and how many boards are drawn.
func (c *LoadLineChart) cloudLegend(leg *plot.Legend, t Trace, cold, hot, between plot.Thumbnailer) {
	if len(t.Cloud.Cold) > 0 {
		leg.Add("board at "+notation.FormatTemperature(t.AmbientMin_C), cold)
	}
	if len(t.Cloud.Hot) > 0 {
		leg.Add("board at "+notation.FormatTemperature(t.AmbientMax_C), hot)
	}
	if len(t.Cloud.Between) > 0 {
		leg.Add(fmt.Sprintf("board, ambient %s..%s", notation.FormatTemperature(t.AmbientMin_C), notation.FormatTemperature(t.AmbientMax_C)), between)
	}
	if t.Cloud.Drawn > 0 && t.Cloud.Drawn < t.Cloud.Boards {
		leg.Add(fmt.Sprintf("(%s of %s Monte Carlo boards drawn)", count(t.Cloud.Drawn), count(t.Cloud.Boards)))
	}
}

// composeMany overlays several builds: each build has its own colour,
// marker and dash; open markers are the cold end, filled the hot end.
func (c *LoadLineChart) composeMany(p *plot.Plot, leg *plot.Legend) {
	sameWindow := true
	for _, t := range c.Traces[1:] {
		sameWindow = sameWindow && t.Window == c.Traces[0].Window
	}
	if sameWindow {
		win := c.windowLine(c.Traces[0].Window, black)
		p.Add(win)
		defer leg.Add("yield window", win)
	}
	for i, t := range c.Traces {
		st := traceStyles[i]
		hull := c.hull(t, withAlpha(st.color, 0.15), st.color)
		if hull != nil {
			hull.LineStyle.Dashes = st.dashes // tells the hulls apart in greyscale
			p.Add(hull)
		}
		if !sameWindow {
			p.Add(c.windowLine(t.Window, st.color))
		}
	}
	ends := scatter(nil, traceStyles[0].open, black, 3.5)
	for i := len(c.Traces) - 1; i >= 0; i-- { // the first build's boards on top
		t, st := c.Traces[i], traceStyles[i]
		cold := scatter(t.Cloud.Cold, st.open, withAlpha(st.color, 0.6), 2)
		hot := scatter(t.Cloud.Hot, st.filled, withAlpha(st.color, 0.45), 2)
		between := scatter(t.Cloud.Between, st.filled, withAlpha(st.color, 0.45), 1.6)
		p.Add(cold, hot, between)
	}
	thumbs := make([][]plot.Thumbnailer, len(c.Traces))
	for i := len(c.Traces) - 1; i >= 0; i-- { // the first build on top
		t, st := c.Traces[i], traceStyles[i]
		dc := line(t.DC[:], st.color, medium, st.dashes)
		nominal := scatter([]Point{t.Nominal}, st.filled, st.color, 5)
		outline := scatter([]Point{t.Nominal}, st.open, black, 5.5)
		p.Add(dc, nominal, outline)
		thumbs[i] = []plot.Thumbnailer{dc, nominal, outline}
	}
	for i, t := range c.Traces {
		leg.Add(t.Name, thumbs[i]...)
	}
	t := c.Traces[0]
	leg.Add("large marker: nominal Q-point; outline in the line's dash: worst-case hull")
	if len(t.Cloud.Cold) > 0 && len(t.Cloud.Hot) > 0 {
		leg.Add(fmt.Sprintf("open: board at %s; filled: at %s", notation.FormatTemperature(t.AmbientMin_C), notation.FormatTemperature(t.AmbientMax_C)), ends)
	}
	if t.Cloud.Drawn > 0 && t.Cloud.Drawn < t.Cloud.Boards {
		leg.Add(fmt.Sprintf("(the first %s Monte Carlo boards of each build drawn)", count(t.Cloud.Drawn)))
	}
}

// windowLine outlines the yield window, open sides drawn at the axis end.
func (c *LoadLineChart) windowLine(w Box, col color.RGBA) *plotter.Line {
	b := c.clamp(w)
	pts := append(b.corners(), b.corners()[0])
	l, _ := plotter.NewLine(pts)
	l.Color, l.Width, l.Dashes = col, thick, windowDashes
	return l
}

// hull is the worst-case corners' hull as a filled polygon; nil with fewer
// than three distinct corners (the corners themselves are drawn).
func (c *LoadLineChart) hull(t Trace, fill, edge color.RGBA) *plotter.Polygon {
	if len(t.Hull) < 3 {
		return nil
	}
	poly, err := plotter.NewPolygon(xys(t.Hull))
	if err != nil {
		return nil
	}
	poly.Color = fill
	poly.LineStyle = draw.LineStyle{Color: edge, Width: medium}
	return poly
}

// hullThumb is a legend thumbnail for a hull that may be missing.
func hullThumb(h *plotter.Polygon) plot.Thumbnailer {
	if h == nil {
		return emptyThumb{}
	}
	return h
}

// emptyThumb draws nothing.
type emptyThumb struct{}

// Thumbnail implements plot.Thumbnailer.
func (emptyThumb) Thumbnail(*draw.Canvas) {}

// line is a polyline in plot units.
func line(pts []Point, col color.RGBA, width vg.Length, dashes []vg.Length) *plotter.Line {
	l, _ := plotter.NewLine(xys(pts))
	l.Color, l.Width, l.Dashes = col, width, dashes
	return l
}

// scatter is a set of markers in plot units.
func scatter(pts []Point, g draw.GlyphDrawer, col color.Color, radius float64) *plotter.Scatter {
	s, _ := plotter.NewScatter(xys(pts))
	s.GlyphStyle = draw.GlyphStyle{Color: col, Radius: vg.Points(radius), Shape: g}
	return s
}

// count writes a count with thousands separators: 10000 → "10,000".
func count(n int) string {
	s := fmt.Sprint(n)
	for i := len(s) - 3; i > 0 && s[i-1] != '-'; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}
