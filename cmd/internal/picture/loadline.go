package picture

import (
	"fmt"
	"math"

	"biasbin/solver"
)

// Point is a place on the IC–VCE plane in SI units (forward-referenced
// magnitudes, as in solver.OperatingPoint).
type Point struct {
	VCE_V float64
	IC_A  float64
}

// Box is a rectangle on the IC–VCE plane. A maximum of +Inf is an open
// side (no bound).
type Box struct {
	VCEMin_V, VCEMax_V float64
	ICMin_A, ICMax_A   float64
}

// Contains reports whether p lies in b, edges included.
func (b Box) Contains(p Point) bool {
	return p.VCE_V >= b.VCEMin_V && p.VCE_V <= b.VCEMax_V && p.IC_A >= b.ICMin_A && p.IC_A <= b.ICMax_A
}

// WindowBox is the yield window w as a box: solver.Window's zero maximum
// (no upper bound) becomes an open side.
func WindowBox(w solver.Window) Box {
	open := func(v float64) float64 {
		if v == 0 {
			return math.Inf(1)
		}
		return v
	}
	return Box{VCEMin_V: w.VCEMin_V, VCEMax_V: open(w.VCEMax_V), ICMin_A: w.ICMin_A, ICMax_A: open(w.ICMax_A)}
}

// Cloud is the Monte Carlo Q-points of the boards drawn, told apart by the
// ambient they were solved at.
type Cloud struct {
	// Cold and Hot are the boards' Q-points at the ambient range's minimum
	// and maximum (a board solved at both ends has one point in each).
	Cold, Hot []Point
	// Between are Q-points at an ambient drawn inside the range (a run that
	// gives each board one ambient).
	Between []Point
	// Pass says, per board drawn, whether the analysis counted it inside
	// the window; BoardPoints gives its points.
	Pass []bool
	// BoardPoints lists each drawn board's points in the order solved.
	BoardPoints [][]Point
	// Drawn and Boards are the boards drawn and the boards run.
	Drawn, Boards int
	// Passed is the pass count over every board run, as the analysis
	// reported it; Turned counts the boards whose IC or VCE turned between
	// the ambient ends (a board can fail there with both ends inside the
	// window: the picture shows the ends only).
	Passed, Turned int
}

// Trace is one build on the IC–VCE plane.
type Trace struct {
	Name string
	// DC is the DC load line from its cut-off end (IC = 0, VCE = the rail
	// span) to its saturation end (VCE = 0, IC = span/(RC+RE)).
	DC [2]Point
	// AC is the AC load line through the Q-point with slope −1/r_ac, from
	// its cut-off end to its saturation end; nil when r_ac equals the DC
	// load (no AC load and no bypass).
	AC []Point
	// Nominal is the nominal Q-point.
	Nominal Point
	// Corners are the worst-case corners' Q-points, Hull their convex hull
	// (counter-clockwise).
	Corners, Hull []Point
	// Cloud is the Monte Carlo boards drawn.
	Cloud Cloud
	// Window is the yield window.
	Window Box
	// VCESat_V is where the saturation region ends for this transistor.
	VCESat_V float64
	// AmbientMin_C and AmbientMax_C are the ambient range.
	AmbientMin_C, AmbientMax_C float64
}

// LoadLineChart is the data of the IC–VCE picture.
type LoadLineChart struct {
	Title  string
	Traces []Trace
	// Saturation is the region VCE < VCE(sat) (the largest VCE(sat) of
	// the traces), up to the axis top.
	Saturation Box
	// Cutoff marks IC ≈ 0 along the VCE axis. Its height is
	// CutoffShare of the IC axis so that it can be seen; the stage is cut
	// off well below it (the solver's 100 nA junction threshold).
	Cutoff Box
	// VCEAxis_V and ICAxis_A are the axis ends, VCEAxisMin_V and
	// ICAxisMin_A their starts: 0 for one build; with several builds the
	// axes close in on their spread so that the tightest one can be told
	// (Zoomed).
	VCEAxis_V, ICAxis_A       float64
	VCEAxisMin_V, ICAxisMin_A float64
	Zoomed                    bool
	// PNP is set when a build is PNP: the axes then carry magnitudes
	// (|VCE|, |IC|), as the analyses give them.
	PNP bool
}

// CutoffShare is the height of the cut-off band as a share of the IC axis.
const CutoffShare = 0.02

// DefaultMaxBoards is how many Monte Carlo boards a picture draws by
// default: enough to show the spread's shape, few enough to keep an SVG
// small. The boards drawn are the first of the run, a fair sample of it
// because every board is drawn independently.
const DefaultMaxBoards = 2000

// DefaultCompareBoards is how many boards per build a picture of several
// builds draws by default: more clouds on top of each other hide the
// ones below.
const DefaultCompareBoards = 400

// LoadLineOptions tune LoadLine; the zero value is the defaults.
type LoadLineOptions struct {
	// MaxBoards is the most boards drawn per build; 0 = DefaultMaxBoards
	// for one build, DefaultCompareBoards for several.
	MaxBoards int
	// Zoom closes the axes in on the spread also for a single build
	// (several builds are always zoomed).
	Zoom bool
}

// LoadLine builds the IC–VCE chart of one to MaxCompare builds.
func LoadLine(subjects []Subject, opt LoadLineOptions) (LoadLineChart, error) {
	if len(subjects) == 0 || len(subjects) > MaxCompare {
		return LoadLineChart{}, fmt.Errorf("picture: %d builds: want 1 to %d", len(subjects), MaxCompare)
	}
	maxBoards := opt.MaxBoards
	switch {
	case maxBoards > 0:
	case len(subjects) > 1:
		maxBoards = DefaultCompareBoards
	default:
		maxBoards = DefaultMaxBoards
	}
	var c LoadLineChart
	if len(subjects) == 1 {
		c.Title = "Load line and Q-point spread\n" + subjects[0].Name
	} else {
		c.Title = fmt.Sprintf("Q-point spread of %d builds", len(subjects))
	}
	vceTop, icTop, satTop := 0.0, 0.0, 0.0
	grow := func(p Point) {
		vceTop, icTop = math.Max(vceTop, p.VCE_V), math.Max(icTop, p.IC_A)
	}
	for _, s := range subjects {
		t := trace(s, maxBoards)
		for _, pts := range [][]Point{t.DC[:], t.AC, {t.Nominal}, t.Corners, t.Cloud.Cold, t.Cloud.Hot, t.Cloud.Between} {
			for _, p := range pts {
				grow(p)
			}
		}
		if w := t.Window; !math.IsInf(w.VCEMax_V, 1) {
			vceTop = math.Max(vceTop, w.VCEMax_V)
		}
		if w := t.Window; !math.IsInf(w.ICMax_A, 1) {
			icTop = math.Max(icTop, w.ICMax_A)
		}
		satTop = math.Max(satTop, t.VCESat_V)
		c.PNP = c.PNP || s.Build.Device.Polarity == solver.PNP
		c.Traces = append(c.Traces, t)
	}
	c.VCEAxis_V, c.ICAxis_A = 1.05*vceTop, 1.08*icTop
	c.Saturation = Box{VCEMin_V: 0, VCEMax_V: satTop, ICMin_A: 0, ICMax_A: c.ICAxis_A}
	c.Cutoff = Box{VCEMin_V: 0, VCEMax_V: c.VCEAxis_V, ICMin_A: 0, ICMax_A: CutoffShare * c.ICAxis_A}
	if len(c.Traces) > 1 || opt.Zoom {
		c.zoom()
	}
	return c, nil
}

// zoom closes the axes in on the builds' spread (nominal points, corners,
// boards, windows) with as much room again around it, within the full
// plane.
func (c *LoadLineChart) zoom() {
	lo, hi := Point{math.Inf(1), math.Inf(1)}, Point{math.Inf(-1), math.Inf(-1)}
	grow := func(p Point) {
		if math.IsInf(p.VCE_V, 0) || math.IsInf(p.IC_A, 0) {
			return
		}
		lo = Point{math.Min(lo.VCE_V, p.VCE_V), math.Min(lo.IC_A, p.IC_A)}
		hi = Point{math.Max(hi.VCE_V, p.VCE_V), math.Max(hi.IC_A, p.IC_A)}
	}
	for _, t := range c.Traces {
		for _, pts := range [][]Point{{t.Nominal}, t.Corners, t.Cloud.Cold, t.Cloud.Hot, t.Cloud.Between} {
			for _, p := range pts {
				grow(p)
			}
		}
		w := t.Window
		grow(Point{w.VCEMin_V, w.ICMin_A})
		grow(Point{w.VCEMax_V, w.ICMax_A})
	}
	if math.IsInf(lo.VCE_V, 1) {
		return
	}
	dv, di := hi.VCE_V-lo.VCE_V, hi.IC_A-lo.IC_A
	c.VCEAxisMin_V, c.VCEAxis_V = math.Max(0, lo.VCE_V-0.5*dv), math.Min(c.VCEAxis_V, hi.VCE_V+0.5*dv)
	c.ICAxisMin_A, c.ICAxis_A = math.Max(0, lo.IC_A-0.5*di), math.Min(c.ICAxis_A, hi.IC_A+0.5*di)
	c.Zoomed = true
}

// trace builds one build's data.
func trace(s Subject, maxBoards int) Trace {
	sw := s.Swing
	t := Trace{
		Name:         s.Name,
		DC:           [2]Point{{VCE_V: sw.VCECutDC_V}, {IC_A: sw.ICSatDC_A}},
		Nominal:      Point{VCE_V: s.Nominal.VCE_V, IC_A: s.Nominal.IC_A},
		Window:       WindowBox(s.Window),
		VCESat_V:     s.VCESat_V,
		AmbientMin_C: s.Build.AmbientMin_C,
		AmbientMax_C: s.Build.AmbientMax_C,
	}
	if sw.RAC_Ohm > 0 && sw.RAC_Ohm != sw.RDC_Ohm {
		t.AC = []Point{{VCE_V: sw.VCECutAC_V}, {IC_A: sw.ICSatAC_A}}
	}
	for _, k := range s.Corners {
		t.Corners = append(t.Corners, Point{VCE_V: k.OP.VCE_V, IC_A: k.OP.IC_A})
	}
	t.Hull = convexHull(t.Corners)
	if y := s.Yield; y != nil {
		t.Cloud = cloud(y, s.Build, maxBoards)
	}
	return t
}

// cloud sorts the first maxBoards boards of y by ambient.
func cloud(y *solver.YieldResult, b solver.Build, maxBoards int) Cloud {
	c := Cloud{Boards: y.Boards, Passed: y.Pass, Turned: y.Turned}
	for _, board := range y.Samples {
		if c.Drawn == maxBoards {
			break
		}
		c.Drawn++
		pts := make([]Point, 0, len(board.Points))
		for _, sp := range board.Points {
			p := Point{VCE_V: sp.VCE_V, IC_A: sp.IC_A}
			pts = append(pts, p)
			switch ambientEnd(sp.Ambient_C, b) {
			case coldEnd:
				c.Cold = append(c.Cold, p)
			case hotEnd:
				c.Hot = append(c.Hot, p)
			default:
				c.Between = append(c.Between, p)
			}
		}
		c.BoardPoints = append(c.BoardPoints, pts)
		c.Pass = append(c.Pass, board.Pass)
	}
	return c
}
