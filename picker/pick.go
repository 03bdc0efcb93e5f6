package picker

import (
	"cmp"
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"fmt"
	"math"
	"slices"
	"strings"
	"sync"
	"sync/atomic"
	"time"

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
	s.stop, s.hit = &atomic.Bool{}, &atomic.Bool{}
	s.values = &valueMemo{}
	if req.TimeLimit > 0 {
		t := time.AfterFunc(req.TimeLimit, func() { s.stop.Store(true) })
		defer t.Stop()
	}
	var res Result
	var rejected []Rejection
	// Each topology is searched exactly as alone, so they run at once:
	// one search's serial stretches (seeds, ranking) leave the other
	// cores to the others.
	if len(s.topos) > 1 && req.Progress != nil {
		s.progress = newProgressSum(req.Progress, len(s.topos))
	}
	runs := make([]*topoRun, len(s.topos))
	rejs := make([][]Rejection, len(s.topos))
	errs := make([]error, len(s.topos))
	var wg sync.WaitGroup
	for i, topo := range s.topos {
		wg.Go(func() {
			e, rej := newEvaluator(s, stock, topo)
			e.slot = i
			rejs[i] = rej
			r := &topoRun{e: e, fl: finalists{e: e, k: s.top}, size: s.pool, rounds: 1}
			p := newPool(s.pool, !s.req.ShowAll)
			r.pl = e.firstSearch(p, &r.cnt, s.req.Exhaustive)
			errs[i] = r.rank(p)
			runs[i] = r
		})
	}
	wg.Wait()
	for i := range runs {
		if errs[i] != nil {
			return Result{}, errs[i]
		}
		for _, r := range rejs[i] {
			if !slices.ContainsFunc(rejected, func(x Rejection) bool { return x.Line.ID == r.Line.ID }) {
				rejected = append(rejected, r)
			}
		}
	}
	// Further rounds, each topology's against the k-th of all.
	res.Ranking.Proven = true
	for _, r := range runs {
		for !r.settled(runs) {
			if r.rounds > settleRounds && !s.req.Settle || r.e.stopped() {
				res.Ranking.Proven = false
				break
			}
			// Builds outside the pools may still overtake the k-th: a
			// further round finds the next best builds (a pool
			// roundGrowth times larger) among those whose final score
			// can be at most the k-th's.
			kth, _ := kthOf(runs, s.top)
			r.size *= roundGrowth
			p := newRoundPool(r.size, !s.req.ShowAll, kth.c.Score, len(kth.ev.failing) > 0, r.known)
			if r.pl == nil {
				r.e.exhaustive(p, &r.cnt)
			} else {
				r.pl.search(p, &r.cnt)
			}
			r.rounds++
			if err := r.rank(p); err != nil {
				return Result{}, err
			}
		}
	}
	var all []fin
	best := map[solver.Topology]fin{}
	for _, r := range runs {
		res.Evaluated += r.cnt.evaluated
		res.Solved += r.cnt.solves
		res.Considered += r.e.combinations()
		res.Ranking.Ranked += r.fl.ranked
		res.Ranking.Rounds = max(res.Ranking.Rounds, r.rounds)
		if len(r.fl.fs) > 0 {
			best[r.e.lay.topo] = r.fl.fs[0]
		}
		all = append(all, r.fl.fs...)
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
	// the shown builds' full worst cases are independent: they go to the
	// search's workers
	runs[0].e.onWorkers(len(res.Candidates), &counters{}, func(_, i int, _ *counters) {
		all[i].ev.e.completeWorst(&res.Candidates[i])
	})
	if len(s.topos) > 1 && len(res.Candidates) > 0 {
		res.Rivals = rivals(s, res.Candidates[0], best)
	}
	// the shortfall speaks for the topology of the nearest build
	e := runs[0].e
	if len(all) > 0 {
		e = all[0].ev.e
	}
	if !slices.ContainsFunc(res.Candidates, e.fits) {
		res.Shortfall = e.shortfall(rejected, res.Candidates)
		if len(req.RequireTags) > 0 {
			stopped, err := approvedOnly(res.Shortfall, stock, req, s.boards)
			if err != nil {
				return Result{}, err
			}
			if stopped {
				s.hit.Store(true)
			}
		}
	}
	if s.hit.Load() {
		res.Ranking.Stopped, res.Ranking.Proven, res.Ranking.TimeLimit = true, false, req.TimeLimit
	}
	return res, nil
}

// topoRun is the search of one topology in Pick, round by round.
type topoRun struct {
	e      *evaluator
	pl     plan // nil for the exhaustive search
	cnt    counters
	fl     finalists
	known  []*evaluated // every build of the rounds so far
	last   *evaluated   // the last build of the last round's pool
	full   bool         // the last round's pool was full
	done   bool         // fl.rank settled the topology's own first k
	size   int          // the last round's pool size
	rounds int
}

// rank ranks the builds of a round's pool.
func (r *topoRun) rank(p *pool) error {
	r.known = append(r.known, p.items...)
	r.full = len(p.items) == r.size
	if len(p.items) > 0 {
		r.last = p.items[len(p.items)-1]
	}
	done, err := r.fl.rank(p.items)
	r.done = r.done || done
	return err
}

// settled reports whether no build of the topology left out of its
// rounds can rank above the k-th of all topologies (runs).
func (r *topoRun) settled(runs []*topoRun) bool {
	s := r.e.s
	if r.done || !r.full || s.w.Yield <= 0 {
		return true // its first k are settled, or its pools held every build
	}
	kth, ok := kthOf(runs, s.top)
	if !ok {
		return true // cannot be: a full pool ranks at least k builds
	}
	if len(kth.ev.failing) > 0 && !s.req.ShowFailing && slices.ContainsFunc(runs, func(x *topoRun) bool {
		return len(x.fl.fs) > 0 && len(x.fl.fs[0].ev.failing) == 0
	}) {
		return true // failing builds are not listed beside passing ones
	}
	// every build left out comes after the last round's last
	return finBefore(kth, r.last)
}

// kthOf is the k-th build of all topologies' ranked builds, in the final
// order; ok is false when fewer are ranked.
func kthOf(runs []*topoRun, k int) (fin, bool) {
	var all []fin
	for _, r := range runs {
		all = append(all, r.fl.fs...)
	}
	if len(all) < k {
		return fin{}, false
	}
	slices.SortFunc(all, finOrder)
	return all[k-1], true
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
	vs := s.values.get(s.req.Pairs, kept, func() *valueSet {
		vs := buildValues(lines, s.boards, s.req.Pairs, s.ambMax, s.lim, kept...)
		return &vs
	})
	span := s.vcc
	if lay.split {
		span += s.vee
	}
	devs, rejected := s.transistorCandidates(stock.Transistors, lay.split)
	slices.SortStableFunc(devs, func(a, b device) int { return int(sign64(a.line.ID - b.line.ID)) })
	e := &evaluator{s: s, lay: lay, vs: vs, devs: devs, span: span, stock: stock}
	e.pinKept(at)
	e.setLabelGroups()
	for i := range e.devs {
		e.devs[i].betaNomMin, e.devs[i].betaTypMin = e.nominalBetaMin(&e.devs[i])
		e.devs[i].hotCap = e.newHotCap(&e.devs[i])
		e.devs[i].xtb = newXTBTable(&e.devs[i])
		e.devs[i].isNominal, _, _, _ = e.devs[i].typ.At(NominalAmbient_C)
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

// Rounds of the search (Pick): each further round's pool is roundGrowth
// times the last's; without Request.Settle at most settleRounds further
// rounds run.
const (
	roundGrowth  = 4
	settleRounds = 0
)

// finalists ranks builds by their final score (finOrder), running the
// Monte Carlo yield lazily. rank takes builds in the order of the score
// without the yield term (the pool's), each batch after the last, and
// stops once the k-th best final order is no later than the next build's
// order without the yield term: the term is never negative, so no later
// build can move ahead of the k-th. Once k builds are ranked, a build's
// yield run stops as soon as its failures show that it cannot come before
// the k-th (solver.YieldOptions.FailLimit), and the build is dropped.
// fs holds every build ranked: at least the true first k of all builds
// offered, when k were offered.
type finalists struct {
	e      *evaluator
	k      int
	fs     []fin
	ranked int // builds whose yield was run or bounded
	ahead  int // yield runs started at once past the first k; 0: rankAhead
}

// rank ranks a batch of builds, in order, after those already ranked; it
// reports whether it stopped before the batch's end because no later
// build can move ahead of the k-th (whether a build after the batch can
// is topoRun.settled's question).
//
// The yield runs go ahead of the order, several at once (runAhead), each
// with the failure limit against the k-th as it stood when the run
// began. The k-th only improves as builds are ranked, so that limit is no
// tighter than the one the build would have had in its turn: a run it
// stops would have stopped in its turn too, and a completed run is
// checked against the limit of its turn when it is taken. The result is
// the same as one build at a time; only work after the last build taken
// is wasted.
func (f *finalists) rank(items []*evaluated) (done bool, err error) {
	e, k := f.e, f.k
	type ahead struct {
		c       Candidate
		stopped bool
		err     error
	}
	runs := make([]*ahead, len(items))
	// runAhead runs the yields of items[i:i+m] at once, each with its
	// failure limit against the k-th now (none before k are ranked);
	// those that cannot come before the k-th whatever their yield are
	// left out.
	runAhead := func(i, m int) {
		var wg sync.WaitGroup
		for j := i; j < min(i+m, len(items)); j++ {
			limit := 0
			if len(f.fs) >= k {
				var skip bool
				if limit, skip = e.failLimit(f.fs[k-1], items[j]); skip {
					continue
				}
			}
			r := &ahead{}
			runs[j] = r
			wg.Go(func() { r.c, r.stopped, r.err = e.candidate(items[j], limit) })
		}
		wg.Wait()
	}
	// Until k builds are ranked no build's run has a failure limit: the
	// first runs go at once.
	if m := min(k-len(f.fs), len(items)); m > 1 {
		runAhead(0, m)
	}
	for i, ev := range items {
		f.ranked++
		limit := 0
		if len(f.fs) >= k {
			var skip bool
			if limit, skip = e.failLimit(f.fs[k-1], ev); skip {
				continue
			}
		}
		if runs[i] == nil {
			runAhead(i, cmp.Or(f.ahead, rankAhead))
		}
		r := runs[i]
		if r.err != nil {
			return false, r.err
		}
		if r.stopped || limit > 0 && r.c.Yield.Boards-r.c.Yield.Pass > limit {
			continue // more failures than its turn's limit allows
		}
		c := r.c
		c.Terms.Yield = 1 - c.Yield.Yield
		c.Score = ev.score + e.s.w.Yield*c.Terms.Yield
		fn := fin{ev: ev, c: c}
		at, _ := slices.BinarySearchFunc(f.fs, fn, finOrder)
		f.fs = slices.Insert(f.fs, at, fn)
		if len(f.fs) >= k && i+1 < len(items) && finBefore(f.fs[k-1], items[i+1]) {
			return true, nil
		}
	}
	return false, nil
}

// rankAhead is how many yield runs finalists.rank starts at once past the
// first k.
const rankAhead = 2

// finBefore reports whether a (final) comes before the order of ev
// without its yield term, or is the same build.
func finBefore(a fin, ev *evaluated) bool {
	af, bf := len(a.ev.failing) > 0, len(ev.failing) > 0
	if af != bf {
		return !af
	}
	if a.c.Score != ev.score {
		return a.c.Score < ev.score
	}
	return a.ev.key <= ev.key
}

// failLimit is the yield run's failure limit for build ev against the
// k-th ranked build kth: ev can come before kth only if its final score
// ev.score + w·failures/N is at most kth's, so more than
// (kth − ev.score)·N/w failures settle that it cannot (one more board is
// allowed against rounding). skip: ev cannot come before kth whatever its
// yield; 0: no limit.
func (e *evaluator) failLimit(kth fin, ev *evaluated) (limit int, skip bool) {
	kf, ef := len(kth.ev.failing) > 0, len(ev.failing) > 0
	switch {
	case kf != ef:
		return 0, ef // a passing build comes before a failing one
	case e.s.w.Yield <= 0:
		return 0, false
	}
	room := kth.c.Score - ev.score
	if room < 0 || ev.noYield && ev.finalFloor() > kth.c.Score {
		return 0, true
	}
	n := float64(e.s.yieldBoards)
	if m := math.Floor(room*n/e.s.w.Yield) + 1; m < n {
		return int(m), false
	}
	return 0, false
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
// corners, the yield and the shown fields. With failLimit > 0 the yield
// run stops once more than failLimit boards fail, and then candidate
// reports stopped and no candidate.
func (e *evaluator) candidate(ev *evaluated, failLimit int) (c Candidate, stopped bool, err error) {
	b := e.build(ev.c)
	d := &e.devs[ev.c.dev]
	vceT := e.vceTarget(d, e.ohms(ev.c.lv))
	win := e.window(vceT)
	seed := e.s.req.Seed ^ keySeed(ev.key)
	y, err := solver.EvalYieldSeeded(b, win.Window, e.s.yieldBoards, seed, solver.YieldOptions{FailLimit: failLimit})
	if err != nil {
		return c, false, fmt.Errorf("yield of build %s: %w", e.id(ev.c), err)
	}
	if y.Stopped {
		return c, true, nil
	}
	c = Candidate{
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
		VCETarget_V:     vceT,
		UnknownRatings:  solver.UnknownRatings(d.line.Sheet, e.s.icT),
		Window:          win,
		Yield:           y,
	}
	c.OnTarget = win.Contains(&c.Nominal)
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
	c.Worst = ev.worst // the shown builds get the full one (completeWorst)
	return c, false, nil
}

// completeWorst gives c, a build to be shown, its full worst case (with
// every corner and the RSS spread), which ranking does not need: the
// worst case it was scored with stays where that cannot be solved.
func (e *evaluator) completeWorst(c *Candidate) {
	if wc, err := solver.EvalWorstCase(c.Build, e.s.lim); err == nil {
		c.Worst = wc
	}
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

// firstSearch fills p with the stock's best builds by the score without
// the yield term: the exhaustive evaluation, or the plan's seed, polish
// and branch and bound, whose plan it returns for later rounds (nil for
// the exhaustive one, or with no transistor or value to search).
func (e *evaluator) firstSearch(p *pool, cnt *counters, exhaustive bool) plan {
	if len(e.devs) == 0 || len(e.vs.levels) == 0 {
		return nil
	}
	if exhaustive {
		e.exhaustive(p, cnt)
		return nil
	}
	pl := planFor(e)
	pl.seed(p, cnt)
	e.polish(p, cnt)
	e.singlesFirst(p, cnt)
	pl.search(p, cnt)
	return pl
}

// singlesFirst, when some level holds only pairs and a pair costs a
// placement, runs the whole search over the builds of single parts alone
// (an evaluator of the stock without pairs, with a pool of its own that
// starts from p's threshold) and scores here the level tuples of the
// builds it keeps. A pair costs a placement, so the best builds mostly
// hold singles, and the search over pairs, far larger, starts from a
// threshold near its last one. Like the seeds it changes only the order
// of the search.
func (e *evaluator) singlesFirst(p *pool, cnt *counters) {
	if e.s.w.Parts <= 0 || !e.vs.hasPairOnly() {
		return
	}
	s := e.s
	s.req.Pairs, s.req.Progress = false, nil
	se, _ := newEvaluator(s, e.stock, e.lay.topo)
	if len(se.devs) != len(e.devs) || len(se.vs.levels) == 0 {
		return
	}
	sp := newRoundPool(p.size, p.fold, p.threshold(), true, nil)
	pl := planFor(se)
	pl.seed(sp, cnt)
	se.polish(sp, cnt)
	pl.search(sp, cnt)
	var tc tupleCache
	for _, ev := range sp.items {
		var lv [maxPos]int
		for i := range e.lay.n {
			ohm := se.vs.levels[ev.c.lv[i]].ohm
			lv[i] = e.vs.levelAtOrAbove(ohm)
			if lv[i] == len(e.vs.levels) || !sameOhm(e.vs.levels[lv[i]].ohm, ohm) {
				return // not the same levels: leave the order as it is
			}
		}
		tc.reset() // it holds one device's tuples
		e.scoreVariants(tc.get(e, ev.c.dev, lv, cnt), p, p.add, cnt)
	}
}
