-- 0001_stock: stock lines of resistors and transistors.
--
-- Resistors and transistors share one ID space (parts.id), so a part ID
-- names one line whatever its kind. A detail row must match its part's kind:
-- the composite foreign key (part_id, kind) -> parts (id, kind) enforces it.
-- ident is the line's identity within its kind and bin (resistor: value,
-- tolerance, power, technology; transistor: label); importing the same part
-- into the same bin adds to that line.

CREATE TABLE parts (
    id    INTEGER PRIMARY KEY,
    kind  TEXT    NOT NULL CHECK (kind IN ('resistor', 'transistor')),
    ident TEXT    NOT NULL CHECK (ident <> ''),
    qty   INTEGER NOT NULL CHECK (typeof(qty) = 'integer' AND qty >= 0),
    bin   TEXT    NOT NULL DEFAULT '',
    note  TEXT    NOT NULL DEFAULT '',
    UNIQUE (kind, ident, bin),
    UNIQUE (id, kind)
);

CREATE TABLE resistors (
    part_id       INTEGER PRIMARY KEY,
    kind          TEXT NOT NULL DEFAULT 'resistor' CHECK (kind = 'resistor'),
    ohm           REAL NOT NULL CHECK (ohm > 0 AND ohm < 1e13),
    tol           REAL NOT NULL CHECK (tol > 0 AND tol < 1),
    rated_w       REAL NOT NULL CHECK (rated_w > 0 AND rated_w < 1e6),
    knee_c        REAL NOT NULL CHECK (knee_c > -273.15 AND knee_c < 1000),
    max_c         REAL NOT NULL CHECK (max_c > knee_c AND max_c < 1000),
    tcr_ppm_per_k REAL NOT NULL CHECK (abs(tcr_ppm_per_k) < 1e5),
    tech          TEXT NOT NULL CHECK (tech IN ('thick film', 'thin film', 'metal film', 'carbon film', 'wirewound')),
    FOREIGN KEY (part_id, kind) REFERENCES parts (id, kind) ON DELETE CASCADE
);

CREATE INDEX resistors_by_value ON resistors (ohm);

CREATE TABLE transistors (
    part_id          INTEGER PRIMARY KEY,
    kind             TEXT NOT NULL DEFAULT 'transistor' CHECK (kind = 'transistor'),
    label            TEXT NOT NULL CHECK (label <> ''),
    polarity         TEXT NOT NULL CHECK (polarity IN ('npn', 'pnp')),
    hfe_min          REAL NOT NULL CHECK (hfe_min > 0),
    hfe_max          REAL NOT NULL CHECK (hfe_max >= hfe_min AND hfe_max < 1e6),
    hfe_typ          REAL NOT NULL DEFAULT 0 CHECK (hfe_typ = 0 OR (hfe_typ >= hfe_min AND hfe_typ <= hfe_max)),
    hfe_at_a         REAL NOT NULL DEFAULT 0 CHECK (hfe_at_a >= 0 AND hfe_at_a < 1e4),
    vbe_on_v         REAL NOT NULL CHECK (vbe_on_v > 0 AND vbe_on_v < 10),
    vbe_at_a         REAL NOT NULL CHECK (vbe_at_a > 0 AND vbe_at_a < 1e4),
    vce_sat_v        REAL NOT NULL DEFAULT 0 CHECK (vce_sat_v >= 0 AND vce_sat_v < 100),
    vceo_v           REAL NOT NULL DEFAULT 0 CHECK (vceo_v >= 0 AND vceo_v < 1e5),
    ic_max_a         REAL NOT NULL DEFAULT 0 CHECK (ic_max_a >= 0 AND ic_max_a < 1e4),
    pd25_w           REAL NOT NULL DEFAULT 0 CHECK (pd25_w >= 0 AND pd25_w < 1e6),
    theta_ja_k_per_w REAL NOT NULL DEFAULT 0 CHECK (theta_ja_k_per_w >= 0 AND theta_ja_k_per_w < 1e5),
    tj_max_c         REAL NOT NULL CHECK (tj_max_c > 25 AND tj_max_c < 1000),
    vaf_v            REAL NOT NULL DEFAULT 0 CHECK (vaf_v >= 0 AND vaf_v < 1e6),
    icbo_a           REAL NOT NULL DEFAULT 0 CHECK (icbo_a >= 0 AND icbo_a < 1),
    FOREIGN KEY (part_id, kind) REFERENCES parts (id, kind) ON DELETE CASCADE
);

CREATE INDEX transistors_by_label ON transistors (label);
