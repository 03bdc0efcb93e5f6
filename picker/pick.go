package picker

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"fmt"
	"math"
	"slices"
	"strings"

	"biasbin/solver"
)

// Pick searches stock for the best builds for req: the Top builds by
// score (see doc.go), passing builds first, failing ones only with
// req.ShowFailing or, as the nearest builds, when none passes. Bad input
// is an *InputError. When no listed build fits — passes every hard limit
// with its nominal point inside the yield window — the result carries a
// Shortfall saying why and what to buy.
func Pick(stock Stock, req Request) (Result, error) {
	s, err := normalize(req)
	if err != nil {
		return Result{}, err
	}
	if err := s.checkStock(stock); err != nil {
		return Result{}, err
	}
	var res Result
	var all []fin
	var rejected []Rejection
	var evs []*evaluator
	best := map[solver.Topology]fin{}
	for _, topo := range s.topos {
		e, rej := newEvaluator(s, stock, topo)
		evs = append(evs, e)
		for _, r := range rej {
			if !slices.ContainsFunc(rejected, func(x Rejection) bool { return x.Line.ID == r.Line.ID }) {
				rejected = append(rejected, r)
			}
		}
		var cnt counters
		p := newPool(s.pool, !s.req.ShowAll)
		if len(e.devs) > 0 && len(e.vs.levels) > 0 {
			if s.req.Exhaustive {
				e.exhaustive(p, &cnt)
			} else {
				pl := planFor(e)
				pl.seed(p, &cnt)
				e.polish(p, &cnt)
				pl.search(p, &cnt)
			}
		}
		fs, err := e.finalists(p.items, s.top)
		if err != nil {
			return Result{}, err
		}
		res.Evaluated += cnt.evaluated
		res.Solved += cnt.solves
		res.Considered += e.combinations()
		if len(fs) > 0 {
			best[topo] = fs[0]
		}
		all = append(all, fs...)
	}
	slices.SortStableFunc(all, finOrder)
	passing := 0
	for _, f := range all {
		if len(f.c.Failing) == 0 {
			passing++
		}
	}
	for i, f := range all {
		c := f.c
		if len(res.Candidates) == s.top {
			break
		}
		if len(c.Failing) > 0 && !s.req.ShowFailing && passing > 0 {
			break
		}
		c.Rank = i + 1
		res.Candidates = append(res.Candidates, c)
	}
	if len(s.topos) > 1 && len(res.Candidates) > 0 {
		res.Rivals = rivals(s, res.Candidates[0], best)
	}
	// the shortfall speaks for the topology of the nearest build
	e := evs[0]
	if len(all) > 0 {
		e = all[0].ev.e
	}
	if !slices.ContainsFunc(res.Candidates, e.fits) {
		res.Shortfall = e.shortfall(rejected, res.Candidates)
		if len(req.RequireTags) > 0 {
			if err := approvedOnly(res.Shortfall, stock, req, s.boards); err != nil {
				return Result{}, err
			}
		}
	}
	return res, nil
}

// newEvaluator prepares the value sets and devices of a request for one
// topology.
func newEvaluator(s settings, stock Stock, topo solver.Topology) (*evaluator, []Rejection) {
	var lines []Resistor
	for _, r := range stock.Resistors {
		if HasTags(r.Tags, s.req.RequireTags) {
			lines = append(lines, r)
		}
	}
	lay := layoutOf(topo)
	kept, at := s.keptSpecs(lay)
	vs := buildValues(lines, s.boards, s.req.Pairs, s.ambMax, s.lim, kept...)
	span := s.vcc
	if lay.split {
		span += s.vee
	}
	devs, rejected := s.transistorCandidates(stock.Transistors, lay.split)
	slices.SortStableFunc(devs, func(a, b device) int { return int(sign64(a.line.ID - b.line.ID)) })
	e := &evaluator{s: s, lay: lay, vs: &vs, devs: devs, span: span}
	e.pinKept(at)
	e.setLabelGroups()
	for i := range e.devs {
		e.devs[i].betaNomMin = e.nominalBetaMin(&e.devs[i])
	}
	return e, rejected
}

func sign64(v int64) int64 {
	switch {
	case v < 0:
		return -1
	case v > 0:
		return 1
	}
	return 0
}

// combinations is the number of builds the search covers: devices times
// the stocked values for each free position (a kept position has one),
// saturating at math.MaxInt64 (a large stock covers more than that).
func (e *evaluator) combinations() int64 {
	c := int64(len(e.devs))
	for i := range e.lay.n {
		n := int64(len(e.vs.values) - len(e.vs.kept))
		if e.kept[i] {
			n = 1
		}
		if n != 0 && c > math.MaxInt64/n {
			return math.MaxInt64
		}
		c *= n
	}
	return c
}

// fin is a finalist: the pooled build and its candidate with the yield
// term added.
type fin struct {
	ev *evaluated
	c  Candidate
}

// finOrder is the final order: passing first, then the final score, then
// the tie-break key.
func finOrder(a, b fin) int {
	af, bf := len(a.ev.failing) > 0, len(b.ev.failing) > 0
	switch {
	case af != bf && !af:
		return -1
	case af != bf:
		return 1
	case a.c.Score < b.c.Score:
		return -1
	case a.c.Score > b.c.Score:
		return 1
	}
	return strings.Compare(a.ev.key, b.ev.key)
}

// finalists returns the pooled builds in final order (finOrder), running
// the Monte Carlo yield lazily: in the pool's order (the same order by the
// score without the yield term) until the k-th best final order is no
// later than the next build's order without the yield term. The yield
// term is never negative, so no later build of the pool can move ahead of
// the k-th: the first k are the pool's true first k whatever k is. The
// list holds every build whose yield was run (at least the first k, when
// the pool has k).
func (e *evaluator) finalists(items []*evaluated, k int) (fs []fin, err error) {
	// before reports whether a (final) comes before the order of ev
	// without its yield term, or is the same build.
	before := func(a fin, ev *evaluated) bool {
		af, bf := len(a.ev.failing) > 0, len(ev.failing) > 0
		if af != bf {
			return !af
		}
		if a.c.Score != ev.score {
			return a.c.Score < ev.score
		}
		return a.ev.key <= ev.key
	}
	for i, ev := range items {
		c, err := ev.e.candidate(ev)
		if err != nil {
			return nil, err
		}
		c.Terms.Yield = 1 - c.Yield.Yield
		c.Score = ev.score + e.s.w.Yield*c.Terms.Yield
		f := fin{ev: ev, c: c}
		at, _ := slices.BinarySearchFunc(fs, f, finOrder)
		fs = slices.Insert(fs, at, f)
		if len(fs) >= k && i+1 < len(items) && before(fs[k-1], items[i+1]) {
			break
		}
	}
	return fs, nil
}

// fits reports whether a build is good: it passes every hard limit and
// its nominal point lies inside the yield window.
func (e *evaluator) fits(c Candidate) bool {
	return len(c.Failing) == 0 && e.window(c.VCETarget_V).Contains(&c.Nominal)
}

// window is the yield window of a build: the request's rule (WindowRule)
// around the design point, the target current and the build's VCE target.
func (e *evaluator) window(vceT float64) YieldWindow {
	c := CentreOf(e.s.icT, vceT, solver.OperatingPoint{})
	r := e.s.req.Window.WithDefault()
	return YieldWindow{Window: r.At(c), Rule: r, Centre: c}
}

// candidate completes one pooled build: the full worst case with its
// corners, the yield and the shown fields.
func (e *evaluator) candidate(ev *evaluated) (Candidate, error) {
	b := e.build(ev.c)
	d := &e.devs[ev.c.dev]
	c := Candidate{
		ID:              e.id(ev.c),
		Topology:        e.lay.topo,
		Score:           ev.score,
		Terms:           ev.terms,
		Transistor:      d.line,
		Positions:       map[string]Position{},
		Build:           b,
		Model:           d.typ,
		Nominal:         ev.op,
		BetaSensitivity: math.Abs(ev.beta),
		MaxUtilization:  ev.util,
		Failing:         ev.failing,
		VCETarget_V:     e.vceTarget(d, e.ohms(ev.c.lv)),
		UnknownRatings:  solver.UnknownRatings(d.line.Sheet, e.s.icT),
	}
	c.OnTarget = e.window(c.VCETarget_V).Contains(&c.Nominal)
	if !e.s.req.ShowAll {
		c.Folded = e.folded(ev.c)
	}
	for i, vi := range ev.c.val[:e.lay.n] {
		pos := e.vs.position(vi)
		if e.kept[i] {
			pos.Assumed = e.s.assumedOf(e.lay.names[i])
		}
		c.Positions[e.lay.names[i]] = pos
	}
	if wc, err := solver.EvalWorstCase(b, e.s.lim); err == nil {
		c.Worst = wc
	} else {
		c.Worst = ev.worst
	}
	seed := e.s.req.Seed ^ keySeed(ev.key)
	c.Window = e.window(c.VCETarget_V)
	y, err := solver.EvalYieldSeeded(b, c.Window.Window, e.s.yieldBoards, seed, solver.YieldOptions{})
	if err != nil {
		return c, fmt.Errorf("yield of build %s: %w", c.ID, err)
	}
	c.Yield = y
	return c, nil
}

// keySeed derives a per-build seed from its key, so a build's yield does
// not depend on the order builds were found in.
func keySeed(key string) uint64 {
	h := sha256.Sum256([]byte(key))
	return binary.LittleEndian.Uint64(h[:8])
}

// id is the stable build ID: a hash of the topology, the transistor line
// and, per position, the arrangement and the part line IDs. The same stock
// lines give the same ID whatever the request.
func (e *evaluator) id(c combo) string {
	var sb strings.Builder
	fmt.Fprintf(&sb, "%v|t%d", e.lay.topo, e.devs[c.dev].line.ID)
	for i, vi := range c.val[:e.lay.n] {
		v := e.vs.values[vi]
		fmt.Fprintf(&sb, "|%s:%s", e.lay.names[i], v.arr)
		if v.kept {
			sb.WriteString(":" + keptNote(v.spec))
		}
		for _, li := range v.parts() {
			fmt.Fprintf(&sb, ":%d", e.vs.lines[li].ID)
		}
	}
	h := sha256.Sum256([]byte(sb.String()))
	return "b" + hex.EncodeToString(h[:6])
}
