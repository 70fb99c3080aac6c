-- A stable identity for each case that survives export and import, so a
-- bundle brought back to the library it came from (or to a colleague's)
-- recognises the cases it already holds.
ALTER TABLE cases ADD COLUMN uid TEXT;
UPDATE cases SET uid = lower(hex(randomblob(16))) WHERE uid IS NULL;
CREATE UNIQUE INDEX cases_uid ON cases(uid);

-- New rows get a uid without every writer having to pick one; an import
-- overwrites it with the bundle's uid inside the same transaction.
CREATE TRIGGER cases_uid_default AFTER INSERT ON cases WHEN NEW.uid IS NULL
BEGIN
    UPDATE cases SET uid = lower(hex(randomblob(16))) WHERE id = NEW.id;
END;

-- The library lists live or trashed cases in one of three orders, filtered
-- by liquid or atomizer family; these indexes serve each order and filter
-- without sorting the whole table (see the benchmark in server/).
CREATE INDEX cases_live_updated ON cases(deleted_at, updated_at DESC, id DESC);
CREATE INDEX cases_live_name ON cases(deleted_at, name COLLATE NOCASE, id);
CREATE INDEX cases_fluid ON cases(fluid, deleted_at);
CREATE INDEX cases_family ON cases(family, deleted_at);
CREATE INDEX cases_checksum ON cases(checksum);
