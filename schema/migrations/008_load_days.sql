-- Retention of the load series ([store] keep_load_points_years): raw load
-- points older than the limit are replaced by one row per unit and UTC day
-- of thermal summaries (analytics/load_history.h: peak hot spot, peak top
-- oil, ageing consumed, hours above each limit, ...), and by the thermal
-- model's state where the raw points were cut (load_history), so that the
-- thermal assessment reads the same figures after the retention.
CREATE TABLE load_days (
  unit_key                    INTEGER NOT NULL REFERENCES units(unit_key),
  day                         INTEGER NOT NULL,  -- UTC day number
  first_ts                    INTEGER NOT NULL,
  last_ts                     INTEGER NOT NULL,
  covered_h                   REAL    NOT NULL,
  bridged_h                   REAL    NOT NULL,
  ageing_h                    REAL    NOT NULL,
  peak_load_pu                REAL    NOT NULL,
  peak_load_ts                INTEGER NOT NULL,
  peak_hot_spot_c             REAL    NOT NULL,
  peak_hot_spot_ts            INTEGER NOT NULL,
  peak_top_oil_c              REAL    NOT NULL,
  hours_above_nameplate       REAL    NOT NULL,
  hours_above_normal_cyclic   REAL    NOT NULL,
  hours_above_long_emergency  REAL    NOT NULL,
  hours_above_short_emergency REAL    NOT NULL,
  top_oil_excess_k            REAL    NOT NULL,
  top_oil_measurements        INTEGER NOT NULL,
  ambient_from_profile        INTEGER NOT NULL,
  growth_w                    REAL    NOT NULL,  -- load-growth sums (analytics/load_indicators.h GrowthSums)
  growth_x                    REAL    NOT NULL,
  growth_y                    REAL    NOT NULL,
  growth_xx                   REAL    NOT NULL,
  growth_xy                   REAL    NOT NULL,
  PRIMARY KEY (unit_key, day)
);

CREATE TABLE load_history (
  unit_key INTEGER PRIMARY KEY REFERENCES units(unit_key),
  raw_from INTEGER NOT NULL,  -- UTC seconds: raw points from here on
  resume   TEXT    NOT NULL   -- the model's state after the last summarised point (store_rows.h)
);
