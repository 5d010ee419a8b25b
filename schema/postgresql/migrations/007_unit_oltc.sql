-- ferrum schema for PostgreSQL, version 7: the unit's on-load tap changer, as
-- schema/migrations/007_unit_oltc.sql.
ALTER TABLE units ADD COLUMN oltc TEXT;
