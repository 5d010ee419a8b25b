-- The units of one substation found by an index (the site earth check reads
-- the earth inspections of a unit's neighbours at every assessment; without
-- it each assessment scanned every inspection of the fleet: issue 20's
-- fleet benchmark, bench/results.md). Sites compare without case, as the
-- register does.
CREATE INDEX units_site ON units(lower(site));
