// Package spicecheck runs ngspice (the Debian package, batch mode) on
// decks written by solver.Netlist and returns the operating-point values,
// so tests can hold biasbin's solver against an independent simulator.
//
// Many decks run in one ngspice process: each deck's own .control block is
// dropped, the deck is loaded with `source`, solved with `op`, and the
// requested vectors are written at full precision to an ASCII raw file.
package spicecheck

import (
	"bufio"
	"bytes"
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// RequireEnv is the environment variable that turns a missing ngspice
// from a skipped test into a failed one (set by .ci/test).
const RequireEnv = "BIASBIN_REQUIRE_NGSPICE"

// Available reports whether an ngspice binary is on PATH.
func Available() bool {
	_, err := exec.LookPath("ngspice")
	return err == nil
}

// Require skips t when ngspice is missing, or fails it when the
// environment variable BIASBIN_REQUIRE_NGSPICE is "1".
func Require(t testing.TB) {
	t.Helper()
	if Available() {
		return
	}
	if os.Getenv(RequireEnv) == "1" {
		t.Fatalf("ngspice not found on PATH and %s=1: install the Debian package ngspice", RequireEnv)
	}
	t.Skip("ngspice not found on PATH; set " + RequireEnv + "=1 to make this a failure")
}

// Job is one deck to solve and the vectors to read back after `op`,
// written as ngspice names them: "v(b)", "@q1[ic]", "i(vcc)".
type Job struct {
	Deck    string
	Vectors []string
}

// Run solves every job's operating point in one ngspice batch process
// and returns, per job, the value of each requested vector.
func Run(ctx context.Context, jobs []Job) ([]map[string]float64, error) {
	dir, err := os.MkdirTemp("", "spicecheck")
	if err != nil {
		return nil, fmt.Errorf("spicecheck: %w", err)
	}
	defer os.RemoveAll(dir)

	var script strings.Builder
	script.WriteString("* spicecheck batch\n.control\nset filetype=ascii\n")
	for i, j := range jobs {
		deck := filepath.Join(dir, fmt.Sprintf("c%d.cir", i))
		if err := os.WriteFile(deck, []byte(StripControl(j.Deck)), 0o644); err != nil {
			return nil, fmt.Errorf("spicecheck: write deck %d: %w", i, err)
		}
		fmt.Fprintf(&script, "source %s\nop\n", deck)
		names := make([]string, len(j.Vectors))
		for k, v := range j.Vectors {
			names[k] = fmt.Sprintf("x%d", k)
			fmt.Fprintf(&script, "let %s = %s\n", names[k], v)
		}
		fmt.Fprintf(&script, "write %s %s\ndestroy all\nremcirc\n", filepath.Join(dir, fmt.Sprintf("r%d.raw", i)), strings.Join(names, " "))
	}
	script.WriteString("quit 0\n.endc\n.end\n")
	master := filepath.Join(dir, "batch.cir")
	if err := os.WriteFile(master, []byte(script.String()), 0o644); err != nil {
		return nil, fmt.Errorf("spicecheck: write batch: %w", err)
	}
	logFile := filepath.Join(dir, "batch.log")
	cmd := exec.CommandContext(ctx, "ngspice", "-b", "-o", logFile, master)
	cmd.Dir = dir
	var stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stderr, &stderr
	runErr := cmd.Run()
	logText, _ := os.ReadFile(logFile)

	out := make([]map[string]float64, len(jobs))
	for i, j := range jobs {
		raw, err := os.ReadFile(filepath.Join(dir, fmt.Sprintf("r%d.raw", i)))
		if err != nil {
			return nil, fmt.Errorf("spicecheck: deck %d gave no result (ngspice: %v): %s", i, runErr, tail(string(logText)+stderr.String()))
		}
		vals, err := ParseRaw(raw)
		if err != nil {
			return nil, fmt.Errorf("spicecheck: deck %d: %w", i, err)
		}
		out[i] = make(map[string]float64, len(j.Vectors))
		for k, v := range j.Vectors {
			x, ok := lookup(vals, fmt.Sprintf("x%d", k))
			if !ok {
				return nil, fmt.Errorf("spicecheck: deck %d: vector %s missing from raw file", i, v)
			}
			out[i][v] = x
		}
	}
	return out, nil
}

// StripControl removes .control ... .endc blocks from a deck.
func StripControl(deck string) string {
	var b strings.Builder
	in := false
	for line := range strings.Lines(deck) {
		l := strings.ToLower(strings.TrimSpace(line))
		switch {
		case strings.HasPrefix(l, ".control"):
			in = true
		case strings.HasPrefix(l, ".endc"):
			in = false
		case !in:
			b.WriteString(line)
		}
	}
	return b.String()
}

// ParseRaw reads the first point of an ASCII raw file (one operating
// point) into a map from variable name to value.
func ParseRaw(raw []byte) (map[string]float64, error) {
	sc := bufio.NewScanner(bytes.NewReader(raw))
	var names []string
	vals := map[string]float64{}
	nvars, section := 0, ""
	for sc.Scan() {
		line := sc.Text()
		switch {
		case strings.HasPrefix(line, "No. Variables:"):
			n, err := strconv.Atoi(strings.TrimSpace(strings.TrimPrefix(line, "No. Variables:")))
			if err != nil {
				return nil, fmt.Errorf("raw file: %q: %w", line, err)
			}
			nvars = n
		case line == "Variables:":
			section = "vars"
		case line == "Values:":
			section = "values"
		case section == "vars":
			f := strings.Fields(line)
			if len(f) < 2 {
				return nil, fmt.Errorf("raw file: variable line %q", line)
			}
			names = append(names, f[1])
		case section == "values":
			f := strings.Fields(line)
			if len(f) == 0 {
				continue
			}
			idx := len(vals)
			if idx >= len(names) {
				break
			}
			v, err := strconv.ParseFloat(f[len(f)-1], 64)
			if err != nil {
				return nil, fmt.Errorf("raw file: value %q: %w", line, err)
			}
			vals[names[idx]] = v
		}
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("raw file: %w", err)
	}
	if nvars == 0 || len(vals) != nvars {
		return nil, fmt.Errorf("raw file: %d of %d values read", len(vals), nvars)
	}
	return vals, nil
}

// lookup finds an alias in a raw file's variables; ngspice writes a `let`
// copy of a node voltage as v(alias) and of a current as i(alias).
func lookup(vals map[string]float64, alias string) (float64, bool) {
	for _, n := range []string{alias, "v(" + alias + ")", "i(" + alias + ")"} {
		if v, ok := vals[n]; ok {
			return v, true
		}
	}
	return 0, false
}

func tail(s string) string {
	const n = 600
	if len(s) > n {
		return "..." + s[len(s)-n:]
	}
	return s
}
