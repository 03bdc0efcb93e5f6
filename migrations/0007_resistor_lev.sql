-- 0007_resistor_lev: each resistor line may state its limiting element
-- voltage (lev_v, IEC 60115-1 term; 0 = not stated, the default by power
-- rating applies), the trade's metal oxide and cermet technologies are
-- accepted, and every line may carry the maker's part number.
--
-- SQLite cannot change a CHECK constraint in place, so the resistors table
-- is rebuilt with its rows copied across unchanged.

CREATE TABLE resistors_new (
    part_id       INTEGER PRIMARY KEY,
    kind          TEXT NOT NULL DEFAULT 'resistor' CHECK (kind = 'resistor'),
    ohm           REAL NOT NULL CHECK (ohm > 0 AND ohm < 1e13),
    tol           REAL NOT NULL CHECK (tol > 0 AND tol < 1),
    rated_w       REAL NOT NULL CHECK (rated_w > 0 AND rated_w < 1e6),
    knee_c        REAL NOT NULL CHECK (knee_c > -273.15 AND knee_c < 1000),
    max_c         REAL NOT NULL CHECK (max_c > knee_c AND max_c < 1000),
    tcr_ppm_per_k REAL NOT NULL CHECK (abs(tcr_ppm_per_k) < 1e5),
    tech          TEXT NOT NULL CHECK (tech IN ('thick film', 'thin film', 'metal film', 'carbon film', 'wirewound',
                                                'metal oxide', 'cermet')),
    lev_v         REAL NOT NULL DEFAULT 0 CHECK (lev_v >= 0 AND lev_v < 1e6),
    FOREIGN KEY (part_id, kind) REFERENCES parts (id, kind) ON DELETE CASCADE
);

INSERT INTO resistors_new (part_id, kind, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech)
    SELECT part_id, kind, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech FROM resistors;

DROP TABLE resistors;
ALTER TABLE resistors_new RENAME TO resistors;
CREATE INDEX resistors_by_value ON resistors (ohm);

ALTER TABLE parts ADD COLUMN part_number TEXT NOT NULL DEFAULT '';
