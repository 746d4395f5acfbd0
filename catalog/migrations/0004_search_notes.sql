-- Saved searches keep what find printed besides the results (why nothing
-- met the requirement, the nearest misses, the solver's notes: the JSON
-- object "outcome"), a short note of the user's, and how many results they
-- hold, so that listing them reads no result JSON. The table is rebuilt
-- with AUTOINCREMENT so that the number of a removed search is never given
-- to another (a script's "request 7" must not reach a different search).
CREATE TABLE searches_v2 (
    id           INTEGER PRIMARY KEY AUTOINCREMENT,
    kind         TEXT NOT NULL,
    requirement  TEXT NOT NULL,
    results      TEXT NOT NULL,
    outcome      TEXT NOT NULL DEFAULT '{}',
    result_count INTEGER NOT NULL DEFAULT 0,
    note         TEXT NOT NULL DEFAULT '',
    created_at   TEXT NOT NULL -- RFC 3339, UTC
);
INSERT INTO searches_v2 (id, kind, requirement, results, result_count, created_at)
SELECT id, kind, requirement, results,
       CASE WHEN json_valid(results) THEN json_array_length(results) ELSE 0 END,
       created_at
FROM searches;
DROP TABLE searches;
ALTER TABLE searches_v2 RENAME TO searches;
