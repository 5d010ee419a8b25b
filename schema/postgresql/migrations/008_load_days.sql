-- Version 8: the tables of schema/migrations/008_load_days.sql (SQLite),
-- with the same names, columns and meaning: daily thermal summaries in place
-- of load points older than [store] keep_load_points_years, and the thermal
-- model's state where the raw points were cut.
CREATE TABLE load_days (
  unit_key                    BIGINT  NOT NULL REFERENCES units(unit_key),
  day                         INTEGER NOT NULL,
  first_ts                    BIGINT  NOT NULL,
  last_ts                     BIGINT  NOT NULL,
  covered_h                   DOUBLE PRECISION NOT NULL,
  bridged_h                   DOUBLE PRECISION NOT NULL,
  ageing_h                    DOUBLE PRECISION NOT NULL,
  peak_load_pu                DOUBLE PRECISION NOT NULL,
  peak_load_ts                BIGINT  NOT NULL,
  peak_hot_spot_c             DOUBLE PRECISION NOT NULL,
  peak_hot_spot_ts            BIGINT  NOT NULL,
  peak_top_oil_c              DOUBLE PRECISION NOT NULL,
  hours_above_nameplate       DOUBLE PRECISION NOT NULL,
  hours_above_normal_cyclic   DOUBLE PRECISION NOT NULL,
  hours_above_long_emergency  DOUBLE PRECISION NOT NULL,
  hours_above_short_emergency DOUBLE PRECISION NOT NULL,
  top_oil_excess_k            DOUBLE PRECISION NOT NULL,
  top_oil_measurements        BIGINT  NOT NULL,
  ambient_from_profile        INTEGER NOT NULL,
  growth_w                    DOUBLE PRECISION NOT NULL,
  growth_x                    DOUBLE PRECISION NOT NULL,
  growth_y                    DOUBLE PRECISION NOT NULL,
  growth_xx                   DOUBLE PRECISION NOT NULL,
  growth_xy                   DOUBLE PRECISION NOT NULL,
  PRIMARY KEY (unit_key, day)
);

CREATE TABLE load_history (
  unit_key BIGINT PRIMARY KEY REFERENCES units(unit_key),
  raw_from BIGINT NOT NULL,
  resume   TEXT   NOT NULL
);
