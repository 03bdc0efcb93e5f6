package report

import (
	"strings"
	"testing"

	"biasbin/picker/job"
	"biasbin/solver/safety"
)

// TestJobCautionOneWording: a caution in the short form reads as check
// words the same caution (one wording each), and every kind is worded;
// a supply above ELV (120 V d.c., IEC 61140) is the ELV caution, one above
// 60 V d.c. (IEC 62368-1 ES1, from memory) the touch caution.
func TestJobCautionOneWording(t *testing.T) {
	tests := []struct {
		short job.Caution
		full  safety.Caution
	}{
		{job.Caution{Kind: job.CautionSupply, Value: 63, Limit: safety.TouchVoltage_V},
			safety.Caution{Kind: safety.AboveTouchVoltage, Supply_V: 63, Limit_V: safety.TouchVoltage_V}},
		{job.Caution{Kind: job.CautionSupply, Value: 150, Limit: safety.ELVTop_V},
			safety.Caution{Kind: safety.AboveELV, Supply_V: 150, Limit_V: safety.ELVTop_V}},
		{job.Caution{Kind: job.CautionVCEO, Value: 50, Limit: 45}, safety.Caution{Kind: safety.OverVCEO, VCE_V: 50, VCEO_V: 45}},
		{job.Caution{Kind: job.CautionVCEOCutoff, Value: 50, Limit: 45}, safety.Caution{Kind: safety.SupplyOverVCEO, Supply_V: 50, VCEO_V: 45}},
		{job.Caution{Kind: job.CautionICMax, Value: 0.2, Limit: 0.1}, safety.Caution{Kind: safety.OverICMax, IC_A: 0.2, ICMax_A: 0.1}},
		{job.Caution{Kind: job.CautionNominalOnly}, safety.Caution{Kind: safety.NominalOnly}},
	}
	for _, tt := range tests {
		if got, want := JobCaution(tt.short), Caution(tt.full); got != want {
			t.Errorf("JobCaution(%+v) = %q, want %q", tt.short, got, want)
		}
	}
	hot := JobCaution(job.Caution{Kind: job.CautionHotPart, Part: "rc", Build: 2, Utilization: 0.9})
	for _, w := range []string{"build #2", "RC", "90 %", "can burn"} {
		if !strings.Contains(hot, w) {
			t.Errorf("hot part %q lacks %q", hot, w)
		}
	}
}
