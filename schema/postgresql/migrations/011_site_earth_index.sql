-- ferrum schema for PostgreSQL, version 11: a partial index for the site's
-- earth inspections (schema/migrations/011_...: the same index on SQLite).
--
-- Every unit's assessment reads the earth (grounding) inspections of the
-- other units at its site. With 5,000 units that statement took 2.5 s of the
-- server's 40 s in a fleet assessment (0.5 ms a call for no rows: the unit
-- index visits every inspection of the site's units; bench/results.md).
CREATE INDEX IF NOT EXISTS inspections_grounding ON inspections(unit_key, inspection_day) WHERE item = 'grounding';
