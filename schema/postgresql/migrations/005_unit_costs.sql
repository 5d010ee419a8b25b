-- ferrum schema for PostgreSQL, version 5: the unit's own costs, as
-- schema/migrations/005_unit_costs.sql.
ALTER TABLE units ADD COLUMN replacement_cost DOUBLE PRECISION;
ALTER TABLE units ADD COLUMN refurbishment_cost DOUBLE PRECISION;
