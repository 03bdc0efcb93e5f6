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

// Defaults applied when a field is left zero on adding or importing.
const (
	// DefaultKnee_C is the rated ambient temperature where derating starts:
	// 70 °C, IEC 60115-1 style rated ambient (from memory).
	DefaultKnee_C = 70.0
	// DefaultMax_C is the upper category temperature where the allowed
	// dissipation reaches zero: 155 °C, IEC 60115-1 style (from memory).
	DefaultMax_C = 155.0
	// DefaultVBEOn_V is VBE(on) of a small silicon transistor (common practice).
	DefaultVBEOn_V = 0.65
	// DefaultVBEAt_A is the current DefaultVBEOn_V is stated at (common practice).
	DefaultVBEAt_A = 1e-3
	// DefaultTjMax_C is the maximum junction temperature of small-signal
	// plastic packages (common practice).
	DefaultTjMax_C = 150.0
)

// DefaultTCR_PPMPerK returns the TCR assumed for a technology when a line
// does not state one, and false for an unknown technology.
func DefaultTCR_PPMPerK(tech string) (float64, bool) {
	switch tech {
	case TechThickFilm:
		return 100, true // thick-film chip ±100 ppm/K (common practice)
	case TechThinFilm:
		return 25, true // thin-film chip ±5 to ±50 ppm/K, midpoint 25 (common practice)
	case TechMetalFilm:
		return 50, true // metal film ±50 ppm/K typical (common practice)
	case TechCarbonFilm:
		// carbon film −200 to −1000 ppm/K; −500 taken near the middle
		// (common practice)
		return -500, true
	case TechWirewound:
		return 20, true // wirewound ±20 ppm/K (from memory)
	case TechMetalOxide:
		// metal oxide film ±200 to ±350 ppm/K; the upper figure, as a
		// spread taken too small would flatter the worst case (from memory)
		return 350, true
	case TechCermet:
		return 100, true // cermet (thick film on ceramic) ±100 ppm/K (from memory)
	}
	return 0, false
}
