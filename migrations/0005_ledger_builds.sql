-- 0005_ledger_builds: the quantity ledger, builds (runs that took parts out
-- of stock), their bring-up readings and the kept pick results.
--
-- Every change of parts.qty writes one ledger row through the triggers
-- below, whatever statement made it, so the quantities can always be
-- rebuilt from the ledger. The write that changes a quantity names its
-- reason (and build) in ledger_cause, a one-row table it fills at the start
-- of its transaction and empties before committing; a change made without
-- a cause is still recorded, as 'unrecorded'. Existing quantities become
-- the opening rows. A line's rows stay after the line is removed (the
-- removal row brings it to 0), so ledger.line has no foreign key.

CREATE TABLE builds (
    id        INTEGER PRIMARY KEY AUTOINCREMENT,
    candidate TEXT    NOT NULL CHECK (candidate <> ''),
    boards    INTEGER NOT NULL CHECK (typeof(boards) = 'integer' AND boards >= 1),
    state     TEXT    NOT NULL DEFAULT 'open' CHECK (state IN ('open', 'closed', 'cancelled')),
    created   TEXT    NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')),
    ended     TEXT,
    note      TEXT    NOT NULL DEFAULT '',
    plan      TEXT    NOT NULL DEFAULT '{}' CHECK (json_valid(plan)),
    CHECK ((state = 'open') = (ended IS NULL))
);

CREATE TABLE build_parts (
    build     INTEGER NOT NULL REFERENCES builds (id),
    line      INTEGER NOT NULL,
    kind      TEXT    NOT NULL CHECK (kind IN ('resistor', 'transistor')),
    ohm       REAL    NOT NULL DEFAULT 0,
    label     TEXT    NOT NULL DEFAULT '',
    bin       TEXT    NOT NULL DEFAULT '',
    per_board INTEGER NOT NULL CHECK (per_board >= 1),
    taken     INTEGER NOT NULL CHECK (taken >= 0),
    PRIMARY KEY (build, line)
) WITHOUT ROWID;

CREATE INDEX build_parts_by_line ON build_parts (line, build);

CREATE TABLE build_boards (
    build    INTEGER NOT NULL REFERENCES builds (id),
    board    INTEGER NOT NULL CHECK (board >= 1),
    time     TEXT    NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')),
    vb_v     REAL    NOT NULL,
    ve_v     REAL    NOT NULL,
    vc_v     REAL    NOT NULL,
    verdict  TEXT    NOT NULL,
    detail   TEXT    NOT NULL DEFAULT '{}' CHECK (json_valid(detail)),
    PRIMARY KEY (build, board)
) WITHOUT ROWID;

CREATE TABLE picks (
    candidate TEXT NOT NULL PRIMARY KEY CHECK (candidate <> ''),
    created   TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')),
    plan      TEXT NOT NULL CHECK (json_valid(plan))
) WITHOUT ROWID;

CREATE INDEX picks_by_age ON picks (created);

CREATE TABLE ledger (
    id        INTEGER PRIMARY KEY AUTOINCREMENT,
    time      TEXT    NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ', 'now')),
    line      INTEGER NOT NULL,
    delta     INTEGER NOT NULL,
    qty_after INTEGER NOT NULL CHECK (qty_after >= 0),
    reason    TEXT    NOT NULL CHECK (reason IN
        ('opening', 'add', 'import', 'adjust', 'count', 'build', 'cancel', 'remove', 'unrecorded')),
    build     INTEGER REFERENCES builds (id)
);

CREATE INDEX ledger_by_line ON ledger (line, id);
CREATE INDEX ledger_by_build ON ledger (build, id) WHERE build IS NOT NULL;

CREATE TABLE ledger_cause (
    one    INTEGER PRIMARY KEY CHECK (one = 1),
    reason TEXT    NOT NULL,
    build  INTEGER
);

INSERT INTO ledger (line, delta, qty_after, reason)
    SELECT id, qty, qty, 'opening' FROM parts WHERE qty <> 0 ORDER BY id;

CREATE TRIGGER ledger_on_insert AFTER INSERT ON parts WHEN NEW.qty <> 0
BEGIN
    INSERT INTO ledger (line, delta, qty_after, reason, build)
    VALUES (NEW.id, NEW.qty, NEW.qty,
            coalesce((SELECT reason FROM ledger_cause), 'unrecorded'),
            (SELECT build FROM ledger_cause));
END;

CREATE TRIGGER ledger_on_update AFTER UPDATE OF qty ON parts WHEN NEW.qty <> OLD.qty
BEGIN
    INSERT INTO ledger (line, delta, qty_after, reason, build)
    VALUES (NEW.id, NEW.qty - OLD.qty, NEW.qty,
            coalesce((SELECT reason FROM ledger_cause), 'unrecorded'),
            (SELECT build FROM ledger_cause));
END;

CREATE TRIGGER ledger_on_delete AFTER DELETE ON parts WHEN OLD.qty <> 0
BEGIN
    INSERT INTO ledger (line, delta, qty_after, reason, build)
    VALUES (OLD.id, -OLD.qty, 0,
            coalesce((SELECT reason FROM ledger_cause), 'unrecorded'),
            (SELECT build FROM ledger_cause));
END;
