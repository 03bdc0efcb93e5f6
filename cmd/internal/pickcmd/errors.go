package pickcmd

import (
	"errors"
	"fmt"
	"strings"

	"biasbin/picker"
	"biasbin/solver"
)

// pickError wraps a search error by its cause: a request the picker
// refuses is a usage error (exit 2); anything else — a kind of part
// missing from the stock, stock data the solver refuses — means the job
// could not be done (exit 1).
func pickError(err error) error {
	var pin *picker.InputError
	var gap *picker.StockGapError
	switch {
	case errors.As(err, &gap):
		return stockGap(gap)
	case errors.As(err, &pin):
		return requestError(pin)
	}
	return fmt.Errorf("pick: %w", err)
}

// stockGap words a missing kind of part with what to add.
func stockGap(g *picker.StockGapError) error {
	tagNote := ""
	if len(g.Tags) > 0 {
		tagNote = " tagged " + strings.Join(g.Tags, " and ")
	}
	if g.Resistors {
		if tagNote != "" {
			return fmt.Errorf("no resistor in stock is%s: tag the approved lines with `biasbin stock tag ID TAG`, or drop --require-tag", tagNote)
		}
		return errors.New("the stock holds no resistors: add them with `biasbin stock import FILE.csv` or `biasbin stock add resistor VALUE ...` (`biasbin demo` shows a stocked run)")
	}
	pol := strings.ToUpper(g.Polarity.String())
	msg := fmt.Sprintf("no %s transistor in stock%s: add one with `biasbin stock add transistor LABEL --polarity %s --hfe MIN..MAX ...`",
		pol, tagNote, g.Polarity)
	if g.OtherPolarity > 0 {
		flip := solver.NPN
		if g.Polarity == solver.NPN {
			flip = solver.PNP
		}
		msg += fmt.Sprintf(", or design for --polarity %s (%d line%s in stock)", flip, g.OtherPolarity, plural(g.OtherPolarity))
	}
	return errors.New(msg)
}
