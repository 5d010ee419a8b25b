-- ferrum schema, version 6: planners' work status (issue 16). One row per
-- row of a work-status file: the state of one action, matched by its
-- reference "<unit id>/<need>" (analytics/assessment.h, action_reference).
-- A unit's rows are read in date order; the latest row of a reference wins.
CREATE TABLE work_status (
  id          INTEGER PRIMARY KEY,
  unit_key    INTEGER NOT NULL REFERENCES units(unit_key),
  reference   TEXT NOT NULL,
  status      TEXT NOT NULL,        -- 'booked', 'done' or 'cancelled'
  status_day  INTEGER NOT NULL,     -- days since 1970-01-01: booking, completion or cancellation date
  note        TEXT,
  file_id     INTEGER NOT NULL REFERENCES files(id),
  line        INTEGER NOT NULL
);
CREATE INDEX work_status_unit ON work_status(unit_key, status_day);
