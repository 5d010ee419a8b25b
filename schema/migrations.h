// Versioned SQL migrations, embedded from schema/migrations/NNN_name.sql
// (SQLite) and schema/postgresql/migrations/NNN_name.sql. The store applies
// every migration whose version exceeds the database's (SQLite: PRAGMA
// user_version; PostgreSQL: table ferrum_schema), each in its own
// transaction, at start-up.
#pragma once

#include <vector>

namespace ferrum::store {

struct Migration {
  int version;
  const char* name;
  const char* sql;
};

// All migrations in ascending version order: SQLite (schema/migrations/)
// and PostgreSQL (schema/postgresql/migrations/), with the same versions.
const std::vector<Migration>& embedded_migrations();
const std::vector<Migration>& embedded_postgresql_migrations();

}  // namespace ferrum::store
