package checkcmd

import (
	"biasbin/store"
	"context"
	"errors"
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/picture"
	"biasbin/cmd/internal/stageflags"
	"biasbin/picker/job"
	"biasbin/solver"
)

// NewPlot returns the plot command: the picture of one build named by the
// same flags as check.
func NewPlot(f *cmdutil.Factory) *cobra.Command { return newPlotCmd(f, nil) }

// newPlotCmd builds the plot command; runF, when not nil, replaces Run.
func newPlotCmd(f *cmdutil.Factory, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: f.IO, Store: f.ExistingStore}
	cmd := &cobra.Command{
		Use:   "plot --out FILE (--vcc V --r1 R ... | BUILD-ID...) [flags]",
		Short: "Draw one build: load lines, Q-point spread, yield window (SVG, PNG or PDF)",
		Long: `Analyse one build as check does (the same flags) and draw it to --out;
the file's extension picks the format: .svg, .png or .pdf.

--kind load-line (the default) draws the IC–VCE plane: the DC load line,
the AC load line when --load or --bypass makes r_ac differ from RC+RE, the
saturation region (VCE below VCE(sat)) and cut-off (IC ≈ 0) shaded grey,
the nominal Q-point, the hull of the worst-case corners, the Monte Carlo
boards (each at both ends of the ambient range, told apart by marker) and
the yield window. At most 2,000 boards are drawn, the first of the run.
--zoom closes the axes in on the spread, to tell it against the window.
--kind ic-histogram draws IC over every Monte Carlo board at each ambient
end, with the yield window's IC bounds and the worst-case band.

Colours are the Okabe–Ito palette, chosen to stay distinct for colour-blind
readers; every series also differs by marker or dash, so a greyscale print
reads the same. --size is in pixels (a PNG has exactly that many; SVG and
PDF are that size at 96 pixels per inch).

Instead of the build flags, name up to four builds: a pick's build ID (as
pick shows it, kept for ` + strconv.Itoa(store.PickKeepDays) + ` days) or a reserved build's number (build list).
Each is analysed as check analyses a build (--window, --sim-boards and --seed
apply) and several are overlaid, each in its own colour, marker and dash,
with the axes closed in on their spread. pick --plot FILE draws the first
build of a pick as it runs (--compare N overlays the first N).`,
		Example: `  biasbin plot --out q.svg --vcc 12V --r1 47K --r2 10K --rc 2K2 --re 470R --hfe 100..300 --load 10K --bypass
  biasbin plot --out q.png --size 1200x800 --vcc 15V --r1 10K --r2 5K --rc 1K --re 1K --transistor NPN-GP
  biasbin plot --out ic.pdf --kind ic-histogram --topology collector-feedback --vcc 12V --rf 220K --rc 2K2 --re 470R --hfe 100..400
  biasbin plot --out two.svg b3b39a272f57c b04ae2b60b913`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) > picture.MaxCompare {
				return cmdutil.Usagef("plot draws up to %d builds, not %d", picture.MaxCompare, len(args))
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.Refs = args
			if runF != nil {
				return runF(o)
			}
			return RunPlot(cmd.Context(), o)
		},
	}
	fl := cmd.Flags()
	o.bindBuild(fl)
	fl.VisitAll(func(f *pflag.Flag) {
		switch f.Name {
		case "window", "ic", "vce", "sim-boards", "boards", "seed":
		default:
			o.buildFlags = append(o.buildFlags, f.Name)
		}
	})
	fl.StringVar(&o.Out, "out", "", "the picture file: .svg, .png or .pdf (required)")
	fl.StringVar(&o.Kind, "kind", picture.KindLoadLine.String(), "the picture: load-line or ic-histogram")
	fl.StringVar(&o.PlotSize, "size", "", "picture size in pixels, WIDTHxHEIGHT (default "+defaultSize()+")")
	fl.BoolVar(&o.Zoom, "zoom", false, "load-line picture: close the axes in on the Q-point spread (the load lines run on)")
	return cmd
}

// RunPlot draws the build o names; tests call it with buffer streams.
func RunPlot(ctx context.Context, o *Options) error {
	if ctx == nil {
		ctx = context.Background()
	}
	if len(o.Refs) > 0 {
		return o.plotRefs(ctx)
	}
	pic, res, err := o.analysePlot(ctx)
	if err != nil {
		return err
	}
	for _, c := range cautions(res) {
		fmt.Fprintln(o.IO.ErrOut, "caution:", c)
	}
	if err := pic.write(o.IO, res); err != nil {
		return err
	}
	if len(res.Problems) > 0 {
		for _, p := range problems(res) {
			fmt.Fprintln(o.IO.ErrOut, "biasbin: plot:", p)
		}
		return cmdutil.ErrSilent
	}
	return nil
}

// analysePlot checks plot's flags and analyses the build with its Monte
// Carlo boards kept.
func (o *Options) analysePlot(ctx context.Context) (*pictureJob, *job.Analysis, error) {
	if o.Out == "" {
		return nil, nil, stageflags.Usagef("out", "missing: name the picture file, e.g. --out q.svg")
	}
	pic, err := o.pictureOptions("out", o.Out)
	if err != nil {
		return nil, nil, err
	}
	in, err := o.input(ctx)
	if err != nil {
		return nil, nil, err
	}
	in.KeepBoards = true
	res, err := job.Check(in)
	if err != nil {
		var ie *solver.InputError
		if errors.As(err, &ie) {
			return nil, nil, &cmdutil.UsageError{Err: fmt.Errorf("%s: %s", stageflags.FlagName(ie.Field), ie.Problem)}
		}
		return nil, nil, fmt.Errorf("plot: %w", err)
	}
	return pic, res, nil
}

// defaultSize is the default picture size as the flags write it.
func defaultSize() string {
	return fmt.Sprintf("%dx%d", picture.DefaultSize.Width_px, picture.DefaultSize.Height_px)
}

// pictureJob is a picture to draw, its flags checked.
type pictureJob struct {
	path string
	kind picture.Kind
	size picture.Size
	zoom bool
}

// pictureOptions checks the picture flags before any analysis: nil when
// path is empty (no picture asked for). flag names the file's flag.
func (o *Options) pictureOptions(flag, path string) (*pictureJob, error) {
	if path == "" {
		return nil, nil
	}
	pj := &pictureJob{path: path, size: picture.DefaultSize, zoom: o.Zoom}
	if _, err := picture.FormatOf(path); err != nil {
		return nil, stageflags.Usage(flag, err)
	}
	if o.Kind != "" {
		k, err := picture.ParseKind(o.Kind)
		if err != nil {
			return nil, stageflags.Usage("kind", err)
		}
		pj.kind = k
	}
	if o.PlotSize != "" {
		sz, err := picture.ParseSize(o.PlotSize)
		if err != nil {
			sizeFlag := "size"
			if flag == "plot" {
				sizeFlag = "plot-size"
			}
			return nil, stageflags.Usage(sizeFlag, err)
		}
		pj.size = sz
	}
	return pj, nil
}

// write draws the analysed build and says where on stderr.
func (pj *pictureJob) write(io *cmdutil.IOStreams, a *job.Analysis) error {
	c, err := pj.chart(a)
	if err != nil {
		return err
	}
	if err := picture.WriteFile(pj.path, c, pj.size); err != nil {
		return fmt.Errorf("plot: %w", err)
	}
	fmt.Fprintf(io.ErrOut, "picture: %s written to %s\n", pj.kind, pj.path)
	return nil
}

// chart is the picture's data for the analysed build.
func (pj *pictureJob) chart(a *job.Analysis) (picture.Chart, error) {
	if a.Yield == nil && pj.kind == picture.KindICHistogram {
		return nil, fmt.Errorf("plot: the Monte Carlo run failed, so there is no IC histogram to draw")
	}
	c, err := picture.Draw(pj.kind, []picture.Subject{picture.FromAnalysis(a)}, picture.LoadLineOptions{Zoom: pj.zoom})
	if err != nil {
		return nil, fmt.Errorf("plot: %w", err)
	}
	return c, nil
}

// plotRefs draws the builds named by reference, each analysed as check
// analyses a build.
func (o *Options) plotRefs(ctx context.Context) error {
	pic, c, failed, err := o.refChart(ctx)
	if err != nil {
		return err
	}
	if err := picture.WriteFile(pic.path, c, pic.size); err != nil {
		return fmt.Errorf("plot: %w", err)
	}
	fmt.Fprintf(o.IO.ErrOut, "picture: %s of %s written to %s\n", pic.kind, strings.Join(o.Refs, ", "), pic.path)
	if failed {
		return cmdutil.ErrSilent
	}
	return nil
}

// refChart checks the flags beside build references and builds the chart
// of the builds they name; failed reports an analysis that failed (said
// on stderr).
func (o *Options) refChart(ctx context.Context) (pic *pictureJob, c picture.Chart, failed bool, err error) {
	for _, name := range o.buildFlags {
		if o.changed(name) {
			return nil, nil, false, stageflags.Usagef(name, "give either build IDs or the build flags, not both")
		}
	}
	if o.Out == "" {
		return nil, nil, false, stageflags.Usagef("out", "missing: name the picture file, e.g. --out q.svg")
	}
	if pic, err = o.pictureOptions("out", o.Out); err != nil {
		return nil, nil, false, err
	}
	if pic.kind == picture.KindICHistogram && len(o.Refs) > 1 {
		return nil, nil, false, stageflags.Usagef("kind", "the IC histogram shows one build, not %d", len(o.Refs))
	}
	var base job.CheckRequest
	if err := o.yieldRequest(&base); err != nil {
		return nil, nil, false, err
	}
	refs := make([]buildjob.Ref, len(o.Refs))
	for i, s := range o.Refs {
		if refs[i], err = buildjob.ParseRef(s); err != nil {
			return nil, nil, false, cmdutil.Usagef("plot: build %w", err)
		}
	}
	db, err := o.Store(ctx)
	if err != nil {
		return nil, nil, false, err
	}
	var subjects []picture.Subject
	for _, r := range refs {
		plan, err := buildjob.PlanOf(ctx, db, r)
		if err != nil {
			return nil, nil, false, fmt.Errorf("plot: %w", err) // names the build
		}
		req := base
		req.Build, req.Label, req.KeepBoards = plan.Build, plan.Build.Device.Label, true
		a, err := job.Check(req)
		if err != nil {
			return nil, nil, false, fmt.Errorf("plot: build %s: %w", r, err)
		}
		for _, p := range problems(a) {
			fmt.Fprintf(o.IO.ErrOut, "biasbin: plot: build %s: %s\n", r, p)
			failed = true
		}
		s := picture.FromAnalysis(a)
		s.Name = r.String() + " " + s.Name
		subjects = append(subjects, s)
	}
	if c, err = picture.Draw(pic.kind, subjects, picture.LoadLineOptions{Zoom: pic.zoom}); err != nil {
		return nil, nil, false, fmt.Errorf("plot: %w", err)
	}
	return pic, c, failed, nil
}
