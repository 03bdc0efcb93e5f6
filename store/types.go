package store

// Kind says which table a stock line lives in. Resistors and transistors
// share one ID space, so a part ID alone names a line unambiguously.
type Kind string

const (
	// KindResistor is a fixed resistor line.
	KindResistor Kind = "resistor"
	// KindTransistor is a bipolar transistor line.
	KindTransistor Kind = "transistor"
)

// Technologies a resistor line may name. The default TCR of each is in
// DefaultTCR_PPMPerK.
const (
	TechThickFilm  = "thick film"
	TechThinFilm   = "thin film"
	TechMetalFilm  = "metal film"
	TechCarbonFilm = "carbon film"
	TechWirewound  = "wirewound"
	TechMetalOxide = "metal oxide"
	TechCermet     = "cermet"
)

// Technologies lists the resistor technologies in the order shown to users.
func Technologies() []string {
	return []string{TechThickFilm, TechThinFilm, TechMetalFilm, TechCarbonFilm, TechWirewound, TechMetalOxide, TechCermet}
}

// Resistor is one stock line of fixed resistors: identical parts in one bin.
// Values are SI: ohms, a tolerance as a fraction (0.05 for ±5 %), the rated
// dissipation in watts at the rated ambient temperature, temperatures in °C.
type Resistor struct {
	ID  int64
	Ohm float64
	// Tol is the tolerance as a fraction (0.01 = ±1 %).
	Tol float64
	// Rated_W is the rated dissipation at or below the knee temperature.
	Rated_W float64
	// Knee_C is the ambient temperature where derating starts (0 when
	// adding means DefaultKnee_C).
	Knee_C float64
	// Max_C is the ambient temperature where the allowed dissipation reaches
	// zero (0 when adding means DefaultMax_C).
	Max_C float64
	// TCR_PPMPerK is the temperature coefficient; 0 when adding means the
	// technology's default (DefaultTCR_PPMPerK).
	TCR_PPMPerK float64
	// Tech is one of Technologies(); "" when adding means TechThickFilm.
	Tech string
	// LEV_V is the limiting element voltage (IEC 60115-1, "maximum
	// working voltage" on datasheets); 0 = not stated (the analyses then
	// take a default by power rating).
	LEV_V float64
	// PartNumber is the maker's part number; "" = not given.
	PartNumber string
	Qty        int
	Bin        string
	Note       string
	// Tags are lower-case free words (approved, rohs, reel ...), sorted.
	Tags []string
}

// Transistor is one stock line of bipolar transistors of one type in one
// bin. Magnitudes are positive for both polarities. Zero optional fields
// when adding take the defaults named beside them.
type Transistor struct {
	ID       int64
	Label    string
	Polarity string // "npn" or "pnp"
	HFEMin   float64
	HFEMax   float64
	HFETyp   float64 // 0 = not given
	HFEAt_A  float64 // collector current of the hFE test; 0 = not given
	VBEOn_V  float64 // 0 when adding = DefaultVBEOn_V
	VBEAt_A  float64 // 0 when adding = DefaultVBEAt_A
	VCESat_V float64 // 0 = not given
	VCEO_V   float64 // 0 = not given
	ICMax_A  float64 // 0 = not given
	PD25_W   float64 // total dissipation at 25 °C ambient; 0 = not given
	// ThetaJA_KPerW is the junction-to-ambient thermal resistance; 0 = not given.
	ThetaJA_KPerW float64
	TjMax_C       float64 // 0 when adding = DefaultTjMax_C
	VAF_V         float64 // Early voltage; 0 = not given (infinite)
	ICBO_A        float64 // collector-base leakage at 25 °C; 0 = not given
	// VBEMin_V and VBEMax_V are the part-to-part VBE(on) range at VBEAt_A
	// and 25 °C, VAFMin_V and VAFMax_V the Early-voltage range; each pair
	// both 0 = not stocked (the solver's default spread applies).
	VBEMin_V, VBEMax_V float64
	VAFMin_V, VAFMax_V float64
	// PartNumber is the maker's part number; "" = not given.
	PartNumber string
	Qty        int
	Bin        string
	Note       string
	// Tags are lower-case free words, sorted.
	Tags []string
}

// Filter narrows a listing. The zero value lists everything.
type Filter struct {
	// Bin, when not empty, keeps only lines in that bin.
	Bin string
	// Tags keeps only lines carrying every one of these tags.
	Tags []string
}
