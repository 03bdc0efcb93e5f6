package buildcmd

import (
	"context"
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/report"
	"biasbin/solver/notation"
)

// SheetOptions are the arguments of `build sheet`.
type SheetOptions struct {
	IO     *cmdutil.IOStreams
	Store  StoreFunc
	ID     int64
	Format string
}

func newSheetCmd(f *cmdutil.Factory, runF func(*SheetOptions) error) *cobra.Command {
	o := &SheetOptions{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "sheet ID [--format md|csv]",
		Short: "Print a build's pull list by bin and the test points of every board",
		Long: `Print the pull sheet of build ID: the parts to pull, ordered by bin, with
values and quantities for the whole run, and one row per board with the
VB, VE and VC bands to expect (to 0 V, the rail the sheet names) and, once measured, the readings
and verdict.

--format md (the default) prints Markdown tables ready to print; --format
csv prints one table for a spreadsheet: rows of kind "part" (the pull list)
then rows of kind "board". Text cells that a spreadsheet would read as a
formula (starting with = + - @ or a tab) are prefixed with a quote
(OWASP ASVS 5.0 requirement 1.2.10).`,
		Example: "  biasbin build sheet 3\n  biasbin build sheet 3 --format csv > run3.csv",
		Args:    oneBuildID("sheet"),
		RunE: func(cmd *cobra.Command, args []string) error {
			id, err := parseBuildID(args[0])
			if err != nil {
				return err
			}
			o.ID = id
			if o.Format != "md" && o.Format != "csv" {
				return cmdutil.Usagef("--format %q: want md or csv", o.Format)
			}
			if runF != nil {
				return runF(o)
			}
			return runSheet(cmd.Context(), o)
		},
	}
	cmd.Flags().StringVar(&o.Format, "format", "md", "md (Markdown, to print) or csv (for a spreadsheet)")
	return cmd
}

func runSheet(ctx context.Context, o *SheetOptions) error {
	db, err := o.Store(ctx)
	if err != nil {
		return err
	}
	v, err := buildjob.Show(ctx, db, o.ID)
	if err != nil {
		return err
	}
	if o.Format == "csv" {
		return writeSheetCSV(o.IO.Out, v)
	}
	writeSheetMD(o.IO.Out, v)
	return nil
}

// mdCell keeps a table cell on one line and its bars literal.
func mdCell(s string) string {
	return strings.NewReplacer("|", `\|`, "\n", " ", "\r", " ").Replace(s)
}

func writeSheetMD(w io.Writer, v buildjob.View) {
	p := v.Plan
	fmt.Fprintf(w, "# Build %d: %d board%s of %s (%s)\n\n", v.ID, v.Boards, plural(v.Boards), v.Candidate, v.State)
	fmt.Fprintf(w, "Picked for: %s.\n", mdCell(requestWords(p)))
	fmt.Fprintf(w, "Stage: %s.\n", mdCell(stageWords(p)))
	if v.Note != "" {
		fmt.Fprintf(w, "Note: %s\n", mdCell(v.Note))
	}
	if len(v.Plan.Cautions) > 0 {
		fmt.Fprintln(w)
		writeCautions(w, "- ", v.Plan.Cautions)
	}
	fmt.Fprintln(w, "\n## Pull list, by bin\n\n| Bin | Line | Part | Per board | Pull |\n|---|---:|---|---:|---:|")
	for _, part := range v.Parts {
		fmt.Fprintf(w, "| %s | %d | %s | %d | %d |\n", mdCell(binName(part.Bin)), part.Line, mdCell(partName(part)),
			part.PerBoard, part.Taken)
	}
	fmt.Fprintf(w, "\n## Test points, every board, to 0 V at %s\n\nBands: worst case over hFE spread, tolerances, supply and ambient.\n\n",
		report.ZeroV(p.Build.Topology, p.Build.Ground))
	fmt.Fprintf(w, "| Board | VB %s | VE %s | VC %s | Verdict |\n|---:|---:|---:|---:|---|\n",
		bandWords(p.Bands.VB), bandWords(p.Bands.VE), bandWords(p.Bands.VC))
	for _, rd := range boardsOf(v) {
		if rd.Verdict == "" {
			fmt.Fprintf(w, "| %d |  |  |  |  |\n", rd.Board)
			continue
		}
		verdict := verdictWords(rd.Verdict)
		if len(rd.Causes) > 0 {
			verdict += ": likely " + causeWords(rd.Causes[0])
		}
		fmt.Fprintf(w, "| %d | %s | %s | %s | %s |\n", rd.Board, notation.FormatVoltage(rd.VB_V),
			notation.FormatVoltage(rd.VE_V), notation.FormatVoltage(rd.VC_V), mdCell(verdict))
	}
}

// sheetHeader is the CSV sheet's header row.
var sheetHeader = []string{"row", "bin", "line", "part", "per_board", "qty", "board",
	"vb_min_v", "vb_max_v", "ve_min_v", "ve_max_v", "vc_min_v", "vc_max_v", "vb_v", "ve_v", "vc_v", "verdict", "cause"}

// safeCell prefixes a text cell a spreadsheet would run as a formula with a
// quote (OWASP ASVS 5.0 requirement 1.2.10; CWE-1236).
func safeCell(s string) string {
	if s != "" && strings.ContainsRune("=+-@\t\r\x00", rune(s[0])) {
		return "'" + s
	}
	return s
}

// num writes a voltage for a spreadsheet: a reading as given, a band to 5
// significant digits (well below a 3½-digit meter's resolution).
func num(v float64) string { return strconv.FormatFloat(v, 'g', 5, 64) }

func writeSheetCSV(w io.Writer, v buildjob.View) error {
	cw := csv.NewWriter(w)
	cw.Write(sheetHeader)
	for _, part := range v.Parts {
		row := make([]string, len(sheetHeader))
		row[0], row[1], row[2], row[3] = "part", safeCell(part.Bin), strconv.FormatInt(part.Line, 10), safeCell(partName(part))
		row[4], row[5] = strconv.Itoa(part.PerBoard), strconv.Itoa(part.Taken)
		cw.Write(row)
	}
	b := v.Plan.Bands
	for _, rd := range boardsOf(v) {
		row := make([]string, len(sheetHeader))
		row[0], row[6] = "board", strconv.Itoa(rd.Board)
		copy(row[7:13], []string{num(b.VB.Min_V), num(b.VB.Max_V), num(b.VE.Min_V), num(b.VE.Max_V), num(b.VC.Min_V), num(b.VC.Max_V)})
		if rd.Verdict != "" {
			row[13], row[14], row[15], row[16] = num(rd.VB_V), num(rd.VE_V), num(rd.VC_V), string(rd.Verdict)
			if len(rd.Causes) > 0 {
				row[17] = safeCell(causeWords(rd.Causes[0]))
			}
		}
		cw.Write(row)
	}
	cw.Flush()
	if err := cw.Error(); err != nil {
		return fmt.Errorf("write CSV: %w", err)
	}
	return nil
}
