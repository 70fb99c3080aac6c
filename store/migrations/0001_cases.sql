-- Cases and their revisions. A case row holds the newest revision's body so
-- the library lists without a join; every save also appends a revision row.
CREATE TABLE cases (
    id          INTEGER PRIMARY KEY,
    name        TEXT    NOT NULL,
    fluid       TEXT    NOT NULL DEFAULT '',
    model       TEXT    NOT NULL DEFAULT '',
    family      TEXT    NOT NULL DEFAULT '',
    revision    INTEGER NOT NULL,
    body        TEXT    NOT NULL,           -- case JSON, format fogbench-case/1
    checksum    TEXT    NOT NULL,           -- sha256 of body, hex
    parent_id   INTEGER REFERENCES cases(id) ON DELETE SET NULL,
    created_at  TEXT    NOT NULL,           -- RFC 3339 UTC
    updated_at  TEXT    NOT NULL,
    deleted_at  TEXT                        -- in the trash when set
);
CREATE INDEX cases_updated ON cases(updated_at);
CREATE INDEX cases_name ON cases(name);

CREATE TABLE revisions (
    case_id     INTEGER NOT NULL REFERENCES cases(id) ON DELETE CASCADE,
    revision    INTEGER NOT NULL,
    name        TEXT    NOT NULL,
    body        TEXT    NOT NULL,
    checksum    TEXT    NOT NULL,
    author      TEXT    NOT NULL DEFAULT '',
    created_at  TEXT    NOT NULL,
    PRIMARY KEY (case_id, revision)
);

CREATE TABLE case_tags (
    case_id     INTEGER NOT NULL REFERENCES cases(id) ON DELETE CASCADE,
    tag         TEXT    NOT NULL,
    PRIMARY KEY (case_id, tag)
);
CREATE INDEX case_tags_tag ON case_tags(tag);
