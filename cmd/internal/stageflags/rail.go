package stageflags

import (
	"strings"

	"biasbin/solver"
)

// RailHelp is the help of --rail, for every command that takes a supply.
const RailHelp = "how the single supply is built: positive (the default: an NPN stage's collector side and a PNP stage's emitter side " +
	"to +V, the other side to 0 V) or negative (a PNP stage's emitter side to 0 V, its collector side to -V; also taken from a " +
	"negative --vcc). Every voltage shown or read is against 0 V, as a meter shows it. A split-supply stage is measured from the " +
	"common of its two supplies (NPN: collector rail +V, emitter rail -V; PNP: collector rail -V, emitter rail +V) and takes no --rail"

// SettleRail reads --rail (text, "" when not given) for a stage of
// polarity pol and topology top whose supply was given as vcc (signed as
// typed), settled by solver.SettleRail; a mistake is a usage error naming
// the flag.
func SettleRail(text string, vcc float64, pol solver.Polarity, top solver.Topology) (solver.RailSign, error) {
	r, err := solver.ParseRailSign(strings.ToLower(strings.TrimSpace(text)))
	if err != nil {
		return 0, InputError(err)
	}
	if r, err = solver.SettleRail(vcc, pol, top, r); err != nil {
		return 0, InputError(err)
	}
	return r, nil
}
