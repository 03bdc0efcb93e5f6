-- 0004_transistor_spreads: optional part-to-part ranges of a transistor
-- line, in SI units, for the Monte Carlo yield and the worst case: VBE(on)
-- at the line's VBE test current and 25 °C (vbe_min_v..vbe_max_v), and the
-- Early voltage (vaf_min_v..vaf_max_v). 0 = not stocked: the solver then
-- takes VBE(on) ± its default spread (common practice) and one Early
-- voltage. Each pair is given whole or not at all.

ALTER TABLE transistors ADD COLUMN vbe_min_v REAL NOT NULL DEFAULT 0
    CHECK (vbe_min_v >= 0 AND vbe_min_v < 10);
ALTER TABLE transistors ADD COLUMN vbe_max_v REAL NOT NULL DEFAULT 0
    CHECK (vbe_max_v >= 0 AND vbe_max_v < 10 AND (vbe_max_v = 0) = (vbe_min_v = 0) AND vbe_max_v >= vbe_min_v);
ALTER TABLE transistors ADD COLUMN vaf_min_v REAL NOT NULL DEFAULT 0
    CHECK (vaf_min_v >= 0 AND vaf_min_v < 1e6);
ALTER TABLE transistors ADD COLUMN vaf_max_v REAL NOT NULL DEFAULT 0
    CHECK (vaf_max_v >= 0 AND vaf_max_v < 1e6 AND (vaf_max_v = 0) = (vaf_min_v = 0) AND vaf_max_v >= vaf_min_v);
