-- Manufacturing tolerances: a part may state its own (NULL = not stated),
-- and the catalog keeps the defaults for parts that state none. See
-- optics.Tolerances for what each means.
ALTER TABLE parts ADD COLUMN efl_tol_pct REAL CHECK (efl_tol_pct >= 0);           -- focal length, % of the EFL
ALTER TABLE parts ADD COLUMN thickness_tol_mm REAL CHECK (thickness_tol_mm >= 0); -- centre thickness of each element
ALTER TABLE parts ADD COLUMN index_tol REAL CHECK (index_tol >= 0);               -- index of each glass
ALTER TABLE parts ADD COLUMN radius_tol_pct REAL CHECK (radius_tol_pct >= 0);     -- each radius on its own, %

-- Catalog-wide settings, one value per key: 'efl_tol_pct',
-- 'thickness_tol_mm', 'index_tol', 'radius_tol_pct' are the tolerances of
-- a part that states none; a key absent takes the program's default.
CREATE TABLE settings (
    key   TEXT PRIMARY KEY,
    value REAL NOT NULL
) WITHOUT ROWID;
