-- ferrum schema for PostgreSQL, version 12: each unit's load points of a
-- month, packed into one value, beside the rows (schema/postgresql/pg_store.cpp,
-- "Load packs"). schema/migrations/012_...: nothing to do on SQLite.
--
-- A unit's assessment reads its whole load history: 8,760 rows a year of
-- hourly points, 35,040 of quarter-hourly ones. Forming, sending and reading
-- a row each was about two thirds of the server's time per unit
-- (bench/results.md). A pack is the month's points in ts order, 32 bytes
-- each: ts (bigint), load_pu, ambient_c, top_oil_c (IEEE 754 doubles, NaN for
-- NULL), all in network byte order.
--
-- load_points stays the record: a pack is derived from it and only read
-- when it is current. Every write of a unit's points in a month bumps gen
-- and clears points in the writing transaction; a reader packs a month with
-- the gen it read before the rows and stores the pack only while gen is
-- still that one. UNLOGGED: no write-ahead log for what can be rebuilt; after
-- a crash, or on a promoted standby, the table is empty and every month is
-- read from the rows and packed again.
CREATE UNLOGGED TABLE IF NOT EXISTS load_packs (
  unit_key BIGINT  NOT NULL,
  month    INTEGER NOT NULL,  -- year * 12 + month - 1 (UTC), as the partitions of load_points
  gen      BIGINT  NOT NULL,
  points   BYTEA,             -- NULL: stale, read the rows
  PRIMARY KEY (unit_key, month)
);
-- Packs of 2 KB and more are kept out of line uncompressed: doubles hardly
-- compress, and the server then sends the stored bytes as they are.
ALTER TABLE load_packs ALTER COLUMN points SET STORAGE EXTERNAL;
