package report

import (
	"fmt"
	"math"
	"strings"

	"biasbin/solver/notation"
	"biasbin/solver/safety"
)

// partName writes a caution's part as the board names it: "RC", "the
// transistor".
func partName(p string) string {
	if p == safety.PartTransistor {
		return "the transistor"
	}
	return strings.ToUpper(p)
}

// Caution words one caution in plain words, saying what happens and what
// to do.
func Caution(c safety.Caution) string {
	fV, fW, fA, fT := notation.FormatVoltage, notation.FormatPower, notation.FormatCurrent, notation.FormatTemperature
	switch c.Kind {
	case safety.CornersNotActive:
		return fmt.Sprintf("%d of %d worst-case corners leave the active region or the VCE margin: some boards will saturate or cut off", c.NotActive, c.Corners)
	case safety.OverRating:
		if c.Part == safety.PartTransistor {
			return fmt.Sprintf("the transistor dissipates %s, %s of what it can shed at %s: its junction passes its limit and it will fail; lower the current or the supply, or heatsink it",
				fW(c.Power_W), pctOf(c.RatingUse), fT(c.Ambient_C))
		}
		fix := "no resistor rating holds it at this ambient: lower the current or the ambient"
		if c.NeedRated_W > 0 {
			fix = "use one rated at least " + fW(ceil2(c.NeedRated_W))
		}
		return fmt.Sprintf("%s dissipates %s, %s of its rating at %s: it will overheat and can burn or fail open; %s",
			partName(c.Part), fW(c.Power_W), pctOf(c.RatingUse), fT(c.Ambient_C), fix)
	case safety.OverDesignLimit:
		return fmt.Sprintf("%s runs at %s of its design limit (%s; %s of its rating): it runs hot with no margin left",
			partName(c.Part), pctOf(c.Use), fW(c.Power_W), pctOf(c.RatingUse))
	case safety.OverElementVoltage:
		lev := "its limiting element voltage " + fV(c.LEV_V)
		if c.LEVDefaulted {
			lev += " (assumed from its power rating; a stated figure replaces it)"
		}
		return fmt.Sprintf("%s carries %s, above the %s allowed by %s: it can arc over or drift; use a part rated for the voltage or two in series",
			partName(c.Part), fV(c.Voltage_V), fV(c.VoltageAllow), lev)
	case safety.OverVCEO:
		return fmt.Sprintf("VCE reaches %s, beyond VCEO %s: the transistor can break down and short", fV(c.VCE_V), fV(c.VCEO_V))
	case safety.OverICMax:
		return fmt.Sprintf("IC reaches %s, beyond the transistor's IC max %s", fA(c.IC_A), fA(c.ICMax_A))
	case safety.SupplyOverVCEO:
		return fmt.Sprintf("the supply reaches %s, above the transistor's VCEO %s: it can break down whenever the stage cuts off (no base drive, a fault, power-up)",
			fV(c.Supply_V), fV(c.VCEO_V))
	case safety.NearDesignLimit:
		return fmt.Sprintf("%s runs at %s of its design limit (%s): it will be warm, with little margin left", partName(c.Part), pctOf(c.Use), fW(c.Power_W))
	case safety.HotSurface:
		if c.Part == "" {
			return fmt.Sprintf("at %s ambient every part is hot enough to burn a finger (touch limit %s, ISO 13732-1 / IEC 62368-1, from memory): let it cool before handling",
				fT(c.Ambient_C), fT(c.Limit_C))
		}
		return fmt.Sprintf("%s can reach %s at %s ambient, hot enough to burn a finger (touch limit %s for about a minute's contact, ISO 13732-1 / IEC 62368-1, from memory): keep it off the case and away from fingers and wires",
			partName(c.Part), fT(c.Surface_C), fT(c.Ambient_C), fT(c.Limit_C))
	case safety.UnknownRatings:
		return fmt.Sprintf("the transistor's %s not stated: nothing here says it survives this build", RatingList(c.Ratings))
	case safety.AboveTouchVoltage:
		return fmt.Sprintf("the supply reaches %s, above the %s d.c. generally safe to touch (IEC 62368-1 ES1, from memory): touching the circuit can give a shock; switch off before working on it, and follow your local codes and licensed practice",
			fV(c.Supply_V), fV(c.Limit_V))
	case safety.AboveELV:
		return fmt.Sprintf("the supply reaches %s, beyond extra-low voltage (%s d.c., IEC 61140): a shock can kill; enclose it, switch off and discharge before touching, and work to local codes and licensed practice",
			fV(c.Supply_V), fV(c.Limit_V))
	case safety.NominalOnly:
		return "the worst case could not be solved: the figures are for the nominal point only"
	}
	return fmt.Sprintf("caution %v", c.Kind)
}

// Verdict words a build's standing in one line: "fails — VCE reaches
// 234 V, beyond VCEO 80 V", "passes", "passes, with 2 cautions".
func Verdict(v safety.Verdict) string {
	switch {
	case v.Fails:
		return "fails — " + firstClause(Caution(*v.First))
	case v.Cautions == 1:
		return "passes, with 1 caution"
	case v.Cautions > 1:
		return fmt.Sprintf("passes, with %d cautions", v.Cautions)
	}
	return "passes"
}

// firstClause is a worded caution up to its first colon: what breaks,
// without the advice.
func firstClause(s string) string {
	if i := strings.Index(s, ": "); i > 0 {
		return s[:i]
	}
	return s
}

// pctOf writes a share as a whole percentage ("162 %").
func pctOf(f float64) string {
	if f > 9.99 {
		return ">999 %"
	}
	return fmt.Sprintf("%.0f %%", 100*f)
}

// ceil2 rounds w up to two significant digits, so that "at least" holds.
func ceil2(w float64) float64 {
	if !(w > 0) {
		return w
	}
	e := math.Pow(10, math.Floor(math.Log10(w))-1)
	return math.Ceil(w/e-1e-9) * e
}
