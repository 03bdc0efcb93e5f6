// Package picker searches the parts in stock for the best bias builds of a
// single-transistor stage and ranks them. It is pure: a Stock and a
// Request in, a ranked Result out; it never touches the database and never
// prints. Units are SI; the request's rail is signed (negative for a PNP
// stage) and everything else is a magnitude.
//
// # Request defaults
//
// A zero field means its default: Topology divider (AnyTopology: every
// topology, see "Several topologies"); Polarity from the sign
// of VCC_V; VCE_V the maximum-symmetrical-swing rule below; ambient
// 0..50 °C; Boards 1; Top 5 (DefaultTop); Window DefaultWindowRule,
// ±10 % IC around the target and ±20 % VCE around the build's VCE target
// (WindowRule: the one window rule, which check follows too); Weights
// DefaultWeights(); Limits the solver's defaults (resistors at most 50 %
// of the derated rating, the transistor at most 75 %, 0.5 V above
// VCE(sat) at every corner); Finalists 2·max(Top, 5) + 5; YieldBoards 400;
// TimeLimit none (DefaultTimeLimit is the limit a front end offers).
// A bad request or stock is an *InputError naming the field, the problem
// and the fix.
//
// # Candidates
//
// Transistors: lines of the polarity carrying every required tag (and,
// with Request.Transistor, bearing that label, ASCII letter case aside;
// the search is then the search of a stock holding only those lines), holding
// at least Boards parts, with VCEO ≥ VCC·(1+tol)/0.8, IC max ≥ IC/0.5 and
// the dissipation at the target current and mid-supply VCE within the
// derated, margined allowance at the hottest ambient (common practice
// margins; the worst-case corners check every build again). Resistor
// values: every line with at least Boards parts, and with Request.Pairs
// every series and parallel pair of two lines (one line twice when it
// holds 2·Boards), except pairs whose lesser part carries under 1 % of the
// value. A pair's tolerance, TCR and rating are derived in pairs.go
// (worst-case tolerance, first-order TCR, the part that reaches its rating
// first). Quantities hold across the whole build: a line used in several
// positions, or a pair, must hold Boards times every part drawn from it.
//
// # Score
//
// Every term is ≥ 0 and lower is better; the score is their weighted sum.
// The nominal point is the self-heated operating point at 25 °C ambient
// (NominalAmbient_C) with the typical hFE, every part at its marked value.
//
//	QPoint      |IC − IC_target|/IC_target + |VCE − VCE_target|/|VCC|  at the nominal point
//	Emitter     (max(0, VE − VE_max) + max(0, VE_min − VE))/|VCC| at the nominal point:
//	            the emitter resistor's slice of the supply outside the band
//	            (Request.VEMin_V..VEMax_V, default 5 %..20 % of |VCC|; about a
//	            tenth is common practice — enough emitter feedback to swamp
//	            VBE drift, little enough to leave the supply to the swing)
//	Beta        |IC(hFE max) − IC(hFE min)|/IC  (both self-heated at 25 °C, nominal parts)
//	Headroom    max(0, 1 − s/0.10) + max(0, 1 − c/0.50), where
//	            s = (VCE_min − VCE(sat) − margin)/|VCC| and c = IC_min/IC_target
//	            over every worst-case corner (solver.EvalWorstCase)
//	Utilization the largest part utilization at the nominal point against the
//	            ratings derated at the hottest ambient (solver.EvalDissipation)
//	Yield       1 − Monte Carlo yield (solver.EvalYieldSeeded), finalists only
//	Parts       the number of positions filled by a pair: each pair is one
//	            more part to place and solder
//
// Default weights: QPoint 2, Emitter 2, Beta 1, Headroom 1,
// Utilization 0.25, Yield 1, Parts 0.05 (DefaultPartsWeight: a pair's
// extra placement costs what a 2.5 % IC error costs, so a pair must buy a
// real improvement over stocked singles to rank above them). The VCE
// target is the request's, or the VCE that maximises the
// symmetrical swing of this build at the target current: with
// r_ac = RC‖RL + RE(unbypassed) and R_dc = RC + RE it is
// VCE(sat) + (|VCC| − VCE(sat))·r_ac/(R_dc + r_ac), which is the mid-point
// (|VCC| + VCE(sat))/2 with no load and no bypass.
//
// Hard limits: a build with any corner outside the active region or less
// than the margin above VCE(sat), any part over its derated, margined
// rating at any corner, IC over the transistor's IC max, or a bench point
// (25 °C ambient, marked values, at hFE min, typical or max: the board on
// the bench at bring-up, whatever the ambient range) outside the active
// region or the VCE margin fails, with its reasons in Candidate.Failing.
// The bench points lie inside the corner box when the ambient range holds
// 25 °C, so there they only restate the corners; the search's bounds rest
// on them either way. A failing build never ranks above a
// passing one; failing builds are listed only with Request.ShowFailing or,
// as the nearest builds, when nothing passes. Near-duplicates (the same
// topology, transistor type and values, differing only in tolerance
// grade, rating, TCR or stock line; fold.go) take one place: the search
// keeps the best of each group and counts the rest in Candidate.Folded,
// unless Request.ShowAll.
//
// Order: passing before failing, then the score, then a fixed key: the
// transistor line ID, then per position R1, R2, RC, RE the value's
// resistance and its preference (single before series before parallel,
// tighter tolerance, higher rating, smaller |TCR|, lower line IDs). The
// search keeps the best Finalists builds by the score without the yield
// term (the pool) and runs their yield lazily, in that order, until the
// Top-th best final score is no worse than the next build's score without
// the term; as the term is never negative, no later build can overtake
// it. Once Top builds are ranked, a build's Monte Carlo stops as soon as
// its failed boards show it cannot come before the Top-th
// (solver.YieldOptions.FailLimit), and a build whose worst-case band
// misses the window has yield 0 for certain. When the pool runs out first
// (the yield term reorders builds beyond it), a further round searches
// again with a pool roundGrowth times larger, admitting only builds not
// ranked yet whose final score can be at most the Top-th's (with several
// topologies, the Top-th of all), and so on. Without Request.Settle at
// most settleRounds further rounds run (none: the search stays as fast
// as one pool); Result.Ranking says whether the
// order is proven: no build left out can rank above a listed one, so the
// first Top builds are the true first Top whatever Top is. Low yields
// that differ much between builds can leave it unproven, and the text and
// JSON say so. Candidate.ID is a hash of the topology, the transistor
// line and each position's arrangement and line IDs, so the same stock
// lines give the same ID.
//
// # Search
//
// Request.TimeLimit bounds the search's time: the plans' loops stop once
// it has run out (evaluator.stopped), the builds found by then are ranked
// as usual (each still evaluated exactly, yield and all), and
// Result.Ranking.Stopped says that they are the best found, not proven
// the best of the stock.
//
// The search works on resistance levels (distinct values, ascending; the
// values of one level share one nominal point) and level tuples, one
// level per position. Request.Exhaustive solves the nominal point of
// every level tuple and scores every build. The default search first
// scores a few hand-method builds per device (the plan's seed; with
// pairs, the divider's and collector feedback's also with every level
// snapped to one holding a single) and
// hill-climbs from the best (order only, shared by every topology); with
// pairs, it then runs the whole search over single parts alone and scores
// the level tuples of the builds that search keeps (singlesFirst: a pair
// costs a placement, so the best builds mostly hold singles, and the far
// larger search over pairs starts from a threshold near its last one);
// then it runs the plan's branch and bound.
//
// # How a topology plugs in
//
// A topology is two pieces, and nothing else in the package knows it:
//
//   - a layout (layout.go): its positions in order — the solver slot and
//     the name of each (the Candidate.Positions keys), which position is
//     RC and which RE (the VCE target and the emitter term read them),
//     and the tolerance signs of the two corners the headroom floor
//     solves (any signs keep that floor a lower bound). The evaluator
//     (nominal.go, score.go, corners.go, combo.go) builds stages, builds,
//     tie-break keys, IDs and reasons from the layout alone, and the
//     exhaustive evaluation and the hill-climb (plan.go) walk any number
//     of positions up to maxPos.
//   - a plan (plan.go's interface): seed, a few hand-method builds per
//     device, and search, which must cover every level tuple of every
//     device — evaluating it, or showing that a lower bound on the score
//     of every build it drops exceeds the pool's threshold T. Its bounds
//     are its own, each stated at its site and argued from the nominal
//     point's monotonicity in that topology's resistors (as L1 and L2
//     below for the divider); the threshold-derived window (IC within
//     ±T/w_QPoint of the target, boundsNow) and the per-build cuts of
//     scoreVariants hold for every topology.
//
// Bound P, the parts term, holds for every plan: a level whose values are
// all pairs (level.pairOnly) puts at least one extra part in its position,
// so every build with it scores at least the floor of its other terms
// plus w_Parts. Each loop adds the parts floors of the positions it has
// fixed to the floors it compares with T, and where floor + w_Parts
// exceeds T it visits only the levels holding a single (see "Pairs").
// scoreVariants forms only the value combinations of a level tuple with
// at most as many pairs as T leaves room for over its exact QPoint and
// emitter terms (a wall with pairs may hold dozens of values per level,
// so most combinations would fail that check).
//
// TestSearchMatchesExhaustive compares every plan with the exhaustive
// evaluation on random stocks, TestPairsMatchExhaustive on E96 sub-walls
// with pairs and parts weights from 0 up.
//
// # Pairs
//
// A pair's value is a sum (series) or a harmonic sum (parallel) of two
// stocked values. Every worthwhile pair is formed once (n lines give up
// to n(n+1) values: the E96 wall of 481 lines about 232 000, in about
// 110 000 levels) and sorted with the singles into one ascending list of
// levels, so a pair is searched exactly as a single is: every bound of a
// plan is an interval of a position's resistance (the IC window gives R1's,
// RF's or RB's range by bisection over the sorted levels, the VCE band
// RC's, the RE cuts RE's) and only the levels inside it are visited, at a
// cost of the logarithm of the level count per bisection, not of the pair
// count. Within the interval, bound P does the rest: the levels holding a
// single are indexed (valueSet.nextSingle, prevSingle, singleLevels), and
// a loop whose floor leaves no room for w_Parts steps from one such level
// to the next, its bisections probe only them (a predicate monotone over
// every level is monotone over a subsequence: valueSet.firstIn), and a
// solved tuple scores only its singles when its Q-point and emitter terms
// leave no room either (scoreVariants). Every build so passed over puts a
// pair in a position where its floor plus w_Parts exceeds T, so the search
// stays exact. On a dense wall the best builds are singles unless a pair
// buys more than w_Parts, so the search visits about what the singles
// alone would; with w_Parts = 0 a pair costs nothing, the pair levels form
// a near-continuum of values, and the number of near-ties the bounds must
// separate grows with it (the benchmarks say how far).
//
// # The divider's plan
//
// The divider's plan covers (device, RE, R2, R1, RC). Both keep the pool of the best Finalists builds; the pool's
// threshold T is the last member's score once the pool is full of passing
// builds (+∞ before). A build whose score is shown to exceed T can never
// enter: a passing one would rank below the last member, a failing one
// below every member. Every cut compares a lower bound on the score of
// every build it drops with T, so the pool — and so the result — is the
// exhaustive one; TestSearchMatchesExhaustive checks this on random
// stocks. With δ = T/w_QPoint every build that can still enter has its
// nominal IC in [IC_t(1−δ), IC_t(1+δ)] and VCE within δ·|VCC| of its
// target, because the QPoint term alone is below δ.
//
// The cuts rest on two facts about the nominal point (all parts at
// their marked values, the stable self-heated equilibrium):
//
//   - L1: IC falls as R1 or RE rises and rises with R2. Isothermally the
//     base drive falls with R1 and RE and rises with R2; the Early effect
//     and self-heating are feedback loops whose loop gain is below one at
//     a stable equilibrium, so they scale the change but cannot reverse it.
//     This holds in the active region; a build that saturates at its
//     nominal point fails (a bench-point hard limit), so only active
//     builds need the bound.
//   - L2: VCE and IC fall as RC rises (if VCE rose, the Early effect would
//     raise IC and so lower VCE: a contradiction; less VCE means less
//     power, a cooler junction and less IC), and saturation only deepens.
//
// Both are proved for the isothermal circuit and carried to the
// self-heated one by the loop-gain argument. The bounds, per loop level
// (doc comments at each site repeat them):
//
//   - U-RE: RE dissipates IE²·RE ≥ IC_lo²·RE, so the utilization term is
//     at least that over the best allowance at the hot ambient; it rises
//     with RE, so the upward RE run stops.
//   - Q-RE: VCE ≤ |VCC| − IC(RC + RE) ≤ |VCC| − IC_lo(RC_min + RE); once
//     this is more than δ|VCC| below the lowest VCE target no larger RE can
//     come close.
//   - E-RE: VE = IE·RE lies in [IC_lo·RE, k·IC_hi·RE], so the emitter term
//     is at least (IC_lo·RE − VE_max)/|VCC| (rising with RE: the upward run
//     stops) and at least (VE_min − k·IC_hi·RE)/|VCC| (an RE too small is
//     skipped). The term is ≥ 0 and only adds to the score, so every other
//     floor stays a floor.
//   - RC band: with IE between IC and k·IC, k = 1 + 1/β_min, where β_min
//     bounds IC/IB at every nominal point of a passing build
//     (nominalBetaMin: the transport model's IC/IB at hFE min, bounded over
//     junction temperatures up to Tj max, the Early factor and the
//     collector junction's share, as in bound B), VCE lies in
//     [|VCC| − IC_hi(RC + k·RE), |VCC| − IC_lo(RC + RE)]; RC outside the band
//     where this can come within δ|VCC| of the target band is out.
//   - U-RC: RC carries IC ≥ IC_lo (collector feedback: IE ≥ IC) and is
//     at least the RC band's bottom level, so the utilization term is at
//     least IC_lo²·RC_lo over the best allowance of any value; with U-RE's
//     floor the larger of the two counts (the term is the hottest part's).
//     Where the hottest part is RC (a stage at several milliamperes), it
//     narrows the IC window of every build at that R2 (collector feedback:
//     at that RC, and as it rises with RC the RC run stops).
//   - U-P: a position still open (RC at an R2 level of the divider, and
//     R1 once its highest level is known; RC at an RE level of split
//     supply) is one part or a pair. As one part (a single or a kept part)
//     its utilization is at least its power floor over the best allowance
//     of such a value; as a pair at least that power over the best of any
//     value, and the pair adds its extra part to the parts term. The
//     least over the choices (useAndPartsFloor), with the other parts'
//     utilization floors, bounds the utilization and parts terms together
//     where U-RC alone takes the pair's allowance without its part: on a
//     wall with pairs at several milliamperes a build whose RC must be a
//     pair to run cool pays the pair's part. It only cuts and narrows the
//     IC window; the RC scan takes the floor with RC open. At a divider R2
//     level it is tried with U-RE, U-R2 and E-RE before bound B is taken.
//     TestUseAndPartsFloorHolds checks it on random builds.
//   - U-Q: the transistor dissipates VCE·IC + VBE·IB ≥ VCE·IC at its
//     nominal point (VBE and IB share their sign). With IC ≥ IC_lo, and
//     VCE at least the lowest VCE target less (T − F)·|VCC|/w_QPoint, F
//     the floors of the terms other than QPoint and Utilization (a build
//     with less VCE has a QPoint term alone over what is left), its
//     utilization is at least IC_lo times that VCE over its own derated
//     allowance (transistorUseFloor); it joins the utilization floors
//     (the larger counts) of every plan: per R2 in the divider, per RE and
//     per (RC, RE) in collector feedback, per RE in split supply. Where
//     the transistor is the hottest part (a stage at several
//     milliamperes) it is the utilization floor that prunes. The RC scan
//     (divider, split supply) also takes it per RC level before the solve,
//     with VCE ≥ span − IC_hi·(RC + kE·RE) (transistorUseAtRC: it rises
//     as RC falls, so going down it ends the scan), and scoreVariants
//     takes the exact one (transistorUse) once per level tuple, not per
//     value combination. The RC scan's level floor also takes the
//     QPoint term's IC part and RC's or RE's utilization (the larger
//     coefficient; bound QU-RE) together
//     (qPointUseFloor): a lower IC eases RC but moves off the target,
//     and the least of their sum over the IC window is over the sum of
//     their floors at the window's ends; TestBoundsHoldOnRandomBuilds and
//     TestOtherTopologyBoundsHold check all three against the exact point
//     of random builds and EvalDissipation.
//   - U-R2: R2 dissipates VB²/R2 and, since base current flows into the
//     base (VB ≤ V_TH), R1 dissipates at least (|VCC| − VB)·VB/R2; VB lies
//     between VBE_lo + IC_lo·RE and VBE_hi + IC_hi·k·RE, with VBE bounded
//     from the device model (vbeBounds). R2 levels below the first one
//     bound U-P admits with these two powers, RC's at the band's bottom,
//     RE's utilization, the emitter floor and RE's parts floor (each of
//     R1, R2 and RC one part or a pair) are skipped by bisection (the
//     powers fall with R2, so the floor does); where the per-level bound
//     settles a pair-only level, the weak bound at the last pair-only
//     level before the next single (with the run's parts floor) may
//     settle the whole run at once.
//   - B: betaFloor (betafloor.go) bounds the beta term from below. It
//     writes the base loop of the hFE-min, typical and hFE-max points as
//     V_TH − VBE = IC·g(β) and bounds every quantity that differs between
//     them — β through BF's temperature factor, the Early factor and the
//     collector junction's share, VBE through the current ratio and the
//     junction temperature, the temperatures through each point's power —
//     by inequalities of the solver's transport model, with no
//     linearisation and no margin; the fixed points that result are solved
//     from below. Its premise is that the three points of a passing build
//     are forward-active with VCE above VCE(sat) + margin, which the
//     corner argument gives when the ambient range holds 25 °C (otherwise
//     the bound is not used). TestBoundsHoldOnRandomBuilds checks it
//     against the exact beta term of random builds. It also takes a range
//     of RE, each step at the end of it that keeps the step an inequality
//     (TestBetaModelOverRangeIsConservative checks each step against the
//     model at either end). Two steps matter most where the transistor
//     heats: the points' junctions lie apart by θ times their power
//     difference, and the power IC·V − IC²(RC + RE) has the slope V −
//     2·IC(RC + RE), small near mid-supply, so the slope's size at the
//     corners of the points' IC range bounds it (powerSlope), not V; and
//     a window of R_TH open upward is capped at the R_TH a build whose
//     typical point is in the IC window can have, b_t·φ_max·(span −
//     IC·RE)/IC (bound B-RTH, rthCap: collector feedback's F-B takes RF
//     up to the largest level). checkPointTemperatures checks both
//     against random builds. It is taken over a window of R_TH: per block of eight R2 levels, R_TH between rthFloor
//     of the block's first R2 and its last R2 (taken once, at the
//     threshold of the block's first level: a wider IC window and RC band
//     only lower it, so it stays a floor at every level of the block); with
//     the utilization floor of RE (every build carries RE) and the emitter
//     floor it skips that R2, and once one R2 is skipped the next levels
//     are tried in blocks that double while they fall (R_TH between
//     rthFloor of the block's first R2 and its last R2). With the divider
//     floor it skips one R2. What is left of the threshold after these
//     floors bounds the QPoint term, so the IC window of that R2 narrows
//     to ±(T − floors)/w_QPoint, and the RC band with it (δ = (T −
//     floors)/w_QPoint; so in split supply per RE); at the R1 level the beta floor is taken
//     again per block of eight R1 values (R_TH between the block's ends)
//     with R1's own dissipation.
//   - R1 range: by L1 and L2 the IC of any build at (R1, R2, RE) is at most
//     IC at the bottom of the RC band and, for builds active at their nominal point, at least
//     IC at the largest band RC that is still active; R1 outside the range
//     where these envelopes can meet the window is out (both envelopes
//     fall with R1, so the range is found by search, from the previous
//     R2's range; an envelope value seen at a smaller R2 is a lower bound
//     at a larger one and settles a probe without a solve).
//   - RC scan: what is left of T over the floors of the tuple bounds its
//     QPoint term by d = (T − floors)/w_QPoint, so the scan covers only the
//     RC band for IC within ±d of the target and VCE within d·|VCC| of the
//     target band (the RC band above with δ = d). From the RC where VCE
//     crosses the top of the target band, VCE (L2) and IC move
//     monotonically, so going down (up) the QPoint term only grows once
//     VCE is over (under) the band; with the floors above the scan stops
//     at the first RC whose bound exceeds T. An RC level not yet solved
//     is skipped when its own parts floor and its utilization at the
//     least IC of that window, over its own best allowance (levelUseFloor),
//     put the tuple over T.
//   - Per build: QPoint and Utilization (one solve, shared by the values
//     of a level tuple), then the beta floor at the exact point, then Beta
//     (two solves), then a headroom floor from the two corners expected to
//     be extreme (any single corner bounds the corner minima, so the floor
//     is a lower bound whichever corners are extreme; a corner that already
//     breaks a hard limit proves the build fails), and only then every
//     worst-case corner. A build proved failing is evaluated fully only
//     while the pool has room for it: once the pool is full, a failing
//     build whose floor exceeds the last member's score ranks below it.
//
// # The collector-feedback plan
//
// RF from the collector to the base, RC, RE; it covers (device, RE, RC,
// RF). Its base loop is VCC − VBE = IB·RF + IE·(RC + RE) and VCE = VCC −
// IE·(RC + RE): the transistor sees exactly what it would in a divider with
// V_TH = VCC, R_TH = RF, an emitter resistor RC + RE and no collector
// resistor (baseLoop), so bound B and nominalBetaMin carry over. VCB =
// IB·RF ≥ 0: the stage never saturates.
//
//   - F1: IC falls as RF rises (the base drive falls; as L1, the Early
//     effect and self-heating scale the change but cannot reverse it).
//   - U-RE, Q-RE, E-RE as for the divider (reCuts; VCE ≤ VCC − IC(RC + RE));
//     U-RC per RC level.
//   - RC band: RC carries IE, so VCE lies in [VCC − kE·icHi(RC + RE),
//     VCC − icLo(RC + RE)] (rcBand with kRC = kE).
//   - F-Q: at a current x, VCE lies in [VCC − kE·x·r, VCC − x·r] with
//     r = RC + RE; the QPoint term is at least the least over x of
//     |x − IC_t|/IC_t plus that interval's distance from the target band,
//     a convex function whose least value is at a breakpoint
//     (feedbackQFloor).
//   - F-QW: F-Q's floor at a current x is convex in x, so the currents
//     where it is at most what the threshold leaves for the QPoint term
//     form an interval (feedbackICWindow: the floor is piecewise linear,
//     its pieces ending at IC_t, xLo and where the VCE interval's ends
//     meet the band's, so each end of the interval is solved on the piece
//     it lies on); it replaces the plain ±(T − floors)/w_QPoint IC window of
//     every build at (RC, RE), so a sum RC + RE whose VCE is off target
//     admits fewer currents, and fewer RF levels.
//   - F-B: IB ≤ IC/β_min gives RF ≥ β_min(VCC − VBE_hi − kE·icHi·r)/icHi,
//     with β_min the typical model's floor on IC/IB at the nominal point
//     (device.betaTypMin: the nominal point is the typical model's, so
//     the floor with hFE typical holds there, not only hFE min's);
//     bound B over R_TH from there up bounds the beta term of every build
//     at (RC, RE). With RE's utilization and emitter floors it skips an RC
//     and narrows the IC window. It depends on RC + RE and the IC window
//     only, so it is taken over the cell of F-G's grid of sums that holds
//     the pair's sum (bound B over a range of RE, a floor at every sum in
//     the cell) and kept per cell, which the pairs of neighbouring sums
//     share. Once it settles one level, F-RF's blocks of RC levels take
//     it too, as F-QB over the block's sums, so the low sums whose base
//     is not stiff enough fall block by block.
//   - F-QB: F-Q and F-B apart each take their floor where the other's
//     is least (F-B at the top of the IC window, F-Q at the target), so
//     together they bound the two terms' sum loosely. F-QB splits the IC
//     window into qbParts equal parts and takes, on each, F-Q's least over
//     the currents in the part plus F-B with the part as the window; the
//     least over the parts bounds w_QPoint·q + w_Beta·β. Per grid cell
//     it skips an RC and decides whether a pair in RF can enter; over
//     the whole RC band of an RE, in blocks of sums (sumsQBLeast), it
//     decides whether a pair in RC can enter and whether the RE can hold
//     anything at all: collector feedback's beta term is set mostly by
//     how far VCE lies above VBE, so where the best builds all hold
//     singles a pair's placement cost puts every pair over. Per grid
//     cell it also takes RC's and RE's utilization per part (F-QBU,
//     qbFloors.withUse: both carry IE ≥ IC, so a part's least current
//     bounds the hotter one's). With pairs, F-RF's blocks of RC levels
//     take F-QBU too, cell by cell over the cells the block's sums span,
//     each with its own IC floor (cellsSettle): RC's parts floor the
//     least over the block's levels, its utilization from the block's
//     least RC over the best allowance of any value. A whole group of
//     cellGroup cells first takes F-QB once over the group's sums with
//     the IC floor at its top, kept per group; only a group that does not
//     settle so is taken cell by cell. Per pair F-B and F-QB settled most
//     pairs one at a time where the block floors over sums without the
//     IC floor did not (E96 with pairs, collector feedback at 10 mA: 279
//     million RC visits, 272 million settled one by one; 9 million with
//     the cells). The cells' memos are direct-mapped by grid point
//     (cellMemoBits), so neighbouring cells never evict each other.
//   - F-G, the RF window: by F1 the RF levels with IC in the window are
//     found by two searches, run not at the build's own sum r = RC + RE
//     but at its two neighbours on a grid of sums (gridPoints points per
//     mean level spacing, at most 0.5 % apart): IC falls as r rises (L1
//     with RE' = r) and depends on RC and RE only through r, so with
//     R(g) ≤ r < R(g+1) an RF level whose IC at R(g+1) is over the window,
//     or whose IC at R(g) is under it, is out. Every (RC, RE) pair whose
//     sum falls in one grid cell shares that cell's solves, and the
//     window so found holds the exact one and is about a level wider at
//     most. Bound B over the window (taken over the pair's cell of sums
//     and kept per cell and window, which pairs of neighbouring sums
//     share) narrows it again, and bound B over RF in [k, top of the
//     window] with the other terms' floors (F-Q included) settles the top of the window from the k a bisection
//     finds (the beta term grows as the base loses stiffness; the
//     bisection assumes nothing of the floor's shape, and the k it uses
//     is one whose floor was computed and settles).
//   - F-T (feedback_cells.go), with pairs: the nominal point depends on
//     RC and RE only through their sum, so every (RC, RE) pair whose sum
//     lies in one span of the grid of sums shares floors taken before any
//     of its builds is solved. Over a span [R(g), R(g')) and a range of
//     RF levels a..b, IC lies between the grid's solves at (R(g'), RF b)
//     and (R(g), RF a) (F1, F-G); KVL and KCL give VCE = (VCC − r·IC +
//     r·VBE/RF)/(1 + r/RF) with r = RC + RE, monotonic in each of r, IC,
//     VBE and RF, so its range is read at the corners; with these, the
//     QPoint term's floor, bound B with R_TH over the RF range and RE'
//     over the span, the transistor's IC·VCE and IE ≤ IC + (VCE −
//     VBE)/RF for the emitter term. Near saturation the headroom term
//     is at least its saturation part at the lowest-VCE corner the
//     worst case holds for these parts (RF low, RC and RE high, hFE max,
//     VBE(on) and VAF low, hot, supply low): there too VCE depends on
//     the sum alone, falls as it rises and rises with RF, so one solve at
//     the span's least sum times the least high-end factor of any value
//     (tolerance and TCR, solver.ResistorSpec.CornerFactor) and RF b
//     times the largest low-end factor bounds the lowest corner VCE of
//     every build there from above (cornerVCE, kept per grid point).
//     Per tuple it is taken over 8 grid
//     cells by 8 RF levels (rfCell) and settles the tuple unsolved, and
//     with it the rest of the tuple's block of 8 RF levels where the
//     least parts floor among them settles too;
//     per span of 32 grid cells (sumCell) the RF levels whose IC can
//     meet the window are split in halves, the lower-floored first,
//     while the floor is under the threshold and under the least found
//     so far, down to 8 levels, and the least over the parts left
//     bounds every build of the span (a part without a floor counts as
//     0, so once the least is 0 nothing more is split). Halving from
//     each end of the window finds the first and last part of 8 levels
//     not over the threshold (and not over it less one pair's part, for
//     builds with a pair in RC or RE): the span's hull, which bounds
//     every RF window in the span. The RC scan (sumCellNext) steps
//     from span to span, with RE's parts, emitter and utilization floors
//     and RC's utilization at the span's least RC, and visits only the
//     levels of spans that can hold a build (the singles alone where a
//     pair's part puts the span over); a span over the threshold is
//     linked past for every later RE, and one a pair's part puts over
//     for every later RE holding one (liveSpan). E96 with pairs at 10
//     mA: 452 000 (RC, RE) pairs reached their RF window and 10 million
//     tuples were solved without it (22–25 s); 46 000 and 0.4–0.6
//     million with it (1.3 s). It replaces there the bisection of bound
//     B over the window's top. On a wall whose transistors spread hFE
//     1:3 to 1:4 at 0.1 mA, where the largest RF cannot reach the target
//     and every build near the best is near saturation, the headroom
//     floor and the hull (and the RF window searched within it) took
//     the search from not finishing in 7
//     minutes to about 2.6 s (0.6 million solves).
//     TestSumFloorsHoldWithPairs checks it against solved builds.
//   - F-BB: the window's tuples are solved in blocks of rfBlock levels,
//     and bound B over a block (R_TH = RF and the nominal IC between the
//     least and largest of its active tuples) with each tuple's exact
//     QPoint and emitter terms and the parts floor settles most tuples
//     before the floor at each one alone is taken (scoreBlock). That one
//     (betaFloorAt) is taken once per tuple and kept on it, before any of
//     its value combinations is formed (scoreVariants): with pairs a
//     tuple has many, and each took it afresh (E96 with pairs, collector
//     feedback at 10 mA: 63 million floors for 10 million tuples).
//   - F-RS: the window is solved from its top down, in blocks that grow
//     from two levels to rfBlock. By F1 every RF below
//     the lowest one solved has IC at least that one's, so F-Q over
//     currents from there up, with the other terms' floors, settles the
//     rest of the window. Near saturation the headroom term counts too
//     (headroomBelow): at the worst case's corner with hFE max, VBE(on)
//     and VAF low, hot, the supply low, RF and RE low and RC high (each
//     with its TCR the same way), any RF below level k is at most R(k − 1)
//     raised by the largest TCR, so by F1 IC there is at least IC_up of
//     that corner at R(k − 1), and the corner's VCE = VCC − IE·(RC + RE)
//     is at most VCC − IC_up·(RC + RE), which bounds the lowest corner VCE
//     and so the headroom term (RC's and RE's levels must each admit one
//     value). Taken below the largest level + 1, it bounds every build of
//     the pair (one solve), which settles a pair before its RF window is
//     searched. Over a block of RC levels it solves the corner at the
//     block's largest corner RC, whose IC is the least (L1 with RE' = RC +
//     RE), and takes VCE ≤ VCC − IC_up·(RC'min + RE) with the least; once
//     it settles a pair, F-RF's blocks take it too. This is what settles a target the largest RF cannot reach,
//     where every split of RC + RE near saturation scores alike.
//   - F-RF per pair: every build at (RC, RE) has IC at least IC at the
//     largest RF and the grid point above RC + RE (F1, F-G), so F-Q and
//     F-QW are taken over currents from there up.
//   - F-RF: RF is at most the largest level, so by F1 every build at (RC,
//     RE) has IC at least IC at the largest RF, which falls as RC + RE
//     rises (L1 in the divider picture, RE' = RC + RE). Over a block of RC
//     levels every build has IC ≥ x0, the IC at the largest RF and the
//     block's largest RC, and RC + RE between the block's ends: F-Q over
//     x ≥ x0 with VCE in [VCC − kE·x·r_hi, VCC − x·r_lo] bounds its QPoint
//     term (feedbackQFloorBlock). With RE's floors (and F-B over the
//     block once F-B has settled a level) it skips the block; blocks
//     double while they fall. This is the bound that matters when
//     the stock's largest value cannot bring IC down to a small target
//     (the best builds then sit at the largest RF, off target).
//
// # The split-supply plan
//
// RB from the base to ground, RC, RE to the emitter rail VEE (signed
// opposite to VCC, with its own tolerance, Request.VEETol, else the
// supply's; the worst case and the yield vary the rails apart); it covers
// (device, RE, RB, RC). Its base loop is |VEE| − VBE = IB·RB + IE·RE and
// VCE = |VCC| + |VEE| − IC·RC − IE·RE: a divider with V_TH = |VEE|,
// R_TH = RB on the span |VCC| + |VEE|, so L1 (IC falls as RB or RE rises),
// L2, U-RE, U-RC, Q-RE, the RC band, the RC scan and bound B carry over with the
// span in place of VCC. The emitter term is 0 (the emitter resistor's share
// of the supply is set by VEE, not by the parts). RB's range comes from
// the envelopes as R1's does for the divider: IC at the band's bottom RC
// falls with RB, and IC at the band's largest active RC bounds the active
// builds from below. Bound RB-IB (splitRBFloor) starts both searches: an
// active build with IC ≤ IC max draws IB ≤ IC max/β_nom,min, so RB ≥
// β_nom,min(|VEE| − VBE max − kE·IC max·RE)/IC max; below it builds
// saturate or their base current heats the junction past Tj max, and
// each such probe is a failed solve the envelopes cannot use. Bound B over RB: bound B with R_TH over a block of
// eight RB levels bounds the beta term of every build in it (taken at the
// block's first threshold), so it settles the block or joins the floor
// each level's RC scan starts from; when it settles the block, bound B
// with R_TH from there to the largest level may settle every level above
// it too, and before RB's range is searched, bound B with R_TH from RB-IB's
// level to the largest settles an RE whose builds all lean on beta (a
// small RE leaves a large drop across RB, so IC follows IB). (RB enters IC
// only through IB·RB, so stiff RB levels tie on the Q-point; the beta term
// is what separates them.)
//
// Bound QU-RE (reUseWindow): RE carries IE ≥ IC and, with |VEE| set, its
// dissipation is about (|VEE| − VBE)·IC whatever RE is, so at several
// milliamperes RE's utilization is the largest term of the best builds
// and nearly fixed: the QPoint term's IC part and RE's utilization
// together bound every build at an RE level from below
// (qPointUseFloor), and the IC where they fit within the threshold are
// an interval (qPointUseWindow, the sum being convex in IC). Per choice
// of RE (one part, or a pair with the best pair's allowance and its
// extra part) the window narrows the IC window, raises the utilization
// floor to its bottom and leaves the VCE part only what the floor leaves;
// where only a pair fits (a single there runs too hot), RE's extra part
// joins the floor and RB and RC hold singles (bound P). The RC scan
// (divider and split supply) takes RE's utilization with the QPoint
// term's IC part in the same way per level and, once a level is solved,
// over the IC the levels beyond it can have (IC rises as RC falls, L2).
// TestREUseWindowHolds and TestQPointUseWindowIsTheSublevelSet check it.
// On E96 with pairs at 10 mA it took the split-supply search from over 8
// minutes to under a second.
//
// # Kept parts
//
// Request.Keep names resistors already on the board (a repair) by
// position. Each is one more value of the value set (buildValues, after
// the stocked values of its level, a new level when its value is not
// stocked) that only its own position takes: scoreVariants admits at a
// kept position the kept value alone and, at a free one, stocked values
// alone (admitted). A kept part has no stock line, so it draws nothing
// from stock (quantities, the pull list, a reservation), the shortfall
// never buys it, and its ID names its value, tolerance and rating. Its
// tolerance and rating default to KeptDefaultTol and KeptDefaultRated_W
// and its TCR is KeptTCR_PPMPerK (conservative for a part of unknown make
// and age); Position.Assumed names what was assumed. With AnyTopology only
// the topologies having every kept position are searched.
//
// The guarantees carry over: every bound is a floor over a set of builds
// that holds the admitted ones (a level's allowance and the smallest
// level are over the set with the kept values in it, so they only
// weaken), and the pool holds only admitted builds, so a cut that is
// sound for every build is sound for them. The plans clamp each
// position's level range to the kept level (levelRange: searchByRE's
// RE runs, the divider's R2 loop and R1 range, rfWindow, the RB range,
// rcBand, the exhaustive odometer), so nothing is solved twice; the seeds
// and the hill-climb solve a kept position at its kept level whatever
// level they asked for (tupleCache.get), which changes only the order.
// TestSearchMatchesExhaustive draws kept parts too.
//
// # Several topologies
//
// With AnyTopology each topology (split supply only with an emitter rail)
// is searched with its own pool and finalists, exactly as alone, and all
// at once (one search's serial stretches, its seeds and ranking, leave
// the cores to the others; Request.Progress then reports their sum,
// through progressSum, one call at a time); the
// finalists of all are ranked together by the final score (every term is
// a share, so the scale is one), and Result.Rivals holds the best build of
// each topology other than the first's, with the term it trails the first
// in most. Every term's share of the supply is of the build's own span.
//
// The default search runs on two goroutines sharing the pool, each with
// its own tuple cache (searchByRE): a worker takes the next device's run
// of RE levels (from its best seed up, then down), and once every run has
// begun it joins the one with the most levels left, so a device that
// holds most of the work is shared level by level; so do every
// plan's seeds (seedByDevice, a device each) and the hill climbs of polish
// (a start each). The pool keeps the exact best builds whatever order
// they arrive in, so the result does not depend on the scheduling (only
// Result.Evaluated and Solved, the work done, vary). The finalists' Monte
// Carlo judges its boards on every CPU with the one-at-a-time result
// (solver.EvalYieldWith), and the first k runs, which have no failure
// limit, run at once; past them rankAhead runs go at once, each with the
// failure limit against the k-th when it began, which is no tighter than
// its turn's (the k-th only improves), and each is checked against its
// turn's limit when taken, so the ranking is that of one run at a time
// (finalists.rank, TestRankAheadSameAsOneAtATime).
package picker
