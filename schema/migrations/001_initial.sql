-- ferrum schema, version 1.
-- Every stored value knows the file and line it came from (provenance).
-- Times are stored as ISO 8601 text in UTC for import times, as integer day
-- numbers (days since 1970-01-01) for dates, and as integer UTC seconds for
-- load-series timestamps.

-- Every file ferrum has taken from a party folder, accepted or not.
CREATE TABLE files (
  id            INTEGER PRIMARY KEY,
  sha256        TEXT    NOT NULL,
  party         TEXT    NOT NULL,
  original_name TEXT    NOT NULL,
  kind          TEXT,                 -- units_register, oil_lab, infrared, load_series, inspection
  status        TEXT    NOT NULL,     -- accepted, rejected, duplicate
  rows          INTEGER NOT NULL DEFAULT 0,
  problem_count INTEGER NOT NULL DEFAULT 0,
  received_at   TEXT    NOT NULL,     -- UTC, ISO 8601
  stored_as     TEXT,                 -- path relative to the site root (archive/... or quarantine/...)
  receipt_json  TEXT    NOT NULL
);
CREATE INDEX files_sha ON files(sha256, status);

CREATE TABLE units (
  unit_key            INTEGER PRIMARY KEY,
  unit_id             TEXT NOT NULL UNIQUE,
  site                TEXT NOT NULL,
  serial              TEXT,
  rated_mva           REAL NOT NULL,
  hv_kv               REAL NOT NULL,
  lv_kv               REAL NOT NULL,
  cooling             TEXT NOT NULL,
  year_built          INTEGER NOT NULL,
  phases              INTEGER NOT NULL DEFAULT 3,
  vector_group        TEXT,
  oil_type            TEXT NOT NULL DEFAULT 'mineral',
  paper               TEXT NOT NULL DEFAULT 'kraft',
  oil_volume_l        REAL,
  criticality         INTEGER NOT NULL DEFAULT 3,
  customers_served    INTEGER,
  top_oil_rise_k      REAL,
  hot_spot_gradient_k REAL,
  load_loss_ratio     REAL,
  oil_treated_day     INTEGER,
  file_id             INTEGER NOT NULL REFERENCES files(id),
  line                INTEGER NOT NULL
);

-- Earlier versions of a unit's register row, kept when a new register replaces them.
CREATE TABLE unit_history (
  id          INTEGER PRIMARY KEY,
  unit_id     TEXT NOT NULL,
  replaced_at TEXT NOT NULL,
  replaced_by_file INTEGER NOT NULL REFERENCES files(id),
  old_row_json TEXT NOT NULL
);

CREATE TABLE oil_samples (
  id            INTEGER PRIMARY KEY,
  unit_key      INTEGER NOT NULL REFERENCES units(unit_key),
  sample_day    INTEGER NOT NULL,
  lab_ref       TEXT NOT NULL DEFAULT '',
  sample_point  TEXT NOT NULL DEFAULT '',
  breakdown_method TEXT NOT NULL DEFAULT '',
  superseded_by INTEGER REFERENCES oil_samples(id),  -- a corrected re-issue
  file_id       INTEGER NOT NULL REFERENCES files(id),
  line          INTEGER NOT NULL
);
CREATE INDEX oil_samples_unit ON oil_samples(unit_key, sample_day);

-- One row per test result of a sample. state: 1 measured, 2 below detection
-- limit (value = the limit, NULL when not stated).
CREATE TABLE oil_values (
  sample_id INTEGER NOT NULL REFERENCES oil_samples(id),
  test      TEXT    NOT NULL,   -- h2_ppm, ..., furan_2fal_ppb (stored unit)
  state     INTEGER NOT NULL,
  value     REAL,
  original  TEXT,               -- original column/unit when converted, e.g. 'furan_2fal_ppm'
  PRIMARY KEY (sample_id, test)
) WITHOUT ROWID;

CREATE TABLE load_points (
  unit_key  INTEGER NOT NULL,
  ts        INTEGER NOT NULL,   -- UTC seconds
  load_pu   REAL    NOT NULL,
  ambient_c REAL,
  top_oil_c REAL,
  file_id   INTEGER NOT NULL,
  line      INTEGER NOT NULL,
  PRIMARY KEY (unit_key, ts)
) WITHOUT ROWID;

CREATE TABLE infrared_scans (
  id          INTEGER PRIMARY KEY,
  unit_key    INTEGER NOT NULL REFERENCES units(unit_key),
  survey_day  INTEGER NOT NULL,
  component   TEXT NOT NULL,
  spot_c      REAL NOT NULL,
  reference_c REAL,
  ambient_c   REAL,
  load_pct    REAL,
  emissivity  REAL,
  image_ref   TEXT,
  note        TEXT,
  file_id     INTEGER NOT NULL REFERENCES files(id),
  line        INTEGER NOT NULL
);
CREATE INDEX infrared_unit ON infrared_scans(unit_key, survey_day);

CREATE TABLE inspections (
  id              INTEGER PRIMARY KEY,
  unit_key        INTEGER NOT NULL REFERENCES units(unit_key),
  inspection_day  INTEGER NOT NULL,
  item            TEXT NOT NULL,
  rating          TEXT NOT NULL,
  note            TEXT,
  inspector       TEXT,
  file_id         INTEGER NOT NULL REFERENCES files(id),
  line            INTEGER NOT NULL
);
CREATE INDEX inspections_unit ON inspections(unit_key, inspection_day);

-- Conversions applied on import, per file and column (provenance of units).
CREATE TABLE conversions (
  file_id   INTEGER NOT NULL REFERENCES files(id),
  column    TEXT NOT NULL,
  original_unit TEXT NOT NULL,
  stored_as TEXT NOT NULL,
  PRIMARY KEY (file_id, column)
) WITHOUT ROWID;

CREATE TABLE alerts (
  id         INTEGER PRIMARY KEY,
  unit_id    TEXT NOT NULL,
  kind       TEXT NOT NULL,
  raised_at  TEXT NOT NULL,
  text       TEXT NOT NULL,
  acknowledged_at TEXT
);

-- Small key/value facts the daemon keeps about itself (last bundle, ...).
CREATE TABLE daemon_state (
  key   TEXT PRIMARY KEY,
  value TEXT NOT NULL
) WITHOUT ROWID;
