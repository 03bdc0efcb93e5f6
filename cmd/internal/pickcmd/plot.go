package pickcmd

import (
	"fmt"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/picture"
	"biasbin/picker/job"
)

// pictureJob is the picture pick --plot draws, its flags checked.
type pictureJob struct {
	path   string
	builds int
	size   picture.Size
}

// pictureOptions checks --plot, --compare and --plot-size before the
// search; nil when no picture is asked for.
func (o *Options) pictureOptions() (*pictureJob, error) {
	if o.Plot == "" {
		if o.Compare != 0 {
			return nil, cmdutil.Usagef("--compare: needs --plot FILE to draw into")
		}
		if o.PlotSize != "" {
			return nil, cmdutil.Usagef("--plot-size: needs --plot FILE to draw into")
		}
		return nil, nil
	}
	pj := &pictureJob{path: o.Plot, builds: 1, size: picture.DefaultSize}
	if _, err := picture.FormatOf(o.Plot); err != nil {
		return nil, cmdutil.Usagef("--plot: %v", err)
	}
	if o.Compare != 0 {
		if o.Compare < 2 || o.Compare > picture.MaxCompare {
			return nil, cmdutil.Usagef("--compare: %d: want 2 to %d builds", o.Compare, picture.MaxCompare)
		}
		pj.builds = o.Compare
	}
	if o.PlotSize != "" {
		sz, err := picture.ParseSize(o.PlotSize)
		if err != nil {
			return nil, cmdutil.Usagef("--plot-size: %v", err)
		}
		pj.size = sz
	}
	return pj, nil
}

// write draws the first builds of the pick and says where on stderr.
func (pj *pictureJob) write(io *cmdutil.IOStreams, out *job.PickOutcome) error {
	n, err := DrawBuilds(pj.path, pj.size, out, pj.builds)
	if err != nil {
		return fmt.Errorf("pick: --plot: %w", err)
	}
	what := "the first build"
	if n > 1 {
		what = fmt.Sprintf("the first %d builds", n)
	}
	if n < pj.builds {
		what += fmt.Sprintf(" (only %d shown)", n)
	}
	fmt.Fprintf(io.ErrOut, "picture: %s written to %s\n", what, pj.path)
	return nil
}

// DrawBuilds draws the first n builds of a pick (one: its load-line
// picture; up to picture.MaxCompare: overlaid) to path, each analysed as
// check analyses a build with the window, boards and seed of its own yield
// run, so each picture counts the boards the pick counted. It returns how
// many builds it drew.
func DrawBuilds(path string, size picture.Size, out *job.PickOutcome, n int) (int, error) {
	if len(out.Builds) == 0 {
		return 0, fmt.Errorf("no build to draw")
	}
	n = min(n, len(out.Builds))
	subjects := make([]picture.Subject, 0, n)
	for _, b := range out.Builds[:n] {
		req := job.CandidateRequest(b.Candidate)
		req.KeepBoards = true
		a, err := job.Check(req)
		if err != nil {
			return 0, fmt.Errorf("build %s: %w", b.ID, err)
		}
		s := picture.FromAnalysis(a)
		s.Name = fmt.Sprintf("#%d %s", b.Rank, s.Name)
		subjects = append(subjects, s)
	}
	c, err := picture.LoadLine(subjects, picture.LoadLineOptions{})
	if err != nil {
		return 0, err
	}
	if err := picture.WriteFile(path, c, size); err != nil {
		return 0, err
	}
	return n, nil
}
