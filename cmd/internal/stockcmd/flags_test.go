package stockcmd

import (
	"bytes"
	"io"
	"reflect"
	"strings"
	"testing"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
)

// parse runs cmd with args and returns the error (flag parsing only: the
// run function only records the options).
func parse(t *testing.T, cmd *cobra.Command, args ...string) error {
	t.Helper()
	cmd.SetArgs(args)
	cmd.SetOut(io.Discard)
	cmd.SetErr(io.Discard)
	cmd.SilenceErrors, cmd.SilenceUsage = true, true
	cmd.SetFlagErrorFunc(func(_ *cobra.Command, err error) error { return &cmdutil.UsageError{Err: err} })
	return cmd.Execute()
}

func testFactory() *cmdutil.Factory {
	return &cmdutil.Factory{IO: cmdtest.Streams(strings.NewReader(""), &bytes.Buffer{}, &bytes.Buffer{})}
}

func TestAddFlags(t *testing.T) {
	for _, tc := range []struct {
		name     string
		kind     string
		args     []string
		want     map[string]string // fields checked
		wantQty  int
		wantTags []string
		wantCode int
	}{
		{"resistor defaults", "resistor", []string{"4K7"},
			map[string]string{"tolerance": "5%", "power": "0.25W", "tech": "thick film", "bin": ""}, 1, nil, 0},
		{"resistor letter keeps its tolerance", "resistor", []string{"4K7F"},
			map[string]string{"tolerance": ""}, 1, nil, 0},
		{"resistor every flag", "resistor", []string{"10k", "--tol", "1%", "--power", "0.6W", "--qty", "50", "--bin", "A3",
			"--tcr", "50", "--tech", "metal film", "--knee", "70", "--max-temp", "155", "--tag", "rohs,approved", "--note", "n"},
			map[string]string{"tolerance": "1%", "power": "0.6W", "bin": "A3", "tcr": "50", "tech": "metal film",
				"knee_c": "70", "max_c": "155", "note": "n"}, 50, []string{"rohs", "approved"}, 0},
		{"resistor without value", "resistor", nil, nil, 0, nil, 2},
		{"resistor non-integer qty", "resistor", []string{"1K", "--qty", "2.5"}, nil, 0, nil, 2},
		{"transistor range at current", "transistor", []string{"Q1", "--polarity", "npn", "--hfe", "110..800@2mA"},
			map[string]string{"polarity": "npn", "hfe_min": "110", "hfe_max": "800", "hfe_at": "0.002"}, 1, nil, 0},
		{"transistor vbe at current", "transistor", []string{"Q1", "--polarity", "pnp", "--hfe", "100..300", "--vbe", "0.7V@2mA", "--vceo", "45V"},
			map[string]string{"vbe": "0.7", "vbe_at": "0.002", "vceo": "45V", "hfe_at": ""}, 1, nil, 0},
		{"transistor without hfe", "transistor", []string{"Q1", "--polarity", "npn"}, nil, 0, nil, 2},
		{"transistor bad hfe range", "transistor", []string{"Q1", "--polarity", "npn", "--hfe", "300..100"}, nil, 0, nil, 2},
		{"transistor hfe current twice", "transistor", []string{"Q1", "--polarity", "npn", "--hfe", "100..300@1mA", "--hfe-at", "2mA"}, nil, 0, nil, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var got *AddOptions
			runF := func(o *AddOptions) error { got = o; return nil }
			cmd := newAddResistorCmd(testFactory(), runF)
			if tc.kind == "transistor" {
				cmd = newAddTransistorCmd(testFactory(), runF)
			}
			err := parse(t, cmd, tc.args...)
			if code := cmdutil.ExitCode(err); code != tc.wantCode {
				t.Fatalf("exit %d (%v), want %d", code, err, tc.wantCode)
			}
			if tc.wantCode != 0 {
				return
			}
			for k, v := range tc.want {
				if got.Fields[k] != v {
					t.Errorf("field %s = %q, want %q", k, got.Fields[k], v)
				}
			}
			if got.Qty != tc.wantQty || !reflect.DeepEqual(got.Tags, tc.wantTags) {
				t.Errorf("qty %d tags %v, want %d %v", got.Qty, got.Tags, tc.wantQty, tc.wantTags)
			}
		})
	}
}

func TestAdjustFlags(t *testing.T) {
	for _, tc := range []struct {
		name     string
		args     []string
		want     AdjustOptions
		wantCode int
	}{
		{"take out", []string{"12", "-4"}, AdjustOptions{ID: 12, N: -4}, 0},
		{"put in", []string{"12", "+100"}, AdjustOptions{ID: 12, N: 100}, 0},
		{"count", []string{"12", "=37"}, AdjustOptions{ID: 12, N: 37, Set: true}, 0},
		{"json before", []string{"--json", "3", "-1"}, AdjustOptions{ID: 3, N: -1, JSON: true}, 0},
		{"json after", []string{"3", "-1", "--json"}, AdjustOptions{ID: 3, N: -1, JSON: true}, 0},
		{"bare number", []string{"12", "4"}, AdjustOptions{}, 2},
		{"fraction", []string{"12", "-1.5"}, AdjustOptions{}, 2},
		{"no change", []string{"12"}, AdjustOptions{}, 2},
		{"bad ID", []string{"R12", "-1"}, AdjustOptions{}, 2},
		{"zero ID", []string{"0", "-1"}, AdjustOptions{}, 2},
		{"unknown flag", []string{"12", "-1", "--frobnicate"}, AdjustOptions{}, 2},
		{"huge", []string{"12", "+99999999999999999999"}, AdjustOptions{}, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var got AdjustOptions
			cmd := newAdjustCmd(testFactory(), func(o *AdjustOptions) error { got = *o; return nil })
			err := parse(t, cmd, tc.args...)
			if code := cmdutil.ExitCode(err); code != tc.wantCode {
				t.Fatalf("exit %d (%v), want %d", code, err, tc.wantCode)
			}
			if tc.wantCode == 0 && (got.ID != tc.want.ID || got.N != tc.want.N || got.Set != tc.want.Set || got.JSON != tc.want.JSON) {
				t.Fatalf("got %+v, want %+v", got, tc.want)
			}
		})
	}
}

func TestOtherFlags(t *testing.T) {
	for _, tc := range []struct {
		name     string
		cmd      func(f *cmdutil.Factory, got *any) *cobra.Command
		args     []string
		want     any
		wantCode int
	}{
		{"list all", listCmd, nil, ListOptions{}, 0},
		{"list kind and filters", listCmd, []string{"--kind", "Resistor", "--bin", "A3", "--tag", "rohs", "--tag", "approved", "--json"},
			ListOptions{Kind: "resistor", Bin: "A3", Tags: []string{"rohs", "approved"}, JSON: true}, 0},
		{"list bad kind", listCmd, []string{"--kind", "capacitor"}, nil, 2},
		{"list takes no arguments", listCmd, []string{"4K7"}, nil, 2},
		{"export needs kind", exportCmd, nil, nil, 2},
		{"export to stdout", exportCmd, []string{"--kind", "transistor"}, ExportOptions{Kind: "transistor"}, 0},
		{"export to file", exportCmd, []string{"--kind", "resistor", "r.csv"}, ExportOptions{Kind: "resistor", File: "r.csv"}, 0},
		{"import dry run", importCmd, []string{"stock.csv", "--dry-run"}, ImportOptions{File: "stock.csv", DryRun: true}, 0},
		{"import replace", importCmd, []string{"--replace", "-"}, ImportOptions{File: "-", Replace: true}, 0},
		{"import without file", importCmd, nil, nil, 2},
		{"tag", tagCmd, []string{"7", "rohs", "reel"}, TagOptions{Add: true, IDs: []int64{7}, Tags: []string{"rohs", "reel"}}, 0},
		{"tag several lines", tagCmd, []string{"--tag", "approved", "5", "6", "7"}, TagOptions{Add: true, IDs: []int64{5, 6, 7}, Tags: []string{"approved"}}, 0},
		{"tag several tags and lines", tagCmd, []string{"--tag", "approved,rohs", "5", "6"}, TagOptions{Add: true, IDs: []int64{5, 6}, Tags: []string{"approved", "rohs"}}, 0},
		{"tag with --tag and a word", tagCmd, []string{"--tag", "approved", "5", "reel"}, nil, 2},
		{"tag without tags", tagCmd, []string{"7"}, nil, 2},
		{"tag bad ID", tagCmd, []string{"x", "rohs"}, nil, 2},
		// a tag of only digits reads as a line ID: a usage error (exit 2)
		// in either form, before the stock is opened
		{"tag digits after ID", tagCmd, []string{"5", "approved", "6", "7"}, nil, 2},
		{"tag digits with --tag", tagCmd, []string{"--tag", "6", "5"}, nil, 2},
		{"untag digits", untagCmd, []string{"--tag", "55", "1"}, nil, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var got any
			err := parse(t, tc.cmd(testFactory(), &got), tc.args...)
			if code := cmdutil.ExitCode(err); code != tc.wantCode {
				t.Fatalf("exit %d (%v), want %d", code, err, tc.wantCode)
			}
			if tc.wantCode == 0 && !reflect.DeepEqual(got, tc.want) {
				t.Fatalf("got %+v, want %+v", got, tc.want)
			}
		})
	}
}

// Constructors that record the parsed options without their streams and
// store, for comparison.
func listCmd(f *cmdutil.Factory, got *any) *cobra.Command {
	return newListCmd(f, func(o *ListOptions) error { c := *o; c.IO, c.Store = nil, nil; *got = c; return nil })
}

func exportCmd(f *cmdutil.Factory, got *any) *cobra.Command {
	return newExportCmd(f, func(o *ExportOptions) error {
		c := *o
		c.IO, c.Store, c.StockPath = nil, nil, nil
		*got = c
		return nil
	})
}

func importCmd(f *cmdutil.Factory, got *any) *cobra.Command {
	return newImportCmd(f, func(o *ImportOptions) error {
		c := *o
		c.IO, c.Store, c.ReadStore = nil, nil, nil
		*got = c
		return nil
	})
}

func tagCmd(f *cmdutil.Factory, got *any) *cobra.Command {
	return newTagCmd(f, true, func(o *TagOptions) error { c := *o; c.IO, c.Store = nil, nil; *got = c; return nil })
}

func untagCmd(f *cmdutil.Factory, got *any) *cobra.Command {
	return newTagCmd(f, false, func(o *TagOptions) error { c := *o; c.IO, c.Store = nil, nil; *got = c; return nil })
}
