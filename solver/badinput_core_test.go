package solver_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"biasbin/solver"
)

// TestSolveBadInput: every non-physical input is an *InputError naming the
// field, and no result is returned.
func TestSolveBadInput(t *testing.T) {
	good := stage(solver.Divider, 15, 0, R{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3})
	goodSplit := stage(solver.SplitSupply, 15, -15, R{solver.RB: 10e3, solver.RC: 10e3, solver.RE: 20e3})
	npn := npnModel(1e-14, 100, 0, 0)
	_, pnp := mirror(good, npn)
	with := func(s solver.Stage, f func(*solver.Stage)) solver.Stage { f(&s); return s }
	withM := func(m solver.Model, f func(*solver.Model)) solver.Model { f(&m); return m }
	for _, c := range []struct {
		name  string
		s     solver.Stage
		m     solver.Model
		tj    float64
		field string
	}{
		{"negative R1", with(good, func(s *solver.Stage) { s.R_Ohm[solver.R1] = -10e3 }), npn, 25, "r1"},
		{"zero R2", with(good, func(s *solver.Stage) { s.R_Ohm[solver.R2] = 0 }), npn, 25, "r2"},
		{"NaN RC", with(good, func(s *solver.Stage) { s.R_Ohm[solver.RC] = math.NaN() }), npn, 25, "rc"},
		{"infinite RE", with(good, func(s *solver.Stage) { s.R_Ohm[solver.RE] = math.Inf(1) }), npn, 25, "re"},
		{"zero RF", stage(solver.CollectorFeedback, 10, 0, R{solver.RC: 1e3}), npn, 25, "rf"},
		{"zero RC in collector feedback", stage(solver.CollectorFeedback, 10, 0, R{solver.RF: 100e3}), npn, 25, "rc"},
		{"negative RB", with(goodSplit, func(s *solver.Stage) { s.R_Ohm[solver.RB] = -1 }), npn, 25, "rb"},
		{"RB and RE both 0", with(goodSplit, func(s *solver.Stage) { s.R_Ohm[solver.RB], s.R_Ohm[solver.RE] = 0, 0 }), npn, 25, "re"},
		{"NPN with negative VCC", with(good, func(s *solver.Stage) { s.VCC_V = -15 }), npn, 25, "vcc"},
		{"PNP with positive VCC", good, pnp, 25, "vcc"},
		{"zero VCC", with(good, func(s *solver.Stage) { s.VCC_V = 0 }), npn, 25, "vcc"},
		{"NPN split supply with positive VEE", with(goodSplit, func(s *solver.Stage) { s.VEE_V = 5 }), npn, 25, "vee"},
		{"PNP split supply with negative VEE", with(goodSplit, func(s *solver.Stage) { s.VCC_V = -15 }), pnp, 25, "vee"},
		{"bypass larger than RE", with(good, func(s *solver.Stage) { s.RBypass_Ohm = 2e3 }), npn, 25, "re_bypass"},
		{"negative load", with(good, func(s *solver.Stage) { s.RL_Ohm = -1 }), npn, 25, "rl"},
		{"unknown topology", with(good, func(s *solver.Stage) { s.Topology = 0 }), npn, 25, "topology"},
		{"Tj below -55 °C", good, npn, -56, "tj"},
		{"Tj above 200 °C", good, npn, 201, "tj"},
		{"Tj NaN", good, npn, math.NaN(), "tj"},
		{"IS zero", good, withM(npn, func(m *solver.Model) { m.IS_A = 0 }), 25, "is"},
		{"BF negative", good, withM(npn, func(m *solver.Model) { m.BF = -5 }), 25, "bf"},
		{"BR zero", good, withM(npn, func(m *solver.Model) { m.BR = 0 }), 25, "br"},
		{"VAF negative", good, withM(npn, func(m *solver.Model) { m.VAF_V = -50 }), 25, "vaf"},
		{"VAF 0.5 V", good, withM(npn, func(m *solver.Model) { m.VAF_V = 0.5 }), 25, "vaf"},
		{"ICBO negative", good, withM(npn, func(m *solver.Model) { m.ICBO_A = -1e-9 }), 25, "icbo"},
		{"no polarity", good, withM(npn, func(m *solver.Model) { m.Polarity = 0 }), 25, "model polarity"},
	} {
		op, err := solver.Solve(c.s, c.m, c.tj)
		var ie *solver.InputError
		if !errors.As(err, &ie) {
			t.Errorf("%s: err = %v, want *InputError", c.name, err)
			continue
		}
		if ie.Field != c.field {
			t.Errorf("%s: field %q, want %q (%v)", c.name, ie.Field, c.field, err)
		}
		if op != (solver.OperatingPoint{}) {
			t.Errorf("%s: returned a result with the error: %+v", c.name, op)
		}
	}
}

// TestSelfHeatedBadInput: ambient outside −55..150 °C, negative θJA or a
// Tj max not above the ambient are input errors.
func TestSelfHeatedBadInput(t *testing.T) {
	s := stage(solver.Divider, 15, 0, R{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3})
	m := npnModel(1e-14, 100, 0, 0)
	for _, c := range []struct {
		name              string
		amb, theta, tjMax float64
		field             string
	}{
		{"ambient -56 °C", -56, 200, 150, "ambient"},
		{"ambient 151 °C", 151, 200, 175, "ambient"},
		{"negative theta", 25, -1, 150, "theta_ja"},
		{"tj max below ambient", 60, 200, 50, "tj_max"},
		{"tj max above 200 °C", 25, 200, 250, "tj_max"},
	} {
		_, err := solver.SolveSelfHeated(s, m, c.amb, c.theta, c.tjMax)
		var ie *solver.InputError
		if !errors.As(err, &ie) || ie.Field != c.field {
			t.Errorf("%s: err = %v, want *InputError on %q", c.name, err, c.field)
		}
	}
}

// TestModelForBadInput: hFE min above max, negative or non-finite
// datasheet figures and a bad beta are input errors naming the field and
// the part.
func TestModelForBadInput(t *testing.T) {
	ok := solver.Datasheet{Label: "Q7", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300}
	for _, c := range []struct {
		name  string
		d     solver.Datasheet
		bf    float64
		field string
	}{
		{"hFE min > max", solver.Datasheet{Label: "Q7", Polarity: solver.NPN, HFEMin: 300, HFEMax: 100}, 150, "hfe_max"},
		{"hFE min zero", solver.Datasheet{Label: "Q7", Polarity: solver.NPN, HFEMax: 100}, 150, "hfe_min"},
		{"typical outside range", solver.Datasheet{Label: "Q7", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, HFETyp: 400}, 150, "hfe_typ"},
		{"negative VAF", solver.Datasheet{Label: "Q7", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, VAF_V: -80}, 150, "vaf"},
		{"VBE(on) 5 V", solver.Datasheet{Label: "Q7", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, VBEOn_V: 5}, 150, "vbe_on"},
		{"VBE(on) 50 mV", solver.Datasheet{Label: "Q7", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, VBEOn_V: 0.05}, 150, "vbe_on"},
		{"NaN ICBO", solver.Datasheet{Label: "Q7", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, ICBO_A: math.NaN()}, 150, "icbo"},
		{"no polarity", solver.Datasheet{Label: "Q7", HFEMin: 100, HFEMax: 300}, 150, "polarity"},
		{"zero beta", ok, 0, "bf"},
		{"infinite beta", ok, math.Inf(1), "bf"},
	} {
		_, err := solver.ModelFor(c.d, c.bf)
		var ie *solver.InputError
		if !errors.As(err, &ie) || ie.Field != c.field {
			t.Errorf("%s: err = %v, want *InputError on %q", c.name, err, c.field)
			continue
		}
		if !strings.Contains(err.Error(), "Q7") {
			t.Errorf("%s: error %q does not name the part", c.name, err)
		}
	}
}
