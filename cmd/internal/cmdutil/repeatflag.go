package cmdutil

import (
	"fmt"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
)

// RefuseRepeatedFlags makes every flag of cmd and its subcommands refuse
// being given twice with different values (pflag would silently keep the
// last one): `--vcc 12 --vcc 24` is a usage error naming --vcc. Giving the
// same value twice is accepted, and flags meant to repeat (lists, counts)
// are left alone. Call it once the command tree is built.
func RefuseRepeatedFlags(cmd *cobra.Command) {
	wrap := func(f *pflag.Flag) {
		if _, done := f.Value.(*onceValue); done || repeatable(f.Value.Type()) {
			return
		}
		f.Value = &onceValue{Value: f.Value}
	}
	cmd.LocalNonPersistentFlags().VisitAll(wrap)
	cmd.PersistentFlags().VisitAll(wrap)
	cmd.Flags().VisitAll(wrap)
	for _, sub := range cmd.Commands() {
		RefuseRepeatedFlags(sub)
	}
}

// repeatable reports whether a pflag type is meant to be given many times.
func repeatable(typ string) bool {
	return strings.HasSuffix(typ, "Slice") || strings.HasSuffix(typ, "Array") || typ == "count"
}

// onceValue passes the first value to the flag and refuses a different
// second one.
type onceValue struct {
	pflag.Value
	given bool
	first string
}

func (v *onceValue) Set(s string) error {
	if v.given && s != v.first {
		return fmt.Errorf("given twice with different values (%q, then %q): give it once", v.first, s)
	}
	v.given, v.first = true, s
	return v.Value.Set(s)
}
