// Versioned SQL migrations, embedded from schema/migrations/NNN_name.sql.
// The store applies every migration whose version exceeds PRAGMA user_version,
// each in its own transaction, at start-up.
#pragma once

#include <vector>

namespace ferrum::store {

struct Migration {
  int version;
  const char* name;
  const char* sql;
};

// All migrations in ascending version order.
const std::vector<Migration>& embedded_migrations();

}  // namespace ferrum::store
