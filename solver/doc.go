// Package solver is biasbin's circuit math: the transistor model built from
// datasheet ranges, the exact DC operating point of the three bias
// topologies, self-heating, stability factors, and the analyses built on
// them. It is pure: value types in, value types out, no I/O.
//
// # Units and conventions
//
// SI base units everywhere, the unit in the name (VCC_V, IC_A, R_Ohm, P_W);
// temperatures are in °C (Tj_C, TNOM_C) and converted to kelvin inside
// with T = t + 273.15. Tolerances are fractions.
//
// Rails and node voltages are signed and relative to ground. A PNP stage is
// the mirror of the NPN one: VCC_V < 0 (and VEE_V > 0 for split supply).
// Every PNP stage is solved as the mirrored NPN circuit (all node voltages
// negated) and its node voltages are negated back. Currents, VCE_V and
// VBE_V are forward-referenced: for an NPN IC flows into the collector, IB
// into the base, IE out of the emitter, VCE = VC−VE, VBE = VB−VE; for a
// PNP every one of these is reversed (VCE = VE−VC, VBE = VE−VB). So all are
// positive in the forward-active region for both polarities.
// IE_A = IC_A + IB_A always. Terminal currents include the optional
// collector-base leakage.
//
// # Device model
//
// The transistor is the Ebers–Moll transport model, i.e. SPICE's
// Gummel–Poon model with no high-level injection (IKF, IKR = ∞), no
// leakage diodes (ISE, ISC = 0), no ohmic resistances and no reverse Early
// effect (VAR = ∞), written exactly as ngspice evaluates it (bjtload.c),
// in the mirrored-NPN frame with junction voltages VBE and VBC:
//
//	Ibe = IS·(exp(VBE/(NF·VT)) − 1)
//	Ibc = IS·(exp(VBC/VT) − 1)                    (NR = 1)
//	IC  = (Ibe − Ibc)·(1 − VBC/VAF) − Ibc/BR + ICBO
//	IB  = Ibe/BF + Ibc/BR − ICBO
//
// VAF = 0 means infinite (the factor is 1). ICBO is an optional constant
// current source from collector to base (the collector-base leakage); it
// is not part of SPICE's model and the netlist writer adds it as a source.
// SPICE adds GMIN (1e-12 S) across each junction for numerical reasons;
// the solver does not, which only matters for currents below a nanoampere.
//
// ModelFor fills the parameters from a Datasheet: IS from VBE(on) at its
// test current at TNOM (IC = IS·(exp(VBE/VT) − 1), NF = 1; no base-current
// correction because datasheets state VBE(on) against IC, which in the
// forward-active region is exactly the transport term), BF = the hFE under
// analysis, BR = 1, VAF from the datasheet (0 = infinite), XTI = 3 and
// EG = 1.11 eV (the SPICE defaults, ngspice manual §8.2), XTB = 1.5
// (common practice for silicon; SPICE's own default XTB = 0 keeps beta
// constant over temperature, which no silicon transistor does), and
// TNOM = 25 °C because datasheet figures are given at 25 °C (SPICE's own
// default TNOM is 27 °C; every netlist states TNOM explicitly).
//
// # Temperature
//
// Exactly as SPICE (ngspice manual §1.3.1 eqs. (1)–(2), bjttemp.c with
// TLEV = 0), with T and T0 = TNOM in kelvin and k, q the exact SI constants
// (k = 1.380649e-23 J/K, q = 1.602176634e-19 C):
//
//	VT     = k·T/q
//	IS(T)  = IS·(T/T0)^XTI·exp((EG·q/k)·(1/T0 − 1/T))
//	BF(T)  = BF·(T/T0)^XTB,   BR(T) = BR·(T/T0)^XTB
//	ICBO(T) = ICBO·2^((T−T0)/10 K)      (doubling every 10 K, common practice)
//
// # Operating point
//
// Each topology is reduced by hand to the junction voltages VBE, VBC as
// the two unknowns (the divider by its Thevenin equivalent; every node
// voltage is affine in IB and IC), and the two loop equations are solved by
// Newton's method with SPICE's junction-voltage limiting (pnjlim, ngspice
// devsup.c) from the forward-active hand solution. Each Newton step is a
// 2×2 linear solve done by hand (Cramer's rule, no allocation); gonum/mat
// serves the independent nodal reference solver in the tests. If Newton
// fails, a source-stepping continuation ramps every source from zero. A Newton step
// is accepted as converged when no limiting was applied, both junction
// voltages moved by less than 1e-10 V and both loop residuals are below
// 1e-10 of the terms they sum (or the residual one last bit of the
// junction voltages leaves). Results never contain NaN or Inf;
// a failure is an error wrapping ErrNoConvergence.
//
// # Regions
//
// The region is named from the junction biases. A junction conducts when
// its ideal diode current IS(T)·(exp(V/(N·VT)) − 1) reaches 100 nA, which
// is VBE ≈ 0.41 V for IS = 1e-14 A at 25 °C:
//
//	cutoff          neither junction conducts
//	active          base-emitter conducts, base-collector injection < 1 % of it
//	                (VBC < VBE − VT·ln 100, i.e. VCE > ≈ 0.12 V at 25 °C)
//	reverse-active  base-collector conducts, base-emitter injection < 1 % of it
//	saturation      otherwise (both junctions injecting)
//
// The 1 % bound is where IC/IB has fallen about 2 % below BF (with BR = 1).
// A design margin above the datasheet's VCE(sat) is a separate check made
// by the analyses.
//
// # Self-heating
//
// SolveSelfHeated finds the junction temperature where
// Tj = Ta + θJA·P(Tj), P = max(PTransistor, 0) with
// PTransistor = VCE·IC + VBE·IB (the power ngspice reports as @q[p]; it can
// only go negative in saturation with a large ICBO, whose constant source
// then delivers power). The equilibrium is the first downward crossing of
// the heat balance above the ambient — the temperature a junction warming
// from the ambient settles at — found by a bracketed secant iteration to
// 1e-6 K. No stable equilibrium at or below Tj max is thermal runaway
// (ErrThermalRunaway); that includes a stage that is stable but would
// settle above Tj max.
//
// # Hand method and stability factors
//
// The tests check the exact solver against the textbook hand method, kept
// in fixedvbe_test.go as a reference (the program itself never uses it):
// SolveFixedVBE is that hand method (fixed VBE, IC = β·IB +
// (β+1)·ICBO) in closed form; every topology reduces to one base loop
// V = IB·Rb + VBE + IE·Re (divider: V_TH, R_TH, RE; collector feedback:
// VCC, RF, RC+RE; split supply: |VEE|, RB, RE), so
// IC = [β(V−VBE) + (β+1)(Rb+Re)·ICBO] / [Rb + (β+1)Re].
// StabilityClosedForm differentiates that closed form (S_I, S_V, S_β);
// StabilityNumeric differentiates the exact solver by finite differences.
// The two differ by the junction's dynamic resistance, which the closed
// form leaves out: the exact denominator is Rb + (β+1)Re + β·NF·VT/IC.
//
// # SPICE netlist
//
// Netlist writes an ngspice deck that reproduces Solve: the same model
// card (TNOM stated), `.options temp` at the junction temperature and
// Newton tolerances tight enough for a reference. The package
// solver/spicecheck runs such decks through ngspice in tests.
//
// # Analyses of a build
//
// A Build is a stage with its parts' tolerances, TCRs and ratings, the
// supply tolerance and the ambient range. Build.Resolve gives the stage at
// one set of deviations: R = R_marked·(1 + dev)·(1 + TCR·(T − 25 °C)), the
// resistors taken to sit at the ambient. Nominal solves the marked values
// at NominalAmbient_C with the typical hFE (the datasheet typical, else
// √(min·max)), self-heated through ThermalResistance (θJA, else the θJA
// implied by PD25 and Tj max, else none).
//
// Every uncertain input of a build — each resistor's value within its
// tolerance and its TCR within ± its stated bound, the supply within its
// tolerance, hFE within the datasheet range, VBE(on) from part to part
// (the stocked vbe_min..vbe_max, else ±30 mV, common practice), the Early
// voltage where a range is stocked — is listed by Uncertainties with its
// range and distribution; the corners, the RSS spread and the Monte Carlo
// all take the same bounds from there. EvalWorstCase solves every corner
// of those bounds × {ambient min, max}, self-heated, with BF = the hFE
// bound itself (hFE is specified at 25 °C = TNOM); it reports the IC and
// VCE extremes with their corners, the test-point bands, the worst
// dissipation, whether every corner is active with VCE ≥ VCE(sat) +
// margin, and a linearised root-sum-square figure (GUM, JCGM 100:2008
// §5.1.2, with uniform inputs u = a/√3, GUM §4.3.7; from memory for the
// clauses). EvalYield is a seeded Monte Carlo (gonum/stat/distuv) that
// draws every input rectangular between its limits (JCGM 101:2008
// §6.4.2.1: only the limits are known) and counts a board good only if
// IC and VCE stay inside the window over the whole ambient range (both
// ends, and a turning point between them where the response is not
// monotonic: YieldDefinition), with the Clopper–Pearson 95 % interval.
// EvalDissipation checks each resistor against its rating derated linearly
// from the knee (70 °C) to zero at its maximum temperature (155 °C), IEC
// 60115-1 style, and the transistor against (Tj max − Ta)/θJA, each times
// its design margin (Limits). EvalSwing draws the DC and AC load lines,
// the maximum symmetrical swing and the Q-point that maximises it.
package solver
