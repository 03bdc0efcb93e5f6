// Package picture draws a build's operating point for people who would
// rather look than read: the IC–VCE plane with the DC and AC load lines,
// the saturation and cut-off regions, the nominal Q-point, the hull of the
// worst-case corners, the Monte Carlo boards at both ambient ends and the
// yield window; and a histogram of IC over the boards with the window and
// the worst-case band.
//
// It is a renderer shared by every front end (the command line today, a
// local web page later): it takes typed analysis results (Subject), never
// parses text, and knows no flags. Work is in two steps so tests can check
// what is drawn rather than pixels: LoadLine and Histogram build the chart
// data in SI units (amperes, volts) from the results; Render draws a chart
// with gonum.org/v1/plot as SVG, PNG or PDF, scaling to engineering units
// (mA, V) only on the axes.
//
// # Palette
//
// Colours are the eight-colour palette of Okabe and Ito ("Color Universal
// Design", 2008), chosen because its hues stay distinct for the common
// forms of colour-blindness (protan, deutan, tritan). Colour never carries
// meaning alone: every series also differs by marker shape, fill (open or
// filled) or line dash, and the fills are light behind dark outlines, so a
// greyscale print reads the same.
package picture
