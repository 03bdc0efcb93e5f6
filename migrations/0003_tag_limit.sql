-- 0003_tag_limit: a stock line carries at most 16 tags (store.MaxTags), so a
-- hostile or careless file cannot bury a line under thousands of them. The
-- store checks first; this trigger keeps the rule for every writer.
-- Lines that already carry more keep them; only new tags are refused.

CREATE TRIGGER part_tags_at_most_16 BEFORE INSERT ON part_tags
WHEN (SELECT count(*) FROM part_tags WHERE part_id = NEW.part_id) >= 16
    AND NOT EXISTS (SELECT 1 FROM part_tags WHERE part_id = NEW.part_id AND tag = NEW.tag)
BEGIN
    SELECT RAISE(ABORT, 'a stock line carries at most 16 tags');
END;
