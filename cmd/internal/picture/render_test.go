package picture

import (
	"bytes"
	"encoding/xml"
	"errors"
	"image/png"
	"io"
	"strings"
	"testing"
)

// TestRenderFormats checks that each format is a valid file of the
// requested size: SVG parses as XML with an <svg> root of that size, PNG
// decodes (image/png) to exactly that many pixels, PDF starts with %PDF-
// and ends with %%EOF (ISO 32000-1 §7.5.2 and §7.5.5, from memory for the
// clauses).
func TestRenderFormats(t *testing.T) {
	s := subjectOf(t, dividerFixture(), 200)
	ll, err := LoadLine([]Subject{s}, LoadLineOptions{})
	if err != nil {
		t.Fatal(err)
	}
	h, err := Histogram(s)
	if err != nil {
		t.Fatal(err)
	}
	cmp, err := LoadLine([]Subject{s, subjectOf(t, feedbackFixture(), 200)}, LoadLineOptions{})
	if err != nil {
		t.Fatal(err)
	}
	size := Size{Width_px: 800, Height_px: 500}
	for name, c := range map[string]Chart{"load line": ll, "histogram": h, "compare": cmp} {
		for _, f := range []Format{SVG, PNG, PDF} {
			var buf bytes.Buffer
			if err := Render(&buf, c, f, size); err != nil {
				t.Fatalf("%s %v: %v", name, f, err)
			}
			data := buf.Bytes()
			switch f {
			case SVG:
				checkSVG(t, name, data, "600pt", "375pt")
				if !bytes.Contains(data, []byte("Arial,Helvetica,sans-serif")) || bytes.Contains(data, []byte("font-family:Liberation Sans;")) {
					t.Errorf("%s: SVG text names no typeface to fall back on", name)
				}
			case PNG:
				img, err := png.Decode(bytes.NewReader(data))
				if err != nil {
					t.Fatalf("%s: PNG does not decode: %v", name, err)
				}
				if b := img.Bounds(); b.Dx() != 800 || b.Dy() != 500 {
					t.Errorf("%s: PNG %dx%d, want 800x500", name, b.Dx(), b.Dy())
				}
			case PDF:
				if !bytes.HasPrefix(data, []byte("%PDF-")) || !bytes.HasSuffix(bytes.TrimRight(data, "\r\n"), []byte("%%EOF")) {
					t.Errorf("%s: PDF starts %q, ends %q", name, data[:min(8, len(data))], data[max(0, len(data)-8):])
				}
				if !bytes.Contains(data, []byte("/MediaBox [0 0 600.00 375.00]")) {
					t.Errorf("%s: PDF has no 600x375 pt page", name)
				}
			}
		}
	}
}

// checkSVG parses data as XML and checks the root element's size.
func checkSVG(t *testing.T, name string, data []byte, w, h string) {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(data))
	root := true
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatalf("%s: SVG is not well-formed XML: %v", name, err)
		}
		if se, ok := tok.(xml.StartElement); ok && root {
			root = false
			attr := map[string]string{}
			for _, a := range se.Attr {
				attr[a.Name.Local] = a.Value
			}
			if se.Name.Local != "svg" || attr["width"] != w || attr["height"] != h {
				t.Errorf("%s: root <%s width=%q height=%q>, want <svg width=%q height=%q>", name, se.Name.Local, attr["width"], attr["height"], w, h)
			}
		}
	}
	if root {
		t.Errorf("%s: SVG has no element", name)
	}
}

// TestFormatAndSize checks the file-name and size parsing.
func TestFormatAndSize(t *testing.T) {
	for _, tc := range []struct {
		path string
		want Format
		ok   bool
	}{{"q.svg", SVG, true}, {"Q.PNG", PNG, true}, {"out/q.pdf", PDF, true}, {"q.jpg", 0, false}, {"q", 0, false}} {
		f, err := FormatOf(tc.path)
		if (err == nil) != tc.ok || tc.ok && f != tc.want {
			t.Errorf("FormatOf(%q) = %v, %v; want %v, ok %v", tc.path, f, err, tc.want, tc.ok)
		}
		if err != nil && !strings.Contains(err.Error(), ".svg, .png or .pdf") {
			t.Errorf("FormatOf(%q): error %q does not name the accepted types", tc.path, err)
		}
	}
	for _, tc := range []struct {
		in   string
		want Size
		ok   bool
	}{{"1200x800", Size{1200, 800}, true}, {" 960 X 600 ", Size{960, 600}, true}, {"100x100", Size{}, false}, {"9000x600", Size{}, false}, {"wide", Size{}, false}, {"800x", Size{}, false}} {
		got, err := ParseSize(tc.in)
		if (err == nil) != tc.ok || tc.ok && got != tc.want {
			t.Errorf("ParseSize(%q) = %v, %v; want %v, ok %v", tc.in, got, err, tc.want, tc.ok)
		}
	}
}

// TestTicks checks the axis labels land on round steps (common practice
// for chart axes: steps of 1, 2 or 5 times a power of ten).
func TestTicks(t *testing.T) {
	for _, tc := range []struct {
		lo, hi float64
		labels string
	}{
		{0, 12.6, "0 2 4 6 8 10 12"},
		{0, 5.6, "0 1 2 3 4 5"},
		{1.9, 3.7, "2.0 2.2 2.4 2.6 2.8 3.0 3.2 3.4 3.6"},
	} {
		var got []string
		for _, tk := range (niceTicks{}).Ticks(tc.lo, tc.hi) {
			if tk.Label != "" {
				got = append(got, tk.Label)
			}
		}
		if g := strings.Join(got, " "); g != tc.labels {
			t.Errorf("ticks %g..%g: %q, want %q", tc.lo, tc.hi, g, tc.labels)
		}
	}
}
