-- ferrum schema for SQLite, version 10: nothing changes here. The PostgreSQL
-- store drops its foreign keys from oil_values and oil_samples.superseded_by
-- to oil_samples at this version (schema/postgresql/migrations/
-- 010_oil_keys_checked_by_ferrum.sql says why); SQLite checks them through
-- the primary key without a planned query, so it keeps them. The version
-- exists so that both backends carry the same numbers.
SELECT 1;
