package picture

import (
	"math"
	"testing"

	"biasbin/solver"
)

// near reports whether got is within rel of want.
func near(got, want, rel float64) bool { return math.Abs(got-want) <= rel*math.Abs(want) }

// TestDCLoadLineEnds checks the drawn DC load line's end points against
// the textbook definition (REFERENCE.md §7: IC(sat) = VCC/(RC+RE) on the IC
// axis, VCE(cut) = VCC on the VCE axis; Malvino 7th ed. ch. 8, from
// memory). The split-supply stage spans VCC − VEE; the collector-feedback
// stage's RC carries IC (its base current neglected, as the definition
// does). The values are the fixtures' marked resistors and rails.
func TestDCLoadLineEnds(t *testing.T) {
	for _, tc := range []struct {
		name          string
		b             solver.Build
		span_V, rdc_Ω float64
	}{
		{"divider", dividerFixture(), 12, 2.2e3 + 470},
		{"collector feedback", feedbackFixture(), 12, 2.2e3 + 470},
		{"split supply", splitFixture(), 18, 3.3e3 + 4.7e3},
	} {
		c, err := LoadLine([]Subject{subjectOf(t, tc.b, 50)}, LoadLineOptions{})
		if err != nil {
			t.Fatal(err)
		}
		dc := c.Traces[0].DC
		cut, sat := dc[0], dc[1]
		if cut.IC_A != 0 || !near(cut.VCE_V, tc.span_V, 1e-12) {
			t.Errorf("%s: cut-off end (%g V, %g A), want (%g V, 0)", tc.name, cut.VCE_V, cut.IC_A, tc.span_V)
		}
		if sat.VCE_V != 0 || !near(sat.IC_A, tc.span_V/tc.rdc_Ω, 1e-12) {
			t.Errorf("%s: saturation end (%g V, %g A), want (0, %g A)", tc.name, sat.VCE_V, sat.IC_A, tc.span_V/tc.rdc_Ω)
		}
		if c.VCEAxis_V < tc.span_V || c.ICAxis_A < tc.span_V/tc.rdc_Ω {
			t.Errorf("%s: axes end at %g V, %g A: the load line does not fit", tc.name, c.VCEAxis_V, c.ICAxis_A)
		}
		if tc.b.RL_Ohm == 0 && c.Traces[0].AC != nil {
			t.Errorf("%s: an AC load line without an AC load", tc.name)
		}
	}
}

// TestACLoadLine checks the AC load line: through the Q-point with slope
// −1/r_ac, r_ac = RC‖RL + unbypassed RE (REFERENCE.md §7 and §19).
func TestACLoadLine(t *testing.T) {
	// Own fixture: RC 2K2, RL 10K, RE fully bypassed, so r_ac = 2.2k‖10k
	// = 1803.3 Ω (REFERENCE.md §7, the check example's r_ac).
	s := subjectOf(t, dividerFixture(), 50)
	// Malvino & Bates, Electronic Principles, 7th ed., Example 12-2
	// (p. 384), via REFERENCE.md §19: VCC 30 V, R1 490 Ω, R2 68 Ω,
	// RC 120 Ω, RE 20 Ω bypassed, RL 180 Ω; r_c = 72 Ω; the book's
	// ic(sat) 273 mA and vce(cut) 19.7 V unrounded 277.08 mA and 19.9499 V
	// (REFERENCE.md §19 [D], a stiff divider and VBE = 0.7 V). The exact
	// solve loads the divider with the base current, so within 1 %.
	book := solver.Build{
		Topology: solver.Divider, VCC_V: 30, RL_Ohm: 180, RBypass_Ohm: 20,
		Device:       solver.Datasheet{Polarity: solver.NPN, HFEMin: 200, HFEMax: 400, VBEOn_V: 0.7, VBEAt_A: 0.15, VCESat_V: 0.2},
		AmbientMin_C: 25, AmbientMax_C: 25, NominalAmbient_C: 25,
	}
	for sl, r := range map[solver.Slot]float64{solver.R1: 490, solver.R2: 68, solver.RC: 120, solver.RE: 20} {
		book.Resistors[sl] = solver.ResistorSpec{Nominal_Ohm: r, Tol: 0.01}
	}
	bs := subjectOf(t, book, 50)
	for _, tc := range []struct {
		name            string
		s               Subject
		rac_Ω           float64
		icSat_A, vceCut float64 // 0: not checked
	}{
		{"own, RC‖RL", s, 2.2e3 * 10e3 / 12.2e3, 0, 0},
		{"Malvino Ex. 12-2", bs, 72, 0.27708, 19.9499},
	} {
		c, err := LoadLine([]Subject{tc.s}, LoadLineOptions{})
		if err != nil {
			t.Fatal(err)
		}
		tr := c.Traces[0]
		if len(tr.AC) != 2 {
			t.Fatalf("%s: AC load line %v, want two end points", tc.name, tr.AC)
		}
		cut, sat := tr.AC[0], tr.AC[1]
		if cut.IC_A != 0 || sat.VCE_V != 0 {
			t.Errorf("%s: AC ends %v, want one on each axis", tc.name, tr.AC)
		}
		if slope := -sat.IC_A / cut.VCE_V; !near(slope, -1/tc.rac_Ω, 1e-9) {
			t.Errorf("%s: slope %g S, want −1/r_ac = %g S", tc.name, slope, -1/tc.rac_Ω)
		}
		q := tr.Nominal
		if onLine := sat.IC_A * (1 - q.VCE_V/cut.VCE_V); !near(onLine, q.IC_A, 1e-9) {
			t.Errorf("%s: the line passes %g A at the Q-point's VCE, Q is at %g A", tc.name, onLine, q.IC_A)
		}
		if tc.icSat_A > 0 && (!near(sat.IC_A, tc.icSat_A, 0.01) || !near(cut.VCE_V, tc.vceCut, 0.01)) {
			t.Errorf("%s: AC ends ic(sat) %g A, vce(cut) %g V; the book has %g A, %g V (±1 %%)", tc.name, sat.IC_A, cut.VCE_V, tc.icSat_A, tc.vceCut)
		}
	}
}

// insideHull reports whether p lies in the counter-clockwise convex
// polygon h, allowing rel of its size for rounding.
func insideHull(p Point, h []Point, tol float64) bool {
	for i := range h {
		a, b := h[i], h[(i+1)%len(h)]
		if cross(a, b, p) < -tol {
			return false
		}
	}
	return true
}

// TestPointsInsideDrawnShapes checks what the picture shows against the
// analysis it was drawn from: every worst-case corner lies in the drawn
// hull, the hull's vertices are corners, every Monte Carlo board is drawn
// at both ambient ends, and the boards drawn inside the window box are
// exactly those the yield counted as passing (REFERENCE.md §9: a board
// passes when its IC and VCE lie in the window at every ambient solved).
func TestPointsInsideDrawnShapes(t *testing.T) {
	for _, b := range []solver.Build{dividerFixture(), feedbackFixture(), splitFixture()} {
		s := subjectOf(t, b, 400)
		c, err := LoadLine([]Subject{s}, LoadLineOptions{MaxBoards: 1000})
		if err != nil {
			t.Fatal(err)
		}
		tr := c.Traces[0]
		if len(tr.Corners) != len(s.Corners) || len(tr.Hull) < 3 {
			t.Fatalf("%v: %d corners drawn of %d, hull of %d points", b.Topology, len(tr.Corners), len(s.Corners), len(tr.Hull))
		}
		tol := 1e-9 * c.VCEAxis_V * c.ICAxis_A
		for i, k := range s.Corners {
			if p := (Point{k.OP.VCE_V, k.OP.IC_A}); !insideHull(p, tr.Hull, tol) {
				t.Errorf("%v: corner %d at %v outside the drawn hull", b.Topology, i, p)
			}
		}
		for _, v := range tr.Hull {
			found := false
			for _, k := range tr.Corners {
				found = found || k == v
			}
			if !found {
				t.Errorf("%v: hull vertex %v is no corner", b.Topology, v)
			}
		}
		cl := tr.Cloud
		if cl.Drawn != 400 || len(cl.Cold) != 400 || len(cl.Hot) != 400 || len(cl.Between) != 0 {
			t.Fatalf("%v: %d boards drawn, %d cold and %d hot points, %d between; want 400 at each end", b.Topology, cl.Drawn, len(cl.Cold), len(cl.Hot), len(cl.Between))
		}
		inside, passed := 0, 0
		for i, pts := range cl.BoardPoints {
			in := true
			for _, p := range pts {
				in = in && tr.Window.Contains(p)
			}
			if cl.Pass[i] && !in {
				t.Errorf("%v: board %d counted passing, but drawn outside the window", b.Topology, i)
			}
			if in {
				inside++
			}
			if cl.Pass[i] {
				passed++
			}
		}
		// A board inside the window at both ends fails only where its IC
		// or VCE turned between them (REFERENCE.md §9, the whole range).
		if passed != s.Yield.Pass || passed != cl.Passed || inside-passed > cl.Turned {
			t.Errorf("%v: %d boards drawn inside the window, %d pass, the yield counted %d with %d turned", b.Topology, inside, passed, s.Yield.Pass, cl.Turned)
		}
		n := tr.Nominal
		if n.IC_A != s.Nominal.IC_A || n.VCE_V != s.Nominal.VCE_V {
			t.Errorf("%v: nominal drawn at %v, analysed at %g A, %g V", b.Topology, n, s.Nominal.IC_A, s.Nominal.VCE_V)
		}
		if !c.Saturation.Contains(Point{VCE_V: 0.9 * b.Device.VCESat_V, IC_A: n.IC_A}) || c.Saturation.Contains(Point{VCE_V: 1.1 * b.Device.VCESat_V}) {
			t.Errorf("%v: saturation region %v, want VCE below VCE(sat) %g V", b.Topology, c.Saturation, b.Device.VCESat_V)
		}
	}
}

// TestMaxBoards checks that a picture draws the first boards of the run.
func TestMaxBoards(t *testing.T) {
	s := subjectOf(t, dividerFixture(), 300)
	c, err := LoadLine([]Subject{s}, LoadLineOptions{MaxBoards: 120})
	if err != nil {
		t.Fatal(err)
	}
	cl := c.Traces[0].Cloud
	if cl.Drawn != 120 || cl.Boards != 300 || len(cl.Cold) != 120 {
		t.Fatalf("drawn %d of %d (%d cold points), want 120 of 300", cl.Drawn, cl.Boards, len(cl.Cold))
	}
	if first := s.Yield.Samples[0].Points[0]; cl.Cold[0] != (Point{first.VCE_V, first.IC_A}) {
		t.Errorf("first cold point %v, want the run's first board %v", cl.Cold[0], first)
	}
	if _, err := LoadLine(make([]Subject, MaxCompare+1), LoadLineOptions{}); err == nil {
		t.Errorf("%d builds accepted, want at most %d", MaxCompare+1, MaxCompare)
	}
}

// TestConvexHull checks the hull on shapes whose hull is known by
// construction (common practice: a square's hull is its corners).
func TestConvexHull(t *testing.T) {
	pts := []Point{{0, 0}, {2, 0}, {2, 2}, {0, 2}, {1, 1}, {1, 0}, {0.5, 1.5}, {2, 2}}
	h := convexHull(pts)
	want := []Point{{0, 0}, {2, 0}, {2, 2}, {0, 2}}
	if len(h) != len(want) {
		t.Fatalf("hull %v, want %v", h, want)
	}
	for i := range want {
		if h[i] != want[i] {
			t.Errorf("hull %v, want %v", h, want)
			break
		}
	}
	if h := convexHull([]Point{{1, 1}, {1, 1}}); len(h) != 1 {
		t.Errorf("hull of one repeated point %v, want the point", h)
	}
}

// TestZoom checks that zoomed axes still hold everything the analysis
// gave (nominal point, corners, boards, window) while closing in on it.
func TestZoom(t *testing.T) {
	s := subjectOf(t, feedbackFixture(), 300)
	full, err := LoadLine([]Subject{s}, LoadLineOptions{})
	if err != nil {
		t.Fatal(err)
	}
	c, err := LoadLine([]Subject{s}, LoadLineOptions{Zoom: true})
	if err != nil {
		t.Fatal(err)
	}
	if !c.Zoomed || full.Zoomed || c.VCEAxis_V-c.VCEAxisMin_V >= full.VCEAxis_V || c.ICAxis_A-c.ICAxisMin_A >= full.ICAxis_A {
		t.Fatalf("zoomed axes %g..%g V, %g..%g A; full %g V, %g A", c.VCEAxisMin_V, c.VCEAxis_V, c.ICAxisMin_A, c.ICAxis_A, full.VCEAxis_V, full.ICAxis_A)
	}
	view := Box{c.VCEAxisMin_V, c.VCEAxis_V, c.ICAxisMin_A, c.ICAxis_A}
	tr := c.Traces[0]
	w := tr.Window
	pts := append([]Point{tr.Nominal, {w.VCEMin_V, w.ICMin_A}, {w.VCEMax_V, w.ICMax_A}}, tr.Corners...)
	pts = append(append(pts, tr.Cloud.Cold...), tr.Cloud.Hot...)
	for _, p := range pts {
		if !view.Contains(p) {
			t.Errorf("%v lies outside the zoomed axes %+v", p, view)
		}
	}
}
