-- Migration 1: the first schema of the cardinal catalog.
-- Lengths in mm, wavelengths in nm. See catalog/doc.go and the README
-- section "The catalog file" for what each table holds.

PRAGMA application_id = 1128354372; -- 0x43415244, "CARD": marks the file as ours

-- One row per stock part, keyed by supplier and part name.
CREATE TABLE parts (
    id                   INTEGER PRIMARY KEY,
    supplier             TEXT NOT NULL CHECK (supplier <> ''),
    part                 TEXT NOT NULL CHECK (part <> ''),
    description          TEXT NOT NULL DEFAULT '',
    diameter_mm          REAL NOT NULL CHECK (diameter_mm > 0),
    clear_aperture_mm    REAL NOT NULL DEFAULT 0 CHECK (clear_aperture_mm >= 0), -- as stated; 0 = not stated
    kind                 TEXT NOT NULL CHECK (kind IN ('singlet', 'cemented', 'air-spaced')),
    stated_efl_mm        REAL,  -- NULL = not stated
    stated_bfd_mm        REAL,
    stated_edge_mm       REAL,
    stated_wavelength_nm REAL,  -- NULL = 587.6 nm
    price                REAL,  -- per piece, NULL = not stated
    currency             TEXT NOT NULL DEFAULT '',
    url                  TEXT NOT NULL DEFAULT '',
    notes                TEXT NOT NULL DEFAULT '',
    fingerprint          TEXT NOT NULL, -- hash of every stored field, to tell an unchanged re-import
    UNIQUE (supplier, part)
);

-- The prescription, surface by surface in light order.
CREATE TABLE surfaces (
    part_id      INTEGER NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
    idx          INTEGER NOT NULL CHECK (idx >= 1), -- 1 = first surface the light meets
    radius_mm    REAL,                              -- NULL = plane
    conic        REAL NOT NULL DEFAULT 0,
    a4           REAL NOT NULL DEFAULT 0,
    a6           REAL NOT NULL DEFAULT 0,
    a8           REAL NOT NULL DEFAULT 0,
    a10          REAL NOT NULL DEFAULT 0,
    a12          REAL NOT NULL DEFAULT 0,
    a14          REAL NOT NULL DEFAULT 0,
    a16          REAL NOT NULL DEFAULT 0,
    thickness_mm REAL,                 -- to the next surface; NULL on the last
    glass        TEXT COLLATE NOCASE,  -- material to the next surface; NULL on the last
    PRIMARY KEY (part_id, idx)
) WITHOUT ROWID;
CREATE INDEX surfaces_glass ON surfaces (glass);

-- The user's own glasses, as the glass CSV gives them; the built-in glasses
-- and six-digit codes are not stored. coefficients is a JSON array in the
-- order of the formula: sellmeier B1, C1, B2, C2, ... (C in square
-- micrometres); cauchy A0, A1, ... (micrometres); constant n; abbe nd, Vd.
CREATE TABLE glasses (
    name         TEXT PRIMARY KEY COLLATE NOCASE,
    formula      TEXT NOT NULL CHECK (formula IN ('sellmeier', 'cauchy', 'constant', 'abbe')),
    coefficients TEXT NOT NULL,
    min_nm       REAL NOT NULL DEFAULT 0, -- range of the formula; 0 and 0 = not stated
    max_nm       REAL NOT NULL DEFAULT 0,
    source       TEXT NOT NULL DEFAULT ''
);

-- First-order properties of each part in each orientation at the reference
-- wavelength, kept in step with parts, surfaces and glasses by the program.
-- reversed = 1 is the part turned around. Front positions from the first
-- vertex, back positions from the last, positive toward the image.
CREATE TABLE computed (
    part_id           INTEGER NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
    reversed          INTEGER NOT NULL CHECK (reversed IN (0, 1)),
    wavelength_nm     REAL NOT NULL,
    power_per_mm      REAL NOT NULL, -- 0 for an afocal part
    efl_mm            REAL,          -- NULL for an afocal part
    bfd_mm            REAL,          -- last vertex to F'
    ffd_mm            REAL,          -- first vertex to F
    p_mm              REAL,          -- first vertex to P
    p_prime_mm        REAL,          -- last vertex to P'
    length_mm         REAL NOT NULL, -- first to last vertex
    diameter_mm       REAL NOT NULL,
    clear_aperture_mm REAL NOT NULL, -- as used: stated, or 90 % of the diameter
    PRIMARY KEY (part_id, reversed)
);
CREATE INDEX computed_efl ON computed (efl_mm);
CREATE INDEX computed_power ON computed (power_per_mm);
CREATE INDEX computed_diameter ON computed (diameter_mm);

-- Problems that do not stop a part being used (a stated EFL off by more
-- than 1 %, ...), in the order found. computed = 1 marks the warnings that
-- come from comparing stated values with the prescription; they are worked
-- out again when a glass changes.
CREATE TABLE warnings (
    part_id  INTEGER NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
    seq      INTEGER NOT NULL,
    message  TEXT NOT NULL,
    computed INTEGER NOT NULL DEFAULT 0 CHECK (computed IN (0, 1)),
    PRIMARY KEY (part_id, seq)
) WITHOUT ROWID;

-- The lenses at hand.
CREATE TABLE drawer (
    part_id  INTEGER PRIMARY KEY REFERENCES parts (id) ON DELETE CASCADE,
    quantity INTEGER NOT NULL CHECK (quantity >= 0),
    location TEXT NOT NULL DEFAULT ''
);

-- Saved searches: the requirement and the results as JSON, and when.
CREATE TABLE searches (
    id          INTEGER PRIMARY KEY,
    kind        TEXT NOT NULL,
    requirement TEXT NOT NULL,
    results     TEXT NOT NULL,
    created_at  TEXT NOT NULL -- RFC 3339, UTC
);

-- One readable row per part, for people using the sqlite3 shell.
CREATE VIEW part_summary AS
SELECT p.supplier || ':' || p.part               AS id,
       p.kind                                    AS kind,
       p.description                             AS description,
       p.diameter_mm                             AS diameter_mm,
       c.clear_aperture_mm                       AS clear_aperture_mm,
       c.length_mm                               AS length_mm,
       round(c.efl_mm, 3)                        AS efl_mm,
       round(c.bfd_mm, 3)                        AS bfd_mm,
       round(c.ffd_mm, 3)                        AS ffd_mm,
       round(c.p_mm, 3)                          AS p_mm,
       round(c.p_prime_mm, 3)                    AS p_prime_mm,
       round(c.power_per_mm * 1000, 3)           AS power_dpt,
       coalesce(d.quantity, 0)                   AS in_drawer,
       coalesce(d.location, '')                  AS location,
       (SELECT count(*) FROM warnings w WHERE w.part_id = p.id) AS warnings
FROM parts p
JOIN computed c ON c.part_id = p.id AND c.reversed = 0
LEFT JOIN drawer d ON d.part_id = p.id;
