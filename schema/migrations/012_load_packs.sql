-- ferrum schema version 12: nothing on SQLite. PostgreSQL's version 12
-- (schema/postgresql/migrations/012_load_packs.sql) adds packed monthly load
-- points for reading over the network; SQLite reads its rows in-process,
-- where a row costs no round trip. The version is kept in step so that
-- both stores refuse a database newer than they know at the same number.
SELECT 1;
