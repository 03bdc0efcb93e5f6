package store

// The stock's defaults: the figures written into a line that leaves a
// rating blank when it is added or imported, so that stock list shows what
// the math will use. They are the solver's defaults (solver/defaults.go,
// the one file of the math's defaults, with sources); the store may not
// import the solver, so they are repeated here once, and a test in
// cmd/internal/stockparts fails if the two ever differ. The TCR by
// technology lives only here: the technology is a stock column.

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
