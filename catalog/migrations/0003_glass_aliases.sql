-- Migration 3: glass aliases, the names supplier sheets use for a glass.
-- Every import resolves a name here after the built-in and the user's
-- glasses; a part stores the target, never the alias.
CREATE TABLE glass_aliases (
    name   TEXT PRIMARY KEY COLLATE NOCASE,
    target TEXT NOT NULL -- a six-digit glass code, a built-in glass or one of the user's glasses
);
