package picker

import "biasbin/solver"

// rivals sets the best build of each other searched topology against
// first, the overall first candidate: for each, the score term in which
// it trails the most once weighted (Rival.Term).
func rivals(s settings, first Candidate, best map[solver.Topology]fin) []Rival {
	var out []Rival
	for _, t := range s.topos {
		if t == first.Topology {
			continue
		}
		r := Rival{Topology: t}
		if f, ok := best[t]; ok {
			c := f.c
			r.Best = &c
			r.Failing = len(c.Failing) > 0
			r.Term = trailingTerm(s.w, first.Terms, c.Terms)
		}
		out = append(out, r)
	}
	return out
}

// trailingTerm names the term whose weighted value in b exceeds a's by the
// most ("" when none exceeds it).
func trailingTerm(w Weights, a, b Terms) string {
	name, most := "", 0.0
	for _, t := range []struct {
		name      string
		w, ta, tb float64
	}{
		{"qpoint", w.QPoint, a.QPoint, b.QPoint},
		{"emitter", w.Emitter, a.Emitter, b.Emitter},
		{"beta", w.Beta, a.Beta, b.Beta},
		{"headroom", w.Headroom, a.Headroom, b.Headroom},
		{"utilization", w.Utilization, a.Utilization, b.Utilization},
		{"yield", w.Yield, a.Yield, b.Yield},
		{"parts", w.Parts, a.Parts, b.Parts},
	} {
		if d := t.w * (t.tb - t.ta); d > most {
			name, most = t.name, d
		}
	}
	return name
}
