-- ferrum schema for PostgreSQL, version 9: the units of one substation found
-- by an index, as schema/migrations/009_units_site.sql.
CREATE INDEX units_site ON units(lower(site));
