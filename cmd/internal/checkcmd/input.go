package checkcmd

import (
	"context"
	"errors"
	"fmt"
	"strconv"
	"strings"

	"biasbin/cmd/internal/stageflags"
	"biasbin/cmd/internal/stockparts"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/notation"
	"biasbin/store"
)

// input parses the flags into a build. The stock is opened only when
// --transistor is given.
func (o *Options) input(ctx context.Context) (job.CheckRequest, error) {
	if o.Ref != "" {
		return o.refInput(ctx)
	}
	var in job.CheckRequest
	b := &in.Build
	top, err := solver.ParseTopology(strings.ToLower(strings.TrimSpace(o.Topology)))
	if err != nil {
		return in, stageflags.Usage("topology", err)
	}
	b.Topology = top

	d, label, err := o.device(ctx)
	if err != nil {
		return in, err
	}
	b.Device = d
	in.Label = label
	sign := 1.0
	if d.Polarity == solver.PNP {
		sign = -1
	}

	// Rails: a magnitude, or the signed rail of the polarity.
	if o.VCC == "" {
		return in, stageflags.Usagef("vcc", "missing: give the collector supply, e.g. --vcc 12V")
	}
	vcc, vccTol, vccRange, err := notation.ParseSupply(o.VCC)
	if err != nil {
		return in, stageflags.Usage("vcc", err)
	}
	if b.VCC_V, err = stageflags.RailOf(vcc, sign, "vcc"); err != nil {
		return in, err
	}
	switch {
	case top == solver.SplitSupply && o.VEE == "":
		return in, stageflags.Usagef("vee", "missing: the split-supply stage needs the emitter supply, e.g. --vee 12V")
	case top != solver.SplitSupply && o.VEE != "":
		return in, stageflags.Usagef("vee", "only the split-supply stage has an emitter supply")
	case o.VEE != "":
		if b.VEE_V, err = stageflags.Rail(o.VEE, -sign, "vee"); err != nil {
			return in, err
		}
	}
	switch {
	case vccRange && o.Changed != nil && o.Changed("vcc-tol"):
		return in, stageflags.Usagef("vcc-tol", "--vcc %s is already a range; give either the range or --vcc-tol, not both", o.VCC)
	case vccRange && vccTol >= 0.5:
		return in, stageflags.Usagef("vcc", "%s: the top of a supply range must be below 3 times its bottom", o.VCC)
	case vccRange:
		b.VCCTol = vccTol
	default:
		if b.VCCTol, err = notation.ParseTolerance(o.VCCTol); err != nil {
			return in, stageflags.Usage("vcc-tol", err)
		}
	}

	// Resistors.
	tol, err := notation.ParseTolerance(o.Tol)
	if err != nil {
		return in, stageflags.Usage("tol", err)
	}
	tcr, err := notation.ParseTCR(o.TCR)
	if err != nil {
		return in, stageflags.Usage("tcr", err)
	}
	power, err := notation.ParsePower(o.Power)
	if err != nil {
		return in, stageflags.Usage("power", err)
	}
	used := map[solver.Slot]bool{}
	for _, s := range top.Slots() {
		used[s] = true
	}
	for s := range solver.NumSlots {
		text := strings.TrimSpace(o.R[s])
		name := s.String()
		if !used[s] {
			if text != "" {
				return in, stageflags.Usagef(name, "the %s stage has no %s (it uses %s)", top, name, stageflags.SlotList(top))
			}
			continue
		}
		if text == "" {
			if s == solver.RE && top != solver.SplitSupply {
				continue // emitter tied to ground
			}
			return in, stageflags.Usagef(name, "missing: the %s stage needs %s", top, stageflags.SlotList(top))
		}
		if strings.HasPrefix(text, "#") {
			spec, err := o.stockResistor(ctx, name, text)
			if err != nil {
				return in, err
			}
			b.Resistors[s] = spec
			continue
		}
		rt, err := notation.ParseResistorText(text)
		if err != nil {
			return in, stageflags.Usage(name, err)
		}
		spec := solver.ResistorSpec{Nominal_Ohm: rt.Ohm, Tol: tol, TCR_PPMPerK: tcr, Rated_W: power}
		if rt.HasTol {
			spec.Tol = rt.Tol
		}
		if rt.HasPower {
			spec.Rated_W = rt.Rated_W
		}
		b.Resistors[s] = spec
	}

	// AC side.
	if o.Load != "" {
		if b.RL_Ohm, err = notation.ParseOhms(o.Load); err != nil {
			return in, stageflags.Usage("load", err)
		}
	}
	switch bp := strings.TrimSpace(o.Bypass); {
	case bp == "":
	case b.Resistors[solver.RE].Nominal_Ohm == 0:
		return in, stageflags.Usagef("bypass", "there is no RE to bypass")
	case strings.EqualFold(bp, bypassAll):
		b.RBypass_Ohm = b.Resistors[solver.RE].Nominal_Ohm
	default:
		if b.RBypass_Ohm, err = notation.ParseOhms(bp); err != nil {
			return in, stageflags.Usage("bypass", err)
		}
		if b.RBypass_Ohm > b.Resistors[solver.RE].Nominal_Ohm {
			return in, stageflags.Usagef("bypass", "%s is more than RE (%s)", notation.FormatResistance(b.RBypass_Ohm), notation.FormatResistance(b.Resistors[solver.RE].Nominal_Ohm))
		}
	}

	// Temperatures and the nominal point.
	if b.AmbientMin_C, b.AmbientMax_C, err = notation.ParseRange(o.Ambient, notation.ParseTemperature); err != nil {
		return in, stageflags.Usage("ambient", err)
	}
	if b.NominalAmbient_C, err = notation.ParseTemperature(o.Temp); err != nil {
		return in, stageflags.Usage("temp", err)
	}
	if o.Beta != "" {
		if b.NominalBeta, err = notation.ParseNumber(o.Beta); err != nil {
			return in, stageflags.Usage("beta", err)
		}
		if b.NominalBeta <= 0 {
			return in, stageflags.Usagef("beta", "%g: want a positive beta", b.NominalBeta)
		}
	}

	if err := o.yieldRequest(&in); err != nil {
		return in, err
	}
	if err := b.Validate(); err != nil {
		return in, stageflags.InputError(err)
	}
	return in, nil
}

// yieldRequest fills in the yield window and the Monte Carlo's size and
// seed from --window, --boards and --seed.
func (o *Options) yieldRequest(in *job.CheckRequest) error {
	var err error
	if in.Window, err = parseWindow(o.Window); err != nil {
		return err
	}
	if err := solver.YieldBoardsRange.Check(float64(o.Boards)); err != nil {
		return stageflags.InputError(err)
	}
	in.Boards, in.Seed = o.Boards, o.Seed
	return nil
}

// parseWindow reads --window "IC,VCE".
func parseWindow(text string) (job.WindowSpec, error) {
	var w job.WindowSpec
	ic, vce, ok := strings.Cut(text, ",")
	if !ok || strings.TrimSpace(ic) == "" || strings.TrimSpace(vce) == "" {
		return w, stageflags.Usagef("window", "%q: want IC,VCE, e.g. 10%%,20%% or 1.8mA..2.2mA,4V..8V", text)
	}
	var err error
	if w.IC, err = windowPart(strings.TrimSpace(ic), notation.ParseCurrent); err != nil {
		return w, err
	}
	if w.VCE, err = windowPart(strings.TrimSpace(vce), notation.ParseVoltage); err != nil {
		return w, err
	}
	if !w.IC.Relative && w.IC.Max == 0 || !w.VCE.Relative && w.VCE.Max == 0 {
		return w, stageflags.Usagef("window", "%q: an absolute range needs a maximum above 0", text)
	}
	if w.VCE.Min < 0 {
		return w, stageflags.Usagef("window", "%q: VCE is a magnitude", text)
	}
	return w, nil
}

// windowPart reads one part of --window: "10%" or "MIN..MAX".
func windowPart(text string, parse notation.Parser) (job.Band, error) {
	if strings.HasSuffix(text, "%") {
		pct, err := notation.ParseTolerance(text)
		if err != nil {
			return job.Band{}, stageflags.Usage("window", err)
		}
		return job.Band{Relative: true, Frac: pct}, nil
	}
	lo, hi, err := notation.ParseRange(text, parse)
	if err != nil {
		return job.Band{}, stageflags.Usage("window", err)
	}
	return job.Band{Min: lo, Max: hi}, nil
}

// device reads the transistor: the stock line when --transistor is given
// (its label matched without regard to letter case), with any inline flags
// overriding it; else the inline flags alone. label is the stock line's
// label as stocked, or "" for an inline transistor.
func (o *Options) device(ctx context.Context) (d solver.Datasheet, label string, err error) {
	if o.Transistor != "" {
		if d, label, err = o.stockDevice(ctx); err != nil {
			return d, "", err
		}
	} else {
		d.Polarity = solver.NPN
		if o.HFE == "" {
			return d, "", stageflags.Usagef("hfe", "missing: name a stocked transistor with --transistor LABEL, or give it inline with at least --hfe MIN..MAX")
		}
	}
	d, err = o.inlineDevice(d)
	return d, label, err
}

// stockResistor reads the resistor stock line a position names as "#ID"
// (its value, tolerance, rating, derating, TCR and element voltage as
// stocked, the store's defaults filled in).
func (o *Options) stockResistor(ctx context.Context, flag, text string) (solver.ResistorSpec, error) {
	id, err := strconv.ParseInt(strings.TrimSpace(strings.TrimPrefix(text, "#")), 10, 64)
	if err != nil || id <= 0 {
		return solver.ResistorSpec{}, stageflags.Usagef(flag, "%q: a stock line is written #ID, like #26 (see biasbin stock list)", text)
	}
	if o.Store == nil {
		return solver.ResistorSpec{}, fmt.Errorf("--%s %s: no stock available", flag, text)
	}
	db, err := o.Store(ctx)
	if err != nil {
		return solver.ResistorSpec{}, err
	}
	r, err := db.ResistorByID(ctx, id)
	switch {
	case errors.Is(err, store.ErrNotFound):
		return solver.ResistorSpec{}, stageflags.Usagef(flag, "%s is not a resistor line in stock (see biasbin stock list --kind resistor)", text)
	case err != nil:
		return solver.ResistorSpec{}, fmt.Errorf("--%s %s: %w", flag, text, err)
	}
	r = r.WithDefaults()
	return solver.ResistorSpec{Nominal_Ohm: r.Ohm, Tol: r.Tol, TCR_PPMPerK: r.TCR_PPMPerK, Rated_W: r.Rated_W,
		Knee_C: r.Knee_C, Max_C: r.Max_C, LEV_V: r.LEV_V}, nil
}

// stockDevice reads the stock line --transistor names. A label stocked in
// two spellings (QN-230 and qn-230) is refused with every matching line,
// since check takes no line ID.
func (o *Options) stockDevice(ctx context.Context) (solver.Datasheet, string, error) {
	if o.Store == nil {
		return solver.Datasheet{}, "", fmt.Errorf("--transistor %s: no stock available", o.Transistor)
	}
	db, err := o.Store(ctx)
	if err != nil {
		return solver.Datasheet{}, "", err
	}
	t, err := db.TransistorByLabel(ctx, o.Transistor)
	var amb *store.AmbiguousLabelError
	switch {
	case errors.Is(err, store.ErrNotFound):
		return solver.Datasheet{}, "", stageflags.Usagef("transistor", "%q is not in stock (see biasbin stock list)", o.Transistor)
	case errors.As(err, &amb):
		return solver.Datasheet{}, "", stageflags.Usagef("transistor", "%v; check takes a label, not a line ID: "+
			"make the labels differ by more than letter case, remove the wrong line (biasbin stock remove ID), "+
			"or give the transistor inline (--hfe ...)", err)
	case err != nil:
		return solver.Datasheet{}, "", fmt.Errorf("--transistor %s: %w", o.Transistor, err)
	}
	d, err := stockparts.Sheet(t)
	if err != nil {
		return d, "", fmt.Errorf("--transistor %s: %w", o.Transistor, err)
	}
	return d, t.Label, nil
}

// inlineDevice applies the inline transistor flags to d (the stock line or
// a default NPN) and checks the result.
func (o *Options) inlineDevice(d solver.Datasheet) (solver.Datasheet, error) {
	var err error
	if o.Polarity != "" {
		if d.Polarity, err = solver.ParsePolarity(strings.TrimSpace(o.Polarity)); err != nil {
			return d, stageflags.Usage("polarity", err)
		}
	}
	if o.HFE != "" {
		if d.HFEMin, d.HFEMax, d.HFEAt_A, _, err = notation.ParseRangeAt(o.HFE, notation.ParseNumber); err != nil {
			return d, stageflags.Usage("hfe", err)
		}
		if d.HFEMin <= 0 {
			return d, stageflags.Usagef("hfe", "%q: hFE must be above 0", o.HFE)
		}
		if !o.changed("hfe-typ") && (d.HFETyp < d.HFEMin || d.HFETyp > d.HFEMax) {
			d.HFETyp = 0 // a stock typical outside the new window no longer applies
		}
	}
	type field struct {
		flag  string
		text  string
		parse notation.Parser
		dst   *float64
	}
	for _, f := range []field{
		{"hfe-typ", o.HFETyp, notation.ParseNumber, &d.HFETyp},
		{"vce-sat", o.VCESat, notation.ParseVoltage, &d.VCESat_V},
		{"vaf", o.VAF, notation.ParseVoltage, &d.VAF_V},
		{"vceo", o.VCEO, notation.ParseVoltage, &d.VCEO_V},
		{"ic-max", o.ICMax, notation.ParseCurrent, &d.ICMax_A},
		{"pd", o.PD, notation.ParsePower, &d.PD25_W},
		{"theta-ja", o.ThetaJA, notation.ParseThermalResistance, &d.ThetaJA_KPerW},
		{"tj-max", o.TjMax, notation.ParseTemperature, &d.TjMax_C},
		{"icbo", o.ICBO, notation.ParseCurrent, &d.ICBO_A},
	} {
		if f.text == "" {
			continue
		}
		v, err := f.parse(f.text)
		if err != nil {
			return d, stageflags.Usage(f.flag, err)
		}
		if v < 0 {
			return d, stageflags.Usagef(f.flag, "%q: give the magnitude", f.text)
		}
		*f.dst = v
	}
	if o.TjMax != "" {
		// 0 would read as "not given" below: a Tj max typed in is checked here.
		if err := solver.TjMaxRange.Check(d.TjMax_C); err != nil {
			return d, stageflags.InputError(err)
		}
	}
	if o.VBE != "" {
		if d.VBEOn_V, d.VBEAt_A, _, err = notation.ParseAt(o.VBE, notation.ParseVoltage); err != nil {
			return d, stageflags.Usage("vbe", err)
		}
		if d.VBEOn_V <= 0 {
			return d, stageflags.Usagef("vbe", "%q: give the magnitude of VBE(on)", o.VBE)
		}
	}
	if err := d.Validate(); err != nil {
		return d, stageflags.InputError(err)
	}
	return d, nil
}

// changed reports whether a flag was set on the command line.
func (o *Options) changed(name string) bool { return o.Changed != nil && o.Changed(name) }
