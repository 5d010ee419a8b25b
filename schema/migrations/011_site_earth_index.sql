-- ferrum schema version 11: a partial index for the site's earth inspections.
--
-- Every unit's assessment reads the earth (grounding) inspections of the
-- other units at its site (analytics/site_earth_check.h). Through the unit
-- index that read visited every inspection of every unit at the site to keep
-- the few grounding ones; this index holds only those.
CREATE INDEX IF NOT EXISTS inspections_grounding ON inspections(unit_key, inspection_day) WHERE item = 'grounding';
