-- ferrum schema for PostgreSQL, version 10: no foreign keys from oil_values
-- to oil_samples, nor from oil_samples.superseded_by to oil_samples.
--
-- PostgreSQL checks a foreign key with a query that each session plans once
-- and keeps. Planned while oil_samples was nearly empty, that query scans the
-- whole table, and an oil file of 400,000 samples, which fills the table in
-- one transaction, scanned it once per lab value: it did not finish in ten
-- minutes (bench/results.md). ferrum writes a sample, its values and the
-- supersession of an earlier issue in one statement (schema/postgresql/
-- pg_store.cpp, add_oil_sample), so the references hold without the check.
-- SQLite keeps both keys (schema/migrations/010_...): it checks them through
-- the primary key directly.
ALTER TABLE oil_values DROP CONSTRAINT IF EXISTS oil_values_sample_id_fkey;
ALTER TABLE oil_samples DROP CONSTRAINT IF EXISTS oil_samples_superseded_by_fkey;
