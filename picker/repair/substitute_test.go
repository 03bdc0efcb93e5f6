package repair_test

import (
	"errors"
	"math"
	"testing"

	"biasbin/picker"
	"biasbin/picker/repair"
	"biasbin/solver"
	"biasbin/solver/fault"
)

// bench is an invented parts drawer of NPN and PNP lines.
func bench() picker.Stock {
	return picker.Stock{Resistors: e12Stock(), Transistors: []picker.Transistor{
		{ID: 1, Qty: 5, Bin: "T1", Sheet: npnSheet("HI-GAIN", 400, 800, 0.64)},
		{ID: 2, Qty: 3, Bin: "T2", Sheet: npnSheet("MID-GAIN", 200, 450, 0.66)},
		{ID: 3, Qty: 3, Bin: "T3", Sheet: pnpSheet("PNP-X", 100, 300, 0.66)},
		{ID: 4, Qty: 0, Bin: "T4", Sheet: npnSheet("EMPTY", 100, 300, 0.66)},
	}}
}

// TestSubstituteSameTypeRanksFirst: a stocked line of the original's own
// type keeps the original's Q-point exactly (common practice: the same
// part in the same stage is the same stage), so it ranks first with no
// shift; a part whose VCEO the supply exceeds ranks last with FailVCEO;
// the empty line is skipped and the PNP line is not tried.
func TestSubstituteSameTypeRanksFirst(t *testing.T) {
	orig := npnSheet("ORIG-1", 100, 160, 0.65)
	st := bench()
	lowV := npnSheet("LOW-V", 100, 160, 0.65)
	lowV.VCEO_V = 10
	st.Transistors = append(st.Transistors,
		picker.Transistor{ID: 5, Qty: 2, Bin: "T5", Sheet: orig},
		picker.Transistor{ID: 6, Qty: 2, Bin: "T6", Sheet: lowV})
	out, err := repair.Substitute(repair.SubstituteRequest{Build: dividerBuild(12), Polarity: solver.NPN, Original: &orig, Stock: st})
	if err != nil {
		t.Fatal(err)
	}
	if len(out.Candidates) != 4 {
		t.Fatalf("%d candidates, want the 4 stocked NPN lines with parts", len(out.Candidates))
	}
	first, last := out.Candidates[0], out.Candidates[len(out.Candidates)-1]
	if first.Transistor.ID != 5 || math.Abs(first.ICShift) > 1e-12 {
		t.Errorf("first %s shift %g, want the original's own type with no shift", first.Transistor.Sheet.Label, first.ICShift)
	}
	if last.Transistor.ID != 6 || len(last.Failing) == 0 || last.Failing[0].Kind != repair.FailVCEO {
		t.Errorf("last %s failing %+v, want LOW-V failing VCEO (10 V under a 12 V supply)", last.Transistor.Sheet.Label, last.Failing)
	}
	if len(out.Skipped) != 1 || !out.Skipped[0].Empty || out.Skipped[0].Transistor.ID != 4 {
		t.Errorf("skipped %+v, want the empty line 4", out.Skipped)
	}
	if out.NoneWithin {
		t.Error("NoneWithin with the original's own type in stock")
	}
	if out.Original.Source != repair.SourceRanges {
		t.Errorf("source %v, want ranges", out.Original.Source)
	}
}

// TestSubstituteChangeFollowsHandFormula: in a collector-feedback stage
// with no emitter resistor IC follows hFE, so a part of a higher gain
// class shifts IC by far more than 10 %, and the change proposed is RF,
// raised to what the hand formula of REFERENCE.md §6 asks,
// IC = β(VCC − VBE)/(RF + (β+1)·RC), solved for RF at the original IC with
// the substitute's typical β (the geometric mean of its range, package
// solver's convention). Agreement within 15 %: the formula fixes VBE and
// leaves out self-heating, and the stock has E12 values and their pairs.
func TestSubstituteChangeFollowsHandFormula(t *testing.T) {
	orig := npnSheet("ORIG-1", 100, 160, 0.65)
	b := feedbackBuild()
	out, err := repair.Substitute(repair.SubstituteRequest{Build: b, Polarity: solver.NPN, Original: &orig, Stock: bench(), Pairs: true})
	if err != nil {
		t.Fatal(err)
	}
	if !out.NoneWithin {
		t.Fatal("a part of a higher gain class kept IC within 10 % in a stage with no emitter resistor")
	}
	var mid *repair.Candidate
	for i := range out.Candidates {
		if out.Candidates[i].Transistor.Sheet.Label == "MID-GAIN" {
			mid = &out.Candidates[i]
		}
	}
	if mid == nil || mid.Change == nil {
		t.Fatalf("MID-GAIN has no change: %+v", mid)
	}
	const vcc, vbe, rf, rc = 12.0, 0.65, 470e3, 4.7e3
	bOld, bNew := math.Sqrt(100*160), math.Sqrt(200*450)
	ic0 := bOld * (vcc - vbe) / (rf + (bOld+1)*rc)
	wantRF := bNew*(vcc-vbe)/ic0 - (bNew+1)*rc
	ch := mid.Change
	if ch.Position != solver.RF || math.Abs(ch.Filling.Ohm/wantRF-1) > 0.15 {
		t.Errorf("change %v to %.4g ohm, want rf near %.4g ohm (REFERENCE.md §6 hand formula, ±15 %%)", ch.Position, ch.Filling.Ohm, wantRF)
	}
	if !ch.Within || math.Abs(ch.ICShift) >= math.Abs(mid.ICShift) {
		t.Errorf("change leaves IC shifted %.3f (before %.3f), want within ±10 %%", ch.ICShift, mid.ICShift)
	}
}

// TestSubstituteBadInput: readings a working stage cannot give are
// refused naming the reading (the bad-input list).
func TestSubstituteBadInput(t *testing.T) {
	b := dividerBuild(12)
	for _, c := range []struct {
		name    string
		r       fault.Readings
		reading string
	}{
		{"VE above VB", fault.Readings{VB_V: 1.5, VE_V: 1.9, VC_V: 7}, "ve"},
		{"VC beyond the supply", fault.Readings{VB_V: 2.1, VE_V: 1.45, VC_V: 13.5}, "vc"},
		// 1.45 V over RE 1 k is 1.45 mA, but (12 − 10)/4.7 k is 0.43 mA.
		{"IC from RE and RC disagree", fault.Readings{VB_V: 2.1, VE_V: 1.45, VC_V: 10}, "ve/vc"},
		{"junction beyond silicon", fault.Readings{VB_V: 3.5, VE_V: 1.45, VC_V: 5.2}, "vb"},
	} {
		_, err := repair.Substitute(repair.SubstituteRequest{Build: b, Polarity: solver.NPN, Twin: &c.r, Stock: bench()})
		var re *fault.ReadingError
		if !errors.As(err, &re) || re.Reading != c.reading {
			t.Errorf("%s: error %v, want a ReadingError on %s", c.name, err, c.reading)
		}
	}
	if _, err := repair.Substitute(repair.SubstituteRequest{Build: b, Polarity: solver.NPN, Stock: bench()}); !errors.Is(err, repair.ErrNoOriginal) {
		t.Errorf("neither ranges nor twin: %v, want ErrNoOriginal", err)
	}
}
