package stockcsv

import (
	"errors"
	"io"
	"strings"
	"testing"
)

// endless yields the same byte for ever, like /dev/zero.
type endless byte

func (e endless) Read(p []byte) (int, error) {
	for i := range p {
		p[i] = byte(e)
	}
	return len(p), nil
}

// Point 7 of the stock-safety issue: endless or over-long input ends in a
// problem naming the line, after reading at most about one row's limit,
// never in an out-of-memory crash.
func TestScanIsBounded(t *testing.T) {
	for _, tc := range []struct {
		name string
		in   io.Reader
		want string
	}{
		{"NUL bytes for ever", endless(0), "in.csv:1: a row longer than 65536 bytes"},
		{"a header then NULs", io.MultiReader(strings.NewReader(rHeader), endless(0)), "in.csv:2: a row longer"},
		{"an open quote and line breaks for ever", io.MultiReader(strings.NewReader(rHeader+"1K,1%,1W,1,\""), endless('\n')),
			"in.csv:2: a row longer"},
		{"a cell over the limit", strings.NewReader(rHeader + "1K,1%,1W,1," + strings.Repeat("x", MaxFieldChars+1) + "\n"),
			"in.csv:2: bin: longer than 1000 characters"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			counted := &countingReader{r: tc.in}
			_, err := Scan(counted, "in.csv", nil)
			var fe *FileError
			if !errors.As(err, &fe) || !strings.Contains(err.Error(), tc.want) {
				t.Fatalf("error %v, want one containing %q", err, tc.want)
			}
			if counted.n > 2*MaxRowBytes {
				t.Errorf("read %d bytes before stopping", counted.n)
			}
		})
	}
}

// TestScanStopsAfterMaxProblems: a file of bad rows lists MaxProblems of
// them and says it stopped.
func TestScanStopsAfterMaxProblems(t *testing.T) {
	in := rHeader + strings.Repeat("x,1%,1W,1,A\n", 10*MaxProblems)
	_, err := Scan(strings.NewReader(in), "in.csv", nil)
	var fe *FileError
	if !errors.As(err, &fe) || len(fe.Problems) != MaxProblems+1 ||
		!strings.Contains(fe.Problems[MaxProblems].Msg, "stopped reading") {
		t.Fatalf("%v", err)
	}
}

type countingReader struct {
	r io.Reader
	n int
}

func (c *countingReader) Read(p []byte) (int, error) {
	n, err := c.r.Read(p)
	c.n += n
	return n, err
}
