-- 0002_tags: free tags on stock lines (approved, rohs, reel ...), so a search
-- can be restricted to an approved parts list. Tags are stored lower-case,
-- without spaces, commas or semicolons.

CREATE TABLE part_tags (
    part_id INTEGER NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
    tag     TEXT    NOT NULL CHECK (
        tag <> '' AND tag = lower(tag) AND length(tag) <= 64
        AND instr(tag, ' ') = 0 AND instr(tag, ';') = 0 AND instr(tag, ',') = 0),
    PRIMARY KEY (part_id, tag)
) WITHOUT ROWID;

CREATE INDEX part_tags_by_tag ON part_tags (tag, part_id);
