package buildcmd

import (
	"bytes"
	"errors"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/ledgercmd"
)

// TestFlagMistakesAreUsageErrors: each wrong call exits 2 with a message
// naming what was wrong, before anything is opened.
func TestFlagMistakesAreUsageErrors(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"new", "b123"}, "--boards N"},
		{[]string{"new", "b123", "--boards", "0"}, "want 1 to"},
		{[]string{"new", "b1", "b2", "--boards", "2"}, "one build ID"},
		{[]string{"new", "--boards", "2"}, "one build ID"},
		{[]string{"show", "x"}, `build "x"`},
		{[]string{"cancel"}, "one build number"},
		{[]string{"close", "-3"}, "unknown shorthand"},
		{[]string{"sheet", "3", "--format", "xlsx"}, `--format "xlsx"`},
		{[]string{"measure", "3", "--board", "1", "--vb", "2", "--ve", "1.4"}, "--vc is required"},
		{[]string{"measure", "3", "--board", "0", "--vb", "2", "--ve", "1.4", "--vc", "6"}, "numbered from 1"},
		{[]string{"measure", "3", "--board", "1", "--vb", "two", "--ve", "1.4", "--vc", "6"}, `--vb "two"`},
		{[]string{"list", "extra"}, "no arguments"},
	} {
		var out, errOut bytes.Buffer
		f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut), DBPath: "/nonexistent/never/opened.db"}
		err := cmdtest.Execute(New(f), tc.args, &out, &errOut)
		var ue *cmdutil.UsageError
		if !errors.As(err, &ue) || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%v: error %v, want a usage error containing %q", tc.args, err, tc.want)
		}
	}
}

// TestLedgerFlagMistakes: ledger's filters are checked before anything
// is opened.
func TestLedgerFlagMistakes(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"--since", "yesterday"}, `--since "yesterday"`},
		{[]string{"--line", "0"}, "--line 0"},
		{[]string{"--build", "-2"}, "--build -2"},
		{[]string{"12"}, "no arguments"},
	} {
		var out, errOut bytes.Buffer
		f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut), DBPath: "/nonexistent/never/opened.db"}
		err := cmdtest.Execute(ledgercmd.New(f), tc.args, &out, &errOut)
		var ue *cmdutil.UsageError
		if !errors.As(err, &ue) || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%v: error %v, want a usage error containing %q", tc.args, err, tc.want)
		}
	}
}
