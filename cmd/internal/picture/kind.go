package picture

import (
	"fmt"
	"os"
	"strings"
)

// Kind is which picture to draw.
type Kind int

// The pictures.
const (
	// KindLoadLine is the IC–VCE plane: load lines, regions, Q-point
	// spread and yield window (LoadLine).
	KindLoadLine Kind = iota
	// KindICHistogram is IC over the Monte Carlo boards (Histogram).
	KindICHistogram
)

// kindNames are the kinds as the command line names them.
var kindNames = [...]string{KindLoadLine: "load-line", KindICHistogram: "ic-histogram"}

// String names the kind as ParseKind reads it.
func (k Kind) String() string {
	if k >= 0 && int(k) < len(kindNames) {
		return kindNames[k]
	}
	return fmt.Sprintf("kind(%d)", int(k))
}

// ParseKind reads a kind's name ("load-line", "ic-histogram").
func ParseKind(s string) (Kind, error) {
	for k, n := range kindNames {
		if strings.EqualFold(strings.TrimSpace(s), n) {
			return Kind(k), nil
		}
	}
	return 0, fmt.Errorf("%q: want %s", s, strings.Join(kindNames[:], " or "))
}

// Draw builds the chart of kind k: the load-line picture of one to
// MaxCompare builds, or the IC histogram of one build.
func Draw(k Kind, subjects []Subject, opt LoadLineOptions) (Chart, error) {
	switch k {
	case KindLoadLine:
		return LoadLine(subjects, opt)
	case KindICHistogram:
		if len(subjects) != 1 {
			return nil, fmt.Errorf("picture: the IC histogram shows one build, not %d", len(subjects))
		}
		return Histogram(subjects[0])
	}
	return nil, fmt.Errorf("picture: unknown kind %v", k)
}

// WriteFile renders c to path in the format its extension names. A file
// that could not be written whole is removed.
func WriteFile(path string, c Chart, s Size) (err error) {
	f, err := FormatOf(path)
	if err != nil {
		return err
	}
	out, err := os.Create(path)
	if err != nil {
		return fmt.Errorf("picture: %w", err)
	}
	defer func() {
		if cerr := out.Close(); err == nil && cerr != nil {
			err = fmt.Errorf("picture: %w", cerr)
		}
		if err != nil {
			os.Remove(path)
		}
	}()
	return Render(out, c, f, s)
}
