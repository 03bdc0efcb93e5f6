package picture

import "sort"

// convexHull returns the convex hull of pts counter-clockwise, starting at
// the lowest VCE (lowest IC on a tie), without repeating the first point
// and without collinear points (Andrew's monotone chain). Fewer than three
// distinct points give those points.
func convexHull(pts []Point) []Point {
	p := append([]Point(nil), pts...)
	sort.Slice(p, func(i, j int) bool {
		if p[i].VCE_V != p[j].VCE_V {
			return p[i].VCE_V < p[j].VCE_V
		}
		return p[i].IC_A < p[j].IC_A
	})
	uniq := p[:0]
	for i, q := range p {
		if i == 0 || q != p[i-1] {
			uniq = append(uniq, q)
		}
	}
	p = uniq
	if len(p) < 3 {
		return p
	}
	h := make([]Point, 0, 2*len(p))
	for _, q := range p { // lower hull
		for len(h) >= 2 && cross(h[len(h)-2], h[len(h)-1], q) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, q)
	}
	lower := len(h) + 1
	for i := len(p) - 2; i >= 0; i-- { // upper hull
		q := p[i]
		for len(h) >= lower && cross(h[len(h)-2], h[len(h)-1], q) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, q)
	}
	return h[:len(h)-1]
}

// cross is the z component of (a→b) × (a→c): positive when c lies to the
// left of the line from a to b.
func cross(a, b, c Point) float64 {
	return (b.VCE_V-a.VCE_V)*(c.IC_A-a.IC_A) - (b.IC_A-a.IC_A)*(c.VCE_V-a.VCE_V)
}
