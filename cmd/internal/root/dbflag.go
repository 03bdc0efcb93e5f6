package root

import (
	"errors"
	"strings"
)

// dbFlag is the --db flag: a path that may not be empty, so that
// `--db ""` (an unset shell variable) never falls back to another stock.
type dbFlag struct{ path *string }

func (d dbFlag) String() string {
	if d.path == nil {
		return ""
	}
	return *d.path
}

func (d dbFlag) Set(s string) error {
	if strings.TrimSpace(s) == "" {
		return errors.New("empty path: name the stock file, or leave --db out to use $BIASBIN_DB or the default")
	}
	*d.path = s
	return nil
}

func (d dbFlag) Type() string { return "path" }
