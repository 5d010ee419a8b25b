-- ferrum schema, version 2: electrical field tests (issue 18).

-- Register columns the electrical tests read (all optional).
ALTER TABLE units ADD COLUMN conductor TEXT;         -- 'cu' or 'al'
ALTER TABLE units ADD COLUMN tap_positions INTEGER;  -- HV tap changer positions
ALTER TABLE units ADD COLUMN tap_nominal INTEGER;    -- position of the nameplate HV voltage
ALTER TABLE units ADD COLUMN tap_step_pct REAL;      -- % of U_HV per position (position 1 = highest HV voltage)
ALTER TABLE units ADD COLUMN impedance_pct REAL;     -- nameplate short-circuit impedance, %

-- One row per test result of an electrical tests file. value holds the
-- test's value column in its unit: turns_ratio ratio, winding_resistance
-- ohm, insulation_power_factor and bushing_power_factor %, insulation_resistance
-- megohm, excitation_current mA, leakage_reactance %.
CREATE TABLE electrical_tests (
  id              INTEGER PRIMARY KEY,
  unit_key        INTEGER NOT NULL REFERENCES units(unit_key),
  test_day        INTEGER NOT NULL,
  test            TEXT NOT NULL,
  phase           TEXT NOT NULL DEFAULT '',
  tap             INTEGER,
  winding         TEXT NOT NULL DEFAULT '',
  temp_c          REAL,
  insulation      TEXT NOT NULL DEFAULT '',
  test_kv         REAL,
  bushing         TEXT NOT NULL DEFAULT '',
  minutes         INTEGER,
  value           REAL,
  capacitance_pf  REAL,
  nameplate_value REAL,
  note            TEXT,
  crew            TEXT,
  file_id         INTEGER NOT NULL REFERENCES files(id),
  line            INTEGER NOT NULL
);
CREATE INDEX electrical_tests_unit ON electrical_tests(unit_key, test_day);
