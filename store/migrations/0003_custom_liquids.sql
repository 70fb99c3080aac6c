-- User-defined liquids. body is the fluid.CustomSpec JSON (SI, unit in each
-- name); cases embed a copy of it, so a case never depends on this row.
CREATE TABLE custom_liquids (
    id          TEXT    PRIMARY KEY,        -- the liquid id cases name in "fluid"
    name        TEXT    NOT NULL,
    revision    INTEGER NOT NULL,
    body        TEXT    NOT NULL,
    created_at  TEXT    NOT NULL,           -- RFC 3339 UTC
    updated_at  TEXT    NOT NULL
);
CREATE INDEX custom_liquids_name ON custom_liquids(name);
