-- Migration 2: the search index. One packed record per part holding what
-- the first-order search needs (catalog/index.go documents the layout):
-- derived data, rebuilt from parts, surfaces and glasses inside every
-- transaction that changes them, and by the program right after this
-- migration. The readable tables remain the catalog; this one only makes
-- `find` fast. id_key is SUPPLIER:PART, so that reading the table in key
-- order gives the parts in the order of their names.
CREATE TABLE search_index (
    id_key  TEXT PRIMARY KEY,
    part_id INTEGER NOT NULL UNIQUE REFERENCES parts (id) ON DELETE CASCADE,
    record  BLOB NOT NULL
) WITHOUT ROWID;
