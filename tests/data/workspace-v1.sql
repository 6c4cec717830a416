-- A version-1 workspace as Slatewise 0.1 wrote it (schema version 1, before run kinds,
-- stored evaluations and fit logs). tests/core/tst_workspace.cpp builds a file from this
-- text and checks that opening it migrates it to the current version without losing data.
CREATE TABLE meta(
  key   TEXT PRIMARY KEY,
  value TEXT NOT NULL
);
CREATE TABLE genres(
  genre_id INTEGER PRIMARY KEY,
  name     TEXT NOT NULL UNIQUE
);
CREATE TABLE series(
  series_id INTEGER PRIMARY KEY,
  name      TEXT NOT NULL UNIQUE
);
CREATE TABLE items(
  item_id     INTEGER PRIMARY KEY,
  external_id TEXT NOT NULL UNIQUE,
  title       TEXT NOT NULL,
  year        INTEGER,
  series_id   INTEGER REFERENCES series(series_id),
  series_part INTEGER CHECK (series_part IS NULL OR series_part >= 1)
);
CREATE TABLE item_genres(
  item_id  INTEGER NOT NULL REFERENCES items(item_id),
  genre_id INTEGER NOT NULL REFERENCES genres(genre_id),
  PRIMARY KEY(item_id, genre_id)
) WITHOUT ROWID;
CREATE TABLE users(
  user_id     INTEGER PRIMARY KEY,
  external_id TEXT NOT NULL UNIQUE
);
CREATE TABLE train(
  user_id INTEGER NOT NULL REFERENCES users(user_id),
  item_id INTEGER NOT NULL REFERENCES items(item_id),
  rating  REAL NOT NULL,
  ts      INTEGER
);
CREATE TABLE withheld(
  user_id INTEGER NOT NULL REFERENCES users(user_id),
  item_id INTEGER NOT NULL REFERENCES items(item_id),
  rating  REAL NOT NULL,
  ts      INTEGER,
  PRIMARY KEY(user_id, item_id)
) WITHOUT ROWID;
CREATE TABLE runs(
  run_id     INTEGER PRIMARY KEY,
  name       TEXT NOT NULL UNIQUE,
  created_at TEXT NOT NULL,
  settings   TEXT NOT NULL DEFAULT '{}'
);
CREATE TABLE source_files(
  file_id INTEGER PRIMARY KEY,
  run_id  INTEGER REFERENCES runs(run_id) ON DELETE CASCADE,
  role    TEXT NOT NULL CHECK (role IN ('catalog','train','withheld','scores','lists')),
  name    TEXT NOT NULL,
  size    INTEGER NOT NULL,
  sha256  TEXT NOT NULL
);
CREATE TABLE run_scores(
  run_id  INTEGER NOT NULL REFERENCES runs(run_id) ON DELETE CASCADE,
  user_id INTEGER NOT NULL REFERENCES users(user_id),
  item_id INTEGER NOT NULL REFERENCES items(item_id),
  score   REAL NOT NULL,
  PRIMARY KEY(run_id, user_id, item_id)
) WITHOUT ROWID;
CREATE TABLE run_lists(
  run_id  INTEGER NOT NULL REFERENCES runs(run_id) ON DELETE CASCADE,
  user_id INTEGER NOT NULL REFERENCES users(user_id),
  rank    INTEGER NOT NULL CHECK (rank >= 1),
  item_id INTEGER NOT NULL REFERENCES items(item_id),
  score   REAL,
  PRIMARY KEY(run_id, user_id, rank)
) WITHOUT ROWID;
INSERT INTO meta(key, value) VALUES ('schema_version', '1'), ('scale_min', '1'), ('scale_max', '5'),
  ('scale_step', '1'), ('scale_source', 'given'), ('created_at', '2026-01-15T09:00:00Z');
INSERT INTO genres VALUES (0, 'Drama'), (1, 'Comedy'), (2, 'Mystery');
INSERT INTO series VALUES (0, 'Harbour Lights');
INSERT INTO items VALUES (0, 'f1', 'Harbour Lights', 2001, 0, 1), (1, 'f2', 'Harbour Lights Again', 2004, 0, 2),
  (2, 'f3', 'The Tin Lantern', 1990, NULL, NULL);
INSERT INTO item_genres VALUES (0, 0), (0, 2), (1, 0), (2, 1);
INSERT INTO users VALUES (0, 'member-7'), (1, 'member-9');
INSERT INTO train VALUES (0, 2, 4, 1735732800), (0, 0, 5, 1735689600), (1, 2, 2, NULL);
INSERT INTO withheld VALUES (0, 1, 5, 1736000000), (1, 0, 3, 1736100000);
INSERT INTO runs VALUES (1, 'old-run', '2026-01-15T09:05:00Z', '{}');
INSERT INTO source_files VALUES (1, NULL, 'catalog', 'catalog.csv', 120, 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
INSERT INTO run_scores VALUES (1, 0, 1, 4.5), (1, 1, 0, 3.5);
INSERT INTO run_lists VALUES (1, 0, 1, 1, 4.5), (1, 0, 2, 2, 2.0), (1, 1, 1, 0, 3.5);
