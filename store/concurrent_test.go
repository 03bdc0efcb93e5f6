package store

import (
	"context"
	"errors"
	"sync"
	"testing"
)

// TestTwoHandlesWriteTheSameLines runs writers through two separate
// handles (two connection pools, as two processes would have) on the same
// lines at once: every change counts and none fails with a busy database.
func TestTwoHandlesWriteTheSameLines(t *testing.T) {
	a, path := openTemp(t)
	ctx := context.Background()
	b, err := Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	line, err := a.AddResistor(ctx, r4k7(1000, "A"))
	if err != nil {
		t.Fatal(err)
	}
	const rounds = 40
	var wg sync.WaitGroup
	errs := make(chan error, 4*rounds)
	for _, db := range []*DB{a, b} {
		for _, delta := range []int{+3, -1} {
			wg.Add(1)
			go func() {
				defer wg.Done()
				for range rounds {
					if _, err := db.Adjust(ctx, line.ID, delta); err != nil {
						errs <- err
					}
					if delta > 0 {
						if _, err := db.Import(ctx, Batch{Resistors: []Resistor{r4k7(2, "A")}}, ImportOptions{}); err != nil {
							errs <- err
						}
					}
				}
			}()
		}
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		t.Errorf("write failed: %v", err)
	}
	r, _ := a.ResistorByID(ctx, line.ID)
	// each handle: +3 and +2 per round from one writer, -1 per round from the other
	want := 1000 + 2*rounds*(3+2-1)
	if r.Qty != want {
		t.Fatalf("qty %d, want %d", r.Qty, want)
	}
}

// TestConcurrentTakeOutsNeverOversell races more take-outs than there are
// parts through two handles: exactly the stocked number succeed.
func TestConcurrentTakeOutsNeverOversell(t *testing.T) {
	a, path := openTemp(t)
	ctx := context.Background()
	b, err := Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	const stocked, tries = 50, 40
	line, _ := a.AddResistor(ctx, r4k7(stocked, "A"))
	var wg sync.WaitGroup
	var mu sync.Mutex
	ok, refused := 0, 0
	for _, db := range []*DB{a, b} {
		for range 2 {
			wg.Add(1)
			go func() {
				defer wg.Done()
				for range tries {
					_, err := db.Adjust(ctx, line.ID, -1)
					mu.Lock()
					switch {
					case err == nil:
						ok++
					case errors.Is(err, ErrBelowZero):
						refused++
					default:
						t.Errorf("take out: %v", err)
					}
					mu.Unlock()
				}
			}()
		}
	}
	wg.Wait()
	r, _ := a.ResistorByID(ctx, line.ID)
	if ok != stocked || refused != 4*tries-stocked || r.Qty != 0 {
		t.Fatalf("%d taken, %d refused, %d left; want %d, %d, 0", ok, refused, r.Qty, stocked, 4*tries-stocked)
	}
}
