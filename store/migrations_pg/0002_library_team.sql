-- PostgreSQL twin of migrations/0002_library_team.sql: a stable uid per
-- case (32 lower-case hex digits, as SQLite's randomblob gives), filled in
-- by a column default instead of a trigger.
ALTER TABLE cases ADD COLUMN uid TEXT COLLATE "C";
UPDATE cases SET uid = replace(gen_random_uuid()::text, '-', '') WHERE uid IS NULL;
ALTER TABLE cases ALTER COLUMN uid SET DEFAULT replace(gen_random_uuid()::text, '-', '');
CREATE UNIQUE INDEX cases_uid ON cases(uid);

-- The library's orders and filters (see the SQLite migration); the name
-- order folds case with lower(), as the store's PostgreSQL dialect sorts.
CREATE INDEX cases_live_updated ON cases(deleted_at, updated_at DESC, id DESC);
CREATE INDEX cases_live_name ON cases(deleted_at, lower(name), id);
CREATE INDEX cases_fluid ON cases(fluid, deleted_at);
CREATE INDEX cases_family ON cases(family, deleted_at);
CREATE INDEX cases_checksum ON cases(checksum);
