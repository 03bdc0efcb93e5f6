package report

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"biasbin/picker"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// YieldHelp is the paragraph check and pick --help give on the yield: what
// it counts, the interval, the window rule and the flags.
const YieldHelp = `Yield: the share of simulated boards (--sim-boards; --seed repeats a run) that
stay inside the yield window at every ambient of --ambient: each board draws
every uncertain input at random, rectangular within its stated limits (JCGM
101 when only limits are known): each resistor's value within its tolerance
and its TCR within ± its bound, the supply within its tolerance, hFE within
its range, VBE(on) within its spread and the Early voltage where a range is
stocked; it is solved self-heated at both ends of the ambient range (and at
a turning point between) and counts only if IC and VCE stay in the window at
all of them. The yield is shown with its 95 % Clopper–Pearson interval: with
every board passing it reads "≥ the lower end", never "100 %". The window is
one rule for check and pick: IC within ±10 % and VCE within ±20 % of the
design point (pick: the target IC and the target VCE, or each build's; check:
--ic and --vce, else the nominal point), or absolute ranges MIN..MAX.`

// Yield is a yield as a producer should read it: the point estimate with
// its 95 % interval, or, when every board (or none) passes, the bound the
// interval gives: "≥ 99.96 % (95 % Clopper–Pearson)". The lower end is
// rounded down and the upper end up, so the words never claim more.
func Yield(y solver.YieldResult) string {
	switch {
	case y.Boards == 0:
		return "not run"
	case y.Pass == y.Boards:
		return "≥ " + pctDown(y.Low95) + " (95 % Clopper–Pearson)"
	case y.Pass == 0:
		return "≤ " + pctUp(y.High95) + " (95 % Clopper–Pearson)"
	}
	// the estimate and both ends with the same two decimals
	fixed := func(p float64) string { return strconv.FormatFloat(p+0, 'f', 2, 64) }
	return fmt.Sprintf("%s %% (95 %% Clopper–Pearson %s..%s %%)", fixed(pctNear(y.Yield)), fixed(pctFloor(y.Low95)), fixed(pctCeil(y.High95)))
}

// YieldBoards is the count behind a yield: "10,000 of 10,000 simulated
// boards pass at every ambient from −20 to 70 °C".
func YieldBoards(y solver.YieldResult, ambientMin_C, ambientMax_C float64) string {
	at := "at " + notation.FormatTemperature(ambientMin_C)
	if ambientMax_C != ambientMin_C {
		at = "at every ambient from " + strings.TrimSuffix(notation.FormatTemperature(ambientMin_C), " °C") +
			" to " + notation.FormatTemperature(ambientMax_C)
	}
	s := fmt.Sprintf("%s of %s simulated boards pass %s", Count(y.Pass), Count(y.Boards), at)
	if y.Failed > 0 {
		s += fmt.Sprintf(" (%s could not be solved and count as failures)", Count(y.Failed))
	}
	return s
}

// Window is a yield window in words with the rule behind it: "IC 0.9 mA..1.1 mA
// (±10 % of the target 1 mA), VCE 4 V..8 V (as given)".
func Window(w picker.YieldWindow) string {
	return "IC " + notation.FormatBand(w.ICMin_A, w.ICMax_A, "A") + " (" + bandRule(w.Rule.IC, w.Centre.ICOf, w.Centre.IC_A, "A") +
		"), VCE " + notation.FormatBand(w.VCEMin_V, w.VCEMax_V, "V") + " (" + bandRule(w.Rule.VCE, w.Centre.VCEOf, w.Centre.VCE_V, "V") + ")"
}

// bandRule says where one band of the window comes from.
func bandRule(b picker.Band, of picker.CentreKind, centre float64, unit string) string {
	if !b.Relative {
		return "as given"
	}
	what := "the target"
	if of == picker.CentreNominal {
		what = "the nominal"
	}
	return "±" + strings.TrimSuffix(pct(b.Frac), " %") + " % of " + what + " " + notation.FormatSI(centre, unit)
}

// Count writes a whole number with thousands separated by commas: 10,000.
func Count(n int) string {
	s := strconv.Itoa(n)
	neg := strings.HasPrefix(s, "-")
	s = strings.TrimPrefix(s, "-")
	var b strings.Builder
	for i, c := range s {
		if i > 0 && (len(s)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(c)
	}
	if neg {
		return "-" + b.String()
	}
	return b.String()
}

// pct writes a share as a percentage to two decimals, trailing zeros cut.
func pct(frac float64) string { return trimPct(pctNear(frac)) }

// pctDown and pctUp round a share down and up to two decimals of a percent.
func pctDown(frac float64) string { return trimPct(pctFloor(frac)) }
func pctUp(frac float64) string   { return trimPct(pctCeil(frac)) }

// pctNear, pctFloor and pctCeil are a share in percent rounded to two
// decimals: to the nearest, down and up (the bounds never claim more).
func pctNear(frac float64) float64  { return math.Round(frac*1e4) / 100 }
func pctFloor(frac float64) float64 { return math.Floor(frac*1e4+1e-9) / 100 }
func pctCeil(frac float64) float64  { return math.Ceil(frac*1e4-1e-9) / 100 }

func trimPct(p float64) string { return strconv.FormatFloat(p+0, 'f', -1, 64) + " %" }

// YieldJSON is a yield as check --json and pick --json write it: the point
// estimate with its 95 % interval, the count, the method and definition,
// the seed that repeats it, the ambient range it covers, the window with
// its rule, and every input drawn with its distribution and why.
type YieldJSON struct {
	Value        float64     `json:"value"`
	Low95        float64     `json:"low95"`
	High95       float64     `json:"high95"`
	Boards       int         `json:"boards"`
	Passed       int         `json:"passed"`
	Unsolved     int         `json:"unsolved"`
	Method       string      `json:"method"`
	Definition   string      `json:"definition"`
	Seed         uint64      `json:"seed"`
	AmbientMin_C float64     `json:"ambient_min_c"`
	AmbientMax_C float64     `json:"ambient_max_c"`
	Window       WindowJSON  `json:"window"`
	Inputs       []InputJSON `json:"inputs"`
}

// WindowJSON is the yield window: its bounds and the rule behind each band
// (a share of the design point, or "absolute"), with the design point.
type WindowJSON struct {
	ICMin_A  float64  `json:"ic_min_a"`
	ICMax_A  float64  `json:"ic_max_a"`
	VCEMin_V float64  `json:"vce_min_v"`
	VCEMax_V float64  `json:"vce_max_v"`
	IC       BandJSON `json:"ic_rule"`
	VCE      BandJSON `json:"vce_rule"`
	Text     string   `json:"text"`
}

// BandJSON is one band's rule: ±Share of the design point Centre (a
// target or the nominal point), or absolute.
type BandJSON struct {
	Kind   string  `json:"kind"` // "share" or "absolute"
	Share  float64 `json:"share,omitempty"`
	Centre float64 `json:"centre,omitempty"`
	Of     string  `json:"centre_of,omitempty"` // "target" or "nominal"
}

// InputJSON is one drawn input (solver.Uncertainty).
type InputJSON struct {
	Input        string  `json:"input"`
	Unit         string  `json:"unit"`
	Low          float64 `json:"low"`
	High         float64 `json:"high"`
	Distribution string  `json:"distribution"`
	Basis        string  `json:"basis"`
}

// YieldJSONOf is the JSON of the yield y of build b run against window w.
func YieldJSONOf(y solver.YieldResult, b solver.Build, w picker.YieldWindow) YieldJSON {
	out := YieldJSON{Value: y.Yield, Low95: y.Low95, High95: y.High95, Boards: y.Boards, Passed: y.Pass, Unsolved: y.Failed,
		Method: solver.YieldIntervalMethod, Definition: solver.YieldDefinition, Seed: y.Seed,
		AmbientMin_C: b.AmbientMin_C, AmbientMax_C: b.AmbientMax_C,
		Window: WindowJSON{ICMin_A: w.ICMin_A, ICMax_A: w.ICMax_A, VCEMin_V: w.VCEMin_V, VCEMax_V: w.VCEMax_V,
			IC: bandJSON(w.Rule.IC, w.Centre.ICOf, w.Centre.IC_A), VCE: bandJSON(w.Rule.VCE, w.Centre.VCEOf, w.Centre.VCE_V), Text: Window(w)},
		Inputs: []InputJSON{}}
	for _, u := range solver.Uncertainties(b, solver.YieldOptions{}) {
		out.Inputs = append(out.Inputs, InputJSON{u.Input, u.Unit, u.Low, u.High, u.Distribution, u.Basis})
	}
	return out
}

func bandJSON(b picker.Band, of picker.CentreKind, centre float64) BandJSON {
	if !b.Relative {
		return BandJSON{Kind: "absolute"}
	}
	return BandJSON{Kind: "share", Share: b.Frac, Centre: centre, Of: of.String()}
}

// DrawnInputs names the inputs a yield of b draws, in the order drawn:
// "R1, R2, RC, RE value and TCR, supply, hFE, VBE(on), Early voltage".
func DrawnInputs(b solver.Build) string {
	var rs, tcr, rest []string
	for _, u := range solver.Uncertainties(b, solver.YieldOptions{}) {
		if u.Distribution == solver.DistSwept {
			continue // the ambient: every board is solved over the range
		}
		name, sub, _ := strings.Cut(u.Input, " ")
		switch {
		case sub == "tcr":
			tcr = append(tcr, strings.ToUpper(name))
		case isSlot(name):
			rs = append(rs, strings.ToUpper(name))
		case name == "vcc":
			rest = append(rest, "supply")
		case name == "hfe":
			rest = append(rest, "hFE")
		case name == "vbe_on":
			rest = append(rest, "VBE(on)")
		case name == "vaf":
			rest = append(rest, "Early voltage")
		default:
			rest = append(rest, name)
		}
	}
	var parts []string
	if len(rs) > 0 {
		p := strings.Join(rs, ", ") + " value"
		if slicesEqual(rs, tcr) {
			p += " and TCR"
		} else if len(tcr) > 0 {
			p += ", " + strings.Join(tcr, ", ") + " TCR"
		}
		parts = append(parts, p)
	}
	return strings.Join(append(parts, rest...), ", ")
}

func isSlot(name string) bool { _, err := solver.ParseSlot(name); return err == nil }

func slicesEqual(a, b []string) bool { return strings.Join(a, ",") == strings.Join(b, ",") }
