package pickcmd

import (
	"encoding/json"
	"io"
	"math"

	"biasbin/cmd/internal/report"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/safety"
)

// jsonResult is the --json document. Units are SI base units; keys carry
// the unit (ic_a, vce_v).
type jsonResult struct {
	Request    jsonRequest `json:"request"`
	Evaluated  int64       `json:"evaluated"`
	Solved     int64       `json:"solved"`
	Considered int64       `json:"considered"`
	// Fits: a listed build fits the request. False with ranking.stopped
	// means none was found before the time limit, not that none exists.
	Fits bool `json:"fits"`
	// Ranking says whether the order of the candidates is proven.
	Ranking jsonRanking `json:"ranking"`
	// BuildableBoards is set when the stock runs short for the run: the
	// most boards it builds; candidates are then the builds for that many.
	BuildableBoards int             `json:"buildable_boards,omitempty"`
	Candidates      []jsonCandidate `json:"candidates"`
	Shortfall       *jsonShortfall  `json:"shortfall"`
	// Rivals (topology any): the best build of each other topology.
	Rivals   []jsonRival `json:"rivals,omitempty"`
	Cautions []string    `json:"cautions"`
}

type jsonRequest struct {
	Topology string  `json:"topology"`
	Polarity string  `json:"polarity"`
	VCC_V    float64 `json:"vcc_v"`           // the supply as a meter reads it against 0 V
	VEE_V    float64 `json:"vee_v,omitempty"` // split supply: the emitter rail, signed
	report.Reference
	VCCTol float64 `json:"vcc_tol"`
	// VEETol is the emitter rail's tolerance (its own, else vcc_tol's).
	VEETol       float64  `json:"vee_tol,omitempty"`
	IC_A         float64  `json:"ic_a"`
	VCE_V        float64  `json:"vce_v"`    // 0 = the maximum-symmetrical-swing rule
	VEMin_V      float64  `json:"ve_min_v"` // 0..0 = the default emitter band
	VEMax_V      float64  `json:"ve_max_v"`
	AmbientMin_C float64  `json:"ambient_min_c"`
	AmbientMax_C float64  `json:"ambient_max_c"`
	Boards       int      `json:"boards"`
	Load_Ohm     float64  `json:"load_ohms"`
	Bypass       bool     `json:"bypass"`
	Pairs        bool     `json:"pairs"`
	RequireTags  []string `json:"require_tags"`
	Top          int      `json:"top"`
	Exhaustive   bool     `json:"exhaustive"`
	Settle       bool     `json:"settle"`
	TimeLimit_S  float64  `json:"time_limit_s"` // 0 = none
	Seed         uint64   `json:"seed"`
	// Keep are the resistors kept on the board, with the figures used
	// (defaults filled in) and which of them were assumed.
	Keep []jsonKept `json:"keep,omitempty"`
}

// jsonKept is one kept part of the request.
type jsonKept struct {
	Position    string   `json:"position"`
	Ohms        float64  `json:"ohms"`
	Tol         float64  `json:"tol"`
	Rated_W     float64  `json:"rated_w"`
	TCR_PPMPerK float64  `json:"tcr_ppm_per_k"`
	Assumed     []string `json:"assumed"`
}

// jsonRival is the best build of one topology against the first build.
type jsonRival struct {
	Topology string  `json:"topology"`
	ID       string  `json:"id,omitempty"` // "" when the topology has no build
	Score    float64 `json:"score,omitempty"`
	Failing  bool    `json:"failing,omitempty"`
	// Term is the score term it trails the first build in most, weighted.
	Term string `json:"term,omitempty"`
}

type jsonCandidate struct {
	ID       string  `json:"id"`
	Topology string  `json:"topology"`
	Rank     int     `json:"rank"`
	Score    float64 `json:"score"`
	// Folded counts the near-duplicates of this build left out of the
	// list (same topology, transistor type and values); 0 with --all.
	Folded     int                     `json:"folded"`
	Terms      jsonTerms               `json:"terms"`
	Transistor jsonTransistor          `json:"transistor"`
	Resistors  map[string]jsonPosition `json:"resistors"`
	// Joins names the two points each resistor joins ("+v", "base").
	Joins map[string][2]job.Point `json:"joins"`
	report.Reference
	Nominal         jsonNominal         `json:"nominal"`
	Worst           jsonWorst           `json:"worst"`
	TestPoints      map[string]jsonBand `json:"test_points"`
	Yield           *report.YieldJSON   `json:"yield"`
	BetaSensitivity float64             `json:"beta_sensitivity"`
	MaxUtilization  float64             `json:"max_utilization"`
	Model           report.Model        `json:"model"`
	Pull            []jsonPull          `json:"pull"`
	Failing         []string            `json:"failing"`
	// UnknownRatings names the transistor ratings that matter but are not
	// stated ("vceo", "dissipation", "ic_max"): the build is not known safe.
	UnknownRatings []solver.Rating `json:"unknown_ratings"`
	// Cautions are the build's hard limits and cautions as check lists
	// them, typed, each with its text.
	Cautions []jsonCaution `json:"cautions"`
}

// jsonCaution is one caution: its typed figures and the same in words.
type jsonCaution struct {
	safety.Caution
	Text string `json:"text"`
}

type jsonTerms struct {
	QPoint      float64 `json:"qpoint"`
	Emitter     float64 `json:"emitter"`
	Beta        float64 `json:"beta"`
	Headroom    float64 `json:"headroom"`
	Utilization float64 `json:"utilization"`
	Yield       float64 `json:"yield"`
	Parts       float64 `json:"parts"`
}

type jsonTransistor struct {
	Label string `json:"label"`
	ID    int64  `json:"id"`
	Bin   string `json:"bin"`
}

type jsonPosition struct {
	Ohms        float64    `json:"ohms"`
	Code        string     `json:"code"`
	Arrangement string     `json:"arrangement"`
	Tol         float64    `json:"tol"`
	Rated_W     float64    `json:"rated_w"`
	Parts       []jsonPart `json:"parts"`
	// TCR_PPMPerK and Assumed are a kept part's TCR and the figures taken
	// at their defaults ("tol", "rated_w", "tcr_ppm_per_k").
	TCR_PPMPerK float64  `json:"tcr_ppm_per_k,omitempty"`
	Assumed     []string `json:"assumed,omitempty"`
}

type jsonPart struct {
	ID   int64   `json:"id"`
	Ohms float64 `json:"ohms"`
	Bin  string  `json:"bin"`
}

type jsonNominal struct {
	IC_A  float64 `json:"ic_a"`
	IB_A  float64 `json:"ib_a"`
	VCE_V float64 `json:"vce_v"`
	VB_V  float64 `json:"vb_v"`
	VE_V  float64 `json:"ve_v"`
	VC_V  float64 `json:"vc_v"`
	Beta  float64 `json:"beta"`
	Tj_C  float64 `json:"tj_c"`
}

type jsonWorst struct {
	ICMin_A   float64 `json:"ic_min_a"`
	ICMax_A   float64 `json:"ic_max_a"`
	VCEMin_V  float64 `json:"vce_min_v"`
	VCEMax_V  float64 `json:"vce_max_v"`
	AllActive bool    `json:"all_active"`
}

type jsonBand struct {
	Nominal_V float64 `json:"nominal_v"`
	Min_V     float64 `json:"min_v"`
	Max_V     float64 `json:"max_v"`
}

type jsonPull struct {
	ID      int64  `json:"id"`
	Kind    string `json:"kind"`
	Value   string `json:"value"`
	Bin     string `json:"bin"`
	Qty     int    `json:"qty"`
	OnHand  int    `json:"on_hand"`
	Missing int    `json:"missing"`
}

type jsonShortfall struct {
	Reasons   []string       `json:"reasons"`
	Buy       []string       `json:"buy"`
	Purchases []jsonPurchase `json:"purchases"`
	// Unapproved (with require_tags only): parts outside the approved
	// list that would give a good build once approved; not to buy.
	Unapproved []jsonPurchase `json:"unapproved"`
	Rejected   []string       `json:"rejected"`
	// TopUp is, when the stock runs short for the run, what the first
	// shown build takes beyond the stock on hand for all boards.
	TopUp []jsonPull `json:"top_up"`
}

type jsonPurchase struct {
	Slot    string  `json:"slot"`
	Ohms    float64 `json:"ohms"`
	Series  string  `json:"series"`
	Tol     float64 `json:"tol"`
	Rated_W float64 `json:"rated_w"`
	Qty     int     `json:"qty"`
	// LineID, when not 0, is the approved stock line to top up (Qty
	// more), holding OnHand; Label is a transistor line's.
	LineID int64  `json:"line_id,omitempty"`
	Bin    string `json:"bin,omitempty"`
	OnHand int    `json:"on_hand,omitempty"`
	Label  string `json:"label,omitempty"`
	Note   string `json:"note"`
}

// writeJSON writes the whole result as one indented JSON document.
func writeJSON(w io.Writer, v *job.PickOutcome) error {
	doc := jsonResult{
		Request:         jsonRequestOf(v.Request),
		Evaluated:       v.Result.Evaluated,
		Solved:          v.Result.Solved,
		Considered:      v.Result.Considered,
		Fits:            v.Fits,
		Ranking:         jsonRankingOf(v.Shown().Ranking),
		BuildableBoards: v.Buildable,
		Candidates:      []jsonCandidate{},
		Cautions:        report.Words(v.Cautions, report.JobCaution),
	}
	for _, b := range v.Builds {
		doc.Candidates = append(doc.Candidates, jsonCandidateOf(b))
	}
	for _, r := range v.Result.Rivals {
		jr := jsonRival{Topology: r.Topology.String(), Term: r.Term, Failing: r.Failing}
		if r.Best != nil {
			jr.ID, jr.Score = r.Best.ID, r.Best.Score
		}
		doc.Rivals = append(doc.Rivals, jr)
	}
	if s := v.Result.Shortfall; s != nil {
		sf := &jsonShortfall{Reasons: report.Words(s.Reasons, report.Reason), Buy: report.Words(s.Purchases, report.Purchase),
			Rejected:  report.Words(s.Rejected, report.Rejection),
			Purchases: jsonPurchases(s.Purchases), Unapproved: jsonPurchases(s.Unapproved), TopUp: []jsonPull{}}
		for _, p := range v.TopUp {
			sf.TopUp = append(sf.TopUp, jsonPullOf(p))
		}
		doc.Shortfall = sf
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}

func jsonPurchases(ps []picker.Purchase) []jsonPurchase {
	out := []jsonPurchase{}
	for _, p := range ps {
		out = append(out, jsonPurchase{Slot: p.Slot, Ohms: p.Ohm, Series: p.Series, Tol: p.Tol, Rated_W: p.Rated_W, Qty: p.Qty,
			LineID: p.Line, Bin: p.Bin, OnHand: p.OnHand, Label: p.Label, Note: report.Purchase(p)})
	}
	return out
}

func jsonRequestOf(r picker.Request) jsonRequest {
	var keep []jsonKept
	for _, k := range r.Keep {
		spec, assumed := k.Spec()
		keep = append(keep, jsonKept{Position: k.Position, Ohms: k.Ohm, Tol: spec.Tol, Rated_W: spec.Rated_W,
			TCR_PPMPerK: spec.TCR_PPMPerK, Assumed: assumed})
	}
	g := solver.GroundOf(r.Polarity, r.Topology, r.Rail)
	return jsonRequest{
		Keep:         keep,
		Topology:     topologyName(r.Topology),
		Polarity:     r.Polarity.String(),
		VCC_V:        g.Supply_V(r.VCC_V),
		VEE_V:        r.VEE_V,
		Reference:    report.ReferenceOf(r.Polarity, r.Topology, g),
		VCCTol:       r.VCCTol,
		VEETol:       r.EmitterRailTol(),
		IC_A:         r.IC_A,
		VCE_V:        r.VCE_V,
		VEMin_V:      r.VEMin_V,
		VEMax_V:      r.VEMax_V,
		AmbientMin_C: r.AmbientMin_C,
		AmbientMax_C: r.AmbientMax_C,
		Boards:       r.Boards,
		Load_Ohm:     r.RL_Ohm,
		Bypass:       r.Bypass,
		Pairs:        r.Pairs,
		RequireTags:  nonNil(r.RequireTags),
		Top:          r.Top,
		Exhaustive:   r.Exhaustive,
		Settle:       r.Settle,
		TimeLimit_S:  r.TimeLimit.Seconds(),
		Seed:         r.Seed,
	}
}

func jsonCandidateOf(c job.Build) jsonCandidate {
	jc := jsonCandidate{
		ID:       c.ID,
		Topology: c.Build.Topology.String(),
		Rank:     c.Rank,
		Score:    c.Score,
		Folded:   c.Folded,
		Terms: jsonTerms{
			QPoint:      c.Terms.QPoint,
			Emitter:     c.Terms.Emitter,
			Beta:        c.Terms.Beta,
			Headroom:    c.Terms.Headroom,
			Utilization: c.Terms.Utilization,
			Yield:       c.Terms.Yield,
			Parts:       c.Terms.Parts,
		},
		Transistor: jsonTransistor{Label: c.Transistor.Sheet.Label, ID: c.Transistor.ID, Bin: c.Transistor.Bin},
		Resistors:  map[string]jsonPosition{},
		Joins:      report.JoinsJSON(job.Joins(c.Build)),
		Reference:  report.ReferenceOf(c.Build.Device.Polarity, c.Build.Topology, c.Build.Ground),
		Nominal: jsonNominal{
			IC_A:  c.Nominal.IC_A,
			IB_A:  c.Nominal.IB_A,
			VCE_V: c.Nominal.VCE_V,
			VB_V:  c.Nominal.VB_V,
			VE_V:  c.Nominal.VE_V,
			VC_V:  c.Nominal.VC_V,
			Beta:  betaAt(c.Nominal),
			Tj_C:  c.Nominal.Tj_C,
		},
		Worst: jsonWorst{
			ICMin_A:   c.Worst.ICMin_A,
			ICMax_A:   c.Worst.ICMax_A,
			VCEMin_V:  c.Worst.VCEMin_V,
			VCEMax_V:  c.Worst.VCEMax_V,
			AllActive: c.Worst.AllActive,
		},
		TestPoints:      map[string]jsonBand{},
		BetaSensitivity: c.BetaSensitivity,
		MaxUtilization:  c.MaxUtilization,
		Model:           report.ModelOf(c.Model),
		Failing:         report.Words(c.Failing, report.Failure),
		UnknownRatings:  append([]solver.Rating{}, c.UnknownRatings...),
		Cautions:        []jsonCaution{},
	}
	if c.Yield.Boards > 0 {
		y := report.YieldJSONOf(c.Yield, c.Build, c.Window)
		jc.Yield = &y
	}
	for _, slot := range job.Slots(c.Candidate) {
		p := c.Positions[slot]
		jp := jsonPosition{
			Ohms:        p.Ohm,
			Code:        positionCode(p),
			Arrangement: p.Arrangement,
			Tol:         p.Spec.Tol,
			Rated_W:     p.Spec.Rated_W,
			Parts:       []jsonPart{},
		}
		if p.Arrangement == picker.Kept {
			jp.TCR_PPMPerK, jp.Assumed = p.Spec.TCR_PPMPerK, p.Assumed
		}
		for _, part := range p.Parts {
			jp.Parts = append(jp.Parts, jsonPart{ID: part.ID, Ohms: part.Ohm, Bin: part.Bin})
		}
		jc.Resistors[slot] = jp
	}
	for _, tp := range c.TestPoints {
		jc.TestPoints[tp.Node.String()] = jsonBand{Nominal_V: tp.Nominal_V, Min_V: tp.Min_V, Max_V: tp.Max_V}
	}
	for _, p := range c.Pull {
		jc.Pull = append(jc.Pull, jsonPullOf(p))
	}
	for _, k := range c.Safety {
		jc.Cautions = append(jc.Cautions, jsonCaution{Caution: k, Text: report.Caution(k)})
	}
	return jc
}

// jsonPullOf converts one pull-list line.
func jsonPullOf(p job.PullLine) jsonPull {
	return jsonPull{ID: p.ID, Kind: pullKind(p), Value: pullValue(p), Bin: p.Bin, Qty: p.Qty, OnHand: p.OnHand, Missing: p.Missing()}
}

// betaAt is IC/IB at the operating point (0 when IB is zero).
func betaAt(op solver.OperatingPoint) float64 {
	if op.IB_A == 0 || math.IsNaN(op.IB_A) {
		return 0
	}
	return op.IC_A / op.IB_A
}

// nonNil turns a nil slice into an empty one so JSON shows [] not null.
func nonNil[T any](s []T) []T {
	if s == nil {
		return []T{}
	}
	return s
}

// jsonRanking is picker.Ranking: whether the order of the candidates is
// proven (no build of the stock left out or listed lower can rank above
// a listed one), with what the proof took.
type jsonRanking struct {
	Proven bool `json:"proven"`
	Ranked int  `json:"ranked"`
	Rounds int  `json:"rounds"`
	// Stopped: the search stopped at the request's time limit, so the
	// builds are the best it found, not proven the best of the stock.
	Stopped bool   `json:"stopped"`
	Note    string `json:"note"`
}

func jsonRankingOf(r picker.Ranking) jsonRanking {
	return jsonRanking{Proven: r.Proven, Ranked: r.Ranked, Rounds: r.Rounds, Stopped: r.Stopped, Note: report.RankingNote(r)}
}
