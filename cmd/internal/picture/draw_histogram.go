package picture

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"biasbin/solver/notation"
)

// compose implements Chart.
func (h HistogramChart) compose() (*plot.Plot, plot.Legend) {
	x := "IC (mA)"
	if h.PNP {
		x = "|IC| (mA)"
	}
	p, leg := newPlot(h.Title, x, "boards per bin")
	p.Add(plotter.NewGrid())
	lo, hi := h.Bins[0].ICMin_A, h.Bins[len(h.Bins)-1].ICMax_A
	top := 0
	for _, b := range h.Bins {
		top = max(top, b.Cold, b.Hot, b.Between)
	}
	yTop := 1.16 * float64(max(top, 1))
	if h.HasWorst {
		lo, hi = math.Min(lo, h.WorstICMin_A), math.Max(hi, h.WorstICMax_A)
	}
	for _, v := range []float64{h.WindowICMin_A, h.WindowICMax_A} {
		if v > 0 && !math.IsInf(v, 1) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	pad := 0.04 * (hi - lo)
	lo, hi = math.Max(0, lo-pad), hi+pad

	// The worst-case band: a bar along the top with its ends marked down
	// to the axis, so it does not hide the bars it spans.
	var band *plotter.Polygon
	if h.HasWorst {
		yBar := yTop / 1.16 * 1.06
		band, _ = plotter.NewPolygon(plotter.XYs{{X: h.WorstICMin_A * mA, Y: yBar}, {X: h.WorstICMax_A * mA, Y: yBar}, {X: h.WorstICMax_A * mA, Y: yTop}, {X: h.WorstICMin_A * mA, Y: yTop}})
		band.Color = withAlpha(yellow, 0.6)
		band.LineStyle.Color, band.LineStyle.Width = orange, medium
		p.Add(band)
		for _, x := range []float64{h.WorstICMin_A, h.WorstICMax_A} {
			l, _ := plotter.NewLine(plotter.XYs{{X: x * mA}, {X: x * mA, Y: yTop}})
			l.Color, l.Width, l.Dashes = orange, medium, []vg.Length{vg.Points(2), vg.Points(2)}
			p.Add(l)
		}
	}
	steps := func(count func(Bin) int, col color.RGBA, fill color.Color) *plotter.Line {
		pts := plotter.XYs{{X: h.Bins[0].ICMin_A * mA}}
		for _, b := range h.Bins {
			n := float64(count(b))
			pts = append(pts, plotter.XY{X: b.ICMin_A * mA, Y: n}, plotter.XY{X: b.ICMax_A * mA, Y: n})
		}
		pts = append(pts, plotter.XY{X: h.Bins[len(h.Bins)-1].ICMax_A * mA})
		l, _ := plotter.NewLine(pts)
		l.Color, l.Width, l.FillColor = col, medium, fill
		return l
	}
	cold := steps(func(b Bin) int { return b.Cold }, blue, withAlpha(skyBlue, 0.45))
	hot := steps(func(b Bin) int { return b.Hot }, vermillion, nil)
	hot.Width = thick
	between := steps(func(b Bin) int { return b.Between }, black, withAlpha(color.RGBA{0x99, 0x99, 0x99, 0xff}, 0.5))
	var any [3]bool
	for _, b := range h.Bins {
		any[0], any[1], any[2] = any[0] || b.Cold > 0, any[1] || b.Hot > 0, any[2] || b.Between > 0
	}
	if any[2] {
		p.Add(between)
	}
	if any[0] {
		p.Add(cold)
	}
	if any[1] {
		p.Add(hot)
	}
	vline := func(x float64, col color.RGBA) *plotter.Line {
		l, _ := plotter.NewLine(plotter.XYs{{X: x * mA}, {X: x * mA, Y: yTop / 1.16 * 1.04}})
		l.Color, l.Width = col, thick
		return l
	}
	var win *plotter.Line
	for _, v := range []float64{h.WindowICMin_A, h.WindowICMax_A} {
		if v > 0 && !math.IsInf(v, 1) {
			win = vline(v, bluishGreen)
			win.Dashes = windowDashes
			p.Add(win)
		}
	}
	nom := vline(h.Nominal_A, black)
	nom.Width = thin
	p.Add(nom)

	if any[0] {
		leg.Add("IC at "+notation.FormatTemperature(h.AmbientMin_C), cold)
	}
	if any[1] {
		leg.Add("IC at "+notation.FormatTemperature(h.AmbientMax_C), hot)
	}
	if any[2] {
		leg.Add(fmt.Sprintf("IC, ambient %s..%s", notation.FormatTemperature(h.AmbientMin_C), notation.FormatTemperature(h.AmbientMax_C)), between)
	}
	leg.Add("nominal IC "+notation.FormatCurrent(h.Nominal_A), nom)
	if win != nil {
		leg.Add("yield window "+icRange(h.WindowICMin_A, h.WindowICMax_A), win)
	}
	if band != nil {
		leg.Add("worst case "+icRange(h.WorstICMin_A, h.WorstICMax_A), band)
	}
	leg.Add(fmt.Sprintf("%s of %s boards pass (IC and VCE)", count(h.Passed), count(h.Boards)))
	p.X.Min, p.X.Max = lo*mA, hi*mA
	p.Y.Min, p.Y.Max = 0, yTop
	return p, leg
}

// icRange writes an IC band, an open top as "and up".
func icRange(lo, hi float64) string {
	if math.IsInf(hi, 1) {
		return notation.FormatCurrent(lo) + " and up"
	}
	return notation.FormatCurrent(lo) + " to " + notation.FormatCurrent(hi)
}
