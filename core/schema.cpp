// SPDX-License-Identifier: MIT
#include "core/schema.h"

namespace slatewise::core {

namespace {

// Version 1: the data and imported runs.
constexpr std::string_view kV1 = R"sql(
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
INSERT INTO meta(key, value) VALUES ('schema_version', '1');
)sql";

// Version 2: run provenance for fitted and re-ranked runs, stored evaluations,
// comparisons and model fit logs.
constexpr std::string_view kV1toV2 = R"sql(
ALTER TABLE runs ADD COLUMN kind TEXT NOT NULL DEFAULT 'imported' CHECK (kind IN ('imported','fitted','reranked'));
ALTER TABLE runs ADD COLUMN parent_run_id INTEGER REFERENCES runs(run_id) ON DELETE SET NULL;
ALTER TABLE runs ADD COLUMN method TEXT;
CREATE INDEX train_by_user ON train(user_id);
CREATE TABLE evaluations(
  evaluation_id INTEGER PRIMARY KEY,
  run_id        INTEGER NOT NULL REFERENCES runs(run_id) ON DELETE CASCADE,
  settings      TEXT NOT NULL,
  computed_at   TEXT NOT NULL,
  summary       TEXT NOT NULL,
  UNIQUE(run_id, settings)
);
CREATE TABLE user_results(
  evaluation_id    INTEGER NOT NULL REFERENCES evaluations(evaluation_id) ON DELETE CASCADE,
  user_id          INTEGER NOT NULL REFERENCES users(user_id),
  n_withheld       INTEGER NOT NULL,
  n_relevant       INTEGER NOT NULL,
  n_train          INTEGER NOT NULL,
  warning_count    INTEGER NOT NULL,
  rmse REAL, mae REAL, mean_error REAL,
  precision REAL, recall REAL, ap REAL, rr REAL, ndcg REAL, ndcg_graded REAL, heldout_topk REAL,
  ild REAL, novelty REAL, popularity_lift REAL, calibration_kl REAL, series_share REAL,
  order_violations REAL, burst_echo REAL, seen_in_list REAL,
  PRIMARY KEY(evaluation_id, user_id)
) WITHOUT ROWID;
CREATE TABLE user_warnings(
  evaluation_id INTEGER NOT NULL REFERENCES evaluations(evaluation_id) ON DELETE CASCADE,
  user_id       INTEGER NOT NULL REFERENCES users(user_id),
  code          TEXT NOT NULL,
  severity      TEXT NOT NULL CHECK (severity IN ('info','warn','severe')),
  value         REAL,
  threshold     REAL,
  message       TEXT NOT NULL
);
CREATE INDEX user_warnings_by_user ON user_warnings(evaluation_id, user_id);
CREATE TABLE comparisons(
  comparison_id    INTEGER PRIMARY KEY,
  base_run_id      INTEGER NOT NULL REFERENCES runs(run_id) ON DELETE CASCADE,
  candidate_run_id INTEGER NOT NULL REFERENCES runs(run_id) ON DELETE CASCADE,
  settings         TEXT NOT NULL,
  computed_at      TEXT NOT NULL,
  result           TEXT NOT NULL,
  UNIQUE(base_run_id, candidate_run_id, settings)
);
CREATE TABLE fit_log(
  run_id         INTEGER NOT NULL REFERENCES runs(run_id) ON DELETE CASCADE,
  iteration      INTEGER NOT NULL,
  train_rmse     REAL,
  withheld_rmse  REAL,
  PRIMARY KEY(run_id, iteration)
) WITHOUT ROWID;
UPDATE meta SET value = '2' WHERE key = 'schema_version';
)sql";

// Version 3: each run records its row counts when it is stored, so listing the runs of a
// large workspace reads three numbers instead of scanning millions of list rows.
constexpr std::string_view kV2toV3 = R"sql(
ALTER TABLE runs ADD COLUMN score_count INTEGER;
ALTER TABLE runs ADD COLUMN list_rows INTEGER;
ALTER TABLE runs ADD COLUMN list_users INTEGER;
UPDATE runs SET
  score_count = (SELECT count(*) FROM run_scores s WHERE s.run_id = runs.run_id),
  list_rows = (SELECT count(*) FROM run_lists l WHERE l.run_id = runs.run_id),
  list_users = (SELECT count(*) FROM run_lists l WHERE l.run_id = runs.run_id AND l.rank = 1);
UPDATE meta SET value = '3' WHERE key = 'schema_version';
)sql";

} // namespace

std::string_view schemaVersion1() { return kV1; }

const std::vector<std::string_view>& migrations()
{
    static const std::vector<std::string_view> steps{kV1toV2, kV2toV3};
    return steps;
}

} // namespace slatewise::core
