package pickcmd

import (
	"fmt"
	"io"
	"sync"
	"time"
)

// progress draws a one-line indicator on a terminal once a search has run
// for longer than a second, at most ten times a second, and erases it when
// the search ends. Safe for calls from several goroutines.
type progress struct {
	mu    sync.Mutex
	w     io.Writer
	now   func() time.Time
	start time.Time
	last  time.Time
	shown bool
}

// progressDelay is how long a search runs before the indicator appears.
const progressDelay = time.Second

// progressEvery is the shortest time between two redraws.
const progressEvery = 100 * time.Millisecond

func newProgress(w io.Writer, now func() time.Time) *progress {
	return &progress{w: w, now: now, start: now()}
}

// update is the picker's Progress callback.
func (p *progress) update(done, total int64) {
	p.mu.Lock()
	defer p.mu.Unlock()
	t := p.now()
	if t.Sub(p.start) < progressDelay || (p.shown && t.Sub(p.last) < progressEvery) {
		return
	}
	p.last, p.shown = t, true
	if total > 0 {
		fmt.Fprintf(p.w, "\rsearching: %d %% (%d of %d steps)  ", done*100/total, done, total)
	} else {
		fmt.Fprintf(p.w, "\rsearching: %d steps  ", done)
	}
}

// finish erases the indicator if it was drawn.
func (p *progress) finish() {
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.shown {
		fmt.Fprint(p.w, "\r\033[K")
		p.shown = false
	}
}
