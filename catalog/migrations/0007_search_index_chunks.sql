-- Migration 7: the search index in chunks. Instead of one row per part,
-- one row per chunk of 4,096 part ids (chunk = part id / 4096), holding
-- the packed records of its parts in the order of their ids
-- (catalog/index.go documents the layout), so that `find` reads the whole
-- index in a few large rows. Still derived data: rebuilt from parts,
-- surfaces and glasses inside every transaction that changes them, and by
-- the program right after this migration. parts is the number of records
-- in the chunk.
DROP TABLE search_index;
CREATE TABLE search_index (
    chunk   INTEGER PRIMARY KEY,
    parts   INTEGER NOT NULL,
    records BLOB NOT NULL
);
