-- PostgreSQL twin of migrations/0003_custom_liquids.sql.
CREATE TABLE custom_liquids (
    id          TEXT    COLLATE "C" PRIMARY KEY, -- the liquid id cases name in "fluid"
    name        TEXT    COLLATE "C" NOT NULL,
    revision    INTEGER NOT NULL,
    body        TEXT    NOT NULL,
    created_at  TEXT    COLLATE "C" NOT NULL,    -- RFC 3339 UTC
    updated_at  TEXT    COLLATE "C" NOT NULL
);
CREATE INDEX custom_liquids_name ON custom_liquids(lower(name));
